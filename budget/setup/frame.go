package setup

import (
	"beamledger/budget/numeric"
	"math"
)

// BeamAxes returns the unit vectors of a beam's x and y planes in the cloud
// frame for a beam running along the unit vector n.
//
// The cloud frame. A cloud's rms_size = [x, y, z] are its axes; an atoms
// element's beam runs along Direction in that frame. The beam's own x plane
// contains the first of the cloud's axes (x, then y, then z) that is not
// along the beam, and its y plane is the third direction of a right-handed
// set (y_beam = along × x_beam): for a beam along z its x and y planes are
// the cloud's x and y; along x they are the cloud's y and z; along y, x and
// z (with the sign of along × x).
//
// "Not along the beam" means not parallel to it: an axis at any angle but
// 0° or 180° to the beam is taken (a beam 70° from z in the x–z plane has
// its x plane on the cloud's x projected across the beam, not on y).
func BeamAxes(n [3]float64) (u, v [3]float64) {
	for _, e := range [][3]float64{{1, 0, 0}, {0, 1, 0}, {0, 0, 1}} {
		if math.Abs(numeric.Dot(e, n)) < alongTolerance {
			d := numeric.Dot(e, n)
			u = numeric.Normalize([3]float64{e[0] - d*n[0], e[1] - d*n[1], e[2] - d*n[2]})
			break
		}
	}
	return u, numeric.Cross(n, u)
}

// alongTolerance is the |cos| above which a cloud axis counts as along the
// beam: within 0.08° of it (an axis closer than that projects to a
// direction set by rounding, not by the setup).
const alongTolerance = 1 - 1e-6

// Covariance is the cloud's covariance between the unit directions a and
// b, m²: Σ aᵢ bᵢ σᵢ² for a Gaussian cloud with rms sizes σ along its axes.
func (c *Cloud) Covariance(a, b [3]float64) float64 {
	s := 0.0
	for i := range 3 {
		s += a[i] * b[i] * c.RMSSize[i] * c.RMSSize[i]
	}
	return s
}

// RMSAlong is the cloud's rms size along the unit vector d, m: √Σ dᵢ² σᵢ²
// (the square root of Covariance(d, d)).
func (c *Cloud) RMSAlong(d [3]float64) float64 { return math.Sqrt(c.Covariance(d, d)) }
