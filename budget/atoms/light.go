package atoms

import "math"

// Saturation is s = I / I_sat.
func Saturation(intensity, isat float64) float64 { return intensity / isat }

// Rabi is the resonant Rabi frequency Ω = Γ √(s/2), rad/s, on a two-level
// transition (Steck, alkali D-line data sheets, relation between Ω, s and Γ).
func Rabi(Γ, s float64) float64 { return Γ * math.Sqrt(s/2) }

// SaturationForRabi inverts Rabi: s = 2 (Ω/Γ)².
func SaturationForRabi(Γ, Ω float64) float64 { return 2 * (Ω / Γ) * (Ω / Γ) }

// ScatteringRate is the two-level photon scattering rate
// R = (Γ/2) s / (1 + s + (2Δ/Γ)²), photons/s, for detuning Δ (rad/s)
// (Steck, alkali D-line data sheets, eq. (48) of the Rb-87 sheet).
func ScatteringRate(Γ, s, Δ float64) float64 {
	return Γ / 2 * s / (1 + s + 4*Δ*Δ/(Γ*Γ))
}

// OpticalDepth is the resonant optical depth along the beam through the
// centre of a Gaussian cloud of N atoms whose column across the beam has
// rms widths σx, σy and correlation ρ (the cloud's covariance projected on
// the beam's x and y: non-zero for a beam oblique to an anisotropic
// cloud): b0 = σ0 N / (2π σx σy √(1 − ρ²)), which is
// σ0 N/(2π √(det Σ · dᵀΣ⁻¹d)) for the cloud's covariance Σ and the beam's
// direction d.
func OpticalDepth(σ0, n, σx, σy, ρ float64) float64 {
	return σ0 * n / (2 * math.Pi * σx * σy * math.Sqrt(1-ρ*ρ))
}

// Dipole holds the far-detuned response per unit intensity.
type Dipole struct {
	// PotentialPerIntensity is U/I, J per W/m² (negative: attractive).
	PotentialPerIntensity float64
	// ScatteringPerIntensity is Γ_sc/I, photons/s per W/m².
	ScatteringPerIntensity float64
	// RWAPotentialPerIntensity is the rotating-wave shortcut of U/I, for
	// comparison.
	RWAPotentialPerIntensity float64
}

// FarDetuned is the ground-state dipole potential and scattering rate for
// light of angular frequency ω, summed over the transition's lines with their
// weights (linear polarization). Each line keeps the counter-rotating term
// (Grimm, Weidemüller and Ovchinnikov, Adv. At. Mol. Opt. Phys. 42, 95
// (2000), eqs. (9) and (10)):
//
//	U = −(3πc²/(2ω_i³)) (Γ_i/(ω_i−ω) + Γ_i/(ω_i+ω)) I,
//	Γ_sc = (3πc²/(2ħω_i³)) (ω/ω_i)³ (Γ_i/(ω_i−ω) + Γ_i/(ω_i+ω))² I.
func FarDetuned(lines []Line, ω float64) Dipole {
	var d Dipole
	for _, l := range lines {
		w := l.Weight()
		ωi := 2 * math.Pi * C / l.Wavelength
		pre := 3 * math.Pi * C * C / (2 * ωi * ωi * ωi)
		f := l.Gamma/(ωi-ω) + l.Gamma/(ωi+ω)
		d.PotentialPerIntensity += -w * pre * f
		d.ScatteringPerIntensity += w * pre / Hbar * math.Pow(ω/ωi, 3) * f * f
		d.RWAPotentialPerIntensity += w * pre * l.Gamma / (ω - ωi)
	}
	return d
}

// RadialTrapFrequency is the harmonic trap frequency across a Gaussian
// beam of depth U0 (J, > 0) and 1/e² radius w (m) at the atoms, for mass m
// (kg): ω_r = √(4U0/(m w²)), rad/s (Grimm, Weidemüller and Ovchinnikov
// (2000), eq. (37)).
func RadialTrapFrequency(u0, w, m float64) float64 { return math.Sqrt(4 * u0 / (m * w * w)) }

// AxialTrapFrequency is the harmonic trap frequency along a beam of depth U0
// (J, > 0) for mass m (kg), from the relative curvature κ = I”(z)/I(z) of
// the on-axis intensity at the atoms (1/m²): ω_z = √(−U0 κ/m), rad/s; NaN
// where κ ≥ 0 (no confinement along the beam there). At the focus of a round
// beam κ = −2/z_R² and ω_z = √(2U0/(m z_R²)) (Grimm et al. (2000), eq. (37)).
func AxialTrapFrequency(u0, κ, m float64) float64 {
	if κ >= 0 {
		return math.NaN()
	}
	return math.Sqrt(-u0 * κ / m)
}

// LinewidthHz is the natural linewidth Γ (rad/s) in hertz, Γ/2π: the
// figure data sheets print, and the unit of a detuning written in Γ.
func LinewidthHz(Γ float64) float64 { return Γ / (2 * math.Pi) }

// DepthTemperature is a trap depth given as U/h (Hz) expressed as U/k_B
// (K): h f / k_B.
func DepthTemperature(uOverH float64) float64 { return H * uOverH / KB }

// DepthFrequency is a trap depth U/k_B (K) expressed as U/h (Hz): k_B T / h,
// the inverse of DepthTemperature.
func DepthFrequency(uOverKB float64) float64 { return KB * uOverKB / H }

// RecoilTemperature is T_r = ħ²k²/(m k_B) with k = 2π/λ: twice the
// kinetic energy of an atom of mass m (kg) that has absorbed one photon of
// wavelength λ (m), as a temperature, K (the recoil temperature of Steck's
// alkali D-line data; Grimm, Weidemüller and Ovchinnikov (2000) write the
// same k_B T_rec = ħ²k²/m).
func RecoilTemperature(λ, m float64) float64 {
	k := 2 * math.Pi / λ
	return Hbar * Hbar * k * k / (m * KB)
}

// RecoilHeatingRate is the heating of atoms in a far-detuned trap by the
// trap light's spontaneous scattering, K/s: every scattered photon gives
// on average 2 E_rec = k_B T_r (one recoil absorbing, one emitting), and
// in a three-dimensional harmonic trap the energy goes equally into motion
// and potential, E = 3 k_B T, so dT/dt = T_r Γ_sc/3 (Grimm et al. (2000),
// §2.3; with the recoil temperature taken as E_rec/k_B instead, the same
// rate reads (2/3) T_rec Γ_sc). tr is T_r (K), Γsc the photons each atom
// scatters per second.
func RecoilHeatingRate(tr, Γsc float64) float64 { return tr * Γsc / 3 }

// PhotonsToHeatOut is how many photons an atom at the bottom of a trap of
// depth U (J) scatters before the average 2 E_rec = k_B T_r each gives
// (random kicks, a pulse long against the trap period) lifts it to the
// depth: U/(k_B T_r), for T_r in K.
func PhotonsToHeatOut(U, tr float64) float64 { return U / (KB * tr) }

// PhotonsToPushOut is how many photons an atom at the bottom of a trap of
// depth U (J) scatters from one beam, in a pulse short against the trap
// period, before it leaves: the N absorption kicks add along the beam,
// N² E_rec, and the N emissions at random, N E_rec, so N² + N = U/E_rec with
// E_rec = k_B T_r/2 (by hand from momentum conservation; common practice).
func PhotonsToPushOut(U, tr float64) float64 {
	r := U / (KB * tr / 2)
	return (math.Sqrt(1+4*r) - 1) / 2
}
