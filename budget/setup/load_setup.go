package setup

import (
	"fmt"
	"maps"
	"math"
	"runtime"
	"slices"
	"strconv"
	"strings"
	"sync"
	"sync/atomic"
	"time"

	"beamledger/budget/atoms"
	"beamledger/budget/optics"
	"beamledger/budget/units"
	"beamledger/limits"
)

// Wavelength range a setup may use: the span of the exposure limits, m.
const (
	MinWavelength = limits.MinWavelength
	MaxWavelength = limits.MaxWavelength
)

// Size limits of a setup. A real table holds a few lasers and some hundreds
// of elements; these are far above that and keep the largest accepted setup
// within seconds for check and a minute for report (measured figures in
// README).
const (
	MaxLasers        = 500
	MaxClouds        = 500
	MaxPaths         = 5000
	MaxEyewear       = 200
	MaxElements      = 20000
	MaxAtomsElements = 2000
)

func (l *loader) setup(raw map[string]any) *Setup {
	s := &Setup{File: l.file}
	top := l.table("", "", raw).of(&TableSpec{Name: "the top level", Keys: TopKeys})
	if m := top.subtable("setup"); m != nil {
		t := l.table("[setup]", "setup", m).of(TableNamed("setup"))
		s.Meta.Title = t.str("title", false)
		s.Meta.Site = t.str("site", false)
		s.Meta.PreparedBy = t.str("prepared_by", false)
		s.Meta.Revision = t.str("revision", false)
		s.Meta.Exposure = t.positive("exposure", units.Time, false)
		s.Meta.ExposureReason = t.str("exposure_reason", false)
		s.Meta.Limits = limits.LimitSet(t.enum("limits", string(limits.SetStrictest), limits.LimitSets...))
		switch e := s.Meta.Exposure; {
		case e > 0 && (e < MinExposure || e > limits.MaxDuration):
			t.fail("exposure", "%s is outside %g s to 3e4 s: no viewing of a beam is shorter than %g s here, and the limits end at 3e4 s", show(m["exposure"]), MinExposure, MinExposure)
		case e > 0 && e < AversionExposure && strings.TrimSpace(s.Meta.ExposureReason) == "":
			t.fail("exposure", "%s is shorter than the %g s aversion response; a shorter viewing duration needs exposure_reason, saying why the laser safety officer accepts it", show(m["exposure"]), AversionExposure)
		case e == 0 && t.has("exposure_reason"):
			t.fail("exposure_reason", "given without exposure")
		}
		t.done()
	}
	if m := top.subtable("controls"); m != nil {
		s.Controls = l.controls(m)
	}
	if m := top.subtable("signoff"); m != nil {
		t := l.table("[signoff]", "signoff", m).of(TableNamed("signoff"))
		s.SignOff.Conditions = t.texts("conditions")
		if s.SignOff.Review = t.str("review", false); s.SignOff.Review != "" {
			if _, err := time.Parse("2006-01-02", s.SignOff.Review); err != nil {
				t.fail("review", "%q is not a date written YYYY-MM-DD", s.SignOff.Review)
			}
		}
		t.done()
	}
	if s.Meta.Limits == "" {
		s.Meta.Limits = limits.SetStrictest
	}
	if !top.has("laser") {
		l.addf(0, "", "the setup describes no laser ([[laser]] with name, wavelength, power and waist); there is nothing to evaluate")
	}
	lasers, clouds, paths, eyewear := top.tables("laser"), top.tables("cloud"), top.tables("path"), top.tables("eyewear")
	elements, atomsElements := 0, 0
	for _, m := range paths {
		switch els := m["element"].(type) {
		case []map[string]any:
			elements += len(els)
			for _, e := range els {
				if e["type"] == TypeAtoms {
					atomsElements++
				}
			}
		case []any:
			elements += len(els)
			for _, e := range els {
				if em, ok := e.(map[string]any); ok && em["type"] == TypeAtoms {
					atomsElements++
				}
			}
		}
	}
	for _, c := range []struct {
		what   string
		n, max int
	}{
		{"lasers", len(lasers), MaxLasers}, {"clouds", len(clouds), MaxClouds}, {"paths", len(paths), MaxPaths},
		{"eyewear entries", len(eyewear), MaxEyewear}, {"elements", elements, MaxElements}, {"atoms elements", atomsElements, MaxAtomsElements},
	} {
		if c.n > c.max {
			l.addf(0, "", "the setup has %d %s, more than the %d a setup may have (the limits keep check within seconds and report within a minute; see README)", c.n, c.what, c.max)
		}
	}
	if len(l.problems) > 0 {
		return s
	}
	for i, m := range lasers {
		s.Lasers = append(s.Lasers, l.laser(i, m))
	}
	// A stated viewing duration shorter than the one assumed for a laser's
	// wavelength (10 s outside the visible, where no aversion response ends
	// an exposure) makes that laser's limit less strict: it needs a reason.
	if e := s.Meta.Exposure; e >= AversionExposure && strings.TrimSpace(s.Meta.ExposureReason) == "" {
		for _, las := range s.Lasers {
			if d := DefaultViewingDuration(las.Wavelength); las.Wavelength > 0 && e < d {
				l.addf(l.lines.line("setup", "exposure"), "[setup]", "exposure: %s is shorter than the %g s assumed for unintended viewing of laser %q at %s (outside 400–700 nm no aversion response ends an exposure); a shorter viewing duration needs exposure_reason",
					units.FormatSI(e, "s"), d, las.Name, units.FormatLength(las.Wavelength))
				break
			}
		}
	}
	for i, m := range clouds {
		s.Clouds = append(s.Clouds, l.cloud(i, m))
	}
	s.Paths = l.paths(paths)
	for i, m := range eyewear {
		s.Eyewear = append(s.Eyewear, l.eyewear(i, m))
	}
	top.done()
	if len(l.problems) == 0 {
		l.link(s)
	}
	if len(l.problems) == 0 {
		l.resolveTolerances(s)
	}
	return s
}

