package drive

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/unit/constant"

	"beamledger/budget"
	"beamledger/budget/atoms"
	"beamledger/budget/numeric"
	"beamledger/budget/optics"
	"beamledger/budget/setup"
	"beamledger/budget/units"
)

// G is the gravitational acceleration used for the clouds, m/s² (the
// standard gravity of CODATA, via gonum).
var G = float64(constant.StandardGravity)

// CloudBeam is one beam at a cloud: an atoms element's result, and how it
// enters the combined potential.
type CloudBeam struct {
	Atoms *AtomsResult
	// Direction is the unit vector it runs along in the cloud frame; U and V
	// those of its x and y planes (BeamAxes).
	Direction, U, V [3]float64
	// Forward is set on the return pass of a standing wave: the forward
	// pass it interferes with.
	Forward *CloudBeam
	// Far and Near say how it counts: in the dipole potential (far
	// detuned) or in the saturation and scattering (near resonance). A beam
	// near another line is in neither.
	Far, Near bool
	// For a near-resonant beam with a pulse on a trap that holds: Photons
	// each atom scatters from it in the pulse (its share of the cloud's
	// scattering rate, at the cloud centre), and how many heat an atom out
	// from the trap's bottom by random kicks (HeatOut,
	// atoms.PhotonsToHeatOut) or push it out along the beam in a pulse short
	// against the trap period (PushOut, atoms.PhotonsToPushOut); NaN
	// otherwise.
	Photons, HeatOut, PushOut float64
}

// CloudResult is everything at one cloud, all beams counted together.
type CloudResult struct {
	Cloud *setup.Cloud
	Beams []*CloudBeam
	// PotentialAtCloud is the combined dipole potential at the cloud's
	// position, J.
	PotentialAtCloud float64
	// Trap is the combined trap of the far-detuned beams (nil when there is
	// none).
	Trap *Trap
	// GroundShift is the light shift of the ground state of the driven
	// transition at the trap minimum (at the cloud when there is no trap),
	// Hz; DifferentialShift that of the transition (excited minus ground),
	// NaN when the excited-state polarizability is not given for every trap
	// laser.
	GroundShift, DifferentialShift float64
	// SaturationTotal and ScatteringRate are the near-resonant beams' at
	// the cloud centre (s = I/I_sat summed; photons/s).
	SaturationTotal, ScatteringRate float64
	Goal                            *CloudGoal

	// hint and saddle are the trap minimum and escape saddle of the
	// operating powers (or, once the goal is solved, of the goal's powers),
	// to start a goal's trial searches from.
	hint, saddle *[3]float64
}

// trapHints are a trap's minimum and escape saddle, where a search of a
// nearby field (the same beams at other powers) starts: a tolerance
// sample's goal starts from the nominal goal's.
type trapHints struct{ minimum, saddle *[3]float64 }

// Trap is the trap the far-detuned beams make together, found numerically.
type Trap struct {
	// Found is set when the combined potential has a minimum near the cloud
	// (with gravity); Holds when it also has a barrier all round.
	Found, Holds bool
	// HoldsWithoutGravity says whether it would hold with gravity off.
	HoldsWithoutGravity bool
	// Minimum is the minimum's offset from the cloud position, m.
	Minimum [3]float64
	// Depth is the lowest barrier to escape from the minimum, J, and Escape
	// the direction it lies in. Saddle is where the barrier is when it lies
	// off every straight ray from the minimum (nil when a straight ray's
	// barrier is the lowest found).
	Depth  float64
	Escape [3]float64
	Saddle *[3]float64
	// Leave is the energy above the minimum at which the atoms leave the
	// whole potential, out of every beam, along straight lines, J (at least
	// Depth; the same for a single beam).
	Leave float64
	// Frequencies are the harmonic trap frequencies at the minimum, Hz,
	// ascending, along Axes (unit vectors in the cloud frame).
	Frequencies [3]float64
	Axes        [3][3]float64
	// Sag is g/ω² along gravity, m (0 without gravity).
	Sag float64
	// ForceAtCloud is the force at the cloud's position in units of m g
	// (the atoms there are pulled towards the minimum).
	ForceAtCloud float64
	// Lattice is the axial frequency of a standing wave's lattice, Hz (NaN
	// without one).
	Lattice float64
	// HeatingRate is the far-detuned light's recoil heating at the minimum,
	// K/s (each beam's atoms.RecoilHeatingRate, summed), and HeatTime the
	// time it takes to heat the atoms by the depth, s (Inf with no
	// scattering; both NaN when the trap does not hold).
	HeatingRate, HeatTime float64
	// Profile is the combined potential along the escape direction from the
	// minimum: distances (m) and U/k_B (K), for the plot.
	Profile [][2]float64
	// Skipped says why the trap was not searched for ("": it was).
	Skipped string
}

// MaxTrapBeams is the most far-detuned beams on one cloud whose combined
// trap is searched for (a real table puts a handful on a cloud; beyond this
// the search would cost seconds and the potential at the cloud is given
// alone).
const MaxTrapBeams = 16

// CloudGoal is a goal for the whole cloud: the common factor k on the
// operating powers of the lasers it scales that just meets it.
type CloudGoal struct {
	Kind   string
	Target float64 // SI: K for a trap depth, rad/s for a Rabi frequency, s for saturation
	Factor float64 // the collective goal's multiple of the threshold
	Lasers []*setup.Laser
	// Scale is k; Needed the operating power each laser then needs, W;
	// MarginDB is −10 log10 k.
	Scale      float64
	Needed     []float64
	MarginDB   float64
	Met        bool
	Impossible string
	// BeyondMaximum is set when a laser would need more than its maximum
	// power: no setting of the lasers meets the goal.
	BeyondMaximum bool
	// Upper marks an upper bound (goal_max): k is then the most the
	// operating powers may be scaled by, Met says k ≥ 1, and MarginDB is
	// +10 log10 k.
	Upper bool
	// WithoutScaling is set when the other beams meet the goal with these
	// lasers off: Met, Scale 0, Needed zeros and MarginDB NaN (no margin).
	WithoutScaling bool

	hints trapHints // the trap's at the factor found, for the tolerance samples
}

