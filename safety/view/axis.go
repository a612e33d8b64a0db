package view

import (
	"math"
	"strconv"
	"strings"
)

// The scales of a Plot, shared by every renderer (the PDF and the HTML
// page draw the same ticks, labels and ranges).

// Axis is a plot axis's data range, linear or logarithmic (then positive).
type Axis struct {
	Lo, Hi float64
	Log    bool
}

// Ticks returns tick values: decades for a log axis, 1-2-5 steps otherwise.
func (a Axis) Ticks() []float64 {
	var out []float64
	if !(a.Lo < a.Hi) || math.IsInf(a.Lo, 0) || math.IsInf(a.Hi, 0) || (a.Log && !(a.Lo > 0)) {
		return nil // no range to mark (the loops below would never end)
	}
	if a.Log {
		for e := math.Floor(math.Log10(a.Lo)); e <= math.Ceil(math.Log10(a.Hi)); e++ {
			if v := math.Pow(10, e); v >= a.Lo*(1-1e-9) && v <= a.Hi*(1+1e-9) {
				out = append(out, v)
			}
		}
		return out
	}
	step := niceStep((a.Hi - a.Lo) / 6)
	for k := math.Ceil(a.Lo/step - 1e-9); k*step <= a.Hi+step*1e-9; k++ {
		// Round away the float noise of k·step (0.6000000000000001).
		v, _ := strconv.ParseFloat(strconv.FormatFloat(k*step, 'g', 12, 64), 64)
		out = append(out, v)
	}
	return out
}

// At maps v to the interval [p0, p1] that the axis's range spans.
func (a Axis) At(v, p0, p1 float64) float64 {
	if a.Log {
		v, lo, hi := math.Log10(v), math.Log10(a.Lo), math.Log10(a.Hi)
		return p0 + (v-lo)/(hi-lo)*(p1-p0)
	}
	return p0 + (v-a.Lo)/(a.Hi-a.Lo)*(p1-p0)
}

func niceStep(raw float64) float64 {
	if raw <= 0 || math.IsNaN(raw) {
		return 1
	}
	e := math.Pow(10, math.Floor(math.Log10(raw)))
	for _, m := range []float64{1, 2, 5, 10} {
		if m*e >= raw {
			return m * e
		}
	}
	return 10 * e
}

// TickLabel writes a tick value briefly: plain digits for ordinary
// magnitudes, else a short exponent form ("1e-6"); never "-0".
func TickLabel(v float64) string {
	a := math.Abs(v)
	if v == 0 {
		return "0" // never "-0"
	}
	if a >= 1e-3 && a < 1e6 {
		return strconv.FormatFloat(v, 'f', -1, 64)
	}
	s := strconv.FormatFloat(v, 'g', 3, 64)
	s = strings.Replace(s, "e-0", "e-", 1)
	return strings.Replace(strings.Replace(s, "e+0", "e", 1), "e+", "e", 1)
}

// Plottable reports whether v can be drawn: a finite number, and positive
// on a log axis. Other points are left out, never drawn as NaN or Inf.
func Plottable(v float64, log bool) bool {
	return !math.IsNaN(v) && !math.IsInf(v, 0) && (!log || v > 0)
}

// DataRange finds the extent of the values, padded; for a log axis only
// positive values count, and whole decades bound it.
func DataRange(vals []float64, log, fromZero bool) (float64, float64) {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, v := range vals {
		if !Plottable(v, log) {
			continue
		}
		lo, hi = math.Min(lo, v), math.Max(hi, v)
	}
	if math.IsInf(lo, 1) {
		if log {
			return 1, 10 // nothing a log axis can show: one decade
		}
		return 0, 1
	}
	if log {
		return math.Pow(10, math.Floor(math.Log10(lo))), math.Pow(10, math.Ceil(math.Log10(hi)+1e-12))
	}
	if fromZero && lo > 0 {
		lo = 0
	}
	if hi == lo {
		hi = lo + 1
	}
	pad := 0.05 * (hi - lo)
	if lo != 0 {
		lo -= pad
	}
	return lo, hi + pad
}

// RoundTo3 rounds v to three significant figures (a bar's label).
func RoundTo3(v float64) float64 {
	f, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'g', 3, 64), 64)
	return f
}
