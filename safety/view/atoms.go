package view

import (
	"beamledger/budget/atoms"
	"fmt"
	"math"
	"strconv"
	"strings"

	"beamledger/budget/drive"
	"beamledger/budget/setup"
	"beamledger/budget/units"
	"beamledger/safety"
)

func (b *builder) atomsList(a *safety.Assessment) *List {
	l := &List{Key: "atoms", Records: make([]Record, 0, len(a.Atoms))}
	for _, at := range a.Atoms {
		l.Records = append(l.Records, b.atomsRecord(at))
	}
	return l
}

func num(d *Desc, v float64) Field { return Plain(d, v) }

// hzField is an angular frequency ω shown as ω/2π in Hz.
func hzField(d *Desc, ω float64) Field { return Num(d, ω/(2*math.Pi), hz(ω)) }

func (b *builder) atomsRecord(a *drive.AtomsResult) Record {
	e := a.Row.Element
	tr := a.Transition
	las := a.Path.Laser
	wx, wy := a.Row.BeamIn.Radii()
	r := Record{Members: b.members(40)}
	r.F(Str(dPathRef, a.Path.Path.Name)).F(Whole(dElementRef, e.Index)).
		F(Str(dAtomsLaser, las.Name)).F(Field{d: dAtomsWavelengthM, Kind: Number, SI: a.Row.BeamIn.Wavelength, Text: units.FormatWavelength(a.Row.BeamIn.Wavelength)}).
		F(Str(dCloud, a.Cloud.Name)).F(Str(dTransitionName, tr.Name)).
		F(Len(dElementAtM, e.At)).
		F(Pow(dAtomsResultPowerW, a.Power)).
		F(Len(dRowRadiusXM, wx)).F(Len(dRowRadiusYM, wy)).
		F(Irr(dAtomsResultPeakIrradianceWM2, a.PeakIrradiance)).
		F(Num(dIrradianceAtRmsXRelative, a.EdgeRelative[0], fixed(100*a.EdgeRelative[0], 1, " %"))).
		F(Num(dIrradianceAtRmsYRelative, a.EdgeRelative[1], fixed(100*a.EdgeRelative[1], 1, " %")))
	r.F(NumRows(dRadiusAtCloudEndsM, [][]float64{a.EndRadii[0][:], a.EndRadii[1][:]}, fmt.Sprintf("%s × %s and %s × %s", units.FormatLength(a.EndRadii[0][0]), units.FormatLength(a.EndRadii[0][1]), units.FormatLength(a.EndRadii[1][0]), units.FormatLength(a.EndRadii[1][1]))))
	r.F(Field{d: dFocusX, Kind: Number, SI: a.FocusOffset[0], Text: units.FormatLength(a.FocusOffset[0]), People: true}).
		F(Field{d: dFocusY, Kind: Number, SI: a.FocusOffset[1], Text: units.FormatLength(a.FocusOffset[1]), People: true})
	r.F(hzField(dAtomsResultDetuningHz, a.Detuning)).
		F(Num(dDetuningLinewidths, a.Detuning/tr.Gamma, units.FormatNumber(a.Detuning/tr.Gamma)+" Γ")).
		F(Str(dDetuningSource, a.DetuningSource)).
		F(Num(dPulseS, pulseOrNaN(e.Pulse), units.FormatSI(e.Pulse, "s"))).
		F(Num(dTrapLightShiftHz, a.TrapShift, units.FormatFrequency(a.TrapShift))).
		F(Irr(dSaturationIntensityWM2, a.Isat)).
		F(Str(dSaturationIntensityKind, a.IsatNote)).
		F(num(dSaturation, a.Saturation)).
		F(hzField(dRabiFrequencyHz, a.Rabi)).
		F(num(dAtomsResultScatteringRatePerS, a.ScatteringRate)).
		F(num(dCrossSectionM2, a.CrossSection)).
		F(num(dOpticalDepth, a.OpticalDepth)).
		F(Flag(dFarDetuned, a.FarDetuned, yesNo(a.FarDetuned)))
	if a.NearLine != "" {
		r.F(Str(dNearLine, a.NearLine)).F(hzField(dNearLineDetuningHz, a.NearLineDetuning))
	}
	// the dipole trap
	d := a.Dipole
	if d != nil {
		depth := math.Max(0, -d.Depth/kB) // a repulsive beam makes no trap
		r.F(Num(dDipolePotentialK, d.Depth/kB, units.FormatSI(d.Depth/kB, "K"))).
			F(Num(dDipolePotentialHz, d.Depth/hPlanck, units.FormatFrequency(d.Depth/hPlanck))).
			F(Num(dDipoleResultTrapDepthK, depth, units.FormatSI(depth, "K"))).
			F(Num(dDepthWithGravityK, d.DepthWithGravity/kB, units.FormatSI(d.DepthWithGravity/kB, "K"))).
			F(hzField(dTrapFrequencyRadialHz, math.Sqrt(d.TrapX*d.TrapY))).
			F(hzField(dTrapFrequencyXHz, d.TrapX)).
			F(hzField(dTrapFrequencyYHz, d.TrapY)).
			F(hzField(dTrapFrequencyAxialHz, d.TrapAxial)).
			F(Field{d: dRwaRatio, Kind: Number, SI: d.RWARatio, Text: fmt.Sprintf("%.3f", d.RWARatio), People: true}).
			F(Num(dDipoleHeatingRateKPerS, d.HeatingRate, units.FormatSI(d.HeatingRate, "K/s"))).
			F(Num(dDipoleTimeToHeatS, d.HeatTime, units.FormatSI(d.HeatTime, "s")))
	} else {
		for _, k := range []string{"dipole_potential_k", "dipole_potential_hz", "trap_depth_k", "trap_depth_with_gravity_k", "trap_frequency_radial_hz", "trap_frequency_x_hz", "trap_frequency_y_hz", "trap_frequency_axial_hz", "heating_rate_k_per_s", "time_to_heat_by_depth_s"} {
			r.F(Absent(&Desc{k, k, ""}, false))
		}
	}
	var goal *Record
	if g := a.Goal; g != nil {
		goal = b.goalRecord(a, g)
		var tr *Record
		if gt := b.tol[a]; gt != nil {
			tr = toleranceRecord(gt)
			for _, l := range prefixKeys(tr.Lines, "tolerance.") {
				goal.Line(l)
			}
		}
		goal.O("tolerance", tr, true)
	}
	r.O("goal", goal, false)

	r.Line(fmt.Sprintf("path %q, element %d: cloud %q (%s, %s atoms), at {at_m}; laser %q at its operating power %s",
		a.Path.Path.Name, e.Index, a.Cloud.Name, tr.Name, fmtG(a.Cloud.Atoms), las.Name, units.FormatPower(las.OperatingPower)))
	r.Line("  beam: Wx {radius_x_m}, Wy {radius_y_m}; waist {focus_x} (x), {focus_y} (y) from the cloud (+ downstream)")
	r.Line("  power {power_w}, peak irradiance {peak_irradiance_w_m2}")
	r.Line(fmt.Sprintf("  across the cloud: I at ±1 rms is {irradiance_at_rms_x_relative} (x), {irradiance_at_rms_y_relative} (y) of the centre; W at ±1 rms along the beam (%s): {radius_at_cloud_ends_m}", units.FormatLength(a.Cloud.RMSAlong(a.Row.Element.Direction))))
	if a.TrapShift != 0 {
		r.Line("  detuning Δ/2π = {detuning_hz} = {detuning_linewidths} ({detuning_source}), from the transition as the trap's light shifts it at the trap minimum: its differential light shift {trap_light_shift_hz} is taken off")
	} else {
		r.Line("  detuning Δ/2π = {detuning_hz} = {detuning_linewidths} ({detuning_source})")
	}
	r.Line("  I_sat = {saturation_intensity_w_m2} ({saturation_intensity_kind})")
	switch {
	case a.NearLine != "":
		r.Line(fmt.Sprintf("  the light is {near_line_detuning_hz} from the line {near_line}, within %d of its linewidths: neither the far-detuned dipole formula nor the two-level figures of %s apply; not evaluated",
			setup.FarDetuningFactor, tr.Name))
	case a.FarDetuned:
		r.Line(fmt.Sprintf("  far detuned (|Δ| > %d Γ): dipole potential from the lines %s with counter-rotating terms (Grimm et al. 2000)", setup.FarDetuningFactor, strings.Join(tr.LineNames(), ", ")))
		kind := "attractive: a trap this deep"
		if d.PerIntensity >= 0 {
			kind = "repulsive: blue detuned, no trap"
		}
		r.Line("  dipole potential at the cloud centre U/k_B = {dipole_potential_k}, U/h = {dipole_potential_hz} (" + kind + "; {rwa_ratio} × the rotating-wave value); scattering rate {scattering_rate_per_s} photons/s")
		if !math.IsNaN(d.TrapX) {
			ax := "{trap_frequency_axial_hz}"
			if math.IsNaN(d.TrapAxial) {
				ax = "none (the cloud is not at an intensity maximum along the beam)"
			}
			r.Line("  trap frequencies (harmonic, this beam alone): x {trap_frequency_x_hz}, y {trap_frequency_y_hz}, axial " + ax)
			gravity := !math.IsNaN(d.DepthWithGravity) && a.Cloud.Down != [3]float64{}
			switch {
			case gravity && d.DepthWithGravity == 0:
				r.Line("  depth of this beam's own trap: {trap_depth_k} without gravity (|U| at the centre); with the cloud's gravity the beam alone does not hold the atoms")
				r.Line("  recoil heating by this beam's scattering at the centre {heating_rate_k_per_s} (T_r Γ_sc/3, Grimm et al. 2000)")
			case gravity:
				r.Line("  depth of this beam's own trap: {trap_depth_k} without gravity (|U| at the centre), {trap_depth_with_gravity_k} with the cloud's gravity over its lowest escape")
				r.Line("  recoil heating by this beam's scattering at the centre {heating_rate_k_per_s} (T_r Γ_sc/3, Grimm et al. 2000): it heats the atoms by its field-free depth in {time_to_heat_by_depth_s}")
			default:
				r.Line("  recoil heating by this beam's scattering at the centre {heating_rate_k_per_s} (T_r Γ_sc/3, Grimm et al. 2000): it heats the atoms by its depth in {time_to_heat_by_depth_s}")
			}
		}
		r.Line(fmt.Sprintf("  for reference: s = I/I_sat = {saturation}, Ω/2π = {rabi_frequency_hz} on %s", tr.Name))
	default:
		r.Line("  s = I/I_sat = {saturation}, Ω/2π = {rabi_frequency_hz}, scattering rate {scattering_rate_per_s} photons/s (two-level)")
	}
	r.Line("  resonant optical depth along the beam b0 = σ0 N/(2π σx σy √(1 − ρ²)) = {optical_depth} (σ0 = {cross_section_m2} m²; σx, σy, ρ the cloud's spread across the beam)")
	ab := a.Absorption
	r.F(Plain(dCloudTransmission, ab.Transmission)).
		F(Pow(dScatteredPowerW, a.ScatteredPower)).
		F(Plain(dSaturationEntrance, ab.Entrance)).
		F(Plain(dSaturationCentre, ab.Centre)).
		F(Plain(dSaturationExit, ab.Exit))
	if math.IsNaN(a.FractionAboveGoal) {
		r.F(Absent(dFractionAboveGoal, false))
	} else {
		r.F(Num(dFractionAboveGoal, a.FractionAboveGoal, fixed(100*a.FractionAboveGoal, 1, " %")))
	}
	if !a.FarDetuned && a.NearLine == "" {
		r.Line("  through the cloud (saturable absorption along each ray, with I_sat as above; independent two-level atoms, no diffraction, lensing or Doppler broadening, the detuning above): transmission {cloud_transmission}, {scattered_power_w} scattered; s on the beam axis {saturation_entrance} at the entrance (−2 rms), {saturation_centre} at the centre, {saturation_exit} at the exit (+2 rms)")
		if !math.IsNaN(a.FractionAboveGoal) {
			r.Line("  {fraction_above_goal} of the atoms (weighted by density) reach the goal's s at the operating power")
		}
	}
	if goal != nil {
		for _, l := range goal.Lines {
			r.Line(prefixKeys([]string{l}, "goal.")[0])
		}
	}
	return r
}

