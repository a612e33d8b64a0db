package pdf

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"
	"unicode/utf16"

	"github.com/pdfcpu/pdfcpu/pkg/api"
	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu"
	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu/model"

	"beamledger/safety/report"
	"beamledger/safety/safetytest"
	"beamledger/safety/view"
)

func init() {
	// Read documents without pdfcpu writing its configuration into the
	// user's directory.
	api.DisableConfigDir()
}

func demoPDF(t testing.TB, compress bool) ([]byte, *report.Document) {
	t.Helper()
	a, data := safetytest.EvaluateFile(t, "../../testdata/examples/table-c.toml")
	doc := report.Build(a, report.Meta{Date: "2026-01-02", ToolVersion: "test", SetupBytes: data})
	var b bytes.Buffer
	if err := Write(&b, doc, Options{Date: time.Date(2026, 1, 2, 0, 0, 0, 0, time.UTC), Compress: compress}); err != nil {
		t.Fatal(err)
	}
	return b.Bytes(), doc
}

// pdfText extracts the text of every page: pdfcpu decodes each page's
// content stream, and the strings shown with Tj are the UTF-16BE code points
// that fpdf writes for its UTF-8 fonts.
func pdfText(t *testing.T, pdf []byte) (string, int) {
	t.Helper()
	conf := model.NewDefaultConfiguration()
	ctx, err := api.ReadContext(bytes.NewReader(pdf), conf)
	if err != nil {
		t.Fatal(err)
	}
	if err := api.ValidateContext(ctx); err != nil {
		t.Fatal(err)
	}
	var all strings.Builder
	for p := 1; p <= ctx.PageCount; p++ {
		r, err := pdfcpu.ExtractPageContent(ctx, p)
		if err != nil {
			t.Fatal(err)
		}
		content, _ := io.ReadAll(r)
		for _, s := range shownStrings(content) {
			all.WriteString(s)
			all.WriteString("\n")
		}
	}
	return all.String(), ctx.PageCount
}

// shownStrings finds the literal strings before each Tj operator and decodes
// them from UTF-16BE.
func shownStrings(content []byte) []string {
	var out []string
	for i := 0; i < len(content); i++ {
		if content[i] != '(' {
			continue
		}
		var raw []byte
		j := i + 1
		depth := 1
		for ; j < len(content) && depth > 0; j++ {
			c := content[j]
			switch {
			case c == '\\' && j+1 < len(content):
				j++
				switch e := content[j]; e {
				case 'n':
					raw = append(raw, '\n')
				case 'r':
					raw = append(raw, '\r')
				case 't':
					raw = append(raw, '\t')
				case 'b':
					raw = append(raw, '\b')
				case 'f':
					raw = append(raw, '\f')
				default:
					if e >= '0' && e <= '7' {
						v := 0
						k := 0
						for ; k < 3 && j < len(content) && content[j] >= '0' && content[j] <= '7'; k++ {
							v = v*8 + int(content[j]-'0')
							j++
						}
						j--
						raw = append(raw, byte(v))
					} else {
						raw = append(raw, e)
					}
				}
			case c == '(':
				depth++
				raw = append(raw, c)
			case c == ')':
				depth--
				if depth > 0 {
					raw = append(raw, c)
				}
			default:
				raw = append(raw, c)
			}
		}
		rest := strings.TrimLeft(string(content[j:min(j+6, len(content))]), " ")
		if strings.HasPrefix(rest, "Tj") && len(raw)%2 == 0 {
			u := make([]uint16, len(raw)/2)
			for k := range u {
				u[k] = uint16(raw[2*k])<<8 | uint16(raw[2*k+1])
			}
			out = append(out, string(utf16.Decode(u)))
		}
		i = j - 1
	}
	return out
}

