// Package revision compares two revisions of a setup: what changed in the
// file (lasers, paths, elements, clouds, eyewear), what that does to the
// hazards, and what it does to the drive at the atoms. It decides whether a
// change affects safety, so that a new sign-off is needed; README lists the
// rule.
package revision

import (
	"cmp"
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"math"
	"reflect"
	"slices"
	"sort"
	"strconv"
	"strings"

	"github.com/pelletier/go-toml/v2"

	"beamledger/budget"
	"beamledger/budget/setup"
	"beamledger/budget/units"
	"beamledger/safety"
)

// RatioChange is the relative change of an eye or skin ratio, a NOHD or a
// diffuse-zone radius that counts as a hazard change (10 %).
const RatioChange = 0.10

// Revision is one side of a comparison: the file and the assessment of it.
type Revision struct {
	File       string
	Data       []byte
	Assessment *safety.Assessment
}

// Side names a revision in the output.
type Side struct {
	File     string `json:"file"`
	Title    string `json:"title"`
	Revision string `json:"revision"`
	SHA256   string `json:"sha256"`
}

// Change is one difference, in the setup file, in the hazards or in the
// drive.
type Change struct {
	// Change is "added", "removed" or "changed".
	Change string `json:"change"`
	// Kind says what changed: for the setup "setup", "laser", "path",
	// "element", "cloud", "eyewear"; for hazards "open_segment", "class",
	// "stray_reflection", "escaping_beam", "diffuse_zone", "eyewear",
	// "finding"; for the drive "power_at_cloud", "goal", "cloud_goal".
	Kind string `json:"kind"`
	// What names the thing that changed.
	What string `json:"what"`
	// Key is the setup key that changed ("" when a whole table was added or
	// removed, and for hazards and the drive).
	Key string `json:"key,omitempty"`
	// Old and New are the values as written (setup) or as printed.
	Old string `json:"old,omitempty"`
	New string `json:"new,omitempty"`
	// Figures are the numbers behind Old and New, SI, keyed with their unit.
	Figures []Figure `json:"figures,omitempty"`
	// AffectsSafety marks a change that needs a new sign-off.
	AffectsSafety bool `json:"affects_safety"`
	// Path and Element name an element change's element in the new
	// revision (Element 1-based; 0 when it was removed), for the drawing.
	Path    string `json:"-"`
	Element int    `json:"-"`
}

// ChangedElements are the elements of the new revision that were added or
// changed, by path name and element number.
func (r *Report) ChangedElements() map[string]map[int]bool {
	out := map[string]map[int]bool{}
	for _, c := range r.Setup {
		if c.Kind == "element" && c.Element > 0 {
			if out[c.Path] == nil {
				out[c.Path] = map[int]bool{}
			}
			out[c.Path][c.Element] = true
		}
	}
	return out
}

// Figure is one number before and after; nil where it does not exist.
type Figure struct {
	Key string   `json:"key"`
	Old *float64 `json:"old"`
	New *float64 `json:"new"`
}

// Report is the whole comparison.
type Report struct {
	Old, New      Side     `json:"-"`
	Setup         []Change `json:"setup_changes"`
	Hazards       []Change `json:"hazard_changes"`
	Drive         []Change `json:"drive_changes"`
	AffectsSafety bool     `json:"affects_safety"`
}

// Compare compares two revisions.
func Compare(old, new Revision) (*Report, error) {
	r := &Report{Old: side(old), New: side(new)}
	ro, err := decode(old)
	if err != nil {
		return nil, err
	}
	rn, err := decode(new)
	if err != nil {
		return nil, err
	}
	ids := &idMap{old: map[string][]string{}, new: map[string][]string{}}
	r.Setup = setupChanges(ro, rn, ids)
	r.Hazards = hazardChanges(old.Assessment, new.Assessment, ids)
	r.Drive = driveChanges(old.Assessment, new.Assessment, ids)
	for _, c := range append(slices.Clone(r.Setup), r.Hazards...) {
		r.AffectsSafety = r.AffectsSafety || c.AffectsSafety
	}
	return r, nil
}

func side(v Revision) Side {
	sum := sha256.Sum256(v.Data)
	m := v.Assessment.Setup.Meta
	return Side{File: v.File, Title: m.Title, Revision: m.Revision, SHA256: hex.EncodeToString(sum[:])}
}

