package budget

import "math"

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
