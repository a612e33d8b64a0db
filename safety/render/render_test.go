package render

import (
	"encoding/json"
	"io"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"regexp"
	"strings"
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
	hostile, _ := filepath.Glob("../../testdata/hostile/*.toml")
	for _, h := range hostile {
		if data, err := os.ReadFile(h); err == nil {
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

// The JSON writer refuses a non-finite figure and names where it is, rather
// than write a document no reader can take.
func TestJSONRefusesNonFinite(t *testing.T) {
	type inner struct {
		V float64 `json:"v_w"`
	}
	doc := struct {
		A []inner            `json:"a"`
		M map[string]float64 `json:"m"`
	}{A: []inner{{1}, {math.Inf(1)}}}
	err := nonFinite(reflect.ValueOf(doc), "$")
	if err == nil || !strings.Contains(err.Error(), "$.a[1].v_w is +Inf") {
		t.Errorf("got %v", err)
	}
	doc.A[1].V, doc.M = 2, map[string]float64{"k": math.NaN()}
	if err := nonFinite(reflect.ValueOf(doc), "$"); err == nil || !strings.Contains(err.Error(), "$.m[k] is NaN") {
		t.Errorf("got %v", err)
	}
}