func decode(v Revision) (map[string]any, error) {
	var raw map[string]any
	if err := toml.Unmarshal(v.Data, &raw); err != nil {
		return nil, fmt.Errorf("%s: %v", v.File, err)
	}
	return raw, nil
}

// idMap names each element of each path by its match: the element's name,
// else its type and its place among the path's elements of that type. A
// matched pair shares the new side's name, so that hazards at an element
// are compared across revisions even when elements before it were added.
type idMap struct {
	old, new map[string][]string // path → element index−1 → id
}

func (m *idMap) id(old bool, path string, element int) string {
	t := m.new
	if old {
		t = m.old
	}
	if ids := t[path]; element >= 1 && element <= len(ids) {
		return ids[element-1]
	}
	if element == 0 {
		return "the start"
	}
	return fmt.Sprintf("element %d", element)
}

// ---- the setup file ----

func setupChanges(ro, rn map[string]any, ids *idMap) []Change {
	var out []Change
	out = append(out, tableChanges("setup", "[setup]", table(ro["setup"]), table(rn["setup"]), ro["setup"] != nil, rn["setup"] != nil, metaAffects)...)
	// Every control but the officer's notes is safety.
	out = append(out, tableChanges("controls", "[controls]", table(ro["controls"]), table(rn["controls"]), ro["controls"] != nil, rn["controls"] != nil, func(k string) bool { return k != "notes" })...)
	// The officer's conditions and review date are the officer's words, not
	// the setup's hazards.
	out = append(out, tableChanges("signoff", "[signoff]", table(ro["signoff"]), table(rn["signoff"]), ro["signoff"] != nil, rn["signoff"] != nil, func(string) bool { return false })...)
	for _, k := range []string{"laser", "eyewear", "cloud"} {
		affects := func(key string) bool { return k != "cloud" && !(k == "laser" && driveLaserKeys[key]) }
		for _, p := range pairNamed(tables(ro[k]), tables(rn[k])) {
			what := fmt.Sprintf("%s %q", k, p.name)
			out = append(out, tableChanges(k, what, p.old, p.new, p.old != nil, p.new != nil, affects)...)
		}
	}
	for _, p := range pairNamed(tables(ro["path"]), tables(rn["path"])) {
		what := fmt.Sprintf("path %q", p.name)
		po, pn := without(p.old, "element"), without(p.new, "element")
		out = append(out, tableChanges("path", what, po, pn, p.old != nil, p.new != nil, func(string) bool { return true })...)
		eo, en := tables(mapGet(p.old, "element")), tables(mapGet(p.new, "element"))
		pairs := pairElements(eo, en)
		ids.old[p.name] = make([]string, len(eo))
		ids.new[p.name] = make([]string, len(en))
		for _, e := range pairs {
			id := e.id
			if e.oi >= 0 {
				ids.old[p.name][e.oi] = id
			}
			if e.ni >= 0 {
				ids.new[p.name][e.ni] = id
			}
			if p.old == nil || p.new == nil {
				continue // the path's own line says it was added or removed
			}
			var a, b map[string]any
			if e.oi >= 0 {
				a = eo[e.oi]
			}
			if e.ni >= 0 {
				b = en[e.ni]
			}
			typ := fmt.Sprint(cmp.Or(mapGet(b, "type"), mapGet(a, "type")))
			cs := tableChanges("element", fmt.Sprintf("path %q, element %s", p.name, id), a, b, a != nil, b != nil, elementAffects(typ))
			for i := range cs {
				cs[i].Path, cs[i].Element = p.name, e.ni+1
			}
			out = append(out, cs...)
		}
	}
	return out
}

// driveLaserKeys are the keys of a laser that only the drive uses: the
// hazards take every laser at its maximum power.
var driveLaserKeys = map[string]bool{"operating_power": true, "detuning": true}

// metaAffects: of [setup], the viewing duration, its reason and the limit
// set change the limits; the title, site, author and revision do not.
func metaAffects(key string) bool {
	return key == "exposure" || key == "exposure_reason" || key == "limits"
}