// The document validates with pdfcpu and holds every section, the setup's
// hash, key numbers and the symbols the Go fonts must print.
func TestPDFValidAndComplete(t *testing.T) {
	pdf, doc := demoPDF(t, true)
	text, pages := pdfText(t, pdf)
	if pages < 4 {
		t.Errorf("%d pages", pages)
	}
	flat := strings.Join(strings.Fields(text), " ")
	for _, want := range []string{
		"Elongated cloud, table C", "Summary", "1 At a glance", "For the laser safety officer", "No defect and no uncontrolled hazard", "For the physicist", "2 Sources", "3 Drawing of the beam paths", "4 Beam paths", "5 At the atoms", "6 At each cloud", "7 Hazards", "8 Eyewear",
		"9 Control measures", "10 Where the limits come from", "11 Assumptions", "12 Cautions", "13 Sign-off", "Control measures by class", "entry control (interlock or warning light)", "officer's check", "approved with the conditions below", "Review by:", "Key", "Laser \"probe-amp\", 780.24 nm, Class 4", "×2700", "4 pick", "from memory", "Directive 2006/25/EC", "Reviewed by (laser safety officer)", "Approved by (responsible person)",
		doc.SetupSHA256, "page 1 of", "2694", "25.7", "19.49 MHz", "µm", "W/cm²", "Ω/2π", "Δ/2π", "λ", "≤", "IEC 60825-1:2014",
		"laser safety officer",
	} {
		if !strings.Contains(flat, want) {
			t.Errorf("the PDF text lacks %q", want)
		}
	}
	// The alignment practice is one of the cautions, printed once.
	if n := strings.Count(flat, "Align at the lowest power that works"); n != 1 {
		t.Errorf("the alignment practice appears %d times", n)
	}
	// Findings of one kind on one path share a line, with how they are
	// controlled: the demo's four stray reflections on path "drive", all
	// handled by the eyewear worn; page 1 gives the verdict.
	if !strings.Contains(flat, "4 findings (stray reflection)") || !strings.Contains(flat, "Controlled by goggles-780-1064") ||
		!strings.Contains(flat, "no defect and no hazard that a declared control does not handle") {
		t.Errorf("the PDF does not group the demo's findings with their controls, or lacks the verdict")
	}
	if n := strings.Count(flat, doc.SetupSHA256); n < pages+1 {
		t.Errorf("the hash appears %d times; want the title block and every footer (%d pages)", n, pages)
	}
}

// Same document and date: the same bytes, compressed or not.
func TestPDFReproducible(t *testing.T) {
	for _, c := range []bool{true, false} {
		a, _ := demoPDF(t, c)
		b, _ := demoPDF(t, c)
		if !bytes.Equal(a, b) {
			t.Errorf("compress=%v: two runs differ", c)
		}
	}
}

func TestPDFMetadata(t *testing.T) {
	pdf, _ := demoPDF(t, false)
	for _, want := range []string{"/Title", "/Author", "/Subject", "/Creator", "/CreationDate (D:20260102000000"} {
		if !bytes.Contains(pdf, []byte(want)) {
			t.Errorf("metadata lacks %s", want)
		}
	}
}

func BenchmarkReportDemo(b *testing.B) {
	for i := 0; i < b.N; i++ {
		demoPDF(b, true)
	}
}

// A title or name the font cannot draw (an emoji) is printed with Missing in
// its place, and said so; a title that looks like a page-count placeholder
// ("{nb}", or the private-use characters the footers use) is printed as
// written or as Missing, never as the page count.
func TestUndrawableAndPlaceholderText(t *testing.T) {
	data, err := os.ReadFile("../../testdata/examples/weak-probe.toml")
	if err != nil {
		t.Fatal(err)
	}
	a := safetytest.Evaluate(t, "weak-probe.toml", data)
	a.Setup.Meta.Title = "Table {nb} \U0001F52C probe \ue000\ue001"
	doc := report.Build(a, report.Meta{Date: "2026-01-02", ToolVersion: "test", SetupBytes: data})
	var b bytes.Buffer
	if err := Write(&b, doc, Options{Date: time.Date(2026, 1, 2, 0, 0, 0, 0, time.UTC)}); err != nil {
		t.Fatal(err)
	}
	if doc.Title != "Table {nb} \U0001F52C probe \ue000\ue001" {
		t.Errorf("Write changed the caller's document: %q", doc.Title)
	}
	text, pages := pdfText(t, b.Bytes())
	for _, want := range []string{"Table {nb} ? probe ??", "3 character(s) of the setup's text that the embedded font cannot draw are printed as \"?\"", fmt.Sprintf("page 1 of %d", pages)} {
		if !strings.Contains(text, want) {
			t.Errorf("PDF text lacks %q", want)
		}
	}
}

