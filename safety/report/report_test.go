package report

import (
	"bytes"
	"flag"
	"path/filepath"
	"strings"
	"testing"

	"beamledger/budget"
	"beamledger/safety"
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
	want := "Sources|Beam paths|At the atoms|At each cloud, every beam counted together|Hazards|Eyewear|Where the limits come from|Assumptions|Cautions|Sign-off"
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
	s, err := budget.Load("../../testdata/examples/splitter-tree.toml")
	if err != nil {
		t.Fatal(err)
	}
	a, err := safety.Evaluate(s)
	if err != nil {
		t.Fatal(err)
	}
	return a
}
