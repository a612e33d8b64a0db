package safety

import (
	"fmt"
	"math/rand/v2"
	"runtime"
	"slices"
	"strings"
	"sync"
	"sync/atomic"

	"beamledger/budget"
	"beamledger/budget/drive"
	"beamledger/budget/setup"
	"beamledger/budget/units"
)

// The hazards over toleranced geometry. A toleranced position, focal length
// or waist moves foci and changes beam sizes, so the figures at the nominal
// values may not be the worst within the tolerances: a focus moved into an
// open segment, a beam grown onto an aperture's edge. The hazards are
// therefore evaluated again at a set of geometries within the tolerances
// (each value at its ends and at points between, one at a time, then the
// corners where all are at an end together); the findings any of them
// makes worse than the nominal geometry's are added, each naming its
// geometry, and the eyewear needed and the alignment powers are the worst
// over all of them. The sweep is a search, not a proof: an extreme between
// the points evaluated can be missed, which Sweep.Description says.

// Sweep says what the hazards' sweep over toleranced geometry evaluated.
type Sweep struct {
	// Tolerances is the number of toleranced positions, focal lengths and
	// waists; Geometries the geometries evaluated besides the nominal one,
	// of Planned.
	Tolerances, Geometries, Planned int
	// Between is the number of points between the ends evaluated for each
	// value (0: its ends only); Corners the corners evaluated, AllCorners
	// set when they are every corner.
	Between, Corners int
	AllCorners       bool
	// Worse counts the findings added because a geometry made them worse.
	Worse int
}

// Description says what the sweep did, for the assumptions.
func (w *Sweep) Description() string {
	if w == nil || w.Tolerances == 0 {
		return ""
	}
	each := "at its two ends"
	if w.Between > 0 {
		each = fmt.Sprintf("at its two ends and at the %d points that divide its range into %d equal parts", w.Between, w.Between+1)
	}
	var corners string
	switch {
	case w.Tolerances == 1:
		corners = ""
	case w.AllCorners:
		corners = fmt.Sprintf(", then all %d corners where every one is at an end together", w.Corners)
	default:
		corners = fmt.Sprintf(", then %d corners where every one is at an end together (all at their low ends, all at their high ends, and %d drawn with the fixed seed %d)", w.Corners, w.Corners-2, sweepSeed)
	}
	s := fmt.Sprintf("toleranced positions, focal lengths and waists (%d): the figures of the open segments and the reflections, the findings, the eyewear needed and the alignment powers are the worst of %d geometries within the tolerances (the nominal one, and each value %s with the others nominal%s), each segment and reflection naming the geometry of its worst figures; the budget's tables are at the nominal values. A search, not a proof: an extreme between the points evaluated can be missed",
		w.Tolerances, w.Geometries+1, each, corners)
	if w.Worse > 0 {
		s += fmt.Sprintf("; %d finding(s) added where a geometry within the tolerances is worse than the nominal one, each naming it", w.Worse)
	}
	if w.Geometries < w.Planned {
		s += fmt.Sprintf("; only %d of the %d geometries planned were evaluated (see the findings)", w.Geometries, w.Planned)
	}
	return s
}

const (
	// sweepBetween is the number of points between a value's ends the
	// sweep evaluates, while there are at most sweepBetweenUpTo values.
	sweepBetween     = 3
	sweepBetweenUpTo = 16
	// sweepAllCornersUpTo is the number of values up to which every
	// corner is evaluated (2⁶ = 64); above it sweepCorners corners are.
	sweepAllCornersUpTo = 6
	sweepCorners        = 32
	sweepSeed           = 20261203
)

// sweepWork bounds the geometries evaluated times the elements of the
// setup: beyond it the rest of the plan is left out and a defect says so
// (a variable so that a test can lower it).
var sweepWork = 400_000

// FindingSweepCut is the defect of a sweep that could not evaluate every
// geometry it planned.
const FindingSweepCut budget.FindingKind = "geometry_sweep_cut"

// GeometricTolerances lists the toleranced values of s that change the
// beams' geometry: positions, focal lengths, waists and their positions
// (not the loss values, which the conservative ends handle, nor the
// operating powers, which the hazards do not use).
func GeometricTolerances(s *setup.Setup) []*setup.Toleranced {
	var out []*setup.Toleranced
	for _, t := range s.Tolerances {
		if !t.LossValue() && t.Key != "operating_power" {
			out = append(out, t)
		}
	}
	return out
}

