// Package safetytest holds the helpers that tests of the output packages
// share, in the manner of the standard library's httptest: evaluating a
// setup held in a test or read from testdata, and comparing an output with
// its golden file. Production code never imports it.
package safetytest

import (
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"testing"

	"beamledger/budget/setup"
	"beamledger/safety"
)

// Evaluate loads a setup from its bytes (name is used in messages) and
// evaluates it; any error fails the test.
func Evaluate(t testing.TB, name string, src []byte) *safety.Assessment {
	t.Helper()
	s, err := setup.Parse(name, src)
	if err != nil {
		t.Fatal(err)
	}
	a, err := safety.Evaluate(s)
	if err != nil {
		t.Fatal(err)
	}
	return a
}

// EvaluateFile reads and evaluates a setup file, returning the assessment
// and the file's bytes.
func EvaluateFile(t testing.TB, path string) (*safety.Assessment, []byte) {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return Evaluate(t, filepath.Base(path), data), data
}

// Golden compares got with the golden file at path, or rewrites the file
// when update is set (a failed write fails the test). A missing golden file
// is a failure, never a pass; a difference is shown as the first differing
// line with the lines around it.
func Golden(t testing.TB, path, got string, update bool) {
	t.Helper()
	if update {
		if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			t.Fatalf("writing the golden file: %v", err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("golden file: %v (run the test with -update to write it)", err)
	}
	if got == string(want) {
		return
	}
	t.Fatalf("%s differs:\n%s", path, Diff(string(want), got))
}

// GoldenRelTol is the relative tolerance GoldenJSON allows on numbers: a
// change in the last digits of a float (a reordered sum, another platform's
// math library) does not move a golden file; a change in a printed figure
// does.
const GoldenRelTol = 1e-9

// GoldenJSON compares a JSON document with the golden file at path like
// Golden, but numbers need only agree to GoldenRelTol (relative; absolute
// below 1e-300); keys, strings, nulls and the order of lists must match
// exactly. The first difference is reported by its place in the document.
func GoldenJSON(t testing.TB, path, got string, update bool) {
	t.Helper()
	if update {
		Golden(t, path, got, true)
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("golden file: %v (run the test with -update to write it)", err)
	}
	if got == string(want) {
		return
	}
	var w, g any
	if err := json.Unmarshal(want, &w); err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	if err := json.Unmarshal([]byte(got), &g); err != nil {
		t.Fatalf("%s: the output is not JSON: %v", path, err)
	}
	if where := JSONDiff("$", w, g, GoldenRelTol); where != "" {
		t.Fatalf("%s differs at %s", path, where)
	}
}

// JSONDiff is the place of the first difference between two decoded JSON
// values (with both values), numbers compared to a relative tolerance rel;
// "" when they agree.
func JSONDiff(at string, want, got any, rel float64) string {
	switch w := want.(type) {
	case map[string]any:
		g, ok := got.(map[string]any)
		if !ok {
			return fmt.Sprintf("%s: want an object, got %v", at, got)
		}
		keys := make([]string, 0, len(w)+len(g))
		for k := range w {
			keys = append(keys, k)
		}
		for k := range g {
			if _, ok := w[k]; !ok {
				keys = append(keys, k)
			}
		}
		sort.Strings(keys)
		for _, k := range keys {
			wv, wok := w[k]
			gv, gok := g[k]
			if !wok || !gok {
				return fmt.Sprintf("%s.%s: present in want %v, in got %v", at, k, wok, gok)
			}
			if d := JSONDiff(at+"."+k, wv, gv, rel); d != "" {
				return d
			}
		}
		return ""
	case []any:
		g, ok := got.([]any)
		if !ok || len(g) != len(w) {
			return fmt.Sprintf("%s: want a list of %d, got %v", at, len(w), describe(got))
		}
		for i := range w {
			if d := JSONDiff(fmt.Sprintf("%s[%d]", at, i), w[i], g[i], rel); d != "" {
				return d
			}
		}
		return ""
	case float64:
		g, ok := got.(float64)
		if !ok || math.Abs(g-w) > rel*math.Max(math.Abs(w), math.Abs(g)) && math.Abs(g-w) > 1e-300 {
			return fmt.Sprintf("%s: want %v, got %v", at, w, got)
		}
		return ""
	}
	if want != got {
		return fmt.Sprintf("%s: want %v, got %v", at, want, got)
	}
	return ""
}

func describe(v any) string {
	if l, ok := v.([]any); ok {
		return fmt.Sprintf("a list of %d", len(l))
	}
	return fmt.Sprint(v)
}

// Diff shows where two texts first differ: the differing line of each, with
// two lines of context before it, numbered.
func Diff(want, got string) string {
	wl, gl := strings.Split(want, "\n"), strings.Split(got, "\n")
	i := 0
	for i < len(wl) && i < len(gl) && wl[i] == gl[i] {
		i++
	}
	var b strings.Builder
	for k := max(0, i-2); k < i; k++ {
		b.WriteString("  " + strconv.Itoa(k+1) + "  " + wl[k] + "\n")
	}
	line := func(mark string, lines []string) {
		if i < len(lines) {
			b.WriteString(mark + strconv.Itoa(i+1) + "  " + lines[i] + "\n")
		} else {
			b.WriteString(mark + strconv.Itoa(i+1) + "  (end of text)\n")
		}
	}
	line("- ", wl)
	line("+ ", gl)
	return b.String()
}

// ForEachExample runs f as a subtest, named after the example, for every
// shipped example under root/testdata/examples; fewer than four examples
// fail the test.
func ForEachExample(t *testing.T, root string, f func(t *testing.T, name, path string)) {
	t.Helper()
	files, _ := filepath.Glob(filepath.Join(root, "testdata", "examples", "*.toml"))
	if len(files) < 4 {
		t.Fatalf("%d shipped examples found under %s, want at least 4", len(files), root)
	}
	for _, p := range files {
		name := strings.TrimSuffix(filepath.Base(p), ".toml")
		t.Run(name, func(t *testing.T) { f(t, name, p) })
	}
}

// AddSeeds adds to a fuzz target's corpus the named shipped examples and
// every accepted hostile setup, read from root's testdata.
func AddSeeds(f *testing.F, root string, examples ...string) {
	f.Helper()
	var files []string
	for _, name := range examples {
		files = append(files, filepath.Join(root, "testdata", "examples", name+".toml"))
	}
	hostile, _ := filepath.Glob(filepath.Join(root, "testdata", "hostile", "*.toml"))
	for _, p := range append(files, hostile...) {
		data, err := os.ReadFile(p)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(data)
	}
}