// field is the combined potential of far-detuned beams with gravity.
type field struct {
	beams []fieldBeam
	mass  float64
	down  [3]float64 // gravity's direction (zero: none)
	// hint, when set, is where a search of a nearby field (the same beams at
	// other powers) found its minimum: the search starts there alone.
	hint *[3]float64
	// trial marks a goal's trial search: only the depth is wanted, not the
	// profile for the plot.
	trial bool
	// saddle, when set, is where a search of a nearby field found the
	// escape saddle: the search refines it from there alone. Otherwise
	// flood asks for the grid search of saddle.go.
	saddle *[3]float64
	flood  bool
}

type fieldBeam struct {
	x, y     optics.Plane // at the cloud
	λ, power float64
	perI     float64 // U/I, J per W/m²
	scatI    float64 // the scattering rate per unit intensity, photons/s per W/m²
	n, u, v  [3]float64
	laser    *setup.Laser
	// back is the return pass of a standing wave, added coherently.
	back *fieldBeam
}

// intensity of a beam at r (cloud frame, m from the cloud), W/m².
func (b *fieldBeam) intensity(r [3]float64) float64 {
	s, a, c := numeric.Dot(r, b.n), numeric.Dot(r, b.u), numeric.Dot(r, b.v)
	wx, wy := b.x.Propagate(s).Radius(b.λ), b.y.Propagate(s).Radius(b.λ)
	return 2 * b.power / (math.Pi * wx * wy) * math.Exp(-2*a*a/(wx*wx)-2*c*c/(wy*wy))
}

// potential of a beam (or a standing wave at its antinodes: the fields add,
// U = sign · (√|U₁| + √|U₂|)²), J.
func (b *fieldBeam) potential(r [3]float64) float64 {
	u := b.perI * b.intensity(r)
	if b.back == nil {
		return u
	}
	u2 := b.back.perI * b.back.intensity(r)
	return StandingWavePotential(u, u2)
}

// StandingWavePotential is the potential at the antinodes of two
// counter-propagating beams of one laser whose fields add coherently, J:
// sign · (√|U₁| + √|U₂|)², four times one beam's for equal powers (Grimm,
// Weidemüller and Ovchinnikov (2000), §4.1, the standing-wave trap).
func StandingWavePotential(u1, u2 float64) float64 {
	s := math.Sqrt(math.Abs(u1)) + math.Sqrt(math.Abs(u2))
	return math.Copysign(s*s, u1)
}

// LatticeFrequency is the axial trap frequency in a standing wave of depth
// U0 (J, > 0) at wavelength λ for mass m: ω = (2π/λ) √(2U0/m), rad/s
// (Grimm et al. (2000), eq. (40)). U0 is the depth of the modulation along
// the axis, antinode to node (LatticeModulation), not the antinode's depth.
func LatticeFrequency(u0, λ, m float64) float64 { return 2 * math.Pi / λ * math.Sqrt(2*u0/m) }

// LatticeModulation is the depth of a standing wave's modulation along its
// axis for counter-propagating beams of potentials U₁ and U₂ (J): the
// potential U₁ + U₂ + 2√(U₁U₂) cos 2kz runs from (√U₁ + √U₂)² at an
// antinode to (√U₁ − √U₂)² at a node, 4√(|U₁U₂|) apart; for equal beams 4U₁,
// the antinode's depth (Grimm et al. (2000), §4.1, the fields adding).
func LatticeModulation(u1, u2 float64) float64 { return 4 * math.Sqrt(math.Abs(u1*u2)) }

// V is the total potential at r, J: the beams' sum and gravity's −m g (r·down).
func (f *field) V(r [3]float64) float64 {
	u := -f.mass * G * numeric.Dot(r, f.down)
	for i := range f.beams {
		u += f.beams[i].potential(r)
	}
	return u
}

// Scale is the field's natural length: its smallest beam radius at the
// cloud, m; reach is how far the beams' influence goes: a few of their
// longest Rayleigh ranges and radii, m.
func (f *field) scale() (scale, reach float64) {
	scale, reach = math.Inf(1), 0.0
	for _, b := range f.beams {
		for _, p := range []optics.Plane{b.x, b.y} {
			w := p.Radius(b.λ)
			scale = math.Min(scale, w)
			reach = math.Max(reach, 100*math.Max(w, math.Abs(p.RayleighRange())+math.Abs(p.WaistDistance())))
		}
	}
	return scale, reach
}

