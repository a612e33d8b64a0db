// Package limits holds the exposure limits of IEC 60825-1:2014 (Edition 3,
// Annex A) as pure functions of wavelength, exposure duration and angular
// subtense: the maximum permissible exposure (MPE) at the cornea and for the
// skin, the correction factors C1…C7, T1 and T2, the limiting apertures, and
// the accessible emission limits (AEL) of the classes for continuous
// emission.
//
// Conventions: wavelengths in m, durations in s, angles in rad, radiant
// exposure in J/m², irradiance in W/m², powers in W. A wavelength or duration
// outside a table is an error naming the quantity, its value and the valid
// range; nothing is extrapolated.
//
// Provenance. The standard's text is not reproduced or available to this
// project: every number below was transcribed from memory of IEC
// 60825-1:2014 (and, where noted, of Edition 2, 2007) and is marked so in the
// tests. Where the recollection was uncertain the lower (more restrictive)
// value was taken, and the comment says so. Every value must be checked
// against the standard's own tables before the output is relied on; SAFETY.md
// says the same to users.
//
// Continuous AELs are derived as the MPE at the classification time base
// times the area of the limiting aperture, the relation the tables are built
// on; the tables round to two figures, this package does not round.
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
//	| eye MPE | the MPE table by band and duration | IEC 60825-1:2014 Annex A, eye MPE tables (from memory) | EyeMPE | TestEyeMPETable |
//	| skin MPE | the skin MPE table | IEC 60825-1:2014 Annex A, skin MPE table (from memory) | SkinMPE | TestSkinMPETable |
//	| correction factors | C1 … C7, T1, T2 | IEC 60825-1:2014, table of correction factors (from memory) | C4 | TestFactors |
//	| pulse-train factor | C5 = N^−0.25 | IEC 60825-1:2007 (from memory) | C5 | TestFactors |
//	| limiting apertures | 1, 3.5, 7 mm … | IEC 60825-1:2014, table of limiting apertures (from memory) | EyeAperture | TestApertures |
//	| continuous AELs | MPE × aperture area at the time base | IEC 60825-1:2014, AEL tables (from memory) | ContinuousAEL | TestContinuousAEL |
//	| class | lowest class whose AEL the power does not exceed | IEC 60825-1:2014, classification (from memory) | ClassOf | TestContinuousAEL |
//	| repetitive pulses | single pulse, average, C5 | IEC 60825-1:2014, repetitive-pulse rules (from memory) | PulsedEyeMPE | TestPulsedRules |
//	| NOHD | (√(4P/(π MPE)) − a)/φ | IEC 60825-1:2014 NOHD expression (from memory); worked example | NOHD | ExampleNOHD |
//	| 1/e diameter | d/√2 | Gaussian profile, common practice | OneOverEDiameter | ExampleOneOverEDiameter |
//	| aperture-averaged irradiance | P(1 − exp(−2(D/2)²/W²))/(πD²/4) | Gaussian profile | ApertureAverage | TestRoundingIsUpward |
//	| optical density | ⌈log10(ratio)⌉ | EN 207; common practice | OpticalDensity | TestRoundingIsUpward |
//	| EN 207 scale number | LB by irradiance for cw | EN 207 scale table (from memory) | EN207ScaleCW | TestEN207 |
package limits
