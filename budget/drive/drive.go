package drive

import (
	"fmt"
	"math"
	"runtime"
	"sync"

	"beamledger/budget"
	"beamledger/budget/atoms"
	"beamledger/budget/optics"
	"beamledger/budget/setup"
	"beamledger/budget/units"
)

// AtomsResult is the drive at one atoms element, at the laser's operating
// power.
type AtomsResult struct {
	Path       *budget.PathBudget
	Row        *budget.Row
	Cloud      *setup.Cloud
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
	// Detuning Δ = ω_laser − ω_atom, rad/s, and where it came from; for
	// near-resonant light the transition is the one the trap's light shift
	// leaves at the trap minimum, and TrapShift is that differential shift
	// (Hz, excited minus ground; 0 when none is included).
	Detuning       float64
	DetuningSource string
	TrapShift      float64
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
	Absorption     budget.Absorption
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
	// DepthWithGravity is the depth of this beam's own trap found at its
	// real minimum with the cloud's gravity, over its lowest escape, J (0
	// when it does not hold; NaN where not searched: a tolerance sample,
	// no mass, or no trap) — beside Depth, the field-free |U| at the centre.
	DepthWithGravity float64
	// HeatingRate is the trap light's recoil heating at the cloud centre,
	// K/s (atoms.RecoilHeatingRate), and HeatTime the time it takes to
	// heat the atoms by this beam's depth, s; NaN where the beam makes no
	// trap.
	HeatingRate, HeatTime float64

	scatI float64 // the scattering rate per unit intensity, photons/s per W/m²
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
	// Upper marks an upper bound (goal_max): SourcePower is then the most
	// the laser may give before the figure passes Target, Met says the
	// operating power stays at or under it, and MarginDB is
	// 10 log10(SourcePower/Available) (positive: under the bound).
	Upper bool
	// BeyondMaximum is set when the source power needed exceeds the laser's
	// maximum power, Maximum (W): no setting of the laser meets the goal.
	BeyondMaximum bool
	Maximum       float64
	// Impossible explains why no power reaches the goal ("" otherwise).
	Impossible string
	Collective *atoms.Collective
	Factor     float64
	// At is where in the cloud the goal must hold: "centre", "exit" or
	// "all" (then Fraction of the atoms, density-weighted, must reach it).
	At       string
	Fraction float64

	hints trapHints // a trap-depth goal's trap at the factor found, for the tolerance samples
}

// Drive evaluates every atoms element of the budget.
func Evaluate(b *budget.Budget) []*AtomsResult { return driveAll(b, pass{full: true, goals: true}) }

// pass is what one evaluation of the drive is for.
type pass struct {
	// full: the figures of the output, not just a goal's margin (the
	// cloud's absorption integrated over the beam, the findings' questions).
	full bool
	// goals: solve the goals.
	goals bool
	// given: a tolerance sample's start, the nominal goal's trap.
	given *trapHints
}

// driveAll is Evaluate for the pass p.
func driveAll(b *budget.Budget, p pass) []*AtomsResult {
	clouds := map[string]*setup.Cloud{}
	for _, c := range b.Setup.Clouds {
		clouds[c.Name] = c
	}
	type job struct {
		pb *budget.PathBudget
		r  *budget.Row
		c  *setup.Cloud
	}
	var jobs []job
	for _, own := range b.Paths {
		for _, pb := range own.Beams() {
			for i := range pb.Rows {
				r := &pb.Rows[i]
				if r.Element.Type != setup.TypeAtoms {
					continue
				}
				c := clouds[r.Element.Cloud]
				if c == nil || c.Data == nil {
					continue
				}
				jobs = append(jobs, job{pb, r, c})
			}
		}
	}
	out := make([]*AtomsResult, len(jobs))
	// The elements are independent: the output's pass spreads many of
	// them over the cores (a tolerance sample's pass runs on one core of
	// its own already).
	workers := 1
	if p.full && len(jobs) >= parallelAtoms {
		workers = runtime.GOMAXPROCS(0)
	}
	var wg sync.WaitGroup
	for w := range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := w; i < len(jobs); i += workers {
				out[i] = atomsAt(b, jobs[i].pb, jobs[i].r, jobs[i].c, p)
			}
		}()
	}
	wg.Wait()
	return out
}

// parallelAtoms is the number of atoms elements from which the output's
// drive is spread over the cores.
const parallelAtoms = 16

