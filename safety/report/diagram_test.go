package report

import (
	"bytes"
	"encoding/xml"
	"fmt"
	"io"
	"math"
	"slices"
	"strings"
	"testing"
	"unicode/utf8"

	"beamledger/budget/setup"
	"beamledger/budget/units"
	"beamledger/safety"
	"beamledger/safety/safetytest"
	"beamledger/safety/view"
)

// The bands of the legend: at most 1, 10², 10⁴, above.
func TestRatioBand(t *testing.T) {
	for _, c := range []struct {
		r    float64
		band int
	}{{0, 0}, {1, 0}, {1.0001, 1}, {100, 1}, {100.01, 2}, {1e4, 2}, {1.0001e4, 3}, {1e9, 3}} {
		if got := RatioBand(c.r); got != c.band {
			t.Errorf("RatioBand(%g) = %d, want %d", c.r, got, c.band)
		}
	}
}

// shapesWith lists the shapes of kind k whose text contains s.
func shapesWith(ds []*Drawing, k ShapeKind, s string) []Shape {
	var out []Shape
	for _, d := range ds {
		for _, sh := range d.Shapes {
			if sh.Kind == k && strings.Contains(sh.Text, s) {
				out = append(out, sh)
			}
		}
	}
	return out
}

// The demo: one drawing per laser, every element labelled with its number,
// segments styled by access and weighted by the exposure ratio the hazards
// found.
func TestDiagramsOfDemo(t *testing.T) {
	a, _ := safetytest.EvaluateFile(t, "../../testdata/examples/table-c.toml")
	ds := Diagrams(view.BuildDrawn(a))
	if len(ds) != 2 || !strings.Contains(ds[0].Title, `"probe-amp", 780.24 nm`) || !strings.Contains(ds[1].Title, `"trap", 1064.00 nm`) {
		t.Fatalf("drawings %d: %v", len(ds), titles(ds))
	}
	for _, pb := range a.HazardBudget.Paths {
		for _, r := range pb.Rows {
			if len(shapesWith(ds, ShapeText, fmt.Sprintf("%d %s", r.Element.Index, r.Element.Label()))) == 0 {
				t.Errorf("path %q: element %d (%s) has no label", pb.Path.Name, r.Element.Index, r.Element.Label())
			}
		}
	}
	// The first open segment of "drive" reaches 2700 × the eye MPE (band
	// ≤ 10⁴); the trap's first segment is enclosed, the chamber's in vacuum.
	var first, dashed, dotted bool
	for _, s := range ds[0].Shapes {
		if s.Kind == ShapeLine && s.Stroke == bandStroke[2] && s.Dash == Solid {
			first = true
		}
	}
	for _, s := range ds[1].Shapes {
		dashed = dashed || s.Kind == ShapeLine && s.Dash == Dashed
		dotted = dotted || s.Kind == ShapeLine && s.Dash == Dotted
	}
	if !first || !dashed || !dotted {
		t.Errorf("segment styles: band-2 open %v, enclosed %v, vacuum %v", first, dashed, dotted)
	}
	for _, want := range []string{"×2700", "orders", "leak", `to "monitor"`} {
		if len(shapesWith(ds, ShapeText, want)) == 0 {
			t.Errorf("no %q in the drawing", want)
		}
	}
}

// The merged table: a beam joining at a combiner is named there, a path
// into a combiner ends with an arrow, and the lattice's retro mirror spans
// the forward and the return line.
func TestDiagramsOfMergedTable(t *testing.T) {
	a, _ := safetytest.EvaluateFile(t, "../../testdata/examples/table-d.toml")
	ds := Diagrams(view.BuildDrawn(a))
	for _, want := range []string{"+ repump", `laser "repump" (780.23 nm) joins at "pbs"`, `into "pbs" on "cool"`, "return pass", `joins at combiner "pbs" from path "repump"`} {
		if len(shapesWith(ds, ShapeText, want)) == 0 {
			t.Errorf("no %q in the drawing", want)
		}
	}
	var tall bool
	for _, d := range ds {
		if !strings.Contains(d.Title, `"lattice"`) {
			continue
		}
		for _, s := range d.Shapes {
			if s.Kind == ShapeLine && s.Stroke == 0.6 && len(s.P) == 4 && s.P[0] == s.P[2] && s.P[3]-s.P[1] > bandHeight {
				tall = true
			}
		}
	}
	if !tall {
		t.Error("the lattice's retro mirror does not span both passes")
	}
}

