package safety

import (
	"math"

	"beamledger/budget"
	"beamledger/limits"
)

// apertureIrradiance is the irradiance of beam b carrying power p (W)
// averaged over a centred circular aperture of diameter d (m), W/m², with the
// exact elliptical fraction.
func apertureIrradiance(b budget.Beam, p, d float64) float64 {
	wx, wy := b.Radii()
	return p * budget.CircleFraction(wx, wy, d/2) / (math.Pi * d * d / 4)
}

// maxAlong finds the largest aperture-averaged irradiance over [0, length]
// downstream of b (length may be +Inf: an open end), and where it lies.
// The irradiance of each plane peaks at its waist, so the largest value lies
// between the start and the farther waist; the search samples that stretch and
// refines the best sample by golden-section search.
func maxAlong(b budget.Beam, p, d, length float64) (irr, at float64) {
	far := math.Max(b.X.WaistDistance(), b.Y.WaistDistance())
	end := length
	if math.IsInf(length, 1) || far < length {
		end = math.Max(0, math.Min(far, length))
	}
	f := func(z float64) float64 { return apertureIrradiance(b.Propagate(z), p, d) }
	const n = 48
	best, bestZ := f(0), 0.0
	if e := f(end); e > best {
		best, bestZ = e, end
	}
	if end == 0 {
		return best, bestZ
	}
	step := end / n
	for i := 1; i < n; i++ {
		if v := f(float64(i) * step); v > best {
			best, bestZ = v, float64(i)*step
		}
	}
	for _, w := range []float64{b.X.WaistDistance(), b.Y.WaistDistance()} {
		if w > 0 && w < end {
			if v := f(w); v > best {
				best, bestZ = v, w
			}
		}
	}
	lo, hi := math.Max(0, bestZ-step), math.Min(end, bestZ+step)
	const g = 0.6180339887498949
	for i := 0; i < 60 && hi-lo > 1e-9*(1+end); i++ {
		m1, m2 := hi-g*(hi-lo), lo+g*(hi-lo)
		if f(m1) > f(m2) {
			hi = m2
		} else {
			lo = m1
		}
	}
	if v := f((lo + hi) / 2); v > best {
		best, bestZ = v, (lo+hi)/2
	}
	return best, bestZ
}

// hazardDistance is how far beyond `from` (m) the aperture-averaged
// irradiance of b with power p stays above mpe, m: the distance along the beam
// from its start to where it falls below the limit for good, rounded up. It
// is +Inf beyond MaxHazardDistance.
func hazardDistance(b budget.Beam, p, d, mpe float64) float64 {
	peak, zPeak := maxAlong(b, p, d, math.Inf(1))
	if peak <= mpe {
		return 0
	}
	f := func(z float64) float64 { return apertureIrradiance(b.Propagate(z), p, d) }
	lo, hi := zPeak, math.Max(2*zPeak, 1)
	for f(hi) > mpe {
		lo, hi = hi, 2*hi
		if hi > MaxHazardDistance {
			return math.Inf(1)
		}
	}
	for i := 0; i < 200 && hi-lo > 1e-6*hi; i++ {
		m := (lo + hi) / 2
		if f(m) > mpe {
			lo = m
		} else {
			hi = m
		}
	}
	return limits.RoundUp(hi, 3)
}

// MaxHazardDistance bounds the search for a hazard distance, m.
const MaxHazardDistance = 1e7