// findTrap looks for the minimum of the field near the cloud and measures
// it.
func (f *field) findTrap() Trap {
	t := Trap{Lattice: math.NaN()}
	L, reach := f.scale()
	if len(f.beams) == 0 || !(L > 0) || math.IsInf(L, 0) {
		return t
	}
	v0 := math.Abs(f.V([3]float64{}))
	for _, b := range f.beams {
		v0 = math.Max(v0, math.Abs(b.potential(b.focusPoint())))
	}
	if v0 == 0 {
		return t
	}
	// Start at the cloud and at the foci of the deepest beams; keep the
	// lowest minimum found that lies within the beams' reach.
	deep := f.deepest(maxStarts)
	starts := [][3]float64{{}}
	for _, b := range deep {
		// A focus at a point already tried (at the cloud, say) is one start.
		if p := b.focusPoint(); !slices.Contains(starts, p) {
			starts = append(starts, p)
		}
	}
	if f.hint != nil {
		starts = [][3]float64{*f.hint}
	}
	best, bestV := [3]float64{}, math.Inf(1)
	for _, st := range starts {
		r, ok := f.minimize(st, L, v0)
		if !ok || math.Sqrt(numeric.Dot(r, r)) > reach {
			continue
		}
		if v := f.V(r); v < bestV {
			best, bestV = r, v
		}
	}
	if math.IsInf(bestV, 1) {
		return t
	}
	// The search's own noise (far below any size here) is not a position.
	for i := range best {
		best[i] = math.Round(best[i]/(L*1e-6)) * (L * 1e-6)
	}
	h := f.hessian(best, L/100)
	var eig mat.EigenSym
	if !eig.Factorize(h, true) {
		return t
	}
	vals := eig.Values(nil)
	var vecs mat.Dense
	eig.VectorsTo(&vecs)
	if vals[0] <= 0 {
		return t
	}
	// Again along the principal axes, each with a step of its own (a
	// hundredth of the length over which the harmonic potential changes by
	// the trap's scale): a step fit for the tight axes is far too short
	// for the weak one along a beam, and its truncation error would land
	// in the weak frequency whenever that axis is not a cloud axis.
	var axes [3][3]float64
	var steps [3]float64
	for i := range 3 {
		axes[i] = [3]float64{vecs.At(0, i), vecs.At(1, i), vecs.At(2, i)}
		steps[i] = math.Min(reach/100, math.Max(L/1000, 0.01*math.Sqrt(v0/vals[i])))
	}
	h = f.hessianAlong(best, axes, steps)
	if !eig.Factorize(h, true) {
		return t
	}
	vals = eig.Values(nil)
	eig.VectorsTo(&vecs)
	if vals[0] <= 0 {
		return t
	}
	t.Found, t.Minimum = true, best
	for i := range 3 {
		t.Frequencies[i] = math.Sqrt(vals[i]/f.mass) / (2 * math.Pi)
		t.Axes[i] = signed([3]float64{vecs.At(0, i), vecs.At(1, i), vecs.At(2, i)})
	}
	if numeric.Dot(f.down, f.down) > 0 {
		hd := 0.0
		for i := range 3 {
			for j := range 3 {
				hd += f.down[i] * h.At(i, j) * f.down[j]
			}
		}
		t.Sag = G * f.mass / hd
	}
	g := f.gradient([3]float64{}, L/100)
	t.ForceAtCloud = math.Sqrt(numeric.Dot(g, g)) / (f.mass * G)
	// The lowest barrier along straight lines from the minimum: along and
	// across every beam, along gravity and along the principal axes.
	// Along a beam's own axis the atoms have escaped once they are beyond
	// the other beams (three of their radii from each other beam's axis,
	// which a ray at angle θ to it reaches after 3W/sin θ; the beam alone
	// then holds them only as a weaker trap of its own): the barrier is
	// measured up to there. Everywhere else it is measured out to the
	// beams' reach.
	type ray struct {
		d    [3]float64
		tmax float64
	}
	var rays []ray
	for _, b := range deep {
		beyond := 0.0
		for i := range f.beams {
			if o := &f.beams[i]; o != b {
				c := numeric.Cross(b.n, o.n)
				sin := math.Sqrt(numeric.Dot(c, c))
				out := reach // along the same line: never beyond it
				if sin > 1e-6 {
					out = math.Min(reach, 3*math.Max(o.x.Radius(o.λ), o.y.Radius(o.λ))/sin)
				}
				beyond = math.Max(beyond, out)
			}
		}
		if beyond == 0 {
			beyond = reach
		}
		rays = append(rays, ray{b.n, beyond}, ray{b.u, reach}, ray{b.v, reach})
	}
	if numeric.Dot(f.down, f.down) > 0 {
		rays = append(rays, ray{f.down, reach})
	}
	for _, ax := range t.Axes {
		rays = append(rays, ray{ax, reach})
	}
	t.Depth = math.Inf(1)
	vmin := f.V(best)
	// A ray along (or against) another's direction is measured once, out to
	// the nearer end: the lower of two barriers on one line.
	for i := 0; i < len(rays); i++ {
		for j := len(rays) - 1; j > i; j-- {
			if math.Abs(numeric.Dot(rays[i].d, rays[j].d)) > 1-1e-12 {
				rays[i].tmax = math.Min(rays[i].tmax, rays[j].tmax)
				rays = slices.Delete(rays, j, j+1)
			}
		}
	}
	for _, r := range rays {
		for _, sgn := range []float64{1, -1} {
			dd := [3]float64{sgn * r.d[0], sgn * r.d[1], sgn * r.d[2]}
			if barrier := f.barrier(best, vmin, dd, L/50, math.Max(r.tmax, L)); barrier < t.Depth {
				t.Depth, t.Escape = barrier, dd
			}
		}
	}
	// The straight rays bound the depth from above; the lowest saddle on
	// a bent way out may lie lower (saddle.go). A lattice's sites are left
	// to the straight rays: the barrier to the next site is no escape.
	var fr *frame
	if t.Depth > 0 && !f.lattice() && (f.saddle != nil || f.flood) {
		fr = f.principalFrame(best, t.Axes, vmin, t.Depth, reach)
		var s [3]float64
		ok := false
		if f.saddle != nil {
			s, ok = f.refineSaddle(fr, *f.saddle, v0)
		} else {
			s, ok = f.floodSaddle(fr, vmin, t.Depth, reach, v0)
		}
		if d := f.V(s) - vmin; ok && d > 0 && d < t.Depth {
			t.Depth, t.Saddle = d, &s
			t.Escape = numeric.Normalize([3]float64{s[0] - best[0], s[1] - best[1], s[2] - best[2]})
		}
	}
	t.Holds = t.Depth > 0
	t.Depth = math.Max(t.Depth, 0)
	if f.trial {
		return t
	}
	// The energy to leave the whole potential, out of every beam: the
	// same straight rays run out to the beams' reach, no stop beyond the
	// other beams (the depth above is the barrier out of the trap's basin,
	// into one arm of a crossing).
	t.Leave = math.Inf(1)
	for _, r := range rays {
		for _, sgn := range []float64{1, -1} {
			dd := [3]float64{sgn * r.d[0], sgn * r.d[1], sgn * r.d[2]}
			t.Leave = math.Min(t.Leave, f.barrier(best, vmin, dd, L/50, math.Max(reach, L)))
		}
	}
	t.Leave = math.Max(t.Leave, t.Depth)
	if len(f.beams) == 1 && f.beams[0].back == nil {
		t.Leave = t.Depth // one beam: its escape leaves the whole potential
	}
	if t.Saddle != nil {
		t.Profile = f.escapeProfile(fr, best, *t.Saddle)
		return t
	}
	// The potential along the escape direction, for the plot.
	for k := -60; k <= 60; k++ {
		s := float64(k) / 60 * math.Min(reach, 20*L)
		r := [3]float64{best[0] + s*t.Escape[0], best[1] + s*t.Escape[1], best[2] + s*t.Escape[2]}
		t.Profile = append(t.Profile, [2]float64{s, f.V(r) / atoms.KB})
	}
	return t
}

