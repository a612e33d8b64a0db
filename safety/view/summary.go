package view

import (
	"beamledger/budget"
	"beamledger/limits"
	"beamledger/safety"
	"fmt"
	"strings"
)

// Summary is the sign-off's opening paragraph: what was evaluated against
// what, how many findings need action, which drive goals are met, the
// highest class present, and the deference to the laser safety officer.
func Summary(a *safety.Assessment) string {
	action, advice := 0, 0
	for _, f := range a.Findings {
		if f.Severity == budget.SeverityAction {
			action++
		} else {
			advice++
		}
	}
	var b strings.Builder
	fmt.Fprintf(&b, "This document evaluates the setup described in %s against %s and the drive goals it states. ", a.Setup.File, safety.Standard)
	switch action {
	case 0:
		b.WriteString("No finding needs action before alignment under the stated assumptions")
	case 1:
		b.WriteString("1 finding needs action before alignment")
	default:
		fmt.Fprintf(&b, "%d findings need action before alignment", action)
		lines := 0
		for i, n := range FindingGroups(a.Findings) {
			if n > 0 && a.Findings[i].Severity == budget.SeverityAction {
				lines++
			}
		}
		if lines < action {
			fmt.Fprintf(&b, " (%d lines in the findings list, where findings of one kind on one path share a line)", lines)
		}
	}
	fmt.Fprintf(&b, ", and %d more are advice. ", advice)
	met, goals := 0, 0
	var short []string
	for _, at := range a.Atoms {
		if g := at.Goal; g != nil {
			goals++
			if g.Met {
				met++
			} else {
				short = append(short, fmt.Sprintf("%s on path %q", g.Kind, at.Path.Path.Name))
			}
		}
	}
	if goals > 0 {
		fmt.Fprintf(&b, "Of %d drive goal(s), %d are met at the lasers' operating powers", goals, met)
		if len(short) > 0 {
			fmt.Fprintf(&b, "; not met: %s", strings.Join(short, ", "))
		}
		b.WriteString(". ")
	}
	highest, who := "", ""
	order := map[string]int{limits.Class1: 1, limits.Class2: 2, limits.Class3R: 3, limits.Class3B: 4, limits.Class4: 5}
	for _, ll := range a.Hazards.Lasers {
		if order[ll.Class] > order[highest] {
			highest, who = ll.Class, ll.Laser.Name
		}
	}
	if highest != "" {
		fmt.Fprintf(&b, "The highest class present is Class %s (laser %q). ", highest, who)
	}
	b.WriteString("These figures support, and never replace, the evaluation of the laser safety officer under local regulations; this document does not certify the setup as safe to use.")
	return b.String()
}