func (b *builder) goalRecord(a *drive.AtomsResult, g *drive.GoalResult) *Record {
	r := &Record{Members: b.members(20)}
	r.F(Str(dGoalResultKind, g.Kind)).F(Flag(dGoalUpperBound, g.Upper, yesNo(g.Upper)))
	bound := "="
	if g.Upper {
		bound = "at most"
	}
	r.F(Field{d: dGoalBound, Kind: String, Text: bound, People: true})
	switch g.Kind {
	case setup.GoalRabi, setup.GoalCollective:
		r.F(Num(dTargetSi, g.Target, hz(g.Target))) // Ω in rad/s
	case setup.GoalTrapDepth:
		r.F(Num(dTargetSi, g.Target, units.FormatSI(g.Target, "K")))
	default:
		r.F(num(dTargetSi, g.Target))
	}
	if g.Impossible == "" {
		r.F(Irr(dIrradianceNeededWM2, g.Intensity)).
			F(Pow(dPowerAtAtomsW, g.PowerAtAtoms)).
			F(Pow(dGoalResultSourcePowerW, g.SourcePower))
	} else {
		r.F(Absent(dIrradianceNeededWM2, false)).
			F(Absent(dPowerAtAtomsW, false)).
			F(Absent(dGoalResultSourcePowerW, false))
	}
	r.F(Pow(dAvailableSourcePowerW, g.Available))
	if g.Impossible == "" {
		r.F(Num(dGoalResultMarginDb, g.MarginDB, fmt.Sprintf("%+.1f dB", g.MarginDB)))
	} else {
		r.F(Absent(dGoalResultMarginDb, false))
	}
	verdict := "met"
	if !g.Met {
		verdict = "NOT met"
	}
	if g.BeyondMaximum {
		verdict += ", beyond the laser's maximum power"
	}
	r.F(Flag(dGoalResultMet, g.Met, verdict))
	r.F(Pow(dGoalResultMaximumPowerW, g.Maximum)).
		F(Flag(dGoalResultBeyondMaximum, g.BeyondMaximum, yesNo(g.BeyondMaximum)))
	r.F(Field{d: dGoalResultImpossible, Kind: String, Text: g.Impossible, OmitEmpty: true})
	if g.Kind != setup.GoalTrapDepth {
		r.F(Str(dGoalAt, g.At))
		where := map[string]string{setup.GoalAtCentre: "at the cloud centre, reached through the atoms in front of it", setup.GoalAtExit: "at the cloud's exit (+2 rms, the weakest-driven end), reached through the atoms in front of it"}[g.At]
		if g.At == setup.GoalAtAll {
			r.F(Plain(dGoalFraction, g.Fraction))
			where = fmt.Sprintf("for %s of the atoms (weighted by density), reached through the atoms in front of them", fixed(100*g.Fraction, 0, " %"))
		} else {
			r.F(Absent(dGoalFraction, true))
		}
		r.F(Field{d: dGoalWhere, Kind: String, Text: where, People: true})
	}
	switch g.Kind {
	case setup.GoalSaturation:
		r.Line("  goal: saturation s {goal_bound} {target_si}, {goal_where}")
	case setup.GoalRabi:
		r.Line("  goal: Rabi frequency Ω/2π {goal_bound} {target_si}, {goal_where}")
	case setup.GoalTrapDepth:
		uh := atoms.DepthFrequency(g.Target)
		r.F(Field{d: dGoalDepthHz, Kind: Number, SI: uh, Text: units.FormatFrequency(uh), People: true})
		r.Line("  goal: trap depth U/k_B {goal_bound} {target_si} (U/h = {goal_depth_hz})")
	case setup.GoalCollective:
		c := g.Collective
		r.F(num(dGoalResultGoalFactor, g.Factor)).
			F(hzField(dThresholdRabiFrequencyHz, c.OmegaC)).
			F(hzField(dThresholdRabiFrequencyLowHz, c.OmegaCLow)).
			F(num(dThresholdSaturation, c.SatC)).
			F(num(dPhotonBudgetSaturation, c.PhotonBudgetSat)).
			F(Flag(dBistable, c.Bistable, yesNo(c.Bistable))).
			F(Flag(dCollectiveRateGiven, c.FromRate, yesNo(c.FromRate))).
			F(Field{d: dD, Kind: Number, SI: c.D, Text: fmtG(c.D), People: true})
		r.Line("  goal: collective drive at {goal_factor} × the threshold of cooperative resonance fluorescence")
		if c.FromRate {
			r.Line(fmt.Sprintf("    threshold Ω_c/2π = {threshold_rabi_frequency_hz} from the stated collective rate N Γ_c/2π = %s (Ω_c = N Γ_c / 2)", units.FormatFrequency(a.Cloud.CollectiveRate)))
		} else {
			r.Line("    threshold Ω_c/2π = {threshold_rabi_frequency_hz} (D = b0 = {d}, used for the margin) to {threshold_rabi_frequency_low_hz} (D = b0/2); s_c = D²/32 = {threshold_saturation}")
		}
		regime := "smooth crossover (D ≤ 32)"
		if c.Bistable {
			regime = "bistable once single-atom decay is included (D > 32)"
		}
		r.Line("    photon-budget scale s = D = {photon_budget_saturation}; regime: " + regime)
		r.Line("    model: driven Dicke model with one collective decay channel, N Γ_c = D Γ / 4 (a planning estimate, uncertain by a factor of about 2)")
	}
	switch {
	case g.Impossible != "":
		r.Line("    cannot be met: {impossible}")
	case g.Upper:
		r.Line(fmt.Sprintf("    reached by a peak of {irradiance_needed_w_m2} arriving at the cloud → {power_at_atoms_w} at the atoms → {source_power_w} at laser %q, the most it may give; operating power {available_source_power_w}; margin {margin_db}: {met}", a.Path.Laser.Name))
	default:
		r.Line(fmt.Sprintf("    needs a peak of {irradiance_needed_w_m2} arriving at the cloud → {power_at_atoms_w} at the atoms → {source_power_w} at laser %q; operating power {available_source_power_w}; margin {margin_db}: {met}", a.Path.Laser.Name))
	}
	return r
}

