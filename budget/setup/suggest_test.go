package setup

import (
	"errors"
	"math"
	"os"
	"strings"
	"testing"
)

// The optimal-string-alignment distance (Damerau 1964; Boytsov 2011 gives
// the recurrence), by hand: a transposition counts one.
func TestEditDistance(t *testing.T) {
	for _, c := range []struct {
		a, b string
		d    int
	}{{"focal_lenght", "focal_length", 1}, {"lense", "lens", 1}, {"fibre", "fiber", 1}, {"kitten", "sitting", 3}, {"", "abc", 3}, {"Rb87 D3", "Rb87 D2", 1}, {"ca", "ac", 1}} {
		if got := editDistance(c.a, c.b); got != c.d {
			t.Errorf("d(%q, %q) = %d, want %d", c.a, c.b, got, c.d)
		}
	}
	if c, ok := closest("mott", []string{"mot", "odt"}); !ok || c != "mot" {
		t.Errorf("closest(mott) = %q %v", c, ok)
	}
	if _, ok := closest("xyz", []string{"lens", "mirror"}); ok {
		t.Error("a word far from every candidate got a suggestion")
	}
	if c, ok := closest("sat", []string{"collective", "saturation", "rabi", "trap_depth"}); !ok || c != "saturation" {
		t.Errorf("an abbreviation: %q %v", c, ok)
	}
	if _, ok := closest("ab", []string{"ac", "ad"}); ok {
		t.Error("a tie got a suggestion")
	}
}

// A student's slip gives one error that says what to fix, with a
// suggestion, never a second error that only follows from the first: a
// misspelled required key is not also "missing", a refused goal does not
// make goal_value "given without goal", and an element out of order does
// not make the window before it too thick.
func TestOneErrorPerSlip(t *testing.T) {
	for _, c := range []struct{ file, want string }{
		{"student-typo-key.toml", "did you mean focal_length?"},
		{"student-goal-sat.toml", "did you mean saturation?"},
		{"student-at-order.toml", "elements must be listed in order"},
		{"student-lense.toml", "did you mean lens?"},
		{"student-cloud-typo.toml", `did you mean "mot"?`},
	} {
		data, err := os.ReadFile("../../testdata/bad/" + c.file)
		if err != nil {
			t.Fatal(err)
		}
		_, err = Parse(c.file, data)
		var ie *InputError
		if !errors.As(err, &ie) || len(ie.Problems) != 1 || !strings.Contains(ie.Problems[0], c.want) {
			t.Errorf("%s: %v, want one problem saying %q", c.file, err, c.want)
		}
	}
}

// A laser's detuning in linewidths takes Γ of the clouds its beam reaches,
// also through a combiner on another path (Steck, Rubidium 87 D Line Data,
// table 3: Γ/2π = 6.0666 MHz, so −2 Γ is −12.13 MHz).
func TestLinewidthDetuningThroughACombiner(t *testing.T) {
	src := `
[[laser]]
name = "main"
wavelength = "1064 nm"
power = "1 W"
waist = "1 mm"

[[laser]]
name = "probe"
wavelength = "780.241 nm"
power = "1 mW"
waist = "1 mm"
detuning = "-2 Γ"

[[path]]
name = "main"
from = "main"
element = [{ type = "combiner", name = "dc", at = "100 mm", transmission = 0.9, join_transmission = 0.9 }, { type = "atoms", at = "300 mm", cloud = "c" }, { type = "dump", at = "500 mm" }]

[[path]]
name = "probe"
from = "probe"
into = "main:dc"
into_at = "200 mm"

[[cloud]]
name = "c"
transition = "Rb87 D2"
atoms = 1e5
rms_size = ["10 um", "10 um", "10 um"]
`
	s, err := Parse("t.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	if got := s.Lasers[1].Detuning; math.Abs(got+2*6.0666e6) > 1e3 {
		t.Errorf("detuning %g Hz, want −12.13 MHz", got)
	}
}
