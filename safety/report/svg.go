package report

import (
	"bufio"
	"encoding/xml"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
)

// Drawings lists the drawings of the document, in order (the key, then one
// or more per laser).
func (d *Document) Drawings() []*Drawing {
	var out []*Drawing
	for _, s := range d.Sections {
		for _, b := range s.Blocks {
			if b.Drawing != nil {
				out = append(out, b.Drawing)
			}
		}
	}
	return out
}

// svgTitleHeight is the room above each drawing for its title, mm;
// svgMargin the white margin round the whole, mm.
const (
	svgTitleHeight = 7.0
	svgMargin      = 8.0
)

// WriteSVG writes drawings one under another as one SVG document whose
// user unit is the millimetre, each under its title: the same shapes the
// PDF draws, on a white background with a margin, the document titled
// title (<title>, and a heading line above the drawings).
func WriteSVG(w io.Writer, title string, ds []*Drawing) error {
	width, height := 0.0, svgTitleHeight+2
	for _, d := range ds {
		width = max(width, d.Width)
		height += svgTitleHeight + d.Height + 4
	}
	width += 2 * svgMargin
	height += 2 * svgMargin
	bw := bufio.NewWriter(w)
	fmt.Fprintf(bw, `<?xml version="1.0" encoding="UTF-8"?>
<svg xmlns="http://www.w3.org/2000/svg" width="%smm" height="%smm" viewBox="0 0 %s %s" font-family="Go, sans-serif">
<title>%s</title>
<rect x="0" y="0" width="%s" height="%s" fill="white"/>
<text x="%s" y="%s" font-size="%s" font-weight="bold">%s</text>
`, num(width), num(height), num(width), num(height), esc(title), num(width), num(height), num(svgMargin), num(svgMargin+5), num(11*ptMM), esc(title))
	y := svgMargin + svgTitleHeight + 2
	for _, d := range ds {
		fmt.Fprintf(bw, `<text x="%s" y="%s" font-size="%s" font-weight="bold">%s</text>
<g transform="translate(%s %s)">
`, num(svgMargin), num(y+4.5), num(8.5*ptMM), esc(d.Title), num(svgMargin), num(y+svgTitleHeight))
		for _, s := range d.Shapes {
			writeShapeSVG(bw, s)
		}
		bw.WriteString("</g>\n")
		y += svgTitleHeight + d.Height + 4
	}
	bw.WriteString("</svg>\n")
	return bw.Flush()
}

// WriteInlineSVG writes one drawing as an <svg> element for an HTML page
// (no XML declaration): the same shapes, its user unit the millimetre,
// scaled to the page's width, titled by the drawing's title.
func WriteInlineSVG(w io.Writer, d *Drawing) error {
	bw := bufio.NewWriter(w)
	fmt.Fprintf(bw, `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 %s %s" width="100%%" role="img" font-family="Go, sans-serif"><title>%s</title>
<rect x="0" y="0" width="%s" height="%s" fill="white"/>
`, num(d.Width), num(d.Height), esc(d.Title), num(d.Width), num(d.Height))
	for _, s := range d.Shapes {
		writeShapeSVG(bw, s)
	}
	bw.WriteString("</svg>")
	return bw.Flush()
}

// ptMM is one typographic point in mm.
const ptMM = 0.3528

func writeShapeSVG(w *bufio.Writer, s Shape) {
	paint := func() string {
		var b strings.Builder
		if s.Fill >= 0 {
			g := int(s.Fill*255 + 0.5)
			fmt.Fprintf(&b, ` fill="rgb(%d,%d,%d)"`, g, g, g)
		} else {
			b.WriteString(` fill="none"`)
		}
		if s.Stroke > 0 {
			fmt.Fprintf(&b, ` stroke="black" stroke-width="%s"`, num(s.Stroke))
			switch s.Dash {
			case Dashed:
				b.WriteString(` stroke-dasharray="1.6 0.9"`)
			case Dotted:
				b.WriteString(` stroke-dasharray="0.01 0.9" stroke-linecap="round"`)
			}
		}
		return b.String()
	}
	points := func() string {
		var b strings.Builder
		for i := 0; i+1 < len(s.P); i += 2 {
			if i > 0 {
				b.WriteByte(' ')
			}
			b.WriteString(num(s.P[i]) + "," + num(s.P[i+1]))
		}
		return b.String()
	}
	switch s.Kind {
	case ShapeLine:
		fmt.Fprintf(w, "<polyline points=\"%s\"%s/>\n", points(), paint())
	case ShapePolygon:
		fmt.Fprintf(w, "<polygon points=\"%s\"%s/>\n", points(), paint())
	case ShapeRect:
		fmt.Fprintf(w, "<rect x=\"%s\" y=\"%s\" width=\"%s\" height=\"%s\"%s/>\n", num(s.P[0]), num(s.P[1]), num(s.P[2]), num(s.P[3]), paint())
	case ShapeEllipse:
		fmt.Fprintf(w, "<ellipse cx=\"%s\" cy=\"%s\" rx=\"%s\" ry=\"%s\"%s/>\n", num(s.P[0]), num(s.P[1]), num(s.P[2]), num(s.P[3]), paint())
	case ShapeText:
		fmt.Fprintf(w, "<text x=\"%s\" y=\"%s\" font-size=\"%s\" text-anchor=\"%s\">%s</text>\n", num(s.P[0]), num(s.P[1]), num(s.Size*ptMM), s.Anchor, esc(s.Text))
	}
}

// num writes a coordinate rounded to 0.01 mm.
func num(v float64) string { return strconv.FormatFloat(math.Round(v*100)/100, 'f', -1, 64) }

// esc escapes text for XML.
func esc(s string) string {
	var b strings.Builder
	_ = xml.EscapeText(&b, []byte(s)) // a strings.Builder does not fail
	return b.String()
}
