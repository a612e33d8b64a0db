package safety

import (
	"fmt"
	"slices"
	"time"

	"beamledger/budget"
	"beamledger/budget/drive"
	"beamledger/budget/setup"
	"beamledger/budget/units"
)

// Assessment is the whole evaluation of one setup.
type Assessment struct {
	Setup  *setup.Setup
	Budget *budget.Budget
	Atoms  []*drive.AtomsResult
	// Clouds counts every beam at each cloud together.
	Clouds   []*drive.CloudResult
	Hazards  *Hazards
	Findings []budget.Finding
	// Tolerances is the tolerance analysis of each goal (nil when the
	// setup has no tolerances).
	Tolerances map[any]*drive.GoalTolerance
	// HazardBudget is the budget the hazards were evaluated on: the
	// nominal one, or with tolerances every loss value at its highest
	// transmission.
	HazardBudget *budget.Budget
}

// Options are the tolerance analysis's: the number of samples, the seed,
// and the goroutines (0: all cores).
type Options struct {
	Samples int
	Seed    uint64
	Workers int
	// Progress, when set, is told the samples done of the total while
	// the analysis runs (drive.TolerancesWithProgress).
	Progress func(done, total int)
	// Estimate and Stop as for drive.Run: told the analysis's likely
	// duration before it starts, and ending it early when closed.
	Estimate func(time.Duration)
	Stop     <-chan struct{}
}

// DefaultOptions are the analysis's defaults.
var DefaultOptions = Options{Samples: drive.DefaultSamples, Seed: drive.DefaultSeed}

// Evaluate computes everything `check` reports, with the default tolerance
// analysis.
func Evaluate(s *setup.Setup) (*Assessment, error) { return EvaluateWith(s, DefaultOptions) }

// EvaluateWith is Evaluate with the tolerance analysis's options.
func EvaluateWith(s *setup.Setup, o Options) (*Assessment, error) {
	b, err := drive.Budget(s, true)
	if err != nil {
		return nil, err
	}
	a := &Assessment{Setup: s, Budget: b, Atoms: drive.Evaluate(b)}
	a.Clouds = drive.Clouds(b, a.Atoms)
	// Hazards at each laser's maximum power (a saturable cloud passes
	// more of it), and at the conservative end of every tolerance for each
	// beam: the highest transmission of each toleranced loss value for the
	// light that goes on, the lowest for the light that leaves there.
	hs := s
	if len(s.Tolerances) > 0 {
		hs = ConservativeSetup(s)
	}
	if a.HazardBudget, err = drive.Budget(hs, false); err != nil {
		return nil, err
	}
	if len(s.Tolerances) > 0 {
		var progress func(int)
		if o.Progress != nil {
			progress = func(done int) { o.Progress(done, o.Samples) }
		}
		a.Tolerances = drive.TolerancesRun(s, a.Atoms, drive.Run{Samples: o.Samples, Seed: o.Seed, Workers: o.Workers, Progress: progress, Estimate: o.Estimate, Stop: o.Stop})
	}
	a.Findings = append(a.Findings, a.HazardBudget.Findings()...)
	a.Findings = append(a.Findings, drive.DriveFindings(a.Atoms)...)
	a.Findings = append(a.Findings, drive.CloudFindings(a.Clouds)...)
	a.Findings = append(a.Findings, drive.UnreachedCloudGoals(s, a.Clouds)...)
	// Toleranced positions, focal lengths and waists: the hazards again at
	// geometries within the tolerances (geometry.go).
	var (
		sw *sweepFigures
		w  Sweep
	)
	g := GeometricTolerances(hs)
	if len(g) > 0 {
		var plan []geometry
		plan, w = sweepPlan(g)
		if sw, err = sweepGeometry(hs, g, plan, &w); err != nil {
			return nil, err
		}
	}
	h, err := evaluateHazards(hs, a.HazardBudget, sw)
	if err != nil {
		return nil, err
	}
	a.Hazards = h
	a.Findings = append(a.Findings, h.Findings...)
	controlOpenEnds(hs, a.HazardBudget, a.Findings)
	if len(g) > 0 {
		nominal := append(a.HazardBudget.Findings(), h.Findings...)
		controlOpenEnds(hs, a.HazardBudget, nominal)
		more := sw.findings(nominal)
		w.Worse = len(more)
		if w.Geometries < w.Planned {
			more = append(more, sweepCut(w))
		}
		h.Sweep = &w
		h.Findings = append(h.Findings, more...)
		a.Findings = append(a.Findings, more...)
	}
	return a, nil
}

