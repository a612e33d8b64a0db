package budget

import (
	"fmt"
	"math"

	"beamledger/budget/atoms"
	"beamledger/budget/optics"
	"beamledger/budget/units"
)

// FarDetuningFactor: a beam counts as far detuned when its detuning from
// every line of the ground state that the dipole potential sums exceeds this
// many of that line's natural linewidths (for the alkalis, 1000 Γ is a few
// GHz, well beyond the excited-state hyperfine structure, so the D1/D2
// treatment of Grimm et al. (2000), §2.3, applies). Our threshold. Light
// within it of a line other than the driven one fits neither the far-detuned
// formula nor the two-level figures of the driven line, and is refused.
const FarDetuningFactor = 1000

// Detuning sources.
const (
	DetuningFromElement     = "stated at the atoms element"
	DetuningFromLaser       = "laser detuning plus AOM shifts"
	DetuningFromWavelengths = "laser and transition wavelengths plus AOM shifts"
)

// AtomsResult is the drive at one atoms element, at the laser's operating
// power.
type AtomsResult struct {
	Path       *PathBudget
	Row        *Row
	Cloud      *Cloud
	Transition *atoms.Transition
	// Power is the power arriving at the cloud, W.
	Power float64
	// PeakIrradiance at the cloud centre, W/m².
	PeakIrradiance float64
	// EdgeRelative is I at ±1 rms size across the beam over I at the centre,
	// in x and y.
	EdgeRelative [2]float64
	// EndRadii are the x and y 1/e² radii at −1 and +1 rms size along the
	// beam, m: [end][plane].
	EndRadii [2][2]float64
	// FocusOffset is the distance from the cloud to the x and y waists, m
	// (positive: downstream).
	FocusOffset [2]float64
	// Detuning Δ = ω_laser − ω_atom, rad/s, and where it came from.
	Detuning       float64
	DetuningSource string
	Isat           float64 // W/m²
	IsatNote       string
	Saturation     float64
	Rabi           float64 // rad/s
	ScatteringRate float64 // photons/s, two-level near resonance, or far-detuned
	CrossSection   float64 // σ0, m²
	OpticalDepth   float64 // b0
	// Absorption is what the cloud does to this beam at the operating
	// power (transmission; s at the entrance, centre and exit on the axis),
	// and ScatteredPower the power it scatters, W.
	Absorption     Absorption
	ScatteredPower float64
	// FractionAboveGoal is the share of the atoms (density-weighted) whose
	// s reaches the goal's at the operating power (NaN without a
	// saturation, Rabi or collective goal).
	FractionAboveGoal float64
	FarDetuned        bool
	// NearLine names another line of the ground state within
	// FarDetuningFactor of its linewidths of the light ("" when none); the
	// dipole and two-level figures are then not computed.
	NearLine string
	// NearLineDetuning is the detuning from that line, rad/s.
	NearLineDetuning float64
	Dipole           *DipoleResult
	Goal             *GoalResult
}

// NoLightAtAtoms is why a goal cannot be met when no power reaches the cloud.
const NoLightAtAtoms = "no light reaches the atoms: all of the beam is blocked or lost before this element"

// DipoleResult is the far-detuned trap of one beam at the cloud.
type DipoleResult struct {
	// PerIntensity is U/I at the cloud centre, J per W/m² (negative:
	// attractive); its sign says red or blue detuning even when no power
	// arrives.
	PerIntensity float64
	// Depth is U at the cloud centre, J (negative: attractive).
	Depth float64
	// RWARatio is U with counter-rotating terms over the rotating-wave U.
	RWARatio float64
	// TrapX, TrapY, TrapAxial are harmonic trap frequencies, rad/s; NaN
	// where the beam does not confine (blue detuning, unknown mass, or off
	// the focus along the beam).
	TrapX, TrapY, TrapAxial float64
}

// GoalResult is what a goal needs against what the laser gives.
type GoalResult struct {
	Kind string
	// Target in SI: s, Ω (rad/s), U/k_B (K); collective: the Ω it aims for.
	Target       float64
	Intensity    float64 // needed peak irradiance at the cloud, W/m²
	PowerAtAtoms float64 // W
	SourcePower  float64 // W, at the laser
	Available    float64 // W, the laser's operating power
	MarginDB     float64
	Met          bool
	// Impossible explains why no power reaches the goal ("" otherwise).
	Impossible string
	Collective *atoms.Collective
	Factor     float64
	// At is where in the cloud the goal must hold: "centre", "exit" or
	// "all" (then Fraction of the atoms, density-weighted, must reach it).
	At       string
	Fraction float64
}