// elementAffects: the keys of an atoms element that say what the light
// does to the atoms (the cloud, the goal, the detuning, the beam's
// direction in the cloud) do not change the hazards; every other key of
// every element can.
func elementAffects(typ string) func(string) bool {
	k, ok := setup.KindOf(setup.ElementType(typ))
	return func(key string) bool {
		return !(ok && k.Type == setup.TypeAtoms && k.Has(key))
	}
}

type namedPair struct {
	name     string
	old, new map[string]any
}

// pairNamed pairs tables by their name key, in the new file's order, then
// the removed ones in the old file's order; a table without a name is
// paired by its place.
func pairNamed(old, new []map[string]any) []namedPair {
	name := func(m map[string]any, i int) string {
		if s, ok := m["name"].(string); ok {
			return s
		}
		return "#" + strconv.Itoa(i+1)
	}
	byName := map[string]map[string]any{}
	for i, m := range old {
		byName[name(m, i)] = m
	}
	var out []namedPair
	seen := map[string]bool{}
	for i, m := range new {
		n := name(m, i)
		seen[n] = true
		out = append(out, namedPair{n, byName[n], m})
	}
	for i, m := range old {
		if n := name(m, i); !seen[n] {
			out = append(out, namedPair{n, m, nil})
		}
	}
	return out
}

type elementPair struct {
	oi, ni int // indices, −1 where absent
	id     string
}

// pairElements matches the elements of one path: by name where both
// revisions have it, else the k-th unmatched element of a type with the
// k-th of that type (a renamed element is then a change of its name).
func pairElements(old, new []map[string]any) []elementPair {
	name := func(m map[string]any) string { s, _ := m["name"].(string); return s }
	typ := func(m map[string]any) string { return fmt.Sprint(m["type"]) }
	oldOf := make([]int, len(new))
	for i := range oldOf {
		oldOf[i] = -1
	}
	used := make([]bool, len(old))
	// Linear in the elements: the old ones by name, and by type in order.
	byName := map[string][]int{}
	byType := map[string][]int{}
	for oi, o := range old {
		if n := name(o); n != "" {
			byName[n] = append(byName[n], oi)
		}
		byType[typ(o)] = append(byType[typ(o)], oi)
	}
	for ni, m := range new {
		if n := name(m); n != "" {
			if q := byName[n]; len(q) > 0 {
				oldOf[ni], used[q[0]] = q[0], true
				byName[n] = q[1:]
			}
		}
	}
	for ni, m := range new {
		if oldOf[ni] >= 0 {
			continue
		}
		q := byType[typ(m)]
		for len(q) > 0 && used[q[0]] {
			q = q[1:]
		}
		if len(q) > 0 {
			oldOf[ni], used[q[0]] = q[0], true
			q = q[1:]
		}
		byType[typ(m)] = q
	}
	label := func(m map[string]any, i int) string {
		if n := name(m); n != "" {
			return strconv.Quote(n)
		}
		return fmt.Sprintf("%d (%s)", i+1, typ(m))
	}
	var out []elementPair
	for ni, m := range new {
		out = append(out, elementPair{oldOf[ni], ni, label(m, ni)})
	}
	for oi, o := range old {
		if !used[oi] {
			out = append(out, elementPair{oi, -1, label(o, oi) + " of the old revision"})
		}
	}
	return out
}

// tableChanges compares one table key by key.
func tableChanges(kind, what string, old, new map[string]any, hadOld, hasNew bool, affects func(string) bool) []Change {
	switch {
	case !hadOld && !hasNew:
		return nil
	case !hadOld:
		return []Change{{Change: "added", Kind: kind, What: what, New: summary(new), AffectsSafety: kind != "cloud" && !((kind == "setup" || kind == "signoff" || kind == "controls") && !anyKey(new, affects))}}
	case !hasNew:
		return []Change{{Change: "removed", Kind: kind, What: what, Old: summary(old), AffectsSafety: kind != "cloud" && !((kind == "setup" || kind == "signoff" || kind == "controls") && !anyKey(old, affects))}}
	}
	var out []Change
	for _, k := range unionKeys(old, new) {
		a, inOld := old[k]
		b, inNew := new[k]
		c := Change{Kind: kind, What: what, Key: k, AffectsSafety: affects(k)}
		switch {
		case inOld && inNew:
			if sameValue(a, b) {
				continue
			}
			c.Change, c.Old, c.New = "changed", show(a), show(b)
		case inOld:
			c.Change, c.Old = "removed", show(a)
		default:
			c.Change, c.New = "added", show(b)
		}
		out = append(out, c)
	}
	return out
}

