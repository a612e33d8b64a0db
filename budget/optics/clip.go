package optics

import (
	"math"
	"sync"
)

// CircleFraction is the fraction of an elliptical Gaussian beam's power
// (1/e² radii wx, wy, m) that passes a centred circular aperture of radius a
// (m).
//
// In polar coordinates the radial integral is elementary; with the angle
// substitution tan φ = (wy/wx) tan ψ the remaining angular integral becomes
//
//	T = (2/π) ∫₀^{π/2} [1 − exp(−2a² / (wx² cos²ψ + wy² sin²ψ))] dψ,
//
// A smooth periodic integrand, summed with the trapezoid rule (which
// converges geometrically for such integrands), doubling the points until
// two successive estimates agree to 1e-12. For wx = wy it is
// T = 1 − exp(−2a²/w²) (Siegman, Lasers (1986), §17.1).
func CircleFraction(wx, wy, a float64) float64 { return CircleFractionTol(wx, wy, a, 1e-12) }

// CircleFractionTol is CircleFraction to a stated relative tolerance (at
// least 1e-14), for callers that evaluate it many times and need fewer
// digits.
func CircleFractionTol(wx, wy, a, tol float64) float64 {
	tol = math.Max(tol, 1e-14)
	if a <= 0 {
		return 0
	}
	if math.IsInf(a, 1) {
		return 1
	}
	wmax := math.Max(wx, wy)
	if e := 2 * a * a / (wmax * wmax); e > 40 || math.Exp(-e) < tol*1e-2 {
		// The exponential is below e⁻⁴⁰ ≈ 4e-18, or far below the
		// tolerance: the fraction is 1.
		return 1
	}
	if wx == wy {
		return -math.Expm1(-2 * a * a / (wx * wx))
	}
	a2, x2, y2 := 2*a*a, wx*wx, wy*wy
	f := func(c2 float64) float64 { return -math.Expm1(-a2 / (x2*c2 + y2*(1-c2))) }
	// Level 0 holds the end points and 16 intervals; each further level
	// holds the midpoints of the previous one.
	sum := (f(1) + f(0)) / 2
	for _, c2 := range trapezoidLevel(0) {
		sum += f(c2)
	}
	n := 16
	est := sum * (math.Pi / 2 / float64(n))
	for level := 1; level <= maxLevel; level++ {
		for _, c2 := range trapezoidLevel(level) {
			sum += f(c2)
		}
		n *= 2
		next := sum * (math.Pi / 2 / float64(n))
		done := math.Abs(next-est) <= tol*math.Max(next, 1e-300)
		est = next
		if done {
			break
		}
	}
	return math.Min(1, math.Max(0, est*2/math.Pi))
}

const maxLevel = 10

var (
	levelsOnce [maxLevel + 1]sync.Once
	levels     [maxLevel + 1][]float64
)

// trapezoidLevel returns cos²ψ at the new nodes of a level of the doubling
// trapezoid rule on [0, π/2]: level 0 the 15 inner nodes of 16 intervals,
// level k the 16·2^(k−1) midpoints of the level before. Each table is built
// once, when first needed.
func trapezoidLevel(k int) []float64 {
	levelsOnce[k].Do(func() {
		n := 16 << k
		h := math.Pi / 2 / float64(n)
		start, stride := 1, 2
		if k == 0 {
			stride = 1
		}
		var nodes []float64
		for i := start; i < n; i += stride {
			c := math.Cos(float64(i) * h)
			nodes = append(nodes, c*c)
		}
		levels[k] = nodes
	})
	return levels[k]
}