// Where a goal must hold.
const (
	GoalAtCentre = "centre"
	GoalAtExit   = "exit"
	GoalAtAll    = "all"
)

// Drive evaluates every atoms element of the budget.
func (b *Budget) Drive() []*AtomsResult { return b.driveAll(true) }

// driveAll is Drive; full as for atomsAt.
func (b *Budget) driveAll(full bool) []*AtomsResult {
	clouds := map[string]*Cloud{}
	for _, c := range b.Setup.Clouds {
		clouds[c.Name] = c
	}
	var out []*AtomsResult
	for _, own := range b.Paths {
		for _, pb := range own.Beams() {
			for i := range pb.Rows {
				r := &pb.Rows[i]
				if r.Element.Type != TypeAtoms {
					continue
				}
				c := clouds[r.Element.Cloud]
				if c == nil || c.Data == nil {
					continue
				}
				out = append(out, b.atomsAt(pb, r, c, full))
			}
		}
	}
	return out
}

// atomsAt evaluates the drive at one atoms element; full also integrates
// the cloud's absorption over the beam (a tolerance sample needs only the
// goal's margin).
func (b *Budget) atomsAt(pb *PathBudget, r *Row, c *Cloud, full bool) *AtomsResult {
	las := pb.Laser
	tr := c.Data
	a := &AtomsResult{Path: pb, Row: r, Cloud: c, Transition: tr}
	beam := r.BeamIn
	wx, wy := beam.Radii()
	a.Power = r.FractionIn * las.OperatingPower
	a.PeakIrradiance = beam.PeakIrradiance(a.Power)
	// The cloud's rms sizes across the beam (its x and y planes) and along it.
	n := r.Element.Direction
	u, v := BeamAxes(n)
	σu, σv, σn := c.RMSAlong(u), c.RMSAlong(v), c.RMSAlong(n)
	a.EdgeRelative = [2]float64{math.Exp(-2 * σu * σu / (wx * wx)), math.Exp(-2 * σv * σv / (wy * wy))}
	for k, dz := range []float64{-σn, σn} {
		ex, ey := beam.RadiiAt(dz)
		a.EndRadii[k] = [2]float64{ex, ey}
	}
	a.FocusOffset = [2]float64{beam.X.WaistDistance(), beam.Y.WaistDistance()}
	var own *Element // the element's stated detuning is for the path's own laser
	if !pb.IsJoined() {
		own = r.Element
	}
	a.Detuning, a.DetuningSource = detuningAt(las, own, pb.ShiftBefore(pb.First+pb.rowIndex(r)), tr)
	a.Isat, a.IsatNote, _ = tr.Isat(c.Saturation)
	a.Saturation = atoms.Saturation(a.PeakIrradiance, a.Isat)
	a.Rabi = atoms.Rabi(tr.Gamma, a.Saturation)
	a.CrossSection = atoms.CrossSection(tr.Wavelength, tr.Gamma, a.Isat)
	a.OpticalDepth = atoms.OpticalDepth(a.CrossSection, c.Atoms, σu, σv)
	a.FractionAboveGoal = math.NaN()
	if full {
		col := columnFor(pb, pb.First+pb.rowIndex(r), r.Element, c)
		a.Absorption = col.absorb(a.Power, wx, wy)
		a.ScatteredPower = a.Power * (1 - a.Absorption.Transmission)
	}
	ω := tr.Frequency() + a.Detuning
	near, δ := tr.NearestLine(ω)
	nearDriven := math.Abs(a.Detuning) <= FarDetuningFactor*tr.Gamma
	switch {
	case nearDriven:
	case math.Abs(δ) <= FarDetuningFactor*near.Gamma:
		a.NearLine, a.NearLineDetuning = near.Name, δ
	default:
		a.FarDetuned = true
	}
	switch {
	case a.NearLine != "":
		a.ScatteringRate = math.NaN()
	case a.FarDetuned:
		d := atoms.FarDetuned(tr.Lines, ω)
		dr := &DipoleResult{PerIntensity: d.PotentialPerIntensity, Depth: d.PotentialPerIntensity * a.PeakIrradiance, RWARatio: d.PotentialPerIntensity / d.RWAPotentialPerIntensity,
			TrapX: math.NaN(), TrapY: math.NaN(), TrapAxial: math.NaN()}
		a.ScatteringRate = d.ScatteringPerIntensity * a.PeakIrradiance
		if dr.Depth < 0 && tr.Mass > 0 {
			u0 := -dr.Depth
			dr.TrapX = atoms.RadialTrapFrequency(u0, wx, tr.Mass)
			dr.TrapY = atoms.RadialTrapFrequency(u0, wy, tr.Mass)
			dr.TrapAxial = atoms.AxialTrapFrequency(u0, axialCurvature(beam), tr.Mass)
		}
		a.Dipole = dr
	default:
		a.ScatteringRate = atoms.ScatteringRate(tr.Gamma, a.Saturation, a.Detuning)
	}
	// A goal is the path's own laser's; another laser's beam on the path
	// is shown beside it.
	if e := r.Element; e.Goal != "" && !pb.IsJoined() {
		a.Goal = b.goal(a, e, full)
	}
	return a
}

