package optics

import (
	"math"
	"math/cmplx"
)

// Plane is a beam in one transverse plane (x or y), described by the complex
// beam parameter q of its embedded Gaussian scaled to the real beam: with
// λ' = M² λ, 1/q = 1/R − i λ' / (π W²), where W is the real beam's 1/e²
// (second-moment) radius and R the wavefront radius of curvature
// (Siegman, Lasers (1986), §17.1 and §17.4; ISO 11146).
type Plane struct {
	Q  complex128 // m
	M2 float64
}

// NewPlane is a beam whose waist W0 (m) lies at distance z0 (m) after the
// reference point, at wavelength λ (m).
func NewPlane(w0, z0, m2, λ float64) Plane {
	zR := math.Pi * w0 * w0 / (m2 * λ)
	return Plane{Q: complex(-z0, zR), M2: m2}
}

// Radius is the 1/e² intensity radius W at this point, m.
func (p Plane) Radius(λ float64) float64 {
	inv := 1 / p.Q
	return math.Sqrt(-p.M2 * λ / (math.Pi * imag(inv)))
}

// Curvature is 1/R of the wavefront, 1/m (0 at a waist; positive diverging).
func (p Plane) Curvature() float64 { return real(1 / p.Q) }

// RayleighRange is z_R = π W0² / (M² λ), m.
func (p Plane) RayleighRange() float64 { return imag(p.Q) }

// WaistDistance is how far ahead the waist lies, m (negative: behind).
func (p Plane) WaistDistance() float64 { return -real(p.Q) }

// WaistRadius is W0, m.
func (p Plane) WaistRadius(λ float64) float64 {
	return math.Sqrt(p.RayleighRange() * p.M2 * λ / math.Pi)
}

// Divergence is the far-field half-angle θ = M² λ / (π W0), rad.
func (p Plane) Divergence(λ float64) float64 {
	return p.M2 * λ / (math.Pi * p.WaistRadius(λ))
}

// ABCD applies a ray-transfer matrix: q' = (A q + B) / (C q + D).
func (p Plane) ABCD(a, b, c, d float64) Plane {
	q := (complex(a, 0)*p.Q + complex(b, 0)) / (complex(c, 0)*p.Q + complex(d, 0))
	return Plane{Q: q, M2: p.M2}
}

// Propagate moves the plane forward by d metres of free space.
func (p Plane) Propagate(d float64) Plane { return Plane{Q: p.Q + complex(d, 0), M2: p.M2} }

// Lens applies a thin lens of focal length f (m; positive converging).
func (p Plane) Lens(f float64) Plane { return p.ABCD(1, 0, -1/f, 1) }

// Beam is an elliptical (astigmatic, aligned) beam: x and y planes.
type Beam struct {
	Wavelength float64 // vacuum wavelength, m
	X, Y       Plane
}

// Radii returns the x and y 1/e² radii, m.
func (b Beam) Radii() (float64, float64) {
	return b.X.Radius(b.Wavelength), b.Y.Radius(b.Wavelength)
}

// Propagate moves the beam by d metres of free space.
func (b Beam) Propagate(d float64) Beam {
	b.X, b.Y = b.X.Propagate(d), b.Y.Propagate(d)
	return b
}

// Lens applies a thin lens in both planes.
func (b Beam) Lens(f float64) Beam {
	b.X, b.Y = b.X.Lens(f), b.Y.Lens(f)
	return b
}

// Slab accounts for a plate of thickness t (m) and index n whose thickness is
// already counted in the geometric positions: inside the plate the beam
// propagates as if over t/n, so the plate adds −t(1 − 1/n) of free space,
// moving the focus downstream by t(1 − 1/n) (Siegman, Lasers (1986), §15.1).
func (b Beam) Slab(t, n float64) Beam { return b.Propagate(-t * (1 - 1/n)) }

// PeakIrradiance is I₀ = 2P / (π Wx Wy) for power P (W), W/m².
func (b Beam) PeakIrradiance(p float64) float64 {
	wx, wy := b.Radii()
	return 2 * p / (math.Pi * wx * wy)
}

// PowerForPeakIrradiance inverts PeakIrradiance: P = I₀ π Wx Wy / 2, W.
func (b Beam) PowerForPeakIrradiance(i0 float64) float64 {
	wx, wy := b.Radii()
	return i0 * math.Pi * wx * wy / 2
}

// RadiiAt returns the 1/e² radii a distance d (m) downstream.
func (b Beam) RadiiAt(d float64) (float64, float64) { return b.Propagate(d).Radii() }

// MaxParaxialAngle bounds the far-field half-angle θ = M² λ / (π W0) of a
// beam the paraxial Gaussian model may describe, rad. Past about half a
// radian the paraxial wave equation behind q and ABCD matrices no longer
// holds (common practice; Siegman, Lasers (1986), §16.1 on the paraxial
// approximation).
const MaxParaxialAngle = 0.5

// Valid reports whether both planes describe a real beam: a finite q with a
// positive Rayleigh range and a finite positive radius.
func (b Beam) Valid() bool {
	for _, p := range []Plane{b.X, b.Y} {
		if imag(p.Q) <= 0 || cmplx.IsNaN(p.Q) || cmplx.IsInf(p.Q) {
			return false
		}
		if w := p.Radius(b.Wavelength); !(w > 0) || math.IsInf(w, 0) {
			return false
		}
	}
	return true
}

// HalfAngle is the larger far-field half-angle of the two planes, rad.
func (b Beam) HalfAngle() float64 {
	return math.Max(b.X.Divergence(b.Wavelength), b.Y.Divergence(b.Wavelength))
}

// Paraxial reports whether the beam's half-angle is within MaxParaxialAngle.
func (b Beam) Paraxial() bool { return b.HalfAngle() <= MaxParaxialAngle }

// PulseEnergy is the energy of one pulse (J) of a train of average power p
// (W) at repetition rate f (Hz): p/f. The same ratio turns an average
// irradiance (W/m²) into the radiant exposure of one pulse (J/m²).
func PulseEnergy(p, f float64) float64 { return p / f }

// PulsePeakPower is the peak power (W) of a pulse of energy q (J) and
// duration τ (s), taken as rectangular: q/τ (common practice; for other
// shapes the true peak is higher by the shape's factor). The same ratio
// turns a pulse's radiant exposure into its peak irradiance.
func PulsePeakPower(q, τ float64) float64 { return q / τ }
