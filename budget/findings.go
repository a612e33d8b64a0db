package budget

import (
	"beamledger/budget/optics"
	"beamledger/budget/setup"
	"beamledger/budget/units"
	"fmt"
	"math"
)

// Severity of a finding.
type Severity string

// Severities. A defect is to be fixed before alignment whatever the
// controls; a hazard is an exposure above the MPE, acceptable only when a
// declared control handles it (ControlledBy); a drive finding is planning,
// never safety; a note is for information. `check` exits 1 on a defect or an
// uncontrolled hazard (and, when asked, on an unmet drive goal).
const (
	SeverityDefect Severity = "defect"
	SeverityHazard Severity = "hazard"
	SeverityDrive  Severity = "drive"
	SeverityNote   Severity = "note"
)

// FindingKind is the short machine-readable kind of a finding, e.g.
// "clipping".
type FindingKind string

// Finding is something the evaluation found that a person should look at.
type Finding struct {
	Severity Severity
	Kind     FindingKind
	Path     string // path name, "" when not on a path
	Element  int    // 1-based element index, 0 when not at an element
	At       float64
	Message  string
	// Value is the figure the finding is about and Limit the one it is
	// judged against, both in Unit (SI, e.g. "W", "W/m2"); Unit is "" when
	// the finding has no figure.
	Value, Limit float64
	Unit         string
	// ControlledBy names, for a hazard, the declared controls that handle
	// it (the eyewear worn, the perimeter barrier); empty when it is
	// uncontrolled. Nil for other severities.
	ControlledBy []string
}

// Uncontrolled reports whether the finding is a defect or a hazard that no
// declared control handles: what makes `check` exit 1.
func (f Finding) Uncontrolled() bool {
	return f.Severity == SeverityDefect || (f.Severity == SeverityHazard && len(f.ControlledBy) == 0)
}

// Ratio is Value over Limit, 0 when the finding has no figure.
func (f Finding) Ratio() float64 {
	if f.Unit == "" || f.Limit == 0 {
		return 0
	}
	return f.Value / f.Limit
}

// Figure sets the finding's figure: value and limit in unit.
func (f Finding) Figure(value, limit float64, unit string) Finding {
	f.Value, f.Limit, f.Unit = value, limit, unit
	return f
}

// Finding kinds of the budget.
const (
	FindingClipping      FindingKind = "clipping"
	FindingModeMatch     FindingKind = "fibre_mode_match"
	FindingDumpRating    FindingKind = "dump_rating"
	FindingOpenEnd       FindingKind = "open_end"
	FindingUnfollowed    FindingKind = "unfollowed_splitter_port"
	FindingUnusedLaser   FindingKind = "unused_laser"
	FindingDumpUnrated   FindingKind = "dump_unrated"
	FindingLosslessGuess FindingKind = "assumed_lossless"
	FindingNotParaxial   FindingKind = "not_paraxial"
	FindingClippedPower  FindingKind = "clipped_power"
	FindingHugePower     FindingKind = "power_in_megawatts"
)

// HugeContinuousPower is the continuous power above which a laser's power
// is noted as possibly a unit slip ("2 MW" written for 2 mW), W: 10 kW,
// beyond any laboratory continuous source on an optical table (our
// threshold). The power is used as written.
const HugeContinuousPower = 10e3

// ClearApertureFactor: a clear aperture diameter under π·W (W the larger
// 1/e² radius) clips about 1 % or more of a round Gaussian beam; common
// practice sizes optics to at least this.
const ClearApertureFactor = math.Pi

// ClippedPowerAction is the clipped power, at the laser's maximum power,
// from which the light that an aperture or mount stops is an action finding,
// W: 0.5 W, the boundary of Class 4 for continuous emission, above which a
// beam is treated as a fire and burn hazard (our threshold, after IEC
// 60825-1:2014, the Class 3B limit).
const ClippedPowerAction = 0.5

