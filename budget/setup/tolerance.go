package setup

import (
	"beamledger/budget/units"
	"fmt"
	"maps"
	"math"
	"math/rand/v2"
	"strconv"
	"strings"
)

// Tolerance is how a toleranced value varies: uniform on [Lo, Hi] (a range
// "a .. b"), or normal with Mean and Sigma ("x ± s") truncated to the
// value's physical domain [Min, Max].
type Tolerance struct {
	Normal      bool
	Lo, Hi      float64 // the range (uniform)
	Mean, Sigma float64 // the normal
	Min, Max    float64 // the physical domain
	Text        string  // as written
}

// Nominal is the value every figure but the tolerance analysis uses: the
// centre of a range, the mean of a normal.
func (t Tolerance) Nominal() float64 {
	if t.Normal {
		return t.Mean
	}
	return (t.Lo + t.Hi) / 2
}

// Ends are the extreme values the worst case takes: the range's bounds, or
// mean ± 3σ clamped to the domain.
func (t Tolerance) Ends() (lo, hi float64) {
	if !t.Normal {
		return t.Lo, t.Hi
	}
	return math.Max(t.Min, t.Mean-3*t.Sigma), math.Min(t.Max, t.Mean+3*t.Sigma)
}

// Sample draws a value: uniform on the range, or normal truncated to the
// domain (by rejection; after 64 misses, the nearer bound).
func (t Tolerance) Sample(r *rand.Rand) float64 {
	if !t.Normal {
		return t.Lo + (t.Hi-t.Lo)*r.Float64()
	}
	for range 64 {
		if v := t.Mean + t.Sigma*r.NormFloat64(); v >= t.Min && v <= t.Max {
			return v
		}
	}
	return math.Max(t.Min, math.Min(t.Max, t.Mean))
}

// Toleranced is one toleranced value of a setup: where it is (a laser or
// an element, the key, an index into a pair, the laser of a per-laser
// table) and how it varies.
type Toleranced struct {
	Tol Tolerance
	// Laser is the index of the laser (−1: an element's value); Path and
	// Element the indices of the element (0-based).
	Laser, Path, Element int
	Key                  string
	// Index is 0 or 1 for one value of an [x, y] pair, −1 for both.
	Index int
	// PerLaser names the laser of a per-laser table ("": the bare value).
	PerLaser string
	// Label says where it is for people: `path "drive", element 3 (fiber), alignment`.
	Label string
	// PathName and LaserName name its path (an element's) or laser.
	PathName, LaserName string
}

// Apply sets the value v in setup s (a copy made by Clone).
func (t *Toleranced) Apply(s *Setup, v float64) {
	if t.Laser >= 0 {
		las := s.Lasers[t.Laser]
		switch t.Key {
		case "operating_power":
			las.OperatingPower = v
		case "waist":
			setPair(&las.Waist, t.Index, v)
		case "waist_at":
			setPair(&las.WaistAt, t.Index, v)
		}
		return
	}
	e := s.Paths[t.Path].Elements[t.Element]
	if t.PerLaser != "" {
		e.PerLaser[t.Key][t.PerLaser] = v
		return
	}
	switch t.Key {
	case "at":
		e.At = v
	case "focal_length":
		e.FocalLength = v
	case "transmission":
		e.Transmission = &v
	case "reflectivity":
		e.Reflectivity = &v
	case "efficiency":
		e.Efficiency = &v
	case "optical_density":
		e.OpticalDensity = &v
	case "alignment":
		e.Alignment = &v
	case "coupling":
		e.Coupling = &v
	case "join_transmission":
		e.JoinTransmission = &v
	}
}

// ApplyLeaving sets v as the value of a toleranced loss value for the
// light that leaves the path at its element (Element.Leaving), in setup s
// (a copy made by Clone).
func (t *Toleranced) ApplyLeaving(s *Setup, v float64) {
	if t.Laser >= 0 {
		return
	}
	e := s.Paths[t.Path].Elements[t.Element]
	if e.leaving == nil {
		e.leaving = map[string]map[string]float64{}
	}
	if e.leaving[t.Key] == nil {
		e.leaving[t.Key] = map[string]float64{}
	}
	e.leaving[t.Key][t.PerLaser] = v
}

