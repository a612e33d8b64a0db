package pdf

import (
	"codeberg.org/go-pdf/fpdf"

	"beamledger/safety/report"
)

// drawing draws a schematic with its title, whole on one page.
func (w *writer) drawing(d *report.Drawing) {
	f := w.f
	w.need(d.Height + 9)
	top := f.GetY() + 2
	f.SetFont(font, "B", 8.5)
	f.Text(marginLeft, top+3, d.Title)
	ox, oy := marginLeft, top+5
	f.SetDrawColor(0, 0, 0)
	for _, s := range d.Shapes {
		pt := func(i int) (float64, float64) { return ox + s.P[i], oy + s.P[i+1] }
		style := ""
		if s.Stroke > 0 {
			style = "D"
			f.SetLineWidth(s.Stroke)
		}
		if s.Fill >= 0 {
			g := int(s.Fill*255 + 0.5)
			f.SetFillColor(g, g, g)
			f.SetTextColor(g, g, g)
			style = "F" + style
		}
		switch s.Dash {
		case report.Dashed:
			f.SetDashPattern([]float64{1.6, 0.9}, 0)
		case report.Dotted:
			f.SetLineCapStyle("round")
			f.SetDashPattern([]float64{0.01, 0.9}, 0)
		}
		switch s.Kind {
		case report.ShapeLine:
			x, y := pt(0)
			f.MoveTo(x, y)
			for i := 2; i+1 < len(s.P); i += 2 {
				x, y = pt(i)
				f.LineTo(x, y)
			}
			f.DrawPath("D")
		case report.ShapePolygon:
			var ps []fpdf.PointType
			for i := 0; i+1 < len(s.P); i += 2 {
				x, y := pt(i)
				ps = append(ps, fpdf.PointType{X: x, Y: y})
			}
			f.Polygon(ps, style)
		case report.ShapeRect:
			x, y := pt(0)
			f.Rect(x, y, s.P[2], s.P[3], style)
		case report.ShapeEllipse:
			x, y := pt(0)
			f.Ellipse(x, y, s.P[2], s.P[3], 0, style)
		case report.ShapeText:
			f.SetFont(font, "", s.Size)
			x, y := pt(0)
			switch s.Anchor {
			case "middle":
				x -= f.GetStringWidth(s.Text) / 2
			case "end":
				x -= f.GetStringWidth(s.Text)
			}
			f.Text(x, y, s.Text)
		}
		f.SetDashPattern(nil, 0)
		f.SetLineCapStyle("butt")
		f.SetTextColor(0, 0, 0)
	}
	f.SetLineWidth(0.2)
	f.SetY(oy + d.Height + 3)
}