// toleranceRecord shows a goal's tolerance analysis.
func toleranceRecord(gt *drive.GoalTolerance) *Record {
	r := &Record{}
	db := func(d *Desc, v float64) Field {
		if math.IsInf(v, 0) || math.IsNaN(v) {
			f := Absent(d, false)
			f.Text = "cannot be met"
			return f
		}
		return Num(d, v, fmt.Sprintf("%+.1f dB", v))
	}
	r.F(Whole(dSamples, gt.Samples)).
		F(Whole(dSamplesRequested, gt.Requested)).
		F(Flag(dInterrupted, gt.Interrupted, yesNo(gt.Interrupted))).
		F(Field{d: dSeed, Kind: Int, SI: float64(gt.Seed), Text: strconv.FormatUint(gt.Seed, 10)}).
		F(Num(dProbabilityMet, gt.ProbabilityMet, fixed(100*gt.ProbabilityMet, 1, " %"))).
		F(db(dMarginNominal, gt.Nominal)).
		F(db(dGoalToleranceMarginDbP05, gt.P05)).F(db(dGoalToleranceMarginDbP50, gt.P50)).F(db(dGoalToleranceMarginDbP95, gt.P95)).
		F(db(dMarginWorst, gt.Worst))
	cl := &List{Key: "contributors"}
	var top []string
	for i, c := range gt.Contributors {
		cr := Record{}
		in := c.Input
		path, idx := "", 0
		if in.Laser < 0 {
			path, idx = in.PathName, in.Element+1
		}
		cr.F(Str(dContribPath, path)).F(Whole(dTolerancedElementIndex, idx)).F(Str(dContribKey, in.Key)).F(Str(dContribLabel, in.Label)).
			F(Num(dContributorShare, c.Share, fixed(100*c.Share, 0, " %")))
		cl.Records = append(cl.Records, cr)
		if i < 3 {
			top = append(top, fmt.Sprintf("%s (%s)", in.Label, fixed(100*c.Share, 0, " %")))
		}
	}
	r.L(cl)
	r.F(Field{d: dTopContributors, Kind: String, Text: strings.Join(top, "; "), People: true})
	if gt.Interrupted {
		r.Line("    tolerance analysis interrupted after {samples} of {samples_requested} samples: the figures below are of those samples only")
	}
	r.Line("    tolerances ({samples} samples, seed {seed}): margin {margin_db_nominal} nominal, {margin_db_worst} worst case (every value at its bad end, ±3σ), {margin_db_p05} / {margin_db_p50} / {margin_db_p95} at the 5th / 50th / 95th percentile; met with probability {probability_met}")
	r.F(Flag(dNoSpread, gt.NoSpread, yesNo(gt.NoSpread)))
	switch {
	case gt.NoSpread:
		r.Line("    no toleranced input moves this goal's margin (its samples lie within 1e-9 dB): no shares of a spread")
	case len(top) > 0:
		r.Line("    largest shares of the spread (standardized regression coefficients, SRC²/ΣSRC²): {top_contributors}")
	}
	return r
}

// pulseOrNaN is a pulse's duration, NaN (absent) when none is given.
func pulseOrNaN(p float64) float64 {
	if p > 0 {
		return p
	}
	return math.NaN()
}