// signed is the axis a or −a, whichever has its largest component
// positive: an eigenvector's sign is arbitrary, and the output should not
// depend on it.
func signed(a [3]float64) [3]float64 {
	k := 0
	for i := range a {
		if math.Abs(a[i]) > math.Abs(a[k]) {
			k = i
		}
	}
	if a[k] < 0 {
		return [3]float64{-a[0], -a[1], -a[2]}
	}
	return a
}

// maxStarts is how many of the deepest beams the trap search starts from
// and measures escape along (the others still add to the potential).
const maxStarts = 2

// deepest returns up to n beams with the deepest potential at the cloud.
func (f *field) deepest(n int) []*fieldBeam {
	out := make([]*fieldBeam, 0, len(f.beams))
	for i := range f.beams {
		out = append(out, &f.beams[i])
	}
	slices.SortStableFunc(out, func(a, b *fieldBeam) int {
		return numeric.CmpFloat(a.potential(a.focusPoint()), b.potential(b.focusPoint()))
	})
	return out[:min(n, len(out))]
}

// focusPoint is where the beam's on-axis intensity peaks (the mean of its
// x and y waist positions), in the cloud frame.
func (b *fieldBeam) focusPoint() [3]float64 {
	z := (b.x.WaistDistance() + b.y.WaistDistance()) / 2
	return [3]float64{z * b.n[0], z * b.n[1], z * b.n[2]}
}

// minimize finds a local minimum from start, in units of the length L and
// the potential scale v0 (SimplexMin).
func (f *field) minimize(start [3]float64, L, v0 float64) ([3]float64, bool) {
	x0 := [3]float64{start[0] / L, start[1] / L, start[2] / L}
	x, fx := numeric.SimplexMin(func(x [3]float64) float64 {
		return f.V([3]float64{x[0] * L, x[1] * L, x[2] * L}) / v0
	}, x0, 0.05, 1e-10, 40, 600)
	return [3]float64{x[0] * L, x[1] * L, x[2] * L}, !math.IsNaN(fx)
}

// hessian of V at r by central differences of step h, J/m².
func (f *field) hessian(r [3]float64, h float64) *mat.SymDense {
	H := mat.NewSymDense(3, nil)
	at := func(i, j int, si, sj float64) float64 {
		q := r
		q[i] += si * h
		q[j] += sj * h
		return f.V(q)
	}
	v := f.V(r)
	for i := range 3 {
		H.SetSym(i, i, (at(i, i, 0.5, 0.5)-2*v+at(i, i, -0.5, -0.5))/(h*h))
		for j := i + 1; j < 3; j++ {
			H.SetSym(i, j, (at(i, j, 1, 1)-at(i, j, 1, -1)-at(i, j, -1, 1)+at(i, j, -1, -1))/(4*h*h))
		}
	}
	return H
}

// hessianAlong is the Hessian of V at r in the cloud frame, J/m², from
// central differences along the unit axes a (orthonormal), step h[i]
// along a[i]: H = A H' Aᵀ with H'_ij the second derivative along a[i] and
// a[j].
func (f *field) hessianAlong(r [3]float64, a [3][3]float64, h [3]float64) *mat.SymDense {
	at := func(i, j int, si, sj float64) float64 {
		q := r
		for k := range 3 {
			q[k] += si*h[i]*a[i][k] + sj*h[j]*a[j][k]
		}
		return f.V(q)
	}
	v := f.V(r)
	var hp [3][3]float64
	for i := range 3 {
		hp[i][i] = (at(i, i, 0.5, 0.5) - 2*v + at(i, i, -0.5, -0.5)) / (h[i] * h[i])
		for j := i + 1; j < 3; j++ {
			hp[i][j] = (at(i, j, 1, 1) - at(i, j, 1, -1) - at(i, j, -1, 1) + at(i, j, -1, -1)) / (4 * h[i] * h[j])
			hp[j][i] = hp[i][j]
		}
	}
	H := mat.NewSymDense(3, nil)
	for k := range 3 {
		for l := k; l < 3; l++ {
			sum := 0.0
			for i := range 3 {
				for j := range 3 {
					sum += a[i][k] * hp[i][j] * a[j][l]
				}
			}
			H.SetSym(k, l, sum)
		}
	}
	return H
}

// gradient of V at r by central differences, J/m.
func (f *field) gradient(r [3]float64, h float64) [3]float64 {
	var g [3]float64
	for i := range 3 {
		a, b := r, r
		a[i] += h
		b[i] -= h
		g[i] = (f.V(a) - f.V(b)) / (2 * h)
	}
	return g
}

// barrier is the highest the potential rises above vmin along the ray from
// r in direction d, J (a negative value: it only falls): sampled on a
// logarithmic grid from t0 to tmax, the highest sample then refined by a
// golden-section search between its neighbours.
func (f *field) barrier(r [3]float64, vmin float64, d [3]float64, t0, tmax float64) float64 {
	const n = 60
	at := func(t float64) float64 { return f.V([3]float64{r[0] + t*d[0], r[1] + t*d[1], r[2] + t*d[2]}) }
	q := math.Pow(tmax/t0, 1.0/n)
	best, top := 0, math.Inf(-1)
	t := t0
	for k := range n + 1 {
		if v := at(t); v > top {
			best, top = k, v
		}
		t *= q
	}
	if best > 0 && best < n {
		_, v := numeric.GoldenMax(at, t0*math.Pow(q, float64(best-1)), t0*math.Pow(q, float64(best+1)), 30, 0)
		top = math.Max(top, v)
	}
	return top - vmin
}

// Clouds counts every beam at each cloud together: the combined potential
// and its trap (with gravity), the light shifts, the near-resonant
// saturation and scattering, and the cloud's own goal.
func Clouds(b *budget.Budget, drive []*AtomsResult) []*CloudResult {
	var out []*CloudResult
	for _, c := range b.Setup.Clouds {
		if cr := cloudResult(c, drive, pass{full: true, goals: true}); cr != nil {
			out = append(out, cr)
		}
	}
	return out
}

// cloudResult counts the beams in drive that reach cloud c together (nil
// when none does), for the pass p.
func cloudResult(c *setup.Cloud, drive []*AtomsResult, p pass) *CloudResult {
	if c.Data == nil {
		return nil
	}
	cr := beamsAt(c, drive)
	if cr == nil {
		return nil
	}
	if p.given != nil {
		cr.hint, cr.saddle = p.given.minimum, p.given.saddle
	}
	cr.evaluate(nil, 1, p.full)
	if p.goals && c.Goal != "" {
		cr.Goal = cr.goal(p.given == nil)
	}
	return cr
}

