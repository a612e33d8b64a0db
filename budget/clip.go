package budget

import "math"

// CircleFraction is the fraction of an elliptical Gaussian beam's power
// (1/e² radii wx, wy, m) that passes a centred circular aperture of radius a
// (m).
//
// In polar coordinates the radial integral is elementary; with the angle
// substitution tan φ = (wy/wx) tan ψ the remaining angular integral becomes
//
//	T = (2/π) ∫₀^{π/2} [1 − exp(−2a² / (wx² cos²ψ + wy² sin²ψ))] dψ,
//
// a smooth periodic integrand, summed with the trapezoid rule (which
// converges geometrically for such integrands) until two successive
// estimates agree to 1e-13. For wx = wy it is T = 1 − exp(−2a²/w²)
// (Siegman, Lasers (1986), §17.1).
func CircleFraction(wx, wy, a float64) float64 {
	if a <= 0 {
		return 0
	}
	if math.IsInf(a, 1) {
		return 1
	}
	if wx == wy {
		return -math.Expm1(-2 * a * a / (wx * wx))
	}
	f := func(ψ float64) float64 {
		c, s := math.Cos(ψ), math.Sin(ψ)
		return -math.Expm1(-2 * a * a / (wx*wx*c*c + wy*wy*s*s))
	}
	// Trapezoid rule on [0, π/2]; the integrand is even about both ends, so
	// this is the periodic trapezoid rule.
	n := 16
	h := math.Pi / 2 / float64(n)
	sum := (f(0) + f(math.Pi/2)) / 2
	for i := 1; i < n; i++ {
		sum += f(float64(i) * h)
	}
	est := sum * h
	for n < 1<<20 {
		h /= 2
		for i := 1; i < 2*n; i += 2 {
			sum += f(float64(i) * h)
		}
		n *= 2
		next := sum * h
		if math.Abs(next-est) <= 1e-13*math.Max(next, 1e-300) {
			est = next
			break
		}
		est = next
	}
	return math.Min(1, math.Max(0, est*2/math.Pi))
}
