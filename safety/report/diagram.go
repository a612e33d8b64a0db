package report

import (
	"fmt"
	"math"
	"strings"
	"unicode/utf8"

	"beamledger/budget"
	"beamledger/budget/setup"
	"beamledger/budget/units"
	"beamledger/safety/view"
)

// Drawing is a schematic made of simple shapes, in mm, with the origin at
// its top left and y running down. The PDF and the SVG draw the same
// shapes; the golden text lists them.
type Drawing struct {
	Title         string
	Width, Height float64
	Shapes        []Shape
}

// ShapeKind names a shape.
type ShapeKind string

// Shapes.
const (
	ShapeLine    ShapeKind = "line"    // P: x1, y1, x2, y2, … (an open polyline)
	ShapePolygon ShapeKind = "polygon" // P: x1, y1, x2, y2, … (closed)
	ShapeRect    ShapeKind = "rect"    // P: x, y, width, height
	ShapeEllipse ShapeKind = "ellipse" // P: cx, cy, rx, ry
	ShapeText    ShapeKind = "text"    // P: x, y of the baseline at the anchor
)

// Dash is a line's pattern.
type Dash string

// Line patterns: open segments solid, enclosed dashed, in vacuum dotted.
const (
	Solid  Dash = ""
	Dashed Dash = "dashed"
	Dotted Dash = "dotted"
)

// Shape is one mark of a drawing.
type Shape struct {
	Kind ShapeKind
	P    []float64
	// Stroke is the line width, mm (0: no outline); Dash its pattern.
	Stroke float64
	Dash   Dash
	// Fill is the grey level of the fill, 0 black to 1 white; negative:
	// none.
	Fill float64
	// Text, its size (pt) and anchor ("start", "middle", "end").
	Text   string
	Size   float64
	Anchor string
}

// Layout of the schematic, mm.
const (
	diagramWidth   = 174.0 // the PDF's text width
	slotPitch      = 19.0  // from one element to the next
	slotLeft       = 10.0  // the first slot's centre (room for a continuation chevron before it)
	bandHeight     = 25.0  // one line of elements with its labels
	headerHeight   = 6.0   // a path's heading line
	glyphHalf      = 2.5   // half the width of a glyph
	labelSize      = 6.5   // pt, element labels
	noteSize       = 6.0   // pt, ratios, positions and stub labels (6 pt at least: print stays legible)
	labelLine      = 2.6   // mm between label lines
	maxDrawingTall = 225.0 // the most one drawing takes on a page
)

// RatioBand is the band of an eye-exposure ratio the drawing shows by line
// weight: 0 at most 1, 1 at most 10², 2 at most 10⁴, 3 above.
func RatioBand(r float64) int {
	switch {
	case r <= 1:
		return 0
	case r <= 1e2:
		return 1
	case r <= 1e4:
		return 2
	}
	return 3
}

// bandStroke is the line width of each ratio band, mm; bandNames name them
// for the legend.
var (
	bandStroke = [4]float64{0.25, 0.6, 1.0, 1.6}
	bandNames  = [4]string{"eye ratio ≤ 1 (or not open)", "≤ 10²", "≤ 10⁴", "above 10⁴"}
)

// slotsPerLine is how many elements one line holds.
func slotsPerLine() int { return int(math.Floor((diagramWidth - slotLeft - 10) / slotPitch)) }

// stop is one place along a drawn path: its origin, an element, or its end.
type stop struct {
	glyph string // element type, or "source", "port", "join", "open_end", "into"
	label string
	el    *setup.Element
	row   *budget.Row
	fold  bool // a retro mirror: the rest comes back on the line below
}

// band is one line of a drawing: a path's heading or a line of stops.
type band struct {
	height float64
	shapes []Shape // relative to the band's top
	// keep joins the band to the one before it on a page (a folded
	// return pass).
	keep bool
}