// A long path wraps onto more lines and more drawings, none taller than a
// page allows; every shape of every example stays inside its drawing and
// no two texts overlap.
func TestDiagramsFitAndStayLegible(t *testing.T) {
	var b strings.Builder
	b.WriteString("[[laser]]\nname = \"l\"\nwavelength = \"1064 nm\"\npower = \"1 W\"\nwaist = \"1 mm\"\n[[path]]\nname = \"long\"\nfrom = \"l\"\n")
	for i := 1; i <= 200; i++ {
		fmt.Fprintf(&b, "[[path.element]]\ntype = \"window\"\nname = \"w%d\"\nat = \"%d mm\"\ntransmission = 0.999\n", i, 10*i)
	}
	a := safetytest.Evaluate(t, "long.toml", []byte(b.String()))
	ds := Diagrams(view.BuildDrawn(a))
	if len(ds) < 2 || !strings.HasSuffix(ds[1].Title, "(continued)") {
		t.Fatalf("200 elements: %d drawings %v", len(ds), titles(ds))
	}
	if n := len(shapesWith(ds, ShapeText, "w200")); n != 1 {
		t.Errorf("the last element is labelled %d times", n)
	}
	all := append([]*Drawing{Legend()}, ds...)
	// Every shipped example, and the generated lab of 2000 elements (merges,
	// retro mirrors, long paths).
	for _, name := range []string{"examples/table-c", "examples/table-d", "examples/splitter-tree", "examples/clipped-telescope", "examples/ablation-pulse", "examples/elliptical-diode", "examples/weak-probe", "examples/table-c-rev4", "scale/lab-2000"} {
		a, _ := safetytest.EvaluateFile(t, "../../testdata/"+name+".toml")
		all = append(all, Diagrams(view.BuildDrawn(a))...)
	}
	for _, d := range all {
		if d.Height > maxDrawingTall+bandHeight {
			t.Errorf("%s: %.1f mm tall", d.Title, d.Height)
		}
		var boxes [][4]float64
		for _, s := range d.Shapes {
			x0, y0, x1, y1 := extent(s)
			if x0 < -0.5 || y0 < -0.5 || x1 > d.Width+0.5 || y1 > d.Height+0.5 {
				t.Errorf("%s: %s %q at %.1f,%.1f–%.1f,%.1f is outside %.0f × %.1f mm", d.Title, s.Kind, s.Text, x0, y0, x1, y1, d.Width, d.Height)
			}
			if s.Kind == ShapeText && s.Size < 6 {
				// Print stays legible: no drawing text under 6 pt.
				t.Errorf("%s: text %q at %.1f pt", d.Title, s.Text, s.Size)
			}
			if s.Kind == ShapeText {
				for _, o := range boxes {
					if x0 < o[2] && o[0] < x1 && y0 < o[3] && o[1] < y1 {
						t.Errorf("%s: text %q at %.1f,%.1f overlaps another at %.1f,%.1f", d.Title, s.Text, x0, y1, o[0], o[3])
					}
				}
				boxes = append(boxes, [4]float64{x0, y0, x1, y1})
			}
		}
	}
}

// extent is a shape's box; a text's is its width at 0.5 em a character
// (the Go font's average) by its cap height.
func extent(s Shape) (x0, y0, x1, y1 float64) {
	switch s.Kind {
	case ShapeRect:
		return s.P[0], s.P[1], s.P[0] + s.P[2], s.P[1] + s.P[3]
	case ShapeEllipse:
		return s.P[0] - s.P[2], s.P[1] - s.P[3], s.P[0] + s.P[2], s.P[1] + s.P[3]
	case ShapeText:
		w := float64(utf8.RuneCountInString(s.Text)) * 0.5 * s.Size * ptMM
		h := 0.7 * s.Size * ptMM
		x := s.P[0]
		switch s.Anchor {
		case "middle":
			x -= w / 2
		case "end":
			x -= w
		}
		return x, s.P[1] - h, x + w, s.P[1]
	}
	x0, y0, x1, y1 = math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	for i := 0; i+1 < len(s.P); i += 2 {
		x0, x1 = math.Min(x0, s.P[i]), math.Max(x1, s.P[i])
		y0, y1 = math.Min(y0, s.P[i+1]), math.Max(y1, s.P[i+1])
	}
	return
}

func titles(ds []*Drawing) []string {
	var out []string
	for _, d := range ds {
		out = append(out, d.Title)
	}
	return out
}

// The SVG is well-formed XML with one element per shape and a title per
// drawing, a <title>, a white background and the labels (positions
// included).
func TestSVG(t *testing.T) {
	a, _ := safetytest.EvaluateFile(t, "../../testdata/examples/table-d.toml")
	ds := append([]*Drawing{Legend()}, Diagrams(view.BuildDrawn(a))...)
	ds[1].Title += " <&> \"quoted\"" // escaped, not breaking the XML
	var buf bytes.Buffer
	if err := WriteSVG(&buf, "test drawing", ds); err != nil {
		t.Fatal(err)
	}
	dec := xml.NewDecoder(&buf)
	counts := map[string]int{}
	var texts []string
	var root string
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("the SVG is not well-formed XML: %v", err)
		}
		switch e := tok.(type) {
		case xml.StartElement:
			if root == "" {
				root = e.Name.Space + " " + e.Name.Local
			}
			counts[e.Name.Local]++
		case xml.CharData:
			texts = append(texts, string(e))
		}
	}
	if root != "http://www.w3.org/2000/svg svg" {
		t.Errorf("root element %q", root)
	}
	// One heading per drawing and the document's, one background
	// rectangle, one title.
	want := map[string]int{"text": len(ds) + 1, "rect": 1, "title": 1}
	for _, d := range ds {
		for _, s := range d.Shapes {
			want[map[ShapeKind]string{ShapeLine: "polyline", ShapePolygon: "polygon", ShapeRect: "rect", ShapeEllipse: "ellipse", ShapeText: "text"}[s.Kind]]++
		}
	}
	for k, n := range want {
		if counts[k] != n {
			t.Errorf("%d <%s> elements, want %d", counts[k], k, n)
		}
	}
	joined := strings.Join(texts, "|")
	for _, want := range []string{"1 aom", "+ repump", "<&> \"quoted\"", "test drawing", "at 100 mm"} {
		if !strings.Contains(joined, want) {
			t.Errorf("the SVG's text lacks %q", want)
		}
	}
}

