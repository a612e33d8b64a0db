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
// centre of a Gaussian cloud of N atoms with rms radii σx, σy across the
// beam: b0 = σ0 N / (2π σx σy).
func OpticalDepth(σ0, n, σx, σy float64) float64 { return σ0 * n / (2 * math.Pi * σx * σy) }

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

// Polarizability is the ground-state dynamic polarizability in atomic units
// implied by U = −α I / (2 ε0 c) (Grimm et al. (2000), eq. (4)).
func (d Dipole) Polarizability() float64 {
	return -d.PotentialPerIntensity * 2 * Eps0 * C / AUPol
}

// TrapFrequencies of a single focused Gaussian beam of depth U0 (J, > 0),
// 1/e² waist radii wx, wy and Rayleigh range zR (m) for mass m (kg): the
// harmonic approximations ω_r = √(4U0/(m w²)) and ω_z = √(2U0/(m zR²)),
// rad/s (Grimm et al. (2000), §4.1.1).
func TrapFrequencies(u0, wx, wy, zR, m float64) (ωx, ωy, ωz float64) {
	return math.Sqrt(4 * u0 / (m * wx * wx)), math.Sqrt(4 * u0 / (m * wy * wy)), math.Sqrt(2 * u0 / (m * zR * zR))
}
