package report

import (
	"beamledger/safety/view"
	"fmt"
	"io"
	"math"
	"strings"
)

// WriteText writes the model as plain text: the form golden tests read.
// Plots are summarised by their labels, series extents and markers.
func (d *Document) WriteText(w io.Writer) error {
	var b strings.Builder
	fmt.Fprintf(&b, "TITLE %s\nsite: %s\nrevision: %s\nprepared by: %s\ndate: %s\ntool: beamledger %s\nsetup: %s\nsetup SHA-256: %s\n\nSUMMARY\n%s\n",
		d.Title, d.Site, d.Revision, d.PreparedBy, d.Date, d.ToolVersion, d.SetupFile, d.SetupSHA256, d.Summary)
	for i, s := range d.Sections {
		fmt.Fprintf(&b, "\n%d %s\n", i+1, strings.ToUpper(s.Heading))
		for _, bl := range s.Blocks {
			switch {
			case bl.Subheading != "":
				fmt.Fprintf(&b, "-- %s\n", bl.Subheading)
			case bl.Paragraph != "":
				fmt.Fprintf(&b, "%s\n", bl.Paragraph)
			case bl.Bullets != nil:
				for _, x := range bl.Bullets {
					if n, ok := strings.CutPrefix(x, Nested); ok {
						fmt.Fprintf(&b, "    - %s\n", n)
						continue
					}
					fmt.Fprintf(&b, "  * %s\n", x)
				}
			case bl.Table != nil:
				fmt.Fprintf(&b, "  | %s |\n", strings.Join(bl.Table.Header, " | "))
				for _, r := range bl.Table.Rows {
					fmt.Fprintf(&b, "  | %s |\n", strings.Join(r, " | "))
				}
			case bl.Plot != nil:
				writePlotText(&b, bl.Plot)
			case bl.Drawing != nil:
				writeDrawingText(&b, bl.Drawing)
			case bl.SignOff != nil:
				for _, role := range bl.SignOff {
					fmt.Fprintf(&b, "  %s: name ______ signature ______ date ______\n", role)
				}
			case bl.Record != nil:
				for i, l := range bl.Record {
					fmt.Fprintf(&b, "  %s %s\n", RecordMark(i+1), l)
				}
			}
		}
	}
	_, err := io.WriteString(w, b.String())
	return err
}

func writePlotText(b *strings.Builder, p *view.Plot) {
	fmt.Fprintf(b, "  [plot] %s; x: %s; y: %s", p.Title, p.XLabel, p.YLabel)
	if p.LogX || p.LogY {
		fmt.Fprintf(b, " (log x %v, log y %v)", p.LogX, p.LogY)
	}
	b.WriteString("\n")
	for _, s := range p.Series {
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, y := range s.Y {
			lo, hi = math.Min(lo, y), math.Max(hi, y)
		}
		style := "solid"
		if s.Dashed {
			style = "dashed"
		}
		fmt.Fprintf(b, "    series %q (%s): %d points, x %.4g to %.4g, y %.4g to %.4g\n", s.Name, style, len(s.X), s.X[0], s.X[len(s.X)-1], lo, hi)
	}
	for _, m := range p.Markers {
		fmt.Fprintf(b, "    marker %q at x = %.4g\n", m.Label, m.X)
	}
	for _, bar := range p.Bars {
		fmt.Fprintf(b, "    bar %q: %.4g\n", bar.Label, bar.Value)
	}
	for _, h := range p.HLines {
		fmt.Fprintf(b, "    line %q at y = %.4g\n", h.Label, h.Y)
	}
}

// writeDrawingText lists a drawing's shapes, one per line, coordinates to
// 0.1 mm: the drawing commands the PDF and the SVG carry out.
func writeDrawingText(b *strings.Builder, d *Drawing) {
	fmt.Fprintf(b, "  [drawing] %s (%.1f × %.1f mm, %d shapes)\n", d.Title, d.Width, d.Height, len(d.Shapes))
	for _, s := range d.Shapes {
		b.WriteString("    ")
		b.WriteString(string(s.Kind))
		for i := 0; i+1 < len(s.P); i += 2 {
			fmt.Fprintf(b, " %.1f,%.1f", s.P[i], s.P[i+1])
		}
		if s.Stroke > 0 {
			fmt.Fprintf(b, " stroke %.2f", s.Stroke)
		}
		if s.Dash != Solid {
			fmt.Fprintf(b, " %s", s.Dash)
		}
		if s.Fill >= 0 && s.Kind != ShapeText && s.Kind != ShapeLine {
			fmt.Fprintf(b, " fill %.2f", s.Fill)
		}
		if s.Kind == ShapeText {
			fmt.Fprintf(b, " %.1fpt %s %q", s.Size, s.Anchor, s.Text)
		}
		b.WriteString("\n")
	}
}
