package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/pdfcpu/pdfcpu/pkg/api"
	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu/model"

	"beamledger/budget/setup/synth"
	"beamledger/safety"
	"beamledger/safety/report"
	"beamledger/safety/safetytest"
	"beamledger/safety/view"
)

// Every file in testdata/hostile is a setup that must be accepted and must
// give the outcome its .want file lists, one line each:
//
//	exit N               check's exit status
//	finding SEV KIND     a finding of that severity and kind in the JSON
//	text S / no-text S   the text output holds (or lacks) S
//	json S               the JSON output holds S
//	report ok            report writes a PDF that pdfcpu validates (exit 0 or 1)
//	                     and that verify matches with the setup (exit 0)

func init() {
	// Validate documents without pdfcpu writing its configuration into
	// the user's directory.
	api.DisableConfigDir()
}

func TestHostileCorpus(t *testing.T) {
	t.Chdir("../..")
	files, _ := filepath.Glob("testdata/hostile/*.toml")
	if len(files) < 10 {
		t.Fatalf("%d hostile inputs, want at least 10", len(files))
	}
	for _, f := range files {
		name := strings.TrimSuffix(filepath.Base(f), ".toml")
		t.Run(name, func(t *testing.T) {
			want, err := os.ReadFile(strings.TrimSuffix(f, ".toml") + ".want")
			if err != nil {
				t.Fatalf("no expected outcome: %v", err)
			}
			text, errOut, code := runCLI(t, "check", f)
			js, _, jsCode := runCLI(t, "check", "--json", f)
			if code >= exitBadInput || jsCode != code {
				t.Fatalf("check: exit %d (--json %d), stderr %q", code, jsCode, errOut)
			}
			var doc struct {
				Findings []struct{ Severity, Kind string } `json:"findings"`
			}
			if err := json.Unmarshal([]byte(js), &doc); err != nil {
				t.Fatalf("JSON: %v", err)
			}
			for _, line := range strings.Split(strings.TrimSpace(string(want)), "\n") {
				verb, arg, _ := strings.Cut(line, " ")
				switch verb {
				case "exit":
					if n, _ := strconv.Atoi(arg); code != n {
						t.Errorf("exit %d, want %d", code, n)
					}
				case "finding":
					sev, kind, _ := strings.Cut(arg, " ")
					found := false
					for _, fd := range doc.Findings {
						found = found || (fd.Severity == sev && fd.Kind == kind)
					}
					if !found {
						t.Errorf("no %s finding of kind %s in %+v", sev, kind, doc.Findings)
					}
				case "text":
					if !strings.Contains(text, arg) {
						t.Errorf("text lacks %q", arg)
					}
				case "no-text":
					if strings.Contains(text, arg) {
						t.Errorf("text holds %q", arg)
					}
				case "json":
					if !strings.Contains(js, arg) {
						t.Errorf("JSON lacks %q", arg)
					}
				case "report":
					out := filepath.Join(t.TempDir(), "r.pdf")
					if _, errOut, code := runCLI(t, "report", f, "-o", out, "--date", "2026-01-02"); code >= exitBadInput {
						t.Errorf("report: exit %d, %q", code, errOut)
					} else if err := api.ValidateFile(out, model.NewDefaultConfiguration()); err != nil {
						t.Errorf("the PDF does not validate: %v", err)
					} else if vOut, vErr, code := runCLI(t, "verify", out, f); code != exitOK {
						// The pages read back as written, whatever the setup's text.
						t.Errorf("verify of its own sign-off: exit %d, %q %q", code, vOut, vErr)
					}
				default:
					t.Fatalf("unknown line %q in the .want file", line)
				}
			}
		})
	}
}

// nonFiniteWord finds a number printed as NaN or infinity.
var nonFiniteWord = regexp.MustCompile(`\b(NaN|[+-]?Inf)\b`)

// No output of any accepted setup holds a NaN or an infinity: the text, the
// JSON (whose writer refuses a non-finite number) and the sign-off model,
// over the shipped examples, the hostile corpus and generated labs.
func TestNoNonFiniteOutput(t *testing.T) {
	t.Chdir("../..")
	sources := map[string][]byte{}
	for _, pattern := range []string{"testdata/examples/*.toml", "testdata/hostile/*.toml", "testdata/scale/*.toml"} {
		files, _ := filepath.Glob(pattern)
		for _, f := range files {
			data, err := os.ReadFile(f)
			if err != nil {
				t.Fatal(err)
			}
			sources[f] = data
		}
	}
	for seed := uint64(1); seed <= 40; seed++ {
		o := synth.Options{Lasers: 1 + int(seed%3), ElementsPerPath: 4 + int(seed%9), Splits: int(seed % 3), OpenEnds: seed%2 == 0}
		sources[fmt.Sprintf("generated-%d.toml", seed)] = []byte(synth.Lab(seed, o))
	}
	for name, data := range sources {
		t.Run(name, func(t *testing.T) {
			checkFiniteOutputs(t, safetytest.Evaluate(t, name, data), data)
		})
	}
}

func checkFiniteOutputs(t *testing.T, a *safety.Assessment, data []byte) {
	t.Helper()
	var text, js, model bytes.Buffer
	if err := view.Text(&text, a); err != nil {
		t.Fatal(err)
	}
	if err := view.JSON(&js, a); err != nil {
		t.Fatalf("JSON: %v", err)
	}
	doc := report.Build(a, report.Meta{Date: "2026-01-02", ToolVersion: "test", SetupBytes: data})
	if err := doc.WriteText(&model); err != nil {
		t.Fatal(err)
	}
	for what, b := range map[string]*bytes.Buffer{"text": &text, "JSON": &js, "report model": &model} {
		if m := nonFiniteWord.FindString(b.String()); m != "" {
			i := strings.Index(b.String(), m)
			t.Errorf("%s holds %q: …%s…", what, m, b.String()[max(0, i-80):min(b.Len(), i+20)])
		}
	}
}
