package safety

import (
	"fmt"
	"math"
	"strings"

	"beamledger/budget"
	"beamledger/budget/setup"
	"beamledger/budget/units"
	"beamledger/limits"
)

// Controls: which declared control handles each hazard, and which control
// measures the classes present need.
//
// A hazard's eye part (a ratio to the eye MPE above 1) is handled by the
// eyewear worn in the area ([controls] eyewear = "worn") when one entry of
// [[eyewear]] covers every wavelength on it: a band holding the wavelength
// with at least the OD needed there and, where the band states its EN 207
// marking, at least the scale number needed for the test condition (the
// eyewear need of that wavelength, the worst over every hazard at it). Its
// skin part (a ratio to the skin MPE above 1) is not something eyewear can
// handle: we take it as handled by the administrative controls, training
// completed and a written procedure, that keep hands out of beams (our rule;
// the laser safety officer may ask for more). A beam leaving a path's open
// end is stopped by a perimeter barrier rated for the beam's highest peak
// irradiance beyond the end; without one it is a defect.

// Control names as findings print them.
const (
	ControlPerimeter      = "perimeter barrier"
	ControlAdministrative = "training and written procedure"
)

// FindingMissingControl is a control measure a class present needs that the
// setup does not declare.
const FindingMissingControl budget.FindingKind = "missing_control"

// hazardRef ties a hazard finding to the lasers on it and to the parts of it
// that are above a limit.
type hazardRef struct {
	index     int // in the findings it was made with
	lasers    []*LaserLimits
	eye, skin bool
}

// covers reports whether an eyewear band meets a need: the wavelength in the
// band, OD enough, and the EN 207 scale number enough where the band states
// its marking (a need with no scale number, outside 315–1400 nm, is judged
// on OD alone). why says what falls short.
func covers(b setup.EyewearBand, n *EyewearNeed) (ok bool, why string) {
	switch {
	case n.Wavelength < b.From || n.Wavelength > b.To:
		return false, "wavelength outside the band"
	case b.OD < n.OD:
		return false, fmt.Sprintf("OD %g, %g needed", b.OD, n.OD)
	case len(b.Ratings) > 0 && n.LBValid && !b.Rates(n.Mode, n.LB):
		return false, fmt.Sprintf("marked %s, %s LB%d needed", b.EN207, n.Mode, n.LB)
	}
	return true, ""
}

// eyewearCovering lists the eyewear entries that cover every need.
func eyewearCovering(s *setup.Setup, needs []*EyewearNeed) []string {
	var out []string
	for _, ew := range s.Eyewear {
		all := true
		for _, n := range needs {
			one := false
			for _, b := range ew.Bands {
				if ok, _ := covers(b, n); ok {
					one = true
					break
				}
			}
			all = all && one
		}
		if all && len(needs) > 0 {
			out = append(out, ew.Name)
		}
	}
	return out
}

// needOf finds the eyewear need of a laser's wavelength and test condition.
func needOf(h *Hazards, ll *LaserLimits) *EyewearNeed {
	for _, n := range h.Eyewear {
		if n.Wavelength == ll.Laser.Wavelength && n.Mode == ll.EN207Mode {
			return n
		}
	}
	return nil
}

// controlHazards fills in what controls each hazard of refs, in findings.
func controlHazards(s *setup.Setup, h *Hazards, findings []budget.Finding, refs []hazardRef) {
	c := s.Controls
	administrative := c.Training == setup.TrainingDone && c.Procedure != ""
	for _, r := range refs {
		f := &findings[r.index]
		controlled := []string{}
		eyeOK, skinOK := !r.eye, !r.skin
		if r.eye && c.Eyewear == setup.EyewearWorn {
			var needs []*EyewearNeed
			for _, ll := range r.lasers {
				if n := needOf(h, ll); n != nil {
					needs = append(needs, n)
				}
			}
			if names := eyewearCovering(s, needs); len(names) > 0 && len(needs) == len(r.lasers) {
				controlled, eyeOK = append(controlled, names...), true
			}
		}
		if r.skin && administrative {
			controlled, skinOK = append(controlled, ControlAdministrative), true
		}
		if eyeOK && skinOK {
			f.ControlledBy = controlled
		} else {
			f.ControlledBy = []string{}
		}
	}
}