func setPair(p *[2]float64, i int, v float64) {
	if i < 0 {
		p[0], p[1] = v, v
		return
	}
	p[i] = v
}

// HighTransmission is the end of a toleranced loss value that lets the
// most light through (the optical density's low end, every other loss
// value's high end), and whether the value is a loss value at all.
func (t *Toleranced) HighTransmission() (float64, bool) {
	lo, hi := t.Tol.Ends()
	switch {
	case !t.LossValue():
		return 0, false
	case t.Key == "optical_density":
		return lo, true
	}
	return hi, true
}

// LossValue reports whether the toleranced value is a loss value (a
// transmission, reflectivity, efficiency, alignment, coupling or optical
// density): it changes how much power goes on, never a beam's shape.
func (t *Toleranced) LossValue() bool { return boundedLoss[t.Key] }

// HighLeaving is the end of a toleranced loss value that sends the most
// light out of the path at its element as a beam of its own (a
// splitter's other port, a mirror's leak, an AOM's unused orders, a
// combiner's rejected port): the lowest transmission, reflectivity or
// efficiency. The other loss values send nothing out as a beam (absorbed,
// scattered, or not coupled into a fibre), so ok is false for them.
func (t *Toleranced) HighLeaving() (float64, bool) {
	lo, _ := t.Tol.Ends()
	switch t.Key {
	case "transmission", "reflectivity", "efficiency", "join_transmission":
		return lo, true
	}
	return 0, false
}

// toleranceKeys are the keys that may carry a tolerance, with their
// physical domain (a range must lie within it; a normal is truncated to
// it). focal_length's domain is its nominal sign, set when read.
var toleranceKeys = map[string][2]float64{
	"transmission": {0, 1}, "reflectivity": {0, 1}, "efficiency": {0, 1}, "alignment": {0, 1},
	"coupling": {0, 1}, "join_transmission": {0, 1}, "optical_density": {0, 20},
	"operating_power": {1e-15, 1e15}, "at": {0, 1e5}, "focal_length": {-1e5, 1e5},
	"waist": {1e-7, 10}, "waist_at": {-1e5, 1e5},
}

// boundedLoss are the loss values, whose domains are physical bounds that a
// normal tolerance is truncated to.
var boundedLoss = map[string]bool{"transmission": true, "reflectivity": true, "efficiency": true, "alignment": true, "coupling": true, "join_transmission": true, "optical_density": true}

// splitTolerance splits "a .. b", "x ± s" or "x +/- s"; ok is false when s
// is not written so.
func splitTolerance(s string) (a, b string, normal, ok bool) {
	if a, b, found := strings.Cut(s, ".."); found {
		return strings.TrimSpace(a), strings.TrimSpace(b), false, true
	}
	for _, sep := range []string{"±", "+/-"} {
		if a, b, found := strings.Cut(s, sep); found {
			return strings.TrimSpace(a), strings.TrimSpace(b), true, true
		}
	}
	return "", "", false, false
}

// tolLabel names a toleranced value for people.
func tolLabel(where, key string, index int, perLaser string) string {
	l := where + ", " + key
	if index >= 0 {
		l += " " + []string{"x", "y"}[index]
	}
	if perLaser != "" {
		l += " for laser " + strconv.Quote(perLaser)
	}
	return l
}

// pendingTol is a tolerance as read, before its place is resolved.
type pendingTol struct {
	loc, key, perLaser string
	index              int
	tol                Tolerance
}