// Diagrams draws one schematic per laser from the path tree of the hazard
// budget, with the titles and ratios the view gathered (view.BuildDrawn): every beam of the laser on every path, with its elements as
// glyphs, the segments styled by access and weighted by eye-exposure
// ratio, and the beams that leave a path as stubs. A laser whose drawing is
// too tall for a page gets more than one, split between lines.
func Diagrams(dr *view.Drawn) []*Drawing {
	hb := dr.Budget
	var out []*Drawing
	for _, dl := range dr.Lasers {
		var bands []band
		for _, own := range hb.Paths {
			for _, pb := range own.Beams() {
				if pb.Laser == dl.Laser {
					bands = append(bands, pathBands(pb, own, dr, hb)...)
				}
			}
		}
		if len(bands) == 0 {
			bands = []band{{height: headerHeight, shapes: []Shape{text(0, 4, labelSize+1, "start", "no path starts at this laser")}}}
		}
		out = append(out, stack(dl.Title, bands)...)
	}
	return out
}

// stack puts bands under one another into drawings no taller than a page
// allows, never parting a band from one it keeps with.
func stack(title string, bands []band) []*Drawing {
	var out []*Drawing
	d := &Drawing{Title: title, Width: diagramWidth}
	for i, b := range bands {
		if d.Height+b.height > maxDrawingTall && len(d.Shapes) > 0 && !(b.keep && i > 0 && d.Height+b.height <= maxDrawingTall+bandHeight) {
			out = append(out, d)
			d = &Drawing{Title: title + " (continued)", Width: diagramWidth}
		}
		for _, s := range b.shapes {
			s.P = append([]float64(nil), s.P...)
			for k := 1; k < len(s.P); k += 2 {
				if (s.Kind == ShapeRect || s.Kind == ShapeEllipse) && k == 3 {
					continue // a height or a radius, not a position
				}
				s.P[k] += d.Height
			}
			d.Shapes = append(d.Shapes, s)
		}
		d.Height += b.height
	}
	return append(out, d)
}