func anyKey(m map[string]any, f func(string) bool) bool {
	for k := range m {
		if f(k) {
			return true
		}
	}
	return false
}

// sameValue: equal values, or two quantities equal in value and dimension
// ("250 mm" and "0.25 m").
func sameValue(a, b any) bool {
	if reflect.DeepEqual(a, b) {
		return true
	}
	sa, ok1 := a.(string)
	sb, ok2 := b.(string)
	if !ok1 || !ok2 {
		return false
	}
	va, da, e1 := units.ParseQuantity(sa)
	vb, db, e2 := units.ParseQuantity(sb)
	return e1 == nil && e2 == nil && da == db && va == vb
}

// show writes a value as the setup file would.
func show(v any) string {
	switch x := v.(type) {
	case string:
		return strconv.Quote(x)
	case map[string]any:
		var parts []string
		for _, k := range slices.Sorted(func(yield func(string) bool) {
			for k := range x {
				if !yield(k) {
					return
				}
			}
		}) {
			parts = append(parts, k+" = "+show(x[k]))
		}
		return "{" + strings.Join(parts, ", ") + "}"
	case []any:
		parts := make([]string, len(x))
		for i, e := range x {
			parts[i] = show(e)
		}
		return "[" + strings.Join(parts, ", ") + "]"
	case []map[string]any:
		parts := make([]string, len(x))
		for i, e := range x {
			parts[i] = show(e)
		}
		return "[" + strings.Join(parts, ", ") + "]"
	default:
		return fmt.Sprint(x)
	}
}

// summary is a table's keys, briefly: its type and where it stands.
func summary(m map[string]any) string {
	var parts []string
	for _, k := range []string{"type", "wavelength", "power", "from", "into", "at"} {
		if v, ok := m[k]; ok {
			parts = append(parts, k+" = "+show(v))
		}
	}
	return strings.Join(parts, ", ")
}

func table(v any) map[string]any { m, _ := v.(map[string]any); return m }

func tables(v any) []map[string]any {
	switch x := v.(type) {
	case []map[string]any:
		return x
	case []any:
		var out []map[string]any
		for _, e := range x {
			if m, ok := e.(map[string]any); ok {
				out = append(out, m)
			}
		}
		return out
	}
	return nil
}

func mapGet(m map[string]any, k string) any {
	if m == nil {
		return nil
	}
	return m[k]
}

func without(m map[string]any, key string) map[string]any {
	if m == nil {
		return nil
	}
	out := make(map[string]any, len(m))
	for k, v := range m {
		if k != key {
			out[k] = v
		}
	}
	return out
}

// ---- the hazards ----

// entry is one hazard of one revision, keyed so that the same hazard is
// found in the other.
type entry struct {
	kind, what string
	text       string // as printed
	figs       map[string]float64
}

