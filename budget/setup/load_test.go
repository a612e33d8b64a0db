package setup

import (
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"regexp"
	"slices"
	"strings"
	"testing"

	"beamledger/budget/setup/synth"
)

func TestLoadDemo(t *testing.T) {
	s, err := Load("../../testdata/examples/table-c.toml")
	if err != nil {
		t.Fatal(err)
	}
	if len(s.Lasers) != 2 || len(s.Paths) != 3 || len(s.Clouds) != 1 {
		t.Fatalf("got %d lasers, %d paths, %d clouds", len(s.Lasers), len(s.Paths), len(s.Clouds))
	}
	las := s.Lasers[0]
	if las.Name != "probe-amp" || !near(las.Wavelength, 780.24e-9, 1e-12) || las.Power != 1.5 || !near(las.OperatingPower, 1.1, 1e-12) ||
		las.Waist != [2]float64{1.1e-3, 0.6e-3} || las.M2 != [2]float64{1.6, 1.3} || las.Detuning != 80e6 {
		t.Errorf("laser probe-amp read as %+v", las)
	}
	if trap := s.Lasers[1]; !near(trap.Waist[0], 0.9e-3, 1e-12) || trap.Waist[1] != trap.Waist[0] || trap.M2 != [2]float64{1.1, 1.1} || trap.Emission != EmissionCW {
		t.Errorf("laser trap read as %+v", trap)
	}
	drive := s.Paths[0]
	if len(drive.Elements) != 9 || drive.Elements[0].Order != -1 || *drive.Elements[0].Efficiency != 0.8 || drive.Elements[0].Aperture != 2.5e-3 {
		t.Errorf("drive path read as %+v", drive.Elements[0])
	}
	if e := drive.Elements[6]; e.Cloud != "pencil" || e.Goal != GoalCollective || e.GoalFactor != 1.5 {
		t.Errorf("atoms element read as %+v", e)
	}
	if e := s.Paths[2].Elements[4]; e.Goal != GoalTrapDepth || !near(*e.GoalValue, 0.5e-3, 1e-12) {
		t.Errorf("trap atoms element read as %+v", e)
	}
	if mon := s.Paths[1]; mon.Parent != drive || mon.ParentPort != drive.Elements[3] || mon.Laser != las {
		t.Errorf("monitor path not linked to drive:pick")
	}
	if s.Paths[2].Access != AccessEnclosed || drive.Elements[5].Access != AccessVacuum {
		t.Errorf("access not read")
	}
	if c := s.Clouds[0]; c.RMSSize != [3]float64{6e-6, 6e-6, 150e-6} || c.Atoms != 2e4 || c.Saturation != SaturationCycling {
		t.Errorf("cloud read as %+v", c)
	}
}

const okLaser = `
[[laser]]
name = "l"
wavelength = "780 nm"
power = "1 W"
waist = "1 mm"
`

const okPath = `
[[path]]
name = "p"
from = "l"
  [[path.element]]
  type = "dump"
  at = "1 m"
`

