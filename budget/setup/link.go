package setup

import (
	"beamledger/budget/atoms"
	"beamledger/budget/numeric"
	"beamledger/budget/units"
	"fmt"
	"maps"
	"math"
	"slices"
	"strings"
)

// link resolves names between lasers, paths and clouds, and checks the
// order of elements and the shape of the path tree.
func (l *loader) link(s *Setup) {
	lasers := uniqueNames(l, "laser", s.Lasers, func(x *Laser) (string, int) { return x.Name, x.Line })
	clouds := uniqueNames(l, "cloud", s.Clouds, func(x *Cloud) (string, int) { return x.Name, x.Line })
	uniqueNames(l, "eyewear", s.Eyewear, func(x *Eyewear) (string, int) { return x.Name, x.Line })
	locs := pathLocs(s)
	paths := l.checkPaths(s, clouds, locs)
	// The lasers reaching each element, once the paths are linked: the
	// steps after that read them and change no path.
	var reach map[*Element][]Arrival
	// Each step needs the ones before it to have found nothing.
	steps := []func(){
		func() { l.linkSources(s, lasers, paths, locs) },
		func() { l.linkLasers(s, locs) },
		func() { l.linkInto(s, paths, locs) },
		func() {
			reach = Arrivals(s)
			l.checkPerLaser(s, reach, lasers, locs)
			l.checkClouds(s, reach, lasers, locs)
		},
		func() { l.linewidthDetunings(s, clouds, locs) },
		func() { l.checkDetunings(s, clouds, locs) },
		func() { l.checkGoalLasers(s, reach) },
		func() { l.linkElementGoals(s, reach, clouds, locs) },
	}
	for _, step := range steps {
		if len(l.problems) > 0 {
			return
		}
		step()
	}
}

// checkPaths indexes the paths by name and checks each path's own
// elements: unique names, positions in order, a window no thicker than the
// gap after it, clouds that exist, nothing after a dump.
func (l *loader) checkPaths(s *Setup, clouds map[string]*Cloud, locs map[*Path]int) map[string]*Path {
	paths := map[string]*Path{}
	for _, p := range s.Paths {
		ctx := fmt.Sprintf("path %q", p.Name)
		if prev, dup := paths[p.Name]; dup {
			l.addf(p.Line, ctx, "name: duplicate name (also at line %d)", prev.Line)
		}
		paths[p.Name] = p
		names := map[string]*Element{}
		prevAt := 0.0
		for _, e := range p.Elements {
			ectx := fmt.Sprintf("%s, element %d (%s)", ctx, e.Index, e.Type)
			if e.Name != "" {
				if prev, dup := names[e.Name]; dup {
					l.addf(e.Line, ectx, "name: duplicate name %q in this path (also element %d)", e.Name, prev.Index)
				}
				names[e.Name] = e
			}
			if e.At < prevAt {
				l.addf(l.lines.line(fmt.Sprintf("%s.element[%d]", pathLoc(locs, p), e.Index-1), "at"), ectx,
					"at: %s comes before the previous element (%s); elements must be listed in order along the path",
					units.FormatLength(e.At), units.FormatLength(prevAt))
			}
			if k := e.Index - 2; k >= 0 {
				if w := p.Elements[k]; w.Type == TypeWindow && w.Thickness > 0 && e.At >= w.At && w.Thickness > e.At-w.At {
					l.addf(w.Line, fmt.Sprintf("%s, element %d (window)", ctx, w.Index),
						"thickness: %s is more than the %s to the next element; the window would hold it", units.FormatLength(w.Thickness), units.FormatLength(e.At-w.At))
				}
			}
			prevAt = e.At
			if e.Type == TypeAtoms && e.Cloud != "" {
				if _, ok := clouds[e.Cloud]; !ok {
					l.addf(l.lines.line(fmt.Sprintf("%s.element[%d]", pathLoc(locs, p), e.Index-1), "cloud"), ectx,
						"cloud: no cloud named %q (clouds: %s)%s", e.Cloud, listNames(len(s.Clouds), func(i int) string { return s.Clouds[i].Name }), nameHint(e.Cloud, len(s.Clouds), func(i int) string { return s.Clouds[i].Name }))
				}
			}
		}
		for i, e := range p.Elements {
			if e.Type == TypeDump && i < len(p.Elements)-1 {
				l.addf(e.Line, fmt.Sprintf("%s, element %d (dump)", ctx, e.Index), "a dump ends the path, but element %d follows it", e.Index+1)
			}
		}
	}
	return paths
}