// pathBands lays out one beam on one path: a heading band, then lines of
// stops.
func pathBands(pb, own *budget.PathBudget, dr *view.Drawn, hb *budget.Budget) []band {
	ratio, escaping := dr.SegmentRatio[pb], dr.EscapingRatio[pb]
	p := pb.Path
	stops := pathStops(pb, hb)
	head := fmt.Sprintf("path %q: %s, %s", p.Name, units.FormatWavelength(pb.Laser.Wavelength), stops[0].label)
	if pb == own {
		for _, q := range own.Joined {
			head += fmt.Sprintf("; laser %q (%s) joins", q.Laser.Name, units.FormatWavelength(q.Laser.Wavelength))
			if q.Combiner != nil {
				head += fmt.Sprintf(" at %q", q.Combiner.Label())
			}
		}
	}
	stops[0].label = ""
	bands := []band{{height: headerHeight, shapes: []Shape{text(0, headerHeight-1.6, labelSize+1.2, "start", fit(head, diagramWidth, labelSize+1.2))}}}

	// Place the stops: left to right, a new line when one is full, and
	// back along the line below after a retro mirror.
	at := make([]place, len(stops))
	goingLeft := make([]bool, len(stops))
	line, col, dir := 0, 0, 1
	cols := slotsPerLine()
	for i := 1; i < len(stops); i++ {
		if stops[i-1].fold {
			// Only a beam going right folds back: a second retro mirror
			// on the return is drawn as a plain mirror.
			// A mirror at the start of a line has no room to the left for
			// the return: it too is drawn plain.
			if dir == 1 && col > 0 {
				line, dir = line+1, -1
			} else {
				stops[i-1].fold = false
			}
		}
		col += dir
		if col >= cols || col < 0 {
			line, col, dir = line+1, 0, 1
		}
		at[i] = place{line, col}
		goingLeft[i] = dir < 0
	}
	lines := make([]band, at[len(at)-1].line+1)
	for i := range lines {
		lines[i].height = bandHeight
		lines[i].keep = i > 0 && stops[indexOfLineStart(at, i)-1].fold
	}
	x := func(c int) float64 { return slotLeft + float64(c)*slotPitch }
	const yc = 8.0 // the beam's height in a band
	add := func(l int, s ...Shape) { lines[l].shapes = append(lines[l].shapes, s...) }

	// Segments first, so glyphs draw over their ends.
	for i := 0; i+1 < len(stops); i++ {
		a, b := at[i], at[i+1]
		style, r := segmentStyle(pb, i, ratio)
		w := bandStroke[RatioBand(r)]
		seg := func(l int, x1, x2 float64) {
			add(l, Shape{Kind: ShapeLine, P: []float64{x1, yc, x2, yc}, Stroke: w, Dash: style, Fill: -1})
		}
		switch {
		case a.line == b.line && b.col > a.col:
			seg(a.line, x(a.col)+glyphHalf, x(b.col)-glyphHalf)
			if r > 1 {
				add(a.line, text((x(a.col)+x(b.col))/2, yc-1.6, noteSize, "middle", "×"+units.FormatRatio(r)))
			}
		case a.line == b.line:
			seg(a.line, x(b.col)+glyphHalf, x(a.col)-glyphHalf)
			if r > 1 {
				add(a.line, text((x(a.col)+x(b.col))/2, yc-1.6, noteSize, "middle", "×"+units.FormatRatio(r)))
			}
		case stops[i].fold:
			// The return pass leaves the tall retro mirror on the line
			// below.
			seg(b.line, x(b.col)+glyphHalf, x(a.col)-0.8)
			add(b.line, text(x(b.col)+glyphHalf+0.5, yc+3.6, noteSize, "start", "return pass"))
			if r > 1 {
				add(b.line, text((x(a.col)+x(b.col))/2, yc-1.6, noteSize, "middle", "×"+units.FormatRatio(r)))
			}
		case goingLeft[i]:
			// A return pass reaching the left edge: it runs off there and
			// on at the left of the next line.
			end := x(a.col) - slotPitch*0.45
			seg(a.line, end, x(a.col)-glyphHalf)
			add(a.line, chevron(end, yc, -1))
			start := x(b.col) - slotPitch*0.45
			seg(b.line, start, x(b.col)-glyphHalf)
			add(b.line, chevron(start, yc, 1))
		default:
			// A full line: the beam runs off its right end and on at the
			// left of the next, marked by open chevrons.
			end := x(a.col) + slotPitch*0.6
			seg(a.line, x(a.col)+glyphHalf, end)
			add(a.line, chevron(end, yc, 1))
			start := x(b.col) - slotPitch*0.45
			seg(b.line, start, x(b.col)-glyphHalf)
			add(b.line, chevron(start, yc, 1))
		}
	}
	for i, s := range stops {
		l, cx := at[i].line, x(at[i].col)
		var lower float64 // for a retro mirror, the line its return runs on
		if s.fold {
			lower = bandHeight
		}
		add(l, glyph(s.glyph, s.el, cx, yc, lower)...)
		if s.label != "" {
			lx, ly, anchor, room := cx, yc+6.4, "middle", slotPitch-1
			switch {
			case s.fold:
				lx, ly, anchor = cx+2.2, yc+bandHeight/2-1, "start"
			case s.el == nil && !goingLeft[i]:
				// A path's end has the room after it.
				lx, anchor, room = cx-glyphHalf, "start", 2*slotPitch-2
			}
			// The label on up to two lines, then the position along the
			// path and the hazard figure the element carries.
			lines := fitLines(s.label, room, labelSize, 2)
			var notes []string
			if s.el != nil {
				notes = append(notes, "at "+units.FormatLength(s.el.At))
				if z := dr.DumpZone[pb][s.el]; z != "" {
					notes = append(notes, z)
				}
			} else if s.glyph == "open_end" && dr.OpenEnd[pb] != "" {
				notes = append(notes, dr.OpenEnd[pb])
			}
			for k, ln := range lines {
				add(l, text(lx, ly+float64(k)*labelLine, labelSize, anchor, ln))
			}
			for k, n := range notes {
				add(l, text(lx, ly+float64(len(lines)+k)*labelLine, noteSize, anchor, fit(n, room, noteSize)))
			}
			if s.el != nil && dr.Changed[p.Name][s.el.Index] {
				// Changed since the previous revision: a dashed box round
				// the element and its labels.
				add(l, Shape{Kind: ShapeRect, P: []float64{cx - 6, yc - 4.8, 12, bandHeight - yc + 4.4}, Stroke: 0.25, Dash: Dashed, Fill: -1})
			}
		}
		if s.row != nil {
			add(l, stubs(pb, s, own, cx, yc, escaping, hb)...)
		}
	}
	return append(bands, lines...)
}

