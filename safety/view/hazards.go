package view

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

// Assumptions lists what the hazard figures assume, for every output.
func Assumptions(s *budget.Setup) []string {
	return []string{
		"intrabeam viewing of a small source (angular subtense at most 1.5 mrad)",
		"each laser at its maximum power",
		"exposure duration (duration_s of each source): " + safety.DurationAssumption(s),
		"irradiance averaged over the limiting aperture of the eye or skin",
		"reflections evaluated where the beam arrives through an open segment",
	}
}

type hazardView struct {
	json                                    *Record // the members the JSON document takes at its top level
	section                                 Section
	lasers, exposures, reflections, eyewear *List
	stray, escaping, diffuse                *List // the reflections by kind, for people
}

func hazards(a *safety.Assessment) hazardView {
	h := a.Hazards
	v := hazardView{json: &Record{}}
	v.json.F(Str("standard", "standard", safety.Standard, "")).
		F(StrList("assumptions", "assumptions", Assumptions(a.Setup), "")).
		F(StrList("cautions", "cautions", Cautions, ""))
	v.lasers = &List{Key: "lasers", Heading: "Sources", Columns: []string{"name", "wavelength_m", "power_w", "emission", "class_text", "eye_mpe_irradiance_w_m2", "skin_mpe_irradiance_w_m2", "duration_s", "eye_aperture_diameter_m"}}
	for _, ll := range h.Lasers {
		v.lasers.Records = append(v.lasers.Records, laserRecord(ll))
	}
	v.exposures = &List{Key: "exposures", Heading: "Open segments (worst point; ratio = aperture-averaged irradiance ÷ MPE)", Empty: "no open segment carries light",
		Columns: []string{"segment", "power_w", "aperture_irradiance_w_m2", "ratio", "od_required", "skin_ratio", "worst_at_m", "nohd"}}
	for _, e := range h.Exposures {
		v.exposures.Records = append(v.exposures.Records, exposureRecord(e))
	}
	v.reflections = &List{Key: "reflections"}
	v.stray = &List{Heading: "Stray reflections above the eye MPE (at the reflecting surface)", Empty: "none of the surfaces reached through open segments reflects above the MPE"}
	v.escaping = &List{Heading: "Beams leaving the path above the eye MPE (mirror leakage, AOM orders other than the one used)", Empty: "none"}
	v.diffuse = &List{Heading: "Diffuse reflections (nominal hazard zone r = √(ρP/(π MPE)) of a Lambertian reflector, viewed along its normal, small-source MPE: conservative)", Empty: "no dump or path end is reached through an open segment"}
	for _, r := range h.Reflections {
		rec := reflectionRecord(r)
		v.reflections.Records = append(v.reflections.Records, rec)
		switch r.Kind {
		case safety.ReflectionStray:
			v.stray.Records = append(v.stray.Records, rec)
		case safety.ReflectionEscaping:
			v.escaping.Records = append(v.escaping.Records, rec)
		default:
			v.diffuse.Records = append(v.diffuse.Records, rec)
		}
	}
	v.eyewear = &List{Key: "eyewear", Heading: "Eyewear (OD rounded up; EN 207 scale number for continuous emission, 315–1400 nm)", Empty: "no open exposure to evaluate"}
	for _, n := range h.Eyewear {
		v.eyewear.Records = append(v.eyewear.Records, eyewearRecord(n))
	}
	v.json.L(v.lasers).L(v.exposures).L(v.reflections).L(v.eyewear).
		F(StrList("defaults_assumed", "defaults assumed", h.DefaultsAssumed, "Hazards.DefaultsAssumed"))

	blocks := []Block{{Indent: 1, Line: "assumptions:"}}
	for _, as := range Assumptions(a.Setup) {
		blocks = append(blocks, Block{Indent: 2, Line: "- " + as})
	}
	for _, d := range h.DefaultsAssumed {
		blocks = append(blocks, Block{Indent: 2, Line: "- default assumed: " + d})
	}
	blocks = append(blocks, Block{Indent: 1, List: v.lasers}, Block{Indent: 1, List: v.exposures},
		Block{Indent: 1, List: v.stray}, Block{Indent: 1, List: v.escaping}, Block{Indent: 1, List: v.diffuse},
		Block{Indent: 1, List: v.eyewear}, Block{Indent: 1, Line: "Cautions"}, Block{Indent: 2, Bullets: Cautions})
	v.section = Section{Heading: fmt.Sprintf("Hazards (%s)", safety.Standard), Blocks: blocks}
	return v
}

