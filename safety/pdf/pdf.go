// Package pdf draws a report.Document as a PDF with codeberg.org/go-pdf/fpdf:
// the Go fonts embedded as UTF-8 fonts (so µ, ², Ω, Γ, Δ, λ and ≤ print),
// vector plots readable in black and white, and a footer on every page with
// the title, revision, the setup's SHA-256 and "page N of M". The same
// document and date give the same bytes.
package pdf

import (
	"fmt"
	"io"
	"path/filepath"
	"strings"
	"time"

	"codeberg.org/go-pdf/fpdf"
	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/goitalic"
	"golang.org/x/image/font/gofont/goregular"

	"beamledger/safety/report"
)

const (
	font        = "go"
	marginLeft  = 18.0 // mm
	marginTop   = 16.0
	marginRight = 18.0
	bottomSpace = 18.0
	lineH       = 4.2 // mm per line of body text
)

// Options control the output.
type Options struct {
	// Date is the document date; it is also written as the PDF's creation
	// and modification date, so that equal inputs give equal bytes.
	Date time.Time
	// Compress the content streams (true in production; tests may turn it
	// off to read the streams).
	Compress bool
}

type writer struct {
	f     *fpdf.Fpdf
	doc   *report.Document
	pageW float64
	textW float64
	// replaced is the number of characters printed as Missing.
	replaced int
	// headingLast is set while the last thing drawn on the page is a
	// heading; pageEndsWithHeading records it for every finished page
	// (a layout rule the tests hold: no page ends with a heading).
	headingLast         bool
	headingEnd          float64 // where the last heading ends on its page, mm
	pageEndsWithHeading []bool
}

// pageCount stands in every footer for the number of pages until the
// document is complete. It is made of private-use characters, which the
// embedded font has no glyph for: any such character in a setup's text is
// printed as Missing before drawing, so no text can imitate it.
const pageCount = "\ue000\ue001"

// AttachmentName is the name the setup file is attached under: its base
// name, so that `verify` finds it whatever directory it came from.
func AttachmentName(file string) string { return filepath.Base(file) }

// Write draws the document to w. Characters the embedded font cannot draw
// are printed as Missing, and the title block says how many; every footer
// reads "page N of M".
func Write(w io.Writer, doc *report.Document, o Options) error {
	doc, replaced := drawableCopy(doc)
	f, _, err := draw(doc, o, replaced)
	if err != nil {
		return err
	}
	return f.Output(w)
}

func draw(doc *report.Document, o Options, replaced int) (*fpdf.Fpdf, *writer, error) {
	f := fpdf.New("P", "mm", "A4", "")
	f.SetCompression(o.Compress)
	f.SetCatalogSort(true)
	f.SetCreationDate(o.Date)
	f.SetModificationDate(o.Date)
	f.SetTitle(doc.Title, true)
	f.SetAuthor(doc.PreparedBy, true)
	f.SetSubject("Laser beam path evaluation and sign-off", true)
	f.SetCreator("beamledger "+doc.ToolVersion, true)
	f.SetProducer("beamledger "+doc.ToolVersion, true)
	f.AddUTF8FontFromBytes(font, "", goregular.TTF)
	f.AddUTF8FontFromBytes(font, "B", gobold.TTF)
	f.AddUTF8FontFromBytes(font, "I", goitalic.TTF)
	f.SetMargins(marginLeft, marginTop, marginRight)
	f.SetAutoPageBreak(true, bottomSpace)
	pw, _ := f.GetPageSize()
	f.AliasNbPages(pageCount)
	wr := &writer{f: f, doc: doc, pageW: pw, textW: pw - marginLeft - marginRight, replaced: replaced}
	f.SetFooterFunc(wr.footer)
	if len(doc.Setup) > 0 {
		f.SetAttachments([]fpdf.Attachment{
			{Content: doc.Setup, Filename: AttachmentName(doc.SetupFile), Description: "the setup file this document covers, SHA-256 " + doc.SetupSHA256},
			{Content: []byte(strings.Join(doc.Hazards, "\n") + "\n"), Filename: report.HazardsAttachment, Description: "the hazards found at sign-off, one per line; " + doc.Render.String()},
		})
	}
	f.AddPage()
	wr.titleBlock()
	for i, s := range doc.Sections {
		wr.section(i+1, s)
	}
	if err := f.Error(); err != nil {
		return nil, nil, fmt.Errorf("drawing the PDF: %w", err)
	}
	return f, wr, nil
}

