package verify

import (
	"strings"
	"testing"

	"beamledger/safety/report"
)

// A figure edited in the body's tables alone, with the footers, the cover,
// the hazard record and the attachments left true, reads differently from
// the document written again from the attached setup: verify names the
// page, what it reads and what it should read (common practice: a signed
// document is checked against what it claims to be).
func TestBodyFigureEdited(t *testing.T) {
	edited := ""
	doc, _ := document(t, func(d *report.Document) {
		for i := range d.Sections {
			if d.Sections[i].Heading != "Hazards" {
				continue
			}
			for k := range d.Sections[i].Blocks {
				if tb := d.Sections[i].Blocks[k].Table; tb != nil && edited == "" {
					// The first open segment's eye ratio, one digit lower.
					for c, h := range tb.Header {
						if h == "eye ratio" {
							edited = tb.Rows[0][c]
							tb.Rows[0][c] = "1" + edited[1:]
							if tb.Rows[0][c] == edited {
								tb.Rows[0][c] = "9" + edited[1:]
							}
						}
					}
				}
			}
		}
	})
	if edited == "" {
		t.Fatal("the example's hazards have no table with an eye ratio to edit")
	}
	r, err := Check(doc, nil, "test", nil)
	if err != nil {
		t.Fatal(err)
	}
	if r.Match() || !r.BodyCompared || len(r.Pages) != 1 || !strings.HasPrefix(r.Pages[0], "page ") || !strings.Contains(r.Pages[0], `reads "`+edited+`"`) {
		t.Fatalf("an edited eye ratio (%s): match %v, compared %v, %q", edited, r.Match(), r.BodyCompared, r.Pages)
	}
}

// Unedited, every page reads as written again; a document written with
// --since, or by another version, is not written again, and says why.
func TestBodyComparedOrWhyNot(t *testing.T) {
	doc, _ := document(t, nil)
	r, err := Check(doc, nil, "test", nil)
	if err != nil || !r.Match() || !r.BodyCompared || r.BodyNote != "" {
		t.Fatalf("unedited: %+v, %v", r, err)
	}
	// A record edited to name another version, so that the pages would not
	// be written again, disagrees with the cover.
	doc, _ = document(t, func(d *report.Document) { d.Render.Tool = "0.0.9" })
	if r, err = Check(doc, nil, "test", nil); err != nil || r.Match() || r.BodyCompared || len(r.Pages) != 1 || !strings.Contains(r.Pages[0], `the cover's tool reads "beamledger test"`) {
		t.Fatalf("another version in the record alone: %q, %v", r.Pages, err)
	}
	doc, _ = document(t, func(d *report.Document) { d.Render.SinceSHA256 = strings.Repeat("ab", 32) })
	if r, err = Check(doc, nil, "test", nil); err != nil || !r.Match() || r.BodyCompared || !strings.Contains(r.BodyNote, "report --since") {
		t.Fatalf("--since: %+v, %v", r, err)
	}
}

// The render record reads back as written, whatever the setup file's name
// holds, and nothing else reads as one.
func TestRenderRecord(t *testing.T) {
	for _, rd := range []report.Render{
		{Tool: "0.1.0", SetupFile: "testdata/examples/table-c.toml", Date: "2026-01-02", Samples: 10000, Seed: 20261202},
		{Tool: "dev", SetupFile: "lab \"7\", seed 3, since x\n.toml", Date: "2026-12-31", Samples: 0, Seed: 1, SinceSHA256: strings.Repeat("0f", 32), SinceFile: "old \"rev\", since 0f.toml"},
	} {
		got, ok := report.ParseRender("the hazards found at sign-off, one per line; " + rd.String())
		if !ok || got != rd {
			t.Errorf("%q read back as %+v (%v)", rd.String(), got, ok)
		}
	}
	for _, s := range []string{
		"the hazards found at sign-off, one per line",
		`written by beamledger "x" from the setup file "a.toml", dated 2026-01-02, tolerance samples many, seed 1, since none`,
		`written by beamledger "x" from the setup file a.toml, dated 2026-01-02, tolerance samples 1, seed 1, since none`,
		`written by beamledger "x" from the setup file "a.toml", dated 2026-01-02, tolerance samples 1, seed 1, since none, and more`,
	} {
		if rd, ok := report.ParseRender(s); ok {
			t.Errorf("%q read as %+v", s, rd)
		}
	}
}

// BenchmarkVerifyDemo is verify of table C's sign-off: the attachments, the
// pages, the hazards again and the document written again.
func BenchmarkVerifyDemo(b *testing.B) {
	doc, _ := document(b, nil)
	for b.Loop() {
		if r, err := Check(doc, nil, "test", nil); err != nil || !r.Match() {
			b.Fatalf("%v, %+v", err, r)
		}
	}
}
