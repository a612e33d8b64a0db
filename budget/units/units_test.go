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