func (w *writer) footer() {
	f := w.f
	// The page ends with a heading when nothing was drawn below it: the
	// page is left where the heading ended.
	w.pageEndsWithHeading = append(w.pageEndsWithHeading, w.headingLast && f.GetY() <= w.headingEnd+3)
	w.headingLast = false
	f.SetY(-12)
	f.SetFont(font, "", 7)
	f.SetTextColor(60, 60, 60)
	f.CellFormat(w.textW*0.78, 4, FooterText(w.doc.Title, w.doc.Revision, w.doc.SetupSHA256), "T", 0, "L", false, 0, "")
	f.CellFormat(w.textW*0.22, 4, fmt.Sprintf("page %d of %s", f.PageNo(), pageCount), "T", 0, "R", false, 0, "")
	f.SetTextColor(0, 0, 0)
}

// FooterText is what every page's footer states of the document: its
// title, revision and setup hash (verify reads it back off the pages).
func FooterText(title, revision, sha256 string) string {
	rev := ""
	if revision != "" {
		rev = ", revision " + revision
	}
	return fmt.Sprintf("%s%s — setup SHA-256 %s", title, rev, sha256)
}

// FooterBand is the height above the page's bottom edge, mm, where only
// the footer prints: the body ends bottomSpace above the edge, the footer
// line 12 mm above it.
const FooterBand = 15.0

// recordMarkW is the width of the column of a record's line numbers, mm.
const recordMarkW = 9.0

// need starts a new page unless h mm remain above the bottom margin.
func (w *writer) need(h float64) {
	_, ph := w.f.GetPageSize()
	if w.f.GetY()+h > ph-bottomSpace {
		w.f.AddPage()
	}
}

func (w *writer) titleBlock() {
	f, d := w.f, w.doc
	f.SetFont(font, "B", 18)
	f.MultiCell(w.textW, 8, d.Title, "", "L", false)
	f.SetFont(font, "", 10)
	f.MultiCell(w.textW, 5, "Laser beam path evaluation and sign-off", "", "L", false)
	f.Ln(2)
	rows := [][2]string{
		{"Site", d.Site}, {"Revision", d.Revision}, {"Prepared by", d.PreparedBy}, {"Date", d.Date},
		{"Tool", "beamledger " + d.ToolVersion}, {"Setup file", d.SetupFile}, {"Setup SHA-256", d.SetupSHA256},
	}
	if w.replaced > 0 {
		rows = append(rows, [2]string{"Note", fmt.Sprintf("%d character(s) of the setup's text that the embedded font cannot draw are printed as %q; the setup file itself is unchanged", w.replaced, Missing)})
	}
	for _, r := range rows {
		f.SetFont(font, "B", 9)
		f.CellFormat(32, 5, r[0], "", 0, "L", false, 0, "")
		f.SetFont(font, "", 9)
		f.MultiCell(w.textW-32, 5, r[1], "", "L", false)
	}
	f.Ln(3)
	f.SetFont(font, "B", 11)
	f.MultiCell(w.textW, 6, "Summary", "", "L", false)
	f.SetFont(font, "", 9.5)
	f.SetFillColor(238, 238, 238)
	f.MultiCell(w.textW, lineH+0.6, d.Summary, "1", "L", true)
	f.Ln(4)
}

func (w *writer) section(n int, s report.Section) {
	f := w.f
	// A heading stays with the start of what follows it.
	lead := 0.0
	if len(s.Blocks) > 0 {
		lead = w.leadHeight(s.Blocks, 0)
	}
	w.need(13 + lead)
	f.SetFont(font, "B", 13)
	f.Ln(2)
	f.MultiCell(w.textW, 7, fmt.Sprintf("%d  %s", n, s.Heading), "B", "L", false)
	f.Ln(2)
	w.headingLast, w.headingEnd = len(s.Blocks) > 0, f.GetY()
	for i, b := range s.Blocks {
		switch {
		case b.Subheading != "":
			w.need(7 + w.leadHeight(s.Blocks, i+1))
			f.Ln(1)
			f.SetFont(font, "B", 10)
			f.MultiCell(w.textW, 5, b.Subheading, "", "L", false)
			w.headingLast, w.headingEnd = true, f.GetY()
			continue
		case b.Paragraph != "":
			f.SetFont(font, "", 9)
			// A short paragraph (a path's opening line) stays with the
			// start of what it introduces.
			if h := float64(len(wrap(f, b.Paragraph, w.textW))) * lineH; h < 40 {
				w.need(h + w.leadHeight(s.Blocks, i+1))
				f.SetFont(font, "", 9)
			}
			f.MultiCell(w.textW, lineH, b.Paragraph, "", "L", false)
			f.Ln(1)
		case b.Bullets != nil:
			f.SetFont(font, "", 9)
			for _, x := range b.Bullets {
				w.need(lineH)
				if n, nested := strings.CutPrefix(x, report.Nested); nested {
					f.SetX(marginLeft + 5)
					f.CellFormat(4, lineH, "–", "", 0, "L", false, 0, "")
					f.MultiCell(w.textW-9, lineH, n, "", "L", false)
					continue
				}
				f.CellFormat(4, lineH, "•", "", 0, "L", false, 0, "")
				f.MultiCell(w.textW-4, lineH, x, "", "L", false)
			}
			f.Ln(1)
		case b.Table != nil:
			w.table(b.Table)
		case b.Plot != nil:
			w.plot(b.Plot)
		case b.Drawing != nil:
			w.drawing(b.Drawing)
		case b.SignOff != nil:
			w.signOff(b.SignOff)
		case b.Record != nil:
			f.SetFont(font, "", 8)
			for k, l := range b.Record {
				w.need(lineH)
				f.SetFont(font, "", 8)
				f.CellFormat(recordMarkW, lineH, report.RecordMark(k+1), "", 0, "L", false, 0, "")
				f.MultiCell(w.textW-recordMarkW, lineH, l, "", "L", false)
			}
		}
		// Something was drawn after the heading (a page break before it
		// finished the heading's page, and the footer recorded that).
		w.headingLast = false
	}
}

