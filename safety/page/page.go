// Package page writes the sign-off document's model as one HTML page: the
// same sections, tables, plots and drawings the PDF draws, for a wiki or a
// lab notebook (report --html) and for the live view (serve). Every text
// goes through html/template's escaping; plots and drawings are inline SVG
// whose texts are escaped as they are written; the page needs no script to
// be read and fetches nothing.
package page

import (
	"bytes"
	"fmt"
	"html"
	"html/template"
	"io"
	"math"
	"strconv"
	"strings"
	"sync"

	"beamledger/safety/report"
	"beamledger/safety/view"
)

// Write writes d as one self-contained HTML page.
func Write(w io.Writer, d *report.Document) error {
	body, err := Body(d)
	if err != nil {
		return err
	}
	return Shell(w, d.Title, body, "")
}

// Shell writes the page around a body: the head with its style, and
// script (when not empty, the live view's) at the end.
func Shell(w io.Writer, title string, body template.HTML, script template.JS) error {
	return shell().Execute(w, struct {
		Title  string
		Style  template.CSS
		Body   template.HTML
		Script template.JS
	}{title, style, body, script})
}

// Body is the document itself: the title block, the summary, the sections
// and the setup file it covers.
func Body(d *report.Document) (template.HTML, error) {
	type block struct {
		Subheading, Paragraph string
		Bullets               []bullet
		Table                 *report.Table
		Right                 []bool
		Figure                template.HTML
		SignOff               []string
		Record                []string
	}
	type section struct {
		N       int
		Heading string
		Blocks  []block
	}
	var sections []section
	for i, s := range d.Sections {
		sec := section{N: i + 1, Heading: s.Heading}
		for _, b := range s.Blocks {
			var out block
			switch {
			case b.Subheading != "":
				out.Subheading = b.Subheading
			case b.Paragraph != "":
				out.Paragraph = b.Paragraph
			case b.Bullets != nil:
				out.Bullets = bullets(b.Bullets)
			case b.Table != nil:
				out.Table = b.Table
			case b.Plot != nil:
				out.Figure = plotSVG(b.Plot)
			case b.Drawing != nil:
				var buf bytes.Buffer
				if err := report.WriteInlineSVG(&buf, b.Drawing); err != nil {
					return "", err
				}
				out.Figure = template.HTML("<figure class=\"drawing\"><figcaption>" + html.EscapeString(b.Drawing.Title) + "</figcaption>" + buf.String() + "</figure>")
			case b.SignOff != nil:
				out.SignOff = b.SignOff
			case len(b.Record) > 0:
				out.Record = b.Record
			default:
				continue
			}
			sec.Blocks = append(sec.Blocks, out)
		}
		sections = append(sections, sec)
	}
	var buf bytes.Buffer
	err := body().Execute(&buf, struct {
		D        *report.Document
		Sections []section
		Setup    string
	}{d, sections, string(d.Setup)})
	return template.HTML(buf.String()), err
}

// bullet is one bullet and those nested under it (report.Nested).
type bullet struct {
	Text   string
	Nested []string
}

func bullets(items []string) []bullet {
	var out []bullet
	for _, x := range items {
		if n, ok := strings.CutPrefix(x, report.Nested); ok && len(out) > 0 {
			out[len(out)-1].Nested = append(out[len(out)-1].Nested, n)
			continue
		}
		out = append(out, bullet{Text: strings.TrimPrefix(x, report.Nested)})
	}
	return out
}

var funcs = template.FuncMap{
	"right": func(t *report.Table, i int) bool { return i < len(t.Right) && t.Right[i] },
}

var shell = sync.OnceValue(func() *template.Template {
	return template.Must(template.New("shell").Parse(`<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>{{.Title}}</title>
<style>{{.Style}}</style>
</head>
<body>
<main id="document">
{{.Body}}
</main>
{{if .Script}}<script>{{.Script}}</script>
{{end}}</body>
</html>
`))
})

