package render

import (
	"math"

	"beamledger/budget"
)

func hz(ω float64) string { return budget.FormatFrequency(ω / (2 * math.Pi)) }

func writeAtoms(ew *errWriter, a *budget.AtomsResult) {
	e := a.Row.Element
	tr := a.Transition
	las := a.Path.Laser
	ew.printf("  path %q, element %d: cloud %q (%s, %s atoms), at %s; laser %q at its operating power %s\n",
		a.Path.Path.Name, e.Index, a.Cloud.Name, tr.Name, fmtG(a.Cloud.Atoms), budget.FormatLength(e.At), las.Name, budget.FormatPower(las.OperatingPower))
	wx, wy := a.Row.BeamIn.Radii()
	ew.printf("    beam: Wx %s, Wy %s; waist %s (x), %s (y) from the cloud (+ downstream)\n",
		budget.FormatLength(wx), budget.FormatLength(wy), budget.FormatLength(a.FocusOffset[0]), budget.FormatLength(a.FocusOffset[1]))
	ew.printf("    power %s, peak irradiance %s\n", budget.FormatPower(a.Power), budget.FormatIrradiance(a.PeakIrradiance))
	ew.printf("    across the cloud: I at ±1 rms is %.1f %% (x), %.1f %% (y) of the centre; W at ±1 rms along the beam (%s): %s × %s and %s × %s\n",
		100*a.EdgeRelative[0], 100*a.EdgeRelative[1], budget.FormatLength(a.Cloud.RMSSize[2]),
		budget.FormatLength(a.EndRadii[0][0]), budget.FormatLength(a.EndRadii[0][1]), budget.FormatLength(a.EndRadii[1][0]), budget.FormatLength(a.EndRadii[1][1]))
	ew.printf("    detuning Δ/2π = %s (%s)\n", hz(a.Detuning), a.DetuningSource)
	ew.printf("    I_sat = %s (%s)\n", budget.FormatIrradiance(a.Isat), a.IsatNote)
	switch {
	case a.NearLine != "":
		ew.printf("    the light is %s from the line %s, within %d of its linewidths: neither the far-detuned dipole formula nor the two-level figures of %s apply; not evaluated\n",
			hz(a.NearLineDetuning), a.NearLine, budget.FarDetuningFactor, tr.Name)
	case a.FarDetuned:
		d := a.Dipole
		ew.printf("    far detuned (|Δ| > %d Γ): dipole potential from the lines %s with counter-rotating terms (Grimm et al. 2000)\n",
			budget.FarDetuningFactor, lineNames(tr))
		kind := "attractive: a trap this deep"
		if d.PerIntensity >= 0 {
			kind = "repulsive: blue detuned, no trap"
		}
		ew.printf("    dipole potential at the cloud centre U/k_B = %s, U/h = %s (%s; %.3f × the rotating-wave value); scattering rate %s photons/s\n",
			budget.FormatSI(d.Depth/kB, "K"), hz(2*math.Pi*d.Depth/hPlanck), kind, d.RWARatio, fmtG(a.ScatteringRate))
		if !math.IsNaN(d.TrapX) {
			ax := "none (the cloud is not at an intensity maximum along the beam)"
			if !math.IsNaN(d.TrapAxial) {
				ax = hz(d.TrapAxial)
			}
			ew.printf("    trap frequencies (harmonic, this beam alone): x %s, y %s, axial %s\n", hz(d.TrapX), hz(d.TrapY), ax)
		}
		ew.printf("    for reference: s = I/I_sat = %s, Ω/2π = %s on %s\n", fmtG(a.Saturation), hz(a.Rabi), tr.Name)
	default:
		ew.printf("    s = I/I_sat = %s, Ω/2π = %s, scattering rate %s photons/s (two-level)\n", fmtG(a.Saturation), hz(a.Rabi), fmtG(a.ScatteringRate))
	}
	ew.printf("    resonant optical depth along the beam b0 = σ0 N/(2π σx σy) = %s (σ0 = %s m²)\n", fmtG(a.OpticalDepth), fmtG(a.CrossSection))
	if g := a.Goal; g != nil {
		writeGoal(ew, a, g)
	}
}

func writeGoal(ew *errWriter, a *budget.AtomsResult, g *budget.GoalResult) {
	switch g.Kind {
	case budget.GoalSaturation:
		ew.printf("    goal: saturation s = %s\n", fmtG(g.Target))
	case budget.GoalRabi:
		ew.printf("    goal: Rabi frequency Ω/2π = %s\n", hz(g.Target))
	case budget.GoalTrapDepth:
		ew.printf("    goal: trap depth U/k_B = %s\n", budget.FormatSI(g.Target, "K"))
	case budget.GoalCollective:
		c := g.Collective
		ew.printf("    goal: collective drive at %s × the threshold of cooperative resonance fluorescence\n", fmtG(g.Factor))
		if c.FromRate {
			ew.printf("      threshold Ω_c/2π = %s from the stated collective rate N Γ_c/2π = %s (Ω_c = N Γ_c / 2)\n", hz(c.OmegaC), budget.FormatFrequency(a.Cloud.CollectiveRate))
		} else {
			ew.printf("      threshold Ω_c/2π = %s (D = b0 = %s, used for the margin) to %s (D = b0/2); s_c = D²/32 = %s\n",
				hz(c.OmegaC), fmtG(c.D), hz(c.OmegaCLow), fmtG(c.SatC))
		}
		regime := "smooth crossover (D ≤ 32)"
		if c.Bistable {
			regime = "bistable once single-atom decay is included (D > 32)"
		}
		ew.printf("      photon-budget scale s = D = %s; regime: %s\n", fmtG(c.PhotonBudgetSat), regime)
		ew.printf("      model: driven Dicke model with one collective decay channel, N Γ_c = D Γ / 4 (a planning estimate, uncertain by a factor of about 2)\n")
	}
	if g.Impossible != "" {
		ew.printf("      cannot be met: %s\n", g.Impossible)
		return
	}
	verdict := "met"
	if !g.Met {
		verdict = "NOT met"
	}
	ew.printf("      needs %s at the cloud centre → %s at the atoms → %s at laser %q; operating power %s; margin %+.1f dB: %s\n",
		budget.FormatIrradiance(g.Intensity), budget.FormatPower(g.PowerAtAtoms), budget.FormatPower(g.SourcePower),
		a.Path.Laser.Name, budget.FormatPower(g.Available), g.MarginDB, verdict)
}

func lineNames(tr interface{ LineNames() []string }) string {
	out := ""
	for i, n := range tr.LineNames() {
		if i > 0 {
			out += ", "
		}
		out += n
	}
	return out
}

func fmtG(v float64) string { return budget.FormatNumber(v) }