// named starts reading entry i of an array of tables such as [[laser]]: it
// reads the entry's name and names the entry by it in messages.
func (l *loader) named(kind string, i int, m map[string]any) (t *table, loc, name string) {
	loc = fmt.Sprintf("%s[%d]", kind, i)
	t = l.table(fmt.Sprintf("%s %d", kind, i+1), loc, m).of(TableNamed(kind))
	if name = t.name(true); name != "" {
		t.context = fmt.Sprintf("%s %q", kind, name)
	}
	return t, loc, name
}

func (l *loader) laser(i int, m map[string]any) *Laser {
	t, loc, name := l.named("laser", i, m)
	las := &Laser{Line: l.lines[loc], Name: name}
	las.Wavelength = t.positive("wavelength", units.Length, true)
	if w := las.Wavelength; w > 0 && (w < MinWavelength || w > MaxWavelength) {
		t.fail("wavelength", "%s is outside 180 nm to 1 mm, the span of the exposure limits", show(m["wavelength"]))
	}
	las.Power = t.positive("power", units.Power, true)
	las.OperatingPower = las.Power
	if t.has("operating_power") {
		las.OperatingPower = t.positive("operating_power", units.Power, true)
		if las.Power > 0 && las.OperatingPower > las.Power {
			t.fail("operating_power", "%s is more than power %s", show(m["operating_power"]), show(m["power"]))
		}
	}
	las.Waist, _ = t.pair("waist", units.Length, true, 0)
	las.M2 = [2]float64{1, 1}
	if t.has("m2") {
		las.M2, _ = t.pair("m2", units.Dimensionless, true, 1)
	}
	for k, w := range las.Waist {
		if w > 0 && las.Wavelength > 0 {
			if θ := optics.NewPlane(w, 0, las.M2[k], las.Wavelength).Divergence(las.Wavelength); θ > optics.MaxParaxialAngle {
				t.fail("waist", "%s at %s with M² %g diverges at a half-angle of %.3g rad; the Gaussian beam model needs at most %g rad (a waist of at least %s)",
					units.FormatLength(w), units.FormatLength(las.Wavelength), las.M2[k], θ, optics.MaxParaxialAngle, units.FormatLength(las.M2[k]*las.Wavelength/(math.Pi*optics.MaxParaxialAngle)))
				break
			}
		}
	}
	las.WaistAt, _ = t.pair("waist_at", units.Length, false, math.Inf(-1))
	las.Emission = t.enum("emission", EmissionCW, EmissionValues...)
	las.Maker, las.Model, las.Serial, las.Location = t.str("maker", false), t.str("model", false), t.str("serial", false), t.str("location", false)
	las.LabelClass = t.enum("label_class", "", LabelClasses...)
	if las.Emission == EmissionPulsed {
		las.PulseDuration = t.positive("pulse_duration", units.Time, true)
		if d := las.PulseDuration; d > 0 && (d < limits.MinDuration || d > limits.MaxDuration) {
			t.fail("pulse_duration", "%s is outside 1e-13 s to 3e4 s, the span of the exposure limits", show(m["pulse_duration"]))
		}
		las.RepetitionRate = t.positive("repetition_rate", units.Frequency, true)
		if las.PulseDuration > 0 && las.RepetitionRate*las.PulseDuration > 1 {
			t.fail("repetition_rate", "%s with %s pulses is a duty cycle above 1", show(m["repetition_rate"]), show(m["pulse_duration"]))
		}
	} else {
		for _, k := range []string{"pulse_duration", "repetition_rate"} {
			if t.has(k) {
				t.get(k)
				t.fail(k, "only for emission = \"pulsed\"")
			}
		}
	}
	las.Detuning, las.DetuningLinewidths, las.DetuningSet = t.detuning("detuning")
	t.done()
	return las
}