// place is where a stop is drawn: its line and its slot on the line.
type place struct{ line, col int }

// indexOfLineStart is the first stop placed on line l.
func indexOfLineStart(at []place, l int) int {
	for i, p := range at {
		if p.line == l {
			return i
		}
	}
	return len(at) - 1
}

// pathStops lists a beam's stops: where it comes from, every element it
// meets, and how it ends.
func pathStops(pb *budget.PathBudget, hb *budget.Budget) []stop {
	p := pb.Path
	var first stop
	switch {
	case pb.Combiner != nil:
		first = stop{glyph: "join", label: fmt.Sprintf("joins at combiner %q", pb.Combiner.Label())}
		for _, q := range hb.Paths {
			if q.Path.IntoPath == p && q.Path.IntoPort == pb.Combiner {
				for _, b := range q.Beams() {
					if b.Laser == pb.Laser {
						first.label += fmt.Sprintf(" from path %q", q.Path.Name)
					}
				}
			}
		}
	case p.Parent != nil:
		first = stop{glyph: "port", label: fmt.Sprintf("from the other port of %q on path %q", p.ParentPort.Label(), p.Parent.Name)}
	default:
		first = stop{glyph: "source", label: fmt.Sprintf("from the laser %q", pb.Laser.Name)}
	}
	if pb.IsJoined() && pb.Combiner == nil {
		first.label = fmt.Sprintf("laser %q travelling with path %q's beam", pb.Laser.Name, p.Name)
	}
	stops := []stop{first}
	clouds := map[string]bool{}
	for k := range pb.Rows {
		r := &pb.Rows[k]
		el := r.Element
		s := stop{glyph: string(el.Type), label: fmt.Sprintf("%d %s", el.Index, el.Label()), el: el, row: r}
		if el.Type == setup.TypeAtoms && el.Cloud != "" {
			clouds[el.Cloud] = true
		}
		if el.Type == setup.TypeMirror && returnsToCloud(p, el.Index, clouds) {
			s.fold = true
		}
		stops = append(stops, s)
	}
	switch {
	case p.IntoPath != nil && pb.Combiner == nil:
		stops = append(stops, stop{glyph: "into", label: fmt.Sprintf("into %q on %q", p.IntoPort.Label(), p.IntoPath.Name)})
	case pb.OpenEnd:
		stops = append(stops, stop{glyph: "open_end", label: "open end"})
	}
	return stops
}

// returnsToCloud reports whether an atoms element after the mirror at
// index i of path p drives a cloud that one before it drove: the mirror
// sends the beam back (a retro-reflection).
func returnsToCloud(p *setup.Path, i int, before map[string]bool) bool {
	for _, e := range p.Elements[i:] {
		if e.Type == setup.TypeAtoms && before[e.Cloud] {
			return true
		}
	}
	return false
}

// segmentStyle gives the dash of the segment arriving at stop i+1 (from
// its access) and its eye-exposure ratio (0 where the segment is not open).
func segmentStyle(pb *budget.PathBudget, i int, ratio map[int]float64) (Dash, float64) {
	if i >= len(pb.Segments) {
		return Solid, 0
	}
	s := pb.Segments[i]
	switch s.Access {
	case setup.AccessEnclosed:
		return Dashed, 0
	case setup.AccessVacuum:
		return Dotted, 0
	}
	return Solid, ratio[s.After]
}

