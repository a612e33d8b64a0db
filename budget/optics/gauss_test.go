package optics

import (
	"beamledger/budget/units"
	"fmt"
	"math"
	"testing"
)

// Worked example: He-Ne beam, λ = 632.8 nm, W0 = 0.5 mm. Expected values are
// the textbook expressions evaluated by hand (Saleh and Teich, Fundamentals
// of Photonics, 2nd ed. (2007), eqs. (3.1-8) W(z), (3.1-9) R(z), (3.1-11)
// z0 = πW0²/λ, (3.1-19) θ0 = λ/(πW0)).
func TestPlaneTextbookHeNe(t *testing.T) {
	const λ, w0 = 632.8e-9, 0.5e-3
	p := NewPlane(w0, 0, 1, λ)
	if got := p.RayleighRange(); !within(got, 1.241147540, 1e-9) {
		t.Errorf("z_R = %.10g m, want 1.241147540 m", got)
	}
	if got := p.Divergence(λ); !within(got, 4.0285299e-4, 1e-7) {
		t.Errorf("θ = %.8g rad, want 4.0285299e-4 rad", got)
	}
	for _, c := range []struct{ z, w, r float64 }{
		{0.5, 5.390478952e-4, 3.580894433},
		{1.0, 6.420985385e-4, 2.540447216},
		{1.241147540, 7.071067812e-4, 2.482295080}, // W(z_R) = √2 W0, R(z_R) = 2 z_R
		{5.0, 2.075394740e-3, 5.308089443},
	} {
		t.Run(fmt.Sprint(c), func(t *testing.T) {
			q := p.Propagate(c.z)
			if got := q.Radius(λ); !within(got, c.w, 1e-8) {
				t.Errorf("W(%g m) = %.10g m, want %.10g m", c.z, got, c.w)
			}
			if got := 1 / q.Curvature(); !within(got, c.r, 1e-8) {
				t.Errorf("R(%g m) = %.10g m, want %.10g m", c.z, got, c.r)
			}
		})
	}
}

// A beam with M² = 1.5: z_R = πW0²/(M²λ) and θ = M²λ/(πW0) (Siegman, Lasers
// (1986), §17.4, the embedded-Gaussian rules); values evaluated by hand.
func TestPlaneM2(t *testing.T) {
	const λ, w0, m2 = 632.8e-9, 0.5e-3, 1.5
	p := NewPlane(w0, 0, m2, λ)
	if got := p.RayleighRange(); !within(got, 0.8274316934, 1e-9) {
		t.Errorf("z_R = %.10g, want 0.8274316934", got)
	}
	if got := p.Propagate(2).Radius(λ); !within(got, 1.307904736e-3, 1e-8) {
		t.Errorf("W(2 m) = %.10g, want 1.307904736e-3", got)
	}
	if got := p.Divergence(λ); !within(got, 6.042794879e-4, 1e-8) {
		t.Errorf("θ = %.10g, want 6.042794879e-4", got)
	}
	// The product W0·θ is M²λ/π whatever the optics (beam-parameter product).
	q := p.Propagate(0.3).Lens(0.1).Propagate(0.7).Lens(-0.05)
	if got := q.WaistRadius(λ) * q.Divergence(λ); !within(got, m2*λ/math.Pi, 1e-12) {
		t.Errorf("W0·θ = %g, want M²λ/π = %g", got, m2*λ/math.Pi)
	}
}

