package budget

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
