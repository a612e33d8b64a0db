package optics

import (
	"fmt"
	"math"
	"math/cmplx"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
)

// Coherent overlap of two round Gaussians with flat wavefronts:
// η = (2 w1 w2 / (w1² + w2²))² (Marcuse, Bell Syst. Tech. J. 56, 703 (1977),
// eq. (40) for the untilted, unoffset splice); values evaluated by hand.
func TestFiberOverlapRoundMarcuse(t *testing.T) {
	const λ = 780e-9
	for _, c := range []struct{ w, wf, want float64 }{
		{2.65e-6, 2.65e-6, 1},
		{3e-6, 2.65e-6, 0.9847674566},
		{5.3e-6, 2.65e-6, 0.64},
		{1.325e-6, 2.65e-6, 0.64},
	} {
		t.Run(fmt.Sprint(c), func(t *testing.T) {
			b := Beam{Wavelength: λ, X: NewPlane(c.w, 0, 1, λ), Y: NewPlane(c.w, 0, 1, λ)}
			if got := FiberOverlap(b, 2*c.wf); !within(got, c.want, 1e-9) {
				t.Errorf("η(w=%g, wf=%g) = %.10f, want %.10f", c.w, c.wf, got, c.want)
			}
		})
	}
}

// With a curved wavefront, against the overlap integral of the two fields
// computed numerically with gonum's Gauss-Legendre quadrature.
func TestModeOverlapCurvedQuadrature(t *testing.T) {
	const λ = 780e-9
	for _, c := range []struct{ w, invR, wf float64 }{
		{3e-6, 0, 2.65e-6}, {4e-6, 1 / 2e-3, 2.65e-6}, {2e-6, -1 / 0.5e-3, 2.65e-6}, {10e-6, 1 / 1e-4, 3e-6},
	} {
		t.Run(fmt.Sprint(c), func(t *testing.T) {
			k := 2 * math.Pi / λ
			field := func(x float64) complex128 {
				e1 := cmplx.Exp(complex(-x*x/(c.w*c.w), -k*x*x*c.invR/2))
				return e1 * complex(math.Exp(-x*x/(c.wf*c.wf)), 0)
			}
			L := 8 * math.Max(c.w, c.wf)
			re := quad.Fixed(func(x float64) float64 { return real(field(x)) }, -L, L, 400, quad.Legendre{}, 0)
			im := quad.Fixed(func(x float64) float64 { return imag(field(x)) }, -L, L, 400, quad.Legendre{}, 0)
			n1 := math.Sqrt(math.Pi/2) * c.w
			n2 := math.Sqrt(math.Pi/2) * c.wf
			ref := (re*re + im*im) / (n1 * n2)
			if got := ModeOverlap1D(c.w, c.invR, 1, c.wf, λ); !within(got, ref, 1e-9) {
				t.Errorf("η₁(w=%g, 1/R=%g) = %.12f, quadrature %.12f", c.w, c.invR, got, ref)
			}
		})
	}
}

// A Gaussian Schell-model beam coupled into a mode that matches its lowest
// coherent mode (radius W/M) takes the lowest mode's share of the power,
// 2/(M² + 1) (Starikov and Wolf, J. Opt. Soc. Am. 72, 923 (1982): geometric
// eigenvalues with ratio q = b/(a + b + c); here q = (M² − 1)/(M² + 1)).
func TestModeOverlapGSMLowestMode(t *testing.T) {
	const λ = 1064e-9
	for _, m2 := range []float64{1, 1.1, 1.3, 1.6, 2, 4} {
		w := 100e-6
		got := ModeOverlap1D(w, 0, m2, w/math.Sqrt(m2), λ)
		if want := 2 / (m2 + 1); !within(got, want, 1e-12) {
			t.Errorf("M² = %g: η₁ = %.12f, want 2/(M²+1) = %.12f", m2, got, want)
		}
		// And no other fibre mode size does better.
		for _, f := range []float64{0.7, 0.9, 1.1, 1.4} {
			if other := ModeOverlap1D(w, 0, m2, f*w/math.Sqrt(m2), λ); other > got+1e-12 {
				t.Errorf("M² = %g: mode ×%g couples %g > matched %g", m2, f, other, got)
			}
		}
	}
}

