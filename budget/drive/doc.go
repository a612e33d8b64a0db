// Package drive computes the light at the atoms: at each atoms element the
// intensity, saturation, Rabi frequency, detuning, scattering rate and, for
// far-detuned light, the dipole potential; every beam at a cloud counted
// together (the combined trap found at its real minimum, light shifts,
// near-resonant totals); drive goals solved back to the source power; and
// the Monte Carlo analysis of goals over toleranced inputs.
//
// Sources and conventions:
//   - Two-level figures, the far-detuned dipole potential and the collective
//     threshold come from package atoms, each with its published source.
//   - Dipole traps: Grimm, Weidemüller and Ovchinnikov, Adv. At. Mol. Opt.
//     Phys. 42, 95 (2000); gravity along the cloud's down; a trap is judged
//     at its real minimum and its depth is the lowest escape barrier.
//   - Thick clouds: each ray a saturable absorber (package atoms), integrated
//     over the beam by Gauss–Legendre quadrature (package budget's
//     CloudColumn, which the power budget shares).
//   - Tolerances: one PCG random stream per sample from a fixed seed, so the
//     result is the same on any number of cores.
//
// # Formulas
//
//	| quantity | expression | source | function | test |
//	| --- | --- | --- | --- | --- |
//	| axial curvature of I | κ = g''/g, g = 1/(Wx Wy) | Siegman (1986) §17.1 (κ = −2/z_R² at a focus) | axialCurvature | TestAxialTrapFrequencyAtAndOffFocus |
//	| standing-wave depth | sign · (√U₁ + √U₂)², magnitudes | Grimm et al. (2000) §4.1 | StandingWavePotential | TestCloudStandingWave |
//	| lattice frequency | ω = (2π/λ) √(2U/m) | Grimm et al. (2000) eq. (40) | LatticeFrequency | TestCloudStandingWave |
//	| lattice modulation depth | 4√(U₁U₂) | Grimm et al. (2000) §4.1 (the fields adding) | LatticeModulation | TestLatticeModulation |
//	| excited-state light shift | U/I = −α/(2 ε0 c), α in a.u. × 4π ε0 a0³ | Grimm et al. (2000) eq. (2) | ExcitedShiftPerIntensity | TestExcitedShiftPerIntensity |
//	| multi-beam scattering | (Γ/2) s_i/(1 + s_total + 4Δ²/Γ²) | rate equations, common practice | MultiBeamScattering | TestCloudNearResonantTotals |
//	| goal probability | share of Monte Carlo samples with margin ≥ 0 | uniform: (b − η*)/(b − a); normal: Φ((μ − η*)/σ), gonum distuv | Tolerances | TestToleranceUniformProbability |
package drive