// linkSources resolves each path's source: a laser name or
// "<path>:<splitter>"; one output feeds one path.
func (l *loader) linkSources(s *Setup, lasers map[string]*Laser, paths map[string]*Path, locs map[*Path]int) {
	fedBy := map[string]*Path{} // laser name or path:element -> path it feeds
	for _, p := range s.Paths {
		ctx := fmt.Sprintf("path %q", p.Name)
		line := l.lines.line(pathLoc(locs, p), "from")
		if prev, dup := fedBy[p.From]; dup {
			l.addf(line, ctx, "from: %q already feeds path %q; one output feeds one path", p.From, prev.Name)
			continue
		}
		fedBy[p.From] = p
		if las, ok := lasers[p.From]; ok {
			p.Laser = las
			continue
		}
		pathName, elemName, isPort := strings.Cut(p.From, ":")
		if !isPort {
			l.addf(line, ctx, "from: no laser named %q (lasers: %s; a splitter port is written \"<path>:<splitter name>\")%s",
				p.From, listNames(len(s.Lasers), func(i int) string { return s.Lasers[i].Name }), nameHint(p.From, len(s.Lasers), func(i int) string { return s.Lasers[i].Name }))
			continue
		}
		parent, port, problem := portOf(paths, pathName, elemName, TypeSplitter)
		switch {
		case problem != "":
			l.addf(line, ctx, "from: %s", problem)
		default:
			p.Parent, p.ParentPort = parent, port
		}
	}
}

// linkLasers follows each path's parents to its laser; a cycle never
// reaches one. One walk over the parent links (each path has at most one
// parent), so the work is linear in the number of paths and each cycle is
// reported once, at the path of the cycle that comes first in the file.
func (l *loader) linkLasers(s *Setup, locs map[*Path]int) {
	const (
		unvisited = iota
		onWalk
		finished
	)
	state := make(map[*Path]int, len(s.Paths))
	for _, start := range s.Paths {
		var walk []*Path
		q := start
		for q != nil && state[q] == unvisited && q.Laser == nil {
			state[q] = onWalk
			walk = append(walk, q)
			q = q.Parent
		}
		var las *Laser
		switch {
		case q == nil:
		case q.Laser != nil && state[q] != onWalk:
			las = q.Laser
		case state[q] == onWalk:
			// q is on this walk: the walk from q on is a cycle.
			var cycle []*Path
			for i := len(walk) - 1; i >= 0; i-- {
				cycle = append(cycle, walk[i])
				if walk[i] == q {
					break
				}
			}
			first := cycle[0]
			for _, c := range cycle {
				if locs[c] < locs[first] {
					first = c
				}
			}
			l.addf(l.lines.line(pathLoc(locs, first), "from"), fmt.Sprintf("path %q", first.Name), "from: paths feed each other in a cycle (%s)", cycleNames(first, len(cycle)))
		}
		for _, w := range walk {
			state[w] = finished
			w.Laser = las
		}
	}
}