var body = sync.OnceValue(func() *template.Template {
	return template.Must(template.New("body").Funcs(funcs).Parse(`<header>
<h1>{{.D.Title}}</h1>
<dl class="title-block">
<dt>Site</dt><dd>{{.D.Site}}</dd>
<dt>Revision</dt><dd>{{.D.Revision}}</dd>
<dt>Prepared by</dt><dd>{{.D.PreparedBy}}</dd>
<dt>Date</dt><dd>{{.D.Date}}</dd>
<dt>Setup file</dt><dd>{{.D.SetupFile}}</dd>
<dt>Setup SHA-256</dt><dd><code>{{.D.SetupSHA256}}</code></dd>
<dt>Tool</dt><dd>beamledger {{.D.ToolVersion}}</dd>
</dl>
<h2>Summary</h2>
<p>{{.D.Summary}}</p>
</header>
{{range .Sections}}<section id="s{{.N}}">
<h2>{{.N}} {{.Heading}}</h2>
{{range .Blocks}}{{if .Subheading}}<h3>{{.Subheading}}</h3>
{{else if .Paragraph}}<p>{{.Paragraph}}</p>
{{else if .Bullets}}<ul>
{{range .Bullets}}<li>{{.Text}}{{if .Nested}}<ul>{{range .Nested}}<li>{{.}}</li>{{end}}</ul>{{end}}</li>
{{end}}</ul>
{{else if .Table}}{{$t := .Table}}<table>
<thead><tr>{{range $i, $h := $t.Header}}<th scope="col"{{if right $t $i}} class="num"{{end}}>{{$h}}</th>{{end}}</tr></thead>
<tbody>
{{range $t.Rows}}<tr>{{range $i, $c := .}}<td{{if right $t $i}} class="num"{{end}}>{{$c}}</td>{{end}}</tr>
{{end}}</tbody>
</table>
{{else if .Figure}}{{.Figure}}
{{else if .SignOff}}<table class="signoff">
<thead><tr><th scope="col">Role</th><th scope="col">Name</th><th scope="col">Signature</th><th scope="col">Date</th></tr></thead>
<tbody>
{{range .SignOff}}<tr><th scope="row">{{.}}</th><td></td><td></td><td></td></tr>
{{end}}</tbody>
</table>
{{else if .Record}}<ol class="record">
{{range .Record}}<li><code>{{.}}</code></li>
{{end}}</ol>
{{end}}{{end}}</section>
{{end}}<section>
<h2>The setup file this document covers</h2>
<p>{{.D.SetupFile}}, SHA-256 <code>{{.D.SetupSHA256}}</code>, as read:</p>
<details><summary>the setup file</summary><pre>{{.Setup}}</pre></details>
</section>`))
})

const style template.CSS = `body{font-family:"Go",system-ui,sans-serif;max-width:60rem;margin:1rem auto;padding:0 1rem;line-height:1.4;color:#000;background:#fff}
h1{font-size:1.5rem}h2{font-size:1.2rem;border-bottom:1px solid #000;margin-top:2rem}h3{font-size:1rem}
table{border-collapse:collapse;margin:0.5rem 0;font-size:0.85rem}th,td{border:1px solid #999;padding:0.15rem 0.4rem;text-align:left;vertical-align:top}
th{background:#eee}td.num,th.num{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}
dl.title-block{display:grid;grid-template-columns:max-content 1fr;gap:0.1rem 1rem}dt{font-weight:bold}dd{margin:0}
figure{margin:1rem 0;break-inside:avoid}figcaption{font-weight:bold;font-size:0.9rem}svg{max-width:100%;height:auto}
.legend{font-size:0.8rem}table.signoff td{min-width:8rem;height:2rem}ol.record{font-size:0.8rem}
pre{white-space:pre-wrap;font-size:0.8rem}
.stale{opacity:0.45}.load-error{border:2px solid #000;padding:0.5rem;font-weight:bold}
@media print{details{display:none}body{max-width:none}}`