// leadHeight is the height of the start of blocks[i] that a heading above
// it must stay with (mm): a paragraph's first three lines, the first
// bullet, a table's header and first row, a whole plot or drawing.
func (w *writer) leadHeight(blocks []report.Block, i int) float64 {
	if i >= len(blocks) {
		return 0
	}
	f, b := w.f, blocks[i]
	switch {
	case b.Subheading != "":
		return 7 + w.leadHeight(blocks, i+1)
	case b.Paragraph != "":
		f.SetFont(font, "", 9)
		n := len(wrap(f, b.Paragraph, w.textW))
		if h := float64(n) * lineH; h < 40 {
			return h + w.leadHeight(blocks, i+1) // a short one keeps with what follows
		}
		return 3 * lineH
	case len(b.Bullets) > 0:
		f.SetFont(font, "", 9)
		return float64(len(wrap(f, strings.TrimPrefix(b.Bullets[0], report.Nested), w.textW-9))) * lineH
	case b.Table != nil:
		t := dropEmptyColumns(b.Table)
		widths := w.columnWidths(t, tableSize, tablePad)
		h, _ := w.rowHeight(t.Header, widths, true)
		if len(t.Rows) > 0 {
			r, _ := w.rowHeight(t.Rows[0], widths, false)
			h += r
		}
		return h
	case b.Plot != nil:
		return plotHeight + 6
	case b.Drawing != nil:
		return b.Drawing.Height + 9
	case b.SignOff != nil:
		return 30
	case len(b.Record) > 0:
		return lineH
	}
	return 0
}

// Table text: font size (pt), line height and cell padding (mm).
const tableSize, tableLine, tablePad = 7.5, 3.4, 0.8

// dropEmptyColumns leaves out the columns whose cells are empty in every
// row: a column with nothing to show is not printed.
func dropEmptyColumns(t *report.Table) *report.Table {
	keep := make([]bool, len(t.Header))
	for i := range t.Header {
		for _, r := range t.Rows {
			if i < len(r) && strings.TrimSpace(r[i]) != "" {
				keep[i] = true
				break
			}
		}
	}
	out := &report.Table{}
	for i, k := range keep {
		if !k {
			continue
		}
		out.Header = append(out.Header, t.Header[i])
		if i < len(t.Right) {
			out.Right = append(out.Right, t.Right[i])
		}
	}
	for _, r := range t.Rows {
		var row []string
		for i, k := range keep {
			if k && i < len(r) {
				row = append(row, r[i])
			}
		}
		out.Rows = append(out.Rows, row)
	}
	return out
}

// rowHeight is a row's height (mm) and its cells' lines.
func (w *writer) rowHeight(cells []string, widths []float64, bold bool) (float64, [][]string) {
	f := w.f
	f.SetFont(font, map[bool]string{true: "B", false: ""}[bold], tableSize)
	lines := make([][]string, len(cells))
	maxLines := 1
	for i, c := range cells {
		lines[i] = wrap(f, c, widths[i]-2*tablePad)
		if len(lines[i]) == 0 {
			lines[i] = []string{""}
		}
		maxLines = max(maxLines, len(lines[i]))
	}
	return float64(maxLines)*tableLine + 2*tablePad, lines
}