func (l *loader) cloud(i int, m map[string]any) *Cloud {
	t, loc, name := l.named("cloud", i, m)
	c := &Cloud{Line: l.lines[loc], Name: name}
	c.Transition = t.str("transition", true)
	c.Atoms, _ = t.quantity("atoms", units.Dimensionless, true)
	switch {
	case t.has("atoms") && c.Atoms <= 0:
		t.fail("atoms", "must be positive, got %s", show(m["atoms"]))
	case c.Atoms != math.Trunc(c.Atoms):
		t.fail("atoms", "%s is not a whole number of atoms", show(m["atoms"]))
	}
	if v, ok := t.get("rms_size"); ok {
		arr, isArr := v.([]any)
		if !isArr || len(arr) != 3 {
			t.fail("rms_size", "want [x, y, z], three lengths along the cloud's own axes (its frame)")
		} else {
			for k, e := range arr {
				q, ok := t.quantityValue("rms_size", e, units.Length)
				if ok && q <= 0 {
					t.fail("rms_size", "must be positive, got %s", show(e))
				}
				c.RMSSize[k] = q
			}
		}
	} else {
		t.fail("rms_size", "missing (want [x, y, z], three lengths along the cloud's own axes (its frame))")
	}
	c.Saturation = t.enum("saturation", SaturationCycling, SaturationValues...)
	c.CollectiveRate = t.positive("collective_rate", units.Frequency, false)
	downs := map[string][3]float64{"+x": {1, 0, 0}, "-x": {-1, 0, 0}, "+y": {0, 1, 0}, "-y": {0, -1, 0}, "+z": {0, 0, 1}, "-z": {0, 0, -1}, "none": {}}
	c.Down = downs[t.enum("down", "-y", DownValues...)]
	if v, ok := t.get("excited_polarizability"); ok {
		by, isMap := v.(map[string]any)
		if !isMap {
			t.fail("excited_polarizability", "want an inline table of laser = polarizability in atomic units, e.g. { trap = -1200 }")
		} else {
			c.ExcitedPolarizability = map[string]float64{}
			for _, name := range slices.Sorted(maps.Keys(by)) {
				sub := l.table("", loc+".excited_polarizability", map[string]any{name: by[name]})
				sub.describe = func() string { return t.where() + ", excited_polarizability" }
				if q, ok := sub.quantity(name, units.Dimensionless, true); ok {
					if math.Abs(q) > 1e7 {
						sub.fail(name, "%s atomic units is beyond any atom's polarizability", show(by[name]))
					}
					c.ExcitedPolarizability[name] = q
				}
			}
		}
	}
	readGoal(t, &c.Goal, &c.GoalValue, &c.GoalFactor, &c.GoalMax, m)
	if v, ok := t.get("goal_lasers"); ok {
		arr, isArr := v.([]any)
		if !isArr || len(arr) == 0 {
			t.fail("goal_lasers", "want a list of laser names, e.g. [\"trap-a\", \"trap-b\"]")
		}
		for _, e := range arr {
			name, isStr := e.(string)
			if !isStr {
				t.fail("goal_lasers", "want laser names, got %s", show(e))
				break
			}
			c.GoalLasers = append(c.GoalLasers, name)
		}
		if c.Goal == "" {
			t.fail("goal_lasers", "given without goal")
		}
	}
	custom := c.Transition == "custom"
	for _, k := range []string{"wavelength", "linewidth", "saturation_intensity", "mass"} {
		if !custom && t.has(k) {
			t.get(k)
			t.fail(k, "only for transition = \"custom\"")
		}
	}
	if custom {
		c.Wavelength = t.positive("wavelength", units.Length, true)
		if w := c.Wavelength; w > 0 && (w < MinWavelength || w > MaxWavelength) {
			t.fail("wavelength", "%s is outside 180 nm to 1 mm", show(m["wavelength"]))
		}
		c.Linewidth = t.positive("linewidth", units.Frequency, true)
		c.SaturationIntensity = t.positive("saturation_intensity", units.Irradiance, false)
		c.Mass = t.positive("mass", units.Mass, false)
		if t.has("saturation") && c.Saturation == SaturationIsotropic {
			t.fail("saturation", "a custom transition has one saturation intensity; leave saturation out")
		}
		if c.Wavelength > 0 && c.Linewidth > 0 {
			c.Data = atoms.Custom(c.Wavelength, 2*math.Pi*c.Linewidth, c.SaturationIntensity, c.Mass)
		}
	} else if c.Transition != "" {
		if tr, ok := atoms.Lookup(c.Transition); !ok {
			t.fail("transition", "unknown transition %q (built-in: %s; or \"custom\" with wavelength, linewidth)%s", c.Transition, strings.Join(atoms.Names(), ", "), didYouMean(c.Transition, atoms.Names()))
		} else {
			c.Data = tr
			if c.Saturation == SaturationIsotropic && tr.IsatIsotropic == 0 {
				t.fail("saturation", "transition %q has no isotropic saturation intensity in its data; use \"cycling\"", c.Transition)
			}
		}
	}
	t.done()
	return c
}

