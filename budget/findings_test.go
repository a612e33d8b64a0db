package budget

import (
	"strings"
	"testing"
)

// A laser that feeds no path is a beam nobody described: a finding that
// needs action, never silence.
func TestUnusedLaserNeedsAction(t *testing.T) {
	s, err := Parse("u.toml", []byte(okLaser+okPath+strings.Replace(okLaser, `name = "l"`, `name = "spare"`, 1)))
	if err != nil {
		t.Fatal(err)
	}
	b, err := Compute(s)
	if err != nil {
		t.Fatal(err)
	}
	for _, f := range b.Findings() {
		if f.Kind == FindingUnusedLaser {
			if f.Severity != SeverityAction || !strings.Contains(f.Message, `laser "spare" feeds no path`) {
				t.Errorf("finding %+v", f)
			}
			return
		}
	}
	t.Error("no finding for the unused laser")
}
