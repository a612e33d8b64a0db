// Package budget computes the power budget of a setup: for every beam path,
// the beam size and power at each element, every loss named, beams that
// merge on combiners followed through the optics they share, and the
// findings of the budget itself (clipping, poor fibre coupling, unused
// lasers).
//
// Sources and conventions:
//   - Gaussian propagation, clipping and fibre coupling come from package
//     optics, each with its source; the element kinds' effects on the beam
//     and its power are the table in effects.go, one entry per kind of the
//     setup format (package setup).
//   - Positions along a path are free-space distances from its start; a thick
//     window's glass is counted in those distances, and its focus shift
//     t(1 − 1/n) is applied at the window.
//   - Power budget: every element's loss is named; an element whose loss is
//     not stated is lossless, and counted as such. For each laser, dumps +
//     open ends + losses = the source power.
//   - Thick clouds: each ray through an atoms element is a saturable
//     absorber (package atoms), integrated over the beam by Gauss–Legendre
//     quadrature (CloudColumn); the drive shares the same column.
//
// # Formulas
//
// Every figure the package computes: its expression, the source it is
// checked against, the one function that computes it and the test that
// checks that function (TestFormulaIndex keeps this table true: each
// function exists and is called by production code, each test exists and
// calls it).
//
//	| quantity | expression | source | function | test |
//	| --- | --- | --- | --- | --- |
//	| laser balance | dumps + open ends + Σ named losses = 1 | energy conservation, common practice | LaserBalance.Total | TestBudgetCloses |
//	| thick-cloud transmission | ∬ over the beam of each ray's saturable absorption | atoms.OutgoingIntensity per ray; the radial integral by gonum quadrature | CloudColumn.Absorb | TestAbsorbNarrowBeamAgainstRadialIntegral |
package budget