func (l *loader) eyewear(i int, m map[string]any) *Eyewear {
	t, loc, name := l.named("eyewear", i, m)
	e := &Eyewear{Line: l.lines[loc], Name: name}
	bands := t.tables("bands")
	if !t.has("bands") {
		t.fail("bands", "missing (want [{ from = \"740 nm\", to = \"1100 nm\", od = 7 }, …])")
	}
	for k, b := range bands {
		bt := l.table(fmt.Sprintf("%s, band %d", t.where(), k+1), loc+".bands", b).of(TableNamed("band"))
		var band EyewearBand
		band.From = bt.positive("from", units.Length, true)
		band.To = bt.positive("to", units.Length, true)
		if band.From > 0 && band.To > 0 && band.To <= band.From {
			bt.fail("to", "%s is not above from %s", show(b["to"]), show(b["from"]))
		}
		od, ok := bt.quantity("od", units.Dimensionless, true)
		if ok && od < 0 {
			bt.fail("od", "must not be negative, got %s", show(b["od"]))
		}
		band.OD = od
		if band.EN207 = bt.str("en207", false); bt.has("en207") {
			var err error
			if band.Ratings, err = ParseEN207(band.EN207); err != nil {
				bt.fail("en207", "%q: %v", band.EN207, err)
			}
		}
		bt.done()
		e.Bands = append(e.Bands, band)
	}
	t.done()
	return e
}