// Thin-lens waist transformation against Self's equations (S. A. Self, Appl.
// Opt. 22, 658 (1983), eqs. (9a) and (10), with z_R = πW0²/(M²λ) for
// embedded-Gaussian beams):
//
//	1/(s + z_R²/(s − f)) + 1/s'' = 1/f,   m = 1/√((1 − s/f)² + (z_R/f)²).
func TestLensSelf1983(t *testing.T) {
	cases := []struct{ λ, w0, m2, s, f float64 }{
		{1064e-9, 0.5e-3, 1, 0.3, 0.1},
		{1064e-9, 0.5e-3, 1.3, 0.3, 0.1},
		{780e-9, 1.1e-3, 1.6, 0.12, 0.011},
		{780e-9, 0.2e-3, 1, 0.05, 0.2},     // object inside the focal length
		{1064e-9, 0.9e-3, 1.1, 0.2, -0.05}, // diverging lens: virtual waist
		{532e-9, 2e-3, 2.0, 1.5, 0.5},
	}
	for _, c := range cases {
		t.Run(fmt.Sprintf("s=%g,f=%g,M2=%g", c.s, c.f, c.m2), func(t *testing.T) {
			zR := math.Pi * c.w0 * c.w0 / (c.m2 * c.λ)
			sOut := 1 / (1/c.f - 1/(c.s+zR*zR/(c.s-c.f)))
			mag := 1 / math.Sqrt(math.Pow(1-c.s/c.f, 2)+math.Pow(zR/c.f, 2))
			q := NewPlane(c.w0, 0, c.m2, c.λ).Propagate(c.s).Lens(c.f)
			if got := q.WaistDistance(); !within(got, sOut, 1e-9) {
				t.Errorf("s'' = %.10g m, Self gives %.10g m", got, sOut)
			}
			if got := q.WaistRadius(c.λ); !within(got, mag*c.w0, 1e-9) {
				t.Errorf("W0'' = %.10g m, Self gives %.10g m", got, mag*c.w0)
			}
		})
	}
}

// A plate of thickness t and index n moves a focus downstream by t(1 − 1/n)
// (paraxial optics; Siegman, Lasers (1986), §15.1, dielectric slab matrix).
func TestSlabFocusShift(t *testing.T) {
	const λ = 780e-9
	b := Beam{Wavelength: λ, X: NewPlane(1e-3, 0, 1, λ), Y: NewPlane(1e-3, 0, 1, λ)}
	b = b.Lens(0.2)
	before := b.X.WaistDistance()
	after := b.Slab(6.35e-3, 1.4533).X.WaistDistance() // fused silica at 780 nm, n ≈ 1.4533, from memory
	if got, want := after-before, 6.35e-3*(1-1/1.4533); !within(got, want, 1e-9) {
		t.Errorf("focus shift %.6g m, want t(1 − 1/n) = %.6g m", got, want)
	}
}

func BenchmarkPropagate(b *testing.B) {
	const λ = 1064e-9
	beam := Beam{Wavelength: λ, X: NewPlane(0.9e-3, 0, 1.1, λ), Y: NewPlane(0.6e-3, 0, 1.3, λ)}
	for i := 0; i < b.N; i++ {
		x := beam.Propagate(0.2).Lens(-0.05).Propagate(0.2).Lens(0.25).Propagate(0.3).Lens(0.3)
		_, _ = x.RadiiAt(0.3)
	}
}

// A beam whose radius is not a finite positive number is not valid, even
// when its q looks finite (its 1/q underflows); a beam past the paraxial
// half-angle is valid but not paraxial.
func TestBeamValidity(t *testing.T) {
	λ := 1e-6
	huge := Beam{Wavelength: λ, X: Plane{Q: complex(-1e200, 1e-200), M2: 1}, Y: NewPlane(1e-3, 0, 1, λ)}
	if w, _ := huge.Radii(); !math.IsInf(w, 1) && !math.IsNaN(w) {
		t.Fatalf("test beam has radius %g, want +Inf or NaN", w)
	}
	if huge.Valid() {
		t.Error("a beam of infinite radius passed as valid")
	}
	// θ = M² λ / (π W0) (Siegman, Lasers (1986), §17.1): W0 = 0.5 µm at 1 µm
	// gives 0.637 rad, past the 0.5 rad bound; W0 = 1 µm gives 0.318 rad.
	tight := Beam{Wavelength: λ, X: NewPlane(0.5e-6, 0, 1, λ), Y: NewPlane(1e-6, 0, 1, λ)}
	if !tight.Valid() || tight.Paraxial() || !within(tight.HalfAngle(), 1/(2*math.Pi)*4, 1e-9) {
		t.Errorf("valid %v, paraxial %v, half-angle %g", tight.Valid(), tight.Paraxial(), tight.HalfAngle())
	}
}