// beamsAt gathers the beams in drive that reach cloud c (nil when none
// does), each with how it counts.
func beamsAt(c *setup.Cloud, drive []*AtomsResult) *CloudResult {
	cr := &CloudResult{Cloud: c, DifferentialShift: math.NaN()}
	var prev []*CloudBeam
	for _, a := range drive {
		if a.Cloud != c {
			continue
		}
		n := a.Row.Element.Direction
		u, v := setup.BeamAxes(n)
		cb := &CloudBeam{Atoms: a, Direction: n, U: u, V: v, Photons: math.NaN(), HeatOut: math.NaN(), PushOut: math.NaN(),
			Far:  a.FarDetuned && a.Dipole != nil && a.Row.FractionIn > 0,
			Near: !a.FarDetuned && a.NearLine == "" && a.Row.FractionIn > 0}
		if a.Row.Element.Interference == "standing_wave" {
			for k := len(prev) - 1; k >= 0; k-- {
				f := prev[k]
				if f.Atoms.Path == a.Path && numeric.Dot(f.Direction, n) < -0.999 && f.Forward == nil {
					cb.Forward = f
					break
				}
			}
		}
		prev = append(prev, cb)
		cr.Beams = append(cr.Beams, cb)
	}
	if len(cr.Beams) == 0 {
		return nil
	}
	return cr
}

// fieldOf builds the field of the far-detuned beams, the powers of the
// lasers in scaled multiplied by k (all lasers when scaled is nil and k is
// 1), with or without gravity.
func (cr *CloudResult) fieldOf(scaled []*setup.Laser, k float64, gravity bool) *field {
	return cr.fieldAt(scaled, k, gravity, false)
}

// fieldAt is fieldOf, with every laser at its maximum power instead of
// its operating power where maximum is set.
func (cr *CloudResult) fieldAt(scaled []*setup.Laser, k float64, gravity, maximum bool) *field {
	f := &field{mass: cr.Cloud.Data.Mass, beams: make([]fieldBeam, 0, len(cr.Beams))}
	if gravity {
		f.down = cr.Cloud.Down
	}
	fb := map[*CloudBeam]*fieldBeam{}
	for _, cb := range cr.Beams {
		if !cb.Far {
			continue
		}
		a := cb.Atoms
		p := a.Row.FractionIn * a.Path.Laser.OperatingPower
		if maximum {
			p = a.Row.FractionIn * a.Path.Laser.Power
		}
		if slices.Contains(scaled, a.Path.Laser) {
			p *= k
		}
		if p == 0 && k == 0 {
			continue // a laser turned off is not in the field (nor its return pass)
		}
		beam := a.Row.BeamIn
		x := fieldBeam{x: beam.X, y: beam.Y, λ: beam.Wavelength, power: p, perI: a.Dipole.PerIntensity, scatI: a.Dipole.scatI, n: cb.Direction, u: cb.U, v: cb.V, laser: a.Path.Laser}
		if fwd := fb[cb.Forward]; cb.Forward != nil && fwd != nil {
			// The return pass joins its forward pass coherently.
			back := x
			fwd.back = &back
			continue
		}
		f.beams = append(f.beams, x) // within its capacity: the pointers stay valid
		fb[cb] = &f.beams[len(f.beams)-1]
	}
	return f
}

// evaluate fills the combined figures, with the powers of the lasers in
// scaled multiplied by k; full also asks whether a trap that fails against
// gravity would hold without it (a goal's trial powers skip that).
func (cr *CloudResult) evaluate(scaled []*setup.Laser, k float64, full bool) {
	c := cr.Cloud
	tr := c.Data
	f := cr.fieldOf(scaled, k, true)
	if full {
		f.flood = true
	} else {
		f.hint, f.trial, f.saddle = cr.hint, true, cr.saddle
	}
	cr.PotentialAtCloud = f.V([3]float64{})
	cr.Trap = nil // (a goal's trial copy must not keep the nominal trap)
	var at [3]float64
	switch {
	case len(f.beams) > MaxTrapBeams:
		cr.Trap = &Trap{Lattice: math.NaN(), Skipped: fmt.Sprintf("%d far-detuned beams reach the cloud; the combined trap is searched for with at most %d", len(f.beams), MaxTrapBeams)}
	case len(f.beams) > 0 && tr.Mass == 0:
		cr.Trap = &Trap{Lattice: math.NaN(), Skipped: "the transition's data give no mass"}
	case len(f.beams) > 0:
		t := f.findTrap()
		if t.Found {
			at = t.Minimum
			if full {
				m := t.Minimum
				cr.hint, cr.saddle = &m, t.Saddle
			}
		}
		if full && !t.Holds && numeric.Dot(c.Down, c.Down) > 0 {
			t.HoldsWithoutGravity = cr.fieldOf(scaled, k, false).findTrap().Holds
		} else {
			t.HoldsWithoutGravity = t.Holds
		}
		for _, b := range f.beams {
			if b.back != nil && t.Found {
				u1, u2 := b.perI*b.intensity(t.Minimum), b.back.perI*b.back.intensity(t.Minimum)
				t.Lattice = LatticeFrequency(LatticeModulation(u1, u2), b.λ, tr.Mass) / (2 * math.Pi)
			}
		}
		t.HeatingRate, t.HeatTime = math.NaN(), math.NaN()
		if t.Holds {
			t.HeatingRate = f.heating(t.Minimum)
			t.HeatTime = t.Depth / atoms.KB / t.HeatingRate
		}
		cr.Trap = &t
	}
	// Light shifts at the trap minimum (or the cloud).
	cr.GroundShift, cr.DifferentialShift = f.lightShifts(at, c)
	// Near-resonant beams at the cloud centre; a standing wave's return
	// pass joins its forward pass coherently, (√s₁ + √s₂)².
	var s, Δs []float64
	index := map[*CloudBeam]int{}
	for _, cb := range cr.Beams {
		if !cb.Near {
			continue
		}
		a := cb.Atoms
		p := a.Power
		if slices.Contains(scaled, a.Path.Laser) {
			p *= k
		}
		si := atoms.Saturation(a.Row.BeamIn.PeakIrradiance(p), a.Isat)
		if j, ok := index[cb.Forward]; ok && cb.Forward != nil {
			s[j] = StandingWavePotential(s[j], si)
			continue
		}
		// The element's detuning holds the shift at the operating powers;
		// here the one at these powers replaces it.
		Δ := budget.TrapShifted(a.Detuning, -a.TrapShift)
		if !math.IsNaN(cr.DifferentialShift) {
			Δ = budget.TrapShifted(Δ, cr.DifferentialShift)
		}
		index[cb] = len(s)
		s = append(s, si)
		Δs = append(Δs, Δ)
	}
	cr.SaturationTotal, cr.ScatteringRate = 0, 0
	for _, si := range s {
		cr.SaturationTotal += si
	}
	for i, si := range s {
		cr.ScatteringRate += MultiBeamScattering(tr.Gamma, si, cr.SaturationTotal, Δs[i])
	}
	// The photons of each pulse against the trap's depth (for the output
	// only: the beams are shared with a goal's trial copies).
	for cb, i := range index {
		if !full {
			break
		}
		pulse := cb.Atoms.Row.Element.Pulse
		if t := cr.Trap; pulse > 0 && t != nil && t.Holds {
			trec := atoms.RecoilTemperature(cb.Atoms.Row.BeamIn.Wavelength, tr.Mass)
			cb.Photons = MultiBeamScattering(tr.Gamma, s[i], cr.SaturationTotal, Δs[i]) * pulse
			cb.HeatOut, cb.PushOut = atoms.PhotonsToHeatOut(t.Depth, trec), atoms.PhotonsToPushOut(t.Depth, trec)
		}
	}
}