// Every class of bad input gives one message naming file, line and field.
func TestLoadErrors(t *testing.T) {
	tests := []struct{ name, src, want string }{
		{"syntax", "[[laser]\nname = 1", "bad.toml:1: TOML syntax:"}, // the header line left open
		{"unknown top key", "colour = 1\n" + okLaser + okPath, `bad.toml:1: colour: unknown key`},
		{"a date for a string", "[setup]\ntitle = 1979-05-27\n" + okLaser + okPath, `bad.toml:2: [setup]: title: want a string, got a local date`},
		{"a time for a string", "[setup]\ntitle = 07:32:00\n" + okLaser + okPath, `bad.toml:2: [setup]: title: want a string, got a local time`},
		{"key after element", okLaser + okPath + "colour = 1\n", `bad.toml:14: path "p", element 1 (dump): colour: unknown key for a dump (it takes rating,`},
		{"unknown laser key", okLaser + "colour = \"red\"\n" + okPath, `bad.toml:7: laser "l": colour: unknown key`},
		{"unknown element key", okLaser + okPath + "  focal_length = \"1 m\"\n", `bad.toml:14: path "p", element 1 (dump): focal_length: unknown key for a dump`},
		{"unknown element type", okLaser + okPath + "  [[path.element]]\n  type = \"prism\"\n  at = \"2 m\"\n", `bad.toml:15: path "p", element 2: type: unknown element type "prism"`},
		{"wrong dimension", strings.Replace(okLaser, `"1 W"`, `"5 mm"`, 1) + okPath, `bad.toml:5: laser "l": power: "5 mm" is a length, want a power`},
		{"unknown unit", strings.Replace(okLaser, `"1 mm"`, `"20 cm x"`, 1) + okPath, `bad.toml:6: laser "l": waist: unknown unit "cm x"`},
		{"no unit", strings.Replace(okLaser, `"1 W"`, `1`, 1) + okPath, `laser "l": power: 1 has no unit; want a power`},
		{"negative power", strings.Replace(okLaser, `"1 W"`, `"-1 W"`, 1) + okPath, `bad.toml:5: laser "l": power: must be positive, got "-1 W"`},
		{"zero waist", strings.Replace(okLaser, `"1 mm"`, `"0 mm"`, 1) + okPath, `bad.toml:6: laser "l": waist: must be positive`},
		{"m2 below 1", okLaser + "m2 = 0.8\n" + okPath, `bad.toml:7: laser "l": m2: must be at least 1, got 0.8`},
		{"operating above power", okLaser + "operating_power = \"2 W\"\n" + okPath, `laser "l": operating_power: "2 W" is more than power "1 W"`},
		{"wavelength out of range", strings.Replace(okLaser, `"780 nm"`, `"2 mm"`, 1) + okPath, `laser "l": wavelength: "2 mm" is outside 180 nm to 1 mm`},
		{"nan", okLaser + "m2 = nan\n" + okPath, `laser "l": m2: NaN is not a finite number`},
		{"inf", okLaser + "m2 = inf\n" + okPath, `laser "l": m2: +Inf is not a finite number`},
		{"efficiency above 1", okLaser + okPath + "  [[path.element]]\n  type = \"aom\"\n  at = \"0.5 m\"\n  efficiency = 1.2\n",
			`bad.toml:17: path "p", element 2 (aom): efficiency: 1.2 is outside [0, 1]`},
		{"percent", okLaser + "\n[[path]]\nname = \"p\"\nfrom = \"l\"\n  [[path.element]]\n  type = \"window\"\n  at = \"1 m\"\n  transmission = \"120 %\"\n",
			`bad.toml:14: path "p", element 1 (window): transmission: "120 %" is outside [0, 1]`},
		{"unknown laser", okLaser + strings.Replace(okPath, `from = "l"`, `from = "nope"`, 1), `bad.toml:10: path "p": from: no laser named "nope"`},
		{"no splitter", okLaser + okPath + "[[path]]\nname = \"q\"\nfrom = \"p:x\"\n", `bad.toml:16: path "q": from: path "p" has no element named "x"`},
		{"not a splitter", okLaser + strings.Replace(okPath, "type = \"dump\"", "type = \"dump\"\n  name = \"d\"", 1) + "[[path]]\nname = \"q\"\nfrom = \"p:d\"\n",
			`path "q": from: element "d" of path "p" is a dump, not a splitter`},
		{"duplicate laser", okLaser + okLaser + okPath, `bad.toml:8: laser "l": name: duplicate name (also at line 2)`},
		{"duplicate path", okLaser + okPath + strings.Replace(okPath, `from = "l"`, `from = "p:x"`, 1), `path "p": name: duplicate name (also at line 8)`},
		{"out of order", okLaser + okPath + "  [[path.element]]\n  type = \"lens\"\n  at = \"0.5 m\"\n  focal_length = \"1 m\"\n",
			`path "p", element 1 (dump): a dump ends the path, but element 2 follows it`},
		{"out of order lenses", okLaser + "\n[[path]]\nname = \"p\"\nfrom = \"l\"\n  [[path.element]]\n  type = \"lens\"\n  at = \"1 m\"\n  focal_length = \"1 m\"\n  [[path.element]]\n  type = \"lens\"\n  at = \"0.5 m\"\n  focal_length = \"1 m\"\n",
			`bad.toml:17: path "p", element 2 (lens): at: 500 mm comes before the previous element (1 m)`},
		{"cycle", okLaser + "[[path]]\nname = \"a\"\nfrom = \"b:s\"\n  [[path.element]]\n  type = \"splitter\"\n  name = \"s\"\n  at = \"1 m\"\n  transmission = 0.5\n" +
			"[[path]]\nname = \"b\"\nfrom = \"a:s\"\n  [[path.element]]\n  type = \"splitter\"\n  name = \"s\"\n  at = \"1 m\"\n  transmission = 0.5\n",
			`bad.toml:9: path "a": from: paths feed each other in a cycle ("a" ← "b" ← "a")`},
		{"two paths one laser", okLaser + okPath + strings.Replace(okPath, `name = "p"`, `name = "q"`, 1), `path "q": from: "l" already feeds path "p"`},
		{"atoms without cloud ref", okLaser + "\n[[path]]\nname = \"p\"\nfrom = \"l\"\n  [[path.element]]\n  type = \"atoms\"\n  at = \"1 m\"\n  cloud = \"ghost\"\n",
			`bad.toml:14: path "p", element 1 (atoms): cloud: no cloud named "ghost" (clouds: none)`},
		{"goal without value", okLaser + "\n[[path]]\nname = \"p\"\nfrom = \"l\"\n  [[path.element]]\n  type = \"atoms\"\n  at = \"1 m\"\n  cloud = \"c\"\n  goal = \"rabi\"\n",
			`path "p", element 1 (atoms): goal_value: missing (the goal needs a Rabi frequency Ω/2π`},
		{"fiber without output", okLaser + "\n[[path]]\nname = \"p\"\nfrom = \"l\"\n  [[path.element]]\n  type = \"fiber\"\n  at = \"1 m\"\n  mode_field_diameter = \"5 um\"\n",
			`path "p", element 1 (fiber): output_waist: missing (a fiber needs output_waist or output_focal_length)`},
		{"splitter without name", okLaser + "\n[[path]]\nname = \"p\"\nfrom = \"l\"\n  [[path.element]]\n  type = \"splitter\"\n  at = \"1 m\"\n  transmission = 0.5\n",
			`path "p", element 1 (splitter): name: missing`},
		{"lens zero focal length", okLaser + "\n[[path]]\nname = \"p\"\nfrom = \"l\"\n  [[path.element]]\n  type = \"lens\"\n  at = \"1 m\"\n  focal_length = \"0 mm\"\n",
			`bad.toml:14: path "p", element 1 (lens): focal_length: must not be zero`},
		{"access", okLaser + strings.Replace(okPath, `from = "l"`, "from = \"l\"\naccess = \"underwater\"", 1), `path "p": access: "underwater" is not one of open, enclosed, vacuum`},
		{"mirror transmission", okLaser + "\n[[path]]\nname = \"p\"\nfrom = \"l\"\n  [[path.element]]\n  type = \"mirror\"\n  at = \"1 m\"\n  transmission = 0.5\n",
			`path "p", element 1 (mirror): transmission: a mirror's throughput is its reflectivity`},
		{"cloud rms", okLaser + okPath + "[[cloud]]\nname = \"c\"\ntransition = \"Rb87 D2\"\natoms = 1e4\nrms_size = [\"1 um\", \"2 um\"]\n",
			`bad.toml:18: cloud "c": rms_size: want [x, y, z], three lengths along the cloud's own axes (its frame)`},
		{"eyewear band", okLaser + okPath + "[[eyewear]]\nname = \"g\"\nbands = [{ from = \"900 nm\", to = \"800 nm\", od = 5 }]\n",
			`eyewear "g", band 1: to: "800 nm" is not above from "900 nm"`},
		{"pulse keys on cw", okLaser + "pulse_duration = \"10 ns\"\n" + okPath, `laser "l": pulse_duration: only for emission = "pulsed"`},
		{"unknown transition", okLaser + okPath + "[[cloud]]\nname = \"c\"\ntransition = \"Rb86 D2\"\natoms = 1e4\nrms_size = [\"1 um\", \"2 um\", \"3 um\"]\n",
			`bad.toml:16: cloud "c": transition: unknown transition "Rb86 D2" (built-in: Cs133 D1, Cs133 D2,`},
		{"isotropic missing", okLaser + okPath + "[[cloud]]\nname = \"c\"\ntransition = \"K39 D2\"\nsaturation = \"isotropic\"\natoms = 1e4\nrms_size = [\"1 um\", \"2 um\", \"3 um\"]\n",
			`bad.toml:17: cloud "c": saturation: transition "K39 D2" has no isotropic saturation intensity in its data; use "cycling"`},
		{"custom without linewidth", okLaser + okPath + "[[cloud]]\nname = \"c\"\ntransition = \"custom\"\nwavelength = \"780 nm\"\natoms = 1e4\nrms_size = [\"1 um\", \"2 um\", \"3 um\"]\n",
			`cloud "c": linewidth: missing (want a frequency`},
		{"laser array as table", "[laser]\nname = \"l\"\n", `laser: want an array of tables ([[laser]]), got a table`},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Parse("bad.toml", []byte(tc.src))
			var ie *InputError
			if !errors.As(err, &ie) {
				t.Fatalf("got %v, want an InputError", err)
			}
			if !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error:\n%v\nwant it to contain:\n%s", err, tc.want)
			}
		})
	}
}

