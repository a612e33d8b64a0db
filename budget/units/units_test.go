package units

import (
	"math"
	"testing"
)

// Decibels: 10 log10 of a power ratio (common practice): 0.5 is −3.0103 dB.
func TestDecibels(t *testing.T) {
	if got := Decibels(0.5); math.Abs(got+3.0103) > 1e-5*3.0103 {
		t.Errorf("got %g", got)
	}
}

// Hazard figures are written rounded up (common practice): a ratio to three
// figures, a distance past the search as "beyond" it.
func TestHazardFormatters(t *testing.T) {
	for _, c := range []struct{ got, want string }{
		{FormatRatio(1.0001), "1.01"},
		{FormatRatio(502.6265), "503"},
		{FormatNanometres(780.24e-9), "780.2 nm"},
		{FormatDistance(math.Inf(1), 1e5), "beyond 100 km"},
		{FormatDistance(2e5, 1e5), "beyond 100 km"},
		{FormatDistance(0, 1e5), "0 m"},
		{FormatDistance(1.67e3, 1e5), "1.67 km"},
	} {
		if c.got != c.want {
			t.Errorf("got %q, want %q", c.got, c.want)
		}
	}
}