// parallelLoadPaths is the number of paths from which they are read on
// all cores (a variable so that a test can read any setup both ways).
var parallelLoadPaths = 32

// paths reads the [[path]] tables. Each path is read by a loader of its
// own, on all cores for a large setup; their problems and pending
// tolerances are then taken in the file's order, so that what is reported
// does not depend on timing and equals what one loader would report.
func (l *loader) paths(ms []map[string]any) []*Path {
	out := make([]*Path, len(ms))
	if len(ms) < parallelLoadPaths {
		for i, m := range ms {
			out[i] = l.path(i, m)
		}
		return out
	}
	subs := make([]loader, len(ms))
	var (
		wg   sync.WaitGroup
		next atomic.Int64
	)
	for range min(runtime.GOMAXPROCS(0), len(ms)) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := int(next.Add(1) - 1); i < len(ms); i = int(next.Add(1) - 1) {
				subs[i] = loader{file: l.file, lines: l.lines}
				out[i] = subs[i].path(i, ms[i])
			}
		}()
	}
	wg.Wait()
	for i := range subs {
		l.take(&subs[i])
	}
	return out
}

// take adds what another loader found to l's, as if l had found it: its
// problems up to l's bound (o's own closing line lies past the bound, so
// it is never taken), and its pending tolerances.
func (l *loader) take(o *loader) {
	for _, msg := range o.problems {
		if len(l.problems) >= maxProblems {
			break
		}
		l.problems = append(l.problems, msg)
		if len(l.problems) == maxProblems {
			l.problems = append(l.problems, moreProblems(l.file))
		}
	}
	l.tols = append(l.tols, o.tols...)
}

func (l *loader) path(i int, m map[string]any) *Path {
	t, loc, name := l.named("path", i, m)
	p := &Path{Line: l.lines[loc], Name: name}
	p.From = t.str("from", true)
	p.Access = Access(t.enum("access", string(AccessOpen), AccessValues...))
	p.Into = t.str("into", false)
	if p.Into != "" {
		var ok bool
		if p.IntoAt, ok = t.quantity("into_at", units.Length, true); ok && p.IntoAt < 0 {
			t.fail("into_at", "must not be negative, got %s", show(m["into_at"]))
		}
	} else if t.has("into_at") {
		t.get("into_at")
		t.fail("into_at", "given without into")
	}
	ems := t.tables("element")
	// One allocation for the path's elements.
	slab := make([]Element, len(ems))
	p.Elements = make([]*Element, 0, len(ems))
	for k, em := range ems {
		p.Elements = append(p.Elements, l.element(&slab[k], p, t.where(), loc+".element["+strconv.Itoa(k)+"]", k, em))
	}
	t.done()
	return p
}

// perLaser reads the keys of an element given per laser, as inline tables
// keyed by laser name, into e.PerLaser, and takes them out of m so that the
// kind's reader sees only bare values. The names are checked against the
// lasers that reach the element once the paths are linked.
func (l *loader) perLaser(t *table, e *Element, m map[string]any) {
	for _, key := range PerLaserKeys {
		by, ok := m[key].(map[string]any)
		if !ok {
			continue
		}
		t.get(key)
		delete(m, key)
		lo, hi := 0.0, 1.0
		if key == "optical_density" {
			hi = 20
		}
		vals := make(map[string]float64, len(by))
		for _, name := range slices.Sorted(maps.Keys(by)) {
			sub := l.table("", t.loc+"."+key, map[string]any{name: by[name]})
			sub.describe = func() string { return t.where() + ", " + key }
			sub.keyAs = key
			var q *float64
			if key == "optical_density" {
				if v, ok := sub.quantity(name, units.Dimensionless, true); ok {
					if v < lo || v > hi {
						sub.fail(name, "%s is outside [%g, %g]", show(by[name]), lo, hi)
					} else {
						q = &v
					}
				}
			} else {
				q = sub.fraction(name, lo, hi)
			}
			if q != nil {
				vals[name] = *q
			}
		}
		if e.PerLaser == nil {
			e.PerLaser = map[string]map[string]float64{}
		}
		e.PerLaser[key] = vals
	}
}

