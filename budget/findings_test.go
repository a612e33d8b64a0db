package budget

import (
	"beamledger/budget/setup"
	"math"
	"strings"
	"testing"
)

// A laser that feeds no path is a beam nobody described: a finding that
// needs action, never silence.
func TestUnusedLaserNeedsAction(t *testing.T) {
	s, err := setup.Parse("u.toml", []byte(twoLasersOnePath))
	if err != nil {
		t.Fatal(err)
	}
	b, err := Compute(s)
	if err != nil {
		t.Fatal(err)
	}
	for _, f := range b.Findings() {
		if f.Kind == FindingUnusedLaser {
			if f.Severity != SeverityDefect || !strings.Contains(f.Message, `laser "spare" feeds no path`) {
				t.Errorf("finding %+v", f)
			}
			return
		}
	}
	t.Error("no finding for the unused laser")
}

// twoLasersOnePath: laser "l" feeds path "p" to a dump; laser "spare" feeds
// nothing.
const twoLasersOnePath = `
[[laser]]
name = "l"
wavelength = "780 nm"
power = "1 W"
waist = "1 mm"
[[laser]]
name = "spare"
wavelength = "780 nm"
power = "1 W"
waist = "1 mm"
[[path]]
name = "p"
from = "l"
  [[path.element]]
  type = "dump"
  at = "1 m"
`

// fiberAfter is a 780 nm, 1 mm beam through the given lens elements onto a
// fibre of 5.3 µm mode-field diameter at 400 mm.
func fiberAfter(t *testing.T, lenses string) *FiberCoupling {
	t.Helper()
	src := `[[laser]]
name = "l"
wavelength = "780 nm"
power = "10 mW"
waist = "1 mm"

[[path]]
name = "p"
from = "l"
` + lenses + `
  [[path.element]]
  type = "fiber"
  at = "400 mm"
  mode_field_diameter = "5.3 um"
  output_waist = "1 mm"

  [[path.element]]
  type = "dump"
  at = "600 mm"
  rating = "1 W"
`
	s, err := setup.Parse("f.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	b, err := Compute(s)
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range b.Paths[0].Rows {
		if r.Fiber != nil {
			return r.Fiber
		}
	}
	t.Fatal("no fibre")
	return nil
}

// The ideal coupling-lens focal length: one value for a round beam; one
// per plane, said so, for a beam a cylindrical lens made astigmatic before
// a spherical coupling lens; none, with the reason, when the last lens
// before the fibre is cylindrical (a spherical lens cannot stand for it).
// Common practice.
func TestIdealFocalLengthOfAnAstigmaticBeam(t *testing.T) {
	lens := func(at, kind, extra string) string {
		return "\n  [[path.element]]\n  type = \"" + kind + "\"\n  at = \"" + at + "\"\n  focal_length = \"100 mm\"\n" + extra
	}
	round := fiberAfter(t, lens("300 mm", "lens", ""))
	if round.IdealNote != "" || math.IsNaN(round.IdealFocalLength[0]) || round.IdealFocalLength[0] != round.IdealFocalLength[1] {
		t.Errorf("round: %+v", round)
	}
	astig := fiberAfter(t, lens("100 mm", "cylindrical_lens", "  plane = \"x\"\n")+lens("300 mm", "lens", ""))
	if !strings.Contains(astig.IdealNote, "astigmatic") || math.IsNaN(astig.IdealFocalLength[0]) || math.Abs(astig.IdealFocalLength[0]-astig.IdealFocalLength[1]) < 1e-6 {
		t.Errorf("astigmatic: %+v", astig)
	}
	cyl := fiberAfter(t, lens("300 mm", "cylindrical_lens", "  plane = \"x\"\n"))
	if !strings.Contains(cyl.IdealNote, "cylindrical (element 1)") || !math.IsNaN(cyl.IdealFocalLength[0]) || !math.IsNaN(cyl.IdealFocalLength[1]) || !strings.Contains(IdealText(cyl), "not given") {
		t.Errorf("cylindrical: %+v", cyl)
	}
}
