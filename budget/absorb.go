package budget

import (
	"math"
	"slices"
	"sync"

	"gonum.org/v1/gonum/integrate/quad"

	"beamledger/budget/atoms"
	"beamledger/budget/setup"
)

// Absorption is what an optically thick cloud does to a beam crossing it:
// each transverse ray is a saturable absorber (atoms.OutgoingIntensity)
// through the cloud's Gaussian column, and the ray results are integrated
// over the beam's Gaussian profile.
type Absorption struct {
	// Transmission is the fraction of the beam's power that passes the
	// cloud; the rest is scattered by the atoms.
	Transmission float64
	// Entrance, Centre and Exit are s = I/I_sat on the beam axis at −2, 0
	// and +2 rms sizes along the beam.
	Entrance, Centre, Exit float64
}

// CloudColumn is a cloud as one beam sees it: its peak resonant optical
// depth B0 along the beam, its rms sizes across the beam (in the beam's x
// and y planes), the detuning factor A = 1 + 4Δ²/Γ² and I_sat (W/m²).
type CloudColumn struct {
	B0, σx, σy, A, isat float64
	// ρ is the correlation of the column's x and y (a beam oblique to an
	// anisotropic cloud): the column is B0 exp(−½ rᵀΣ⁻¹r) with
	// Σ = [[σx², ρσxσy], [ρσxσy, σy²]].
	ρ float64
}

// inverse is Σ⁻¹ of the column's transverse covariance: P11, P12, P22.
func (col CloudColumn) inverse() (p11, p12, p22 float64) {
	d := 1 - col.ρ*col.ρ
	return 1 / (col.σx * col.σx * d), -col.ρ / (col.σx * col.σy * d), 1 / (col.σy * col.σy * d)
}

// at is the column's optical depth at (x, y) across the beam.
func (col CloudColumn) at(x, y float64) float64 {
	p11, p12, p22 := col.inverse()
	return col.B0 * math.Exp(-(p11*x*x+2*p12*x*y+p22*y*y)/2)
}

// weakLimit is the optical depth b0/a below which the cloud is treated as
// weak (Beer–Lambert, linear in b): the absorbed fraction is then below
// 1e-6 of the light crossing it.
const weakLimit = 1e-6

// thinLimit is the optical depth b0/a below which each ray is taken to
// first order in b, ΔI = I_sat b i/(a + i) (saturation kept; the neglected
// terms are below b0/a = 1 % of the absorbed light).
const thinLimit = 1e-2

// uniformRatio is how many times wider than the cloud a beam must be (in
// both planes) for its intensity to be taken as uniform across the column:
// the intensity then falls by under 2(2.5σ)²/w² = 0.5 % out to 2.5 rms,
// where a column of optical depth 25 is down to 1.
const uniformRatio = 50

// quadNodes is the number of Gauss–Legendre nodes across each transverse
// direction.
const quadNodes = 32

// legendre holds the Gauss–Legendre nodes and weights on [−1, 1], computed
// when a cloud is first integrated.
var legendre = sync.OnceValue(func() (n struct{ x, w []float64 }) {
	n.x, n.w = make([]float64, quadNodes), make([]float64, quadNodes)
	quad.Legendre{}.FixedLocations(n.x, n.w, -1, 1)
	return n
})

