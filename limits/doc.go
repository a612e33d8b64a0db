// Package limits holds the exposure limits of IEC 60825-1:2014 (Edition 3,
// Annex A) and of the EU directive 2006/25/EC (Annex II), and the choice
// between them (EyeMPEIn, SkinMPEIn, PulsedEyeMPEIn: one set, or the lower
// of the two), as pure functions of wavelength, exposure duration and angular
// subtense: the maximum permissible exposure (MPE) at the cornea and for the
// skin, the correction factors C1…C7, T1 and T2, the limiting apertures, and
// the accessible emission limits (AEL) of the classes for continuous
// emission, the repetitive-pulse rules and the EN 207 scale numbers.
//
// Conventions: wavelengths in m, durations in s, angles in rad, radiant
// exposure in J/m², irradiance in W/m², powers in W. A wavelength or duration
// outside a table is an error naming the quantity, its value and the valid
// range; nothing is extrapolated.
//
// Provenance. The standard's text is not reproduced or available to this
// project. Every value carries a Provenance: the standard and edition, the
// table and row, the public sources it was compared with, and a status:
// checked (against a named public source: the EU directive's tables of
// coefficients and of corrections for repetitive exposure), checked against
// an earlier edition's values as reprinted in public guidance (a few rows),
// from memory (most MPE and AEL rows), or a conservative substitute (C7 = 8 above 1250 nm in place of
// Edition 3's larger value, C5 without the small-source relaxation, and
// MPE × aperture area where no Class 1 row was transcribed). The outputs
// print it beside each value and list the values that were not checked.
//
// Printed values. Each limit is the value its table row prints; where two
// bands meet discontinuously, the row that starts at the edge applies.
// Nothing is smoothed for continuity.
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
//	| continuous AELs | the AEL rows (Class 1 3.9e-4 C4 C7 W, Class 2 C6 mW, 3R 5 × …, 3B 0.5 W) | IEC 60825-1:2014, AEL tables (from memory) | ContinuousAEL | TestContinuousAEL |
//	| class | lowest class whose AEL the power does not exceed | IEC 60825-1:2014, classification (from memory) | ClassOf | TestClassAtPrintedLimits |
//	| photochemical field of view | γ = 11 mrad, 1.1 t^0.5 mrad, 110 mrad | Directive 2006/25/EC Annex II Table 2.5 | Gamma | TestPhotochemicalBeyond100s |
//	| pulses counted as one | T_min by band | Directive 2006/25/EC Annex II Table 2.6 | Tmin | TestPulsedRules |
//	| repetitive pulses | single pulse, average, C5 over at most T2 | Directive 2006/25/EC Annex II Table 2.6; IEC 60825-1:2014 (from memory) | PulsedEyeMPE | TestPulsedRules |
//	| directive eye MPE | Tables 2.2 and 2.3 by band and duration | Directive 2006/25/EC Annex II Tables 2.2, 2.3 (from memory; 532 nm short pulses as read by an audit) | DirectiveEyeMPE | TestDirectiveEyeRows |
//	| directive skin MPE | Table 2.4 (Edition 3's skin rows) | Directive 2006/25/EC Annex II Table 2.4 (from memory) | DirectiveSkinMPE | TestDirectiveSkinRows |
//	| C_E | 1, α/α_min, α²/(α_min α_max), α_max = 100 mrad | Directive 2006/25/EC Annex II Table 2.5 | CE | TestCE |
//	| directive repetitive pulses | rules 1–3, C_P = N^−0.25 over every pulse | Directive 2006/25/EC Annex II Table 2.6 | DirectivePulsedEyeMPE | TestPulseTrainsCountedTheDirectivesWay |
//	| strictest limit | the lower of the two sets' values | our rule (the stricter of the limits the workplace may have to apply) | EyeMPEIn | TestStrictestNeverAboveEitherSet |
//	| strictest pulse-train limit | the lower of the two sets' limits per pulse | our rule | PulsedEyeMPEIn | TestPulseTrainsCountedTheDirectivesWay |
//	| NOHD | (√(4P/(π MPE)) − a)/φ | IEC 60825-1:2014 NOHD expression (from memory); worked example | NOHD | ExampleNOHD |
//	| 1/e diameter | d/√2 | Gaussian profile, common practice | OneOverEDiameter | ExampleOneOverEDiameter |
//	| aperture-averaged irradiance | P(1 − exp(−2(D/2)²/W²))/(πD²/4) | Gaussian profile | ApertureAverage | TestRoundingIsUpward |
//	| optical density | ⌈log10(ratio)⌉ | EN 207; common practice | OpticalDensity | TestRoundingIsUpward |
//	| additive effects | eye: both in 400–1400 nm or both outside; skin: always | IEC 60825-1:2014, table of additive effects (from memory) | EffectsAdd | TestEffectsAdd |
//	| OD on a shared segment | ⌈log10(n · ratio)⌉ for n additive wavelengths | our rule (equal shares keep the sum ≤ 1) | SharedOD | TestEffectsAdd |
//	| EN 207 test condition | D, I, R, M by pulse duration | EN 207 (from memory) | EN207Mode | TestEN207 |
//	| EN 207 scale number | LB by irradiance (D) or radiant exposure per pulse (I, R, M) | EN 207 scale table (from memory) | EN207Scale | TestEN207 |
package limits
