package limits

import (
	"fmt"
	"math"
)

// Range of the tables.
const (
	MinWavelength = 180e-9 // m
	MaxWavelength = 1e-3   // m
	MinDuration   = 1e-13  // s
	MaxDuration   = 3e4    // s
)

// AlphaMin is the smallest angular subtense of a source, 1.5 mrad.
const AlphaMin = 1.5e-3

// RangeError is a lookup outside a table.
type RangeError struct {
	Quantity string
	Value    string
	Valid    string
}

func (e *RangeError) Error() string {
	return fmt.Sprintf("%s %s is outside the tables (valid: %s)", e.Quantity, e.Value, e.Valid)
}

func checkRange(λ, t float64) error {
	if !(λ >= MinWavelength && λ <= MaxWavelength) {
		return &RangeError{"wavelength", fmt.Sprintf("%g nm", λ*1e9), "180 nm to 1 mm"}
	}
	if !(t >= MinDuration && t <= MaxDuration) {
		return &RangeError{"duration", fmt.Sprintf("%g s", t), "1e-13 s to 3e4 s"}
	}
	return nil
}

// C1 = 5.6·10³ t^0.25 (t in s), UV 302.5–400 nm.
func C1(t float64) float64 { return 5.6e3 * math.Pow(t, 0.25) }

// C2 = 10^(0.2(λ − 295)) (λ in nm), 302.5–315 nm.
func C2(nm float64) float64 { return math.Pow(10, 0.2*(nm-295)) }

// T1 = 10^(0.8(λ − 295)) · 10⁻¹⁵ s (λ in nm), 302.5–315 nm.
func T1(nm float64) float64 { return math.Pow(10, 0.8*(nm-295)) * 1e-15 }

// C3 = 1 for 400–450 nm, 10^(0.02(λ − 450)) for 450–600 nm (photochemical).
func C3(nm float64) float64 {
	if nm <= 450 {
		return 1
	}
	return math.Pow(10, 0.02*(nm-450))
}

// C4 = 1 below 700 nm, 10^(0.002(λ − 700)) for 700–1050 nm, 5 for 1050–1400 nm.
func C4(nm float64) float64 {
	switch {
	case nm < 700:
		return 1
	case nm < 1050:
		return math.Pow(10, 0.002*(nm-700))
	}
	return 5
}

// C7 = 1 for 700–1150 nm, 10^(0.018(λ − 1150)) for 1150–1200 nm and 8 for
// 1200–1400 nm. Edition 3 raised it above 1250 nm (to 8 + 10^(0.04(λ − 1250)),
// as we recall); the Edition 2 value is kept here as the more restrictive.
func C7(nm float64) float64 {
	switch {
	case nm < 1150:
		return 1
	case nm < 1200:
		return math.Pow(10, 0.018*(nm-1150))
	}
	return 8
}

// AlphaMax is the angular subtense beyond which a source no longer gains:
// 5 mrad below 625 µs, 200 t^0.5 mrad up to 0.25 s, 100 mrad after.
func AlphaMax(t float64) float64 {
	switch {
	case t < 625e-6:
		return 5e-3
	case t < 0.25:
		return 200e-3 * math.Sqrt(t)
	}
	return 0.1
}

// C6 = 1 for α ≤ α_min, α/α_min up to α_max, α_max/α_min beyond.
func C6(α, t float64) float64 {
	switch {
	case α <= AlphaMin:
		return 1
	case α <= AlphaMax(t):
		return α / AlphaMin
	}
	return AlphaMax(t) / AlphaMin
}

// T2 = 10 s for α ≤ 1.5 mrad, 10·10^((α − 1.5)/98.5) s up to 100 mrad
// (α in mrad), 100 s beyond.
func T2(α float64) float64 {
	mrad := α * 1e3
	switch {
	case mrad <= 1.5:
		return 10
	case mrad < 100:
		return 10 * math.Pow(10, (mrad-1.5)/98.5)
	}
	return 100
}

// Gamma is the field of view (rad) over which the photochemical limit is
// measured: 11 mrad up to 100 s, 1.1 t^0.5 mrad up to 1e4 s, 110 mrad beyond.
func Gamma(t float64) float64 {
	switch {
	case t <= 100:
		return 11e-3
	case t < 1e4:
		return 1.1e-3 * math.Sqrt(t)
	}
	return 110e-3
}

// FactorProvenance is where a correction factor or breakpoint comes from
// (names as in Limit.Factors; "" for a name it does not know).
func FactorProvenance(name string) Provenance {
	row := map[string]string{"T2_s": "T2", "T1_s": "T1", "gamma_rad": "γ (photochemical field of view)"}[name]
	if row == "" {
		row = name
	}
	switch name {
	case "C3", "C4", "C6", "T2_s", "gamma_rad":
		return checked(TableFactors, row, SourceDirectiveFactors)
	case "C7":
		p := substitute(TableFactors, "C7 = 8 from 1200 nm", "Edition 3's larger C7 above 1250 nm (8 + 10^(0.04(λ−1250)), from memory)")
		p.CheckedAgainst = []string{SourceDirectiveFactors}
		return p
	case "C1", "C2", "T1_s":
		return memory(TableFactors, row)
	case "C5":
		p := substitute(TableRepetitive, "C5 = N^−0.25", "Edition 3's relaxation of C5 for small sources (from memory, not confirmed)")
		p.CheckedAgainst = []string{SourceDirectiveRepetitive}
		return p
	}
	return Provenance{}
}

// FactorProvenanceAt is FactorProvenance for a limit at duration t (s) and
// angular subtense α (rad): C6 is checked against the directive's C_E only
// where the two agree, at α ≤ α_min (both 1) or at α ≤ 100 mrad from
// 0.25 s (where Edition 3's α_max is the directive's 100 mrad); elsewhere
// Edition 3's time-dependent α_max makes it differ, and it is from memory.
func FactorProvenanceAt(name string, t, α float64) Provenance {
	if name == "C6" && α > AlphaMin && (α > 0.1 || t < 0.25) {
		return memory(TableFactors, "C6 with Edition 3's time-dependent α_max (or α > 100 mrad)")
	}
	return FactorProvenance(name)
}

// C5 is the repetitive-pulse factor N^−0.25 applied to the single-pulse limit
// in the retinal thermal region. Edition 3 relaxes it (to 1 for small sources,
// as we recall); this package keeps the more restrictive Edition 2 rule.
func C5(n float64) float64 {
	if n <= 1 {
		return 1
	}
	return math.Pow(n, -0.25)
}
