package main

import (
	"bytes"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strings"
	"testing"
	"time"

	"beamledger/budget/setup"
)

// largestLab writes an invented setup at every size limit at once: the most
// lasers, paths, elements, atoms elements (each with a collective goal, the
// costliest), clouds and eyewear a setup may have.
func largestLab() string {
	var b strings.Builder
	b.WriteString("# Invented: the largest setup beamledger accepts, for the speed test.\n[setup]\ntitle = \"Largest accepted setup\"\n\n")
	for c := 0; c < setup.MaxClouds; c++ {
		fmt.Fprintf(&b, "[[cloud]]\nname = \"c%d\"\ntransition = \"Rb87 D2\"\natoms = 20000\nrms_size = [\"6 um\", \"6 um\", \"150 um\"]\n\n", c)
	}
	for w := 0; w < setup.MaxEyewear; w++ {
		fmt.Fprintf(&b, "[[eyewear]]\nname = \"g%d\"\nbands = [{ from = \"%d nm\", to = \"%d nm\", od = 5 }]\n\n", w, 400+w, 500+w)
	}
	pathsPerLaser := setup.MaxPaths / setup.MaxLasers
	elementsPerPath := setup.MaxElements / setup.MaxPaths
	atomsPaths := setup.MaxAtomsElements / setup.MaxLasers // per laser
	for l := 0; l < setup.MaxLasers; l++ {
		fmt.Fprintf(&b, "[[laser]]\nname = \"L%d\"\nwavelength = \"780.24 nm\"\npower = \"%d mW\"\nwaist = [\"1.1 mm\", \"0.6 mm\"]\nm2 = [1.3, 1.1]\ndetuning = \"0 Hz\"\n\n", l, 100+l)
		for p := 0; p < pathsPerLaser; p++ {
			from := fmt.Sprintf("L%d", l)
			if p > 0 {
				from = fmt.Sprintf("L%dp%d:s", l, p-1)
			}
			fmt.Fprintf(&b, "[[path]]\nname = \"L%dp%d\"\nfrom = %q\n", l, p, from)
			n := 0
			el := func(format string, args ...any) {
				n++
				fmt.Fprintf(&b, "  [[path.element]]\n  at = \"%d mm\"\n"+format, append([]any{100 * n}, args...)...)
			}
			el("  type = \"lens\"\n  focal_length = \"200 mm\"\n  aperture = \"25 mm\"\n")
			if p < pathsPerLaser-1 {
				el("  type = \"splitter\"\n  name = \"s\"\n  transmission = 0.5\n")
			} else {
				el("  type = \"mirror\"\n  reflectivity = 0.99\n")
			}
			if p < atomsPaths {
				el("  type = \"atoms\"\n  cloud = \"c%d\"\n  goal = \"collective\"\n  goal_factor = 1.5\n", (l*atomsPaths+p)%setup.MaxClouds)
			}
			for n < elementsPerPath-1 {
				el("  type = \"window\"\n  transmission = 0.99\n")
			}
			el("  type = \"dump\"\n  rating = \"1 W\"\n")
		}
	}
	return b.String()
}

// The largest setup the loader accepts is checked and reported (exit
// below 2); one element more is refused with the limit named. How long it
// takes is measured by BenchmarkLargestAcceptedSetup, never asserted here.
func TestLargestAcceptedSetup(t *testing.T) {
	if raceEnabled || testing.Short() {
		t.Skip("the largest setup: not under the race detector or -short (minutes there)")
	}
	dir := t.TempDir()
	src := largestLab()
	f := filepath.Join(dir, "largest.toml")
	if err := os.WriteFile(f, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, errOut, code := runCLI(t, "check", f); code >= exitBadInput {
		t.Fatalf("check: exit %d, %s", code, errOut)
	}
	if _, errOut, code := runCLI(t, "report", f, "-o", filepath.Join(dir, "largest.pdf"), "--date", "2026-01-02"); code >= exitBadInput {
		t.Fatalf("report: exit %d, %s", code, errOut)
	}
	over := strings.Replace(src, "[[laser]]\nname = \"L0\"", "[[laser]]\nname = \"extra\"\nwavelength = \"780 nm\"\npower = \"1 mW\"\nwaist = \"1 mm\"\n\n[[laser]]\nname = \"L0\"", 1)
	if err := os.WriteFile(f, []byte(over), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, errOut, code := runCLI(t, "check", f); code != exitBadInput || !strings.Contains(errOut, "the setup has 501 lasers, more than the 500 a setup may have") {
		t.Errorf("one laser over the limit: exit %d, %q", code, errOut)
	}
}

// BenchmarkLargestAcceptedSetup times check and report on the largest
// setup the loader accepts (docs/speed.md's size limits give the figures):
// go test -run '^$' -bench LargestAcceptedSetup -benchtime 1x ./cmd/beamledger
func BenchmarkLargestAcceptedSetup(b *testing.B) {
	dir := b.TempDir()
	f := filepath.Join(dir, "largest.toml")
	if err := os.WriteFile(f, []byte(largestLab()), 0o644); err != nil {
		b.Fatal(err)
	}
	for _, c := range []struct {
		name string
		args []string
	}{{"check", []string{"check", f}}, {"report", []string{"report", f, "-o", filepath.Join(dir, "largest.pdf"), "--force", "--date", "2026-01-02"}}} {
		b.Run(c.name, func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				var out, errOut bytes.Buffer
				if code := run(c.args, &out, &errOut); code >= exitBadInput {
					b.Fatalf("%s: exit %d, %s", c.name, code, errOut.String())
				}
			}
		})
	}
}

// Files that never end, directories and devices are refused at once.
func TestUnreadableSources(t *testing.T) {
	for _, tc := range []struct{ file, want string }{
		{"/dev/zero", "is not a regular file"},
		{t.TempDir(), "is a directory, not a setup file"},
	} {
		t.Run(tc.file, func(t *testing.T) {
			done := make(chan struct{})
			var errOut string
			var code int
			go func() {
				defer close(done)
				_, errOut, code = runCLI(t, "check", tc.file)
			}()
			select {
			case <-done:
			case <-time.After(10 * time.Second):
				t.Fatalf("%s: check did not return", tc.file)
			}
			if code != exitBadInput || !strings.Contains(errOut, tc.want) {
				t.Errorf("%s: exit %d, %q", tc.file, code, errOut)
			}
		})
	}
}

// The command starts in a few milliseconds: it links no package whose
// initialisation is slow. pdfcpu's api package brings in a text-width
// table built at start-up (30 ms, measured with GODEBUG=inittrace=1); the
// tests may use it, the command may not.
func TestNoSlowStartPackages(t *testing.T) {
	goTool, err := exec.LookPath("go")
	if err != nil {
		t.Skip("no go command to list the dependencies")
	}
	out, err := exec.Command(goTool, "list", "-deps", "beamledger/cmd/beamledger").Output()
	if err != nil {
		t.Fatal(err)
	}
	for _, slow := range []string{"github.com/mattn/go-runewidth", "github.com/pdfcpu/pdfcpu/pkg/api"} {
		if slices.Contains(strings.Fields(string(out)), slow) {
			t.Errorf("the command links %s", slow)
		}
	}
}
