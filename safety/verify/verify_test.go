package verify

import (
	"bytes"
	"errors"
	"os"
	"slices"
	"strings"
	"testing"
	"time"

	"beamledger/safety/pdf"
	"beamledger/safety/report"
	"beamledger/safety/safetytest"
)

const example = "../../testdata/examples/table-c.toml"

// document writes the sign-off of the shipped example, after edit changes
// the document model (nil: as report writes it).
func document(t testing.TB, edit func(*report.Document)) ([]byte, []byte) {
	t.Helper()
	a, data := safetytest.EvaluateFile(t, example)
	doc := report.Build(a, report.Meta{Date: "2026-01-02", ToolVersion: "test", SetupBytes: data})
	if edit != nil {
		edit(doc)
	}
	var b bytes.Buffer
	if err := pdf.Write(&b, doc, pdf.Options{Date: time.Date(2026, 1, 2, 0, 0, 0, 0, time.UTC), Compress: true}); err != nil {
		t.Fatal(err)
	}
	return b.Bytes(), data
}

func TestMatch(t *testing.T) {
	doc, setup := document(t, nil)
	r, err := Check(doc, setup, "test", nil)
	if err != nil {
		t.Fatal(err)
	}
	if !r.Match() || !r.Given || !r.GivenMatches {
		t.Fatalf("the report of an unchanged setup does not match: %+v", r)
	}
	if r.SetupName != "table-c.toml" {
		t.Errorf("attached setup named %q, want table-c.toml", r.SetupName)
	}
	if r.SetupSHA256 != r.RecordedSHA256 || len(r.SetupSHA256) != 64 {
		t.Errorf("hash %q, recorded %q", r.SetupSHA256, r.RecordedSHA256)
	}
	// Without a setup file beside it, the document still checks itself.
	r, err = Check(doc, nil, "test", nil)
	if err != nil || !r.Match() || r.Given {
		t.Fatalf("document alone: %+v, %v", r, err)
	}
}

func TestModifiedSetup(t *testing.T) {
	doc, setup := document(t, nil)
	changed := bytes.Replace(setup, []byte("revision"), []byte("# edited\nrevision"), 1)
	if bytes.Equal(changed, setup) {
		t.Fatal("the example has no revision key to edit before")
	}
	r, err := Check(doc, changed, "test", nil)
	if err != nil {
		t.Fatal(err)
	}
	if r.Match() || r.GivenMatches {
		t.Fatalf("a setup edited after sign-off matches: %+v", r)
	}
}

func TestHashStatedDiffers(t *testing.T) {
	doc, _ := document(t, func(d *report.Document) {
		prefix := "00" // any other first two digits
		if d.SetupSHA256[:2] == prefix {
			prefix = "ff"
		}
		d.SetupSHA256 = prefix + d.SetupSHA256[2:]
	})
	r, err := Check(doc, nil, "test", nil)
	if err != nil {
		t.Fatal(err)
	}
	if r.Match() || r.SetupSHA256 == r.RecordedSHA256 {
		t.Fatalf("an attachment whose hash differs from the stated one matches: %+v", r)
	}
}

// A document whose recorded hazards differ from those this version finds
// (as one written by another version would) lists both sides.
func TestHazardsDiffer(t *testing.T) {
	var gone string
	doc, _ := document(t, func(d *report.Document) {
		gone = d.Hazards[0]
		d.Hazards = append([]string{"class: laser \"retired\" Class 4"}, d.Hazards[1:]...)
		setRecord(d, d.Hazards) // the pages as that version prints them
	})
	r, err := Check(doc, nil, "later", nil) // this is a later version
	if err != nil {
		t.Fatal(err)
	}
	if r.Match() {
		t.Fatal("different hazards match")
	}
	if r.BodyCompared || !strings.Contains(r.BodyNote, "written by beamledger test, this is later") {
		t.Errorf("another version's document: body compared %v, %q", r.BodyCompared, r.BodyNote)
	}
	if len(r.Pages) != 0 {
		t.Errorf("the pages and the attachments disagree: %q", r.Pages)
	}
	if !slices.Equal(r.Removed, []string{"class: laser \"retired\" Class 4"}) || !slices.Equal(r.Added, []string{gone}) {
		t.Errorf("removed %q, added %q; want the edited line removed and %q added", r.Removed, r.Added, gone)
	}
}

func TestNoAttachment(t *testing.T) {
	doc, _ := document(t, func(d *report.Document) { d.Setup = nil })
	_, err := Check(doc, nil, "test", nil)
	if !errors.Is(err, ErrUnusable) {
		t.Fatalf("a PDF without an attached setup: error %v, want ErrUnusable", err)
	}
}

func TestNotAPDF(t *testing.T) {
	data, err := os.ReadFile(example)
	if err != nil {
		t.Fatal(err)
	}
	for name, b := range map[string][]byte{"setup": data, "empty": nil, "truncated": []byte("%PDF-1.4\n1 0 obj\n")} {
		if _, err := Check(b, nil, "test", nil); !errors.Is(err, ErrUnusable) {
			t.Errorf("%s: error %v, want ErrUnusable", name, err)
		}
	}
}