// A plot whose data hold NaN, infinities or non-positive values on a log
// axis is drawn without them: no such operand reaches the content stream.
func TestPlotLeavesOutNonFinite(t *testing.T) {
	doc := &report.Document{Title: "plot", Sections: []report.Section{{Heading: "p", Blocks: []report.Block{{Plot: &view.Plot{
		Title: "t", LogY: true,
		Series:  []view.Series{{Name: "s", X: []float64{0, 1, 2, 3}, Y: []float64{1, math.Inf(1), math.NaN(), -1}}},
		Markers: []view.Marker{{X: math.Inf(1), Label: "m"}},
		HLines:  []view.HLine{{Y: math.Inf(-1), Label: "h"}, {Y: 0, Label: "zero"}},
	}}, {Plot: &view.Plot{Title: "bars", Bars: []view.Bar{{Label: "a", Value: math.NaN()}, {Label: "b", Value: 2}}}}}}}}
	var b bytes.Buffer
	if err := Write(&b, doc, Options{Date: time.Date(2026, 1, 2, 0, 0, 0, 0, time.UTC)}); err != nil {
		t.Fatal(err)
	}
	if m := regexp.MustCompile(`(?i)\b(nan|[+-]?inf)\b`).Find(b.Bytes()); m != nil {
		t.Errorf("the PDF holds %q", m)
	}
	pdfText(t, b.Bytes()) // validates
}

// The sign-off's layout rules, held over every shipped example: no page
// ends with a heading (a heading moves to the next page with the start of
// what follows it), and a table that runs onto another page repeats its
// header there (the header of a long table appears once per page it is
// on).
func TestLayoutKeepsHeadingsWithTheirContent(t *testing.T) {
	safetytest.ForEachExample(t, "../..", func(t *testing.T, base, f string) {
		a, data := safetytest.EvaluateFile(t, f)
		doc := report.Build(a, report.Meta{Date: "2026-01-02", ToolVersion: "test", SetupBytes: data})
		d, replaced := drawableCopy(doc)
		_, w, err := draw(d, Options{Date: time.Date(2026, 1, 2, 0, 0, 0, 0, time.UTC)}, replaced)
		if err != nil {
			t.Fatal(err)
		}
		for p, heading := range w.pageEndsWithHeading {
			if heading {
				t.Errorf("page %d ends with a heading", p+1)
			}
		}
	})
}

// Columns empty on every row are left out of a table.
func TestDropEmptyColumns(t *testing.T) {
	got := dropEmptyColumns(&report.Table{Header: []string{"a", "b", "c"}, Right: []bool{false, true, true}, Rows: [][]string{{"1", "", "3"}, {"4", " ", ""}}})
	if strings.Join(got.Header, ",") != "a,c" || len(got.Right) != 2 || !got.Right[1] || strings.Join(got.Rows[1], ",") != "4," {
		t.Errorf("%+v", got)
	}
}

// The sign-offs of table C and table D render page by page in poppler's
// pdftoppm (a renderer other than the library that wrote them), every page
// to an image of its own. .ci/run installs poppler-utils; where pdftoppm is
// missing the test says so and skips.
func TestPagesRender(t *testing.T) {
	bin, err := exec.LookPath("pdftoppm")
	if err != nil {
		t.Skip("pdftoppm (poppler-utils) is not installed")
	}
	for _, name := range []string{"table-c", "table-d"} {
		a, data := safetytest.EvaluateFile(t, "../../testdata/examples/"+name+".toml")
		doc := report.Build(a, report.Meta{Date: "2026-01-02", ToolVersion: "test", SetupBytes: data})
		var b bytes.Buffer
		if err := Write(&b, doc, Options{Date: time.Date(2026, 1, 2, 0, 0, 0, 0, time.UTC)}); err != nil {
			t.Fatal(err)
		}
		dir := t.TempDir()
		pdf := filepath.Join(dir, name+".pdf")
		if err := os.WriteFile(pdf, b.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
		if out, err := exec.Command(bin, "-r", "20", "-png", pdf, filepath.Join(dir, "p")).CombinedOutput(); err != nil {
			t.Fatalf("%s: pdftoppm: %v %s", name, err, out)
		}
		_, pages := pdfText(t, b.Bytes())
		pngs, _ := filepath.Glob(filepath.Join(dir, "p-*.png"))
		if len(pngs) != pages {
			t.Errorf("%s: %d pages rendered of %d", name, len(pngs), pages)
		}
		for _, p := range pngs {
			if fi, err := os.Stat(p); err != nil || fi.Size() < 200 {
				t.Errorf("%s: page image %s is empty", name, p)
			}
		}
	}
}