func TestLoadExamplesAll(t *testing.T) {
	files, _ := filepath.Glob("../../testdata/examples/*.toml")
	if len(files) < 4 {
		t.Fatalf("found %d examples, want at least 4", len(files))
	}
	for _, f := range files {
		if _, err := Load(f); err != nil {
			t.Errorf("%s: %v", f, err)
		}
	}
}

func BenchmarkLoadDemo(b *testing.B) {
	data, err := os.ReadFile("../../testdata/examples/table-c.toml")
	if err != nil {
		b.Fatal(err)
	}
	for i := 0; i < b.N; i++ {
		if _, err := Parse("table-c.toml", data); err != nil {
			b.Fatal(err)
		}
	}
}

// EN 207 markings as eyewear prints them (EN 207: test conditions D, I, R,
// M and scale numbers LB1 to LB10; common practice for the written form).
func TestParseEN207(t *testing.T) {
	for _, c := range []struct {
		in   string
		want []EN207Rating
		ok   bool
	}{
		{"D LB6", []EN207Rating{{"D", 6}}, true},
		{"DIR LB5", []EN207Rating{{"D", 5}, {"I", 5}, {"R", 5}}, true},
		{"D 1064 LB6 + IR 1064 LB7", []EN207Rating{{"D", 6}, {"I", 7}, {"R", 7}}, true},
		{"D LB11", nil, false},
		{"X LB3", nil, false},
		{"LB3", nil, false},
		{"D LBx", nil, false},
	} {
		got, err := ParseEN207(c.in)
		if (err == nil) != c.ok || (c.ok && !slices.Equal(got, c.want)) {
			t.Errorf("%q: %v, %v; want %v", c.in, got, err, c.want)
		}
	}
	b := EyewearBand{Ratings: []EN207Rating{{"D", 5}, {"I", 7}}}
	if !b.Rates("D", 5) || b.Rates("D", 6) || !b.Rates("I", 6) || b.Rates("R", 1) {
		t.Error("Rates")
	}
}