// commonElementKeys are taken by every element type: the key table's
// "element" table.
var commonElementKeys = keyNames(TableNamed("element").Keys)

func keyNames(keys []KeySpec) []string {
	out := make([]string, len(keys))
	for i, k := range keys {
		out[i] = k.Key
	}
	return out
}

// typeNames lists the element types for messages.
func typeNames() string { return strings.Join(typeList(), ", ") }

func typeList() []string {
	names := make([]string, len(Kinds))
	for i, k := range Kinds {
		names[i] = string(k.Type)
	}
	return names
}

// typeAliases are other spellings of element types that mean the same.
var typeAliases = map[ElementType]ElementType{"fibre": TypeFiber}

func (l *loader) element(e *Element, p *Path, pathContext, loc string, k int, m map[string]any) *Element {
	t := l.table("", loc, m)
	t.describe = func() string { return fmt.Sprintf("%s, element %d", pathContext, k+1) }
	e.Index, e.Line = k+1, l.lines[loc]
	e.Type = ElementType(t.str("type", true))
	if a, ok := typeAliases[e.Type]; ok {
		e.Type = a
	}
	kind, ok := KindOf(e.Type)
	if !ok {
		if e.Type != "" {
			t.fail("type", "unknown element type %q (want one of %s)%s", e.Type, typeNames(), didYouMean(string(e.Type), typeList()))
		}
		for key := range m {
			t.get(key) // the type is wrong; do not also list its keys as unknown
		}
		return e
	}
	t.spec = elementReadSpecs()[e.Type]
	t.describe = func() string {
		if e.Name != "" {
			return fmt.Sprintf("%s, element %d (%s %q)", pathContext, k+1, e.Type, e.Name)
		}
		return fmt.Sprintf("%s, element %d (%s)", pathContext, k+1, e.Type)
	}
	e.Name = t.name(e.Type == TypeSplitter || e.Type == TypeCombiner)
	l.perLaser(t, e, m)
	for _, key := range slices.Sorted(maps.Keys(e.PerLaser)) {
		if (!kind.Has(key) && !slices.Contains(commonElementKeys, key)) || (e.Type == TypeMirror && key == "transmission") {
			t.fail(key, "not a key of a %s (it takes %s)", e.Type, strings.Join(append(kind.KeyNames(), commonElementKeys...), ", "))
		}
	}
	e.At, _ = t.quantity("at", units.Length, true)
	if e.At < 0 {
		t.fail("at", "must not be negative, got %s", show(m["at"]))
	}
	e.Aperture = t.positive("aperture", units.Length, false)
	if e.Type == TypeMirror {
		if t.has("transmission") {
			t.get("transmission")
			t.fail("transmission", "a mirror's throughput is its reflectivity")
		}
	} else {
		e.Transmission = t.fraction("transmission", 0, 1)
	}
	if t.has("access") {
		e.Access = Access(t.enum("access", "", AccessValues...))
	}
	e.SurfaceReflectance = t.fraction("surface_reflectance", 0, 1)
	if v, ok := t.get("damage_threshold"); ok {
		s, _ := v.(string)
		q, d, err := units.ParseQuantity(s)
		switch {
		case err != nil || s == "":
			t.fail("damage_threshold", "want a linear power density (cw, e.g. \"5 kW/cm\") or a radiant exposure (pulsed, e.g. \"2 J/cm2\")")
		case q <= 0:
			t.fail("damage_threshold", "must be positive, got %q", s)
		case d == units.LinearPowerDensity:
			e.DamageThreshold = q
		case d == units.RadiantExposure:
			e.DamageThreshold, e.DamageIsFluence = q, true
		default:
			t.fail("damage_threshold", "%q is %s; want a linear power density (cw, e.g. \"5 kW/cm\") or a radiant exposure (pulsed, e.g. \"2 J/cm2\")", s, units.Describe(d))
		}
	}
	e.DamagePulseDuration = t.positive("damage_pulse_duration", units.Time, e.DamageIsFluence)

	kind.read(t, e, m)
	if e.Type != TypeDump && t.has("diffuse_reflectance") {
		t.get("diffuse_reflectance")
		t.fail("diffuse_reflectance", "only for a dump")
	}
	t.hint = func() string {
		keys := append(kind.KeyNames(), commonElementKeys...)
		return fmt.Sprintf(" for a %s (it takes %s)", e.Type, strings.Join(keys, ", "))
	}
	t.done()
	return e
}

