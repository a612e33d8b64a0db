package verify

import (
	"bytes"
	"compress/zlib"
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/pdfcpu/pdfcpu/pkg/api"

	"beamledger/safety"
	"beamledger/safety/report"
	"beamledger/safety/safetytest"
)

func init() { api.DisableConfigDir() }

// setRecord prints hazards as the document's hazard record.
func setRecord(d *report.Document, hazards []string) {
	for i := range d.Sections {
		for k := range d.Sections[i].Blocks {
			if d.Sections[i].Blocks[k].Record != nil {
				d.Sections[i].Blocks[k].Record = hazards
			}
		}
	}
}

// attach writes doc with files added as attachments (name → content,
// description), through the PDF library's own writer.
func attach(t *testing.T, doc []byte, files map[string][2]string) []byte {
	t.Helper()
	dir := t.TempDir()
	var names []string
	for n, c := range files {
		p := filepath.Join(dir, n)
		if err := os.WriteFile(p, []byte(c[0]), 0o644); err != nil {
			t.Fatal(err)
		}
		if c[1] != "" {
			p += "," + c[1]
		}
		names = append(names, p)
	}
	var out bytes.Buffer
	if err := api.AddAttachments(bytes.NewReader(doc), &out, names, false, nil); err != nil {
		t.Fatal(err)
	}
	return out.Bytes()
}

// The pages of one setup with another setup attached, its hash in the
// attachment's description and its hazards as the attached list: the
// pages are what people signed, so verify says the two disagree and names
// the hashes, even given the attached file.
func TestPagesShowAnotherSetup(t *testing.T) {
	b, other := safetytest.EvaluateFile(t, "../../testdata/examples/table-c-rev4.toml")
	sum := sha256.Sum256(other)
	otherSHA := hex.EncodeToString(sum[:])
	var pagesSHA string
	doc, _ := document(t, func(d *report.Document) { d.Setup, pagesSHA = nil, d.SetupSHA256 })
	forged := attach(t, doc, map[string][2]string{
		"table-c.toml":           {string(other), "the setup file this document covers, SHA-256 " + otherSHA},
		report.HazardsAttachment: {strings.Join(safety.HazardDigest(b), "\n") + "\n", ""},
	})
	r, err := Check(forged, other, "test", nil)
	if err != nil {
		t.Fatal(err)
	}
	if r.Match() || !r.GivenMatches || r.SetupSHA256 != r.RecordedSHA256 {
		t.Fatalf("forged document: %+v", r)
	}
	all := strings.Join(r.Pages, "\n")
	for _, want := range []string{"every page", pagesSHA, otherSHA, "the cover states setup SHA-256 " + pagesSHA, "hazard line"} {
		if !strings.Contains(all, want) {
			t.Errorf("the disagreement does not name %q:\n%s", want, all)
		}
	}
}

// A hazard line changed on the pages alone, and a record left out.
func TestRecordOnThePages(t *testing.T) {
	doc, _ := document(t, func(d *report.Document) {
		h := append([]string{}, d.Hazards...)
		h[2] = strings.Replace(h[2], "OD", "OD 9 (edited)", 1)
		setRecord(d, h)
	})
	r, err := Check(doc, nil, "test", nil)
	if err != nil {
		t.Fatal(err)
	}
	// The record disagrees with the attached list, and the page with the
	// document written again.
	if r.Match() || len(r.Pages) != 2 || !strings.HasPrefix(r.Pages[0], "hazard line 3: the pages read") || !strings.Contains(r.Pages[0], "(edited)") ||
		!strings.HasPrefix(r.Pages[1], "page ") || !strings.Contains(r.Pages[1], "(edited)") {
		t.Fatalf("an edited record line: %q", r.Pages)
	}
	doc, _ = document(t, func(d *report.Document) { d.Sections = d.Sections[:len(d.Sections)-1] })
	if r, err = Check(doc, nil, "test", nil); err != nil || r.Match() || len(r.Pages) < 1 || !strings.Contains(r.Pages[0], "no hazard record") {
		t.Fatalf("no record: %q, %v", r.Pages, err)
	}
}

// Exactly one setup file; a name is printed escaped, never as a line of
// its own.
func TestOneSetupAttached(t *testing.T) {
	doc, setup := document(t, nil)
	for name, files := range map[string]map[string][2]string{
		"two setups":                {"other.toml": {string(setup), ""}},
		"a name that prints a line": {"x\n\x1b[32mThe document matches.toml": {string(setup), ""}},
		"a file of another kind":    {"notes.txt": {"hello", ""}},
	} {
		_, err := Check(attach(t, doc, files), nil, "test", nil)
		if !errors.Is(err, ErrUnusable) {
			t.Errorf("%s: error %v, want ErrUnusable", name, err)
			continue
		}
		if strings.ContainsAny(err.Error(), "\n\x1b") {
			t.Errorf("%s: the error prints a control character: %q", name, err)
		}
	}
	if got := AttachmentLabel("a\nb\x1b"); got != `"a\nb\x1b"` {
		t.Errorf("AttachmentLabel: %s", got)
	}
}

