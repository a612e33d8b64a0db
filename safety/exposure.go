package safety

import (
	"math"

	"beamledger/budget/numeric"
	"beamledger/budget/optics"
)

// apertureIrradiance is the irradiance of beam b carrying power p (W)
// averaged over a centred circular aperture of diameter d (m), W/m², with the
// exact elliptical fraction.
func apertureIrradiance(b optics.Beam, p, d float64) float64 {
	wx, wy := b.Radii()
	return p * optics.CircleFractionTol(wx, wy, d/2, hazardTolerance) / (math.Pi * d * d / 4)
}

// hazardTolerance is the relative accuracy of the clipped fractions behind
// hazard figures, far finer than any limit's precision.
const hazardTolerance = 1e-9

// maxAlong finds the largest aperture-averaged irradiance over [0, length]
// downstream of b (length may be +Inf: an open end), and where it lies.
// Before both waists each plane narrows, so the irradiance rises; after both
// it falls; the largest value therefore lies between the two waists, clamped
// to the stretch. For a round beam that is one point; otherwise the stretch
// between the waists is sampled and the best sample refined by golden-section
// search.
func maxAlong(b optics.Beam, p, d, length float64) (irr, at float64) {
	clamp := func(z float64) float64 { return math.Max(0, math.Min(z, length)) }
	zx, zy := b.X.WaistDistance(), b.Y.WaistDistance()
	lo, hi := clamp(math.Min(zx, zy)), clamp(math.Max(zx, zy))
	f := func(z float64) float64 { return apertureIrradiance(b.Propagate(z), p, d) }
	if hi-lo <= 1e-9*(1+hi) {
		return f(lo), lo
	}
	// W(z) is convex in each plane, so between the waists the beam is widest
	// at an end; when it fits the aperture there, all of it passes everywhere
	// and the irradiance is P over the aperture area throughout.
	full := p / (math.Pi * d * d / 4)
	flo, fhi := f(lo), f(hi)
	if best, z := math.Max(flo, fhi), lo; best >= full*(1-1e-12) {
		if fhi > flo {
			z = hi
		}
		return best, z
	}
	return maxBetween(f, lo, hi, flo, fhi)
}

// maxBetween finds the largest value of f on [lo, hi], f having one
// maximum there: samples, then a golden-section search around the best
// sample, one new evaluation per step, to a relative width of 1e-5 of the
// stretch (the value near a maximum changes with the square of the step).
// flo and fhi are f(lo) and f(hi), already known to the caller.
func maxBetween(f func(float64) float64, lo, hi, flo, fhi float64) (best, bestZ float64) {
	best, bestZ = flo, lo
	if e := fhi; e > best {
		best, bestZ = e, hi
	}
	const n = 12
	step := (hi - lo) / n
	for i := 1; i < n; i++ {
		if v := f(lo + float64(i)*step); v > best {
			best, bestZ = v, lo+float64(i)*step
		}
	}
	if z, v := numeric.GoldenMax(f, math.Max(lo, bestZ-step), math.Min(hi, bestZ+step), 80, 1e-5*(1+hi)); v > best {
		best, bestZ = v, z
	}
	return best, bestZ
}

// PeakAlong is the highest peak irradiance 2P/(π Wx Wy) (optics.Beam.
// PeakIrradiance) of beam b with power p over the first length metres
// (+Inf: all of it beyond), W/m², and where it lies: the beam is narrowest
// in the product Wx Wy between its two waists, or at an end of the stretch.
// For a Gaussian it is also the power over the area of the 63 % (1/e)
// diameter, the power density EN 207 rates filters against (from memory).
func PeakAlong(b optics.Beam, p, length float64) (peak, at float64) {
	clamp := func(z float64) float64 { return math.Max(0, math.Min(z, length)) }
	zx, zy := b.X.WaistDistance(), b.Y.WaistDistance()
	lo, hi := clamp(math.Min(zx, zy)), clamp(math.Max(zx, zy))
	f := func(z float64) float64 { return b.Propagate(z).PeakIrradiance(p) }
	if hi-lo <= 1e-9*(1+hi) {
		return f(lo), lo
	}
	return maxBetween(f, lo, hi, f(lo), f(hi))
}

// hazardDistance is how far beyond `from` (m) the aperture-averaged
// irradiance of b with power p stays above mpe, m: the distance along the beam
// from its start to where it falls below the limit for good, rounded up. It
// is +Inf beyond MaxHazardDistance.
func hazardDistance(b optics.Beam, p, d, mpe float64) float64 {
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
	return numeric.RoundUp(hi, 3)
}

// MaxHazardDistance bounds the search for a hazard distance, m: 100 km, past
// which a figure does not matter on any site (it is reported as "beyond").
const MaxHazardDistance = 1e5