// linewidthDetunings converts detunings written in linewidths: an atoms
// element's with its cloud's transition, a laser's with the transition of
// the clouds its own beams reach (they must agree on Γ).
func (l *loader) linewidthDetunings(s *Setup, clouds map[string]*Cloud, locs map[*Path]int) {
	gammaOf := map[*Laser][]float64{}
	for _, p := range s.Paths {
		for _, e := range p.Elements {
			c := clouds[e.Cloud]
			if e.Type != TypeAtoms || c == nil || c.Data == nil {
				continue
			}
			gammaOf[p.Laser] = append(gammaOf[p.Laser], c.Data.Gamma)
			if e.DetuningLinewidths != nil {
				hz := *e.DetuningLinewidths * atoms.LinewidthHz(c.Data.Gamma)
				e.Detuning = &hz
			}
		}
		// A path that ends at a combiner takes its laser on along the
		// other path's elements after it.
		for q, seen := p, map[*Path]bool{}; q.IntoPath != nil && !seen[q]; q = q.IntoPath {
			seen[q] = true
			after := false
			for _, e := range q.IntoPath.Elements {
				if c := clouds[e.Cloud]; after && e.Type == TypeAtoms && c != nil && c.Data != nil {
					gammaOf[p.Laser] = append(gammaOf[p.Laser], c.Data.Gamma)
				}
				after = after || e == q.IntoPort
			}
		}
	}
	for i, las := range s.Lasers {
		if las.DetuningLinewidths == nil {
			continue
		}
		line, ctx := l.lines.line(fmt.Sprintf("laser[%d]", i), "detuning"), fmt.Sprintf("laser %q", las.Name)
		g := gammaOf[las]
		if len(g) == 0 {
			l.addf(line, ctx, "detuning: %g Γ needs a transition, but the laser's beams reach no cloud; give it in Hz", *las.DetuningLinewidths)
			continue
		}
		for _, x := range g[1:] {
			if math.Abs(x-g[0]) > 1e-9*g[0] {
				l.addf(line, ctx, "detuning: %g Γ is ambiguous: the clouds the laser reaches have transitions of different linewidths; give it in Hz", *las.DetuningLinewidths)
				g = nil
				break
			}
		}
		if g != nil {
			las.Detuning = *las.DetuningLinewidths * atoms.LinewidthHz(g[0])
		}
	}
}

// checkDetunings checks, at every atoms element on a known transition, that
// a stated detuning agrees with the wavelengths (checkDetuning); the message
// names the element, or the laser when the laser's detuning is the one
// stated.
func (l *loader) checkDetunings(s *Setup, clouds map[string]*Cloud, locs map[*Path]int) {
	laserLocs := make(map[*Laser]int, len(s.Lasers))
	for i, las := range s.Lasers {
		laserLocs[las] = i
	}
	for _, p := range s.Paths {
		for _, e := range p.Elements {
			if c := clouds[e.Cloud]; e.Type == TypeAtoms && c != nil && c.Data != nil {
				if msg := checkDetuning(p, e, c.Data); msg != "" {
					line, ctx := l.lines.line(fmt.Sprintf("%s.element[%d]", pathLoc(locs, p), e.Index-1), "detuning"), fmt.Sprintf("path %q, element %d (atoms, cloud %q)", p.Name, e.Index, e.Cloud)
					if e.Detuning == nil && p.Laser.DetuningSet {
						line, ctx = l.lines.line(fmt.Sprintf("laser[%d]", laserLocs[p.Laser]), "detuning"), fmt.Sprintf("laser %q, at path %q, element %d (atoms, cloud %q)", p.Laser.Name, p.Name, e.Index, e.Cloud)
					}
					l.addf(line, ctx, "detuning: %s", msg)
				}
			}
		}
	}
}

// uniqueNames maps names to items and reports each duplicate name.
func uniqueNames[T any](l *loader, kind string, items []T, id func(T) (string, int)) map[string]T {
	out := map[string]T{}
	first := map[string]int{}
	for _, it := range items {
		name, line := id(it)
		if prev, dup := first[name]; dup {
			l.addf(line, fmt.Sprintf("%s %q", kind, name), "name: duplicate name (also at line %d)", prev)
			continue
		}
		first[name] = line
		out[name] = it
	}
	return out
}

// cycleNames writes the n paths of a cycle starting at p, following the
// parent links; a long cycle is shortened to its first and last few names.
func cycleNames(p *Path, n int) string {
	const show = 4
	var names []string
	q := p
	for i := 0; i < n; i++ {
		if n <= 2*show || i < show || i >= n-show {
			names = append(names, fmt.Sprintf("%q", q.Name))
		} else if i == show {
			names = append(names, fmt.Sprintf("… %d more …", n-2*show))
		}
		q = q.Parent
	}
	return strings.Join(append(names, fmt.Sprintf("%q", p.Name)), " ← ")
}