// tolerance reads a toleranced quantity, "a .. b" or "x ± s", records it
// and returns its nominal value.
func (t *table) tolerance(key, x, a, b string, normal bool, dim units.Dimension) (float64, bool) {
	k, per := key, ""
	if t.keyAs != "" {
		k, per = t.keyAs, key
	}
	dom, allowed := toleranceKeys[k]
	laserKey := k == "operating_power" || k == "waist" || k == "waist_at"
	if !allowed || laserKey != strings.HasPrefix(t.loc, "laser[") {
		t.fail(key, "%q: %s takes no tolerance (ranges \"a .. b\" and \"x ± s\" are for the loss values, a laser's operating_power, waist and waist_at, and an element's at and focal_length)", x, k)
		return 0, false
	}
	// One tolerance per value: a bound that is itself a range or a ±.
	for _, part := range []string{a, b} {
		if _, _, _, nested := splitTolerance(part); nested {
			t.fail(key, "%q: one tolerance per value (\"a .. b\" or \"x ± s\"), not a tolerance inside another", x)
			return 0, false
		}
	}
	pa, ok := t.rawQuantity(key, a, dim)
	if !ok {
		return 0, false
	}
	pb, ok := t.rawQuantity(key, b, dim)
	if !ok {
		return 0, false
	}
	if k == "focal_length" {
		if pa > 0 {
			dom[0] = 1e-6
		} else {
			dom[1] = -1e-6
		}
	}
	tol := Tolerance{Normal: normal, Min: dom[0], Max: dom[1], Text: x}
	if normal {
		if !(pb > 0) {
			t.fail(key, "%q: the standard deviation must be positive", x)
			return 0, false
		}
		tol.Mean, tol.Sigma = pa, pb
		if pa < dom[0] || pa > dom[1] {
			t.fail(key, "%q: the mean lies outside the value's physical domain [%g, %g]", x, dom[0], dom[1])
			return 0, false
		}
		// The samples and the worst case reach mean ± 3σ: for a size, a
		// power or a position that must be a value the setup could hold
		// written directly (a waist, a focal length of the same sign, …),
		// not the domain's floor. A loss value's bounds are physical (no
		// transmission above 1): there the truncated normal is the model.
		if lo, hi := pa-3*pb, pa+3*pb; !boundedLoss[k] && (lo < dom[0] || hi > dom[1]) {
			t.fail(key, "%q: mean ± 3σ (%s to %s) leaves what %s may be (%s to %s); a standard deviation up to %s keeps it inside",
				x, formatAs(lo, dim), formatAs(hi, dim), k, formatAs(dom[0], dim), formatAs(dom[1], dim), formatAs(roundDown(math.Min(pa-dom[0], dom[1]-pa)/3), dim))
			return 0, false
		}
	} else {
		if !(pb > pa) {
			t.fail(key, "%q: the range's upper bound is not above its lower bound", x)
			return 0, false
		}
		tol.Lo, tol.Hi = pa, pb
		if pa < dom[0] || pb > dom[1] {
			t.fail(key, "%q: the range leaves the value's physical domain [%g, %g]", x, dom[0], dom[1])
			return 0, false
		}
	}
	t.l.tols = append(t.l.tols, &pendingTol{loc: strings.TrimSuffix(t.loc, "."+k), key: k, perLaser: per, index: t.pairIndex, tol: tol})
	return tol.Nominal(), true
}

// roundDown rounds v > 0 down to three significant figures (a bound that
// is printed must not be above the true one).
func roundDown(v float64) float64 {
	p := math.Pow(10, math.Floor(math.Log10(v))-2)
	return math.Floor(v/p) * p
}

// formatAs writes v (SI) in the dimension's unit, or bare.
func formatAs(v float64, dim units.Dimension) string {
	switch dim {
	case units.Length:
		return units.FormatLength(v)
	case units.Power:
		return units.FormatPower(v)
	}
	return units.FormatNumber(v)
}

