package pdf

import (
	"math"
	"sort"
	"testing"
)

// Tick labels never read "-0": a tick at zero reached from below is 0.
func TestZeroTickLabel(t *testing.T) {
	if s := label(math.Copysign(0, -1)); s != "0" {
		t.Errorf("label(-0) = %q", s)
	}
	// An axis starting just below zero: the first tick, ceil(lo/step)·step,
	// is the negative zero of floating point.
	for _, a := range []axis{{lo: -0.3, hi: 3}, {lo: -1.2e-4, hi: 4e-3}, {lo: -7, hi: 0}} {
		zero := false
		for _, v := range a.ticks() {
			if v == 0 {
				zero = true
				if s := label(v); s != "0" {
					t.Errorf("axis %v: the zero tick reads %q", a, s)
				}
			}
		}
		if !zero {
			t.Errorf("axis %v has no zero tick: %v", a, a.ticks())
		}
	}
}

// spread keeps labels at least a pitch apart, within bounds when they fit,
// and leaves labels already apart where they are.
func TestSpreadLabels(t *testing.T) {
	apart := []float64{10, 30, 50}
	if got := spread(apart, 2, 0, 100); !equalF(got, apart) {
		t.Errorf("labels already apart moved: %v", got)
	}
	// The demo's lens and fibre: 300 and 311 mm of a 1750 mm path on a
	// 170 mm plot stand 1.07 mm apart on the page.
	scale := 170.0 / 1750
	want := []float64{120 * scale, 300 * scale, 311 * scale, 600 * scale, 1750 * scale}
	pitch := markerPitch(5.5)
	got := spread(want, pitch, pitch, 170)
	checkSpread(t, got, pitch, pitch, 170)
	if got[0] != want[0] || got[3] != want[3] {
		t.Errorf("labels with room moved: %v from %v", got, want)
	}
	// Crowded at the right edge: pulled back inside.
	got = spread([]float64{99, 99.5, 100, 100}, 2, 0, 100)
	checkSpread(t, got, 2, 0, 100)
}

func checkSpread(t *testing.T, got []float64, pitch, lo, hi float64) {
	t.Helper()
	s := append([]float64(nil), got...)
	sort.Float64s(s)
	for i, x := range s {
		if x < lo-1e-9 || x > hi+1e-9 {
			t.Errorf("label at %g outside [%g, %g]", x, lo, hi)
		}
		if i > 0 && x-s[i-1] < pitch-1e-9 {
			t.Errorf("labels at %g and %g overlap (pitch %g)", s[i-1], x, pitch)
		}
	}
}

// Labels that cannot fit at 5.5 pt shrink to 3 pt, then only every k-th is
// written; those written always fit.
func TestMarkerLabelSize(t *testing.T) {
	for _, n := range []int{1, 10, 80, 120, 200, 1000} {
		size, every := markerLabelSize(n, 170)
		written := (n + every - 1) / every
		if size < 3 || size > 5.5 || float64(written)*markerPitch(size) > 170+1e-9 {
			t.Errorf("%d labels: %g pt, every %d: %d labels take %g mm of 170", n, size, every, written, float64(written)*markerPitch(size))
		}
		if n <= 70 && (size != 5.5 || every != 1) {
			t.Errorf("%d labels fit at 5.5 pt but got %g pt, every %d", n, size, every)
		}
	}
}

func equalF(a, b []float64) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}
