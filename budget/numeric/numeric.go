package numeric

import "math"

// CmpFloat orders two numbers for sorting: −1, 0 or +1.
func CmpFloat(a, b float64) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}

// SolveScale finds the least factor k on the powers at which metric(k)
// (growing with k, about as k^γ) reaches target: first by secant steps on
// log k – log metric, which take a few evaluations when the figure is close
// to a power law; if they do not settle within 1e-4, by bracketing and
// bisection. The answer is where metric(k) ≥ target, within 0.1 %.
func SolveScale(metric func(float64) float64, target, γ float64) (float64, bool) {
	k, m := 1.0, metric(1)
	if m > 0 {
		lk, lm := math.Log(k), math.Log(m)
		for range 8 {
			nk := math.Exp(lk + (math.Log(target)-lm)/γ)
			if !(nk > 1e-6 && nk < 1e6) {
				break
			}
			nm := metric(nk)
			if !(nm > 0) {
				break
			}
			if math.Abs(nm/target-1) < 1e-4 {
				if nm >= target {
					return nk, true
				}
				// just short: step up to the safe side of the 0.1 % tolerance
				if up := nk * (1 + 1e-3); metric(up) >= target {
					return up, true
				}
				break
			}
			if d := math.Log(nk) - lk; math.Abs(d) > 1e-12 {
				if g := (math.Log(nm) - lm) / d; g > 0.05 && g < 20 {
					γ = g
				}
			}
			lk, lm = math.Log(nk), math.Log(nm)
		}
	}
	enough := func(k float64) bool { return metric(k) >= target }
	lo, hi, ok := bracket(enough)
	if !ok {
		return 0, false
	}
	return bisect(lo, hi, enough), true
}

// bracket finds factors lo < hi around the least k in [1e-6, 1e6] for which
// enough(k) holds (enough grows with k), starting from 1 and stepping by
// tens; ok is false when even 1e6 is not enough.
func bracket(enough func(float64) bool) (lo, hi float64, ok bool) {
	if enough(1) {
		hi = 1
		for hi > 1e-6 && enough(hi/10) {
			hi /= 10
		}
		return hi / 10, hi, true
	}
	lo = 1
	for lo < 1e6 {
		if enough(lo * 10) {
			return lo, lo * 10, true
		}
		lo *= 10
	}
	return 0, 0, false
}

// bisect narrows [lo, hi] on log k to 1e-3 relative and returns the upper
// end, where enough holds.
func bisect(lo, hi float64, enough func(float64) bool) float64 {
	for hi/lo > 1+1e-3 {
		mid := math.Sqrt(lo * hi)
		if enough(mid) {
			hi = mid
		} else {
			lo = mid
		}
	}
	return hi
}

// Cross is the vector product a × b.
func Cross(a, b [3]float64) [3]float64 {
	return [3]float64{a[1]*b[2] - a[2]*b[1], a[2]*b[0] - a[0]*b[2], a[0]*b[1] - a[1]*b[0]}
}

// Normalize scales a to unit length; a must not be zero.
func Normalize(a [3]float64) [3]float64 {
	n := math.Sqrt(Dot(a, a))
	return [3]float64{a[0] / n, a[1] / n, a[2] / n}
}

// Dot is the scalar product a · b.
func Dot(a, b [3]float64) float64 { return a[0]*b[0] + a[1]*b[1] + a[2]*b[2] }

// Percentile is the p-quantile of sorted values, interpolated linearly
// between the nearest ranks ((n−1)p, the usual definition of spreadsheet
// and numerical packages' default).
func Percentile(sorted []float64, p float64) float64 {
	if len(sorted) == 0 {
		return math.NaN()
	}
	h := p * float64(len(sorted)-1)
	i := int(math.Floor(h))
	if i+1 >= len(sorted) {
		return sorted[len(sorted)-1]
	}
	a, b := sorted[i], sorted[i+1]
	if math.IsInf(a, -1) || math.IsInf(b, -1) {
		return a
	}
	return a + (h-float64(i))*(b-a)
}

