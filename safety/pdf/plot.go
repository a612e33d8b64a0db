package pdf

import (
	"codeberg.org/go-pdf/fpdf"

	"math"
	"sort"

	"beamledger/safety/view"
)

const plotHeight = 64.0 // mm, frame plus labels

// axis maps data values to page coordinates, linear or logarithmic.
type axis struct {
	lo, hi float64 // data range (positive for log)
	log    bool
	p0, p1 float64 // page coordinates of lo and hi
}

func (a axis) at(v float64) float64 {
	return view.Axis{Lo: a.lo, Hi: a.hi, Log: a.log}.At(v, a.p0, a.p1)
}

// ticks are the axis's tick values (view.Axis.Ticks).
func (a axis) ticks() []float64 { return view.Axis{Lo: a.lo, Hi: a.hi, Log: a.log}.Ticks() }

// The shared plot helpers of view.
var (
	label     = view.TickLabel
	plottable = view.Plottable
	dataRange = view.DataRange
	roundTo3  = view.RoundTo3
)

func (w *writer) plot(p *view.Plot) {
	f := w.f
	w.need(plotHeight + 6)
	top := f.GetY() + 2
	f.SetFont(font, "B", 8.5)
	f.Text(marginLeft, top+3, p.Title)
	x0, x1 := marginLeft+16, marginLeft+w.textW-2
	y0, y1 := top+7, top+plotHeight-22 // frame top and bottom
	if len(p.Bars) > 0 {
		w.bars(p, x0, x1, y0, y1)
		f.SetY(top + plotHeight)
		return
	}
	var xs, ys []float64
	for _, s := range p.Series {
		xs = append(xs, s.X...)
		ys = append(ys, s.Y...)
	}
	for _, m := range p.Markers {
		xs = append(xs, m.X)
	}
	for _, h := range p.HLines {
		ys = append(ys, h.Y)
	}
	xlo, xhi := dataRange(xs, p.LogX, false)
	if !p.LogX {
		xlo = math.Min(xlo, 0)
	}
	ylo, yhi := dataRange(ys, p.LogY, true)
	ax := axis{lo: xlo, hi: xhi, log: p.LogX, p0: x0, p1: x1}
	ay := axis{lo: ylo, hi: yhi, log: p.LogY, p0: y1, p1: y0}
	// Grid, ticks and labels.
	f.SetFont(font, "", 6.5)
	f.SetLineWidth(0.1)
	f.SetDrawColor(200, 200, 200)
	for _, t := range ax.ticks() {
		x := ax.at(t)
		f.Line(x, y0, x, y1)
		s := label(t)
		f.Text(x-f.GetStringWidth(s)/2, y1+3.2, s)
	}
	w.yAxisAndFrame(ay, p.YLabel, x0, x1, y0, y1)
	f.SetFont(font, "", 7.5)
	f.Text((x0+x1)/2-f.GetStringWidth(p.XLabel)/2, y1+7, p.XLabel)
	f.ClipRect(x0, y0, x1-x0, y1-y0, false)
	// Markers: dotted verticals, each with its label running down beside
	// it; labels that would overlap are moved apart and joined to their
	// line by a short leader.
	var mx []float64
	var ms []view.Marker
	for _, m := range p.Markers {
		if plottable(m.X, p.LogX) {
			x := ax.at(m.X)
			f.SetDashPattern([]float64{0.4, 0.8}, 0)
			f.SetLineWidth(0.15)
			f.SetDrawColor(90, 90, 90)
			f.Line(x, y0, x, y1)
			mx, ms = append(mx, x), append(ms, m)
		}
	}
	size, every := markerLabelSize(len(mx), x1-x0-2)
	var wx []float64
	var wm []view.Marker
	for i := 0; i < len(mx); i += every {
		wx, wm = append(wx, mx[i]), append(wm, ms[i])
	}
	lx := spread(wx, markerPitch(size), x0+markerPitch(size), x1)
	f.SetFont(font, "", size)
	f.SetDashPattern(nil, 0)
	for i, m := range wm {
		top := y0 + 1
		if math.Abs(lx[i]-wx[i]) > 0.05 {
			f.Line(wx[i], y0, lx[i]-markerPitch(size)/2, y0+2.5)
			top = y0 + 3
		}
		f.TransformBegin()
		f.TransformRotate(90, lx[i]-0.6, top)
		f.Text(lx[i]-0.6-f.GetStringWidth(m.Label), top, m.Label)
		f.TransformEnd()
	}
	f.SetDrawColor(0, 0, 0)
	for _, h := range p.HLines {
		if !plottable(h.Y, p.LogY) {
			continue
		}
		y := ay.at(h.Y)
		f.SetDashPattern([]float64{2, 0.8, 0.4, 0.8}, 0)
		f.SetLineWidth(0.3)
		f.Line(x0, y, x1, y)
		f.SetFont(font, "", 6.5)
		f.Text(x0+2, y-1, h.Label)
	}
	for _, s := range p.Series {
		if s.Dashed {
			f.SetDashPattern([]float64{1.6, 1}, 0)
		} else {
			f.SetDashPattern(nil, 0)
		}
		seriesPen(f, s)
		first := true
		for i := range s.X {
			if !plottable(s.X[i], p.LogX) || !plottable(s.Y[i], p.LogY) {
				first = true
				continue
			}
			x, y := ax.at(s.X[i]), ay.at(s.Y[i])
			if first {
				f.MoveTo(x, y)
				first = false
			} else {
				f.LineTo(x, y)
			}
		}
		f.DrawPath("D")
	}
	f.SetDashPattern(nil, 0)
	f.SetDrawColor(0, 0, 0)
	f.ClipEnd()
	// Legend under the axis label.
	legendX := x0
	ly := y1 + 11
	f.SetFont(font, "", 7)
	for _, s := range p.Series {
		if s.Dashed {
			f.SetDashPattern([]float64{1.6, 1}, 0)
		}
		seriesPen(f, s)
		f.Line(legendX, ly-1, legendX+8, ly-1)
		f.SetDashPattern(nil, 0)
		f.SetDrawColor(0, 0, 0)
		f.Text(legendX+10, ly, s.Name)
		legendX += 14 + f.GetStringWidth(s.Name)
	}
	f.SetLineWidth(0.2)
	f.SetY(top + plotHeight)
}