// pathLocs maps each path to its index in the setup file.
func pathLocs(s *Setup) map[*Path]int {
	m := make(map[*Path]int, len(s.Paths))
	for i, p := range s.Paths {
		m[p] = i
	}
	return m
}

// pathLoc is the line-index key of a path, e.g. "path[3]".
func pathLoc(locs map[*Path]int, p *Path) string { return fmt.Sprintf("path[%d]", locs[p]) }

// nameHint is "; did you mean X?" when one of the n names is near word.
func nameHint(word string, n int, name func(int) string) string {
	names := make([]string, n)
	for i := range names {
		names[i] = name(i)
	}
	if c, ok := closest(word, names); ok {
		return fmt.Sprintf("; did you mean %q?", c)
	}
	return ""
}

func listNames(n int, name func(int) string) string {
	if n == 0 {
		return "none"
	}
	var out []string
	for i := 0; i < n; i++ {
		out = append(out, fmt.Sprintf("%q", name(i)))
	}
	return strings.Join(out, ", ")
}

// portOf finds the element named elemName of the path named pathName and
// checks that it is of type want; problem says what is wrong, if anything.
func portOf(paths map[string]*Path, pathName, elemName string, want ElementType) (*Path, *Element, string) {
	p, ok := paths[pathName]
	if !ok {
		return nil, nil, fmt.Sprintf("no path named %q", pathName)
	}
	var port *Element
	for _, e := range p.Elements {
		if e.Name == elemName {
			port = e
		}
	}
	switch {
	case port == nil:
		return nil, nil, fmt.Sprintf("path %q has no element named %q", pathName, elemName)
	case port.Type != want:
		return nil, nil, fmt.Sprintf("element %q of path %q is a %s, not a %s", elemName, pathName, port.Type, want)
	}
	return p, port, ""
}

// linkInto resolves each path's into ("<path>:<combiner name>"), checks
// that the path's elements lie before into_at and that it does not end in a
// dump, and refuses cycles through splitters and combiners together.
func (l *loader) linkInto(s *Setup, paths map[string]*Path, locs map[*Path]int) {
	joinedBy := map[*Element]*Path{}
	for _, p := range s.Paths {
		if p.Into == "" {
			continue
		}
		ctx := fmt.Sprintf("path %q", p.Name)
		line := l.lines.line(pathLoc(locs, p), "into")
		pathName, elemName, ok := strings.Cut(p.Into, ":")
		if !ok {
			l.addf(line, ctx, "into: want \"<path>:<combiner name>\", got %q", p.Into)
			continue
		}
		target, port, problem := portOf(paths, pathName, elemName, TypeCombiner)
		switch {
		case problem != "":
			l.addf(line, ctx, "into: %s", problem)
			continue
		case target == p:
			l.addf(line, ctx, "into: a path cannot go into its own combiner")
			continue
		}
		if prev, dup := joinedBy[port]; dup {
			l.addf(line, ctx, "into: combiner %q of path %q is already joined by path %q; one path joins a combiner", elemName, pathName, prev.Name)
			continue
		}
		joinedBy[port] = p
		p.IntoPath, p.IntoPort = target, port
		if n := len(p.Elements); n > 0 {
			last := p.Elements[n-1]
			if last.Type == TypeDump {
				l.addf(line, ctx, "into: the path ends in a dump (element %d), so no light goes on into %q", last.Index, p.Into)
			}
			if last.At > p.IntoAt {
				l.addf(l.lines.line(pathLoc(locs, p), "into_at"), ctx, "into_at: %s comes before element %d (at %s); the combiner ends the path", units.FormatLength(p.IntoAt), last.Index, units.FormatLength(last.At))
			}
		}
	}
	if len(l.problems) > 0 {
		return
	}
	// A path feeds its splitter branches and the path it goes into; light
	// must never come back to a path it has left. One depth-first walk.
	next := map[*Path][]*Path{}
	for _, p := range s.Paths {
		if p.Parent != nil {
			next[p.Parent] = append(next[p.Parent], p)
		}
		if p.IntoPath != nil {
			next[p] = append(next[p], p.IntoPath)
		}
	}
	const (
		unvisited = iota
		onStack
		finished
	)
	state := make(map[*Path]int, len(s.Paths))
	type frame struct {
		p *Path
		i int
	}
	for _, root := range s.Paths {
		if state[root] != unvisited {
			continue
		}
		stack := []frame{{root, 0}}
		state[root] = onStack
		for len(stack) > 0 {
			top := &stack[len(stack)-1]
			if top.i == len(next[top.p]) {
				state[top.p] = finished
				stack = stack[:len(stack)-1]
				continue
			}
			q := next[top.p][top.i]
			top.i++
			switch state[q] {
			case unvisited:
				state[q] = onStack
				stack = append(stack, frame{q, 0})
			case onStack:
				var names []string
				for k := range stack {
					if stack[k].p == q || len(names) > 0 {
						names = append(names, fmt.Sprintf("%q", stack[k].p.Name))
					}
				}
				names = append(names, fmt.Sprintf("%q", q.Name))
				if len(names) > 10 {
					names = append(append(names[:4:4], fmt.Sprintf("… %d more …", len(names)-8)), names[len(names)-4:]...)
				}
				l.addf(l.lines.line(pathLoc(locs, q), "from"), fmt.Sprintf("path %q", q.Name), "light comes back to this path through splitters and combiners (%s); a beam's route must not loop", strings.Join(names, " → "))
				return
			}
		}
	}
}

