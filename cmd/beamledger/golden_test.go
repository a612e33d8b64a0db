package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
	"time"

	"beamledger/safety/safetytest"
)

// runCLI runs the command line from the repository root with a pinned clock.
func runCLI(t *testing.T, args ...string) (stdout, stderr string, code int) {
	t.Helper()
	var out, errOut bytes.Buffer
	e := &env{stdout: &out, stderr: &errOut,
		now:    func() time.Time { return time.Date(2026, 1, 2, 3, 4, 5, 0, time.UTC) },
		getenv: func(string) string { return "" }, interrupts: noInterrupts}
	code = e.execute(args)
	return out.String(), errOut.String(), code
}

// noInterrupts delivers no signal.
func noInterrupts() (<-chan os.Signal, func()) { return nil, func() {} }

// Every shipped example has a known exit status, and check prints exactly
// the renderer's golden text and JSON (safety/view/testdata/golden, which
// go test ./safety/view -update rewrites).
func TestCheckGolden(t *testing.T) {
	t.Chdir("../..")
	files, err := filepath.Glob("testdata/examples/*.toml")
	if err != nil || len(files) < 4 {
		t.Fatalf("examples: %v (%d found)", err, len(files))
	}
	wantCode := map[string]int{
		"table-c":           exitOK,       // every hazard controlled by the eyewear worn (and training with a written procedure for the skin); every control Class 4 needs declared
		"elliptical-diode":  exitFindings, // open beams above the MPE, no controls declared
		"clipped-telescope": exitFindings, // open end
		"splitter-tree":     exitFindings, // dumps under-rated
		"weak-probe":        exitOK,       // below the MPE everywhere, goal met
		"ablation-pulse":    exitFindings, // open pulsed beam above the MPE, no controls declared
		"table-d":           exitFindings, // the green band's scale number too low, no entry control, a fibre face over its limit
		"table-c-rev4":      exitFindings, // as table-c, and the trap beam ends open
		"goal-short":        exitOK,       // only a drive goal short (exit 1 with --fail-on-goals)
	}
	for _, f := range files {
		base := strings.TrimSuffix(filepath.Base(f), ".toml")
		t.Run(base, func(t *testing.T) {
			code, known := wantCode[base]
			if !known {
				t.Fatalf("no expected exit status for %s; add it to wantCode", base)
			}
			for _, c := range []struct{ flag, ext string }{{"", ".txt"}, {"--json", ".json"}} {
				args := []string{"check", f}
				if c.flag != "" {
					args = []string{"check", c.flag, f}
				}
				out, errOut, got := runCLI(t, args...)
				if got != code {
					t.Errorf("%v: exit %d, want %d (stderr %q)", args, got, code, errOut)
				}
				golden := filepath.Join("safety", "view", "testdata", "golden", base+c.ext)
				if c.ext == ".json" {
					safetytest.GoldenJSON(t, golden, out, false)
				} else {
					safetytest.Golden(t, golden, out, false)
				}
			}
		})
	}
}

// The JSON output round-trips: decoding it and encoding it again gives the
// same document (no NaN, no value that JSON cannot hold).
func TestCheckJSONRoundTrip(t *testing.T) {
	t.Chdir("../..")
	files, _ := filepath.Glob("testdata/examples/*.toml")
	for _, f := range files {
		out, _, _ := runCLI(t, "check", "--json", f)
		var doc any
		if err := json.Unmarshal([]byte(out), &doc); err != nil {
			t.Fatalf("%s: %v", f, err)
		}
		var b bytes.Buffer
		enc := json.NewEncoder(&b)
		enc.SetIndent("", "  ")
		enc.SetEscapeHTML(false)
		if err := enc.Encode(doc); err != nil {
			t.Fatal(err)
		}
		var again any
		if err := json.Unmarshal(b.Bytes(), &again); err != nil || !reflect.DeepEqual(doc, again) {
			t.Errorf("%s: JSON does not round-trip", f)
		}
	}
}

// Identical input gives byte-identical text and JSON, run after run.
func TestDeterministicOutput(t *testing.T) {
	t.Chdir("../..")
	for _, args := range [][]string{{"check", "testdata/examples/table-c.toml"}, {"check", "--json", "testdata/examples/splitter-tree.toml"}} {
		first, _, _ := runCLI(t, args...)
		for i := 0; i < 5; i++ {
			if again, _, _ := runCLI(t, args...); again != first {
				t.Fatalf("%v: run %d differs", args, i+2)
			}
		}
	}
}