func (w *writer) bars(p *view.Plot, x0, x1, y0, y1 float64) {
	f := w.f
	vals := make([]float64, len(p.Bars))
	for i, b := range p.Bars {
		vals[i] = b.Value
	}
	_, hi := dataRange(vals, false, true)
	ay := axis{lo: 0, hi: hi, p0: y1, p1: y0}
	w.yAxisAndFrame(ay, p.YLabel, x0, x1, y0, y1)
	n := float64(len(p.Bars))
	slot := (x1 - x0) / n
	f.SetFillColor(170, 170, 170)
	for i, b := range p.Bars {
		if !plottable(b.Value, false) {
			continue
		}
		bx := x0 + slot*float64(i) + slot*0.2
		top := ay.at(b.Value)
		f.Rect(bx, top, slot*0.6, y1-top, "FD")
		f.SetFont(font, "", 5.5)
		v := label(roundTo3(b.Value))
		f.Text(bx+slot*0.3-f.GetStringWidth(v)/2, top-0.8, v)
		f.TransformBegin()
		f.TransformRotate(35, bx+slot*0.3, y1+2)
		f.Text(bx+slot*0.3-f.GetStringWidth(b.Label), y1+2, b.Label)
		f.TransformEnd()
	}
}

// yAxisAndFrame draws the horizontal grid lines with their tick labels, the
// frame and the rotated y label.
func (w *writer) yAxisAndFrame(ay axis, ylabel string, x0, x1, y0, y1 float64) {
	f := w.f
	f.SetFont(font, "", 6.5)
	f.SetLineWidth(0.1)
	f.SetDrawColor(200, 200, 200)
	for _, t := range ay.ticks() {
		y := ay.at(t)
		f.Line(x0, y, x1, y)
		s := label(t)
		f.Text(x0-1.2-f.GetStringWidth(s), y+1, s)
	}
	f.SetDrawColor(0, 0, 0)
	f.SetLineWidth(0.25)
	f.Rect(x0, y0, x1-x0, y1-y0, "D")
	f.SetFont(font, "", 7.5)
	f.TransformBegin()
	f.TransformRotate(90, marginLeft+3, (y0+y1)/2)
	f.Text(marginLeft+3-f.GetStringWidth(ylabel)/2, (y0+y1)/2, ylabel)
	f.TransformEnd()
}

// markerPitch is the width across the page that a marker label of the
// given font size takes when it runs down the plot (its line height), with
// A small gap: 1 pt is 0.3528 mm.
func markerPitch(size float64) float64 { return size * 0.3528 * 1.15 }

// markerLabelSize picks the font size of n marker labels across a plot
// width wide: 5.5 pt when they fit side by side, smaller down to 3 pt, and
// below that only every k-th marker labelled (the markers are numbered, so
// the labels left out follow from their neighbours).
func markerLabelSize(n int, width float64) (size float64, every int) {
	size, every = 5.5, 1
	if n == 0 || float64(n)*markerPitch(size) <= width {
		return size, every
	}
	size = math.Max(3, width/float64(n)/markerPitch(1))
	every = int(math.Ceil(float64(n) * markerPitch(size) / width))
	return size, every
}

// spread places labels wanted at the page positions want (in any order) so
// that no two are closer than pitch, each as near its wish as that allows,
// all within [lo, hi] when they fit: a pass left to right pushes crowded
// labels right, a pass right to left pulls back those past hi. Labels that
// already stand apart keep their positions.
func spread(want []float64, pitch, lo, hi float64) []float64 {
	idx := make([]int, len(want))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(a, b int) bool { return want[idx[a]] < want[idx[b]] })
	out := make([]float64, len(want))
	prev := math.Inf(-1)
	for _, i := range idx {
		out[i] = math.Max(math.Max(want[i], lo), prev+pitch)
		prev = out[i]
	}
	next := math.Inf(1)
	for k := len(idx) - 1; k >= 0; k-- {
		i := idx[k]
		out[i] = math.Min(math.Min(out[i], hi), next-pitch)
		next = out[i]
	}
	return out
}

// seriesPen sets the line of a series: black 0.35 mm, or grey 0.7 mm for
// another laser's beam.
func seriesPen(f *fpdf.Fpdf, s view.Series) {
	if s.Grey {
		f.SetDrawColor(140, 140, 140)
		f.SetLineWidth(0.7)
		return
	}
	f.SetDrawColor(0, 0, 0)
	f.SetLineWidth(0.35)
}
