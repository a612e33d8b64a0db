package optics

import "math"

// ModeOverlap1D is the power coupled in one plane: a beam of 1/e² radius w
// (m), wavefront curvature 1/R (1/m) and beam quality m2 into a Gaussian mode
// of radius wf (m) with a flat wavefront, at wavelength λ (m).
//
// A beam with M² = 1 couples into the fibre's fundamental mode (a Gaussian of
// 1/e² radius w_f = MFD/2 with a flat wavefront at the face) by the overlap
// integral of the two fields, which factorises into x and y.
//
// A beam with M² > 1 is modelled as a Gaussian Schell-model beam: a partially
// coherent Gaussian of the same 1/e² radius W, wavefront curvature and M²,
// whose coherence width σ_g follows from M² = √(1 + W²/σ_g²). Its coherent
// modes are the Hermite-Gaussians of the embedded Gaussian (radius W/M) with
// geometric weights, so the fraction in the lowest mode is 2/(M² + 1)
// (Gori, Opt. Commun. 34, 301 (1980); Starikov and Wolf, J. Opt. Soc. Am. 72,
// 923 (1982)). The coupled fraction is the overlap of its cross-spectral
// density with the fibre mode, a Gaussian integral with the closed form
//
//	η₁ = 2 / (W w_f √(a² + b² − c²)),
//	a = (M⁴ + 1)/(2W²) + 1/w_f²,  b = k/(2R) = π/(λR),  c = (M⁴ − 1)/(2W²),
//
// which for M² = 1 is the coherent overlap 2/(W w_f |1/W² + 1/w_f² + i b|)
// (Marcuse, Bell Syst. Tech. J. 56, 703 (1977), for the untilted, centred case).
func ModeOverlap1D(w, invR, m2, wf, λ float64) float64 {
	m4 := m2 * m2
	a := (m4+1)/(2*w*w) + 1/(wf*wf)
	b := math.Pi * invR / λ
	c := (m4 - 1) / (2 * w * w)
	return 2 / (w * wf * math.Sqrt(a*a+b*b-c*c))
}

// FiberOverlap is the fraction of the beam's power in the fibre's
// fundamental mode of diameter mfd (m) at the fibre face, before alignment.
func FiberOverlap(b Beam, mfd float64) float64 {
	wf := mfd / 2
	wx, wy := b.Radii()
	return ModeOverlap1D(wx, b.X.Curvature(), b.X.M2, wf, b.Wavelength) *
		ModeOverlap1D(wy, b.Y.Curvature(), b.Y.M2, wf, b.Wavelength)
}

// IdealCouplingFocalLength is the focal length of a thin lens that, placed
// where the beam is now, focuses the beam's embedded Gaussian (radius W/M,
// the width of its lowest coherent mode, which the closed form above couples
// best) to a waist of radius wf (m) in one plane; the fibre face then belongs
// at that waist. It returns NaN where the embedded Gaussian is already no
// larger than wf (a lens cannot focus it down to the mode; expand it first).
func IdealCouplingFocalLength(p Plane, λ, wf float64) float64 {
	we := p.Radius(λ) / math.Sqrt(p.M2)
	if we <= wf {
		return math.NaN()
	}
	// After the lens the embedded beam must converge with 1/R' such that its
	// waist is wf: wf² = we² / (1 + (π we² / (λ R'))²).
	invRout := -(λ / (math.Pi * we * we)) * math.Sqrt(we*we/(wf*wf)-1)
	return 1 / (p.Curvature() - invRout)
}

// FiberOutputWaist is the collimated output radius (m) of a fibre with mode
// field diameter mfd (m) behind a collimator of focal length f (m):
// W = λ f / (π w_f) (Saleh and Teich, Fundamentals of Photonics, §3.2).
func FiberOutputWaist(λ, f, mfd float64) float64 { return λ * f / (math.Pi * mfd / 2) }