func (t *table) positivePtr(key string, dim units.Dimension, what string) *float64 {
	if !t.has(key) {
		t.get(key)
		t.fail(key, "missing (the goal needs %s, %s)", what, dim)
		return nil
	}
	q := t.positive(key, dim, true)
	if q <= 0 {
		return nil
	}
	return &q
}

func (t *table) integer(key string, def, lo, hi int) int {
	v, ok := t.get(key)
	if !ok {
		return def
	}
	n, isInt := v.(int64)
	if !isInt {
		t.fail(key, "want a whole number, got %s", tomlKind(v))
		return def
	}
	if n < int64(lo) || n > int64(hi) {
		t.fail(key, "%d is outside [%d, %d]", n, lo, hi)
		return def
	}
	return int(n)
}

// controls reads [controls].
func (l *loader) controls(m map[string]any) Controls {
	t := l.table("[controls]", "controls", m).of(TableNamed("controls"))
	var c Controls
	c.Eyewear = t.enum("eyewear", ControlNone, EyewearWorn, ControlNone)
	c.Entry = t.enum("entry", ControlNone, EntryInterlock, EntryWarning, EntrySign, ControlNone)
	c.KeyControl = t.enum("key_control", ControlNone, KeyInPlace, ControlNone)
	c.WarningSigns = t.enum("warning_signs", ControlNone, SignsPosted, ControlNone)
	c.Training = t.enum("training", ControlNone, TrainingDone, ControlNone)
	c.Perimeter = t.enum("perimeter", ControlNone, PerimeterBarrier, ControlNone)
	if c.Perimeter == PerimeterBarrier {
		c.PerimeterRating = t.positive("perimeter_rating", units.Irradiance, true)
	} else if t.has("perimeter_rating") {
		t.get("perimeter_rating")
		t.fail("perimeter_rating", "given without perimeter = \"barrier\"")
	}
	c.Procedure = t.str("procedure", false)
	c.AlignmentProcedure = t.str("alignment_procedure", false)
	c.Officer = t.str("officer", false)
	c.Notes = t.str("notes", false)
	t.done()
	return c
}

// ParseEN207 reads an EN 207 marking: one or more parts joined by "+",
// each test conditions (letters of D, I, R, M) and a scale number "LB1" to
// "LB10" ("D LB6", "DIR LB5", "D LB5 + IR LB6"); a wavelength written in a
// part ("D 1064 LB6") is allowed and not checked against the band.
func ParseEN207(s string) ([]EN207Rating, error) {
	var out []EN207Rating
	for _, part := range strings.Split(s, "+") {
		f := strings.Fields(part)
		if len(f) < 2 {
			return nil, fmt.Errorf("want test conditions and a scale number, e.g. \"D LB6\"")
		}
		conds, lb := f[0], f[len(f)-1]
		n, err := strconv.Atoi(strings.TrimPrefix(lb, "LB"))
		if !strings.HasPrefix(lb, "LB") || err != nil || n < 1 || n > 10 {
			return nil, fmt.Errorf("%q is not a scale number LB1 to LB10", lb)
		}
		for _, w := range f[1 : len(f)-1] {
			if _, err := strconv.Atoi(w); err != nil {
				return nil, fmt.Errorf("%q is neither a wavelength in nm nor a scale number", w)
			}
		}
		for _, c := range conds {
			if !strings.ContainsRune("DIRM", c) {
				return nil, fmt.Errorf("test condition %q is not one of D, I, R, M", c)
			}
			out = append(out, EN207Rating{Condition: string(c), LB: n})
		}
	}
	return out, nil
}