// checkPerLaser checks each per-laser table: every laser that reaches the
// element is in it, and it names no laser the setup does not have.
func (l *loader) checkPerLaser(s *Setup, reach map[*Element][]Arrival, lasers map[string]*Laser, locs map[*Path]int) {
	for _, p := range s.Paths {
		for k, e := range p.Elements {
			for _, key := range slices.Sorted(maps.Keys(e.PerLaser)) {
				by := e.PerLaser[key]
				line := l.lines.line(fmt.Sprintf("%s.element[%d]", pathLoc(locs, p), k), key)
				ctx := fmt.Sprintf("path %q, element %d (%s)", p.Name, e.Index, e.Type)
				for _, name := range slices.Sorted(maps.Keys(by)) {
					if _, ok := lasers[name]; !ok {
						l.addf(line, ctx, "%s: no laser named %q (lasers: %s)%s", key, name, listNames(len(s.Lasers), func(i int) string { return s.Lasers[i].Name }), nameHint(name, len(s.Lasers), func(i int) string { return s.Lasers[i].Name }))
					}
				}
				var here []string
				for _, a := range reach[e] {
					if slices.Contains(here, a.Laser.Name) {
						continue
					}
					// At a combiner, join_transmission is for the beams that join
					// there and transmission for the others.
					if e.Type == TypeCombiner && (key == "join_transmission" || key == "transmission") && (key == "join_transmission") != a.Joins {
						continue
					}
					here = append(here, a.Laser.Name)
					if _, ok := by[a.Laser.Name]; !ok {
						l.addf(line, ctx, "%s: laser %q reaches this element but is missing from its table", key, a.Laser.Name)
					}
				}
				// An entry for a laser whose light never gets here would be
				// silently unused: a slip of a name, or a route that is not
				// what the setup says.
				for _, name := range slices.Sorted(maps.Keys(by)) {
					if _, ok := lasers[name]; ok && !slices.Contains(here, name) {
						l.addf(line, ctx, "%s: laser %q never reaches this element%s (the lasers here: %s)", key, name, map[bool]string{true: " as a joining beam", false: ""}[key == "join_transmission"], quotedOrNone(here))
					}
				}
			}
		}
	}
}

// Arrival is one laser's light reaching an element; Joins is set at the
// combiner where it joins the path.
type Arrival struct {
	Laser *Laser
	Joins bool
}

