package main

import (
	"os/exec"
	"strings"
	"testing"
)

// layers is the project's import order, lowest first: a package may import
// the packages of lower layers only, in its code and in its tests (the
// folder tree reads the same way; DEVELOPERS.md draws it). numeric is below
// everything and units (quantities and their text) next; the other base
// packages know nothing of each other.
var layers = [][]string{
	{"budget/numeric"},
	{"budget/units"},
	{"limits", "budget/atoms", "budget/optics", "budget/setup/starter", "budget/setup/synth"},
	{"budget/setup"},
	{"budget"},
	{"budget/drive"},
	{"safety"},
	{"safety/safetytest"},
	{"safety/view", "safety/revision"},
	{"safety/report"},
	{"safety/pdf", "safety/page"},
	{"safety/verify"},
	{"cmd/beamledger"},
}

const module = "beamledger"

// layerOf returns each package's layer.
func layerOf() map[string]int {
	m := map[string]int{}
	for i, l := range layers {
		for _, p := range l {
			m[module+"/"+p] = i
		}
	}
	return m
}

// backArrows lists the imports of a package listing (lines "pkg|imports|
// test imports|external test imports", as go list writes them below) that
// go to the same or a higher layer, and the packages no layer names.
func backArrows(listing string, layer map[string]int) []string {
	var bad []string
	for _, line := range strings.Split(strings.TrimSpace(listing), "\n") {
		f := strings.Split(line, "|")
		pkg := f[0]
		own, ok := layer[pkg]
		if !ok {
			bad = append(bad, pkg+" is in no layer (add it to layers)")
			continue
		}
		seen := map[string]bool{}
		for i, kind := range []string{"imports", "its tests import", "its external tests import"} {
			for _, imp := range strings.Split(f[i+1], ",") {
				if imp == pkg || seen[kind+imp] || !(imp == module || strings.HasPrefix(imp, module+"/")) {
					continue
				}
				seen[kind+imp] = true
				if l, ok := layer[imp]; !ok || l >= own {
					bad = append(bad, pkg+" "+kind+" "+imp)
				}
			}
		}
	}
	return bad
}

// Every import goes down the layers: go list reads each package's imports
// and its tests' imports, and an import of the same or a higher layer is an
// error here even where the compiler would accept it.
func TestImportOrder(t *testing.T) {
	goTool, err := exec.LookPath("go")
	if err != nil {
		t.Skip("no go command to list the imports")
	}
	cmd := exec.Command(goTool, "list", "-f", `{{.ImportPath}}|{{join .Imports ","}}|{{join .TestImports ","}}|{{join .XTestImports ","}}`, module+"/...")
	out, err := cmd.Output()
	if err != nil {
		t.Fatal(err)
	}
	for _, b := range backArrows(string(out), layerOf()) {
		t.Error(b)
	}
}

// The check itself finds a back arrow, in code or in tests, and an
// unplaced package.
func TestBackArrowsFound(t *testing.T) {
	listing := module + "/budget/setup|" + module + "/budget/units," + module + "/budget||\n" +
		module + "/budget/optics||" + module + "/budget/drive|\n" +
		module + "/budget/extra|||\n" +
		module + "/safety|" + module + "/budget/drive,fmt||" + module + "/safety"
	got := backArrows(listing, layerOf())
	want := []string{
		module + "/budget/setup imports " + module + "/budget",
		module + "/budget/optics its tests import " + module + "/budget/drive",
		module + "/budget/extra is in no layer (add it to layers)",
	}
	if strings.Join(got, "\n") != strings.Join(want, "\n") {
		t.Errorf("got\n%s\nwant\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
	}
}
