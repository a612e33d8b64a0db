package view

import (
	"fmt"
	"sort"
	"strings"

	"beamledger/budget/units"
	"beamledger/limits"
	"beamledger/safety"
)

// factorOrder is the order people read the correction factors in.
var factorOrder = []string{"C1", "C2", "T1_s", "C3", "C4", "C6", "C7", "T2_s"}

// factorName is a factor's name for people: the JSON key without its unit
// suffix ("T2" for T2_s, "γ" for gamma_rad).
func factorName(k string) string {
	switch {
	case k == "gamma_rad":
		return "γ"
	case strings.HasSuffix(k, "_s"):
		return strings.TrimSuffix(k, "_s")
	}
	return k
}

// factorText is a factor's value for people, with its unit.
func factorText(k string, v float64) string {
	switch {
	case k == "gamma_rad":
		return units.FormatSI(v, "rad")
	case strings.HasSuffix(k, "_s"):
		return units.FormatSI(v, "s")
	}
	return units.FormatNumber(v)
}

// Limits is the view of a limits lookup: one record for JSON, its lines for
// people.
func Limits(l *safety.LimitsLookup) *Doc {
	q := l.Query
	r := &Record{}
	src := "a small source (α ≤ 1.5 mrad)"
	if q.AngularSubtense > limits.AlphaMin {
		src = fmt.Sprintf("a source of angular subtense %s", units.FormatSI(q.AngularSubtense, "rad"))
	}
	r.F(Num(dLimitsQueryWavelengthM, q.Wavelength, units.FormatNumber(q.Wavelength*1e9)+" nm")).
		F(Sec(dLimitsLookupDurationS, l.Duration)).
		F(Num(dAngularSubtenseRad, q.AngularSubtense, units.FormatSI(q.AngularSubtense, "rad"))).
		F(Str(dStandard, safety.Standard)).
		F(Str(dLimitSet, string(l.Set))).
		F(Field{d: dLimitSetText, Kind: String, Text: safety.LimitsBasis(l.Set), People: true}).
		F(Str(dEyeMpeSet, string(l.Eye.Set))).
		F(Field{d: dEyeMpeSetText, Kind: String, Text: safety.GoverningSet(l.Set, l.Eye.Set), People: true}).
		F(Str(dSkinMpeSet, string(l.Skin.Set))).
		F(Field{d: dSkinMpeSetText, Kind: String, Text: safety.GoverningSet(l.Set, l.Skin.Set), People: true})
	r.Line("limits at {wavelength_m}, exposure {duration_s}, " + src)
	r.Line("  limits applied: {limit_set_text}; " + safety.ClassBasis)
	var b builder
	side := func(key, name string, m limits.Limit, ap float64, apRow limits.Provenance) {
		s := &Record{}
		s.F(Num(dLimitMpeIrradianceWM2, m.Irradiance, units.FormatSI(m.Irradiance, "W/m²")+" = "+units.FormatIrradiance(m.Irradiance))).
			F(Num(dMpeRadiantExposureJM2, m.RadiantExposure, units.FormatSI(m.RadiantExposure, "J/m²"))).
			F(Len(dApertureDiameterM, ap)).
			F(Str(dRule, m.Rule)).F(Str(dEffect, m.Effect))
		prov, apProv := provenanceRecord(m.Provenance), provenanceRecord(apRow)
		s.O("provenance", &prov, false).O("aperture_provenance", &apProv, false)
		r.O(key, s, false)
		r.Line(fmt.Sprintf("  %s MPE {%s.mpe_irradiance_w_m2} (H = {%s.mpe_radiant_exposure_j_m2}), averaged over a {%s.aperture_diameter_m} aperture; {%s.effect}", name, key, key, key, key))
		r.Line(fmt.Sprintf("       rule: {%s.rule}", key))
		r.Line(fmt.Sprintf("       from: {%s.provenance.table}, {%s.provenance.row}: {%s.provenance.status_text}", key, key, key))
		r.Line(fmt.Sprintf("       aperture from: {%s.aperture_provenance.row}: {%s.aperture_provenance.status_text}", key, key))
	}
	side("eye", "eye ", l.Eye, l.EyeAperture, l.EyeApertureRow)
	r.Line("       {eye_mpe_set_text}")
	side("skin", "skin", l.Skin, l.SkinAperture, l.SkinApertureRow)
	r.Line("       {skin_mpe_set_text}")
	sets := &Record{}
	r.Line("  side by side (the lower governs under \"strictest\"):")
	for _, sl := range []struct {
		key string
		v   safety.SetLimits
	}{{"iec_60825_1_2014", l.IEC}, {"directive_2006_25_ec", l.Directive}} {
		one := &Record{}
		one.F(Str(dLimitSet, string(sl.v.Set))).
			F(Num(dEyeMpeIrradianceWM2, sl.v.Eye.Irradiance, units.FormatIrradiance(sl.v.Eye.Irradiance))).
			F(Num(dMpeRadiantExposureJM2, sl.v.Eye.RadiantExposure, units.FormatSI(sl.v.Eye.RadiantExposure, "J/m²"))).
			F(Str(dRule, sl.v.Eye.Rule)).
			F(Num(dSkinMpeIrradianceWM2, sl.v.Skin.Irradiance, units.FormatIrradiance(sl.v.Skin.Irradiance)))
		ep, sp := provenanceRecord(sl.v.Eye.Provenance), provenanceRecord(sl.v.Skin.Provenance)
		one.O("eye_provenance", &ep, false).O("skin_provenance", &sp, false)
		pre := "sets." + sl.key + "."
		one.Line(fmt.Sprintf("    %-17s eye {%seye_mpe_irradiance_w_m2} (H = {%smpe_radiant_exposure_j_m2}), {%srule}: {%seye_provenance.status_text}", sl.v.Set.Governs()+":", pre, pre, pre, pre))
		one.Line(fmt.Sprintf("    %-17s skin {%sskin_mpe_irradiance_w_m2}: {%sskin_provenance.status_text}", "", pre, pre))
		if p := sl.v.Pulsed; p != nil {
			one.F(Num(dMpePerPulseJM2, p.PerPulse, withUnit(p.PerPulse, "J/m²"))).F(Str(dGoverningRule, p.Rule))
			if p.TrainApplies {
				one.F(Plain(dPulses, p.N)).F(Sec(dCountedOverS, p.CountedOver))
			} else {
				one.F(Absent(dPulses, false)).F(Absent(dCountedOverS, false))
			}
			tp := provenanceRecord(p.Provenance)
			one.O("train_provenance", &tp, false)
			if p.TrainApplies {
				one.Line(fmt.Sprintf("    %-17s pulse train: {%smpe_per_pulse_j_m2} per pulse, the {%sgoverning_rule} rule (N = {%spulses} over {%scounted_over_s}): {%strain_provenance.status_text}", "", pre, pre, pre, pre, pre))
			} else {
				one.Line(fmt.Sprintf("    %-17s pulse train: {%smpe_per_pulse_j_m2} per pulse, the {%sgoverning_rule} rule: {%strain_provenance.status_text}", "", pre, pre, pre))
			}
		}
		sets.O(sl.key, one, false)
		for _, line := range one.Lines {
			r.Line(line)
		}
		one.Lines = nil
	}
	r.O("sets", sets, false)
	ael := &Record{}
	ael.F(Pow(dAELClass1, l.AEL.Class1)).
		F(orNone(Pow(dAELClass2, l.AEL.Class2))).
		F(orNone(Pow(dClass3r, l.AEL.Class3R))).
		F(Pow(dClass3b, l.AEL.Class3B))
	r.O("ael_w", ael, false)
	aelProv := &Record{}
	for _, c := range []struct {
		key string
		row limits.Provenance
	}{{"class_1", l.AEL.Class1Row}, {"class_2", l.AEL.Class2Row}, {"class_3r", l.AEL.Class3RRow}, {"class_3b", l.AEL.Class3BRow}, {"time_base", limits.TimeBaseRow()}} {
		if c.row.Table == "" {
			aelProv.O(c.key, nil, false)
			continue
		}
		pr := provenanceRecord(c.row)
		aelProv.O(c.key, &pr, false)
	}
	r.O("ael_provenance", aelProv, false)
	r.F(Sec(dAelTimeBaseS, l.AEL.TimeBase))
	factors := &Record{}
	keys := make([]string, 0, len(l.Eye.Factors))
	for k := range l.Eye.Factors {
		keys = append(keys, k)
	}
	sort.Strings(keys) // as JSON objects list their keys
	for _, k := range keys {
		factors.F(Num(&Desc{k, k, "Limit.Factors"}, l.Eye.Factors[k], factorText(k, l.Eye.Factors[k])))
	}
	r.O("factors", factors, false)
	if len(keys) > 0 {
		var parts []string
		for _, k := range factorOrder {
			if _, ok := l.Eye.Factors[k]; ok {
				parts = append(parts, fmt.Sprintf("%s = {factors.%s}", factorName(k), k))
			}
		}
		r.Line("  correction factors: " + strings.Join(parts, " "))
		var from []string
		for _, k := range factorOrder {
			if _, ok := l.Eye.Factors[k]; ok {
				pr := provenanceRecord(limits.FactorProvenanceAt(k, l.Duration, q.AngularSubtense))
				from = append(from, factorName(k)+" "+pr.Field("status_text").Text)
			}
		}
		r.F(StrList(dFactorsFrom, from))
		r.Line("       from: {factors_provenance}")
	}
	var pulsed *Record
	if p := l.Pulsed; p != nil {
		pulsed = b.pulsedRecord(p, q.PulseDuration, q.RepetitionRate, l.Duration)
		train := provenanceRecord(p.Provenance)
		pulsed.O("provenance", &train, false)
		tmin := provenanceRecord(limits.TminRow(q.Wavelength))
		pulsed.O("tmin_provenance", &tmin, false)
		r.Line("  pulse train of {pulsed.pulse_duration_s} pulses at {pulsed.repetition_rate_hz} over {duration_s}:")
		for _, line := range prefixKeys(pulsed.Lines, "pulsed.") {
			r.Line(line)
		}
		r.Line("       rules from: {pulsed.provenance.row}: {pulsed.provenance.status_text}; T_min from: {pulsed.tmin_provenance.row}: {pulsed.tmin_provenance.status_text}")
	}
	r.O("pulsed", pulsed, true)
	r.Line("  AEL for continuous emission (Class 1 time base {ael_time_base_s}): Class 1/1M {ael_w.class_1}, Class 2/2M {ael_w.class_2}, Class 3R {ael_w.class_3r}, Class 3B {ael_w.class_3b}")
	for _, c := range []struct {
		key, name string
		row       limits.Provenance
	}{{"class_1", "Class 1", l.AEL.Class1Row}, {"class_2", "Class 2", l.AEL.Class2Row}, {"class_3r", "Class 3R", l.AEL.Class3RRow}, {"class_3b", "Class 3B", l.AEL.Class3BRow}, {"time_base", "time base", limits.TimeBaseRow()}} {
		if c.row.Table != "" {
			r.Line(fmt.Sprintf("       %s from: {ael_provenance.%s.row}: {ael_provenance.%s.status_text}", c.name, c.key, c.key))
		}
	}
	if l.HasBeam {
		if l.Class != "" {
			r.F(Str(dLimitsLookupClass, l.Class))
			r.Line("  class {class} (whole beam through the aperture; 1M/2M not distinguished)")
		} else {
			r.Line("  class: not assessed for pulsed emission")
		}
		if l.NOHD > safety.MaxHazardDistance {
			r.F(Num(dLimitsLookupNohdBeyondM, safety.MaxHazardDistance, units.FormatDistance(l.NOHD, safety.MaxHazardDistance)))
			r.F(Field{d: dLimitsLookupNohdText, Kind: String, Text: units.FormatDistance(l.NOHD, safety.MaxHazardDistance), People: true})
		} else {
			r.F(Num(dLimitsLookupNohdM, l.NOHD, units.FormatDistance(l.NOHD, safety.MaxHazardDistance)))
			r.F(Field{d: dLimitsLookupNohdText, Kind: String, Text: units.FormatDistance(l.NOHD, safety.MaxHazardDistance) + " (rounded up)", People: true})
		}
		r.F(Num(dLimitsLookupOdRequired, l.ODRequired, fmt.Sprintf("%g", l.ODRequired))).
			F(Irr(dExitApertureIrradianceWM2, l.ExitIrr))
		r.Line("  at the exit: {exit_aperture_irradiance_w_m2} over the eye aperture, OD {od_required} needed; NOHD {nohd}")
	}
	r.F(StrList(dCautions, Cautions))
	d := &Doc{JSON: r, Sections: []Section{{Blocks: []Block{{Record: r}, {Indent: 1, Bullets: Cautions}}}}}
	return d
}