func laserRecord(ll *safety.LaserLimits) Record {
	las := ll.Laser
	r := Record{Members: make([]Member, 0, 20)}
	cl := ll.Class
	if cl == "" {
		cl = "not assessed"
	}
	r.F(Str("name", "laser", las.Name, "Laser.Name")).
		F(Nm("wavelength_m", "λ", las.Wavelength, "Laser.Wavelength")).
		F(Pow("power_w", "max power", las.Power, "Laser.Power")).
		F(Str("emission", "emission", las.Emission, "Laser.Emission"))
	if ll.Class != "" {
		r.F(Str("class", "class", ll.Class, "LaserLimits.Class"))
	} else {
		r.F(Absent("class", "class", false, "LaserLimits.Class"))
	}
	r.F(Field{Key: "class_text", Label: "class", Kind: String, Text: cl, People: true}).
		F(Str("class_note", "class basis", ll.ClassNote, "LaserLimits.ClassNote")).
		F(Sec("duration_s", "duration", ll.Duration, "LaserLimits.Duration")).
		F(Irr("eye_mpe_irradiance_w_m2", "eye MPE", ll.EyeIrradiance, "LaserLimits.EyeIrradiance")).
		F(Str("eye_mpe_rule", "eye limit", ll.EyeRule, "LaserLimits.EyeRule")).
		F(Str("eye_mpe_effect", "effect", ll.Eye.Effect, "LaserLimits.Eye")).
		F(Irr("skin_mpe_irradiance_w_m2", "skin MPE", ll.SkinIrradiance, "LaserLimits.SkinIrradiance")).
		F(Len("eye_aperture_diameter_m", "eye aperture", ll.EyeAperture, "LaserLimits.EyeAperture")).
		F(Len("skin_aperture_diameter_m", "skin aperture", ll.SkinAperture, "LaserLimits.SkinAperture")).
		F(Pow("ael_class_1_w", "Class 1", ll.AEL.Class1, "LaserLimits.AEL")).
		F(orNone(Pow("ael_class_2_w", "Class 2", ll.AEL.Class2, "LaserLimits.AEL"))).
		F(orNone(Pow("ael_class_3r_w", "Class 3R", ll.AEL.Class3R, "LaserLimits.AEL"))).
		F(Pow("ael_class_3b_w", "Class 3B", ll.AEL.Class3B, "LaserLimits.AEL"))
	r.Line(las.Name + ": eye limit {eye_mpe_rule} ({eye_mpe_effect}); class {class_note}")
	r.Line("  continuous-emission AELs: Class 1 {ael_class_1_w}, Class 2 {ael_class_2_w}, Class 3R {ael_class_3r_w}, Class 3B {ael_class_3b_w}; skin aperture {skin_aperture_diameter_m}")
	if ll.Class != "" {
		r.F(Field{Key: "class_meaning", Kind: String, Text: classMeaning(ll.Class), People: true})
		r.Line("  class {class}: {class_meaning}")
	}
	return r
}