// Arrivals lists, for every element, the lasers whose light reaches it, in
// the order the path order meets them: the path's own laser, the other
// lasers the splitter feeding the path carries, and from a combiner on, the
// lasers of the path that goes into it (as Compute propagates them).
func Arrivals(s *Setup) map[*Element][]Arrival {
	type arrival struct {
		las   *Laser
		first int
		joins bool // at the element first, a combiner
	}
	n := 0
	for _, p := range s.Paths {
		n += len(p.Elements)
	}
	on := make(map[*Path][]arrival, len(s.Paths))
	out := make(map[*Element][]Arrival, n)
	for _, p := range PathOrder(s) {
		var arr []arrival
		if p.Parent == nil {
			arr = append(arr, arrival{p.Laser, 0, false})
		} else {
			k := ElementIndex(p.Parent, p.ParentPort)
			for _, a := range on[p.Parent] {
				if a.first <= k {
					arr = append(arr, arrival{a.las, 0, false})
				}
			}
		}
		for _, j := range s.Paths {
			if j.IntoPath == p {
				k := ElementIndex(p, j.IntoPort)
				for _, a := range on[j] {
					arr = append(arr, arrival{a.las, k, true})
				}
			}
		}
		on[p] = arr
		for k, e := range p.Elements {
			for _, a := range arr {
				if a.first > k {
					continue
				}
				joins := a.joins && a.first == k
				if !slices.ContainsFunc(out[e], func(x Arrival) bool { return x.Laser == a.las && x.Joins == joins }) {
					out[e] = append(out[e], Arrival{a.las, joins})
				}
			}
		}
	}
	return out
}

// checkClouds checks the laser names a cloud gives (goal_lasers,
// excited_polarizability) and that every standing wave has its forward pass:
// an earlier atoms element on the same path, on the same cloud, running the
// opposite way.
func (l *loader) checkClouds(s *Setup, reach map[*Element][]Arrival, lasers map[string]*Laser, locs map[*Path]int) {
	laserNames := listNames(len(s.Lasers), func(i int) string { return s.Lasers[i].Name })
	atCloud := map[string][]string{} // the lasers whose light reaches each cloud
	for _, p := range s.Paths {
		for _, e := range p.Elements {
			if e.Type != TypeAtoms {
				continue
			}
			for _, a := range reach[e] {
				if !slices.Contains(atCloud[e.Cloud], a.Laser.Name) {
					atCloud[e.Cloud] = append(atCloud[e.Cloud], a.Laser.Name)
				}
			}
		}
	}
	for i, c := range s.Clouds {
		loc := fmt.Sprintf("cloud[%d]", i)
		ctx := fmt.Sprintf("cloud %q", c.Name)
		for _, name := range c.GoalLasers {
			if _, ok := lasers[name]; !ok {
				l.addf(l.lines.line(loc, "goal_lasers"), ctx, "goal_lasers: no laser named %q (lasers: %s)%s", name, laserNames, nameHint(name, len(s.Lasers), func(i int) string { return s.Lasers[i].Name }))
			}
		}
		for _, name := range slices.Sorted(maps.Keys(c.ExcitedPolarizability)) {
			if _, ok := lasers[name]; !ok {
				l.addf(l.lines.line(loc, "excited_polarizability"), ctx, "excited_polarizability: no laser named %q (lasers: %s)%s", name, laserNames, nameHint(name, len(s.Lasers), func(i int) string { return s.Lasers[i].Name }))
			} else if at := atCloud[c.Name]; !slices.Contains(at, name) {
				l.addf(l.lines.line(loc, "excited_polarizability"), ctx, "excited_polarizability: laser %q never reaches the cloud (the lasers whose light reaches it: %s)", name, quotedOrNone(at))
			}
		}
		for _, name := range c.GoalLasers {
			if at := atCloud[c.Name]; lasers[name] != nil && !slices.Contains(at, name) {
				l.addf(l.lines.line(loc, "goal_lasers"), ctx, "goal_lasers: laser %q never reaches the cloud, so scaling it cannot change the goal (the lasers whose light reaches it: %s)", name, quotedOrNone(at))
			}
		}
	}
	for _, p := range s.Paths {
		for k, e := range p.Elements {
			if e.Type != TypeAtoms || e.Interference != "standing_wave" {
				continue
			}
			found, mirrored := false, false
			for kf, f := range p.Elements[:k] {
				if f.Type == TypeAtoms && f.Cloud == e.Cloud && numeric.Dot(f.Direction, e.Direction) < -0.999 {
					found = true
					// The return pass comes back from a mirror between them.
					mirrored = mirrored || slices.ContainsFunc(p.Elements[kf+1:k], func(m *Element) bool { return m.Type == TypeMirror })
				}
			}
			switch {
			case !found:
				l.addf(l.lines.line(fmt.Sprintf("%s.element[%d]", pathLoc(locs, p), k), "interference"), fmt.Sprintf("path %q, element %d (atoms)", p.Name, e.Index),
					"interference: a standing wave is the return pass of a beam: an earlier atoms element on this path must reach cloud %q running the opposite way (direction reversed)", e.Cloud)
			case !mirrored:
				l.addf(l.lines.line(fmt.Sprintf("%s.element[%d]", pathLoc(locs, p), k), "interference"), fmt.Sprintf("path %q, element %d (atoms)", p.Name, e.Index),
					"interference: a standing wave is the return pass of a retro-reflected beam: a mirror must stand between the forward pass on cloud %q and this one", e.Cloud)
			}
		}
	}
}

