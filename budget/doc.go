// Package budget reads setup files and computes, for every beam path, the
// beam size and power at each element.
//
// Sources and conventions:
//   - Quantities are float64 in SI base units (m, W, s, Hz, K, W/m²); units
//     appear only in ParseQuantity and the Format functions.
//   - Beam size is the 1/e² intensity radius W in x and y (for M² > 1 the
//     second-moment radius of ISO 11146). Peak irradiance I₀ = 2P/(π Wx Wy).
//   - Propagation: complex beam parameter q and ABCD matrices per plane, with
//     the embedded-Gaussian treatment of M² (Siegman, Lasers (1986), ch. 17):
//     a beam of quality M² propagates as a Gaussian of wavelength M²λ.
//   - Clipping at a centred circular clear aperture: the exact fraction of an
//     elliptical Gaussian (CircleFraction), not the round-beam shortcut.
//   - Fibre coupling: the overlap with the fibre's Gaussian mode (Marcuse,
//     Bell Syst. Tech. J. 56, 703 (1977)); beams with M² > 1 as Gaussian
//     Schell-model beams (Gori, Opt. Commun. 34, 301 (1980)).
//   - Positions along a path are free-space distances from its start; a thick
//     window's glass is counted in those distances, and its focus shift
//     t(1 − 1/n) is applied at the window.
//   - Power budget: every element's loss is named; an element whose loss is
//     not stated is lossless, and counted as such. For each laser, dumps +
//     open ends + losses = the source power.
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
//	| light frequency | ν = c/λ + AOM shifts | CODATA c; Steck Rb-87 table 3 | LightFrequency | TestLightFrequency |
//	| default viewing duration | 0.25 s in 400–700 nm, else 10 s | IEC 60825-1:2014 (from memory) | DefaultViewingDuration | TestDefaultViewingDuration |
//	| beam axes in the cloud frame | x plane ∋ first cloud axis not along the beam | our convention | BeamAxes | TestBeamAxes |
//	| cloud rms along a direction | √Σ dᵢ² σᵢ² | Gaussian cloud | Cloud.RMSAlong | TestBeamAxes |
package budget
