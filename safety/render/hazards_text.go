package render

import (
	"fmt"
	"math"

	"beamledger/budget"
	"beamledger/safety"
)

// Cautions are printed under every hazard section, in every output.
var Cautions = []string{
	"These figures support, and never replace, the evaluation of your laser safety officer under local regulations and your institution's procedures.",
	"The limits were transcribed from memory of the standard's tables and have not been checked against its text; confirm every value that matters with the laser safety officer.",
	"Only what the setup file describes is evaluated: beams, surfaces and reflections it leaves out are not.",
	"Align at the lowest power that works, keep beams at table height and below eye level, block stray beams at their source, remove watches and jewellery, and wear the eyewear the laser safety officer specifies (common practice).",
}

func writeHazards(ew *errWriter, a *safety.Assessment) {
	h := a.Hazards
	ew.printf("\nHazards (%s)\n", safety.Standard)
	dur := safety.DurationAssumption(a.Setup)
	ew.printf("  assumptions: intrabeam viewing of a small source (α ≤ 1.5 mrad); each laser at its maximum power; exposure %s;\n", dur)
	ew.printf("    irradiance averaged over the limiting aperture of the eye or skin; reflections evaluated where the beam arrives through an open segment\n")
	for _, d := range h.DefaultsAssumed {
		ew.printf("    default assumed: %s\n", d)
	}
	ew.printf("  Sources\n")
	t := &table{left: 1, lastLeft: true}
	t.add("laser", "λ", "max power", "emission", "class", "eye MPE", "skin MPE", "duration", "eye aperture")
	for _, ll := range h.Lasers {
		cl := ll.Class
		if cl == "" {
			cl = "not assessed"
		}
		t.add(ll.Laser.Name, fmtNMs(ll.Laser.Wavelength), budget.FormatPower(ll.Laser.Power), ll.Laser.Emission, cl,
			budget.FormatIrradiance(ll.EyeIrradiance), budget.FormatIrradiance(ll.SkinIrradiance), budget.FormatSI(ll.Duration, "s"), budget.FormatLength(ll.EyeAperture))
	}
	t.write(ew, "    ")
	for _, ll := range h.Lasers {
		ew.printf("    %s: eye limit %s (%s); class %s\n", ll.Laser.Name, ll.EyeRule, ll.Eye.Effect, ll.ClassNote)
		if ll.Class != "" {
			ew.printf("      class %s: %s\n", ll.Class, classMeaning(ll.Class))
		}
	}
	ew.printf("  Open segments (worst point; ratio = aperture-averaged irradiance ÷ MPE)\n")
	if len(h.Exposures) == 0 {
		ew.printf("    no open segment carries light\n")
	} else {
		t = &table{left: 1, lastLeft: true}
		t.add("segment", "power", "eye irr.", "eye ratio", "OD", "skin ratio", "worst at", "NOHD beyond the end (beam propagated)")
		for _, e := range h.Exposures {
			nohd := ""
			if e.OpenEnd {
				nohd = safety.FormatDistance(e.NOHD)
			}
			t.add(segLabel(e), budget.FormatPower(e.Power), budget.FormatIrradiance(e.Irradiance), fmtRatio(e.Ratio), fmtG(e.OD), fmtRatio(e.SkinRatio),
				budget.FormatLength(e.At), nohd)
		}
		t.write(ew, "    ")
	}
	var stray, escaping, diffuse []*safety.Reflection
	for _, r := range h.Reflections {
		switch r.Kind {
		case safety.ReflectionStray:
			stray = append(stray, r)
		case safety.ReflectionEscaping:
			escaping = append(escaping, r)
		default:
			diffuse = append(diffuse, r)
		}
	}
	ew.printf("  Stray reflections above the eye MPE (at the reflecting surface)\n")
	if len(stray) == 0 {
		ew.printf("    none of the surfaces reached through open segments reflects above the MPE\n")
	}
	for _, r := range stray {
		ew.printf("    path %q, element %d (%s): %d surface(s), R = %g%s, %s each, %s × the eye MPE, OD %g\n",
			r.Path.Path.Name, r.Element.Index, r.Element.Label(), r.Surfaces, r.Reflectance, assumed(r.Assumed),
			budget.FormatPower(r.Power), fmtRatio(r.Ratio), r.OD)
	}
	ew.printf("  Beams leaving the path above the eye MPE (mirror leakage, AOM orders other than the one used)\n")
	if len(escaping) == 0 {
		ew.printf("    none\n")
	}
	for _, r := range escaping {
		ew.printf("    path %q, element %d (%s): %s (%s of the arriving power), %s × the eye MPE, OD %g\n",
			r.Path.Path.Name, r.Element.Index, r.Element.Label(), budget.FormatPower(r.Power), fmtPct(r.Reflectance), fmtRatio(r.Ratio), r.OD)
	}
	ew.printf("  Diffuse reflections (nominal hazard zone r = √(ρP/(π MPE)) of a Lambertian reflector, viewed along its normal, small-source MPE: conservative)\n")
	if len(diffuse) == 0 {
		ew.printf("    no dump or path end is reached through an open segment\n")
	}
	for _, r := range diffuse {
		where := "the open end"
		if r.Element != nil && r.Element.Type == budget.TypeDump {
			where = fmt.Sprintf("element %d (%s)", r.Element.Index, r.Element.Label())
		}
		ew.printf("    path %q, %s: %s, ρ = %g%s: hazard zone radius %s\n", r.Path.Path.Name, where, budget.FormatPower(r.Power), r.Reflectance, assumed(r.Assumed), safety.FormatDistance(r.Radius))
	}
	ew.printf("  Eyewear (OD rounded up; EN 207 scale number for continuous emission, 315–1400 nm)\n")
	if len(h.Eyewear) == 0 {
		ew.printf("    no open exposure to evaluate\n")
	}
	for _, n := range h.Eyewear {
		ew.printf("    %s: OD %g, %s; %s\n", fmtNMs(n.Wavelength), n.OD, n.EN207Label(), n.Coverage())
	}
	ew.printf("  Cautions\n")
	for _, c := range Cautions {
		ew.printf("    - %s\n", c)
	}
}

// classMeaning says in general words what a class asks for; the laser safety
// officer decides the controls.
func classMeaning(c string) string {
	switch c {
	case "1":
		return "as emitted, not expected to exceed the MPE under reasonably foreseeable conditions (the class's definition); the beam paths it feeds may still need controls"
	case "2":
		return "visible, low power; protection relies on the aversion response, do not stare into the beam"
	case "3R":
		return "direct viewing is hazardous though the risk is low; avoid direct eye exposure"
	case "3B":
		return "direct viewing and specular reflections are hazardous; controls and eyewear as the laser safety officer specifies"
	case "4":
		return "direct, specular and diffuse reflections can harm eyes and skin, and the beam can start fires; full controls as the laser safety officer specifies"
	}
	return ""
}

func assumed(a bool) string {
	if a {
		return " (assumed)"
	}
	return ""
}

func fmtRatio(r float64) string {
	if r < 1e-3 {
		return "<0.001"
	}
	return budget.FormatNumber(r)
}

func fmtNMs(λ float64) string { return budget.FormatNumber(λ*1e9) + " nm" }

func segLabel(e *safety.Exposure) string {
	s := e.Segment
	name := e.Path.Path.Name
	switch {
	case math.IsInf(s.To, 1):
		return fmt.Sprintf("%s: after %d (open end)", name, s.After)
	case s.After == 0:
		return fmt.Sprintf("%s: start → 1", name)
	}
	return fmt.Sprintf("%s: %d → %d", name, s.After, s.After+1)
}
