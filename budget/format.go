package budget

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// Formatting of quantities for people. Every function takes SI base units.

var siPrefixes = []struct {
	scale  float64
	symbol string
}{{1e12, "T"}, {1e9, "G"}, {1e6, "M"}, {1e3, "k"}, {1, ""}, {1e-3, "m"}, {1e-6, "µ"}, {1e-9, "n"}, {1e-12, "p"}, {1e-15, "f"}}

// FormatSI writes v with an SI prefix chosen so that the mantissa lies in
// [1, 1000), with four significant digits: FormatSI(0.0012, "W") = "1.2 mW".
func FormatSI(v float64, unit string) string {
	if v == 0 || math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Sprintf("%s %s", trimFloat(v, 4), unit)
	}
	a := math.Abs(v)
	for _, p := range siPrefixes {
		if a >= p.scale*(1-5e-5) || p.symbol == "f" {
			return trimFloat(v/p.scale, 4) + " " + p.symbol + unit
		}
	}
	return trimFloat(v, 4) + " " + unit
}

// trimFloat formats with n significant digits and no exponent for ordinary
// magnitudes, dropping trailing zeros.
func trimFloat(v float64, n int) string {
	if v == 0 {
		return "0"
	}
	s := strconv.FormatFloat(v, 'g', n, 64)
	if strings.ContainsAny(s, "e") && !math.IsInf(v, 0) && !math.IsNaN(v) {
		f, _ := strconv.ParseFloat(s, 64)
		if math.Abs(f) >= 1e-4 && math.Abs(f) < 1e7 {
			s = strconv.FormatFloat(f, 'f', -1, 64)
		}
	}
	return s
}

// FormatNumber writes a bare number with four significant digits, without an
// exponent between 1e-4 and 1e15.
func FormatNumber(v float64) string { return trimFloat(v, 4) }

// FormatLength writes a length with a readable prefix: "1.35 m", "250 mm".
func FormatLength(m float64) string { return FormatSI(m, "m") }

// FormatPower writes a power: "1.1 W", "250 mW".
func FormatPower(w float64) string { return FormatSI(w, "W") }

// FormatIrradiance writes an irradiance in W/cm² (the unit the lab reads):
// input W/m².
func FormatIrradiance(wm2 float64) string { return FormatSI(wm2*1e-4, "W/cm²") }

// FormatFrequency writes a frequency in Hz with a prefix.
func FormatFrequency(hz float64) string { return FormatSI(hz, "Hz") }

// Decibels of a power ratio out/in (negative for a loss).
func Decibels(ratio float64) float64 { return 10 * math.Log10(ratio) }