// The paths of a large setup are read on all cores, each by a loader of
// its own; what is read, and every problem reported with its bound, must be
// what one loader reading them in order gives (common practice: a parallel
// reader is held to the serial one).
func TestParallelPathsReadAsOne(t *testing.T) {
	merged := synth.Lab(7, synth.Options{Lasers: 24, ElementsPerPath: 6, Splits: 1, Merges: true, Fibers: true})
	toleranced := synth.Lab(8, synth.Options{Lasers: 20, ElementsPerPath: 6, Splits: 1, Tolerances: true})
	bothWays := func(t *testing.T, src string) (par, ser *Setup, parErr, serErr error) {
		t.Helper()
		if n := strings.Count(src, "[[path]]"); n < parallelLoadPaths {
			t.Fatalf("the lab has %d paths, fewer than the %d read in parallel", n, parallelLoadPaths)
		}
		par, parErr = Parse("lab.toml", []byte(src))
		defer func(n int) { parallelLoadPaths = n }(parallelLoadPaths)
		parallelLoadPaths = math.MaxInt
		ser, serErr = Parse("lab.toml", []byte(src))
		return
	}
	for _, src := range []string{merged, toleranced} {
		t.Run("valid", func(t *testing.T) {
			par, ser, pe, se := bothWays(t, src)
			if pe != nil || se != nil {
				t.Fatalf("errors: %v / %v", pe, se)
			}
			if src == toleranced && len(par.Tolerances) == 0 {
				t.Fatal("the lab has no tolerances to compare")
			}
			if !reflect.DeepEqual(par, ser) {
				t.Error("the setup read in parallel differs from the one read in order")
			}
		})
	}
	src := merged
	for _, tc := range []struct {
		name  string
		every int // an unknown key on every n-th mirror
		want  int // problems reported, the bound's line included
	}{{"few problems", 9, -1}, {"more than the bound", 1, maxProblems + 1}} {
		t.Run(tc.name, func(t *testing.T) {
			k := 0
			bad := regexp.MustCompile(`type = "mirror"\n`).ReplaceAllStringFunc(src, func(m string) string {
				k++
				if k%tc.every != 0 {
					return m
				}
				return m + fmt.Sprintf("  colour_%d = \"red\"\n", k)
			})
			_, _, pe, se := bothWays(t, bad)
			var pi, si *InputError
			if !errors.As(pe, &pi) || !errors.As(se, &si) {
				t.Fatalf("want input errors, got %v / %v", pe, se)
			}
			if !slices.Equal(pi.Problems, si.Problems) {
				t.Errorf("problems differ:\nparallel:\n%s\nin order:\n%s", pi, si)
			}
			if tc.want > 0 && len(pi.Problems) != tc.want {
				t.Errorf("%d problems, want %d", len(pi.Problems), tc.want)
			}
			if tc.want < 0 && (len(pi.Problems) < 2 || len(pi.Problems) >= maxProblems) {
				t.Errorf("%d problems: the case should have a few, below the bound", len(pi.Problems))
			}
		})
	}
}