// stubs draws what leaves the path at an element (mirror leakage, other
// AOM orders, a combiner's rejected light, a splitter port no path
// follows), a splitter port a path follows, and the beams that join at a
// combiner.
func stubs(pb *budget.PathBudget, s stop, own *budget.PathBudget, cx, cy float64, escaping map[*setup.Element]float64, hb *budget.Budget) []Shape {
	var out []Shape
	up := func(label string, w float64) {
		x2, y2 := cx+3.2, cy-5.2
		out = append(out, Shape{Kind: ShapeLine, P: []float64{cx + 0.8, cy - 1.6, x2, y2}, Stroke: w, Fill: -1},
			arrowHead(cx+0.8, cy-1.6, x2, y2),
			text(x2+0.4, y2-0.6, noteSize, "start", fit(label, slotPitch-1.5, noteSize)))
	}
	for _, l := range s.row.Losses {
		if !budget.EscapingLoss(l.Kind) && l.Kind != budget.LossSplitterPort {
			continue
		}
		what := map[string]string{budget.LossMirror: "leak", budget.LossDiffraction: "orders", budget.LossCombiner: "rejected", budget.LossSplitterPort: "unused port"}[l.Kind]
		up(what, bandStroke[RatioBand(escaping[s.el])])
	}
	if s.el.Type == setup.TypeSplitter {
		for _, q := range hb.Paths {
			if q.Path.ParentPort == s.el && q.Path.Parent == pb.Path {
				up(fmt.Sprintf("to %q", q.Path.Name), bandStroke[0])
			}
		}
	}
	if s.el.Type == setup.TypeCombiner {
		for _, q := range own.Beams() {
			if q.Combiner == s.el && q != pb {
				// Joining beams come in from above, named over the
				// stubs of light leaving (their wavelengths are in the
				// path's heading).
				out = append(out, Shape{Kind: ShapeLine, P: []float64{cx - 1.2, cy - 6.4, cx - 1.2, cy - 2.2}, Stroke: bandStroke[0], Fill: -1},
					arrowHead(cx-1.2, cy-6.4, cx-1.2, cy-2.2),
					text(cx-1.2, cy-7.4, noteSize, "middle", fit("+ "+q.Laser.Name, slotPitch-4, noteSize)))
			}
		}
	}
	return out
}

// arrowHead is a small filled triangle at (x2, y2) pointing away from
// (x1, y1).
func arrowHead(x1, y1, x2, y2 float64) Shape {
	dx, dy := x2-x1, y2-y1
	n := math.Hypot(dx, dy)
	ux, uy := dx/n, dy/n
	const l, w = 1.2, 0.5
	return Shape{Kind: ShapePolygon, P: []float64{x2, y2, x2 - l*ux + w*uy, y2 - l*uy - w*ux, x2 - l*ux - w*uy, y2 - l*uy + w*ux}, Fill: 0}
}

// chevron is an open ">" (dir 1) or "<" (dir −1) where a beam runs off
// one line and on at the next.
func chevron(x, y, dir float64) Shape {
	return Shape{Kind: ShapeLine, P: []float64{x - 0.8*dir, y - 1.2, x + 0.4*dir, y, x - 0.8*dir, y + 1.2}, Stroke: 0.3, Fill: -1}
}

func text(x, y, size float64, anchor, s string) Shape {
	return Shape{Kind: ShapeText, P: []float64{x, y}, Fill: 0, Text: s, Size: size, Anchor: anchor}
}

// fit shortens a label to the width it has, mm, at size pt, ending it with
// "…": a character of the Go font is at most about 0.6 em wide.
// fitLines breaks s at spaces into at most n lines of width (mm) at size
// (pt); the last line is cut with "…" only when the text still does not
// fit.
func fitLines(s string, width, size float64, n int) []string {
	max := int(width / (0.6 * size * 0.3528))
	var lines []string
	words := strings.Fields(s)
	for len(words) > 0 && len(lines) < n {
		line := words[0]
		words = words[1:]
		for len(words) > 0 && utf8.RuneCountInString(line)+1+utf8.RuneCountInString(words[0]) <= max {
			line += " " + words[0]
			words = words[1:]
		}
		lines = append(lines, line)
	}
	if len(words) > 0 {
		lines[len(lines)-1] = fit(lines[len(lines)-1]+" "+strings.Join(words, " "), width, size)
	}
	for i, ln := range lines {
		lines[i] = fit(ln, width, size)
	}
	return lines
}

