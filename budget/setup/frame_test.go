package setup

import (
	"math"
	"testing"
)

// The beam's planes in the cloud frame: along z they are x and y; along x,
// y and z; along −z, x and −y (right-handed); and the rms size along a
// direction of a Gaussian cloud is √Σ dᵢ² σᵢ² (by hand).
func TestBeamAxes(t *testing.T) {
	for _, c := range []struct{ n, u, v [3]float64 }{
		{[3]float64{0, 0, 1}, [3]float64{1, 0, 0}, [3]float64{0, 1, 0}},
		{[3]float64{1, 0, 0}, [3]float64{0, 1, 0}, [3]float64{0, 0, 1}},
		{[3]float64{0, 0, -1}, [3]float64{1, 0, 0}, [3]float64{0, -1, 0}},
	} {
		if u, v := BeamAxes(c.n); u != c.u || v != c.v {
			t.Errorf("along %v: x plane %v, y plane %v; want %v, %v", c.n, u, v, c.u, c.v)
		}
	}
	cl := &Cloud{RMSSize: [3]float64{3, 4, 12}}
	if got := cl.RMSAlong([3]float64{0.6, 0.8, 0}); !near(got, math.Sqrt(0.36*9+0.64*16), 1e-12) {
		t.Errorf("rms along (0.6, 0.8, 0) = %g", got)
	}
}