// The closed form for M² > 1 against the double integral of the Gaussian
// Schell-model cross-spectral density W(x1,x2) = exp(−(x1²+x2²)/W²
// − (x1−x2)²/(2σ²) − ik(x1²−x2²)/(2R)) times the mode, σ² = W²/(M⁴ − 1).
func TestModeOverlapGSMQuadrature(t *testing.T) {
	const λ = 1064e-9
	k := 2 * math.Pi / λ
	for _, c := range []struct{ w, invR, m2, wf float64 }{
		{5e-6, 0, 1.6, 3e-6}, {5e-6, 1 / 1e-3, 1.3, 4e-6}, {8e-6, -1 / 5e-4, 2.5, 4e-6},
	} {
		t.Run(fmt.Sprint(c), func(t *testing.T) {
			s2 := c.w * c.w / (c.m2*c.m2 - 1)
			L := 8 * math.Max(c.w, c.wf)
			inner := func(x1 float64) float64 {
				return quad.Fixed(func(x2 float64) float64 {
					g := math.Exp(-(x1*x1+x2*x2)/(c.w*c.w) - (x1-x2)*(x1-x2)/(2*s2) - (x1*x1+x2*x2)/(c.wf*c.wf))
					return g * math.Cos(k*(x1*x1-x2*x2)*c.invR/2)
				}, -L, L, 200, quad.Legendre{}, 0)
			}
			num := quad.Fixed(inner, -L, L, 200, quad.Legendre{}, 0)
			ref := num / (math.Sqrt(math.Pi/2) * c.w * math.Sqrt(math.Pi/2) * c.wf)
			if got := ModeOverlap1D(c.w, c.invR, c.m2, c.wf, λ); !within(got, ref, 1e-8) {
				t.Errorf("η₁(W=%g, 1/R=%g, M²=%g) = %.10f, quadrature %.10f", c.w, c.invR, c.m2, got, ref)
			}
		})
	}
}

// The ideal focal length focuses the embedded Gaussian to the fibre mode:
// propagating to the new waist gives a coupled fraction at the maximum.
func TestIdealCouplingFocalLength(t *testing.T) {
	const λ, wf = 780e-9, 2.65e-6
	for _, m2 := range []float64{1, 1.6} {
		p := NewPlane(1.1e-3, -0.3, m2, λ) // arriving from a waist 0.3 m upstream
		f := IdealCouplingFocalLength(p, λ, wf)
		q := p.Lens(f)
		q = q.Propagate(q.WaistDistance())
		if got := q.WaistRadius(λ) / math.Sqrt(m2); !within(got, wf, 1e-9) {
			t.Errorf("M² = %g: embedded waist %g, want %g", m2, got, wf)
		}
		if got, want := ModeOverlap1D(q.Radius(λ), q.Curvature(), m2, wf, λ), 2/(m2+1); !within(got, want, 1e-9) {
			t.Errorf("M² = %g: coupling at the ideal focus %g, want %g", m2, got, want)
		}
	}
	// Collimated beam, W ≫ wf: f ≈ π W wf / (M λ) (common practice).
	p := NewPlane(1e-3, 0, 1, λ)
	if got, want := IdealCouplingFocalLength(p, λ, wf), math.Pi*1e-3*wf/λ; !within(got, want, 1e-5) {
		t.Errorf("collimated: f = %g, want ≈ %g", got, want)
	}
	if got := IdealCouplingFocalLength(NewPlane(2e-6, 0, 1, λ), λ, wf); !math.IsNaN(got) {
		t.Errorf("beam smaller than the mode: f = %g, want NaN", got)
	}
}

// Collimated fibre output: W = λ f / (π w_f) (Saleh and Teich, Fundamentals of
// Photonics (2007), eq. (3.2-9) focusing a Gaussian by a lens, run backwards).
func TestFiberOutputWaist(t *testing.T) {
	// 852 nm, f = 30 mm, MFD 5.0 µm: W = 852e-9·0.03/(π·2.5e-6) = 3.25440 mm (by hand)
	if got := FiberOutputWaist(852e-9, 0.03, 5e-6); !within(got, 3.254400e-3, 1e-6) {
		t.Errorf("W = %g, want 3.254400e-3", got)
	}
}
