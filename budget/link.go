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
				l.addf(l.lines.line(fmt.Sprintf("%s.element[%d]", pathLoc(s, p), e.Index-1), "at"), ectx,
					"at: %s comes before the previous element (%s); elements must be listed in order along the path",
					FormatLength(e.At), FormatLength(prevAt))
			}
			prevAt = e.At
			if e.Type == TypeAtoms && e.Cloud != "" {
				if _, ok := clouds[e.Cloud]; !ok {
					l.addf(l.lines.line(fmt.Sprintf("%s.element[%d]", pathLoc(s, p), e.Index-1), "cloud"), ectx,
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
		line := l.lines.line(pathLoc(s, p), "from")
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
	for _, p := range s.Paths {
		seen := map[*Path]bool{}
		q := p
		for q.Laser == nil {
			if seen[q] {
				l.addf(l.lines.line(pathLoc(s, p), "from"), fmt.Sprintf("path %q", p.Name), "from: paths feed each other in a cycle (%s)", cycleNames(p))
				break
			}
			seen[q] = true
			q = q.Parent
		}
		if q.Laser != nil {
			p.Laser = q.Laser
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

func cycleNames(p *Path) string {
	var names []string
	seen := map[*Path]bool{}
	for q := p; q != nil && !seen[q]; q = q.Parent {
		seen[q] = true
		names = append(names, q.Name)
	}
	return strings.Join(names, " ← ")
}

func pathLoc(s *Setup, p *Path) string {
	for i, q := range s.Paths {
		if q == p {
			return fmt.Sprintf("path[%d]", i)
		}
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
