package view

import (
	"encoding/json"
	"flag"
	"io"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"beamledger/budget/setup"
	"beamledger/safety"
	"beamledger/safety/safetytest"
)

// Any setup that loads renders as text and as valid JSON: no NaN or Inf
// reaches the encoder.
func FuzzRender(f *testing.F) {
	safetytest.AddSeeds(f, "../..", "table-c", "splitter-tree", "weak-probe")
	f.Fuzz(func(t *testing.T, data []byte) {
		s, err := setup.Parse("fuzz.toml", data)
		if err != nil {
			return
		}
		a, err := safety.Evaluate(s)
		if err != nil {
			return
		}
		var text strings.Builder
		if err := Text(&text, a); err != nil {
			t.Fatal(err)
		}
		if m := nonFiniteWord.FindString(text.String()); m != "" {
			t.Fatalf("the text output prints %q", m)
		}
		pr, pw := io.Pipe()
		go func() { pw.CloseWithError(JSON(pw, a)) }()
		var doc map[string]any
		if err := json.NewDecoder(pr).Decode(&doc); err != nil {
			t.Fatalf("JSON output does not decode (a non-finite figure is refused by the writer): %v", err)
		}
		io.Copy(io.Discard, pr)
	})
}

// nonFiniteWord finds a number printed as NaN or infinity.
var nonFiniteWord = regexp.MustCompile(`\b(NaN|[+-]?Inf)\b`)

var update = flag.Bool("update", false, "rewrite the golden files under testdata/golden")

// The text and JSON of every shipped example against their golden files
// (go test ./safety/view -update rewrites them; read the diff).
func TestGolden(t *testing.T) {
	safetytest.ForEachExample(t, "../..", func(t *testing.T, base, f string) {
		data, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		// The name is the one `check` prints when run from the repository.
		a := safetytest.Evaluate(t, "testdata/examples/"+base+".toml", data)
		var text, js strings.Builder
		if err := Text(&text, a); err != nil {
			t.Fatal(err)
		}
		if err := JSON(&js, a); err != nil {
			t.Fatal(err)
		}
		safetytest.Golden(t, filepath.Join("testdata", "golden", base+".txt"), text.String(), *update)
		safetytest.GoldenJSON(t, filepath.Join("testdata", "golden", base+".json"), js.String(), *update)
	})
}