// resolveTolerances turns the tolerances read into the setup's list, with
// the indices of their lasers and elements and a label for people. An
// element's position may not leave the place it is listed in: its ends
// stay between its neighbours' positions.
func (l *loader) resolveTolerances(s *Setup) {
	for _, p := range l.tols {
		if p.key == "operating_power" && strings.HasPrefix(p.loc, "laser[") {
			var i int
			fmt.Sscanf(p.loc, "laser[%d]", &i)
			las := s.Lasers[i]
			if _, hi := p.tol.Ends(); hi > las.Power {
				l.addf(l.lines.line(p.loc, "operating_power"), fmt.Sprintf("laser %q", las.Name),
					"operating_power: %q reaches %s, more than the laser's power %s; an operating power may range up to its maximum", p.tol.Text, units.FormatPower(hi), units.FormatPower(las.Power))
			}
		}
		if p.key == "at" && strings.HasPrefix(p.loc, "path[") {
			var i, j int
			fmt.Sscanf(p.loc, "path[%d].element[%d]", &i, &j)
			els := s.Paths[i].Elements
			lo, hi := p.tol.Ends()
			prev, next := 0.0, math.Inf(1)
			if j > 0 {
				prev = els[j-1].At
			}
			if j+1 < len(els) {
				next = els[j+1].At
			}
			if lo < prev || hi > next {
				bound := fmt.Sprintf("from %s", units.FormatLength(prev))
				if !math.IsInf(next, 1) {
					bound += fmt.Sprintf(" to %s", units.FormatLength(next))
				}
				l.addf(l.lines.line(p.loc, "at"), fmt.Sprintf("path %q, element %d (%s)", s.Paths[i].Name, els[j].Index, els[j].Type),
					"at: %q reaches %s to %s, past its neighbours along the path; the position may range %s (the elements' order is the path's)", p.tol.Text, units.FormatLength(lo), units.FormatLength(hi), bound)
			}
		}
	}
	if len(l.problems) > 0 {
		return
	}
	for _, p := range l.tols {
		t := &Toleranced{Tol: p.tol, Laser: -1, Key: p.key, Index: p.index, PerLaser: p.perLaser}
		var i, j int
		switch {
		case strings.HasPrefix(p.loc, "laser["):
			fmt.Sscanf(p.loc, "laser[%d]", &i)
			t.Laser = i
			t.LaserName = s.Lasers[i].Name
			t.Label = tolLabel(fmt.Sprintf("laser %q", s.Lasers[i].Name), p.key, p.index, "")
		default:
			fmt.Sscanf(p.loc, "path[%d].element[%d]", &i, &j)
			t.Path, t.Element = i, j
			t.PathName = s.Paths[i].Name
			e := s.Paths[i].Elements[j]
			t.Label = tolLabel(fmt.Sprintf("path %q, element %d (%s)", s.Paths[i].Name, e.Index, e.Label()), p.key, -1, p.perLaser)
		}
		s.Tolerances = append(s.Tolerances, t)
	}
}

// Clone is a copy of the setup whose lasers, paths and elements can be
// changed (by Toleranced.Apply) without touching s; clouds, eyewear and
// the tolerances are shared.
func (s *Setup) Clone() *Setup {
	c := *s
	lasers := make(map[*Laser]*Laser, len(s.Lasers))
	c.Lasers = make([]*Laser, len(s.Lasers))
	for i, las := range s.Lasers {
		x := *las
		c.Lasers[i], lasers[las] = &x, &x
	}
	paths := make(map[*Path]*Path, len(s.Paths))
	elems := map[*Element]*Element{}
	c.Paths = make([]*Path, len(s.Paths))
	for i, p := range s.Paths {
		x := *p
		x.Elements = make([]*Element, len(p.Elements))
		for k, e := range p.Elements {
			y := *e
			if e.PerLaser != nil {
				y.PerLaser = make(map[string]map[string]float64, len(e.PerLaser))
				for key, by := range e.PerLaser {
					m := make(map[string]float64, len(by))
					for n, v := range by {
						m[n] = v
					}
					y.PerLaser[key] = m
				}
			}
			if e.leaving != nil {
				y.leaving = make(map[string]map[string]float64, len(e.leaving))
				for key, by := range e.leaving {
					y.leaving[key] = maps.Clone(by)
				}
			}
			x.Elements[k], elems[e] = &y, &y
		}
		c.Paths[i], paths[p] = &x, &x
	}
	for _, p := range c.Paths {
		p.Laser = lasers[p.Laser]
		p.Parent, p.IntoPath = paths[p.Parent], paths[p.IntoPath]
		p.ParentPort, p.IntoPort = elems[p.ParentPort], elems[p.IntoPort]
	}
	return &c
}