// EndPeakIrradiance is the highest peak irradiance of a beam beyond the end
// of its path, W/m², at the laser's maximum power (PeakAlong).
func EndPeakIrradiance(pb *budget.PathBudget) float64 {
	if len(pb.Segments) == 0 {
		return 0
	}
	last := pb.Segments[len(pb.Segments)-1] // from the last element on (To is +Inf past an open end)
	peak, _ := PeakAlong(last.Beam, pb.EndFraction*pb.Laser.Power, math.Inf(1))
	return peak
}

// controlOpenEnds makes each open end that a rated perimeter barrier stops a
// hazard controlled by it; an open end without one stays a defect.
func controlOpenEnds(s *setup.Setup, b *budget.Budget, findings []budget.Finding) {
	c := s.Controls
	for i := range findings {
		f := &findings[i]
		if f.Kind != budget.FindingOpenEnd || c.Perimeter != setup.PerimeterBarrier {
			continue
		}
		pb := b.Path(f.Path)
		if pb == nil {
			continue
		}
		peak := 0.0
		for _, beam := range pb.Beams() {
			peak = math.Max(peak, EndPeakIrradiance(beam))
		}
		if peak <= c.PerimeterRating {
			f.Severity, f.ControlledBy = budget.SeverityHazard, []string{ControlPerimeter}
			f.Message += fmt.Sprintf("; the perimeter barrier (rated %s) stops it: the beam's peak irradiance beyond the end is at most %s", units.FormatIrradiance(c.PerimeterRating), units.FormatIrradiance(peak))
		} else {
			f.Message += fmt.Sprintf("; the perimeter barrier is rated %s, below the beam's peak irradiance of %s beyond the end", units.FormatIrradiance(c.PerimeterRating), units.FormatIrradiance(peak))
		}
	}
}

// ControlCheck is one control measure the classes present may need: whether
// it is needed, by which class, whether the setup declares it, and where the
// requirement comes from.
type ControlCheck struct {
	Name string
	// NeededBy names the class and laser that need it ("Class 4, laser
	// "trap""), "" when no class present needs it.
	NeededBy string
	InPlace  bool
	// Declared is what the setup says, in its words.
	Declared   string
	Provenance limits.Provenance
}

// controlRule is a control measure: the lowest class that needs it, a
// condition besides the class (nil: always), and how the setup declares it.
type controlRule struct {
	name     string
	from     string // lowest class that needs it
	when     func(h *Hazards) bool
	declared func(c setup.Controls) (bool, string)
	row      string
}

// The control measures by class, our reading of the user's guide of the
// IEC 60825 family and of ANSI Z136.1, from memory; a laser whose class was
// not assessed is taken as Class 4.
var controlRules = []controlRule{
	{"laser safety officer appointed", limits.Class3B, nil, func(c setup.Controls) (bool, string) { return c.Officer != "", orDash(c.Officer) }, "laser safety officer, Class 3B and 4"},
	{"training of everyone in the area", limits.Class3B, nil, func(c setup.Controls) (bool, string) { return c.Training == setup.TrainingDone, c.Training }, "training, Class 3B and 4"},
	{"key control", limits.Class3B, nil, func(c setup.Controls) (bool, string) { return c.KeyControl == setup.KeyInPlace, c.KeyControl }, "key control, Class 3B and 4"},
	{"warning signs at the entrances", limits.Class3B, nil, func(c setup.Controls) (bool, string) { return c.WarningSigns == setup.SignsPosted, c.WarningSigns }, "warning signs, Class 3B and 4"},
	{"written alignment procedure", limits.Class3B, nil, func(c setup.Controls) (bool, string) { return c.AlignmentProcedure != "", orDash(c.AlignmentProcedure) }, "alignment procedures, Class 3B and 4"},
	{"eyewear worn where the MPE is exceeded", limits.Class3R, anyEye, func(c setup.Controls) (bool, string) { return c.Eyewear == setup.EyewearWorn, c.Eyewear }, "eye protection, Class 3R to 4 where the MPE can be exceeded"},
	{"entry control (interlock or warning light)", limits.Class4, nil, func(c setup.Controls) (bool, string) {
		return c.Entry == setup.EntryInterlock || c.Entry == setup.EntryWarning, c.Entry
	}, "entry controls, Class 4"},
	{"written operating procedure", limits.Class4, nil, func(c setup.Controls) (bool, string) { return c.Procedure != "", orDash(c.Procedure) }, "standard operating procedure, Class 4"},
}

func orDash(s string) string {
	if s == "" {
		return "none"
	}
	return s
}