func fit(s string, width, size float64) string {
	max := int(width / (0.6 * size * 0.3528))
	if utf8.RuneCountInString(s) <= max {
		return s
	}
	r := []rune(s)
	return strings.TrimSpace(string(r[:max-1])) + "…"
}

// glyph draws the mark of an element type centred at (x, y): our own small
// set, each told apart by outline and fill alone so that grey-scale print
// keeps them apart. lower, for a retro mirror, is how far below its return
// line runs.
func glyph(kind string, el *setup.Element, x, y, lower float64) []Shape {
	const h = glyphHalf
	line := func(w float64, p ...float64) Shape { return Shape{Kind: ShapeLine, P: p, Stroke: w, Fill: -1} }
	switch kind {
	case "source":
		return []Shape{{Kind: ShapeRect, P: []float64{x - 3, y - 2, 5, 4}, Stroke: 0.3, Fill: 0.25},
			{Kind: ShapePolygon, P: []float64{x + 2, y - 1.2, x + 3, y, x + 2, y + 1.2}, Fill: 0}}
	case "port":
		return []Shape{line(0.3, x-1.5, y-2, x-1.5, y+2), line(0.3, x-1.5, y, x+h, y)}
	case "join":
		return []Shape{line(0.3, x-2, y-2, x+0.8, y), arrowHead(x-2, y-2, x+0.8, y)}
	case "open_end":
		return []Shape{{Kind: ShapePolygon, P: []float64{x - h, y - 1.6, x + 0.5, y, x - h, y + 1.6}, Stroke: 0.3, Fill: 1},
			line(0.3, x+1.3, y-2.2, x+1.3, y+2.2)}
	case "into":
		return []Shape{{Kind: ShapePolygon, P: []float64{x - h, y - 1.6, x + 0.5, y, x - h, y + 1.6}, Fill: 0}}
	}
	switch setup.ElementType(kind) {
	case setup.TypeLens:
		if el != nil && el.FocalLength < 0 {
			return []Shape{{Kind: ShapePolygon, P: []float64{x - 1.2, y - h, x + 1.2, y - h, x + 0.4, y, x + 1.2, y + h, x - 1.2, y + h, x - 0.4, y}, Stroke: 0.3, Fill: 1}}
		}
		return []Shape{{Kind: ShapeEllipse, P: []float64{x, y, 0.9, h}, Stroke: 0.3, Fill: 1}}
	case setup.TypeCylLens:
		return []Shape{{Kind: ShapePolygon, P: []float64{x - 0.9, y - h, x + 0.2, y - h, x + 0.9, y, x + 0.2, y + h, x - 0.9, y + h}, Stroke: 0.3, Fill: 1},
			text(x, y-h-0.6, noteSize, "middle", el.Plane)}
	case setup.TypeMirror:
		if lower > 0 {
			// A retro mirror, tall enough to meet both passes.
			out := []Shape{line(0.6, x, y-h, x, y+lower+h)}
			for t := y - h + 0.8; t < y+lower+h; t += 1.6 {
				out = append(out, line(0.15, x, t, x+0.9, t-0.9))
			}
			return out
		}
		return []Shape{line(0.6, x-1.6, y+h, x+1.6, y-h), line(0.15, x-1.0, y+h+0.4, x+2.2, y-h+0.4)}
	case setup.TypeWindow:
		return []Shape{{Kind: ShapeRect, P: []float64{x - 0.6, y - h, 1.2, 2 * h}, Stroke: 0.25, Fill: 0.85}}
	case setup.TypeAOM:
		out := []Shape{{Kind: ShapeRect, P: []float64{x - 2.2, y - 1.6, 4.4, 3.2}, Stroke: 0.3, Fill: 1}}
		for _, dx := range []float64{-1, 0, 1} {
			out = append(out, line(0.15, x+dx, y-1.1, x+dx, y+1.1))
		}
		return out
	case setup.TypeFilter:
		return []Shape{{Kind: ShapeRect, P: []float64{x - 0.8, y - h, 1.6, 2 * h}, Stroke: 0.25, Fill: 0.45}}
	case setup.TypeAperture:
		return []Shape{line(0.5, x, y-h, x, y-0.9), line(0.5, x, y+0.9, x, y+h)}
	case setup.TypeSplitter:
		return []Shape{{Kind: ShapeRect, P: []float64{x - 2, y - 2, 4, 4}, Stroke: 0.3, Fill: 1}, line(0.3, x-2, y+2, x+2, y-2)}
	case setup.TypeCombiner:
		return []Shape{{Kind: ShapeRect, P: []float64{x - 2, y - 2, 4, 4}, Stroke: 0.3, Fill: 0.85}, line(0.3, x-2, y-2, x+2, y+2)}
	case setup.TypeFiber:
		return []Shape{{Kind: ShapeEllipse, P: []float64{x, y, 2, 2}, Stroke: 0.3, Fill: 1}, {Kind: ShapeEllipse, P: []float64{x, y, 1.1, 1.1}, Stroke: 0.3, Fill: -1}}
	case setup.TypeAtoms:
		return []Shape{{Kind: ShapeEllipse, P: []float64{x, y, 2.2, 1.5}, Stroke: 0.2, Fill: 0.6}}
	case setup.TypeDump:
		return []Shape{{Kind: ShapeRect, P: []float64{x - 1.2, y - h, 2.8, 2 * h}, Fill: 0}}
	}
	return []Shape{{Kind: ShapeRect, P: []float64{x - 2, y - 2, 4, 4}, Stroke: 0.3, Fill: 1}, text(x, y+1.2, noteSize, "middle", "?")}
}

