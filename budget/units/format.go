package units

import (
	"beamledger/budget/numeric"
	"bytes"
	"fmt"
	"math"
	"strconv"
)

// Formatting of quantities for people. Every function takes SI base units.

var siPrefixes = []struct {
	scale  float64
	symbol string
}{{1e12, "T"}, {1e9, "G"}, {1e6, "M"}, {1e3, "k"}, {1, ""}, {1e-3, "m"}, {1e-6, "µ"}, {1e-9, "n"}, {1e-12, "p"}, {1e-15, "f"}}

// FormatSI writes v with an SI prefix chosen so that the mantissa lies in
// [1, 1000), with four significant digits: FormatSI(0.0012, "W") = "1.2 mW".
func FormatSI(v float64, unit string) string { return string(AppendSI(nil, v, unit)) }

// AppendSI appends v as FormatSI writes it.
func AppendSI(dst []byte, v float64, unit string) []byte {
	if v == 0 || math.IsNaN(v) || math.IsInf(v, 0) {
		dst = appendTrimmed(dst, v, 4)
		dst = append(dst, ' ')
		return append(dst, unit...)
	}
	a := math.Abs(v)
	for _, p := range siPrefixes {
		if a >= p.scale*(1-5e-5) || p.symbol == "f" {
			dst = appendTrimmed(dst, v/p.scale, 4)
			dst = append(dst, ' ')
			dst = append(dst, p.symbol...)
			return append(dst, unit...)
		}
	}
	dst = appendTrimmed(dst, v, 4)
	dst = append(dst, ' ')
	return append(dst, unit...)
}

// appendTrimmed appends v with n significant digits and no exponent for
// ordinary magnitudes, dropping trailing zeros.
func appendTrimmed(dst []byte, v float64, n int) []byte {
	if v == 0 {
		return append(dst, '0')
	}
	k := len(dst)
	dst = strconv.AppendFloat(dst, v, 'g', n, 64)
	if !math.IsInf(v, 0) && !math.IsNaN(v) && bytes.IndexByte(dst[k:], 'e') >= 0 {
		f, _ := strconv.ParseFloat(string(dst[k:]), 64)
		if math.Abs(f) >= 1e-4 && math.Abs(f) < 1e7 {
			dst = strconv.AppendFloat(dst[:k], f, 'f', -1, 64)
		}
	}
	return dst
}

// FormatNumber writes a bare number with four significant digits, without an
// exponent between 1e-4 and 1e7.
func FormatNumber(v float64) string { return string(AppendNumber(nil, v)) }

// AppendNumber appends v as FormatNumber writes it.
func AppendNumber(dst []byte, v float64) []byte { return appendTrimmed(dst, v, 4) }

// FormatLength writes a length with a readable prefix: "1.35 m", "250 mm".
func FormatLength(m float64) string { return FormatSI(m, "m") }

// AppendLength appends a length as FormatLength writes it.
func AppendLength(dst []byte, m float64) []byte { return AppendSI(dst, m, "m") }

// FormatPower writes a power: "1.1 W", "250 mW".
func FormatPower(w float64) string { return FormatSI(w, "W") }

// AppendPower appends a power as FormatPower writes it.
func AppendPower(dst []byte, w float64) []byte { return AppendSI(dst, w, "W") }

// FormatIrradiance writes an irradiance in W/cm² (the unit the lab reads):
// input W/m².
func FormatIrradiance(wm2 float64) string { return string(AppendIrradiance(nil, wm2)) }

// AppendIrradiance appends an irradiance as FormatIrradiance writes it.
func AppendIrradiance(dst []byte, wm2 float64) []byte { return AppendSI(dst, wm2*1e-4, "W/cm²") }

// FormatFrequency writes a frequency in Hz with a prefix.
func FormatFrequency(hz float64) string { return FormatSI(hz, "Hz") }

// Decibels of a power ratio out/in (negative for a loss).
func Decibels(ratio float64) float64 { return 10 * math.Log10(ratio) }

// FormatWavelength writes a wavelength, m, in nm to 0.01 nm ("780.24 nm"),
// as the path headings print it.
func FormatWavelength(λ float64) string { return fmt.Sprintf("%.2f nm", λ*1e9) }

// FormatRatio writes a ratio to its limit (exposure ÷ MPE) to three
// significant figures, rounded up: a hazard figure never reads lower than
// it is.
func FormatRatio(r float64) string { return FormatNumber(numeric.RoundUp(r, 3)) }

// FormatNanometres writes a wavelength in nm to four significant figures,
// trailing zeros trimmed ("780.2 nm", "1064 nm").
func FormatNanometres(λ float64) string { return FormatNumber(λ*1e9) + " nm" }

// FormatDistance writes a hazard distance d, m, where searched is how far
// the search for it went: a distance past it (or +Inf) is "beyond" that
// distance, and zero is "0 m".
func FormatDistance(d, searched float64) string {
	if math.IsInf(d, 1) || d > searched {
		return "beyond " + FormatLength(searched)
	}
	if d == 0 {
		return "0 m"
	}
	return FormatLength(d)
}
