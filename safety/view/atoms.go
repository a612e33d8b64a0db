package view

import (
	"fmt"
	"math"
	"strings"

	"beamledger/budget"
	"beamledger/safety"
)

func atomsList(a *safety.Assessment) *List {
	l := &List{Key: "atoms"}
	for _, at := range a.Atoms {
		l.Records = append(l.Records, atomsRecord(at))
	}
	return l
}

func num(key, label string, v float64, source string) Field { return Plain(key, label, v, source) }

func hzField(key, label string, ω float64, source string) Field {
	return Num(key, label, ω/(2*math.Pi), hz(ω), source)
}

func atomsRecord(a *budget.AtomsResult) Record {
	e := a.Row.Element
	tr := a.Transition
	las := a.Path.Laser
	wx, wy := a.Row.BeamIn.Radii()
	r := Record{Members: make([]Member, 0, 40)}
	r.F(Str("path", "path", a.Path.Path.Name, "Path.Name")).F(Whole("element", "element", e.Index, "Element.Index")).
		F(Str("cloud", "cloud", a.Cloud.Name, "Cloud.Name")).F(Str("transition", "transition", tr.Name, "Transition.Name")).
		F(Len("at_m", "at", e.At, "Element.At")).
		F(Pow("power_w", "power", a.Power, "AtomsResult.Power")).
		F(Len("radius_x_m", "Wx", wx, "Row.BeamIn")).F(Len("radius_y_m", "Wy", wy, "Row.BeamIn")).
		F(Irr("peak_irradiance_w_m2", "peak irradiance", a.PeakIrradiance, "AtomsResult.PeakIrradiance")).
		F(Num("irradiance_at_rms_x_relative", "I at ±1 rms (x)", a.EdgeRelative[0], fmt.Sprintf("%.1f %%", 100*a.EdgeRelative[0]), "AtomsResult.EdgeRelative")).
		F(Num("irradiance_at_rms_y_relative", "I at ±1 rms (y)", a.EdgeRelative[1], fmt.Sprintf("%.1f %%", 100*a.EdgeRelative[1]), "AtomsResult.EdgeRelative"))
	r.F(NumRows("radius_at_cloud_ends_m", "W at ±1 rms along the beam", [][]float64{a.EndRadii[0][:], a.EndRadii[1][:]},
		fmt.Sprintf("%s × %s and %s × %s", budget.FormatLength(a.EndRadii[0][0]), budget.FormatLength(a.EndRadii[0][1]), budget.FormatLength(a.EndRadii[1][0]), budget.FormatLength(a.EndRadii[1][1])),
		"AtomsResult.EndRadii"))
	r.F(Field{Key: "focus_x", Kind: Number, SI: a.FocusOffset[0], Text: budget.FormatLength(a.FocusOffset[0]), People: true, Source: "AtomsResult.FocusOffset"}).
		F(Field{Key: "focus_y", Kind: Number, SI: a.FocusOffset[1], Text: budget.FormatLength(a.FocusOffset[1]), People: true, Source: "AtomsResult.FocusOffset"})
	r.F(hzField("detuning_hz", "detuning Δ/2π", a.Detuning, "AtomsResult.Detuning")).
		F(Str("detuning_source", "detuning from", a.DetuningSource, "AtomsResult.DetuningSource")).
		F(Irr("saturation_intensity_w_m2", "I_sat", a.Isat, "AtomsResult.Isat")).
		F(Str("saturation_intensity_kind", "I_sat kind", a.IsatNote, "AtomsResult.IsatNote")).
		F(num("saturation", "s = I/I_sat", a.Saturation, "AtomsResult.Saturation")).
		F(hzField("rabi_frequency_hz", "Ω/2π", a.Rabi, "AtomsResult.Rabi")).
		F(num("scattering_rate_per_s", "scattering rate", a.ScatteringRate, "AtomsResult.ScatteringRate")).
		F(num("cross_section_m2", "σ0", a.CrossSection, "AtomsResult.CrossSection")).
		F(num("optical_depth", "b0", a.OpticalDepth, "AtomsResult.OpticalDepth")).
		F(Flag("far_detuned", "far detuned", a.FarDetuned, yesNo(a.FarDetuned), "AtomsResult.FarDetuned"))
	if a.NearLine != "" {
		r.F(Str("near_line", "nearby line", a.NearLine, "AtomsResult.NearLine")).F(hzField("near_line_detuning_hz", "detuning from it", a.NearLineDetuning, "AtomsResult.NearLineDetuning"))
	}
	// the dipole trap
	d := a.Dipole
	if d != nil {
		depth := math.Max(0, -d.Depth/kB) // a repulsive beam makes no trap
		r.F(Num("dipole_potential_k", "U/k_B", d.Depth/kB, budget.FormatSI(d.Depth/kB, "K"), "DipoleResult.Depth")).
			F(Num("dipole_potential_hz", "U/h", d.Depth/hPlanck, budget.FormatFrequency(d.Depth/hPlanck), "DipoleResult.Depth")).
			F(Num("trap_depth_k", "trap depth", depth, budget.FormatSI(depth, "K"), "DipoleResult.Depth")).
			F(hzField("trap_frequency_radial_hz", "radial trap frequency", math.Sqrt(d.TrapX*d.TrapY), "DipoleResult.TrapX")).
			F(hzField("trap_frequency_x_hz", "trap frequency x", d.TrapX, "DipoleResult.TrapX")).
			F(hzField("trap_frequency_y_hz", "trap frequency y", d.TrapY, "DipoleResult.TrapY")).
			F(hzField("trap_frequency_axial_hz", "axial trap frequency", d.TrapAxial, "DipoleResult.TrapAxial")).
			F(Field{Key: "rwa_ratio", Kind: Number, SI: d.RWARatio, Text: fmt.Sprintf("%.3f", d.RWARatio), People: true, Source: "DipoleResult.RWARatio"})
	} else {
		for _, k := range []string{"dipole_potential_k", "dipole_potential_hz", "trap_depth_k", "trap_frequency_radial_hz", "trap_frequency_x_hz", "trap_frequency_y_hz", "trap_frequency_axial_hz"} {
			r.F(Absent(k, k, false, ""))
		}
	}
	var goal *Record
	if g := a.Goal; g != nil {
		goal = goalRecord(a, g)
	}
	r.O("goal", goal, false)

	r.Line(fmt.Sprintf("path %q, element %d: cloud %q (%s, %s atoms), at {at_m}; laser %q at its operating power %s",
		a.Path.Path.Name, e.Index, a.Cloud.Name, tr.Name, fmtG(a.Cloud.Atoms), las.Name, budget.FormatPower(las.OperatingPower)))
	r.Line("  beam: Wx {radius_x_m}, Wy {radius_y_m}; waist {focus_x} (x), {focus_y} (y) from the cloud (+ downstream)")
	r.Line("  power {power_w}, peak irradiance {peak_irradiance_w_m2}")
	r.Line(fmt.Sprintf("  across the cloud: I at ±1 rms is {irradiance_at_rms_x_relative} (x), {irradiance_at_rms_y_relative} (y) of the centre; W at ±1 rms along the beam (%s): {radius_at_cloud_ends_m}", budget.FormatLength(a.Cloud.RMSSize[2])))
	r.Line("  detuning Δ/2π = {detuning_hz} ({detuning_source})")
	r.Line("  I_sat = {saturation_intensity_w_m2} ({saturation_intensity_kind})")
	switch {
	case a.NearLine != "":
		r.Line(fmt.Sprintf("  the light is {near_line_detuning_hz} from the line {near_line}, within %d of its linewidths: neither the far-detuned dipole formula nor the two-level figures of %s apply; not evaluated",
			budget.FarDetuningFactor, tr.Name))
	case a.FarDetuned:
		r.Line(fmt.Sprintf("  far detuned (|Δ| > %d Γ): dipole potential from the lines %s with counter-rotating terms (Grimm et al. 2000)", budget.FarDetuningFactor, strings.Join(tr.LineNames(), ", ")))
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
		}
		r.Line(fmt.Sprintf("  for reference: s = I/I_sat = {saturation}, Ω/2π = {rabi_frequency_hz} on %s", tr.Name))
	default:
		r.Line("  s = I/I_sat = {saturation}, Ω/2π = {rabi_frequency_hz}, scattering rate {scattering_rate_per_s} photons/s (two-level)")
	}
	r.Line("  resonant optical depth along the beam b0 = σ0 N/(2π σx σy) = {optical_depth} (σ0 = {cross_section_m2} m²)")
	if goal != nil {
		for _, l := range goal.Lines {
			r.Line(prefixKeys([]string{l}, "goal.")[0])
		}
	}
	return r
}

