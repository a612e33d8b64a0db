package budget

import (
	"fmt"
	"math"

	"beamledger/budget/atoms"
)

// FarDetuningFactor: a beam counts as far detuned when |Δ| exceeds this many
// natural linewidths of the driven transition (for the alkalis, 1000 Γ is a
// few GHz, well beyond the excited-state hyperfine structure, so the D1/D2
// treatment of Grimm et al. (2000), §2.3, applies). Our threshold.
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
	FarDetuned     bool
	Dipole         *DipoleResult
	Goal           *GoalResult
}

// DipoleResult is the far-detuned trap of one beam at the cloud.
type DipoleResult struct {
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
}

// Drive evaluates every atoms element of the budget.
func (b *Budget) Drive() []*AtomsResult {
	clouds := map[string]*Cloud{}
	for _, c := range b.Setup.Clouds {
		clouds[c.Name] = c
	}
	var out []*AtomsResult
	for _, pb := range b.Paths {
		for i := range pb.Rows {
			r := &pb.Rows[i]
			if r.Element.Type != TypeAtoms {
				continue
			}
			c := clouds[r.Element.Cloud]
			if c == nil || c.Data == nil {
				continue
			}
			out = append(out, b.atomsAt(pb, r, c))
		}
	}
	return out
}

func (b *Budget) atomsAt(pb *PathBudget, r *Row, c *Cloud) *AtomsResult {
	las := pb.Laser
	tr := c.Data
	a := &AtomsResult{Path: pb, Row: r, Cloud: c, Transition: tr}
	beam := r.BeamIn
	wx, wy := beam.Radii()
	a.Power = r.FractionIn * las.OperatingPower
	a.PeakIrradiance = beam.PeakIrradiance(a.Power)
	a.EdgeRelative = [2]float64{math.Exp(-2 * c.RMSSize[0] * c.RMSSize[0] / (wx * wx)), math.Exp(-2 * c.RMSSize[1] * c.RMSSize[1] / (wy * wy))}
	for k, dz := range []float64{-c.RMSSize[2], c.RMSSize[2]} {
		ex, ey := beam.RadiiAt(dz)
		a.EndRadii[k] = [2]float64{ex, ey}
	}
	a.FocusOffset = [2]float64{beam.X.WaistDistance(), beam.Y.WaistDistance()}
	a.Detuning, a.DetuningSource = b.detuning(pb, r, tr)
	a.Isat, a.IsatNote, _ = tr.Isat(c.Saturation)
	a.Saturation = atoms.Saturation(a.PeakIrradiance, a.Isat)
	a.Rabi = atoms.Rabi(tr.Gamma, a.Saturation)
	a.CrossSection = atoms.CrossSection(tr.Wavelength, tr.Gamma, a.Isat)
	a.OpticalDepth = atoms.OpticalDepth(a.CrossSection, c.Atoms, c.RMSSize[0], c.RMSSize[1])
	a.FarDetuned = math.Abs(a.Detuning) > FarDetuningFactor*tr.Gamma
	if a.FarDetuned {
		ω := tr.Frequency() + a.Detuning
		d := atoms.FarDetuned(tr.Lines, ω)
		dr := &DipoleResult{Depth: d.PotentialPerIntensity * a.PeakIrradiance, RWARatio: d.PotentialPerIntensity / d.RWAPotentialPerIntensity,
			TrapX: math.NaN(), TrapY: math.NaN(), TrapAxial: math.NaN()}
		a.ScatteringRate = d.ScatteringPerIntensity * a.PeakIrradiance
		if dr.Depth < 0 && tr.Mass > 0 {
			u0 := -dr.Depth
			dr.TrapX = math.Sqrt(4 * u0 / (tr.Mass * wx * wx))
			dr.TrapY = math.Sqrt(4 * u0 / (tr.Mass * wy * wy))
			if k := axialCurvature(beam); k < 0 {
				// U(z) = U0 g(z)/g(0) with g = 1/(Wx Wy); ω_z² = −U0 g''/(g m).
				dr.TrapAxial = math.Sqrt(-u0 * k / tr.Mass)
			}
		}
		a.Dipole = dr
	} else {
		a.ScatteringRate = atoms.ScatteringRate(tr.Gamma, a.Saturation, a.Detuning)
	}
	if e := r.Element; e.Goal != "" {
		a.Goal = b.goal(a, e)
	}
	return a
}