// geometry is one setup of the sweep and how it differs from the nominal.
type geometry struct {
	values []float64 // one per geometric tolerance
	what   string
}

// sweepPlan lists the geometries to evaluate, in the order they are
// evaluated (the corners at all-low and all-high first, as they are the
// likeliest extremes, then each value alone, then the other corners).
func sweepPlan(g []*setup.Toleranced) ([]geometry, Sweep) {
	n := len(g)
	w := Sweep{Tolerances: n}
	nominal := make([]float64, n)
	lo, hi := make([]float64, n), make([]float64, n)
	for i, t := range g {
		nominal[i] = t.Tol.Nominal()
		lo[i], hi[i] = t.Tol.Ends()
	}
	var plan []geometry
	corner := func(high []bool) geometry {
		v := make([]float64, n)
		for i := range v {
			v[i] = lo[i]
			if high[i] {
				v[i] = hi[i]
			}
		}
		return geometry{values: v, what: describeGeometry(g, v, nominal)}
	}
	var corners [][]bool
	if n > 1 {
		allLow, allHigh := make([]bool, n), make([]bool, n)
		for i := range allHigh {
			allHigh[i] = true
		}
		corners = append(corners, allLow, allHigh)
		if n <= sweepAllCornersUpTo {
			w.AllCorners = true
			for m := 1; m < 1<<n-1; m++ {
				c := make([]bool, n)
				for i := range c {
					c[i] = m&(1<<i) != 0
				}
				corners = append(corners, c)
			}
		} else {
			// Distinct corners, none of them all low or all high.
			r := rand.New(rand.NewPCG(sweepSeed, uint64(n)))
			drawn := map[string]bool{fmt.Sprint(allLow): true, fmt.Sprint(allHigh): true}
			for len(corners) < sweepCorners {
				c := make([]bool, n)
				for i := range c {
					c[i] = r.IntN(2) == 1
				}
				if k := fmt.Sprint(c); !drawn[k] {
					drawn[k] = true
					corners = append(corners, c)
				}
			}
		}
	}
	w.Corners = len(corners)
	for _, c := range corners[:min(2, len(corners))] {
		plan = append(plan, corner(c))
	}
	if n <= sweepBetweenUpTo {
		w.Between = sweepBetween
	}
	for i := range g {
		for k := 0; k <= w.Between+1; k++ {
			v := append([]float64(nil), nominal...)
			v[i] = lo[i] + (hi[i]-lo[i])*float64(k)/float64(w.Between+1)
			if k == w.Between+1 {
				v[i] = hi[i] // the end itself, not a rounding of it
			}
			if v[i] == nominal[i] {
				continue // the nominal geometry itself
			}
			plan = append(plan, geometry{values: v, what: describeGeometry(g, v, nominal)})
		}
	}
	for _, c := range corners[min(2, len(corners)):] {
		plan = append(plan, corner(c))
	}
	w.Planned = len(plan)
	return plan, w
}

// describeGeometry names the values of a geometry that differ from the
// nominal ones; past six, the count of the others.
func describeGeometry(g []*setup.Toleranced, v, nominal []float64) string {
	var parts []string
	others := 0
	for i, t := range g {
		if v[i] == nominal[i] {
			continue
		}
		if len(parts) == 6 {
			others++
			continue
		}
		parts = append(parts, fmt.Sprintf("%s at %s", t.Label, units.FormatLength(v[i])))
	}
	s := strings.Join(parts, ", ")
	if others > 0 {
		s += fmt.Sprintf(" and %d other toleranced value(s) at an end", others)
	}
	if s == "" {
		s = "the nominal values"
	}
	return s
}

// exposureKey names one beam's segment the same way in every geometry: its
// path, its laser and the element it follows.
type exposureKey struct {
	path, laser string
	after       int
}

func keyOf(e *Exposure) exposureKey {
	return exposureKey{e.Path.Path.Name, e.Path.Laser.Name, e.Segment.After}
}

// figures are the measured figures of one exposure at one geometry
// (measureSegment), kept without the budget they were measured on.
type figures struct {
	Ratio, Irradiance, At, PeakIrr, SkinIrr, SkinRatio, Power, BeamIrradiance, NOHD float64
}

// worstFigure is the worst of one figure over the geometries: the figures
// of the geometry it comes from, and that geometry's index in the plan.
type worstFigure struct {
	f   figures
	geo int
}

