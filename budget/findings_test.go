package budget

import (
	"beamledger/budget/setup"
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