// The glyph of every element kind is drawn, none as the unknown mark.
func TestEveryKindHasAGlyph(t *testing.T) {
	for _, k := range setup.Kinds {
		g := glyph(string(k.Type), &setup.Element{Type: k.Type, Plane: "x"}, 10, 10, 0)
		for _, s := range g {
			if s.Kind == ShapeText && s.Text == "?" {
				t.Errorf("%s has no glyph of its own", k.Type)
			}
		}
	}
}

// Any setup that loads draws: every shape has finite coordinates, the
// layout never panics, and the SVG parses.
func FuzzDiagram(f *testing.F) {
	safetytest.AddSeeds(f, "../..", "table-c", "table-d", "splitter-tree")
	f.Fuzz(func(t *testing.T, data []byte) {
		s, err := setup.Parse("fuzz.toml", data)
		if err != nil {
			return
		}
		a, err := safety.Evaluate(s)
		if err != nil {
			return
		}
		ds := Diagrams(view.BuildDrawn(a))
		for _, d := range ds {
			for _, sh := range d.Shapes {
				for _, v := range sh.P {
					if math.IsNaN(v) || math.IsInf(v, 0) {
						t.Fatalf("%s: %s with coordinate %g", d.Title, sh.Kind, v)
					}
				}
			}
		}
		var buf bytes.Buffer
		if err := WriteSVG(&buf, "test drawing", ds); err != nil {
			t.Fatal(err)
		}
		dec := xml.NewDecoder(&buf)
		for {
			if _, err := dec.Token(); err != nil {
				if err != io.EOF {
					t.Fatalf("the SVG does not parse: %v", err)
				}
				return
			}
		}
	})
}

// Under report --since the elements added or changed are boxed (dashed),
// and the others are not.
func TestChangedElementsMarked(t *testing.T) {
	a, _ := safetytest.EvaluateFile(t, "../../testdata/examples/table-c.toml")
	dr := view.BuildDrawn(a)
	boxes := func() int {
		n := 0
		for _, d := range Diagrams(dr) {
			for _, s := range d.Shapes {
				if s.Kind == ShapeRect && s.Dash == Dashed {
					n++
				}
			}
		}
		return n
	}
	if n := boxes(); n != 0 {
		t.Fatalf("%d boxes without --since", n)
	}
	dr.Changed = map[string]map[int]bool{"drive": {2: true, 4: true}}
	if n := boxes(); n != 2 {
		t.Errorf("%d boxes for two changed elements", n)
	}
}

// Every shipped example draws every path that starts at a laser, with the
// laser's class in the title, tolerances or not: the hazard budget of a
// setup with toleranced values is built on the hazards' own copy of it,
// whose lasers the drawing must follow (common practice: a drawing that
// reads "no path starts at this laser" for a laser with paths hides them
// from the officer).
func TestDiagramsDrawEveryPath(t *testing.T) {
	safetytest.ForEachExample(t, "../..", func(t *testing.T, name, path string) {
		a, _ := safetytest.EvaluateFile(t, path)
		ds := Diagrams(view.BuildDrawn(a))
		for _, p := range a.Setup.Paths {
			if len(shapesWith(ds, ShapeText, fmt.Sprintf("path %q", p.Name))) == 0 {
				t.Errorf("path %q is not drawn", p.Name)
			}
		}
		if len(shapesWith(ds, ShapeText, "no path starts at this laser")) > 0 {
			t.Errorf("a drawing says no path starts at its laser: %v", titles(ds))
		}
		for _, ll := range a.Hazards.Lasers {
			title := fmt.Sprintf("Laser %q, %s, Class %s", ll.Laser.Name, units.FormatWavelength(ll.Laser.Wavelength), ll.Class)
			if ll.Class != "" && !slices.ContainsFunc(ds, func(d *Drawing) bool { return strings.HasPrefix(d.Title, title) }) {
				t.Errorf("no drawing titled %q: %v", title, titles(ds))
			}
		}
	})
}
