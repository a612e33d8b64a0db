package view

import (
	"beamledger/budget"
	"beamledger/budget/units"
	"beamledger/safety"
	"fmt"
	"strings"
)

// Summary is the sign-off's opening paragraph: what was evaluated against
// what, how many findings need action, which drive goals are met, the
// highest class present, and the deference to the laser safety officer.
func Summary(a *safety.Assessment) string {
	count := map[budget.Severity]int{}
	uncontrolled := 0
	for _, f := range a.Findings {
		count[f.Severity]++
		if f.Severity == budget.SeverityHazard && len(f.ControlledBy) == 0 {
			uncontrolled++
		}
	}
	var b strings.Builder
	fmt.Fprintf(&b, "This document evaluates the setup described in %s against %s, with %s, and the drive goals it states. ", a.Setup.File, safety.LimitsBasis(a.Setup.Meta.Limits), safety.ClassBasis)
	defects, hazards := count[budget.SeverityDefect], count[budget.SeverityHazard]
	switch {
	case defects == 0 && uncontrolled == 0:
		b.WriteString("Under the stated assumptions it finds no defect and no hazard that a declared control does not handle")
	default:
		fmt.Fprintf(&b, "It finds %s to fix before alignment and %s that no declared control handles", plural(defects, "defect"), plural(uncontrolled, "uncontrolled hazard"))
	}
	fmt.Fprintf(&b, "; %s in all (exposures above the MPE), %d controlled; %s and %s. ", plural(hazards, "hazard"), hazards-uncontrolled, plural(count[budget.SeverityDrive], "drive finding"), plural(count[budget.SeverityNote], "note"))
	met, goals := 0, 0
	var short, beyond []string
	for _, at := range a.Atoms {
		if g := at.Goal; g != nil {
			goals++
			what := fmt.Sprintf("%s on path %q, element %d", g.Kind, at.Path.Path.Name, at.Row.Element.Index)
			switch {
			case g.Met:
				met++
			case g.BeyondMaximum:
				beyond = append(beyond, fmt.Sprintf("%s (it needs %s from laser %q, whose maximum power is %s)", what, units.FormatPower(g.SourcePower), at.Path.Laser.Name, units.FormatPower(g.Maximum)))
			default:
				short = append(short, what)
			}
		}
	}
	for _, cr := range a.Clouds {
		if g := cr.Goal; g != nil {
			goals++
			what := fmt.Sprintf("%s of cloud %q", g.Kind, cr.Cloud.Name)
			switch {
			case g.Met:
				met++
			case g.BeyondMaximum:
				var needs []string
				for i, las := range g.Lasers {
					if g.Needed[i] > las.Power {
						needs = append(needs, fmt.Sprintf("%s from laser %q, whose maximum power is %s", units.FormatPower(g.Needed[i]), las.Name, units.FormatPower(las.Power)))
					}
				}
				beyond = append(beyond, fmt.Sprintf("%s (it needs %s)", what, strings.Join(needs, "; ")))
			default:
				short = append(short, what)
			}
		}
	}
	if goals > 0 {
		fmt.Fprintf(&b, "Of %d drive goal(s) (at atoms elements and for whole clouds), %d are met at the lasers' operating powers", goals, met)
		if len(short) > 0 {
			fmt.Fprintf(&b, "; not met: %s", strings.Join(short, ", "))
		}
		if len(beyond) > 0 {
			fmt.Fprintf(&b, "; not met even at the lasers' maximum powers: %s", strings.Join(beyond, ", "))
		}
		b.WriteString(". ")
	}
	highest, who := "", ""
	for _, ll := range a.Hazards.Lasers {
		// A class not assessed is not a class present.
		if ll.Class != "" && (highest == "" || safety.ClassRank(ll.Class) > safety.ClassRank(highest)) {
			highest, who = ll.Class, ll.Laser.Name
		}
	}
	if highest != "" {
		fmt.Fprintf(&b, "The highest class present is Class %s (laser %q). ", highest, who)
	}
	b.WriteString("These figures support, and never replace, the evaluation of the laser safety officer under local regulations; this document does not certify the setup as safe to use.")
	return b.String()
}

// plural writes a count with its noun, "1 defect", "3 defects".
func plural(n int, noun string) string {
	if n == 1 {
		return "1 " + noun
	}
	return fmt.Sprintf("%d %ss", n, noun)
}
