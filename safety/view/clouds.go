package view

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"beamledger/budget/atoms"
	"beamledger/budget/drive"
	"beamledger/budget/setup"
	"beamledger/budget/units"
	"beamledger/safety"
)

// cloudsList is every cloud with all its beams counted together.
func (b *builder) cloudsList(a *safety.Assessment) *List {
	l := &List{Key: "clouds", Gap: true, Records: make([]Record, 0, len(a.Clouds))}
	for _, cr := range a.Clouds {
		l.Records = append(l.Records, b.cloudRecord(cr))
	}
	return l
}

// vec writes a vector of the cloud frame.
func vec(v [3]float64) string {
	return fmt.Sprintf("[%s, %s, %s]", fmtG(round6(v[0])), fmtG(round6(v[1])), fmtG(round6(v[2])))
}

// round6 drops the last digits of a unit vector's components (so that
// −1.2e-17 reads 0).
func round6(x float64) float64 { return math.Round(x*1e6) / 1e6 }

func lengths(v [3]float64) string {
	return fmt.Sprintf("[%s, %s, %s]", units.FormatLength(v[0]), units.FormatLength(v[1]), units.FormatLength(v[2]))
}

func (b *builder) cloudRecord(cr *drive.CloudResult) Record {
	c := cr.Cloud
	r := Record{Members: b.members(24)}
	r.F(Str(dCloudName, c.Name)).F(Str(dCloudTransition, c.Transition))
	down := "none"
	if c.Down != [3]float64{} {
		down = vec(c.Down)
	}
	r.F(Field{d: dDownText, Kind: String, Text: down, People: true})
	beams := &List{Key: "beams", Columns: []string{"path", "element_index", "laser", "power_w", "direction", "detuning_hz", "role"}, Left: 3, Indent: 1, Records: make([]Record, 0, len(cr.Beams))}
	for _, cb := range cr.Beams {
		at := cb.Atoms
		role := "neither (near another line)"
		switch {
		case cb.Far && cb.Forward != nil:
			role = "far detuned, standing wave with its forward pass"
		case cb.Far:
			role = "far detuned (dipole potential)"
		case cb.Near && cb.Forward != nil:
			role = "near resonance, standing wave"
		case cb.Near:
			role = "near resonance"
		case at.Row.FractionIn <= 0:
			role = "no light"
		}
		br := Record{Members: b.members(8)}
		br.F(Str(dPathRef, at.Path.Path.Name)).F(Whole(dElementIndexRef, at.Row.Element.Index)).F(Str(dLaserRef, at.Path.Laser.Name)).
			F(Pow(dAtomsResultPowerW, at.Power)).
			F(NumList(dDirection, cb.Direction[:], vec(cb.Direction))).
			F(Num(dAtomsResultDetuningHz, at.Detuning/(2*math.Pi), units.FormatFrequency(at.Detuning/(2*math.Pi)))).
			F(Field{d: dRole, Kind: String, Text: role, People: true}).
			F(Num(dPulseS, pulseOrNaN(at.Row.Element.Pulse), units.FormatSI(at.Row.Element.Pulse, "s"))).
			F(Num(dPhotonsPerAtom, cb.Photons, fmtG(cb.Photons))).
			F(Num(dPhotonsToHeatOut, cb.HeatOut, fmtG(cb.HeatOut))).
			F(Num(dPhotonsToPushOut, cb.PushOut, fmtG(cb.PushOut)))
		beams.Records = append(beams.Records, br)
	}
	r.L(beams)
	r.Line(fmt.Sprintf("cloud %q ({transition}), gravity along {down}: %d beam(s)", c.Name, len(cr.Beams)))
	r.F(Num(dDipoleAtCloudK, cr.PotentialAtCloud/atoms.KB, units.FormatSI(cr.PotentialAtCloud/atoms.KB, "K")))
	if cr.Trap != nil {
		r.After = append(r.After, "  dipole potential of the far-detuned beams at the cloud U/k_B = {dipole_potential_at_cloud_k}")
	}
	t := cr.Trap
	switch {
	case t == nil:
		r.F(Absent(dTrapMinimumOffsetM, false)).F(Absent(dTrapTrapDepthK, false)).F(Absent(dTrapFrequenciesHz, false)).F(Absent(dTrapAxes, false)).
			F(Absent(dGravitySagM, false)).F(Absent(dHoldsAgainstGravity, false)).F(Absent(dForceAtCloudG, false)).F(Absent(dLatticeFrequencyHz, false)).F(Absent(dEscapeDirection, false)).F(Absent(dTrapNote, true)).
			F(Absent(dTrapHeatingRateKPerS, false)).F(Absent(dTrapTimeToHeatS, false)).F(Absent(dTrapLeaveK, false))
		r.After = append(r.After, "  no far-detuned beam: no dipole trap")
	case t.Skipped != "":
		r.F(Absent(dTrapMinimumOffsetM, false)).F(Absent(dTrapTrapDepthK, false)).F(Absent(dTrapFrequenciesHz, false)).F(Absent(dTrapAxes, false)).
			F(Absent(dGravitySagM, false)).F(Absent(dHoldsAgainstGravity, false)).F(Absent(dForceAtCloudG, false)).F(Absent(dLatticeFrequencyHz, false)).F(Absent(dEscapeDirection, false)).F(Str(dTrapNote, t.Skipped)).
			F(Absent(dTrapHeatingRateKPerS, false)).F(Absent(dTrapTimeToHeatS, false)).F(Absent(dTrapLeaveK, false))
		r.After = append(r.After, "  trap: not searched for: {trap_note}")
	case !t.Found:
		r.F(Absent(dTrapMinimumOffsetM, false)).F(Absent(dTrapTrapDepthK, false)).F(Absent(dTrapFrequenciesHz, false)).F(Absent(dTrapAxes, false)).
			F(Absent(dGravitySagM, false)).F(Flag(dHoldsAgainstGravity, false, "no")).F(Absent(dForceAtCloudG, false)).F(Absent(dLatticeFrequencyHz, false)).F(Absent(dEscapeDirection, false)).F(Absent(dTrapNote, true)).
			F(Absent(dTrapHeatingRateKPerS, false)).F(Absent(dTrapTimeToHeatS, false)).F(Absent(dTrapLeaveK, false))
		r.After = append(r.After, "  trap: the combined potential has no minimum near the cloud (with gravity): the beams do not trap the atoms")
	default:
		var freqs []string
		for _, f := range t.Frequencies {
			freqs = append(freqs, units.FormatFrequency(f))
		}
		axes := [][]float64{t.Axes[0][:], t.Axes[1][:], t.Axes[2][:]}
		r.F(NumList(dTrapMinimumOffsetM, t.Minimum[:], lengths(t.Minimum))).
			F(Num(dTrapTrapDepthK, t.Depth/atoms.KB, units.FormatSI(t.Depth/atoms.KB, "K"))).
			F(NumList(dTrapFrequenciesHz, t.Frequencies[:], strings.Join(freqs, ", "))).
			F(NumRows(dTrapAxes, axes, vec(t.Axes[0])+", "+vec(t.Axes[1])+", "+vec(t.Axes[2]))).
			F(Len(dGravitySagM, t.Sag)).
			F(Flag(dHoldsAgainstGravity, t.Holds, yesNo(t.Holds))).
			F(Num(dForceAtCloudG, t.ForceAtCloud, fmtG(t.ForceAtCloud))).
			F(NumList(dEscapeDirection, t.Escape[:], vec(t.Escape))).
			F(Absent(dTrapNote, true)).
			F(Num(dTrapLeaveK, t.Leave/atoms.KB, units.FormatSI(t.Leave/atoms.KB, "K"))).
			F(Num(dTrapHeatingRateKPerS, t.HeatingRate, units.FormatSI(t.HeatingRate, "K/s"))).
			F(Num(dTrapTimeToHeatS, t.HeatTime, units.FormatSI(t.HeatTime, "s")))
		if t.Saddle != nil {
			r.F(NumList(dEscapeSaddleM, t.Saddle[:], lengths(*t.Saddle)))
		} else {
			r.F(Absent(dEscapeSaddleM, false))
		}
		if math.IsNaN(t.Lattice) {
			r.F(Absent(dLatticeFrequencyHz, false))
		} else {
			r.F(Num(dLatticeFrequencyHz, t.Lattice, units.FormatFrequency(t.Lattice)))
		}
		depth := "  depth U/k_B = {trap_depth_k}: the lowest barrier from the minimum along straight lines (along each beam beyond the others, across the beams, along gravity and the principal axes), towards {escape_direction}; no lower saddle found on a bent way out; holds against gravity: {holds_against_gravity}"
		switch {
		case t.Saddle != nil:
			depth = "  depth U/k_B = {trap_depth_k}: the lowest saddle on the way out, at {escape_saddle_m} from the cloud (towards {escape_direction} from the minimum), lower than along any straight line from the minimum; holds against gravity: {holds_against_gravity}"
		case lattice(cr):
			depth = "  depth U/k_B = {trap_depth_k}: the lowest barrier from the minimum along straight lines (along each beam beyond the others, across the beams, along gravity and the principal axes), towards {escape_direction}; a lattice's bent ways out are not searched; holds against gravity: {holds_against_gravity}"
		}
		r.After = append(r.After,
			"  trap minimum {trap_minimum_offset_m} from the cloud (x, y, z); force at the cloud {force_at_cloud_g} g",
			depth,
			"  trap frequencies {trap_frequencies_hz} along the principal axes {trap_axes}; sag under gravity g/ω² = {gravity_sag_m}")
		if !math.IsNaN(t.Lattice) {
			r.After = append(r.After, "  standing wave: lattice spacing λ/2, axial lattice frequency {lattice_frequency_hz} (Grimm et al. 2000)")
		}
		if t.Holds && t.Leave > t.Depth*1.01 {
			r.After = append(r.After, "  the depth above is the barrier out of the trap's basin (into one arm of a crossing); the atoms leave the whole potential, out of every beam, above {trap_leave_k} (along straight lines)")
		}
		if t.Holds {
			r.After = append(r.After, "  recoil heating by the far-detuned light's scattering at the minimum {heating_rate_k_per_s} (T_r Γ_sc/3 for each beam, Grimm et al. 2000): it heats the atoms by the depth in {time_to_heat_by_depth_s}")
		}
	}
	r.F(Num(dGroundLightShiftHz, cr.GroundShift, units.FormatFrequency(cr.GroundShift)))
	switch {
	case cr.Trap == nil:
		r.F(Absent(dDifferentialLightShiftHz, false))
	case math.IsNaN(cr.DifferentialShift):
		r.F(Absent(dDifferentialLightShiftHz, false))
		r.After = append(r.After, "  light shift of the ground state {ground_light_shift_hz} at the trap minimum (at the cloud when there is none); the excited state's shift is not included (give excited_polarizability for every trap laser)")
	default:
		r.F(Num(dDifferentialLightShiftHz, cr.DifferentialShift, units.FormatFrequency(cr.DifferentialShift)))
		r.After = append(r.After, "  light shift of the ground state {ground_light_shift_hz}, of the transition (excited − ground) {differential_light_shift_hz} at the trap minimum, taken off the near-resonant beams' detunings here and at their atoms elements")
	}
	r.F(Plain(dSaturationTotal, cr.SaturationTotal)).F(Num(dCloudResultScatteringRatePerS, cr.ScatteringRate, fmtG(cr.ScatteringRate)+" photons/s"))
	if slices.ContainsFunc(cr.Beams, func(cb *drive.CloudBeam) bool { return cb.Near }) {
		r.After = append(r.After, "  near-resonant beams at the cloud centre: s = {saturation_total} in all, scattering rate {scattering_rate_per_s} ((Γ/2) s_i/(1 + s_total + 4Δ_i²/Γ²) summed)")
	}
	for _, cb := range cr.Beams {
		e := cb.Atoms.Row.Element
		switch {
		case e.Pulse <= 0, cb.Near && cb.Forward != nil: // a standing wave's pulse is its forward pass's
		case math.IsNaN(cb.Photons):
			r.After = append(r.After, fmt.Sprintf("  pulse of %s from path %q (element %d): no trap holds the atoms here, or the beam is not near resonance; its photons are not set against a depth",
				units.FormatSI(e.Pulse, "s"), cb.Atoms.Path.Path.Name, e.Index))
		default:
			r.After = append(r.After, fmt.Sprintf("  pulse of %s from path %q (element %d): %s photons per atom at the centre; from the trap's bottom %s random recoils (2 E_rec each) heat an atom out of the depth, %s pushes along the beam do in a pulse short against the trap period (N² + N recoils); atoms already warm leave sooner",
				units.FormatSI(e.Pulse, "s"), cb.Atoms.Path.Path.Name, e.Index, fmtG(cb.Photons), fmtG(cb.HeatOut), fmtG(cb.PushOut)))
		}
	}
	var goal *Record
	if g := cr.Goal; g != nil {
		goal = &Record{Members: b.members(10)}
		var names []string
		for _, las := range g.Lasers {
			names = append(names, las.Name)
		}
		goal.F(Str(dCloudGoalKind, g.Kind)).F(StrList(dGoalLasers, names))
		if g.Kind == setup.GoalCollective {
			goal.F(Plain(dCloudGoalGoalFactor, g.Factor))
		} else {
			goal.F(Absent(dCloudGoalGoalFactor, true))
		}
		target := fmtG(g.Target)
		switch g.Kind {
		case setup.GoalTrapDepth:
			target = units.FormatSI(g.Target, "K")
		case setup.GoalRabi, setup.GoalCollective:
			target = "Ω/2π = " + units.FormatFrequency(g.Target/(2*math.Pi))
		case setup.GoalSaturation:
			target = "s = " + fmtG(g.Target)
		}
		if g.Upper {
			target = "at most " + target
		}
		goal.F(Num(dTargetSI, g.Target, target)).F(Flag(dCloudGoalUpperBound, g.Upper, yesNo(g.Upper)))
		goal.F(Flag(dMetWithoutScaling, g.WithoutScaling, yesNo(g.WithoutScaling)))
		switch {
		case g.Impossible != "":
			goal.F(Absent(dScaleFactor, false)).F(Absent(dCloudGoalMarginDb, false)).F(Flag(dCloudGoalMet, false, "no")).F(Str(dCloudGoalImpossible, g.Impossible)).
				F(Flag(dCloudGoalBeyondMaximum, false, "no"))
			r.After = append(r.After, "  goal for the whole cloud: {goal.kind} {goal.target_si}: cannot be met: {goal.impossible}")
		case g.WithoutScaling:
			goal.F(Absent(dScaleFactor, false)).F(Absent(dCloudGoalMarginDb, false)).F(Flag(dCloudGoalMet, true, "met")).
				F(Absent(dCloudGoalImpossible, true)).F(Flag(dCloudGoalBeyondMaximum, false, "no"))
			r.After = append(r.After, "  goal for the whole cloud: {goal.kind} {goal.target_si} scaling {goal.lasers}: met without scaling: the other beams reach it with these lasers off (no margin: their power does not decide it)")
		default:
			var needed []string
			for i, las := range g.Lasers {
				needed = append(needed, fmt.Sprintf("%s %s", las.Name, units.FormatPower(g.Needed[i])))
			}
			goal.F(Num(dScaleFactor, g.Scale, fmtG(g.Scale))).
				F(Num(dCloudGoalMarginDb, g.MarginDB, fmt.Sprintf("%+.1f dB", g.MarginDB))).
				F(Flag(dCloudGoalMet, g.Met, map[bool]string{true: "met", false: "NOT met"}[g.Met]+map[bool]string{true: ", beyond a laser's maximum power", false: ""}[g.BeyondMaximum])).
				F(NumList(dNeededW, g.Needed, strings.Join(needed, ", "))).
				F(Absent(dCloudGoalImpossible, true)).
				F(Flag(dCloudGoalBeyondMaximum, g.BeyondMaximum, yesNo(g.BeyondMaximum)))
			if g.Upper {
				r.After = append(r.After, "  goal for the whole cloud: {goal.kind} {goal.target_si} scaling {goal.lasers}: reached at factor {goal.scale_factor} on their operating powers ({goal.needed_w}), the most they may give; margin {goal.margin_db}: {goal.met}")
			} else {
				r.After = append(r.After, "  goal for the whole cloud: {goal.kind} {goal.target_si} scaling {goal.lasers}: factor {goal.scale_factor} on their operating powers ({goal.needed_w}); margin {goal.margin_db}: {goal.met}")
			}
		}
	}
	if goal != nil {
		var tr *Record
		if gt := b.tol[c]; gt != nil {
			tr = toleranceRecord(gt)
			r.After = append(r.After, prefixKeys(tr.Lines, "goal.tolerance.")...)
		}
		goal.O("tolerance", tr, true)
	}
	r.O("goal", goal, true)
	return r
}

// lattice says whether a standing wave's return pass reaches the cloud.
func lattice(cr *drive.CloudResult) bool {
	return slices.ContainsFunc(cr.Beams, func(cb *drive.CloudBeam) bool { return cb.Forward != nil && cb.Far })
}
