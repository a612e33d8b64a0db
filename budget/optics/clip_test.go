package optics

import (
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
)

// Round beam through a centred circular aperture: T = 1 − exp(−2a²/w²)
// (Siegman, Lasers (1986), §17.1, eq. (17.9)); values evaluated by hand.
func TestCircleFractionRound(t *testing.T) {
	for _, c := range []struct{ a, want float64 }{
		{1, 0.8646647168},           // a = w: 1 − e⁻²
		{math.Pi / 2, 0.9928081166}, // D = πw: 1 − exp(−π²/2), the "π·w" rule of common practice
		{0.5, 0.3934693403},         // a = w/2: 1 − e^(−1/2)
		{1.5, 0.9888910034},         // a = 1.5 w: 1 − e^(−4.5)
	} {
		t.Run(fmt.Sprint(c), func(t *testing.T) {
			if got := CircleFraction(1, 1, c.a); !within(got, c.want, 1e-9) {
				t.Errorf("T(a=%g w) = %.10f, want %.10f", c.a, got, c.want)
			}
		})
	}
}

// The elliptical case against a direct two-dimensional integration of the
// Gaussian over the disc with gonum's Gauss-Legendre quadrature.
func TestCircleFractionEllipticalQuadrature(t *testing.T) {
	for _, c := range []struct{ wx, wy, a float64 }{
		{1, 0.6, 0.8}, {1, 0.6, 1.25}, {1, 0.1, 0.5}, {2, 0.5, 3}, {1, 0.02, 0.3}, {0.3, 1, 0.4},
	} {
		t.Run(fmt.Sprint(c), func(t *testing.T) {
			ref := diskIntegral(c.wx, c.wy, c.a)
			if got := CircleFraction(c.wx, c.wy, c.a); math.Abs(got-ref) > 1e-9 {
				t.Errorf("T(wx=%g, wy=%g, a=%g) = %.12f, quadrature %.12f", c.wx, c.wy, c.a, got, ref)
			}
		})
	}
}

// diskIntegral integrates 2/(π wx wy) exp(−2x²/wx² − 2y²/wy²) over x² + y² ≤ a²:
// the y integral in closed form (erf), the x integral with x = a sin θ so
// that the disc's edge leaves no square-root kink for the quadrature.
func diskIntegral(wx, wy, a float64) float64 {
	inner := func(θ float64) float64 {
		x, h := a*math.Sin(θ), a*math.Cos(θ)
		return a * math.Cos(θ) * math.Exp(-2*x*x/(wx*wx)) * math.Sqrt(math.Pi/2) * wy * math.Erf(math.Sqrt2*h/wy)
	}
	sum := 0.0
	const pieces = 64
	for i := 0; i < pieces; i++ {
		lo := -math.Pi/2 + math.Pi*float64(i)/pieces
		sum += quad.Fixed(inner, lo, lo+math.Pi/pieces, 64, quad.Legendre{}, 0)
	}
	return 2 / (math.Pi * wx * wy) * sum
}

// Properties: a larger aperture never passes less, and nothing passes more
// than the whole beam.
func TestCircleFractionMonotone(t *testing.T) {
	prev := 0.0
	for a := 0.01; a < 5; a += 0.01 {
		got := CircleFraction(1.3, 0.4, a)
		if got < prev-1e-12 || got > 1 {
			t.Fatalf("T(a=%g) = %g after %g", a, got, prev)
		}
		prev = got
	}
}

func BenchmarkCircleFraction(b *testing.B) {
	for i := 0; i < b.N; i++ {
		CircleFraction(1.1e-3, 0.6e-3, 1.25e-3)
	}
}