// heating is the far-detuned beams' recoil heating at r, K/s: each beam's
// scattering (its rate per intensity times its intensity there; a standing
// wave's from its combined potential over U/I) heats by
// atoms.RecoilHeatingRate with the recoil of its own wavelength.
func (f *field) heating(r [3]float64) float64 {
	rate := 0.0
	for _, b := range f.beams {
		i := b.intensity(r)
		if b.back != nil {
			i = b.potential(r) / b.perI
		}
		rate += atoms.RecoilHeatingRate(atoms.RecoilTemperature(b.λ, f.mass), b.scatI*i)
	}
	return rate
}

// lightShifts are the light shifts of the far-detuned beams at r: the
// ground state's U/h and the transition's (U_e − U_g)/h, Hz (NaN when
// excited_polarizability does not give U_e for every beam's laser, or no
// beam is far detuned). A standing wave's intensity at r is its combined
// potential over U/I.
func (f *field) lightShifts(r [3]float64, c *setup.Cloud) (ground, differential float64) {
	known := len(f.beams) > 0
	for _, b := range f.beams {
		u := b.potential(r)
		ground += u / atoms.H
		i := b.intensity(r)
		if b.back != nil {
			i = u / b.perI
		}
		αe, ok := c.ExcitedPolarizability[b.laser.Name]
		if !ok {
			known = false
			continue
		}
		differential += (ExcitedShiftPerIntensity(αe)*i - u) / atoms.H
	}
	if !known {
		differential = math.NaN()
	}
	return ground, differential
}

// ExcitedShiftPerIntensity is the light shift per unit intensity of a state
// of polarizability α (atomic units): U/I = −α/(2 ε0 c), J per W/m² (the
// dipole potential of a state in a light field, Grimm et al. (2000), eq.
// (2), with α in SI = α(a.u.) · 4π ε0 a0³).
func ExcitedShiftPerIntensity(αAU float64) float64 {
	return -αAU * atoms.AUPol / (2 * atoms.Eps0 * atoms.C)
}

// MultiBeamScattering is one beam's scattering rate among several
// near-resonant beams whose saturation parameters add to sTotal:
// (Γ/2) s/(1 + sTotal + 4Δ²/Γ²), photons/s (the rate-equation
// approximation common in laser cooling, e.g. Metcalf and van der Straten,
// Laser Cooling and Trapping (1999), §7.3; common practice).
func MultiBeamScattering(Γ, s, sTotal, Δ float64) float64 {
	return Γ / 2 * s / (1 + sTotal + 4*Δ*Δ/(Γ*Γ))
}

// goalLasers are the lasers a cloud goal scales: those it names, else the
// far-detuned ones for a trap depth and the near-resonant ones otherwise.
func (cr *CloudResult) goalLasers() []*setup.Laser {
	c := cr.Cloud
	var out []*setup.Laser
	for _, cb := range cr.Beams {
		las := cb.Atoms.Path.Laser
		want := cb.Near
		if c.Goal == setup.GoalTrapDepth {
			want = cb.Far
		}
		if len(c.GoalLasers) > 0 {
			want = slices.Contains(c.GoalLasers, las.Name)
		}
		if want && !slices.Contains(out, las) {
			out = append(out, las)
		}
	}
	return out
}

// metric is what the cloud goal measures with the lasers scaled by k:
// trap depth (K), s, or Ω (rad/s).
func (cr *CloudResult) metric(lasers []*setup.Laser, k float64) float64 {
	trial := *cr
	trial.evaluate(lasers, k, false)
	switch cr.Cloud.Goal {
	case setup.GoalTrapDepth:
		if trial.Trap == nil || !trial.Trap.Holds || trial.Trap.Skipped != "" {
			return 0
		}
		return trial.Trap.Depth / atoms.KB
	case setup.GoalSaturation:
		return trial.SaturationTotal
	}
	return atoms.Rabi(cr.Cloud.Data.Gamma, trial.SaturationTotal)
}