// PoorModeOverlap is the computed fibre mode overlap below which the coupling
// optics, not the alignment, limit the coupling (our threshold).
const PoorModeOverlap = 0.5

// Findings lists what the budget found, in path and element order. Powers in
// messages use each laser's maximum power where they concern hazards or
// ratings, and say so.
func (b *Budget) Findings() []Finding {
	var out []Finding
	used := map[*setup.Laser]bool{}
	for _, own := range b.Paths {
		p := own.Path
		for _, pb := range own.Beams() {
			used[pb.Laser] = true
			max := pb.Laser.Power
			beamNote := ""
			if pb.IsJoined() {
				beamNote = fmt.Sprintf(", beam of laser %q", pb.Laser.Name)
			}
			for _, r := range pb.Rows {
				e := r.Element
				where := fmt.Sprintf("%s %d (%s%s)", "element", e.Index, e.Label(), beamNote)
				clear := e.ClearAperture()
				if clear > 0 {
					wx, wy := r.BeamIn.Radii()
					w := math.Max(wx, wy)
					if clipped := r.FractionIn * (1 - r.ClipFraction) * max; clipped >= ClippedPowerAction {
						out = append(out, Finding{Severity: SeverityDefect, Kind: FindingClippedPower, Path: p.Name, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: up to %s (%.1f %% of the arriving beam, at the laser's maximum power) falls outside its %s clear aperture onto the mount or iris; that much absorbed power can burn, melt or start a fire: enlarge the aperture, or make the part a rated dump",
							where, units.FormatPower(clipped), 100*(1-r.ClipFraction), units.FormatLength(clear))}.Figure(clipped, ClippedPowerAction, "W"))
					} else if clear < ClearApertureFactor*w {
						out = append(out, Finding{Severity: SeverityNote, Kind: FindingClipping, Path: p.Name, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: clear aperture %s is under π·W = %s for the beam there; %.2f %% of the power is clipped (included in the budget; diffraction from the edge is not modelled)",
							where, units.FormatLength(clear), units.FormatLength(ClearApertureFactor*w), 100*(1-r.ClipFraction))}.Figure(clear, ClearApertureFactor*w, "m"))
					}
				}
				if !r.BeamOut.Paraxial() {
					out = append(out, Finding{Severity: SeverityDefect, Kind: FindingNotParaxial, Path: p.Name, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: the beam leaving it diverges at a half-angle of %.3g rad, past the %g rad the Gaussian beam model holds to; the figures after it are not reliable (check the focal lengths and distances, or the optic's real aperture)",
						where, r.BeamOut.HalfAngle(), optics.MaxParaxialAngle)}.Figure(r.BeamOut.HalfAngle(), optics.MaxParaxialAngle, "rad"))
				}
				if r.Fiber != nil && !r.Fiber.Given && r.Fiber.Overlap < PoorModeOverlap {
					out = append(out, Finding{Severity: SeverityNote, Kind: FindingModeMatch, Path: p.Name, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: mode overlap with the fibre is only %.1f %%; the coupling optics do not match the beam to the mode (ideal coupling-lens focal length %s)",
						where, 100*r.Fiber.Overlap, IdealText(r.Fiber))}.Figure(r.Fiber.Overlap, PoorModeOverlap, "1"))
				}
			}
			for _, e := range pb.UnfollowedPorts {
				r := pb.row(e)
				pw := r.Lost(LossSplitterPort) * max
				out = append(out, Finding{Severity: SeverityDefect, Kind: FindingUnfollowed, Path: p.Name, Element: e.Index, At: e.At, Message: fmt.Sprintf("element %d (%s%s): up to %s leaves the other port and no path follows it; describe where it goes (a path from %q) or block it",
					e.Index, e.Label(), beamNote, units.FormatPower(pw), p.Name+":"+e.Name)})
			}
		}
		// A dump and an open end receive every beam on the path.
		maxWord := "the laser's"
		if len(own.Joined) > 0 {
			maxWord = "the lasers'"
		}
		for _, e := range p.Elements {
			if e.Type != setup.TypeDump {
				continue
			}
			pw := 0.0
			for _, pb := range own.Beams() {
				if r := pb.row(e); r != nil {
					pw += r.FractionIn * pb.Laser.Power
				}
			}
			where := fmt.Sprintf("element %d (%s)", e.Index, e.Label())
			if e.Rating == 0 {
				out = append(out, Finding{Severity: SeverityNote, Kind: FindingDumpUnrated, Path: p.Name, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: no rating stated; it receives up to %s at %s maximum power", where, units.FormatPower(pw), maxWord)})
			} else if pw > e.Rating {
				out = append(out, Finding{Severity: SeverityDefect, Kind: FindingDumpRating, Path: p.Name, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: receives up to %s at %s maximum power, above its rating of %s", where, units.FormatPower(pw), maxWord, units.FormatPower(e.Rating))}.Figure(pw, e.Rating, "W"))
			}
		}
		if own.OpenEnd {
			at := 0.0
			if n := len(p.Elements); n > 0 {
				at = p.Elements[n-1].At
			}
			pw := 0.0
			for _, pb := range own.Beams() {
				pw += pb.EndFraction * pb.Laser.Power
			}
			out = append(out, Finding{Severity: SeverityDefect, Kind: FindingOpenEnd, Path: p.Name, Element: 0, At: at, Message: fmt.Sprintf("the path ends without a dump: up to %s leaves it at %s; end it in a rated dump", units.FormatPower(pw), units.FormatLength(at))})
		}
	}
	for _, las := range b.Setup.Lasers {
		if !used[las] {
			out = append(out, Finding{Severity: SeverityDefect, Kind: FindingUnusedLaser, Path: "", Element: 0, At: 0, Message: fmt.Sprintf("laser %q feeds no path, so its beam is not evaluated at all; describe where its beam goes", las.Name)})
		}
	}
	for _, las := range b.Setup.Lasers {
		if las.Emission == setup.EmissionCW && las.Power > HugeContinuousPower {
			out = append(out, Finding{Severity: SeverityNote, Kind: FindingHugePower, Message: fmt.Sprintf("laser %q: a continuous power of %s is used as written; \"MW\" means megawatt, write \"mW\" for milliwatt", las.Name, units.FormatPower(las.Power))})
		}
	}
	if b.AssumedLossless > 0 {
		out = append(out, Finding{Severity: SeverityNote, Kind: FindingLosslessGuess, Path: "", Element: 0, At: 0, Message: fmt.Sprintf("%d element(s) have no stated loss and were assumed lossless; the budget is optimistic by their real losses", b.AssumedLossless)})
	}
	return out
}

func formatFocalPair(f [2]float64) string {
	show := func(v float64) string {
		if math.IsNaN(v) {
			return "none (expand the beam first)"
		}
		return units.FormatLength(v)
	}
	if f[0] == f[1] || (math.IsNaN(f[0]) && math.IsNaN(f[1])) || math.Abs(f[0]-f[1]) < 1e-3*math.Abs(f[0]) {
		return show(f[0])
	}
	return fmt.Sprintf("x %s, y %s", show(f[0]), show(f[1]))
}

// IdealText is a fibre's ideal coupling-lens focal length as printed: the
// pair (formatFocalPair), with the note on an astigmatic beam, or the
// note alone where none is given.
func IdealText(fc *FiberCoupling) string {
	switch {
	case fc.IdealNote == "":
		return formatFocalPair(fc.IdealFocalLength)
	case math.IsNaN(fc.IdealFocalLength[0]) && math.IsNaN(fc.IdealFocalLength[1]):
		return fc.IdealNote
	}
	return formatFocalPair(fc.IdealFocalLength) + " (" + fc.IdealNote + ")"
}
