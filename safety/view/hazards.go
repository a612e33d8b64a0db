package view

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"beamledger/budget/setup"
	"beamledger/budget/units"
	"beamledger/limits"
	"beamledger/safety"
)

// Cautions are printed under every hazard section, in every output.
var Cautions = []string{
	"These figures support, and never replace, the evaluation of your laser safety officer under local regulations and your institution's procedures.",
	"Limits whose status reads \"from memory\" or \"conservative substitute\" (printed beside each limit or listed under where the limits come from) have not been checked against the standard's text or a published source; confirm every value that matters with the laser safety officer.",
	"Only what the setup file describes is evaluated: beams, surfaces and reflections it leaves out are not.",
	"Align at the lowest power that works, keep beams at table height and below eye level, block stray beams at their source, remove watches and jewellery, and wear the eyewear the laser safety officer specifies (common practice).",
}

// Assumptions lists what the hazard figures assume, for every output.
func Assumptions(a *safety.Assessment) []string {
	s := a.Setup
	out := []string{
		"intrabeam viewing of a small source (angular subtense at most 1.5 mrad)",
		"each laser at its maximum power",
		"exposure duration (the duration column of the sources): " + safety.DurationAssumption(s),
		"irradiance averaged over the limiting aperture of the eye or skin",
		"reflections evaluated where the beam arrives through an open segment",
	}
	if len(s.Tolerances) > len(safety.GeometricTolerances(s)) { // a loss value or an operating power
		out = append(out, "each toleranced loss value at the end that makes each beam most hazardous: its highest transmission for the beam that goes on, its lowest for the beam that leaves the path there (a splitter's other port, a mirror's leak, an AOM's unused orders, a combiner's rejected port); operating powers do not enter: each laser at its maximum power")
	}
	if a.Hazards != nil {
		if d := a.Hazards.Sweep.Description(); d != "" {
			out = append(out, d)
		}
	}
	return out
}

type hazardView struct {
	json                                    *Record // the members the JSON document takes at its top level
	section                                 Section
	lasers, exposures, reflections, eyewear *List
	stray, escaping, diffuse                *List // the reflections by kind, for people
	provenance                              *List // where the limits used come from
}

// provenanceList is the list of the distinct rows of the standard (and of
// the other sources) the limits used come from, unchecked ones first.
func provenanceList(rows []limits.Provenance) *List {
	l := &List{Key: "limits_used", Heading: "Where the limits come from (status: checked against a named public source, checked against an earlier edition, from memory of the standard, or a conservative substitute)"}
	seen := map[string]bool{}
	var unchecked, checked []Record
	for _, p := range rows {
		k := p.Table + "|" + p.Row
		if p.Table == "" || seen[k] {
			continue
		}
		seen[k] = true
		r := provenanceRecord(p)
		r.Lines = provenanceLines
		if p.Checked() {
			checked = append(checked, r)
		} else {
			unchecked = append(unchecked, r)
		}
	}
	l.Records = append(unchecked, checked...)
	return l
}

// provenanceLines is the sentence of every provenance record.
var provenanceLines = []string{"- {standard}, {table}, {row}: {status_text}"}

// provenanceRecord is one provenance as JSON shows it: standard, table,
// row, the sources it was checked against and its status.
func provenanceRecord(p limits.Provenance) Record {
	var r Record
	r.F(Str(dProvStandard, p.Standard)).F(Str(dProvTable, p.Table)).F(Str(dProvRow, p.Row)).
		F(StrList(dCheckedAgainst, p.CheckedAgainst)).F(Str(dStatus, string(p.Status)))
	if p.Replaces != "" {
		r.F(Str(dReplaces, p.Replaces))
	}
	text := string(p.Status)
	if p.Replaces != "" {
		text += " (in place of " + p.Replaces + ")"
	}
	switch {
	case p.Status == limits.StatusEarlierEdition:
		text = "checked against an earlier edition's values (" + strings.Join(p.CheckedAgainst, ", ") + "), not against the cited edition"
	case len(p.CheckedAgainst) > 0 && p.Checked():
		text = "checked against " + strings.Join(p.CheckedAgainst, ", ")
	case len(p.CheckedAgainst) > 0:
		text += "; checked against " + strings.Join(p.CheckedAgainst, ", ")
	}
	r.F(Field{d: dStatusText, Kind: String, Text: text, People: true})
	return r
}