// table draws a table; its header is repeated at the top of every page it
// continues on, and never stands alone at the foot of a page.
func (w *writer) table(t *report.Table) {
	f := w.f
	t = dropEmptyColumns(t)
	widths := w.columnWidths(t, tableSize, tablePad)
	_, ph := f.GetPageSize()
	draw := func(cells []string, bold bool) {
		h, lines := w.rowHeight(cells, widths, bold)
		f.SetFont(font, map[bool]string{true: "B", false: ""}[bold], tableSize)
		x, y := marginLeft, f.GetY()
		if bold {
			f.SetFillColor(225, 225, 225)
			f.Rect(x, y, w.textW, h, "F")
		}
		f.SetDrawColor(150, 150, 150)
		f.SetLineWidth(0.1)
		f.Line(x, y+h, x+w.textW, y+h)
		for i := range cells {
			for k, ln := range lines[i] {
				tx := x + tablePad
				if i < len(t.Right) && t.Right[i] && !bold {
					tx = x + widths[i] - tablePad - f.GetStringWidth(ln)
				}
				f.Text(tx, y+tablePad+tableLine*float64(k+1)-0.8, ln)
			}
			x += widths[i]
		}
		f.SetY(y + h)
	}
	hh, _ := w.rowHeight(t.Header, widths, true)
	first := 0.0
	if len(t.Rows) > 0 {
		first, _ = w.rowHeight(t.Rows[0], widths, false)
	}
	w.need(hh + first)
	draw(t.Header, true)
	for _, r := range t.Rows {
		if h, _ := w.rowHeight(r, widths, false); f.GetY()+h > ph-bottomSpace {
			f.AddPage()
			draw(t.Header, true)
		}
		draw(r, false)
	}
	f.SetDrawColor(0, 0, 0)
	f.Ln(2)
}

// wrap breaks text into lines no wider than width at the current font,
// at spaces only: a word (a number with its unit) is never split, and one
// wider than the column stands alone on its line.
func wrap(f *fpdf.Fpdf, text string, width float64) []string {
	var lines []string
	line := ""
	for _, word := range strings.Fields(text) {
		if line == "" {
			line = word
			continue
		}
		if f.GetStringWidth(line+" "+word) <= width {
			line += " " + word
		} else {
			lines = append(lines, line)
			line = word
		}
	}
	if line != "" || len(lines) == 0 {
		lines = append(lines, line)
	}
	return lines
}

// columnWidths gives each column the width of its widest cell, or of its
// header's longest word, at the table's font size (free text up to 60 mm),
// then fits the table to the text width: spare room is shared out in
// proportion; when the table is too wide, the columns of free text give way
// first (their text wraps), and only then every column in proportion.
func (w *writer) columnWidths(t *report.Table, size, pad float64) []float64 {
	f := w.f
	n := len(t.Header)
	nat := make([]float64, n)
	measure := func(s string, bold bool) float64 {
		f.SetFont(font, map[bool]string{true: "B", false: ""}[bold], size)
		return f.GetStringWidth(s) + 2*pad + 1.5
	}
	for i, h := range t.Header {
		for _, word := range strings.Fields(h) {
			nat[i] = max(nat[i], measure(word, true))
		}
	}
	for _, r := range t.Rows {
		for i, c := range r {
			if i < n {
				nat[i] = max(nat[i], min(measure(c, false), 60))
			}
		}
	}
	total := 0.0
	for _, x := range nat {
		total += x
	}
	if total <= w.textW {
		for i := range nat {
			nat[i] *= w.textW / total
		}
		return nat
	}
	// Too wide: the columns of free text (flush left) give way first, down
	// to 18 mm each, their text wrapping; numbers keep their width.
	const minText = 18.0
	give := 0.0
	for i, x := range nat {
		if !(i < len(t.Right) && t.Right[i]) && x > minText {
			give += x - minText
		}
	}
	if excess := total - w.textW; give >= excess {
		for i, x := range nat {
			if !(i < len(t.Right) && t.Right[i]) && x > minText {
				nat[i] = x - excess*(x-minText)/give
			}
		}
		return nat
	}
	for i := range nat {
		nat[i] *= w.textW / total
	}
	return nat
}

func (w *writer) signOff(roles []string) {
	f := w.f
	for _, role := range roles {
		w.need(30)
		f.SetFont(font, "B", 10)
		f.MultiCell(w.textW, 6, role, "", "L", false)
		f.SetFont(font, "", 9)
		for _, field := range []string{"Name", "Signature", "Date"} {
			y := f.GetY() + 7
			f.Text(marginLeft, y, field)
			f.SetLineWidth(0.2)
			f.Line(marginLeft+22, y+0.5, marginLeft+110, y+0.5)
			f.SetY(y + 1)
		}
		f.Ln(5)
	}
}