// PathOrder lists the paths so that every path comes after the paths that
// feed it: the one whose splitter it starts at and those that go into its
// combiners (the loader refuses cycles).
func PathOrder(s *Setup) []*Path {
	joiners := map[*Path][]*Path{}
	for _, p := range s.Paths {
		if p.IntoPath != nil {
			joiners[p.IntoPath] = append(joiners[p.IntoPath], p)
		}
	}
	order := make([]*Path, 0, len(s.Paths))
	done := make(map[*Path]bool, len(s.Paths))
	var visit func(p *Path)
	visit = func(p *Path) {
		if done[p] {
			return
		}
		done[p] = true
		if p.Parent != nil {
			visit(p.Parent)
		}
		for _, j := range joiners[p] {
			visit(j)
		}
		order = append(order, p)
	}
	for _, p := range s.Paths {
		visit(p)
	}
	return order
}

// ElementIndex is the index of element e in path p's elements.
func ElementIndex(p *Path, e *Element) int {
	for i, x := range p.Elements {
		if x == e {
			return i
		}
	}
	return -1
}

// quotedOrNone lists names quoted, or says there are none.
func quotedOrNone(names []string) string {
	if len(names) == 0 {
		return "none"
	}
	q := make([]string, len(names))
	for i, n := range names {
		q[i] = fmt.Sprintf("%q", n)
	}
	return strings.Join(q, ", ")
}

// checkGoalLasers checks that every laser a cloud's goal names can serve
// it: a trap depth scales far-detuned light, saturation, Rabi frequency
// and the collective drive scale near-resonant light (Classify, at each
// atoms element of the cloud the laser's light reaches; the laser serves
// if it counts so at one of them). A goal scaling only light that cannot
// change it would report a margin it does not have.
func (l *loader) checkGoalLasers(s *Setup, reach map[*Element][]Arrival) {
	for i, c := range s.Clouds {
		if c.Goal == "" || len(c.GoalLasers) == 0 || c.Data == nil {
			continue
		}
		want := LightNear
		if c.Goal == GoalTrapDepth {
			want = LightFar
		}
		for _, name := range c.GoalLasers {
			var seen []string
			serves := false
			for _, p := range s.Paths {
				for _, e := range p.Elements {
					if e.Type != TypeAtoms || e.Cloud != c.Name {
						continue
					}
					for _, a := range reach[e] {
						if a.Laser.Name != name {
							continue
						}
						var Δ float64
						if a.Laser == p.Laser {
							Δ, _ = DetuningAt(a.Laser, e, aomShift(p, e), c.Data)
						} else {
							Δ, _ = DetuningAt(a.Laser, nil, 0, c.Data)
						}
						kind, _, _ := Classify(Δ, c.Data)
						serves = serves || kind == want
						seen = append(seen, fmt.Sprintf("%s, %s from %s (path %q, element %d)", kind, units.FormatFrequency(Δ/(2*math.Pi)), c.Data.Name, p.Name, e.Index))
					}
				}
			}
			if !serves && len(seen) > 0 {
				l.addf(l.lines.line(fmt.Sprintf("cloud[%d]", i), "goal_lasers"), fmt.Sprintf("cloud %q", c.Name),
					"goal_lasers: laser %q cannot serve the %s goal: its light at the cloud is %s; a %s goal scales %s light", name, c.Goal, strings.Join(seen, "; "), c.Goal, map[string]string{LightFar: "far-detuned", LightNear: "near-resonant"}[want])
			}
		}
	}
}