// GoldenMax narrows the bracket [a, b] around a maximum of f by golden-
// section search, one new evaluation per step, for at most steps steps or
// until the bracket is no wider than tol; it returns the better of the two
// interior points and f there. f must be unimodal on [a, b] for the answer
// to be the maximum; elsewhere it is a point no lower than those tried.
func GoldenMax(f func(float64) float64, a, b float64, steps int, tol float64) (x, fx float64) {
	const φ = 0.6180339887498949 // (√5 − 1)/2
	c, e := b-φ*(b-a), a+φ*(b-a)
	fc, fe := f(c), f(e)
	for i := 0; i < steps && b-a > tol; i++ {
		if fc > fe {
			b, e, fe = e, c, fc
			c = b - φ*(b-a)
			fc = f(c)
		} else {
			a, c, fc = c, e, fe
			e = a + φ*(b-a)
			fe = f(e)
		}
	}
	if fc > fe {
		return c, fc
	}
	return e, fe
}

// SimplexMin looks for a local minimum of f near x0 by the Nelder–Mead
// simplex method (Nelder & Mead, Comput. J. 7, 308 (1965), with the
// standard coefficients: reflection 1, expansion 2, contraction ½, shrink
// ½, as in Lagarias et al., SIAM J. Optim. 9, 112 (1998)). The first
// simplex is x0 and x0 + step along each axis. It stops when the best value
// has not fallen by more than ftol over stall iterations in a row, or after
// maxEval evaluations; it returns the best vertex and f there.
//
// It runs in the caller's goroutine: the trap search calls it a few
// thousand times per setup, and a general optimizer's hand-offs between
// goroutines cost more than the potential it evaluates.
func SimplexMin(f func([3]float64) float64, x0 [3]float64, step, ftol float64, stall, maxEval int) ([3]float64, float64) {
	const n = 3
	var x [n + 1][3]float64
	var fx [n + 1]float64
	for i := range x {
		x[i] = x0
		if i > 0 {
			x[i][i-1] += step
		}
		fx[i] = f(x[i])
	}
	evals := n + 1
	// order keeps the vertices sorted by value, best first.
	order := func() {
		for i := 1; i <= n; i++ {
			for j := i; j > 0 && fx[j] < fx[j-1]; j-- {
				x[j], x[j-1] = x[j-1], x[j]
				fx[j], fx[j-1] = fx[j-1], fx[j]
			}
		}
	}
	order()
	// along is the point c + t(c − worst), c the centroid of the others.
	along := func(c [3]float64, t float64) [3]float64 {
		var p [3]float64
		for k := range p {
			p[k] = c[k] + t*(c[k]-x[n][k])
		}
		return p
	}
	best, quiet := fx[0], 0
	for evals < maxEval && quiet < stall {
		var c [3]float64
		for i := range n {
			for k := range c {
				c[k] += x[i][k] / n
			}
		}
		r := along(c, 1)
		fr := f(r)
		evals++
		switch {
		case fr < fx[0]:
			e := along(c, 2)
			if fe := f(e); fe < fr {
				x[n], fx[n] = e, fe
			} else {
				x[n], fx[n] = r, fr
			}
			evals++
		case fr < fx[n-1]:
			x[n], fx[n] = r, fr
		default:
			// Contract outside (the reflected point beats the worst) or
			// inside; if that fails too, shrink towards the best vertex.
			t := -0.5
			if fr < fx[n] {
				t = 0.5
			}
			k := along(c, t)
			fk := f(k)
			evals++
			if fk < math.Min(fr, fx[n]) {
				x[n], fx[n] = k, fk
				break
			}
			for i := 1; i <= n; i++ {
				for d := range x[i] {
					x[i][d] = x[0][d] + 0.5*(x[i][d]-x[0][d])
				}
				fx[i] = f(x[i])
			}
			evals += n
		}
		order()
		if best-fx[0] > ftol {
			best, quiet = fx[0], 0
		} else {
			quiet++
		}
	}
	return x[0], fx[0]
}

// RoundUp rounds v > 0 up to n significant figures.
func RoundUp(v float64, n int) float64 {
	if v <= 0 || math.IsInf(v, 0) || math.IsNaN(v) {
		return v
	}
	e := math.Floor(math.Log10(v)) - float64(n-1)
	s := math.Pow(10, e)
	r := math.Ceil(v/s-1e-9) * s
	if r < v {
		r += s
	}
	return r
}
