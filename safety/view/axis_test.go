package view

import (
	"math"
	"slices"
	"testing"
)

// Ticks: a linear axis on 1-2-5 steps, a log axis on the decades within
// its range (common practice for plot axes); an axis with no range, or a
// log axis reaching zero, marks nothing (it used to loop without end on a
// log axis from 0: a sign-off whose plotted values were all zero never
// finished).
func TestTicks(t *testing.T) {
	cases := []struct {
		a    Axis
		want []float64
	}{
		{Axis{Lo: 0, Hi: 1}, []float64{0, 0.2, 0.4, 0.6, 0.8, 1}},
		{Axis{Lo: 1e-3, Hi: 10, Log: true}, []float64{1e-3, 1e-2, 0.1, 1, 10}},
		{Axis{Lo: 0, Hi: 1, Log: true}, nil},
		{Axis{Lo: -1, Hi: 1, Log: true}, nil},
		{Axis{Lo: 1, Hi: 1}, nil},
		{Axis{Lo: math.Inf(-1), Hi: 1}, nil},
		{Axis{Lo: 0, Hi: math.NaN()}, nil},
	}
	for _, c := range cases {
		if got := c.a.Ticks(); !slices.Equal(got, c.want) {
			t.Errorf("%+v: ticks %v, want %v", c.a, got, c.want)
		}
	}
}

// A log axis over values none of which it can show (all zero) spans one
// decade from 1, never a range from 0.
func TestDataRangeNothingPlottable(t *testing.T) {
	if lo, hi := DataRange([]float64{0, 0, math.NaN()}, true, false); lo != 1 || hi != 10 {
		t.Errorf("log range of zeros: %g .. %g, want 1 .. 10", lo, hi)
	}
	if lo, hi := DataRange(nil, false, false); lo != 0 || hi != 1 {
		t.Errorf("linear range of nothing: %g .. %g, want 0 .. 1", lo, hi)
	}
	if lo, hi := DataRange([]float64{3e-4, 0.2}, true, false); lo != 1e-4 || hi != 1 {
		t.Errorf("log range: %g .. %g, want 1e-4 .. 1", lo, hi)
	}
}