// Plot geometry, in SVG user units.
const (
	plotW, plotH               = 640.0, 300.0
	plotLeft, plotRight        = 64.0, 12.0
	plotTop, plotBottomMargins = 12.0, 44.0
)

// plotSVG draws a plot as a figure: an SVG chart (the same ranges, ticks
// and labels as the PDF, view.Axis) and a legend in words.
func plotSVG(p *view.Plot) template.HTML {
	var b strings.Builder
	e := html.EscapeString
	fmt.Fprintf(&b, `<figure class="plot"><figcaption>%s</figcaption><svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 %g %g" width="%g" role="img" font-family="Go, sans-serif" font-size="11"><title>%s</title><rect x="0" y="0" width="%g" height="%g" fill="white"/>`,
		e(p.Title), plotW, plotH, plotW, e(p.Title), plotW, plotH)
	x0, x1 := plotLeft, plotW-plotRight
	y0, y1 := plotTop, plotH-plotBottomMargins
	f := func(v float64) string { return strconv.FormatFloat(math.Round(v*10)/10, 'f', -1, 64) }
	if len(p.Bars) > 0 {
		vals := make([]float64, len(p.Bars))
		for i, bar := range p.Bars {
			vals[i] = bar.Value
		}
		_, hi := view.DataRange(vals, false, true)
		ay := view.Axis{Lo: 0, Hi: hi}
		yGrid(&b, ay, x0, x1, y0, y1, f)
		slot := (x1 - x0) / float64(len(p.Bars))
		for i, bar := range p.Bars {
			if !view.Plottable(bar.Value, false) {
				continue
			}
			bx := x0 + slot*float64(i) + slot*0.2
			top := ay.At(bar.Value, y1, y0)
			fmt.Fprintf(&b, `<rect x="%s" y="%s" width="%s" height="%s" fill="#aaa" stroke="black"/><text x="%s" y="%s" text-anchor="middle" font-size="9">%s</text><text x="%s" y="%s" text-anchor="end" font-size="9" transform="rotate(-35 %s %s)">%s</text>`,
				f(bx), f(top), f(slot*0.6), f(y1-top), f(bx+slot*0.3), f(top-2), e(view.TickLabel(view.RoundTo3(bar.Value))), f(bx+slot*0.3), f(y1+10), f(bx+slot*0.3), f(y1+10), e(bar.Label))
		}
		frame(&b, p, x0, x1, y0, y1, f)
		b.WriteString("</svg></figure>")
		return template.HTML(b.String())
	}
	var xs, ys []float64
	for _, s := range p.Series {
		xs, ys = append(xs, s.X...), append(ys, s.Y...)
	}
	for _, m := range p.Markers {
		xs = append(xs, m.X)
	}
	for _, h := range p.HLines {
		ys = append(ys, h.Y)
	}
	xlo, xhi := view.DataRange(xs, p.LogX, false)
	if !p.LogX {
		xlo = math.Min(xlo, 0)
	}
	ylo, yhi := view.DataRange(ys, p.LogY, true)
	ax, ay := view.Axis{Lo: xlo, Hi: xhi, Log: p.LogX}, view.Axis{Lo: ylo, Hi: yhi, Log: p.LogY}
	for _, t := range ax.Ticks() {
		x := ax.At(t, x0, x1)
		fmt.Fprintf(&b, `<line x1="%s" y1="%s" x2="%s" y2="%s" stroke="#ccc"/><text x="%s" y="%s" text-anchor="middle" font-size="10">%s</text>`, f(x), f(y0), f(x), f(y1), f(x), f(y1+13), e(view.TickLabel(t)))
	}
	yGrid(&b, ay, x0, x1, y0, y1, f)
	for _, h := range p.HLines {
		if !view.Plottable(h.Y, p.LogY) {
			continue
		}
		y := ay.At(h.Y, y1, y0)
		fmt.Fprintf(&b, `<line x1="%s" y1="%s" x2="%s" y2="%s" stroke="black" stroke-dasharray="4 3"/><text x="%s" y="%s" text-anchor="end" font-size="9">%s</text>`, f(x0), f(y), f(x1), f(y), f(x1-2), f(y-3), e(h.Label))
	}
	for _, m := range p.Markers {
		if !view.Plottable(m.X, p.LogX) {
			continue
		}
		x := ax.At(m.X, x0, x1)
		fmt.Fprintf(&b, `<line x1="%s" y1="%s" x2="%s" y2="%s" stroke="#555" stroke-dasharray="1 3"/><text x="%s" y="%s" font-size="8" transform="rotate(-90 %s %s)">%s</text>`, f(x), f(y0), f(x), f(y1), f(x-2), f(y0+2), f(x-2), f(y0+2), e(m.Label))
	}
	for _, s := range p.Series {
		stroke, width, dash := "black", "1.2", ""
		if s.Grey {
			stroke, width = "#777", "2.2"
		}
		if s.Dashed {
			dash = ` stroke-dasharray="6 3"`
		}
		var pts []string
		flush := func() {
			if len(pts) > 1 {
				fmt.Fprintf(&b, `<polyline points="%s" fill="none" stroke="%s" stroke-width="%s"%s/>`, strings.Join(pts, " "), stroke, width, dash)
			}
			pts = pts[:0]
		}
		for i := range s.X {
			if !view.Plottable(s.X[i], p.LogX) || !view.Plottable(s.Y[i], p.LogY) {
				flush()
				continue
			}
			pts = append(pts, f(ax.At(s.X[i], x0, x1))+","+f(ay.At(s.Y[i], y1, y0)))
		}
		flush()
	}
	frame(&b, p, x0, x1, y0, y1, f)
	b.WriteString("</svg>")
	if len(p.Series) > 0 {
		var names []string
		for _, s := range p.Series {
			style := "solid black line"
			switch {
			case s.Grey && s.Dashed:
				style = "dashed grey line"
			case s.Grey:
				style = "heavy grey line"
			case s.Dashed:
				style = "dashed black line"
			}
			names = append(names, e(s.Name)+" ("+style+")")
		}
		b.WriteString(`<p class="legend">` + strings.Join(names, "; ") + "</p>")
	}
	b.WriteString("</figure>")
	return template.HTML(b.String())
}