func (b *builder) hazards(a *safety.Assessment) hazardView {
	h := a.Hazards
	v := hazardView{json: &Record{}}
	v.json.F(Str(dStandard, safety.Standard)).
		F(Str(dLimitSet, string(a.Setup.Meta.Limits))).
		F(Field{d: dLimitSetText, Kind: String, Text: safety.LimitsBasis(a.Setup.Meta.Limits), People: true}).
		F(StrList(dAssumptions, Assumptions(a))).
		F(StrList(dCautions, Cautions))
	v.lasers = &List{Key: "lasers", Heading: "Sources", Columns: []string{"name", "wavelength_m", "power_w", "emission", "class_text", "label_class", "eye_mpe_irradiance_w_m2", "skin_mpe_irradiance_w_m2", "duration_s", "eye_aperture_diameter_m"}, Records: make([]Record, 0, len(h.Lasers))}
	for _, ll := range h.Lasers {
		v.lasers.Records = append(v.lasers.Records, b.laserRecord(ll))
	}
	v.exposures = &List{Key: "exposures", Heading: "Open segments (worst point; ratio = aperture-averaged irradiance ÷ MPE)", Empty: "no open segment carries light",
		Columns: []string{"segment", "power_w", "aperture_irradiance_w_m2", "ratio", "combined_text", "od_required", "skin_ratio", "worst_at_m", "nohd"}, Records: make([]Record, 0, len(h.Exposures))}
	for _, e := range slices.Concat(h.Exposures, h.Enclosed) {
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
	v.eyewear = &List{Key: "eyewear", Heading: "Eyewear (OD rounded up; EN 207 scale number in 315–1400 nm with its test condition: D continuous, I long pulses, R Q-switched, M mode-locked; scale table from memory)", Empty: "no open exposure to evaluate"}
	for _, n := range h.Eyewear {
		v.eyewear.Records = append(v.eyewear.Records, b.eyewearRecord(n))
	}
	var rows []limits.Provenance
	for _, ll := range h.Lasers {
		rows = append(rows, ll.Rows()...)
	}
	if len(h.Eyewear) > 0 {
		rows = append(rows, limits.EN207Row())
	}
	for _, e := range h.Exposures {
		if len(e.Wavelengths) > 1 {
			rows = append(rows, limits.AdditivityRow())
			break
		}
	}
	v.provenance = provenanceList(rows)
	declared, checks := b.controls(a)
	v.json.L(v.lasers).L(v.exposures).L(v.reflections).L(v.eyewear).
		F(StrList(dDefaultsAssumed, h.DefaultsAssumed)).L(v.provenance)
	v.json.O("controls", declared, false)
	v.json.L(checks)

	blocks := []Block{{Indent: 1, Line: "limits applied: " + safety.LimitsBasis(a.Setup.Meta.Limits) + "; " + safety.ClassBasis}, {Indent: 1, Line: "assumptions:"}}
	for _, as := range Assumptions(a) {
		blocks = append(blocks, Block{Indent: 2, Line: "- " + as})
	}
	for _, d := range h.DefaultsAssumed {
		blocks = append(blocks, Block{Indent: 2, Line: "- default assumed: " + d})
	}
	blocks = append(blocks, Block{Indent: 1, List: v.lasers}, Block{Indent: 1, List: v.exposures},
		Block{Indent: 1, List: v.stray}, Block{Indent: 1, List: v.escaping}, Block{Indent: 1, List: v.diffuse},
		Block{Indent: 1, List: v.eyewear}, Block{Indent: 1, Line: "controls declared: " + safety.ControlSummary(a.Setup.Controls)}, Block{Indent: 1, List: checks},
		Block{Indent: 1, List: v.provenance}, Block{Indent: 1, Line: "Cautions"}, Block{Indent: 2, Bullets: Cautions})
	v.section = Section{Heading: "Hazards", Blocks: blocks}
	return v
}

func (b *builder) laserRecord(ll *safety.LaserLimits) Record {
	las := ll.Laser
	r := Record{Members: b.members(20)}
	cl := ll.Class
	if cl == "" {
		cl = "not assessed"
	}
	r.F(Str(dLaserName, las.Name)).
		F(Nm(dLaserLambdaM, las.Wavelength)).
		F(Pow(dLaserPowerW, las.Power)).
		F(Str(dEmission, las.Emission))
	if ll.Class != "" {
		r.F(Str(dLaserLimitsClass, ll.Class))
	} else {
		r.F(Absent(dLaserLimitsClass, false))
	}
	r.F(Field{d: dClassText, Kind: String, Text: cl, People: true}).
		F(Str(dClassNote, ll.ClassNote)).
		F(Sec(dLaserLimitsDurationS, ll.Duration)).
		F(Irr(dEyeMpeIrradianceWM2, ll.EyeIrradiance)).
		F(Str(dEyeMpeRule, ll.EyeRule)).
		F(Str(dEyeMpeEffect, ll.Eye.Effect)).
		F(Str(dEyeMpeSet, string(ll.EyeSet))).
		F(Field{d: dEyeMpeSetText, Kind: String, Text: safety.GoverningSet(ll.LimitSet, ll.EyeSet), People: true}).
		F(Irr(dSkinMpeIrradianceWM2, ll.SkinIrradiance)).
		F(Str(dSkinMpeSet, string(ll.SkinSet))).
		F(Field{d: dSkinMpeSetText, Kind: String, Text: safety.GoverningSet(ll.LimitSet, ll.SkinSet), People: true}).
		F(Len(dEyeApertureDiameterM, ll.EyeAperture)).
		F(Len(dSkinApertureDiameterM, ll.SkinAperture)).
		F(Pow(dAelClass1W, ll.AEL.Class1)).
		F(orNone(Pow(dAelClass2W, ll.AEL.Class2))).
		F(orNone(Pow(dAelClass3rW, ll.AEL.Class3R))).
		F(Pow(dAelClass3bW, ll.AEL.Class3B))
	eyeProv := provenanceRecord(ll.Eye.Provenance)
	r.O("eye_mpe_provenance", &eyeProv, false)
	skinProv := provenanceRecord(ll.Skin.Provenance)
	r.O("skin_mpe_provenance", &skinProv, false)
	r.F(Pow(dAlignmentPowerW, ll.AlignmentPower)).F(Plain(dAlignmentAttenuatorOd, ll.AlignmentOD))
	r.F(Str(dLaserMaker, las.Maker)).F(Str(dLaserModel, las.Model)).F(Str(dLaserSerial, las.Serial)).
		F(Str(dLaserLabelClass, las.LabelClass)).F(Str(dLaserLocation, las.Location))
	if inv := inventory(las); inv != "" {
		r.F(Field{d: dInventory, Kind: String, Text: inv, People: true})
		r.Line(las.Name + ": {inventory}")
	}
	r.Line(las.Name + ": eye limit {eye_mpe_rule} ({eye_mpe_effect}; {eye_mpe_provenance.status}; {eye_mpe_set_text}); skin limit: {skin_mpe_set_text}; class {class_note}")
	r.Line(las.Name + ": for alignment at most {alignment_power_w}, every segment within the MPE with every enclosure opened; from the operating power an attenuator of OD {alignment_attenuator_od}")
	if p := ll.Pulsed; p != nil {
		r.F(Num(dPulseEnergyJ, ll.PulseEnergy, units.FormatSI(ll.PulseEnergy, "J"))).
			F(Pow(dPeakPowerW, ll.PeakPower)).
			F(Str(dEn207Mode, ll.EN207Mode))
		pr := b.pulsedRecord(p, las.PulseDuration, las.RepetitionRate, ll.Duration)
		r.O("pulsed", pr, false)
		r.Line("  pulses: {pulse_energy_j} per pulse at maximum power, peak power {peak_power_w} (rectangular pulse), EN 207 condition {en207_mode}")
		for _, l := range prefixKeys(pr.Lines, "pulsed.") {
			r.Line(l)
		}
	}
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
	r := Record{Members: b.members(40)}
	s := e.Segment
	r.F(Str(dPathRef, e.Path.Path.Name)).
		F(Whole(dAfterElement, s.After)).
		F(Len(dFromM, s.From)).
		F(Len(dToM, s.To)).
		F(Len(dWorstAtM, e.At)).
		F(Nm(dLaserLambdaM, e.Path.Laser.Wavelength)).
		F(Sec(dLaserLimitsDurationS, e.Laser.Duration)).
		F(Pow(dExposurePowerW, e.Power)).
		F(Irr(dExposureApertureIrradianceWM2, e.Irradiance)).
		F(Irr(dLaserLimitsMpeIrradianceWM2, e.Laser.EyeIrradiance)).
		F(Ratio(dExposureRatio, e.Ratio)).
		F(Plain(dExposureOdRequired, e.OD)).
		F(Irr(dSkinApertureIrradianceWM2, e.SkinIrr)).
		F(Ratio(dSkinRatio, e.SkinRatio)).
		F(Flag(dExposureOpenEnd, e.OpenEnd, yesNo(e.OpenEnd))).
		F(Flag(dExposureEnclosed, e.Enclosed, yesNo(e.Enclosed))).
		F(Irr(dExposureBeamIrradianceWM2, e.BeamIrradiance))
	if e.Laser.Laser.Emission == setup.EmissionPulsed {
		r.F(Num(dExposureBeamPulseExposureJM2, e.BeamPulseExposure, withUnit(e.BeamPulseExposure, "J/m²")))
	} else {
		r.F(Absent(dExposureBeamPulseExposureJM2, true))
	}
	nohd := ""
	switch {
	case !e.OpenEnd:
		r.F(Absent(dExposureNohdM, false))
	case math.IsInf(e.NOHD, 1):
		r.F(Absent(dExposureNohdM, false))
		r.F(Len(dExposureNohdBeyondM, safety.MaxHazardDistance))
		nohd = units.FormatDistance(e.NOHD, safety.MaxHazardDistance)
	default:
		r.F(Num(dExposureNohdM, e.NOHD, units.FormatDistance(e.NOHD, safety.MaxHazardDistance)))
		nohd = units.FormatDistance(e.NOHD, safety.MaxHazardDistance)
	}
	r.F(Field{d: dSegment, Kind: String, Text: segLabel(e), People: true}).
		F(Field{d: dExposureNohdText, Kind: String, Text: nohd, People: true})
	var nms []string
	for _, λ := range e.Wavelengths {
		nms = append(nms, units.FormatNumber(λ*1e9)+" nm")
	}
	names := make([]string, len(e.Lasers))
	beams := make([]string, len(e.Lasers))
	for i, las := range e.Lasers {
		names[i] = las.Name
		beams[i] = strconv.Quote(las.Name) + " (" + units.FormatWavelength(las.Wavelength) + ")"
	}
	shared := StrList(dSharedLasers, names)
	shared.Text = strings.Join(beams, " + ")
	r.F(NumList(dWavelengthsM, e.Wavelengths, strings.Join(nms, " + "))).F(shared).
		F(Ratio(dCombinedEyeRatio, e.CombinedEyeRatio)).
		F(Ratio(dCombinedSkinRatio, e.CombinedSkinRatio)).
		F(Whole(dAdditive, e.Additive))
	combined := ""
	if len(e.Wavelengths) > 1 {
		combined = units.FormatRatio(e.CombinedEyeRatio)
	}
	r.F(Field{d: dCombinedText, Kind: String, Text: combined, People: true})
	if len(e.Wavelengths) > 1 {
		r.Line("      {segment}: lasers {lasers} share this segment; with the beams whose effects add ({additive_beams} on the eye) the ratios sum to {combined_eye_ratio} (eye) and {combined_skin_ratio} (skin); OD {od_required} holds this wavelength to an equal share")
	}
	if e.Geometry != "" {
		r.F(Str(dWorstGeometry, e.Geometry))
		r.Line("      {segment}: its figures are the worst within the stated tolerances, with {worst_geometry}")
	} else {
		r.F(Field{d: dWorstGeometry, Kind: String, OmitEmpty: true})
	}
	if e.Laser.Pulsed != nil {
		r.F(Num(dExposurePulseRadiantExposureJM2, e.PulseRadiantExposure, withUnit(e.PulseRadiantExposure, "J/m²"))).
			F(Irr(dPulsePeakIrradianceWM2, e.PulsePeakIrr)).
			F(Irr(dAverageBeamPeakWM2, e.PeakIrr))
		r.Line("      {segment} per pulse: {pulse_radiant_exposure_j_m2} over the eye aperture; peak irradiance during a pulse {pulse_peak_irradiance_w_m2} (of the average power: {average_power_peak_irradiance_w_m2})")
	}
	return r
}

func segLabel(e *safety.Exposure) string {
	if e.Enclosed {
		return segName(e) + " (enclosed; when opened for alignment)"
	}
	return segName(e)
}

// segName names an exposure's segment: its path and the elements it lies
// between.
func segName(e *safety.Exposure) string {
	s := e.Segment
	p := e.Path.Path
	name := p.Name
	if e.Path.IsJoined() {
		name += " (" + e.Path.Laser.Name + ")"
	}
	from := strconv.Itoa(s.After)
	if s.After == 0 {
		from = "start"
	}
	switch {
	case math.IsInf(s.To, 1):
		return name + ": after " + strconv.Itoa(s.After) + " (open end)"
	case p.IntoPath != nil && s.To == p.IntoAt && (len(p.Elements) == 0 || s.After == p.Elements[len(p.Elements)-1].Index):
		return name + ": " + from + " → " + p.Into
	}
	return name + ": " + from + " → " + strconv.Itoa(s.After+1)
}

func (b *builder) reflectionRecord(rf *safety.Reflection) Record {
	r := Record{Members: b.members(14)}
	r.F(Str(dPathRef, rf.Path.Path.Name))
	if rf.Element != nil {
		r.F(Whole(dReflectionElement, rf.Element.Index))
	} else {
		r.F(Absent(dReflectionElement, false))
	}
	r.F(Str(dReflectionKind, string(rf.Kind))).
		F(Nm(dLaserLambdaM, rf.Path.Laser.Wavelength)).
		F(Num(dReflectance, rf.Reflectance, fmt.Sprintf("%g", rf.Reflectance))).
		F(Flag(dReflectanceAssumed, rf.Assumed, assumed(rf.Assumed))).
		F(Whole(dSurfaces, rf.Surfaces)).
		F(Pow(dReflectionPowerW, rf.Power))
	if rf.Kind != safety.ReflectionDiffuse {
		r.F(Irr(dReflectionApertureIrradianceWM2, rf.Irradiance)).
			F(Ratio(dReflectionRatio, rf.Ratio)).
			F(Plain(dReflectionOdRequired, rf.OD)).
			F(Absent(dHazardRadiusM, false))
	} else {
		r.F(Absent(dReflectionApertureIrradianceWM2, false)).
			F(Absent(dReflectionRatio, false)).
			F(Absent(dReflectionOdRequired, false)).
			F(Num(dHazardRadiusM, rf.Radius, units.FormatDistance(rf.Radius, safety.MaxHazardDistance)))
	}
	// A diffuse zone sits at a dump, or where an open end's beam lands.
	where := make([]byte, 0, 64)
	where = strconv.AppendQuote(append(where, "path "...), rf.Path.Path.Name)
	if rf.Path.IsJoined() {
		where = strconv.AppendQuote(append(where, " (beam of laser "...), rf.Path.Laser.Name)
		where = append(where, ')')
	}
	if rf.Element != nil && (rf.Kind != safety.ReflectionDiffuse || rf.Element.Type == setup.TypeDump) {
		where = strconv.AppendInt(append(where, ", element "...), int64(rf.Element.Index), 10)
		where = append(append(append(where, " ("...), rf.Element.Label()...), ')')
	} else {
		where = append(where, ", the open end"...)
	}
	r.F(Field{d: dReflectionWhere, Kind: String, Text: string(where), People: true})
	worst := safety.WorstNote(rf.Geometry)
	if rf.Geometry != "" {
		r.F(Str(dReflectionWorstGeometry, rf.Geometry))
	} else {
		r.F(Field{d: dReflectionWorstGeometry, Kind: String, OmitEmpty: true})
	}
	r.F(Field{d: dWorstText, Kind: String, Text: worst, People: true})
	switch rf.Kind {
	case safety.ReflectionStray:
		r.Line("{where}: {surfaces} surface(s), R = {reflectance}{reflectance_assumed}, {power_w} each, {ratio} × the eye MPE, OD {od_required}{worst_text}")
	case safety.ReflectionEscaping:
		r.F(Field{d: dReflectionShare, Kind: Number, SI: rf.Reflectance, Text: fmtPct(rf.Reflectance), People: true})
		r.Line("{where}: {power_w} ({share} of the arriving power), {ratio} × the eye MPE, OD {od_required}{worst_text}")
	default:
		r.Line("{where}: {power_w}, ρ = {reflectance}{reflectance_assumed}: hazard zone radius {hazard_radius_m}{worst_text}")
	}
	return r
}

func (b *builder) eyewearRecord(n *safety.EyewearNeed) Record {
	var r Record
	r.F(Nm(dEyewearNeedWavelengthM, n.Wavelength)).
		F(Plain(dEyewearNeedOdRequired, n.OD))
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
	r.F(Str(dEn207Mode, n.Mode))
	r.F(Irr(dIrradianceWM2, n.Irradiance))
	r.F(Irr(dEyewearNeedBeamIrradianceWM2, n.BeamIrradiance))
	r.F(Field{d: dCoverage, Kind: String, Text: n.Coverage(), People: true})
	if n.Mode == limits.EN207D {
		r.F(Absent(dEyewearNeedPulseRadiantExposureJM2, true)).F(Absent(dEyewearNeedBeamPulseExposureJM2, true))
		r.Line("{wavelength_m}: OD {od_required} (from the largest aperture-averaged irradiance, {irradiance_w_m2}), {en207_scale} (continuous; from the beam's own largest power density, {beam_irradiance_w_m2}); {coverage}")
	} else {
		r.F(Num(dEyewearNeedPulseRadiantExposureJM2, n.PulseRadiantExposure, withUnit(n.PulseRadiantExposure, "J/m²"))).
			F(Num(dEyewearNeedBeamPulseExposureJM2, n.BeamPulseExposure, withUnit(n.BeamPulseExposure, "J/m²")))
		r.Line("{wavelength_m}: OD {od_required} (from the largest radiant exposure per pulse over the eye aperture, {pulse_radiant_exposure_j_m2}), {en207_scale} (pulsed, condition {en207_mode}; from the beam's own largest energy density per pulse, {beam_pulse_exposure_j_m2}); {coverage}")
	}
	return r
}

func assumed(a bool) string {
	if a {
		return " (assumed)"
	}
	return ""
}

// pulsedRecord shows the three repetitive-pulse rules for pulses of
// duration τ at rate f over an exposure T: each rule's limit per pulse,
// which governs, and what rule 3 counted.
func (b *builder) pulsedRecord(p *limits.PulsedLimit, τ, f, T float64) *Record {
	r := &Record{Members: b.members(16)}
	r.F(Sec(dPulseDurationS, τ)).
		F(Num(dRepetitionRateHz, f, units.FormatFrequency(f))).
		F(Num(dSinglePulseJM2, p.SinglePulse, withUnit(p.SinglePulse, "J/m²"))).
		F(Num(dAverageJM2, p.Average, withUnit(p.Average, "J/m²")))
	if p.TrainApplies {
		r.F(Num(dTrainJM2, p.Train, withUnit(p.Train, "J/m²"))).
			F(Plain(dPulses, p.N)).
			F(Sec(dCountedOverS, p.CountedOver)).
			F(Plain(dC5, p.C5))
	} else {
		r.F(Absent(dTrainJM2, false)).F(Absent(dPulses, false)).F(Absent(dCountedOverS, false)).F(Absent(dC5, false))
	}
	r.F(Str(dTrainNote, p.TrainNote)).
		F(Flag(dGrouped, p.Grouped, yesNo(p.Grouped))).
		F(Sec(dTminS, p.Tmin)).
		F(Num(dMpePerPulseJM2, p.PerPulse, withUnit(p.PerPulse, "J/m²"))).
		F(Str(dGoverningRule, p.Rule)).
		F(Irr(dMpeAverageIrradianceWM2, p.Irradiance))
	if p.Grouped {
		r.F(Plain(dPulsesPerGroup, p.PerGroup))
	} else {
		r.F(Absent(dPulsesPerGroup, true))
	}
	r.Line("  rule 1, single pulse: {single_pulse_j_m2} per pulse" + map[bool]string{true: " (pulses within T_min = {tmin_s} count as one: {pulses_per_group} per group)", false: ""}[p.Grouped])
	r.Line("  rule 2, average over {duration_s}: {average_j_m2} per pulse")
	if p.TrainApplies {
		r.Line("  rule 3, pulse train: C5 = {c5} for {pulses} pulses counted over {counted_over_s}: {train_j_m2} per pulse ({train_note})")
	} else {
		r.Line("  rule 3, pulse train: not applied ({train_note})")
	}
	r.Line("  the {governing_rule} rule of {set_text} governs: {mpe_per_pulse_j_m2} per pulse, an average irradiance of {mpe_average_irradiance_w_m2}")
	r.F(Sec(dExposureDurationS, T))
	r.F(Str(dPulsedSet, string(p.Set))).F(Field{d: dPulsedSetText, Kind: String, Text: p.Set.Governs(), People: true})
	return r
}

// controls is the record of the declared controls and the list of the
// control measures the classes present need.
func (b *builder) controls(a *safety.Assessment) (*Record, *List) {
	c := a.Setup.Controls
	declared := &Record{}
	declared.F(Str(dControlsEyewear, c.Eyewear)).F(Str(dControlsEntry, c.Entry)).F(Str(dControlsKeyControl, c.KeyControl)).
		F(Str(dControlsWarningSigns, c.WarningSigns)).F(Str(dControlsTraining, c.Training)).F(Str(dControlsPerimeter, c.Perimeter))
	if c.Perimeter == setup.PerimeterBarrier {
		declared.F(Irr(dControlsPerimeterRatingWM2, c.PerimeterRating))
	} else {
		declared.F(Absent(dControlsPerimeterRatingWM2, false))
	}
	declared.F(Str(dControlsProcedure, c.Procedure)).F(Str(dControlsAlignmentProcedure, c.AlignmentProcedure)).
		F(Str(dControlsOfficer, c.Officer)).F(Str(dControlsNotes, c.Notes))
	l := &List{Key: "control_checks", Heading: "Control measures by class (" + safety.ControlsStandard + ", from memory; the laser safety officer decides)", Records: make([]Record, 0, len(a.Hazards.Controls))}
	for _, cc := range a.Hazards.Controls {
		r := Record{}
		status := "not needed by the classes present"
		switch {
		case cc.NeededBy != "" && cc.InPlace:
			status = "needed by " + cc.NeededBy + "; in place"
		case cc.NeededBy != "":
			status = "needed by " + cc.NeededBy + "; MISSING"
		}
		r.F(Str(dControlCheckName, cc.Name)).F(Str(dControlCheckNeededBy, cc.NeededBy)).
			F(Flag(dControlCheckNeeded, cc.NeededBy != "", yesNo(cc.NeededBy != ""))).
			F(Flag(dControlCheckInPlace, cc.InPlace, yesNo(cc.InPlace))).
			F(Str(dControlCheckDeclared, cc.Declared)).
			F(Field{d: dControlCheckStatus, Kind: String, Text: status, People: true})
		prov := provenanceRecord(cc.Provenance)
		r.O("provenance", &prov, false)
		r.Line("{name}: {status} (declared: {declared})")
		l.Records = append(l.Records, r)
	}
	return declared, l
}

// inventory writes a laser's inventory keys for people: "maker model,
// serial S, labelled Class X, at L" ("" when none is stated).
func inventory(las *setup.Laser) string {
	var parts []string
	if mm := strings.TrimSpace(las.Maker + " " + las.Model); mm != "" {
		parts = append(parts, mm)
	}
	if las.Serial != "" {
		parts = append(parts, "serial "+las.Serial)
	}
	if las.LabelClass != "" {
		parts = append(parts, "labelled Class "+las.LabelClass)
	}
	if las.Location != "" {
		parts = append(parts, "at "+las.Location)
	}
	return strings.Join(parts, ", ")
}