// lightAt is how laser las's light counts at atoms element e of path p on
// transition tr (Classify of its detuning there: the element's stated
// detuning and the AOM shifts for the path's own laser, the laser's own
// detuning or wavelength otherwise).
func lightAt(p *Path, e *Element, las *Laser, tr *atoms.Transition) (string, float64) {
	var Δ float64
	if las == p.Laser {
		Δ, _ = DetuningAt(las, e, aomShift(p, e), tr)
	} else {
		Δ, _ = DetuningAt(las, nil, 0, tr)
	}
	kind, _, _ := Classify(Δ, tr)
	return kind, Δ
}

// linkElementGoals sets each atoms element's goal laser: the one named
// (which must reach the element and serve the goal), else the path's own
// laser when it serves it, else the one arriving laser that does; a goal
// no arriving laser serves, or that several could serve but not the
// path's own, is an input error naming them.
func (l *loader) linkElementGoals(s *Setup, reach map[*Element][]Arrival, clouds map[string]*Cloud, locs map[*Path]int) {
	for _, p := range s.Paths {
		for k, e := range p.Elements {
			c := clouds[e.Cloud]
			if e.Type != TypeAtoms || e.Goal == "" || c == nil || c.Data == nil {
				continue
			}
			want := LightNear
			if e.Goal == GoalTrapDepth {
				want = LightFar
			}
			adj := map[string]string{LightFar: "far-detuned", LightNear: "near-resonant"}[want]
			line, ctx := l.lines.line(fmt.Sprintf("%s.element[%d]", pathLoc(locs, p), k), "goal_laser"), fmt.Sprintf("path %q, element %d (atoms, cloud %q)", p.Name, e.Index, e.Cloud)
			var here, serve []string
			kinds := map[string]string{}
			for _, a := range reach[e] {
				if slices.Contains(here, a.Laser.Name) {
					continue
				}
				here = append(here, a.Laser.Name)
				kind, Δ := lightAt(p, e, a.Laser, c.Data)
				kinds[a.Laser.Name] = fmt.Sprintf("%s, %s from %s", kind, units.FormatFrequency(Δ/(2*math.Pi)), c.Data.Name)
				if kind == want {
					serve = append(serve, a.Laser.Name)
				}
			}
			switch {
			case e.GoalLaser != "" && !slices.Contains(here, e.GoalLaser):
				l.addf(line, ctx, "goal_laser: laser %q does not reach this element (the lasers here: %s)", e.GoalLaser, quotedOrNone(here))
			case e.GoalLaser != "" && !slices.Contains(serve, e.GoalLaser):
				l.addf(line, ctx, "goal_laser: laser %q cannot serve the %s goal: its light here is %s; a %s goal is for %s light", e.GoalLaser, e.Goal, kinds[e.GoalLaser], e.Goal, adj)
			case e.GoalLaser != "":
			case slices.Contains(serve, p.Laser.Name) || len(here) == 1:
				// The path's own laser, as always; alone, it keeps the goal
				// even where it cannot serve it (the drive says why).
				e.GoalLaser = p.Laser.Name
			case len(serve) == 1:
				e.GoalLaser = serve[0]
			case len(serve) == 0:
				l.addf(line, ctx, "goal: no laser whose light reaches this element can serve the %s goal (%s light): %s", e.Goal, adj, quotedOrNone(here))
			default:
				l.addf(line, ctx, "goal: the lasers %s could each serve the %s goal here, and the path's own laser %q cannot; name one with goal_laser", quotedOrNone(serve), e.Goal, p.Laser.Name)
			}
		}
	}
}