// axialCurvature is κ = g”(0)/g(0) for the on-axis peak irradiance
// g(z) ∝ 1/(Wx(z) Wy(z)) of the beam at this point, 1/m², by a central
// difference on the scale of the shorter Rayleigh range. At the focus of a
// round beam, W² = W0²(1 + z²/z_R²) (Siegman, Lasers (1986), §17.1) gives
// κ = −2/z_R²; off it, (6u² − 2)/((1 + u²)² z_R²) with u = z/z_R.
func axialCurvature(beam optics.Beam) float64 {
	h := 1e-3 * math.Min(beam.X.RayleighRange(), beam.Y.RayleighRange())
	g := func(z float64) float64 {
		x, y := beam.RadiiAt(z)
		return 1 / (x * y)
	}
	return (g(h) - 2*g(0) + g(-h)) / (h * h * g(0))
}

// aomShift is the frequency shift of the AOMs before element upTo on path p
// and, through the splitters that feed it, on its parent paths, Hz: the
// shift the path's own laser carries there.
func aomShift(p *Path, upTo *Element) float64 {
	shift := 0.0
	for p != nil {
		for _, e := range p.Elements {
			if upTo != nil && e == upTo {
				break
			}
			shift += e.FrequencyShift()
		}
		upTo = p.ParentPort
		p = p.Parent
	}
	return shift
}

// FrequencyShift is the shift an element gives the light passing it, Hz:
// order × frequency × passes for an AOM, 0 for anything else.
func (e *Element) FrequencyShift() float64 {
	if e.Type != TypeAOM {
		return 0
	}
	return float64(e.Order) * e.Frequency * float64(e.Passes)
}

// LightFrequency is the optical frequency of laser las after AOM shifts
// totalling shift (Hz), from its vacuum wavelength, Hz.
func LightFrequency(las *Laser, shift float64) float64 { return atoms.C/las.Wavelength + shift }

// detuningAt finds Δ = ω_laser − ω_atom at atoms element e for laser las
// carrying AOM shifts totalling shift (Hz), rad/s, and where it came from:
// the element's stated detuning (e nil: not to be used, as for another
// laser's beam on the path), the laser's stated detuning plus the shifts,
// or the wavelengths plus the shifts.
func detuningAt(las *Laser, e *Element, shift float64, tr *atoms.Transition) (float64, string) {
	if e != nil && e.Detuning != nil {
		return 2 * math.Pi * *e.Detuning, DetuningFromElement
	}
	if las.DetuningSet {
		return 2 * math.Pi * (las.Detuning + shift), DetuningFromLaser
	}
	return 2 * math.Pi * (LightFrequency(las, shift) - atoms.C/tr.Wavelength), DetuningFromWavelengths
}

// DetuningTolerance is how far a stated detuning may sit from the one the
// wavelengths give, as a fraction of the transition frequency: 0.1 %, about
// 0.8 nm at 780 nm, so that a wavelength written to the nearest nanometre
// passes while a laser on another line, or a stated detuning that belongs
// to another laser, does not (our threshold).
const DetuningTolerance = 1e-3

// checkDetuning refuses, at atoms element e of path p, the path's own
// light whose frequency after the AOM shifts is not positive, and a stated
// detuning (on the element or the laser) that disagrees with the
// wavelengths by more than DetuningTolerance. It returns the problem, or "".
func checkDetuning(p *Path, e *Element, tr *atoms.Transition) string {
	return detuningProblem(p.Laser, e, aomShift(p, e), tr)
}