// Absorb is the absorption of a beam of power p (W) and 1/e² radii wx, wy
// at the cloud.
func (col CloudColumn) Absorb(p, wx, wy float64) Absorption {
	nodes := legendre()
	i0 := 2 * p / (math.Pi * wx * wy) / col.isat
	ab := Absorption{Transmission: 1}
	for k, z := range []float64{-2, 0, 2} {
		s := atoms.OutgoingIntensity(i0, col.B0*atoms.ColumnFraction(z), col.A)
		switch k {
		case 0:
			ab.Entrance = s
		case 1:
			ab.Centre = s
		default:
			ab.Exit = s
		}
	}
	if !(p > 0) || !(col.B0 > 0) {
		return ab
	}
	if col.B0/col.A < weakLimit {
		// ∬ I (b/a) dx dy for the two Gaussians in closed form.
		// 2π/√det M with M = diag(4/wx², 4/wy²) + Σ⁻¹.
		p11, p12, p22 := col.inverse()
		m11, m22 := 4/(wx*wx)+p11, 4/(wy*wy)+p22
		absorbed := i0 * col.isat * col.B0 / col.A * 2 * math.Pi / math.Sqrt(m11*m22-p12*p12)
		ab.Transmission = 1 - absorbed/p
		return ab
	}
	// A beam much wider than the cloud drives the whole column at its peak:
	// with u = b/b0 = exp(−ρ²/2) the column's area element is
	// 2π σx σy √(1 − ρ²) du/u, and one dimension suffices.
	if math.Min(wx/col.σx, wy/col.σy) > uniformRatio {
		absorbed := 0.0
		for k, u := range nodes.x {
			u = (u + 1) / 2 // on (0, 1)
			out := atoms.OutgoingIntensity(i0, col.B0*u, col.A)
			if col.B0/col.A < thinLimit {
				out = i0 - col.B0*u*i0/(col.A+i0)
			}
			absorbed += nodes.w[k] / 2 * (i0 - out) / u
		}
		absorbed *= 2 * math.Pi * col.σx * col.σy * math.Sqrt(1-col.ρ*col.ρ) * col.isat
		ab.Transmission = math.Max(0, 1-absorbed/p)
		return ab
	}
	thin := col.B0/col.A < thinLimit
	ray := func(in, b float64) float64 { // I_in − I_out of one ray, units of I_sat
		if thin {
			return b * in / (col.A + in)
		}
		return in - atoms.OutgoingIntensity(in, b, col.A)
	}
	// A round beam on a round cloud: one radial integral, ∫ 2πρ ΔI dρ.
	if math.Abs(wx-wy) <= 1e-9*wx && math.Abs(col.σx-col.σy) <= 1e-9*col.σx && col.ρ == 0 {
		R := math.Min(3.5*wx, 6*col.σx)
		absorbed := 0.0
		for k, u := range nodes.x {
			ρ := (u + 1) / 2 * R
			absorbed += nodes.w[k] * ρ * ray(i0*math.Exp(-2*ρ*ρ/(wx*wx)), col.B0*math.Exp(-ρ*ρ/(2*col.σx*col.σx)))
		}
		absorbed *= math.Pi * R * col.isat // the 2π of the ring times the R/2 of the nodes' scale
		ab.Transmission = math.Max(0, 1-absorbed/p)
		return ab
	}
	// The absorbed intensity I_in − I_out over the region where both the
	// beam and the column are.
	X, Y := math.Min(3.5*wx, 6*col.σx), math.Min(3.5*wy, 6*col.σy)
	var ix, iy, bx, by [quadNodes]float64 // the profiles at the nodes, separable
	for k, u := range nodes.x {
		x, y := u*X, u*Y
		ix[k], iy[k] = math.Exp(-2*x*x/(wx*wx)), math.Exp(-2*y*y/(wy*wy))
		bx[k], by[k] = math.Exp(-x*x/(2*col.σx*col.σx)), math.Exp(-y*y/(2*col.σy*col.σy))
	}
	// The integrand is even in x and in y, and the nodes are symmetric
	// about zero (an even count): one quadrant, four times; with a
	// correlated column only the point symmetry (x, y) → (−x, −y) holds:
	// one half, twice.
	const half = quadNodes / 2
	absorbed := 0.0
	if col.ρ == 0 {
		for i := half; i < quadNodes; i++ {
			for j := half; j < quadNodes; j++ {
				absorbed += nodes.w[i] * nodes.w[j] * ray(i0*ix[i]*iy[j], col.B0*bx[i]*by[j])
			}
		}
		absorbed *= 4 * X * Y * col.isat
	} else {
		for i := half; i < quadNodes; i++ {
			for j := range quadNodes {
				absorbed += nodes.w[i] * nodes.w[j] * ray(i0*ix[i]*iy[j], col.at(nodes.x[i]*X, nodes.x[j]*Y))
			}
		}
		absorbed *= 2 * X * Y * col.isat
	}
	ab.Transmission = math.Max(0, 1-absorbed/p)
	return ab
}

