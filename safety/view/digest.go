package view

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strings"

	"beamledger/budget"
	"beamledger/budget/atoms"
	"beamledger/budget/units"
	"beamledger/safety"
)

// Digest is the sign-off's page-1 digest for its two readers: for the laser
// safety officer, each laser's class, the defects and uncontrolled hazards
// (worst first), the eyewear each wavelength needs against the eyewear
// declared, every open end with its NOHD and the control measures missing;
// for the physicist, the power at each atoms element, each trap's depth and
// each goal's margin.
type Digest struct {
	Officer, Physicist []string
}

// BuildDigest makes the page-1 digest of an assessment.
func BuildDigest(a *safety.Assessment) *Digest {
	d := &Digest{}
	h := a.Hazards
	for _, ll := range h.Lasers {
		class := "Class " + ll.Class
		if ll.Class == "" {
			class = "class not assessed"
		}
		d.Officer = append(d.Officer, fmt.Sprintf("Laser %q: %s, %s at %s at most; for alignment at most %s (attenuator OD %g from the operating power).",
			ll.Laser.Name, class, units.FormatPower(ll.Laser.Power), units.FormatNanometres(ll.Laser.Wavelength), units.FormatPower(ll.AlignmentPower), ll.AlignmentOD))
	}
	var open []budget.Finding
	for _, f := range a.Findings {
		if f.Uncontrolled() {
			open = append(open, f)
		}
	}
	// Defects first, then uncontrolled hazards, each the worst (highest
	// ratio to its limit) first.
	slices.SortStableFunc(open, func(x, y budget.Finding) int {
		if c := cmp.Compare(rankOf(x), rankOf(y)); c != 0 {
			return c
		}
		return cmp.Compare(y.Ratio(), x.Ratio())
	})
	if len(open) == 0 {
		d.Officer = append(d.Officer, "No defect and no uncontrolled hazard under the stated assumptions.")
	}
	for _, f := range open {
		where := ""
		if f.Path != "" {
			where = fmt.Sprintf("path %q: ", f.Path)
		}
		word := "Defect"
		if f.Severity == budget.SeverityHazard {
			word = "Uncontrolled hazard"
		}
		d.Officer = append(d.Officer, fmt.Sprintf("%s: %s%s.", word, where, f.Message))
	}
	for _, n := range h.Eyewear {
		d.Officer = append(d.Officer, fmt.Sprintf("Eyewear at %s: OD %g, %s needed; %s.", units.FormatNanometres(n.Wavelength), n.OD, n.EN207Label(), n.Coverage()))
	}
	for _, e := range h.Exposures {
		if e.OpenEnd && e.NOHD > 0 {
			d.Officer = append(d.Officer, fmt.Sprintf("Open end of path %q (laser %q): NOHD %s beyond the last element.", e.Path.Path.Name, e.Laser.Laser.Name, units.FormatDistance(e.NOHD, safety.MaxHazardDistance)))
		}
	}
	var missing []string
	needed := 0
	for _, cc := range h.Controls {
		if cc.NeededBy != "" {
			needed++
			if !cc.InPlace {
				missing = append(missing, cc.Name)
			}
		}
	}
	switch {
	case needed == 0:
		d.Officer = append(d.Officer, "Control measures: the classes present need none of those listed.")
	case len(missing) == 0:
		d.Officer = append(d.Officer, fmt.Sprintf("Control measures: all %d that the classes present need are declared.", needed))
	default:
		d.Officer = append(d.Officer, fmt.Sprintf("Control measures: %d of %d needed are declared; missing: %s.", needed-len(missing), needed, strings.Join(missing, ", ")))
	}

	for _, at := range a.Atoms {
		e := at.Row.Element
		line := fmt.Sprintf("Path %q, element %d (cloud %q), laser %q: %s at the atoms", at.Path.Path.Name, e.Index, e.Cloud, at.Path.Laser.Name, units.FormatPower(at.Power))
		if at.Dipole != nil {
			line += fmt.Sprintf(", dipole potential U/k_B %s at the centre", units.FormatSI(at.Dipole.Depth/atoms.KB, "K"))
		} else if !at.FarDetuned && at.NearLine == "" {
			line += fmt.Sprintf(", s = %s", units.FormatNumber(at.Saturation))
		}
		if g := at.Goal; g != nil {
			line += "; goal " + g.Kind + ": " + goalState(g.Impossible, g.Met, g.BeyondMaximum, g.MarginDB)
		}
		d.Physicist = append(d.Physicist, line+".")
	}
	for _, cr := range a.Clouds {
		line := fmt.Sprintf("Cloud %q", cr.Cloud.Name)
		if t := cr.Trap; t != nil && t.Found {
			line += fmt.Sprintf(": combined trap depth %s", units.FormatSI(t.Depth/atoms.KB, "K"))
			if !t.Holds {
				line += " (it does not hold)"
			}
		} else {
			line += ": no combined trap"
		}
		if g := cr.Goal; g != nil {
			line += "; goal " + g.Kind + " for the whole cloud: " + goalState(g.Impossible, g.Met, g.BeyondMaximum, g.MarginDB)
		}
		d.Physicist = append(d.Physicist, line+".")
	}
	return d
}

// rankOf orders findings that need action: defects before hazards.
func rankOf(f budget.Finding) int {
	if f.Severity == budget.SeverityDefect {
		return 0
	}
	return 1
}

// goalState says how a goal stands: met or not with its margin, beyond the
// maximum power, or impossible.
func goalState(impossible string, met, beyond bool, marginDB float64) string {
	switch {
	case impossible != "":
		return "cannot be met (" + impossible + ")"
	case met && math.IsNaN(marginDB):
		return "met without scaling (the other beams reach it)"
	case met:
		return fmt.Sprintf("met, margin %+.1f dB", marginDB)
	case beyond:
		return fmt.Sprintf("NOT met, short by %.1f dB, beyond the maximum power", math.Abs(marginDB))
	}
	return fmt.Sprintf("NOT met, short by %.1f dB at the operating power", math.Abs(marginDB))
}