// detuningProblem is checkDetuning for laser las carrying AOM shifts
// totalling shift (Hz) to element e (nil: the element's detuning is not for
// this laser).
func detuningProblem(las *Laser, e *Element, shift float64, tr *atoms.Transition) string {
	ν := LightFrequency(las, shift)
	if !(ν > 0) {
		return fmt.Sprintf("the AOM shifts (%s in all) take laser %q at %s to a frequency of %s, which is not positive",
			units.FormatFrequency(shift), las.Name, units.FormatLength(las.Wavelength), units.FormatFrequency(ν))
	}
	Δ, source := detuningAt(las, e, shift, tr)
	if source == DetuningFromWavelengths {
		return ""
	}
	ν0 := atoms.C / tr.Wavelength
	stated := ν0 + Δ/(2*math.Pi)
	if diff := math.Abs(stated - ν); diff > DetuningTolerance*ν0 {
		return fmt.Sprintf("the stated detuning (%s) puts the light at %s, %s from %s, but laser %q at %s (with %s of AOM shifts) is at %s; they differ by %s, more than the %.1f %% of the transition frequency allowed; correct the wavelength or the detuning",
			source, units.FormatFrequency(stated), units.FormatFrequency(Δ/(2*math.Pi)), tr.Name, las.Name, units.FormatLength(las.Wavelength), units.FormatFrequency(shift), units.FormatFrequency(ν), units.FormatFrequency(diff), 100*DetuningTolerance)
	}
	return ""
}

// goal works out the power a goal needs at the atoms and at the laser.
func (b *Budget) goal(a *AtomsResult, e *Element, full bool) *GoalResult {
	tr := a.Transition
	g := &GoalResult{Kind: e.Goal, Available: a.Path.Laser.OperatingPower, Factor: 1}
	if a.NearLine != "" {
		g.Impossible = fmt.Sprintf("the light is %s from the line %s, within %d of its linewidths; neither the far-detuned dipole formula nor the two-level figures of %s apply there",
			units.FormatFrequency(a.NearLineDetuning/(2*math.Pi)), a.NearLine, FarDetuningFactor, tr.Name)
	}
	switch e.Goal {
	case GoalSaturation:
		g.Target = *e.GoalValue
		g.Intensity = g.Target * a.Isat
	case GoalRabi:
		g.Target = 2 * math.Pi * *e.GoalValue
		g.Intensity = atoms.SaturationForRabi(tr.Gamma, g.Target) * a.Isat
	case GoalTrapDepth:
		g.Target = *e.GoalValue
		switch {
		case g.Impossible != "":
		case !a.FarDetuned:
			g.Impossible = fmt.Sprintf("the beam is %s from the transition, not far detuned (more than %d Γ); the trap-depth formula does not apply", units.FormatFrequency(a.Detuning/(2*math.Pi)), FarDetuningFactor)
		case a.Dipole.PerIntensity >= 0:
			g.Impossible = "the beam is blue detuned: a single beam repels the atoms and makes no trap"
		case !(a.Row.FractionIn > 0):
			g.Impossible = NoLightAtAtoms
		default:
			// Judged at the beam's real trap minimum, with gravity: the
			// factor on the power whose trap is just that deep.
			k, why := trapDepthScale(a, g.Target*atoms.KB)
			if why != "" {
				g.Impossible = why
			} else {
				g.Intensity = k * a.PeakIrradiance
			}
		}
	case GoalCollective:
		g.Factor = e.GoalFactor
		var col atoms.Collective
		if a.Cloud.CollectiveRate > 0 {
			col = atoms.CollectiveFromRate(2*math.Pi*a.Cloud.CollectiveRate, tr.Gamma, a.OpticalDepth)
		} else {
			col = atoms.CollectiveThreshold(a.OpticalDepth, tr.Gamma)
		}
		g.Collective = &col
		g.Target = g.Factor * col.OmegaC
		g.Intensity = atoms.SaturationForRabi(tr.Gamma, g.Target) * a.Isat
	}
	if g.Impossible == "" && !(a.Row.FractionIn > 0) {
		g.Impossible = NoLightAtAtoms
	}
	// A drive goal holds at a place in the cloud: the incident intensity
	// must get through the atoms in front of it.
	g.At, g.Fraction = e.GoalAt, e.GoalFraction
	if g.Impossible == "" && e.Goal != GoalTrapDepth {
		sGoal := g.Intensity / a.Isat
		col := columnFor(a.Path, a.Path.First+a.Path.rowIndex(a.Row), e, a.Cloud)
		wx, wy := a.Row.BeamIn.Radii()
		switch g.At {
		case GoalAtExit:
			g.Intensity = a.Isat * atoms.IncomingIntensity(sGoal, col.b0*atoms.ColumnFraction(2), col.a)
		case GoalAtAll:
			g.Intensity = a.Isat * col.incidentForFraction(sGoal, g.Fraction, wx, wy)
		default:
			g.Intensity = a.Isat * atoms.IncomingIntensity(sGoal, col.b0*atoms.ColumnFraction(0), col.a)
		}
		if full {
			a.FractionAboveGoal = col.fractionAbove(a.PeakIrradiance/a.Isat, wx, wy, sGoal)
		}
	}
	if g.Impossible != "" {
		// No figure: the needed powers are not finite numbers.
		g.Intensity, g.PowerAtAtoms, g.SourcePower, g.MarginDB = 0, 0, 0, 0
		return g
	}
	g.PowerAtAtoms = a.Row.BeamIn.PowerForPeakIrradiance(g.Intensity)
	g.SourcePower = g.PowerAtAtoms / a.Row.FractionIn
	g.MarginDB = units.Decibels(g.Available / g.SourcePower)
	g.Met = g.Available >= g.SourcePower
	return g
}