// take keeps f from geometry geo when its value v is higher than the
// kept one's, or equal and from an earlier geometry: the result does not
// depend on the order the geometries finish in.
func (w *worstFigure) take(f figures, geo int, v, kept float64) {
	if v > kept || (v == kept && geo < w.geo) {
		w.f, w.geo = f, geo
	}
}

// worstFigures are one exposure's worst figures over the geometries.
type worstFigures struct {
	eye, skin, power, beam, nohd worstFigure
}

// sweepFigures gathers, as the geometries finish, what the nominal
// geometry's hazards take from the sweep: the worst figures of each
// exposure, the worst ratio of each laser, the eyewear needed, and the
// worst judged finding at each place. Each geometry's budget and hazards
// are let go once gathered, so a large sweep holds one per core.
type sweepFigures struct {
	mu       sync.Mutex
	plan     []geometry
	envelope *envelope
	worst    []float64 // by laser, in the setup's order
	needs    map[needKey]*EyewearNeed
	found    map[findingPlace]*foundFinding
}

// needKey is the wavelength and EN 207 test condition of an eyewear need.
type needKey struct {
	λ    float64
	mode string
}

// foundFinding is the worst judged finding at one place: the geometry it
// comes from and its index among that geometry's findings.
type foundFinding struct {
	f        budget.Finding
	geo, idx int
}

func newSweepFigures(plan []geometry, lasers int) *sweepFigures {
	return &sweepFigures{plan: plan, envelope: &envelope{plan: plan, worst: map[exposureKey]*worstFigures{}, reflections: map[reflectionKey]*worstReflection{}}, worst: make([]float64, lasers),
		needs: map[needKey]*EyewearNeed{}, found: map[findingPlace]*foundFinding{}}
}

// gather takes what geometry geo of the plan found: its hazard budget's
// findings and its hazards' (the open ends' controls applied).
func (sw *sweepFigures) gather(geo int, h *Hazards, findings []budget.Finding) {
	sw.mu.Lock()
	defer sw.mu.Unlock()
	for _, e := range slices.Concat(h.Exposures, h.Enclosed) {
		f := figuresOf(e)
		w := sw.envelope.worst[keyOf(e)]
		if w == nil {
			at := worstFigure{f, geo}
			sw.envelope.worst[keyOf(e)] = &worstFigures{at, at, at, at, at}
			continue
		}
		w.eye.take(f, geo, f.Ratio, w.eye.f.Ratio)
		w.skin.take(f, geo, f.SkinRatio, w.skin.f.SkinRatio)
		w.power.take(f, geo, f.Power, w.power.f.Power)
		w.beam.take(f, geo, f.BeamIrradiance, w.beam.f.BeamIrradiance)
		w.nohd.take(f, geo, f.NOHD, w.nohd.f.NOHD)
	}
	for _, r := range h.Reflections {
		sw.envelope.take(r, geo)
	}
	for i, ll := range h.Lasers {
		sw.worst[i] = max(sw.worst[i], h.worstRatio(ll))
	}
	for _, n := range h.Eyewear {
		k := needKey{n.Wavelength, n.Mode}
		if sw.needs[k] == nil {
			sw.needs[k] = &EyewearNeed{Wavelength: n.Wavelength, Mode: n.Mode}
		}
		sw.needs[k].raise(*n)
	}
	for i, f := range findings {
		if !judged(f) {
			continue
		}
		p := placeOf(f)
		b := sw.found[p]
		if b == nil || worse(f, b.f) || (!worse(b.f, f) && (geo < b.geo || geo == b.geo && i < b.idx)) {
			sw.found[p] = &foundFinding{f, geo, i}
		}
	}
}

func (sw *sweepFigures) envelopeOf() *envelope {
	if sw == nil {
		return nil
	}
	return sw.envelope
}

// worstOf is the worst ratio of the i-th laser over the sweep (0 without
// one).
func (sw *sweepFigures) worstOf(i int) float64 {
	if sw == nil {
		return 0
	}
	return sw.worst[i]
}

// needsOf is the eyewear the sweep's geometries need, each wavelength and
// test condition at the worst over them.
func (sw *sweepFigures) needsOf() []EyewearNeed {
	if sw == nil {
		return nil
	}
	out := make([]EyewearNeed, 0, len(sw.needs))
	for _, n := range sw.needs {
		out = append(out, *n)
	}
	return out
}