func hazardEntries(a *safety.Assessment, ids *idMap, old bool) map[string]entry {
	out := map[string]entry{}
	h := a.Hazards
	for _, ll := range h.Lasers {
		k := "class|" + ll.Laser.Name
		out[k] = entry{"class", fmt.Sprintf("laser %q", ll.Laser.Name), classText(ll.Class), nil}
	}
	for _, e := range h.Exposures {
		path := e.Path.Path.Name
		where := "from the start"
		if e.Segment.After > 0 {
			where = "after element " + ids.id(old, path, e.Segment.After)
		}
		what := fmt.Sprintf("path %q %s, laser %q", path, where, e.Laser.Laser.Name)
		figs := map[string]float64{"eye_ratio": e.CombinedEyeRatio, "skin_ratio": e.CombinedSkinRatio, "od": e.OD}
		text := fmt.Sprintf("eye %s × MPE, skin %s × MPE, OD %g", units.FormatRatio(e.CombinedEyeRatio), units.FormatRatio(e.CombinedSkinRatio), e.OD)
		if e.OpenEnd {
			// A distance beyond the search is a figure of its own, the
			// search's reach, as check writes it: never a non-finite number.
			if math.IsInf(e.NOHD, 1) {
				figs["nohd_beyond_m"] = safety.MaxHazardDistance
			} else {
				figs["nohd_m"] = e.NOHD
			}
			text += ", open end, NOHD " + units.FormatDistance(e.NOHD, safety.MaxHazardDistance)
		}
		out["seg|"+what] = entry{"open_segment", what, text, figs}
	}
	for _, rf := range h.Reflections {
		path := rf.Path.Path.Name
		what := fmt.Sprintf("path %q, element %s, laser %q", path, ids.id(old, path, rf.Element.Index), rf.Laser.Laser.Name)
		kind := map[safety.ReflectionKind]string{safety.ReflectionStray: "stray_reflection", safety.ReflectionEscaping: "escaping_beam", safety.ReflectionDiffuse: "diffuse_zone"}[rf.Kind]
		figs := map[string]float64{"eye_ratio": rf.Ratio, "od": rf.OD}
		text := fmt.Sprintf("%s × the eye MPE, OD %g", units.FormatRatio(rf.Ratio), rf.OD)
		if kind == "diffuse_zone" {
			figs = map[string]float64{"radius_m": rf.Radius}
			text = "zone radius " + units.FormatDistance(rf.Radius, safety.MaxHazardDistance)
		}
		out[kind+"|"+what] = entry{kind, what, text, figs}
	}
	for _, n := range h.Eyewear {
		what := fmt.Sprintf("%s, %s", units.FormatWavelength(n.Wavelength), n.Mode)
		cover := "not covered by declared eyewear"
		if len(n.CoveredBy) > 0 {
			cover = "covered by " + strings.Join(n.CoveredBy, ", ")
		}
		out["eyewear|"+what] = entry{"eyewear", what, fmt.Sprintf("OD %g, %s, %s", n.OD, n.EN207Label(), cover), map[string]float64{"od": n.OD}}
	}
	counts := map[string]int{}
	whats := map[string]string{}
	uncontrolled := map[string]bool{}
	for _, f := range a.Findings {
		if f.Severity != budget.SeverityDefect && f.Severity != budget.SeverityHazard {
			continue
		}
		what := string(f.Severity) + " " + string(f.Kind)
		if f.Path != "" {
			what += fmt.Sprintf(", path %q", f.Path)
			if f.Element > 0 {
				what += ", element " + ids.id(old, f.Path, f.Element)
			}
		} else {
			what += ": " + f.Message
		}
		counts[what]++
		whats[what] = what
		uncontrolled[what] = uncontrolled[what] || f.Uncontrolled()
	}
	for what, n := range counts {
		state := "controlled"
		if uncontrolled[what] {
			state = "not controlled"
		}
		out["finding|"+what] = entry{"finding", whats[what], fmt.Sprintf("%d, %s", n, state), map[string]float64{"count": float64(n)}}
	}
	return out
}

func classText(c string) string {
	if c == "" {
		return "not assessed"
	}
	return "Class " + c
}

// hazardChanges lists hazards added, removed or changed: a class, an OD or
// an eyewear coverage that differs, a ratio, NOHD or zone radius that moved
// by more than RatioChange, a finding count that differs.
func hazardChanges(old, new *safety.Assessment, ids *idMap) []Change {
	out := entryChanges(hazardEntries(old, ids, true), hazardEntries(new, ids, false), hazardMoved, true)
	sort.SliceStable(out, func(i, j int) bool { return hazardOrder[out[i].Kind] < hazardOrder[out[j].Kind] })
	return out
}

// entryChanges compares the entries of two revisions by key: an entry in
// one only is added or removed, one in both is changed when moved says so.
func entryChanges(eo, en map[string]entry, moved func(a, b entry) bool, affects bool) []Change {
	var out []Change
	for _, k := range unionKeys(eo, en) {
		a, inOld := eo[k]
		b, inNew := en[k]
		c := Change{AffectsSafety: affects}
		switch {
		case inOld && inNew:
			if !moved(a, b) {
				continue
			}
			c.Change, c.Kind, c.What, c.Old, c.New = "changed", b.kind, b.what, a.text, b.text
		case inOld:
			c.Change, c.Kind, c.What, c.Old = "removed", a.kind, a.what, a.text
		default:
			c.Change, c.Kind, c.What, c.New = "added", b.kind, b.what, b.text
		}
		c.Figures = figures(a.figs, b.figs)
		out = append(out, c)
	}
	return out
}