// goal finds the common factor k on the scaled lasers' operating powers
// that just meets the cloud's goal, by bisection on log k (every figure
// grows with the power; the trap depth is not linear in it once gravity
// counts).
func (cr *CloudResult) goal(verify bool) *CloudGoal {
	c := cr.Cloud
	tr := c.Data
	g := &CloudGoal{Kind: c.Goal, Factor: c.GoalFactor, Lasers: cr.goalLasers(), Upper: c.GoalMax}
	switch c.Goal {
	case setup.GoalTrapDepth, setup.GoalSaturation:
		g.Target = *c.GoalValue
	case setup.GoalRabi:
		g.Target = 2 * math.Pi * *c.GoalValue
	case setup.GoalCollective:
		// The threshold of the first near-resonant beam's cloud column.
		for _, cb := range cr.Beams {
			if cb.Near {
				a := cb.Atoms
				col := atoms.CollectiveThreshold(a.OpticalDepth, tr.Gamma)
				if c.CollectiveRate > 0 {
					col = atoms.CollectiveFromRate(2*math.Pi*c.CollectiveRate, tr.Gamma, a.OpticalDepth)
				}
				g.Target = c.GoalFactor * col.OmegaC
				break
			}
		}
	}
	switch {
	case len(g.Lasers) == 0:
		g.Impossible = fmt.Sprintf("no beam at the cloud can serve a %s goal (%s)", c.Goal, map[bool]string{true: "no far-detuned beam", false: "no near-resonant beam"}[c.Goal == setup.GoalTrapDepth])
		return g
	case !(g.Target > 0):
		g.Impossible = "no near-resonant beam to set the collective threshold"
		return g
	}
	if t := cr.Trap; c.Goal == setup.GoalTrapDepth && t != nil && t.Skipped != "" {
		g.Impossible = "the combined trap was not searched for: " + t.Skipped
		return g
	}
	// With the scaled lasers off, the other beams may reach the goal (or,
	// for an upper bound, pass it) alone: no factor on these lasers
	// changes that, and no margin in dB means anything.
	if alone := cr.metric(g.Lasers, 0); alone >= g.Target {
		if g.Upper {
			if alone > g.Target {
				g.Impossible = fmt.Sprintf("the other beams alone, with %s off, already give %s: more than the goal allows whatever these lasers do", laserNames(g.Lasers), goalFigure(c.Goal, alone))
				return g
			}
		} else {
			g.WithoutScaling, g.Met, g.MarginDB = true, true, math.NaN()
			g.Needed = make([]float64, len(g.Lasers))
			return g
		}
	}
	γ := 1.0 // the figure's power law in k: s and U grow as k, Ω as √k
	if c.Goal == setup.GoalRabi || c.Goal == setup.GoalCollective {
		γ = 0.5
	}
	hi, ok := numeric.SolveScale(func(k float64) float64 { return cr.metric(g.Lasers, k) }, g.Target, γ)
	// A trap's depth at the factor found is checked by a search of its
	// own: where the way out crosses another saddle there, the factor is
	// solved again from it (a tolerance sample keeps the nominal's).
	for round := 0; ok && verify && c.Goal == setup.GoalTrapDepth && round < 3; round++ {
		f := cr.fieldOf(g.Lasers, hi, true)
		f.hint, f.trial, f.flood = cr.hint, true, true
		t := f.findTrap()
		if !t.Found || t.Saddle == nil {
			break
		}
		m := t.Minimum
		cr.hint, cr.saddle = &m, t.Saddle
		if t.Depth/atoms.KB >= g.Target*(1-1e-4) {
			break
		}
		hi, ok = numeric.SolveScale(func(k float64) float64 { return cr.metric(g.Lasers, k) }, g.Target, γ)
	}
	g.hints = trapHints{cr.hint, cr.saddle}
	if !ok {
		g.Impossible = fmt.Sprintf("even a million times the operating powers of %s does not reach it", laserNames(g.Lasers))
		return g
	}
	g.Scale = hi
	for _, las := range g.Lasers {
		g.Needed = append(g.Needed, hi*las.OperatingPower)
		g.BeyondMaximum = g.BeyondMaximum || hi*las.OperatingPower > las.Power
	}
	if g.Upper {
		g.BeyondMaximum = false
		g.MarginDB = units.Decibels(hi)
		g.Met = hi >= 1
		return g
	}
	g.MarginDB = -units.Decibels(hi)
	g.Met = hi <= 1
	return g
}

func laserNames(ls []*setup.Laser) string {
	out := ""
	for i, l := range ls {
		if i > 0 {
			out += ", "
		}
		out += fmt.Sprintf("%q", l.Name)
	}
	return out
}

// Cloud finding kinds.
const (
	FindingNoHold              budget.FindingKind = "trap_does_not_hold"
	FindingTrapOffset          budget.FindingKind = "trap_offset"
	FindingCloudGoalShort      budget.FindingKind = "cloud_goal_short"
	FindingCloudGoalExceeded   budget.FindingKind = "cloud_goal_exceeded"
	FindingCloudGoalImpossible budget.FindingKind = "cloud_goal_impossible"
	FindingPulseHeatsOut       budget.FindingKind = "pulse_heats_out"
)

// UnreachedCloudGoals are the goals of clouds no beam reaches: each cannot
// be met, and says so rather than vanish.
func UnreachedCloudGoals(s *setup.Setup, clouds []*CloudResult) []budget.Finding {
	var out []budget.Finding
	for _, c := range s.Clouds {
		if c.Goal == "" || slices.ContainsFunc(clouds, func(cr *CloudResult) bool { return cr.Cloud == c }) {
			continue
		}
		out = append(out, budget.Finding{Severity: budget.SeverityDrive, Kind: FindingCloudGoalImpossible,
			Message: fmt.Sprintf("cloud %q: goal %s cannot be met: no beam reaches the cloud (no atoms element names it, or no light arrives there)", c.Name, c.Goal)})
	}
	return out
}

