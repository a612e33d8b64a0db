// Package numeric holds the small numerical routines the budget and the
// drive share: one-dimensional searches (golden section, bracketing and
// bisection, secant steps on a power law), a Nelder–Mead simplex that runs in
// the caller's goroutine, vectors of three components and percentiles of
// samples. Each is tested against a reference library (gonum) or a minimum
// known by hand.
//
// # Formulas
//
//	| quantity | expression | source | function | test |
//	| --- | --- | --- | --- | --- |
//	| percentile of samples | linear between ranks at (n−1)p | common practice (numerical packages' default) | Percentile | TestPercentile |
package numeric