func goalRecord(a *budget.AtomsResult, g *budget.GoalResult) *Record {
	r := &Record{}
	r.F(Str("kind", "goal", g.Kind, "GoalResult.Kind"))
	switch g.Kind {
	case budget.GoalRabi, budget.GoalCollective:
		r.F(Num("target_si", "target", g.Target, hz(g.Target), "GoalResult.Target")) // Ω in rad/s
	case budget.GoalTrapDepth:
		r.F(Num("target_si", "target", g.Target, budget.FormatSI(g.Target, "K"), "GoalResult.Target"))
	default:
		r.F(num("target_si", "target", g.Target, "GoalResult.Target"))
	}
	if g.Impossible == "" {
		r.F(Irr("irradiance_needed_w_m2", "needed at the cloud centre", g.Intensity, "GoalResult.Intensity")).
			F(Pow("power_at_atoms_w", "needed at the atoms", g.PowerAtAtoms, "GoalResult.PowerAtAtoms")).
			F(Pow("source_power_w", "needed at the laser", g.SourcePower, "GoalResult.SourcePower"))
	} else {
		r.F(Absent("irradiance_needed_w_m2", "needed at the cloud centre", false, "GoalResult.Intensity")).
			F(Absent("power_at_atoms_w", "needed at the atoms", false, "GoalResult.PowerAtAtoms")).
			F(Absent("source_power_w", "needed at the laser", false, "GoalResult.SourcePower"))
	}
	r.F(Pow("available_source_power_w", "operating power", g.Available, "GoalResult.Available"))
	if g.Impossible == "" {
		r.F(Num("margin_db", "margin", g.MarginDB, fmt.Sprintf("%+.1f dB", g.MarginDB), "GoalResult.MarginDB"))
	} else {
		r.F(Absent("margin_db", "margin", false, "GoalResult.MarginDB"))
	}
	verdict := "met"
	if !g.Met {
		verdict = "NOT met"
	}
	r.F(Flag("met", "met", g.Met, verdict, "GoalResult.Met"))
	r.F(Field{Key: "impossible", Label: "cannot be met", Kind: String, Text: g.Impossible, OmitEmpty: true, Source: "GoalResult.Impossible"})
	switch g.Kind {
	case budget.GoalSaturation:
		r.Line("  goal: saturation s = {target_si}")
	case budget.GoalRabi:
		r.Line("  goal: Rabi frequency Ω/2π = {target_si}")
	case budget.GoalTrapDepth:
		r.Line("  goal: trap depth U/k_B = {target_si}")
	case budget.GoalCollective:
		c := g.Collective
		r.F(num("goal_factor", "goal factor", g.Factor, "GoalResult.Factor")).
			F(hzField("threshold_rabi_frequency_hz", "threshold Ω_c/2π", c.OmegaC, "Collective.OmegaC")).
			F(hzField("threshold_rabi_frequency_low_hz", "lower threshold Ω_c/2π", c.OmegaCLow, "Collective.OmegaCLow")).
			F(num("threshold_saturation", "s_c", c.SatC, "Collective.SatC")).
			F(num("photon_budget_saturation", "photon-budget scale", c.PhotonBudgetSat, "Collective.PhotonBudgetSat")).
			F(Flag("bistable", "bistable", c.Bistable, yesNo(c.Bistable), "Collective.Bistable")).
			F(Flag("collective_rate_given", "collective rate stated", c.FromRate, yesNo(c.FromRate), "Collective.FromRate")).
			F(Field{Key: "d", Kind: Number, SI: c.D, Text: fmtG(c.D), People: true, Source: "Collective.D"})
		r.Line("  goal: collective drive at {goal_factor} × the threshold of cooperative resonance fluorescence")
		if c.FromRate {
			r.Line(fmt.Sprintf("    threshold Ω_c/2π = {threshold_rabi_frequency_hz} from the stated collective rate N Γ_c/2π = %s (Ω_c = N Γ_c / 2)", budget.FormatFrequency(a.Cloud.CollectiveRate)))
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
	if g.Impossible != "" {
		r.Line("    cannot be met: {impossible}")
	} else {
		r.Line(fmt.Sprintf("    needs {irradiance_needed_w_m2} at the cloud centre → {power_at_atoms_w} at the atoms → {source_power_w} at laser %q; operating power {available_source_power_w}; margin {margin_db}: {met}", a.Path.Laser.Name))
	}
	return r
}