// atomsAt evaluates the drive at one atoms element for the pass p.
func atomsAt(b *budget.Budget, pb *budget.PathBudget, r *budget.Row, c *setup.Cloud, p pass) *AtomsResult {
	las := pb.Laser
	tr := c.Data
	a := &AtomsResult{Path: pb, Row: r, Cloud: c, Transition: tr}
	beam := r.BeamIn
	wx, wy := beam.Radii()
	a.Power = r.FractionIn * las.OperatingPower
	a.PeakIrradiance = beam.PeakIrradiance(a.Power)
	// The cloud's rms sizes across the beam (its x and y planes) and along it.
	n := r.Element.Direction
	u, v := setup.BeamAxes(n)
	σu, σv, σn := c.RMSAlong(u), c.RMSAlong(v), c.RMSAlong(n)
	a.EdgeRelative = [2]float64{math.Exp(-2 * σu * σu / (wx * wx)), math.Exp(-2 * σv * σv / (wy * wy))}
	for k, dz := range []float64{-σn, σn} {
		ex, ey := beam.RadiiAt(dz)
		a.EndRadii[k] = [2]float64{ex, ey}
	}
	a.FocusOffset = [2]float64{beam.X.WaistDistance(), beam.Y.WaistDistance()}
	a.Detuning, a.TrapShift, a.DetuningSource = budget.DetuningAtAtoms(pb, pb.First+pb.RowIndex(r), r.Element, c, b.Shifts[c])
	a.Isat, a.IsatNote, _ = tr.Isat(c.Saturation)
	a.Saturation = atoms.Saturation(a.PeakIrradiance, a.Isat)
	a.Rabi = atoms.Rabi(tr.Gamma, a.Saturation)
	a.CrossSection = atoms.CrossSection(tr.Wavelength, tr.Gamma, a.Isat)
	a.OpticalDepth = atoms.OpticalDepth(a.CrossSection, c.Atoms, σu, σv, c.Covariance(u, v)/(σu*σv))
	a.FractionAboveGoal = math.NaN()
	if p.full {
		col := budget.ColumnFor(pb, pb.First+pb.RowIndex(r), r.Element, c, b.Shifts[c])
		a.Absorption = col.Absorb(a.Power, wx, wy)
		a.ScatteredPower = a.Power * (1 - a.Absorption.Transmission)
	}
	ω := tr.Frequency() + a.Detuning
	switch kind, near, δ := setup.Classify(a.Detuning, tr); kind {
	case setup.LightOtherLine:
		a.NearLine, a.NearLineDetuning = near.Name, δ
	case setup.LightFar:
		a.FarDetuned = true
	}
	switch {
	case a.NearLine != "":
		a.ScatteringRate = math.NaN()
	case a.FarDetuned:
		d := atoms.FarDetuned(tr.Lines, ω)
		dr := &DipoleResult{PerIntensity: d.PotentialPerIntensity, Depth: d.PotentialPerIntensity * a.PeakIrradiance, RWARatio: d.PotentialPerIntensity / d.RWAPotentialPerIntensity,
			TrapX: math.NaN(), TrapY: math.NaN(), TrapAxial: math.NaN(), HeatingRate: math.NaN(), HeatTime: math.NaN(), DepthWithGravity: math.NaN(), scatI: d.ScatteringPerIntensity}
		a.ScatteringRate = d.ScatteringPerIntensity * a.PeakIrradiance
		if dr.Depth < 0 && tr.Mass > 0 {
			u0 := -dr.Depth
			dr.TrapX = atoms.RadialTrapFrequency(u0, wx, tr.Mass)
			dr.TrapY = atoms.RadialTrapFrequency(u0, wy, tr.Mass)
			dr.TrapAxial = atoms.AxialTrapFrequency(u0, axialCurvature(beam), tr.Mass)
			dr.HeatingRate = atoms.RecoilHeatingRate(atoms.RecoilTemperature(beam.Wavelength, tr.Mass), a.ScatteringRate)
			dr.HeatTime = u0 / atoms.KB / dr.HeatingRate
		}
		a.Dipole = dr
		if dr.Depth < 0 && tr.Mass > 0 && p.full && a.Power > 0 {
			f := singleBeamField(a, 1)
			f.flood = true
			// One beam has one minimum, by its focus (sagged under
			// gravity): the search starts there alone.
			fp := f.beams[0].focusPoint()
			f.hint = &fp
			if t := f.findTrap(); t.Holds {
				dr.DepthWithGravity = t.Depth
			} else {
				dr.DepthWithGravity = 0
			}
		}
	default:
		a.ScatteringRate = atoms.ScatteringRate(tr.Gamma, a.Saturation, a.Detuning)
	}
	// A goal is the path's own laser's; another laser's beam on the path
	// is shown beside it.
	if e := r.Element; p.goals && e.Goal != "" && pb.Laser.Name == e.GoalLaser {
		a.Goal = goalOf(b, a, e, p)
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

// goal works out the power a goal needs at the atoms and at the laser.
func goalOf(b *budget.Budget, a *AtomsResult, e *setup.Element, p pass) *GoalResult {
	tr := a.Transition
	g := &GoalResult{Kind: e.Goal, Available: a.Path.Laser.OperatingPower, Factor: 1, Upper: e.GoalMax}
	if a.NearLine != "" {
		g.Impossible = fmt.Sprintf("the light is %s from the line %s, within %d of its linewidths; neither the far-detuned dipole formula nor the two-level figures of %s apply there",
			units.FormatFrequency(a.NearLineDetuning/(2*math.Pi)), a.NearLine, setup.FarDetuningFactor, tr.Name)
	}
	switch e.Goal {
	case setup.GoalSaturation:
		g.Target = *e.GoalValue
		g.Intensity = g.Target * a.Isat
	case setup.GoalRabi:
		g.Target = 2 * math.Pi * *e.GoalValue
		g.Intensity = atoms.SaturationForRabi(tr.Gamma, g.Target) * a.Isat
	case setup.GoalTrapDepth:
		g.Target = *e.GoalValue
		switch {
		case g.Impossible != "":
		case !a.FarDetuned:
			g.Impossible = fmt.Sprintf("the beam is %s from the transition, not far detuned (more than %d Γ); the trap-depth formula does not apply", units.FormatFrequency(a.Detuning/(2*math.Pi)), setup.FarDetuningFactor)
		case a.Dipole.PerIntensity >= 0:
			g.Impossible = "the beam is blue detuned: a single beam repels the atoms and makes no trap"
		case !(a.Row.FractionIn > 0):
			g.Impossible = NoLightAtAtoms
		default:
			// Judged at the beam's real trap minimum, with gravity: the
			// factor on the power whose trap is just that deep.
			k, hints, why := trapDepthScale(a, g.Target*atoms.KB, p.given)
			g.hints = hints
			if why != "" {
				g.Impossible = why
			} else {
				g.Intensity = k * a.PeakIrradiance
			}
		}
	case setup.GoalCollective:
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
	if g.Impossible == "" && e.Goal != setup.GoalTrapDepth {
		sGoal := g.Intensity / a.Isat
		col := budget.ColumnFor(a.Path, a.Path.First+a.Path.RowIndex(a.Row), e, a.Cloud, b.Shifts[a.Cloud])
		wx, wy := a.Row.BeamIn.Radii()
		switch g.At {
		case setup.GoalAtExit:
			g.Intensity = a.Isat * atoms.IncomingIntensity(sGoal, col.B0*atoms.ColumnFraction(2), col.A)
		case setup.GoalAtAll:
			g.Intensity = a.Isat * col.IncidentForFraction(sGoal, g.Fraction, wx, wy)
		default:
			g.Intensity = a.Isat * atoms.IncomingIntensity(sGoal, col.B0*atoms.ColumnFraction(0), col.A)
		}
		if p.full {
			a.FractionAboveGoal = col.FractionAbove(a.PeakIrradiance/a.Isat, wx, wy, sGoal)
		}
	}
	if g.Impossible != "" {
		// No figure: the needed powers are not finite numbers.
		g.Intensity, g.PowerAtAtoms, g.SourcePower, g.MarginDB = 0, 0, 0, 0
		return g
	}
	g.PowerAtAtoms = a.Row.BeamIn.PowerForPeakIrradiance(g.Intensity)
	g.settle(a.Row.FractionIn, a.Path.Laser)
	return g
}

// settle works out, from the power the goal needs at the atoms, what the
// laser las must send (the beam reaching the atoms with the fraction f of
// its power) and the margin against its operating power.
func (g *GoalResult) settle(f float64, las *setup.Laser) {
	g.SourcePower = g.PowerAtAtoms / f
	g.Available, g.Maximum = las.OperatingPower, las.Power
	if g.Upper {
		g.MarginDB = units.Decibels(g.SourcePower / g.Available)
		g.Met = g.Available <= g.SourcePower
		return
	}
	g.MarginDB = units.Decibels(g.Available / g.SourcePower)
	g.Met = g.Available >= g.SourcePower
	g.BeyondMaximum = g.SourcePower > g.Maximum
}

// Finding kinds of the drive.
const (
	FindingGoalShort        budget.FindingKind = "goal_short"
	FindingGoalExceeded     budget.FindingKind = "goal_exceeded"
	FindingGoalImpossible   budget.FindingKind = "goal_impossible"
	FindingDetuningGuess    budget.FindingKind = "detuning_from_wavelengths"
	FindingCollectiveDetune budget.FindingKind = "collective_detuned"
	FindingNearOtherLine    budget.FindingKind = "near_other_line"
	FindingNoLight          budget.FindingKind = "no_light_at_atoms"
)

// DriveFindings lists goals not met and doubtful inputs at the atoms.
func DriveFindings(results []*AtomsResult) []budget.Finding {
	var out []budget.Finding
	for _, a := range results {
		e := a.Row.Element
		where := fmt.Sprintf("element %d (atoms %q)", e.Index, a.Cloud.Name)
		p := a.Path.Path.Name
		if g := a.Goal; g != nil {
			switch {
			case g.Impossible != "":
				out = append(out, budget.Finding{Severity: budget.SeverityDrive, Kind: FindingGoalImpossible, Path: p, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: goal %s cannot be met: %s", where, g.Kind, g.Impossible)})
			case !g.Met && g.Upper:
				out = append(out, budget.Finding{Severity: budget.SeverityDrive, Kind: FindingGoalExceeded, Path: p, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: goal %s at most its goal_max is exceeded by %.1f dB at the laser: laser %q may give at most %s here, and its operating power is %s",
					where, g.Kind, -g.MarginDB, a.Path.Laser.Name, units.FormatPower(g.SourcePower), units.FormatPower(g.Available))}.Figure(g.Available, g.SourcePower, "W"))
			case !g.Met:
				msg := fmt.Sprintf("%s: goal %s is short by %.1f dB at the laser: it needs %s from laser %q, whose operating power is %s",
					where, g.Kind, -g.MarginDB, units.FormatPower(g.SourcePower), a.Path.Laser.Name, units.FormatPower(g.Available))
				if g.BeyondMaximum {
					msg += fmt.Sprintf("; that is more than its maximum power of %s, so no setting of the laser meets it", units.FormatPower(g.Maximum))
				}
				out = append(out, budget.Finding{Severity: budget.SeverityDrive, Kind: FindingGoalShort, Path: p, Element: e.Index, At: e.At, Message: msg}.Figure(g.Available, g.SourcePower, "W"))
			}
			if g.Kind == setup.GoalCollective && math.Abs(a.Detuning) > a.Transition.Gamma/2 {
				out = append(out, budget.Finding{Severity: budget.SeverityNote, Kind: FindingCollectiveDetune, Path: p, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: the drive is %s from resonance (more than Γ/2); the collective threshold model assumes a resonant drive",
					where, units.FormatFrequency(a.Detuning/(2*math.Pi)))})
			}
		}
		switch {
		case a.NearLine != "" && a.Goal == nil:
			out = append(out, budget.Finding{Severity: budget.SeverityDefect, Kind: FindingNearOtherLine, Path: p, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: the light is %s from the line %s, within %d of its linewidths; the drive there is not evaluated (neither the far-detuned dipole formula nor the two-level figures of %s apply)",
				where, units.FormatFrequency(a.NearLineDetuning/(2*math.Pi)), a.NearLine, setup.FarDetuningFactor, a.Transition.Name)})
		case !(a.Power > 0) && a.Goal == nil:
			out = append(out, budget.Finding{Severity: budget.SeverityNote, Kind: FindingNoLight, Path: p, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: %s", where, NoLightAtAtoms)})
		}
		if a.DetuningSource == setup.DetuningFromWavelengths && !a.FarDetuned && a.NearLine == "" {
			out = append(out, budget.Finding{Severity: budget.SeverityNote, Kind: FindingDetuningGuess, Path: p, Element: e.Index, At: e.At, Message: fmt.Sprintf("%s: the detuning %s comes from the wavelengths, which are not precise enough near resonance; state detuning on laser %q",
				where, units.FormatFrequency(a.Detuning/(2*math.Pi)), a.Path.Laser.Name)})
		}
	}
	return out
}
