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
	// A beam in the x–z plane at θ from z, by hand: the x axis projected
	// across the beam is (cos θ, 0, −sin θ), and y = n × x is the cloud's y;
	// along x itself the rule moves on to y (then y = x × y = z).
	for _, deg := range []float64{0, 10, 70, 89} {
		θ := deg * math.Pi / 180
		u, v := BeamAxes([3]float64{math.Sin(θ), 0, math.Cos(θ)})
		wu, wv := [3]float64{math.Cos(θ), 0, -math.Sin(θ)}, [3]float64{0, 1, 0}
		for i := range 3 {
			if !near(u[i], wu[i], 1e-12) || !near(v[i], wv[i], 1e-12) {
				t.Errorf("%g° from z: x plane %v, y plane %v; want %v, %v", deg, u, v, wu, wv)
				break
			}
		}
	}
	if u, v := BeamAxes([3]float64{1, 0, 0}); u != [3]float64{0, 1, 0} || v != [3]float64{0, 0, 1} {
		t.Errorf("90° (along x): %v, %v", u, v)
	}
	if u, v := BeamAxes([3]float64{0, 1, 0}); u != [3]float64{1, 0, 0} || v != [3]float64{0, 0, -1} {
		t.Errorf("along y: %v, %v", u, v)
	}
	cl := &Cloud{RMSSize: [3]float64{3, 4, 12}}
	if got := cl.RMSAlong([3]float64{0.6, 0.8, 0}); !near(got, math.Sqrt(0.36*9+0.64*16), 1e-12) {
		t.Errorf("rms along (0.6, 0.8, 0) = %g", got)
	}
}