// FractionAbove is the share of the atoms (weighted by density) where s
// reaches sGoal, for a beam of peak incident s i0 and 1/e² radii wx, wy:
// along each ray the atoms in front of the depth b* where s falls to
// sGoal, b* = a ln(i_in/s_goal) + i_in − s_goal, are above it, so the ray
// contributes min(b, b*) of its column b.
//
// The rays that reach sGoal at all fill the ellipse 2x²/wx² + 2y²/wy² < L,
// L = ln(i0/sGoal). With x = wx √(t/2) cos θ, y = wy √(t/2) sin θ the
// beam's s on a ray is i0 e^(−t), the column b = B0 e^(−q(θ) t) with
// q = wx² cos²θ/(4σx²) + wy² sin²θ/(4σy²), dx dy = (wx wy/4) dt dθ, and the
// share is (wx wy/(2π σx σy B0)) ∫_0^(π/2) ∫_0^L min(b, b*) dt dθ (the four
// quadrants alike; the denominator ∬ b = 2π σx σy B0). Each ray's t
// integral is split where b = b* (the kink) and every piece taken by
// Gauss–Legendre, so the result is smooth in θ and the θ rule converges
// fast: a share that barely moves with the drive is found to well within
// 0.1 % (TestFractionAboveAgainstReferences).
func (col CloudColumn) FractionAbove(i0, wx, wy, sGoal float64) float64 {
	if !(col.B0 > 0) {
		if i0 >= sGoal {
			return 1
		}
		return 0
	}
	L := math.Log(i0 / sGoal)
	if !(L > 0) {
		return 0
	}
	nodes := legendre16()
	bStar := func(t float64) float64 { return col.A*(L-t) + i0*(math.Exp(-t)-math.Exp(-L)) }
	// pieceSum is ∫ min(b, b*) dt over [t0, t1] for the column's rate q.
	piece := func(q, t0, t1 float64) float64 {
		sum := 0.0
		for k, u := range nodes.x {
			t := t0 + (u+1)/2*(t1-t0)
			sum += nodes.w[k] * math.Min(col.B0*math.Exp(-q*t), bStar(t))
		}
		return sum * (t1 - t0) / 2
	}
	const samples = 12
	total := 0.0
	var cuts []float64
	p11, p12, p22 := col.inverse()
	// θ over the first quadrant, four times; a correlated column is only
	// point-symmetric: the first two quadrants, twice.
	quadrants := 1
	if col.ρ != 0 {
		quadrants = 2
	}
	for k := range quadrants * len(nodes.x) {
		u, w := nodes.x[k%len(nodes.x)], nodes.w[k%len(nodes.x)]
		θ := (u+1)/2*math.Pi/2 + float64(k/len(nodes.x))*math.Pi/2
		c, s := math.Cos(θ), math.Sin(θ)
		q := (p11*wx*wx*c*c + 2*p12*wx*wy*c*s + p22*wy*wy*s*s) / 4
		g := func(t float64) float64 { return col.B0*math.Exp(-q*t) - bStar(t) }
		// The pieces: cut at the column's own scale 1/q (a beam much
		// wider than the cloud sees the column fall within a small t)
		// and at the kinks, found between even steps in t and the scale
		// points.
		cuts = append(cuts[:0], 0, L)
		for m := 1.0; m/q < L && m <= 256; m *= 4 {
			cuts = append(cuts, m/q)
		}
		probe := append(slices.Clone(cuts), make([]float64, 0, samples)...)
		for j := 1; j < samples; j++ {
			probe = append(probe, L*float64(j)/samples)
		}
		slices.Sort(probe)
		prev := g(probe[0])
		for j := 1; j < len(probe); j++ {
			gj := g(probe[j])
			if (prev < 0) != (gj < 0) {
				cuts = append(cuts, kink(g, probe[j-1], probe[j], prev, gj, 1e-13*L))
			}
			prev = gj
		}
		slices.Sort(cuts)
		ray := 0.0
		for j := 1; j < len(cuts); j++ {
			if cuts[j] > cuts[j-1] {
				ray += piece(q, cuts[j-1], cuts[j])
			}
		}
		total += w * ray
	}
	total *= math.Pi / 4 * 4 / float64(quadrants) // the θ nodes' scale, and the quadrants not summed
	return math.Min(1, wx*wy/4*total/(2*math.Pi*col.σx*col.σy*math.Sqrt(1-col.ρ*col.ρ)*col.B0))
}

// legendre16 holds 16 Gauss–Legendre nodes and weights on [−1, 1].
var legendre16 = sync.OnceValue(func() (n struct{ x, w []float64 }) {
	n.x, n.w = make([]float64, 16), make([]float64, 16)
	quad.Legendre{}.FixedLocations(n.x, n.w, -1, 1)
	return n
})

