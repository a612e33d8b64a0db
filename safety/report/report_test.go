package report

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"beamledger/budget"
	"beamledger/safety"
)

var update = flag.Bool("update", false, "rewrite the golden files")

// The model of every shipped example against its golden text.
func TestModelGolden(t *testing.T) {
	files, _ := filepath.Glob("../../testdata/examples/*.toml")
	if len(files) < 4 {
		t.Fatalf("%d examples", len(files))
	}
	for _, f := range files {
		base := strings.TrimSuffix(filepath.Base(f), ".toml")
		t.Run(base, func(t *testing.T) {
			doc := buildFor(t, f)
			var b bytes.Buffer
			if err := doc.WriteText(&b); err != nil {
				t.Fatal(err)
			}
			golden := filepath.Join("../../testdata/golden", base+".report.txt")
			if *update {
				os.WriteFile(golden, b.Bytes(), 0o644)
				return
			}
			want, err := os.ReadFile(golden)
			if err != nil {
				t.Fatalf("%v (go test ./safety/report -update writes it)", err)
			}
			if got := b.String(); got != string(want) {
				gl, wl := strings.Split(got, "\n"), strings.Split(string(want), "\n")
				for i := range gl {
					if i >= len(wl) || gl[i] != wl[i] {
						w := ""
						if i < len(wl) {
							w = wl[i]
						}
						t.Fatalf("%s differs at line %d:\n got: %q\nwant: %q", golden, i+1, gl[i], w)
					}
				}
				t.Fatalf("%s: golden has more lines", golden)
			}
		})
	}
}

func buildFor(t *testing.T, f string) *Document {
	t.Helper()
	data, err := os.ReadFile(f)
	if err != nil {
		t.Fatal(err)
	}
	s, err := budget.Parse(filepath.Base(f), data)
	if err != nil {
		t.Fatal(err)
	}
	a, err := safety.Evaluate(s)
	if err != nil {
		t.Fatal(err)
	}
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
	want := "Sources|Beam paths|At the atoms|Hazards|Eyewear|Assumptions|Cautions|Sign-off"
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