// yGrid draws the horizontal grid lines and their tick labels.
func yGrid(b *strings.Builder, ay view.Axis, x0, x1, y0, y1 float64, f func(float64) string) {
	for _, t := range ay.Ticks() {
		y := ay.At(t, y1, y0)
		fmt.Fprintf(b, `<line x1="%s" y1="%s" x2="%s" y2="%s" stroke="#ccc"/><text x="%s" y="%s" text-anchor="end" font-size="10">%s</text>`, f(x0), f(y), f(x1), f(y), f(x0-4), f(y+3.5), html.EscapeString(view.TickLabel(t)))
	}
}

// frame draws the plot's frame and its axis labels.
func frame(b *strings.Builder, p *view.Plot, x0, x1, y0, y1 float64, f func(float64) string) {
	fmt.Fprintf(b, `<rect x="%s" y="%s" width="%s" height="%s" fill="none" stroke="black"/><text x="%s" y="%s" text-anchor="middle">%s</text><text x="%s" y="%s" text-anchor="middle" transform="rotate(-90 %s %s)">%s</text>`,
		f(x0), f(y0), f(x1-x0), f(y1-y0), f((x0+x1)/2), f(y1+30), html.EscapeString(p.XLabel), f(14), f((y0+y1)/2), f(14), f((y0+y1)/2), html.EscapeString(p.YLabel))
}
