// Package safety evaluates a setup: it runs the power and beam budget of
// package budget and gathers its findings into one assessment that the
// terminal, JSON and PDF outputs share.
//
// Conventions: SI base units throughout (m, W, s, W/m²); beam sizes are
// 1/e² intensity radii. Hazard figures use each laser's maximum power.
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
//	| aperture-averaged irradiance | P·fraction(circle of D)/(πD²/4), exact elliptical fraction | IEC 60825-1:2014 limiting apertures; 1 − exp(−2a²/W²) | apertureIrradiance | TestApertureIrradianceRound |
//	| worst point of a segment | maximum between the x and y waists | golden-section search | maxAlong | TestMaxAlongFindsFocus |
//	| hazard distance | propagated until below the MPE | IEC closed form for a diverging beam | hazardDistance | TestHazardDistanceMatchesClosedForm |
//	| diffuse hazard zone | r = √(ρP cos θ/(π MPE)) | Lambertian reflector, by hand | DiffuseHazardRadius | ExampleDiffuseHazardRadius |
//	| linear power density on an optic | P/(2 min(Wx, Wy)), summed over the beams meeting there | common practice for cw damage ratings; by hand | LinearPowerDensity | TestDamageAddsOverSharedBeams |
//	| a beam's own power density (EN 207's basis) | max over the segment of 2P/(π Wx Wy), P over the 63 % area | Siegman (1986) §17.1; EN 207 (from memory); by hand at a focus | PeakAlong | TestNoEN207FilterIsADefect |
//	| alignment power | P / ratio, the ratio rounded up to three figures | the ratio scales with the power; by hand for one Gaussian beam | AlignmentPower | TestAlignmentPowerByHand |
package safety
