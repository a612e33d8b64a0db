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
//	| axial curvature of I | κ = g''/g, g = 1/(Wx Wy) | Siegman (1986) §17.1 (κ = −2/z_R² at a focus) | axialCurvature | TestAxialTrapFrequencyAtAndOffFocus |
//	| light frequency | ν = c/λ + AOM shifts | CODATA c; Steck Rb-87 table 3 | LightFrequency | TestLightFrequency |
//	| default viewing duration | 0.25 s in 400–700 nm, else 10 s | IEC 60825-1:2014 (from memory) | DefaultViewingDuration | TestDefaultViewingDuration |
//	| standing-wave depth | sign · (√U₁ + √U₂)², magnitudes | Grimm et al. (2000) §4.1 | StandingWavePotential | TestCloudStandingWave |
//	| lattice frequency | ω = (2π/λ) √(2U/m) | Grimm et al. (2000) eq. (40) | LatticeFrequency | TestCloudStandingWave |
//	| excited-state light shift | U/I = −α/(2 ε0 c), α in a.u. × 4π ε0 a0³ | Grimm et al. (2000) eq. (2) | ExcitedShiftPerIntensity | TestExcitedShiftPerIntensity |
//	| multi-beam scattering | (Γ/2) s_i/(1 + s_total + 4Δ²/Γ²) | rate equations, common practice | MultiBeamScattering | TestCloudNearResonantTotals |
//	| beam axes in the cloud frame | x plane ∋ first cloud axis not along the beam | our convention | BeamAxes | TestBeamAxes |
//	| cloud rms along a direction | √Σ dᵢ² σᵢ² | Gaussian cloud | Cloud.RMSAlong | TestBeamAxes |
//	| goal probability | share of Monte Carlo samples with margin ≥ 0 | uniform: (b − η*)/(b − a); normal: Φ((μ − η*)/σ), gonum distuv | Tolerances | TestToleranceUniformProbability |
package budget