// envelope is the worst of each exposure's measured figures over the
// sweep's geometries, and of each reflection's, with the geometry each
// comes from.
type envelope struct {
	plan        []geometry
	worst       map[exposureKey]*worstFigures
	reflections map[reflectionKey]*worstReflection
}

// reflectionKey names one beam's reflection the same way in every
// geometry: its path, laser, element (0: the open end) and kind.
type reflectionKey struct {
	path, laser string
	element     int
	kind        ReflectionKind
}

func reflectionKeyOf(r *Reflection) reflectionKey {
	k := reflectionKey{r.Path.Path.Name, r.Path.Laser.Name, 0, r.Kind}
	if r.Element != nil {
		k.element = r.Element.Index
	}
	return k
}

// worstReflection is a reflection's figures at the geometry where it is
// worst (the highest ratio to the eye MPE at the surface; for a diffuse
// zone the largest radius), and that geometry's index in the plan.
type worstReflection struct {
	power, irradiance, ratio, radius float64
	geo                              int
}

// score is what makes a reflection worse.
func (w worstReflection) score() float64 { return max(w.ratio, w.radius) }

// take keeps r from geometry geo when it is worse, or as bad and from an
// earlier geometry.
func (v *envelope) take(r *Reflection, geo int) {
	k := reflectionKeyOf(r)
	x := worstReflection{r.Power, r.Irradiance, r.Ratio, r.Radius, geo}
	w := v.reflections[k]
	if w == nil || x.score() > w.score() || (x.score() == w.score() && geo < w.geo) {
		v.reflections[k] = &x
	}
}

// raiseReflection sets the figures of r (the nominal geometry's, before it
// is judged) to the worst over the sweep where that is worse, and names
// the geometry (Reflection.Geometry). A nil envelope leaves r as it is.
func (v *envelope) raiseReflection(r *Reflection) {
	if v == nil {
		return
	}
	w := v.reflections[reflectionKeyOf(r)]
	if w == nil || !(w.score() > max(r.Ratio, r.Radius)) {
		return
	}
	r.Power, r.Irradiance, r.Ratio, r.Radius = w.power, w.irradiance, w.ratio, w.radius
	r.Geometry = v.plan[w.geo].what
}

func figuresOf(e *Exposure) figures {
	return figures{e.Ratio, e.Irradiance, e.At, e.PeakIrr, e.SkinIrr, e.SkinRatio, e.Power, e.BeamIrradiance, e.NOHD}
}

// raise sets each measured figure of e (the nominal geometry's) to the
// worst over the sweep where that is higher, and names the geometry
// (Exposure.Geometry). The eye figures (the ratio, its irradiance, the
// worst point and the peak irradiance there) go together, from one
// geometry. A nil envelope leaves e as it is.
func (v *envelope) raise(e *Exposure) {
	if v == nil {
		return
	}
	w := v.worst[keyOf(e)]
	if w == nil {
		return
	}
	var named []int // the geometries the raised figures come from, eye first
	if x := w.eye.f; x.Ratio > e.Ratio {
		e.Irradiance, e.Ratio, e.At, e.PeakIrr = x.Irradiance, x.Ratio, x.At, x.PeakIrr
		named = append(named, w.eye.geo)
	}
	if x := w.nohd.f; x.NOHD > e.NOHD {
		e.NOHD = x.NOHD
		named = append(named, w.nohd.geo)
	}
	if x := w.skin.f; x.SkinRatio > e.SkinRatio {
		e.SkinIrr, e.SkinRatio = x.SkinIrr, x.SkinRatio
		named = append(named, w.skin.geo)
	}
	if x := w.power.f; x.Power > e.Power {
		e.Power = x.Power
		named = append(named, w.power.geo)
	}
	if x := w.beam.f; x.BeamIrradiance > e.BeamIrradiance {
		e.BeamIrradiance = x.BeamIrradiance
		named = append(named, w.beam.geo)
	}
	if len(named) > 0 {
		e.Geometry = v.plan[named[0]].what
	}
}

