package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"beamledger/budget"
)

func TestCheckBadInputExit2(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "lab.toml")
	src := "[[laser]]\nname = \"l\"\nwavelength = \"780 nm\"\npower = \"5 mm\"\nwaist = \"1 mm\"\n"
	if err := os.WriteFile(bad, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	out, errOut, code := runCLI(t, "check", bad)
	if code != exitBadInput {
		t.Errorf("exit %d, want %d", code, exitBadInput)
	}
	if out != "" {
		t.Errorf("wrote to stdout on bad input: %q", out)
	}
	want := bad + `:4: laser "l": power: "5 mm" is a length, want a power`
	if !strings.Contains(errOut, want) {
		t.Errorf("stderr %q, want it to contain %q", errOut, want)
	}
}

func TestCheckUsage(t *testing.T) {
	if _, _, code := runCLI(t, "check"); code != exitBadInput {
		t.Errorf("check without a file: exit %d, want %d", code, exitBadInput)
	}
	if _, errOut, code := runCLI(t, "check", "/no/such/file.toml"); code != exitBadInput || !strings.Contains(errOut, "no such file") {
		t.Errorf("missing file: exit %d, stderr %q", code, errOut)
	}
}

func TestInitWritesLoadableStarterAndNeverOverwrites(t *testing.T) {
	name := filepath.Join(t.TempDir(), "mylab.toml")
	if _, errOut, code := runCLI(t, "init", name); code != exitOK {
		t.Fatalf("init: exit %d: %s", code, errOut)
	}
	s, err := budget.Load(name)
	if err != nil {
		t.Fatalf("the starter file does not load: %v", err)
	}
	if len(s.Lasers) == 0 || len(s.Paths) == 0 || s.Meta.Title == "Elongated cloud, table C" {
		t.Errorf("starter should be its own invented scenario with a laser and a path")
	}
	if _, _, code := runCLI(t, "check", name); code == exitBadInput {
		t.Errorf("check on the starter file: exit %d", code)
	}
	before, _ := os.ReadFile(name)
	os.WriteFile(name, []byte("# mine\n"), 0o644)
	_, errOut, code := runCLI(t, "init", name)
	if code != exitBadInput || !strings.Contains(errOut, "already exists") {
		t.Errorf("second init: exit %d, stderr %q", code, errOut)
	}
	if after, _ := os.ReadFile(name); string(after) != "# mine\n" {
		t.Errorf("init overwrote the file (had %d bytes)", len(before))
	}
}

func TestVersion(t *testing.T) {
	out, _, code := runCLI(t, "version")
	if code != exitOK || out != "beamledger "+version+"\n" {
		t.Errorf("version: %d %q", code, out)
	}
}

func TestTransitionsListsEverySource(t *testing.T) {
	out, _, code := runCLI(t, "transitions")
	if code != exitOK {
		t.Fatalf("exit %d", code)
	}
	for _, want := range []string{"Rb87 D2", "Rb87 D1", "Rb85 D2", "Cs133 D2", "Cs133 D1", "Na23 D2", "K39 D2", "Li6 D2",
		"Sr88 461 nm", "Sr88 689 nm", "Yb174 399 nm", "Yb174 556 nm", "I_sat = 1.66933 mW/cm²", "isotropic 3.57713 mW/cm²", "source: D. A. Steck"} {
		if !strings.Contains(out, want) {
			t.Errorf("transitions output lacks %q", want)
		}
	}
}
