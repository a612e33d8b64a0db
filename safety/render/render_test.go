package render

import (
	"encoding/json"
	"io"
	"os"
	"testing"

	"beamledger/budget"
	"beamledger/safety"
)

// Any setup that loads renders as text and as valid JSON: no NaN or Inf
// reaches the encoder.
func FuzzRender(f *testing.F) {
	for _, name := range []string{"table-c", "splitter-tree", "weak-probe"} {
		if data, err := os.ReadFile("../../testdata/examples/" + name + ".toml"); err == nil {
			f.Add(data)
		}
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		s, err := budget.Parse("fuzz.toml", data)
		if err != nil {
			return
		}
		a, err := safety.Evaluate(s)
		if err != nil {
			return
		}
		if err := Text(io.Discard, a); err != nil {
			t.Fatal(err)
		}
		pr, pw := io.Pipe()
		go func() { pw.CloseWithError(JSON(pw, a)) }()
		var doc map[string]any
		if err := json.NewDecoder(pr).Decode(&doc); err != nil {
			t.Fatalf("JSON output does not decode: %v", err)
		}
		io.Copy(io.Discard, pr)
	})
}
