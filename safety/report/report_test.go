package report

import (
	"bytes"
	"flag"
	"path/filepath"
	"strings"
	"testing"

	"beamledger/budget/setup"
	"beamledger/safety"
	"beamledger/safety/revision"
	"beamledger/safety/safetytest"
)

var update = flag.Bool("update", false, "rewrite the golden files")

// The model of every shipped example against its golden text (go test
// ./safety/report -update rewrites them; read the diff).
func TestModelGolden(t *testing.T) {
	safetytest.ForEachExample(t, "../..", func(t *testing.T, base, f string) {
		var b bytes.Buffer
		if err := buildFor(t, f).WriteText(&b); err != nil {
			t.Fatal(err)
		}
		safetytest.Golden(t, filepath.Join("testdata", "golden", base+".txt"), b.String(), *update)
	})
}

func buildFor(t *testing.T, f string) *Document {
	t.Helper()
	a, data := safetytest.EvaluateFile(t, f)
	return Build(a, Meta{Date: "2026-01-02", ToolVersion: "test", SetupBytes: data})
}

// The sections come in the order the sign-off needs, and the summary never
// calls the setup safe.
func TestModelOrderAndWording(t *testing.T) {
	doc := buildFor(t, "../../testdata/examples/table-c.toml")
	var heads []string
	for _, s := range doc.Sections {
		heads = append(heads, s.Heading)
	}
	want := "At a glance|Sources|Drawing of the beam paths|Beam paths|At the atoms|At each cloud, every beam counted together|Hazards|Eyewear|Control measures|Where the limits come from|Assumptions|Cautions|Sign-off|Hazard record"
	if got := strings.Join(heads, "|"); got != want {
		t.Errorf("sections %s, want %s", got, want)
	}
	if strings.Contains(doc.Summary, "is safe") || !strings.Contains(doc.Summary, "never replace") {
		t.Errorf("summary wording: %s", doc.Summary)
	}
	// SHA-256 of the file's bytes: checked against the standard library's
	// digest of the same bytes via a known vector (FIPS 180-4: "abc").
	d := Build(nil2(t), Meta{SetupBytes: []byte("abc")})
	if d.SetupSHA256 != "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad" {
		t.Errorf("hash %s", d.SetupSHA256)
	}
}

func nil2(t *testing.T) *safety.Assessment {
	s, err := setup.Load("../../testdata/examples/splitter-tree.toml")
	if err != nil {
		t.Fatal(err)
	}
	a, err := safety.Evaluate(s)
	if err != nil {
		t.Fatal(err)
	}
	return a
}

// report --since: the document opens with the changes since the previous
// revision, naming its title, revision and SHA-256 (model golden).
func TestModelSince(t *testing.T) {
	old, oldData := safetytest.EvaluateFile(t, "../../testdata/examples/table-c.toml")
	a, data := safetytest.EvaluateFile(t, "../../testdata/examples/table-c-rev4.toml")
	r, err := revision.Compare(revision.Revision{File: "table-c.toml", Data: oldData, Assessment: old}, revision.Revision{File: "table-c-rev4.toml", Data: data, Assessment: a})
	if err != nil {
		t.Fatal(err)
	}
	doc := Build(a, Meta{Date: "2026-01-02", ToolVersion: "test", SetupBytes: data, Since: r})
	if doc.Sections[1].Heading != "Changes since the previous revision" {
		t.Fatalf("second section %q, want the changes right after the digest", doc.Sections[1].Heading)
	}
	var b bytes.Buffer
	if err := doc.WriteText(&b); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"Elongated cloud, table C, revision draft 3 (table-c.toml, SHA-256 8530eb49c7e67a57fb0ae66ea30e24c96fabb523d2270e8734005b06fb424f41)", "[safety] changed laser \"probe-amp\": power: \"1.5 W\" → \"2 W\""} {
		if !strings.Contains(b.String(), want) {
			t.Errorf("the section lacks %q", want)
		}
	}
	safetytest.Golden(t, filepath.Join("testdata", "golden", "table-c-rev4-since.txt"), b.String(), *update)
}

// A subheading always has content under it: it is neither the last block
// of its section nor followed by an empty block (a digest with nothing for
// the physicist says so in a line).
func TestSubheadingsHaveContent(t *testing.T) {
	empty := func(b Block) bool {
		return b.Subheading == "" && b.Paragraph == "" && len(b.Bullets) == 0 && b.Table == nil && b.Plot == nil && b.Drawing == nil && b.SignOff == nil
	}
	safetytest.ForEachExample(t, "../..", func(t *testing.T, base, f string) {
		for _, s := range buildFor(t, f).Sections {
			for i, b := range s.Blocks {
				if b.Subheading != "" && (i+1 == len(s.Blocks) || empty(s.Blocks[i+1]) || s.Blocks[i+1].Subheading != "") {
					t.Errorf("section %q: subheading %q has no content under it", s.Heading, b.Subheading)
				}
			}
		}
	})
}