// axialCurvature is g”(0)/g(0) for g(z) = 1/(Wx(z) Wy(z)), 1/m², by a
// central difference on the scale of the shorter Rayleigh range.
func axialCurvature(beam Beam) float64 {
	h := 1e-3 * math.Min(beam.X.RayleighRange(), beam.Y.RayleighRange())
	g := func(z float64) float64 {
		x, y := beam.RadiiAt(z)
		return 1 / (x * y)
	}
	return (g(h) - 2*g(0) + g(-h)) / (h * h * g(0))
}

// detuning finds Δ at the atoms element r of path pb.
func (b *Budget) detuning(pb *PathBudget, r *Row, tr *atoms.Transition) (float64, string) {
	if d := r.Element.Detuning; d != nil {
		return 2 * math.Pi * *d, DetuningFromElement
	}
	shift := 0.0 // Hz
	p, upTo := pb.Path, r.Element
	for p != nil {
		for _, e := range p.Elements {
			if upTo != nil && e == upTo {
				break
			}
			if e.Type == TypeAOM {
				shift += float64(e.Order) * e.Frequency * float64(e.Passes)
			}
		}
		upTo = p.ParentPort
		p = p.Parent
	}
	las := pb.Laser
	if las.DetuningSet {
		return 2 * math.Pi * (las.Detuning + shift), DetuningFromLaser
	}
	base := atoms.C/las.Wavelength - atoms.C/tr.Wavelength
	return 2 * math.Pi * (base + shift), DetuningFromWavelengths
}

// goal works out the power a goal needs at the atoms and at the laser.
func (b *Budget) goal(a *AtomsResult, e *Element) *GoalResult {
	tr := a.Transition
	g := &GoalResult{Kind: e.Goal, Available: a.Path.Laser.OperatingPower, Factor: 1}
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
		case !a.FarDetuned:
			g.Impossible = fmt.Sprintf("the beam is %s from the transition, not far detuned (more than %d Γ); the trap-depth formula does not apply", FormatFrequency(a.Detuning/(2*math.Pi)), FarDetuningFactor)
		case a.Dipole.Depth >= 0:
			g.Impossible = "the beam is blue detuned: a single beam repels the atoms and makes no trap"
		default:
			perI := a.Dipole.Depth / a.PeakIrradiance
			g.Intensity = g.Target * atoms.KB / -perI
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
	if g.Impossible != "" {
		g.PowerAtAtoms, g.SourcePower, g.MarginDB = math.Inf(1), math.Inf(1), math.Inf(-1)
		return g
	}
	wx, wy := a.Row.BeamIn.Radii()
	g.PowerAtAtoms = g.Intensity * math.Pi * wx * wy / 2
	if a.Row.FractionIn > 0 {
		g.SourcePower = g.PowerAtAtoms / a.Row.FractionIn
		g.MarginDB = Decibels(g.Available / g.SourcePower)
	} else {
		g.SourcePower, g.MarginDB = math.Inf(1), math.Inf(-1)
	}
	g.Met = g.Available >= g.SourcePower
	return g
}

// Finding kinds of the drive.
const (
	FindingGoalShort        = "goal_short"
	FindingGoalImpossible   = "goal_impossible"
	FindingDetuningGuess    = "detuning_from_wavelengths"
	FindingCollectiveDetune = "collective_detuned"
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
				out = append(out, Finding{SeverityAction, FindingGoalImpossible, p, e.Index, e.At,
					fmt.Sprintf("%s: goal %s cannot be met: %s", where, g.Kind, g.Impossible)})
			case !g.Met:
				out = append(out, Finding{SeverityAction, FindingGoalShort, p, e.Index, e.At,
					fmt.Sprintf("%s: goal %s is short by %.1f dB at the laser: it needs %s from laser %q, whose operating power is %s",
						where, g.Kind, -g.MarginDB, FormatPower(g.SourcePower), a.Path.Laser.Name, FormatPower(g.Available))})
			}
			if g.Kind == GoalCollective && math.Abs(a.Detuning) > a.Transition.Gamma/2 {
				out = append(out, Finding{SeverityAdvice, FindingCollectiveDetune, p, e.Index, e.At,
					fmt.Sprintf("%s: the drive is %s from resonance (more than Γ/2); the collective threshold model assumes a resonant drive",
						where, FormatFrequency(a.Detuning/(2*math.Pi)))})
			}
		}
		if a.DetuningSource == DetuningFromWavelengths && !a.FarDetuned {
			out = append(out, Finding{SeverityAdvice, FindingDetuningGuess, p, e.Index, e.At,
				fmt.Sprintf("%s: the detuning %s comes from the wavelengths, which are not precise enough near resonance; state detuning on laser %q",
					where, FormatFrequency(a.Detuning/(2*math.Pi)), a.Path.Laser.Name)})
		}
	}
	return out
}