// unionKeys lists the keys of two maps, sorted.
func unionKeys[V any](a, b map[string]V) []string {
	keys := make([]string, 0, len(a)+len(b))
	for k := range a {
		keys = append(keys, k)
	}
	for k := range b {
		if _, ok := a[k]; !ok {
			keys = append(keys, k)
		}
	}
	slices.Sort(keys)
	return keys
}

var hazardOrder = map[string]int{"class": 0, "open_segment": 1, "escaping_beam": 2, "stray_reflection": 3, "diffuse_zone": 4, "eyewear": 5, "finding": 6}

func hazardMoved(a, b entry) bool {
	if a.kind == "class" || a.kind == "eyewear" || a.kind == "finding" {
		return a.text != b.text
	}
	if len(a.figs) != len(b.figs) {
		return true // a figure appeared (an open end's NOHD)
	}
	for k, va := range a.figs {
		vb, ok := b.figs[k]
		if !ok {
			return true
		}
		switch k {
		case "od", "count":
			if va != vb {
				return true
			}
		default:
			if Moved(va, vb) {
				return true
			}
		}
	}
	return false
}

// Moved reports whether a figure moved by more than RatioChange of the
// larger of the two (a figure that appears from zero always moves).
func Moved(a, b float64) bool {
	if a == b {
		return false
	}
	return math.Abs(a-b) > RatioChange*math.Max(math.Abs(a), math.Abs(b))
}

func figures(a, b map[string]float64) []Figure {
	var out []Figure
	finite := func(v float64) bool { return !math.IsInf(v, 0) && !math.IsNaN(v) }
	for _, k := range unionKeys(a, b) {
		f := Figure{Key: k}
		// A figure that is not a finite number has no value to write (the
		// text says what it is); JSON would refuse it.
		if v, ok := a[k]; ok && finite(v) {
			f.Old = &v
		}
		if v, ok := b[k]; ok && finite(v) {
			f.New = &v
		}
		out = append(out, f)
	}
	return out
}

// ---- the drive ----

func driveEntries(a *safety.Assessment, ids *idMap, old bool) map[string]entry {
	out := map[string]entry{}
	for _, at := range a.Atoms {
		path := at.Path.Path.Name
		what := fmt.Sprintf("path %q, element %s, laser %q", path, ids.id(old, path, at.Row.Element.Index), at.Path.Laser.Name)
		out["power|"+what] = entry{"power_at_cloud", what, units.FormatPower(at.Power), map[string]float64{"power_w": at.Power}}
		if g := at.Goal; g != nil {
			out["goal|"+what] = entry{"goal", what + ", goal " + g.Kind, goalText(g.MarginDB, g.Met, g.Impossible), marginFigure(g.MarginDB)}
		}
	}
	for _, cr := range a.Clouds {
		if g := cr.Goal; g != nil {
			what := fmt.Sprintf("cloud %q, goal %s", cr.Cloud.Name, g.Kind)
			out["cloud|"+what] = entry{"cloud_goal", what, goalText(g.MarginDB, g.Met, g.Impossible), marginFigure(g.MarginDB)}
		}
	}
	return out
}

// marginFigure is a goal's margin as a figure of the diff (none when the
// goal has no margin: met without scaling).
func marginFigure(db float64) map[string]float64 {
	if math.IsNaN(db) {
		return map[string]float64{}
	}
	return map[string]float64{"margin_db": db}
}

func goalText(db float64, met bool, impossible string) string {
	switch {
	case impossible != "":
		return "cannot be met: " + impossible
	case met && math.IsNaN(db):
		return "met without scaling"
	case met:
		return fmt.Sprintf("margin %+.2f dB, met", db)
	default:
		return fmt.Sprintf("margin %+.2f dB, not met", db)
	}
}

// driveChanges lists the power at every cloud and every goal's margin that
// differ as printed.
func driveChanges(old, new *safety.Assessment, ids *idMap) []Change {
	return entryChanges(driveEntries(old, ids, true), driveEntries(new, ids, false), func(a, b entry) bool { return a.text != b.text }, false)
}