// ConservativeSetup is a copy of s with every toleranced loss value at the
// end that makes each beam most hazardous: its highest transmission (the
// optical density's low end) for the beam that goes on through the
// element, and, for the beam that leaves the path there (a splitter's
// other port, a mirror's leak, an AOM's unused orders, a combiner's
// rejected port), its lowest (setup.Element.Leaving). One value is then at
// both ends at once, for different beams: where the two beams meet again
// their sum is overstated, never understated. Positions, focal lengths and
// waists stay nominal here; the sweep (geometry.go) moves them. Operating
// powers do not enter the hazards.
func ConservativeSetup(s *setup.Setup) *setup.Setup {
	c := s.Clone()
	for _, t := range s.Tolerances {
		if v, ok := t.HighTransmission(); ok {
			t.Apply(c, v)
		}
		if v, ok := t.HighLeaving(); ok {
			t.ApplyLeaving(c, v)
		}
	}
	return c
}

// NeedsAction reports whether any finding is a defect or a hazard that no
// declared control handles: what makes check exit 1.
func (a *Assessment) NeedsAction() bool {
	for _, f := range a.Findings {
		if f.Uncontrolled() {
			return true
		}
	}
	return false
}

// GoalFindingKinds are the drive findings of a goal not met (check
// --fail-on-goals exits 1 on them).
var GoalFindingKinds = []budget.FindingKind{drive.FindingGoalShort, drive.FindingGoalImpossible, drive.FindingCloudGoalShort, drive.FindingCloudGoalImpossible}

// GoalsUnmet reports whether a drive goal is not met.
func (a *Assessment) GoalsUnmet() bool {
	for _, f := range a.Findings {
		if slices.Contains(GoalFindingKinds, f.Kind) {
			return true
		}
	}
	return false
}

// HazardDigest lists the hazards of an assessment, one line each, with
// ratios to three figures (so that the last digits of a new version's
// arithmetic do not count as a change): every source's class, every open
// segment's eye and skin ratio and OD, every eyewear need, and every
// finding that needs action (kind, path and element). verify and diff
// compare these lines.
func HazardDigest(a *Assessment) []string {
	var out []string
	h := a.Hazards
	for _, ll := range h.Lasers {
		out = append(out, fmt.Sprintf("class: laser %q %s", ll.Laser.Name, orNone(ll.Class)))
	}
	for _, e := range h.Exposures {
		out = append(out, fmt.Sprintf("open segment: path %q after element %d, laser %q: eye ratio %s, skin ratio %s, OD %g",
			e.Path.Path.Name, e.Segment.After, e.Laser.Laser.Name, units.FormatRatio(e.CombinedEyeRatio), units.FormatRatio(e.CombinedSkinRatio), e.OD))
	}
	for _, n := range h.Eyewear {
		out = append(out, fmt.Sprintf("eyewear: %s %s, OD %g, %s", units.FormatNanometres(n.Wavelength), n.Mode, n.OD, n.EN207Label()))
	}
	for _, f := range a.Findings {
		switch {
		case f.Severity == budget.SeverityDefect:
			out = append(out, fmt.Sprintf("defect: %s, path %q, element %d", f.Kind, f.Path, f.Element))
		case f.Severity == budget.SeverityHazard:
			out = append(out, fmt.Sprintf("hazard: %s, path %q, element %d, %s", f.Kind, f.Path, f.Element, ControlText(f)))
		}
	}
	return out
}

func orNone(s string) string {
	if s == "" {
		return "not assessed"
	}
	return s
}
