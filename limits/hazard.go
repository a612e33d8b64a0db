package limits

import (
	"beamledger/budget/numeric"
	"math"
)

// OneOverEDiameter converts a 1/e² diameter (or full divergence angle) to the
// 1/e diameter the standard's hazard-distance formulas use: d₁/ₑ = d₁/ₑ² / √2
// (for a Gaussian, the 1/e irradiance points lie at w/√2).
func OneOverEDiameter(d float64) float64 { return d / math.Sqrt2 }

// NOHD is the nominal ocular hazard distance, m, of a Gaussian beam of power
// p (W), 1/e² diameter d (m) and full divergence angle φ (rad, 1/e²) against
// an MPE irradiance (W/m²), from the closed form with the 1/e quantities a
// and φ₁/ₑ: NOHD = (√(4P/(π MPE)) − a)/φ₁/ₑ, where 4P/(π a²) is the peak
// irradiance. It is 0 when the exit itself is below the MPE and +Inf for a
// beam that does not diverge. The value is rounded up (numeric.RoundUp).
func NOHD(p, d, φ, mpe float64) float64 {
	a, phi := OneOverEDiameter(d), OneOverEDiameter(φ)
	r := (math.Sqrt(4*p/(math.Pi*mpe)) - a) / phi
	switch {
	case r <= 0:
		return 0
	case phi <= 0:
		return math.Inf(1)
	}
	return numeric.RoundUp(r, 3)
}

// OpticalDensity is the OD an attenuator needs to bring an exposure ratio
// (exposure ÷ MPE) to 1 or below, rounded up to a whole number; 0 when the
// ratio is at most 1.
func OpticalDensity(ratio float64) float64 {
	if !(ratio > 1) {
		return 0
	}
	return math.Ceil(math.Log10(ratio) - 1e-12)
}

// EN 207 test conditions (emission types): D continuous (pulses longer
// than 0.25 s), I long pulses (longer than 1 µs, to 0.25 s), R Q-switched
// (longer than 1 ns, to 1 µs), M mode-locked (1 ns and shorter), the
// boundaries as EN 207 publishes them (from memory).
const (
	EN207D = "D"
	EN207I = "I"
	EN207R = "R"
	EN207M = "M"
)

// EN207Mode is the test condition of a source: D for continuous emission
// (pulsed false) or pulses longer than 0.25 s, else I, R or M by the pulse
// duration τ (s): I above 1 µs, R above 1 ns, M at 1 ns and below.
func EN207Mode(pulsed bool, τ float64) string {
	switch {
	case !pulsed || τ > 0.25:
		return EN207D
	case τ > 1e-6:
		return EN207I
	case τ > 1e-9:
		return EN207R
	}
	return EN207M
}

// MaxEN207Scale is the highest scale number EN 207 rates a filter for: a
// need beyond it has no rated filter.
const MaxEN207Scale = 10

// EN207Scale is the EN 207 scale number LB n in 315–1400 nm for the test
// condition mode: the filter attenuates by 10^n (n ≥ od) and withstands, in
// its column of the scale table, an irradiance of 10^(n+1) W/m² (D) or a
// radiant exposure per pulse of 0.05·10^(n−1) J/m² (I, R) or
// 1.5e-3·10^(n−1) J/m² (M). exposure is the irradiance for D and the radiant
// exposure per pulse otherwise, of the beam itself (its power or energy
// over the area of its 63 % diameter, which EN 207 rates against; from
// memory). n is at least 1; above MaxEN207Scale no rated filter exists. ok
// is false outside 315–1400 nm, where this package gives no scale number.
func EN207Scale(λ float64, mode string, od, exposure float64) (n int, ok bool) {
	if λ < 315e-9 || λ > 1400e-9 {
		return 0, false
	}
	need := od
	if exposure > 0 {
		var first float64 // the column's value at LB1
		switch mode {
		case EN207D:
			first = 100
		case EN207I, EN207R:
			first = 0.05
		default:
			first = 1.5e-3
		}
		need = math.Max(need, math.Ceil(math.Log10(exposure/first)-1e-12)+1)
	}
	return int(math.Max(1, need)), true
}

// EN207Row is where the scale table comes from.
func EN207Row() Provenance {
	return Provenance{Standard: "EN 207:2017", Table: "scale numbers, 315–1400 nm", Row: "D: 10^(n+1) W/m²; I, R: 0.05·10^(n−1) J/m²; M: 1.5e-3·10^(n−1) J/m²", Status: StatusFromMemory}
}

// ApertureAverage is the irradiance (W/m²) of a round Gaussian beam of power
// p (W) and 1/e² radius w (m) averaged over a centred aperture of diameter D
// (m): P (1 − exp(−2(D/2)²/w²)) / (π D²/4).
func ApertureAverage(p, w, D float64) float64 {
	r := D / 2
	return p * -math.Expm1(-2*r*r/(w*w)) / (math.Pi * r * r)
}

// Spectral regions for the additivity of effects.
func additivityRegion(λ float64) int {
	switch nm := λ * 1e9; {
	case nm < 315:
		return 0 // UV-C and UV-B
	case nm < 400:
		return 1 // UV-A
	case nm < 1400:
		return 2 // visible and IR-A: the retina
	}
	return 3 // IR-B and IR-C
}

// EffectsAdd says whether exposures at wavelengths λ1 and λ2 (m) add, on
// the eye and on the skin: on the eye when both reach the same tissue (both
// in 400–1400 nm, the retina; or both outside it, the cornea and lens), on
// the skin always. This is our reading of the standard's table of additive
// effects (from memory), resolved towards adding where we were unsure
// (summing ratios can only overstate the hazard).
func EffectsAdd(λ1, λ2 float64) (eye, skin bool) {
	r1, r2 := additivityRegion(λ1), additivityRegion(λ2)
	return (r1 == 2) == (r2 == 2), true
}

// AdditivityRow is where the additivity rule comes from.
func AdditivityRow() Provenance {
	return memory("additivity of effects of different spectral regions", "eye: 400–1400 nm with 400–1400 nm, and 180–400 nm with 1400 nm–1 mm; skin: all (unsure cells resolved towards adding)")
}

// SharedOD is the OD eyewear needs at one of n wavelengths on a segment
// whose exposure ratios add, for that wavelength's ratio: each of the n
// additive wavelengths is held to 1/n of the limit, ⌈log10(n · ratio)⌉, so
// that the attenuated ratios sum to at most 1 (our rule).
func SharedOD(ratio float64, n int) float64 { return OpticalDensity(float64(max(n, 1)) * ratio) }