// sweepGeometry evaluates the hazards at every geometry of the plan that
// fits the work bound, on all cores, and gathers what they find. c is the
// hazards' conservative setup.
func sweepGeometry(c *setup.Setup, g []*setup.Toleranced, plan []geometry, w *Sweep) (*sweepFigures, error) {
	elements := 1
	for _, p := range c.Paths {
		elements += len(p.Elements)
	}
	fit := min(len(plan), max(2, sweepWork/elements))
	sw := newSweepFigures(plan, len(c.Lasers))
	errs := make([]error, fit)
	var (
		wg   sync.WaitGroup
		next atomic.Int64
	)
	for range min(runtime.GOMAXPROCS(0), fit) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := int(next.Add(1) - 1); i < fit; i = int(next.Add(1) - 1) {
				h, f, err := evaluateGeometry(c, g, plan[i].values)
				if errs[i] = err; err == nil {
					sw.gather(i, h, f)
				}
			}
		}()
	}
	wg.Wait()
	for i, err := range errs {
		if err != nil {
			return nil, fmt.Errorf("hazards with %s (within the stated tolerances): %w", plan[i].what, err)
		}
	}
	w.Geometries = fit
	return sw, nil
}

// evaluateGeometry evaluates the hazards of c with the geometric tolerances
// g at the values v: the hazards, and the hazard budget's findings with the
// hazards', the open ends' controls applied, as for the nominal geometry.
func evaluateGeometry(c *setup.Setup, g []*setup.Toleranced, v []float64) (*Hazards, []budget.Finding, error) {
	s := c.Clone()
	for i, t := range g {
		t.Apply(s, v[i])
	}
	b, err := drive.Budget(s, false)
	if err != nil {
		return nil, nil, err
	}
	h, err := evaluateHazards(s, b, nil)
	if err != nil {
		return nil, nil, err
	}
	f := append(b.Findings(), h.Findings...)
	controlOpenEnds(s, b, f)
	return h, f, nil
}

// findingPlace is where a finding is, and of what kind: the sweep compares
// the worst finding of each kind at each place.
type findingPlace struct {
	kind    budget.FindingKind
	path    string
	element int
	unit    string
}

func placeOf(f budget.Finding) findingPlace {
	return findingPlace{f.Kind, f.Path, f.Element, f.Unit}
}

// judged reports whether a finding counts in the sweep: the defects and
// the hazards (the notes and the drive's findings do not judge safety).
func judged(f budget.Finding) bool {
	return f.Severity == budget.SeverityDefect || f.Severity == budget.SeverityHazard
}

// worse reports whether finding f is worse than w: uncontrolled where w is
// controlled, or with a higher ratio to its limit (a higher ratio is the
// worse for every defect and hazard that has a figure).
func worse(f, w budget.Finding) bool {
	if f.Uncontrolled() != w.Uncontrolled() {
		return f.Uncontrolled()
	}
	return f.Ratio() > w.Ratio()*(1+1e-9)
}

// findings are those the geometries make worse than the nominal findings:
// at each place, the worst of the geometries' when it is worse than the
// nominal geometry's worst there (or the nominal has none), its geometry
// named; in the order of the geometries, and of the findings in each.
func (sw *sweepFigures) findings(nominal []budget.Finding) []budget.Finding {
	base := map[findingPlace]budget.Finding{}
	for _, f := range nominal {
		if !judged(f) {
			continue
		}
		if w, ok := base[placeOf(f)]; !ok || worse(f, w) {
			base[placeOf(f)] = f
		}
	}
	var add []*foundFinding
	for p, b := range sw.found {
		if w, ok := base[p]; !ok || worse(b.f, w) {
			add = append(add, b)
		}
	}
	slices.SortFunc(add, func(a, b *foundFinding) int {
		if a.geo != b.geo {
			return a.geo - b.geo
		}
		return a.idx - b.idx
	})
	out := make([]budget.Finding, 0, len(add))
	for _, b := range add {
		f := b.f
		f.Message = fmt.Sprintf("with %s (within the stated tolerances): %s", sw.plan[b.geo].what, f.Message)
		out = append(out, f)
	}
	return out
}

// sweepCut is the defect of a sweep that left geometries out.
func sweepCut(w Sweep) budget.Finding {
	return budget.Finding{Severity: budget.SeverityDefect, Kind: FindingSweepCut,
		Message: fmt.Sprintf("the hazards were evaluated at %d of the %d geometries the tolerances of %d positions, focal lengths and waists call for (the rest pass what one run evaluates for a setup this large); the findings may miss a worse geometry: state fewer tolerances, or have the laser safety officer judge them", w.Geometries, w.Planned, w.Tolerances)}
}