// anyEye reports whether the eye MPE is exceeded anywhere in the open: on
// a segment, in a stray reflection or a beam leaving a path, or in a
// diffuse zone reaching past NearestViewing.
func anyEye(h *Hazards) bool {
	for _, e := range h.Exposures {
		if e.CombinedEyeRatio > 1 {
			return true
		}
	}
	for _, r := range h.Reflections {
		if (r.Kind != ReflectionDiffuse && r.Ratio > 1) || (r.Kind == ReflectionDiffuse && r.Radius > NearestViewing) {
			return true
		}
	}
	return false
}

// ControlsStandard names where the control measures come from.
const ControlsStandard = "IEC 60825-14 and ANSI Z136.1, control measures by class"

// ClassRank orders the classes, 1 to 5; an unassessed class ("") ranks
// as Class 4 (the conservative reading for the controls it needs).
func ClassRank(class string) int {
	switch class {
	case limits.Class1:
		return 1
	case limits.Class2:
		return 2
	case limits.Class3R:
		return 3
	case limits.Class3B:
		return 4
	}
	return 5
}

// CheckControls lists every control measure with whether the classes
// present need it and whether the setup declares it, and a defect for each
// one needed and missing.
func CheckControls(s *setup.Setup, h *Hazards) ([]ControlCheck, []budget.Finding) {
	var checks []ControlCheck
	var out []budget.Finding
	for _, r := range controlRules {
		cc := ControlCheck{Name: r.name, Provenance: limits.Provenance{Standard: ControlsStandard, Table: "control measures", Row: r.row, Status: limits.StatusFromMemory}}
		cc.InPlace, cc.Declared = r.declared(s.Controls)
		if r.when == nil || r.when(h) {
			for _, ll := range h.Lasers {
				if ClassRank(ll.Class) >= ClassRank(r.from) {
					class := "Class " + ll.Class
					if ll.Class == "" {
						class = "an unassessed class (taken as Class 4)"
					}
					cc.NeededBy = fmt.Sprintf("%s, laser %q", class, ll.Laser.Name)
					break
				}
			}
		}
		if cc.NeededBy != "" && !cc.InPlace {
			out = append(out, budget.Finding{Severity: budget.SeverityDefect, Kind: FindingMissingControl,
				Message: fmt.Sprintf("%s is needed (%s) but not declared in [controls] (%s: %s, from memory)", r.name, cc.NeededBy, ControlsStandard, r.row)})
		}
		checks = append(checks, cc)
	}
	return checks, out
}

// ControlSummary says in words what the setup declares, for the text.
func ControlSummary(c setup.Controls) string {
	var parts []string
	add := func(label, v string) {
		if v != "" && v != setup.ControlNone {
			parts = append(parts, label+" "+v)
		}
	}
	add("eyewear", c.Eyewear)
	add("entry", c.Entry)
	add("key control", c.KeyControl)
	add("warning signs", c.WarningSigns)
	add("training", c.Training)
	if c.Perimeter == setup.PerimeterBarrier {
		parts = append(parts, "perimeter barrier rated "+units.FormatIrradiance(c.PerimeterRating))
	}
	add("procedure", c.Procedure)
	add("alignment procedure", c.AlignmentProcedure)
	add("officer", c.Officer)
	if len(parts) == 0 {
		return "none declared"
	}
	return strings.Join(parts, "; ")
}

// ControlText says in words how a finding is controlled: for a hazard
// "controlled by …" or "uncontrolled", "" for other findings.
func ControlText(f budget.Finding) string {
	switch {
	case f.Severity != budget.SeverityHazard:
		return ""
	case len(f.ControlledBy) == 0:
		return "uncontrolled"
	}
	return "controlled by " + strings.Join(f.ControlledBy, ", ")
}

// LabelClassNote compares the class on a laser's label with the class
// computed for its beam as used, at its maximum power ("" when they agree or
// no label class is stated). 1M and 2M are not told apart from 1 and 2 by
// the computation, so they agree with them.
func LabelClassNote(label, computed string) string {
	base := strings.TrimSuffix(label, "M")
	switch {
	case label == "" || base == computed:
		return ""
	case computed == "":
		return fmt.Sprintf("labelled Class %s; the class of the beam as used was not assessed", label)
	}
	return fmt.Sprintf("labelled Class %s, but the beam as used, at its maximum power, is Class %s; the laser safety officer decides which governs", label, computed)
}
