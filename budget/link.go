package budget

import (
	"fmt"
	"strings"
)

// link resolves names between lasers, paths and clouds, and checks the
// order of elements and the shape of the path tree.
func (l *loader) link(s *Setup) {
	lasers := uniqueNames(l, "laser", s.Lasers, func(x *Laser) (string, int) { return x.Name, x.Line })
	clouds := uniqueNames(l, "cloud", s.Clouds, func(x *Cloud) (string, int) { return x.Name, x.Line })
	uniqueNames(l, "eyewear", s.Eyewear, func(x *Eyewear) (string, int) { return x.Name, x.Line })
	paths := map[string]*Path{}
	locs := pathLocs(s)
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
					FormatLength(e.At), FormatLength(prevAt))
			}
			if k := e.Index - 2; k >= 0 {
				if w := p.Elements[k]; w.Type == TypeWindow && w.Thickness > e.At-w.At {
					l.addf(w.Line, fmt.Sprintf("%s, element %d (window)", ctx, w.Index),
						"thickness: %s is more than the %s to the next element; the window would hold it", FormatLength(w.Thickness), FormatLength(e.At-w.At))
				}
			}
			prevAt = e.At
			if e.Type == TypeAtoms && e.Cloud != "" {
				if _, ok := clouds[e.Cloud]; !ok {
					l.addf(l.lines.line(fmt.Sprintf("%s.element[%d]", pathLoc(locs, p), e.Index-1), "cloud"), ectx,
						"cloud: no cloud named %q (clouds: %s)", e.Cloud, listNames(len(s.Clouds), func(i int) string { return s.Clouds[i].Name }))
				}
			}
		}
		for i, e := range p.Elements {
			if e.Type == TypeDump && i < len(p.Elements)-1 {
				l.addf(e.Line, fmt.Sprintf("%s, element %d (dump)", ctx, e.Index), "a dump ends the path, but element %d follows it", e.Index+1)
			}
		}
	}
	if len(l.problems) > 0 {
		return
	}
	// Resolve sources: a laser name or "<path>:<splitter>".
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
			l.addf(line, ctx, "from: no laser named %q (lasers: %s; a splitter port is written \"<path>:<splitter name>\")",
				p.From, listNames(len(s.Lasers), func(i int) string { return s.Lasers[i].Name }))
			continue
		}
		parent, ok := paths[pathName]
		if !ok {
			l.addf(line, ctx, "from: no path named %q", pathName)
			continue
		}
		var port *Element
		for _, e := range parent.Elements {
			if e.Name == elemName {
				port = e
			}
		}
		switch {
		case port == nil:
			l.addf(line, ctx, "from: path %q has no element named %q", pathName, elemName)
		case port.Type != TypeSplitter:
			l.addf(line, ctx, "from: element %q of path %q is a %s, not a splitter", elemName, pathName, port.Type)
		default:
			p.Parent, p.ParentPort = parent, port
		}
	}
	if len(l.problems) > 0 {
		return
	}
	// Follow each path's parents to its laser; a cycle never reaches one.
	// One walk over the parent links (each path has at most one parent), so
	// the work is linear in the number of paths and each cycle is reported
	// once, at the path of the cycle that comes first in the file.
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
	if len(l.problems) > 0 {
		return
	}
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