// minimalPDF is a one-page PDF whose page content is the given stream
// dictionary entries and data.
func minimalPDF(dict string, data []byte) []byte {
	var b bytes.Buffer
	b.WriteString("%PDF-1.4\n")
	off := []int{}
	obj := func(s string) {
		off = append(off, b.Len())
		b.WriteString(s)
	}
	obj("1 0 obj\n<< /Type /Catalog /Pages 2 0 R >>\nendobj\n")
	obj("2 0 obj\n<< /Type /Pages /Kids [3 0 R] /Count 1 >>\nendobj\n")
	obj("3 0 obj\n<< /Type /Page /Parent 2 0 R /MediaBox [0 0 200 200] /Contents 4 0 R >>\nendobj\n")
	obj(fmt.Sprintf("4 0 obj\n<< /Length %d %s >>\nstream\n", len(data), dict))
	b.Write(data)
	b.WriteString("\nendstream\nendobj\n")
	x := b.Len()
	fmt.Fprintf(&b, "xref\n0 5\n0000000000 65535 f \n")
	for _, o := range off {
		fmt.Fprintf(&b, "%010d 00000 n \n", o)
	}
	fmt.Fprintf(&b, "trailer\n<< /Size 5 /Root 1 0 R >>\nstartxref\n%d\n%%%%EOF\n", x)
	return b.Bytes()
}

// A compressed stream that expands past the bound is refused before the
// PDF reader decodes it; so is a filter a sign-off never uses.
func TestExpansionBounded(t *testing.T) {
	defer func(v int64) { maxInflatedBytes = v }(maxInflatedBytes)
	maxInflatedBytes = 1 << 20
	var z bytes.Buffer
	w := zlib.NewWriter(&z)
	w.Write(make([]byte, 2<<20))
	w.Close()
	_, err := Check(minimalPDF("/Filter /FlateDecode", z.Bytes()), nil, "test", nil)
	if !errors.Is(err, ErrUnusable) || !strings.Contains(err.Error(), "expand to more than the 1048576 bytes") {
		t.Errorf("a 2 MiB stream against a 1 MiB bound: %v", err)
	}
	// The same stream within the bound reads (and then carries no setup).
	maxInflatedBytes = 4 << 20
	if _, err := Check(minimalPDF("/Filter /FlateDecode", z.Bytes()), nil, "test", nil); err == nil || !strings.Contains(err.Error(), "no setup file") {
		t.Errorf("within the bound: %v", err)
	}
	_, err = Check(minimalPDF("/Filter /LZWDecode", []byte{0x80, 0x0b, 0x60, 0x50, 0x22, 0x0c, 0x0c, 0x85, 0x01}), nil, "test", nil)
	if !errors.Is(err, ErrUnusable) || !strings.Contains(err.Error(), "LZWDecode") {
		t.Errorf("an LZW stream: %v", err)
	}
}

// Text runs read as PDF 32000-1:2008 §7.3.4 and §9.4 define them: literal
// strings with their escapes (\n, \\, \(, octal \ddd, a backslash at the
// end of a line continuing it) and balanced parentheses, hexadecimal
// strings with an odd last digit taken as followed by 0, TJ arrays, and
// Td moving from the start of the current line.
func TestContentRuns(t *testing.T) {
	u16 := func(s string) string { // as the sign-off's fonts take text
		var b strings.Builder
		for _, r := range s {
			fmt.Fprintf(&b, "\\%03o\\%03o", r>>8, r&0xff)
		}
		return b.String()
	}
	c := []byte("BT 10 20 Td (" + u16("a(b)") + ")Tj 5 -2 Td [(" + u16("c") + ") -120 <0064 0065>] TJ ET\n" +
		"% a comment (not text)\nBT 1 2 Td (\\000x\\000\\(\\000\\)\\000\\\\) Tj ET BT 0 0 Td <00660067006>Tj ET")
	got := contentRuns(c)
	want := []run{{10, 20, "a(b)"}, {15, 18, "cde"}, {1, 2, "x()\\"}, {0, 0, "fg`"}}
	if fmt.Sprint(got) != fmt.Sprint(want) {
		t.Errorf("runs %v, want %v", got, want)
	}
	if got := (&lexer{b: []byte("(a\\\nb\\nc(d)e)")}).literal(); string(got) != "ab\nc(d)e" {
		t.Errorf("literal %q", got)
	}
}

// Any bytes a page's content stream may hold are read to their end,
// without a panic or an endless loop, and no run read is empty.
func FuzzContentRuns(f *testing.F) {
	f.Add([]byte("BT 10 20 Td (\\000a) Tj ET"))
	f.Add([]byte("BT [(\\000b) -5 <0063>] TJ T* (x) ' 1 2 (y) \" ET"))
	f.Add([]byte("((( \\"))
	f.Add([]byte("<< /A [ 1 2 ] >> % comment\r BT 1e400 0 Td <zz> Tj"))
	f.Fuzz(func(t *testing.T, c []byte) {
		for _, r := range contentRuns(c) {
			if r.text == "" {
				t.Fatalf("an empty run: %+v", r)
			}
		}
	})
}