// ColumnFor is cloud c as the beam pb sees it at element k of its path
// (element e): the peak resonant optical depth across the beam's planes,
// the detuning factor at the light's detuning there (DetuningAtAtoms, with
// the trap's differential light shift δ on the cloud, Hz) and the cloud's
// I_sat.
func ColumnFor(pb *PathBudget, k int, e *setup.Element, c *setup.Cloud, δ float64) CloudColumn {
	tr := c.Data
	isat, _, _ := tr.Isat(c.Saturation)
	u, v := setup.BeamAxes(e.Direction)
	σx, σy := c.RMSAlong(u), c.RMSAlong(v)
	ρ := c.Covariance(u, v) / (σx * σy)
	σ0 := atoms.CrossSection(tr.Wavelength, tr.Gamma, isat)
	Δ, _, _ := DetuningAtAtoms(pb, k, e, c, δ)
	return CloudColumn{B0: atoms.OpticalDepth(σ0, c.Atoms, σx, σy, ρ), σx: σx, σy: σy, ρ: ρ, A: atoms.DetuningFactor(Δ, tr.Gamma), isat: isat}
}

// DetuningAtAtoms is the detuning from cloud c's transition of the light
// pb carries to atoms element e (row k of its path), rad/s: the stated or
// derived one (setup.DetuningAt; the element's own only for the path's
// own laser) and, for near-resonant light (within setup.FarDetuningFactor
// linewidths), the trap's differential light shift δ on the cloud (Hz,
// excited minus ground, at the trap minimum) taken off (TrapShifted).
// included is the shift taken off (0 for far-detuned light), source where
// the detuning came from.
func DetuningAtAtoms(pb *PathBudget, k int, e *setup.Element, c *setup.Cloud, δ float64) (Δ, included float64, source string) {
	var own *setup.Element
	if !pb.IsJoined() {
		own = e
	}
	Δ, source = setup.DetuningAt(pb.Laser, own, pb.ShiftBefore(k), c.Data)
	if δ != 0 && math.Abs(Δ) <= setup.FarDetuningFactor*c.Data.Gamma {
		return TrapShifted(Δ, δ), δ, source
	}
	return Δ, 0, source
}

// TrapShifted is the detuning of light at Δ (rad/s) from a transition the
// trap light shifts by δ (Hz, the excited state's shift less the ground
// state's): Δ − 2π δ, since the resonance moves to ω0 + 2π δ.
func TrapShifted(Δ, δ float64) float64 { return Δ - 2*math.Pi*δ }

// IncidentForFraction is the peak incident s (units of I_sat) at which the
// share frac of the atoms reaches sGoal: bracketed by steps of 4 in s,
// then narrowed by the Illinois variant of regula falsi on ln s (the share
// grows with the drive) until its bracket is 1e-4 wide in ln s (a flat
// share must not end it early); the upper end is returned (the drive that
// is enough).
func (col CloudColumn) IncidentForFraction(sGoal, frac, wx, wy float64) float64 {
	f := func(x float64) float64 { return col.FractionAbove(math.Exp(x), wx, wy, sGoal) - frac }
	lo, hi := math.Log(sGoal), math.Log(sGoal)
	flo, fhi := f(lo), f(hi)
	for fhi < 0 && hi < math.Log(1e12*sGoal) {
		lo, flo = hi, fhi
		hi += math.Log(4)
		fhi = f(hi)
	}
	if fhi < 0 {
		return math.Exp(hi)
	}
	side := 0
	for range 100 {
		if hi-lo <= 1e-4 {
			break
		}
		x := (lo*fhi - hi*flo) / (fhi - flo)
		if !(x > lo && x < hi) {
			x = (lo + hi) / 2
		}
		fx := f(x)
		if fx >= 0 {
			hi, fhi = x, fx
			if side == 1 {
				flo /= 2
			}
			side = 1
		} else {
			lo, flo = x, fx
			if side == -1 {
				fhi /= 2
			}
			side = -1
		}
	}
	return math.Exp(hi)
}

// kink is where g crosses zero between a and b (g(a) = ga and g(b) = gb of
// opposite signs), by the Illinois variant of regula falsi to a width of
// tol.
func kink(g func(float64) float64, a, b, ga, gb, tol float64) float64 {
	side := 0
	for range 100 {
		if b-a <= tol {
			break
		}
		x := (a*gb - b*ga) / (gb - ga)
		if !(x > a && x < b) {
			x = (a + b) / 2
		}
		gx := g(x)
		switch {
		case gx == 0:
			return x
		case (gx < 0) == (ga < 0):
			a, ga = x, gx
			if side == -1 {
				gb /= 2
			}
			side = -1
		default:
			b, gb = x, gx
			if side == 1 {
				ga /= 2
			}
			side = 1
		}
	}
	return (a + b) / 2
}