// Finding kinds of the drive.
const (
	FindingGoalShort        FindingKind = "goal_short"
	FindingGoalImpossible   FindingKind = "goal_impossible"
	FindingDetuningGuess    FindingKind = "detuning_from_wavelengths"
	FindingCollectiveDetune FindingKind = "collective_detuned"
	FindingNearOtherLine    FindingKind = "near_other_line"
	FindingNoLight          FindingKind = "no_light_at_atoms"
)

// DriveFindings lists goals not met and doubtful inputs at the atoms.
func DriveFindings(results []*AtomsResult) []Finding {
	var out []Finding
	for _, a := range results {
		e := a.Row.Element
		where := fmt.Sprintf("element %d (atoms %q)", e.Index, a.Cloud.Name)
		p := a.Path.Path.Name
		if g := a.Goal; g != nil {
			switch {
			case g.Impossible != "":
				out = append(out, Finding{Severity: SeverityAction, Kind: FindingGoalImpossible, Path: p, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: goal %s cannot be met: %s", where, g.Kind, g.Impossible)})
			case !g.Met:
				out = append(out, Finding{Severity: SeverityAction, Kind: FindingGoalShort, Path: p, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: goal %s is short by %.1f dB at the laser: it needs %s from laser %q, whose operating power is %s",
					where, g.Kind, -g.MarginDB, units.FormatPower(g.SourcePower), a.Path.Laser.Name, units.FormatPower(g.Available))}.Figure(g.Available, g.SourcePower, "W"))
			}
			if g.Kind == GoalCollective && math.Abs(a.Detuning) > a.Transition.Gamma/2 {
				out = append(out, Finding{Severity: SeverityAdvice, Kind: FindingCollectiveDetune, Path: p, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: the drive is %s from resonance (more than Γ/2); the collective threshold model assumes a resonant drive",
					where, units.FormatFrequency(a.Detuning/(2*math.Pi)))})
			}
		}
		switch {
		case a.NearLine != "" && a.Goal == nil:
			out = append(out, Finding{Severity: SeverityAction, Kind: FindingNearOtherLine, Path: p, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: the light is %s from the line %s, within %d of its linewidths; the drive there is not evaluated (neither the far-detuned dipole formula nor the two-level figures of %s apply)",
				where, units.FormatFrequency(a.NearLineDetuning/(2*math.Pi)), a.NearLine, FarDetuningFactor, a.Transition.Name)})
		case !(a.Power > 0) && a.Goal == nil:
			out = append(out, Finding{Severity: SeverityAdvice, Kind: FindingNoLight, Path: p, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: %s", where, NoLightAtAtoms)})
		}
		if a.DetuningSource == DetuningFromWavelengths && !a.FarDetuned && a.NearLine == "" {
			out = append(out, Finding{Severity: SeverityAdvice, Kind: FindingDetuningGuess, Path: p, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: the detuning %s comes from the wavelengths, which are not precise enough near resonance; state detuning on laser %q",
				where, units.FormatFrequency(a.Detuning/(2*math.Pi)), a.Path.Laser.Name)})
		}
	}
	return out
}