// Legend draws the key: the line patterns, the ratio bands and every glyph
// with its element type.
func Legend() *Drawing {
	d := &Drawing{Title: "Key", Width: diagramWidth}
	y := 5.0
	xs := []float64{0, 44, 88, 132}
	for i, c := range []struct {
		dash Dash
		name string
	}{{Solid, "open"}, {Dashed, "enclosed"}, {Dotted, "in vacuum"}} {
		d.Shapes = append(d.Shapes, Shape{Kind: ShapeLine, P: []float64{xs[i], y, xs[i] + 12, y}, Stroke: 0.4, Dash: c.dash, Fill: -1},
			text(xs[i]+14, y+1.2, labelSize+0.5, "start", c.name+" segment"))
	}
	y += 7
	for b := range bandStroke {
		d.Shapes = append(d.Shapes, Shape{Kind: ShapeLine, P: []float64{xs[b], y, xs[b] + 12, y}, Stroke: bandStroke[b], Fill: -1},
			text(xs[b]+14, y+1.2, labelSize+0.5, "start", bandNames[b]))
	}
	y += 5
	d.Shapes = append(d.Shapes, text(0, y+1, labelSize, "start", "open segments above the eye MPE carry their ratio (×N, summed where beams share a segment); arrows above an element are light leaving"),
		text(0, y+1+labelLine+0.4, labelSize, "start", "the path; under each element: its number, type or name, position along the path, and the hazard zone at a dump (NOHD at an open end);"),
		text(0, y+1+2*labelLine+0.8, labelSize, "start", "a dashed box marks an element added or changed since the previous revision (report --since)"))
	y += 14
	kinds := []string{"source", "port", "join", "into", "open_end"}
	for _, k := range setup.Kinds {
		kinds = append(kinds, string(k.Type))
	}
	names := map[string]string{"source": "laser", "port": "splitter's other port", "join": "joins at a combiner", "into": "into a combiner", "open_end": "open end"}
	per := 6
	for i, k := range kinds {
		cx := 4 + float64(i%per)*29
		cy := y + float64(i/per)*11
		el := &setup.Element{Type: setup.ElementType(k), FocalLength: 1, Plane: "x"}
		d.Shapes = append(d.Shapes, glyph(k, el, cx, cy, 0)...)
		name := names[k]
		if name == "" {
			name = strings.ReplaceAll(k, "_", " ")
		}
		d.Shapes = append(d.Shapes, text(cx+4, cy+1.2, labelSize, "start", name))
	}
	d.Height = y + float64((len(kinds)+per-1)/per)*11
	return d
}