// Peak irradiance of a Gaussian beam, I₀ = 2P/(π Wx Wy) (Siegman, Lasers
// (1986), §17.1, the on-axis value of I(r) = (2P/πW²) exp(−2r²/W²)): 1 mW
// in a round 1 mm beam is 636.62 W/m²; PowerForPeakIrradiance inverts it.
func TestPeakIrradiance(t *testing.T) {
	λ := 780e-9
	b := Beam{Wavelength: λ, X: NewPlane(1e-3, 0, 1, λ), Y: NewPlane(0.5e-3, 0, 1, λ)}
	round := Beam{Wavelength: λ, X: NewPlane(1e-3, 0, 1, λ), Y: NewPlane(1e-3, 0, 1, λ)}
	if got := round.PeakIrradiance(1e-3); !within(got, 636.6198, 1e-6) {
		t.Errorf("I0 = %g W/m², want 636.62", got)
	}
	if got := b.PeakIrradiance(1e-3); !within(got, 2*636.6198, 1e-6) {
		t.Errorf("elliptical I0 = %g W/m², want 1273.24", got)
	}
	if got := b.PowerForPeakIrradiance(b.PeakIrradiance(0.37)); !within(got, 0.37, 1e-12) {
		t.Errorf("inverse gives %g W", got)
	}
}

// Worked example: a He-Ne beam, λ = 632.8 nm, W0 = 0.5 mm, one Rayleigh
// range from its waist: W = √2 W0 and R = 2 z_R (Saleh and Teich,
// Fundamentals of Photonics, 2nd ed. (2007), eqs. (3.1-8), (3.1-9),
// (3.1-11)).
func ExampleNewPlane() {
	const λ, w0 = 632.8e-9, 0.5e-3
	p := NewPlane(w0, 0, 1, λ)
	zR := p.RayleighRange()
	q := p.Propagate(zR)
	fmt.Printf("z_R = %.4f m, W(z_R) = %.4f mm, R(z_R) = %.4f m\n", zR, q.Radius(λ)*1e3, 1/q.Curvature())
	// Output: z_R = 1.2411 m, W(z_R) = 0.7071 mm, R(z_R) = 2.4823 m
}

// Worked example: 1 mW in a round beam of 1/e² radius 1 mm has the peak
// irradiance 2P/(πW²) = 636.6 W/m², 63.66 mW/cm² (Siegman, Lasers (1986),
// §17.1).
func ExampleBeam_PeakIrradiance() {
	λ := 780e-9
	b := Beam{Wavelength: λ, X: NewPlane(1e-3, 0, 1, λ), Y: NewPlane(1e-3, 0, 1, λ)}
	fmt.Printf("%.1f W/m² = %s\n", b.PeakIrradiance(1e-3), units.FormatIrradiance(b.PeakIrradiance(1e-3)))
	// Output: 636.6 W/m² = 63.66 mW/cm²
}

// A Q-switched train of 1 W average at 1 kHz carries 1 mJ per pulse, and a
// 10 ns pulse of 1 mJ peaks at 100 kW (common practice: Q = P/f,
// P_peak = Q/τ for a rectangular pulse).
func ExamplePulseEnergy() {
	q := PulseEnergy(1, 1e3)
	fmt.Printf("%s per pulse, %s peak\n", units.FormatSI(q, "J"), units.FormatPower(PulsePeakPower(q, 10e-9)))
	// Output: 1 mJ per pulse, 100 kW peak
}

func within(a, b, rel float64) bool { return math.Abs(a-b) <= rel*math.Abs(b) }
