package view

import (
	"fmt"
	"math"
	"strconv"

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

func (b *builder) hazards(a *safety.Assessment) hazardView {
	h := a.Hazards
	v := hazardView{json: &Record{}}
	v.json.F(Str(dStandard, safety.Standard)).
		F(StrList(dAssumptions, Assumptions(a.Setup))).
		F(StrList(dCautions, Cautions))
	v.lasers = &List{Key: "lasers", Heading: "Sources", Columns: []string{"name", "wavelength_m", "power_w", "emission", "class_text", "eye_mpe_irradiance_w_m2", "skin_mpe_irradiance_w_m2", "duration_s", "eye_aperture_diameter_m"}, Records: make([]Record, 0, len(h.Lasers))}
	for _, ll := range h.Lasers {
		v.lasers.Records = append(v.lasers.Records, b.laserRecord(ll))
	}
	v.exposures = &List{Key: "exposures", Heading: "Open segments (worst point; ratio = aperture-averaged irradiance ÷ MPE)", Empty: "no open segment carries light",
		Columns: []string{"segment", "power_w", "aperture_irradiance_w_m2", "ratio", "od_required", "skin_ratio", "worst_at_m", "nohd"}, Records: make([]Record, 0, len(h.Exposures))}
	for _, e := range h.Exposures {
		v.exposures.Records = append(v.exposures.Records, b.exposureRecord(e))
	}
	v.reflections = &List{Key: "reflections", Records: make([]Record, 0, len(h.Reflections))}
	v.stray = &List{Heading: "Stray reflections above the eye MPE (at the reflecting surface)", Empty: "none of the surfaces reached through open segments reflects above the MPE"}
	v.escaping = &List{Heading: "Beams leaving the path above the eye MPE (mirror leakage, AOM orders other than the one used)", Empty: "none"}
	v.diffuse = &List{Heading: "Diffuse reflections (nominal hazard zone r = √(ρP/(π MPE)) of a Lambertian reflector, viewed along its normal, small-source MPE: conservative)", Empty: "no dump or path end is reached through an open segment"}
	for _, r := range h.Reflections {
		rec := b.reflectionRecord(r)
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
		v.eyewear.Records = append(v.eyewear.Records, b.eyewearRecord(n))
	}
	v.json.L(v.lasers).L(v.exposures).L(v.reflections).L(v.eyewear).
		F(StrList(dDefaultsAssumed, h.DefaultsAssumed))

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

func (b *builder) laserRecord(ll *safety.LaserLimits) Record {
	las := ll.Laser
	r := Record{Members: b.members(20)}
	cl := ll.Class
	if cl == "" {
		cl = "not assessed"
	}
	r.F(Str(dName, las.Name)).
		F(Nm(dWavelengthM, las.Wavelength)).
		F(Pow(dPowerW, las.Power)).
		F(Str(dEmission, las.Emission))
	if ll.Class != "" {
		r.F(Str(dClass, ll.Class))
	} else {
		r.F(Absent(dClass, false))
	}
	r.F(Field{d: dClassText, Kind: String, Text: cl, People: true}).
		F(Str(dClassNote, ll.ClassNote)).
		F(Sec(dDurationS, ll.Duration)).
		F(Irr(dEyeMpeIrradianceWM2, ll.EyeIrradiance)).
		F(Str(dEyeMpeRule, ll.EyeRule)).
		F(Str(dEyeMpeEffect, ll.Eye.Effect)).
		F(Irr(dSkinMpeIrradianceWM2, ll.SkinIrradiance)).
		F(Len(dEyeApertureDiameterM, ll.EyeAperture)).
		F(Len(dSkinApertureDiameterM, ll.SkinAperture)).
		F(Pow(dAelClass1W, ll.AEL.Class1)).
		F(orNone(Pow(dAelClass2W, ll.AEL.Class2))).
		F(orNone(Pow(dAelClass3rW, ll.AEL.Class3R))).
		F(Pow(dAelClass3bW, ll.AEL.Class3B))
	r.Line(las.Name + ": eye limit {eye_mpe_rule} ({eye_mpe_effect}); class {class_note}")
	r.Line("  continuous-emission AELs: Class 1 {ael_class_1_w}, Class 2 {ael_class_2_w}, Class 3R {ael_class_3r_w}, Class 3B {ael_class_3b_w}; skin aperture {skin_aperture_diameter_m}")
	if ll.Class != "" {
		r.F(Field{d: dClassMeaning, Kind: String, Text: classMeaning(ll.Class), People: true})
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

func (b *builder) exposureRecord(e *safety.Exposure) Record {
	r := Record{Members: b.members(20)}
	s := e.Segment
	r.F(Str(dPath, e.Path.Path.Name)).
		F(Whole(dAfterElement, s.After)).
		F(Len(dFromM, s.From)).
		F(Len(dToM, s.To)).
		F(Len(dWorstAtM, e.At)).
		F(Nm(dWavelengthM, e.Path.Laser.Wavelength)).
		F(Sec(dDurationS, e.Laser.Duration)).
		F(Pow(dPowerW2, e.Power)).
		F(Irr(dApertureIrradianceWM2, e.Irradiance)).
		F(Irr(dMpeIrradianceWM2, e.Laser.EyeIrradiance)).
		F(Ratio(dRatio, e.Ratio)).
		F(Plain(dOdRequired, e.OD)).
		F(Irr(dSkinApertureIrradianceWM2, e.SkinIrr)).
		F(Ratio(dSkinRatio, e.SkinRatio)).
		F(Flag(dOpenEnd, e.OpenEnd, yesNo(e.OpenEnd)))
	nohd := ""
	switch {
	case !e.OpenEnd:
		r.F(Absent(dNohdM, false))
	case math.IsInf(e.NOHD, 1):
		r.F(Absent(dNohdM, false))
		r.F(Len(dNohdBeyondM, safety.MaxHazardDistance))
		nohd = safety.FormatDistance(e.NOHD)
	default:
		r.F(Num(dNohdM, e.NOHD, safety.FormatDistance(e.NOHD)))
		nohd = safety.FormatDistance(e.NOHD)
	}
	r.F(Field{d: dSegment, Kind: String, Text: segLabel(e), People: true}).
		F(Field{d: dNohd, Kind: String, Text: nohd, People: true})
	return r
}

func segLabel(e *safety.Exposure) string {
	s := e.Segment
	name := e.Path.Path.Name
	switch {
	case math.IsInf(s.To, 1):
		return name + ": after " + strconv.Itoa(s.After) + " (open end)"
	case s.After == 0:
		return name + ": start → 1"
	}
	return name + ": " + strconv.Itoa(s.After) + " → " + strconv.Itoa(s.After+1)
}

func (b *builder) reflectionRecord(rf *safety.Reflection) Record {
	r := Record{Members: b.members(14)}
	r.F(Str(dPath, rf.Path.Path.Name))
	if rf.Element != nil {
		r.F(Whole(dElement, rf.Element.Index))
	} else {
		r.F(Absent(dElement, false))
	}
	r.F(Str(dKind, string(rf.Kind))).
		F(Nm(dWavelengthM, rf.Path.Laser.Wavelength)).
		F(Num(dReflectance, rf.Reflectance, fmt.Sprintf("%g", rf.Reflectance))).
		F(Flag(dReflectanceAssumed, rf.Assumed, assumed(rf.Assumed))).
		F(Whole(dSurfaces, rf.Surfaces)).
		F(Pow(dPowerW3, rf.Power))
	if rf.Kind != safety.ReflectionDiffuse {
		r.F(Irr(dApertureIrradianceWM22, rf.Irradiance)).
			F(Ratio(dRatio2, rf.Ratio)).
			F(Plain(dOdRequired2, rf.OD)).
			F(Absent(dHazardRadiusM, false))
	} else {
		r.F(Absent(dApertureIrradianceWM22, false)).
			F(Absent(dRatio2, false)).
			F(Absent(dOdRequired2, false)).
			F(Num(dHazardRadiusM, rf.Radius, safety.FormatDistance(rf.Radius)))
	}
	// A diffuse zone sits at a dump, or where an open end's beam lands.
	where := make([]byte, 0, 64)
	where = strconv.AppendQuote(append(where, "path "...), rf.Path.Path.Name)
	if rf.Element != nil && (rf.Kind != safety.ReflectionDiffuse || rf.Element.Type == budget.TypeDump) {
		where = strconv.AppendInt(append(where, ", element "...), int64(rf.Element.Index), 10)
		where = append(append(append(where, " ("...), rf.Element.Label()...), ')')
	} else {
		where = append(where, ", the open end"...)
	}
	r.F(Field{d: dWhere, Kind: String, Text: string(where), People: true})
	switch rf.Kind {
	case safety.ReflectionStray:
		r.Line("{where}: {surfaces} surface(s), R = {reflectance}{reflectance_assumed}, {power_w} each, {ratio} × the eye MPE, OD {od_required}")
	case safety.ReflectionEscaping:
		r.F(Field{d: dShare, Kind: Number, SI: rf.Reflectance, Text: fmtPct(rf.Reflectance), People: true})
		r.Line("{where}: {power_w} ({share} of the arriving power), {ratio} × the eye MPE, OD {od_required}")
	default:
		r.Line("{where}: {power_w}, ρ = {reflectance}{reflectance_assumed}: hazard zone radius {hazard_radius_m}")
	}
	return r
}

func (b *builder) eyewearRecord(n *safety.EyewearNeed) Record {
	var r Record
	r.F(Nm(dWavelengthM2, n.Wavelength)).
		F(Plain(dOdRequired3, n.OD))
	if n.LBValid {
		f := Whole(dEn207Scale, n.LB)
		f.Text = n.EN207Label()
		r.F(f)
	} else {
		f := Absent(dEn207Scale, false)
		f.Text = n.EN207Label()
		r.F(f)
	}
	r.F(StrList(dCoveredBy, n.CoveredBy))
	r.F(Irr(dIrradianceWM2, n.Irradiance))
	r.F(Field{d: dCoverage, Kind: String, Text: n.Coverage(), People: true})
	r.Line("{wavelength_m}: OD {od_required}, {en207_scale} (largest aperture-averaged irradiance {irradiance_w_m2}); {coverage}")
	return r
}

func assumed(a bool) string {
	if a {
		return " (assumed)"
	}
	return ""
}