// CloudFindings lists what the clouds' combined figures found: a trap that
// would hold but for gravity (action), a trap whose minimum lies more than
// one rms size from the cloud (advice), a pulse whose photons heat the
// atoms out of the trap (advice: right for destructive imaging), and a
// cloud goal short or impossible (action).
func CloudFindings(clouds []*CloudResult) []budget.Finding {
	var out []budget.Finding
	for _, cr := range clouds {
		c := cr.Cloud
		where := fmt.Sprintf("cloud %q", c.Name)
		if t := cr.Trap; t != nil {
			switch {
			case !t.Holds && t.HoldsWithoutGravity:
				out = append(out, budget.Finding{Severity: budget.SeverityDrive, Kind: FindingNoHold, Message: fmt.Sprintf("%s: the far-detuned beams make a trap that does not hold against gravity (it would without it); raise their power or add confinement along gravity", where)})
			case t.Holds:
				off := math.Sqrt(numeric.Dot(t.Minimum, t.Minimum))
				if rms := c.RMSAlong(normalizeOr(t.Minimum)); off > rms {
					out = append(out, budget.Finding{Severity: budget.SeverityNote, Kind: FindingTrapOffset, Message: fmt.Sprintf("%s: the trap minimum lies %s from the cloud's position (more than its rms size there, %s); the force at the cloud is %.3g g",
						where, units.FormatLength(off), units.FormatLength(rms), t.ForceAtCloud)}.Figure(off, rms, "m"))
				}
			}
		}
		for _, cb := range cr.Beams {
			if cb.Photons > cb.HeatOut {
				e := cb.Atoms.Row.Element
				out = append(out, budget.Finding{Severity: budget.SeverityNote, Kind: FindingPulseHeatsOut, Message: fmt.Sprintf("%s: each atom scatters %s photons in the %s pulse of path %q (element %d), more than the %s that heat an atom out of the trap from its bottom: expect the atoms to leave the trap (as destructive imaging does)",
					where, units.FormatNumber(cb.Photons), units.FormatSI(e.Pulse, "s"), cb.Atoms.Path.Path.Name, e.Index, units.FormatNumber(cb.HeatOut))}.Figure(cb.Photons, cb.HeatOut, "1"))
			}
		}
		if g := cr.Goal; g != nil {
			switch {
			case g.Impossible != "":
				out = append(out, budget.Finding{Severity: budget.SeverityDrive, Kind: FindingCloudGoalImpossible, Message: fmt.Sprintf("%s: goal %s cannot be met: %s", where, g.Kind, g.Impossible)})
			case !g.Met && g.Upper:
				out = append(out, budget.Finding{Severity: budget.SeverityDrive, Kind: FindingCloudGoalExceeded, Message: fmt.Sprintf("%s: goal %s at most its goal_max is exceeded by %.1f dB: the operating powers of %s may be at most %.3g × what they are", where, g.Kind, -g.MarginDB, laserNames(g.Lasers), g.Scale)}.Figure(1, g.Scale, "1"))
			case !g.Met:
				msg := fmt.Sprintf("%s: goal %s is short by %.1f dB: it needs %.3g × the operating powers of %s", where, g.Kind, -g.MarginDB, g.Scale, laserNames(g.Lasers))
				if g.BeyondMaximum {
					msg += "; that is more than the maximum power of " + beyondNames(g) + ", so no setting of the lasers meets it"
				}
				out = append(out, budget.Finding{Severity: budget.SeverityDrive, Kind: FindingCloudGoalShort, Message: msg}.Figure(g.Scale, 1, "1"))
			}
		}
	}
	return out
}

// normalizeOr is the unit vector along a, or z for the zero vector.
func normalizeOr(a [3]float64) [3]float64 {
	if numeric.Dot(a, a) == 0 {
		return [3]float64{0, 0, 1}
	}
	return numeric.Normalize(a)
}

// trapDepthScale is the factor k on a single far-detuned beam's power at
// which its own trap, found at its real minimum with the cloud's gravity,
// is depth deep (J), by bisection on log k; why says why there is none.
// The trap's escape saddle is searched for at the operating power and
// again at the factor found, which is solved again from a lower saddle
// found there; given (a tolerance sample) starts from the nominal's and
// is not searched again. hints are the trap's at the factor found.
func trapDepthScale(a *AtomsResult, depth float64, given *trapHints) (k float64, hints trapHints, why string) {
	c := a.Cloud
	if c.Data.Mass == 0 {
		return 0, hints, "the transition's data give no mass"
	}
	fieldAt := func(k float64) *field {
		f := singleBeamField(a, k)
		f.hint, f.saddle, f.trial = hints.minimum, hints.saddle, true
		return f
	}
	// search is a trap search at factor k that floods for the saddle.
	search := func(k float64) Trap {
		f := fieldAt(k)
		f.saddle, f.flood = nil, true
		t := f.findTrap()
		if t.Found {
			m := t.Minimum
			hints = trapHints{&m, t.Saddle}
		}
		return t
	}
	if given != nil {
		hints = *given
	} else {
		search(1)
	}
	at := func(k float64) float64 {
		f := fieldAt(k)
		t := f.findTrap()
		if hints.minimum == nil && t.Found {
			m := t.Minimum
			hints.minimum = &m
		}
		if !t.Holds {
			return 0
		}
		return t.Depth
	}
	k, ok := numeric.SolveScale(at, depth, 1)
	for round := 0; ok && given == nil && round < 3; round++ {
		if t := search(k); !t.Found || t.Saddle == nil || t.Depth >= depth*(1-1e-4) {
			break
		}
		k, ok = numeric.SolveScale(at, depth, 1)
	}
	if !ok {
		return 0, hints, "even a million times the power makes no trap that deep against gravity"
	}
	return k, hints, ""
}

// singleBeamField is the field of atoms element a's far-detuned beam alone
// at k times its power, with the cloud's gravity.
func singleBeamField(a *AtomsResult, k float64) *field {
	n := a.Row.Element.Direction
	u, v := setup.BeamAxes(n)
	beam := a.Row.BeamIn
	return &field{mass: a.Cloud.Data.Mass, down: a.Cloud.Down, beams: []fieldBeam{{x: beam.X, y: beam.Y, λ: beam.Wavelength, power: k * a.Power,
		perI: a.Dipole.PerIntensity, scatI: a.Dipole.scatI, n: n, u: u, v: v, laser: a.Path.Laser}}}
}

// beyondNames lists the lasers a cloud goal would take past their maximum
// power, each with the power it would need and its maximum.
func beyondNames(g *CloudGoal) string {
	var parts []string
	for i, las := range g.Lasers {
		if g.Needed[i] > las.Power {
			parts = append(parts, fmt.Sprintf("%q (needs %s, has at most %s)", las.Name, units.FormatPower(g.Needed[i]), units.FormatPower(las.Power)))
		}
	}
	return strings.Join(parts, ", ")
}

// goalFigure writes a cloud goal's figure: a trap depth in K, s, or Ω as
// a frequency.
func goalFigure(kind string, v float64) string {
	switch kind {
	case setup.GoalTrapDepth:
		return "a depth of " + units.FormatSI(v, "K")
	case setup.GoalSaturation:
		return "s = " + units.FormatNumber(v)
	}
	return "Ω/2π = " + units.FormatFrequency(v/(2*math.Pi))
}