// orNone writes an absent class limit as the tables do: none at this
// wavelength.
func orNone(f Field) Field {
	if math.IsNaN(f.SI) {
		f.Text = "none at this wavelength"
	}
	return f
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

func exposureRecord(e *safety.Exposure) Record {
	r := Record{Members: make([]Member, 0, 20)}
	s := e.Segment
	r.F(Str("path", "path", e.Path.Path.Name, "Path.Name")).
		F(Whole("after_element", "after element", s.After, "Segment.After")).
		F(Len("from_m", "from", s.From, "Segment.From")).
		F(Len("to_m", "to", s.To, "Segment.To")).
		F(Len("worst_at_m", "worst at", e.At, "Exposure.At")).
		F(Nm("wavelength_m", "λ", e.Path.Laser.Wavelength, "Laser.Wavelength")).
		F(Sec("duration_s", "duration", e.Laser.Duration, "LaserLimits.Duration")).
		F(Pow("power_w", "power", e.Power, "Exposure.Power")).
		F(Irr("aperture_irradiance_w_m2", "eye irr.", e.Irradiance, "Exposure.Irradiance")).
		F(Irr("mpe_irradiance_w_m2", "eye MPE", e.Laser.EyeIrradiance, "LaserLimits.EyeIrradiance")).
		F(Ratio("ratio", "eye ratio", e.Ratio, "Exposure.Ratio")).
		F(Plain("od_required", "OD", e.OD, "Exposure.OD")).
		F(Irr("skin_aperture_irradiance_w_m2", "skin irr.", e.SkinIrr, "Exposure.SkinIrr")).
		F(Ratio("skin_ratio", "skin ratio", e.SkinRatio, "Exposure.SkinRatio")).
		F(Flag("open_end", "open end", e.OpenEnd, yesNo(e.OpenEnd), "Exposure.OpenEnd"))
	nohd := ""
	switch {
	case !e.OpenEnd:
		r.F(Absent("nohd_m", "NOHD", false, "Exposure.NOHD"))
	case math.IsInf(e.NOHD, 1):
		r.F(Absent("nohd_m", "NOHD", false, "Exposure.NOHD"))
		r.F(Len("nohd_beyond_m", "NOHD beyond", safety.MaxHazardDistance, "Exposure.NOHD"))
		nohd = safety.FormatDistance(e.NOHD)
	default:
		r.F(Num("nohd_m", "NOHD", e.NOHD, safety.FormatDistance(e.NOHD), "Exposure.NOHD"))
		nohd = safety.FormatDistance(e.NOHD)
	}
	r.F(Field{Key: "segment", Label: "segment", Kind: String, Text: segLabel(e), People: true}).
		F(Field{Key: "nohd", Label: "NOHD beyond the end (beam propagated)", Kind: String, Text: nohd, People: true})
	return r
}

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

func reflectionRecord(rf *safety.Reflection) Record {
	r := Record{Members: make([]Member, 0, 14)}
	r.F(Str("path", "path", rf.Path.Path.Name, "Path.Name"))
	if rf.Element != nil {
		r.F(Whole("element", "element", rf.Element.Index, "Reflection.Element"))
	} else {
		r.F(Absent("element", "element", false, "Reflection.Element"))
	}
	r.F(Str("kind", "kind", string(rf.Kind), "Reflection.Kind")).
		F(Nm("wavelength_m", "λ", rf.Path.Laser.Wavelength, "Laser.Wavelength")).
		F(Num("reflectance", "reflectance", rf.Reflectance, fmt.Sprintf("%g", rf.Reflectance), "Reflection.Reflectance")).
		F(Flag("reflectance_assumed", "assumed", rf.Assumed, assumed(rf.Assumed), "Reflection.Assumed")).
		F(Whole("surfaces", "surfaces", rf.Surfaces, "Reflection.Surfaces")).
		F(Pow("power_w", "power", rf.Power, "Reflection.Power"))
	if rf.Kind != safety.ReflectionDiffuse {
		r.F(Irr("aperture_irradiance_w_m2", "eye irr.", rf.Irradiance, "Reflection.Irradiance")).
			F(Ratio("ratio", "× MPE", rf.Ratio, "Reflection.Ratio")).
			F(Plain("od_required", "OD", rf.OD, "Reflection.OD")).
			F(Absent("hazard_radius_m", "hazard zone radius", false, "Reflection.Radius"))
	} else {
		r.F(Absent("aperture_irradiance_w_m2", "eye irr.", false, "Reflection.Irradiance")).
			F(Absent("ratio", "× MPE", false, "Reflection.Ratio")).
			F(Absent("od_required", "OD", false, "Reflection.OD")).
			F(Num("hazard_radius_m", "hazard zone radius", rf.Radius, safety.FormatDistance(rf.Radius), "Reflection.Radius"))
	}
	// A diffuse zone sits at a dump, or where an open end's beam lands.
	el := "the open end"
	if rf.Element != nil && (rf.Kind != safety.ReflectionDiffuse || rf.Element.Type == budget.TypeDump) {
		el = fmt.Sprintf("element %d (%s)", rf.Element.Index, rf.Element.Label())
	}
	r.F(Field{Key: "where", Kind: String, Text: fmt.Sprintf("path %q, %s", rf.Path.Path.Name, el), People: true})
	switch rf.Kind {
	case safety.ReflectionStray:
		r.Line("{where}: {surfaces} surface(s), R = {reflectance}{reflectance_assumed}, {power_w} each, {ratio} × the eye MPE, OD {od_required}")
	case safety.ReflectionEscaping:
		r.F(Field{Key: "share", Kind: Number, SI: rf.Reflectance, Text: fmtPct(rf.Reflectance), People: true})
		r.Line("{where}: {power_w} ({share} of the arriving power), {ratio} × the eye MPE, OD {od_required}")
	default:
		r.Line("{where}: {power_w}, ρ = {reflectance}{reflectance_assumed}: hazard zone radius {hazard_radius_m}")
	}
	return r
}

func eyewearRecord(n *safety.EyewearNeed) Record {
	var r Record
	r.F(Nm("wavelength_m", "λ", n.Wavelength, "EyewearNeed.Wavelength")).
		F(Plain("od_required", "OD", n.OD, "EyewearNeed.OD"))
	if n.LBValid {
		f := Whole("en207_scale", "EN 207", n.LB, "EyewearNeed.LB")
		f.Text = n.EN207Label()
		r.F(f)
	} else {
		f := Absent("en207_scale", "EN 207", false, "EyewearNeed.LB")
		f.Text = n.EN207Label()
		r.F(f)
	}
	r.F(StrList("covered_by", "covered by", n.CoveredBy, "EyewearNeed.CoveredBy"))
	r.F(Irr("irradiance_w_m2", "largest irradiance", n.Irradiance, "EyewearNeed.Irradiance"))
	r.F(Field{Key: "coverage", Kind: String, Text: n.Coverage(), People: true, Source: "EyewearNeed.CoveredBy"})
	r.Line("{wavelength_m}: OD {od_required}, {en207_scale} (largest aperture-averaged irradiance {irradiance_w_m2}); {coverage}")
	return r
}

func assumed(a bool) string {
	if a {
		return " (assumed)"
	}
	return ""
}
