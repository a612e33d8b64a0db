package limits

import (
	"fmt"
	"math"
)

// Classification time bases, s: 0.25 s for Class 2 (the aversion response),
// 100 s for Class 1 above 400 nm where viewing is not intended, 30 000 s at
// and below 400 nm.
const (
	TimeBaseClass2   = 0.25
	TimeBaseVisible  = 100
	TimeBaseUV       = 3e4
	class3BVisibleIR = 0.5    // W, 315 nm – 1 mm, continuous emission
	class3BUV        = 1.5e-3 // W, 180–315 nm (from memory)
)

// AEL holds the accessible emission limits for continuous emission, W; NaN
// where a class does not exist at that wavelength (Class 2 outside 400–700 nm,
// Class 3R below 302.5 nm). Classes 1M and 2M share the limits of 1 and 2;
// they differ only in how the emission is measured. Each limit has the row
// it comes from.
type AEL struct {
	Class1, Class2, Class3R, Class3B float64
	// TimeBase is the duration behind Class 1, s.
	TimeBase float64
	// Class1Row … Class3BRow are where each limit comes from.
	Class1Row, Class2Row, Class3RRow, Class3BRow Provenance
}

// ContinuousAEL returns the AELs at wavelength λ (m) for a source of angular
// subtense α (rad), from the AEL tables where we have their rows: Class 1
// in 400–1400 nm for a small source (3.9e-4 C4 C7 W, and 3.9e-5 C3 W in
// 400–600 nm where the photochemical limit governs), Class 2 (C6 × 1 mW),
// Class 3R (5 × Class 2 in the visible, 5 × Class 1 elsewhere from
// 302.5 nm) and Class 3B (0.5 W; 1.5 mW below 315 nm). Where we have no row
// (Class 1 outside 400–1400 nm or for an extended source) the limit is the
// MPE irradiance at the time base times the area of the limiting aperture,
// and its provenance says so.
func ContinuousAEL(λ, α float64) (AEL, error) {
	if !(λ >= MinWavelength && λ <= MaxWavelength) {
		return AEL{}, &RangeError{"wavelength", fmt.Sprintf("%g nm", λ*1e9), "180 nm to 1 mm"}
	}
	nm := λ * 1e9
	base := float64(TimeBaseVisible)
	if nm <= 400 {
		base = TimeBaseUV
	}
	a := AEL{Class2: math.NaN(), Class3R: math.NaN(), TimeBase: base}
	if nm >= 400 && nm < 1400 && α <= AlphaMin {
		a.Class1 = 3.9e-4 * C4(nm) * C7(nm)
		a.Class1Row = memory(TableClass1, "400–1400 nm, t ≥ 100 s, α ≤ 1.5 mrad, thermal: 3.9e-4 C4 C7 W")
		if nm < 600 {
			if ph := 3.9e-5 * C3(nm); ph < a.Class1 {
				a.Class1 = ph
				a.Class1Row = memory(TableClass1, "400–600 nm, t ≥ 100 s, photochemical: 3.9e-5 C3 W")
			}
		}
	} else {
		p1, err := apertureLimit(λ, base, α)
		if err != nil {
			return AEL{}, err
		}
		a.Class1 = p1
		a.Class1Row = substitute(TableClass1, fmt.Sprintf("MPE at %g s × area of the limiting aperture", base), "the Class 1 AEL row (not transcribed)")
	}
	switch {
	case nm >= 400 && nm <= 700:
		c6 := C6(α, TimeBaseClass2)
		a.Class2 = math.Max(1e-3*c6, a.Class1)
		a.Class2Row = memory(TableClass2, "400–700 nm, t ≥ 0.25 s: C6 × 1e-3 W")
		a.Class3R = 5e-3 * c6
		a.Class3RRow = memory(TableClass3R, "400–700 nm, t ≥ 0.25 s: 5 C6 × 1e-3 W (5 × Class 2)")
	case nm >= 302.5:
		a.Class3R = 5 * a.Class1
		a.Class3RRow = memory(TableClass3R, "302.5 nm–1 mm outside 400–700 nm: 5 × Class 1")
	}
	a.Class3B = class3BVisibleIR
	a.Class3BRow = memory(TableClass3B, "315 nm–1 mm, t ≥ 0.25 s: 0.5 W")
	if nm < 315 {
		a.Class3B = class3BUV
		a.Class3BRow = memory(TableClass3B, "180–315 nm, t ≥ 0.25 s: 1.5e-3 W")
	}
	return a, nil
}

// TimeBaseRow is where the classification time bases come from: from
// memory of the standard. The user's guide of the same family gives the
// same durations, but as worst-case exposure durations for the MPE, not as
// classification time bases, so it is not cited as their check.
func TimeBaseRow() Provenance {
	return memory(TableTimeBases, "100 s above 400 nm, 3e4 s at and below 400 nm, 0.25 s for Class 2")
}

// apertureLimit is the MPE irradiance at duration t times the area of the
// eye's limiting aperture, W.
func apertureLimit(λ, t, α float64) (float64, error) {
	l, err := EyeMPE(λ, t, α)
	if err != nil {
		return 0, err
	}
	d, _, err := EyeAperture(λ, t)
	if err != nil {
		return 0, err
	}
	return l.Irradiance * math.Pi * d * d / 4, nil
}

// Class names.
const (
	Class1  = "1"
	Class2  = "2"
	Class3R = "3R"
	Class3B = "3B"
	Class4  = "4"
)

// ClassOf is the class of a continuous source of power p (W) whose whole beam
// is taken to enter the measurement aperture (so Classes 1M and 2M are never
// returned: the class can only be overstated).
func ClassOf(p float64, a AEL) string {
	switch {
	case p <= a.Class1:
		return Class1
	case !math.IsNaN(a.Class2) && p <= a.Class2:
		return Class2
	case !math.IsNaN(a.Class3R) && p <= a.Class3R:
		return Class3R
	case p <= a.Class3B:
		return Class3B
	}
	return Class4
}

// Tmin is the duration within which pulses count as one pulse for the
// pulse-train rule (rule 3), s, and whether rule 3 applies at the
// wavelength at all (from 315 nm).
func Tmin(λ float64) (float64, bool) {
	nm := λ * 1e9
	switch {
	case nm <= 315:
		return 0, false
	case nm <= 400:
		return 1e-9, true
	case nm <= 1050:
		return 18e-6, true
	case nm <= 1400:
		return 50e-6, true
	case nm <= 1500:
		return 1e-3, true
	case nm <= 1800:
		return 10, true
	case nm <= 2600:
		return 1e-3, true
	}
	return 1e-7, true
}

// TminRow is where Tmin comes from: the directive prints 315–1800 nm; the
// two bands beyond are from memory; below 315 nm no T_min applies (the
// table starts at 315 nm) and the row says so.
func TminRow(λ float64) Provenance {
	switch {
	case λ <= 315e-9:
		return memory(TableRepetitive, "no T_min below 315 nm: rule 3 does not apply")
	case λ <= 1800e-9:
		return checked(TableRepetitive, "T_min by band, 315–1800 nm", SourceDirectiveRepetitive)
	}
	return memory(TableRepetitive, "T_min, 1800 nm–1 mm")
}

// Repetitive-pulse rules.
const (
	RuleSingle  = "single pulse"
	RuleAverage = "average power"
	RuleTrain   = "pulse train (C5)"
)

// PulsedLimit is the MPE per pulse of a train under the three rules for
// repetitive pulses, J/m² per pulse: (1) every pulse against the MPE for
// its duration (and, where pulses come closer than Tmin, every group of
// pulses within Tmin against the MPE for Tmin); (2) the whole exposure T
// against the MPE for T, shared among its f·T pulses; (3) for thermal
// limits and pulses shorter than 0.25 s, every pulse (or group) against C5
// = N^−0.25 times the single-pulse MPE, N counted over the exposure but, in
// 400–1400 nm, over no more than T2. The lowest governs.
type PulsedLimit struct {
	PerPulse float64 // the governing limit, J/m² per pulse
	Rule     string  // which rule governs
	// SinglePulse, Average and Train are each rule's limit per pulse, J/m²
	// (Train is NaN where rule 3 does not apply).
	SinglePulse, Average, Train float64
	// TrainApplies says whether rule 3 applies; TrainNote why not, or the
	// restrictive C5 kept.
	TrainApplies bool
	TrainNote    string
	// N is the number of pulses (or groups) counted for C5, over
	// CountedOver seconds.
	N, CountedOver, C5 float64
	// Grouped is set when pulses come closer than Tmin: PerGroup pulses of
	// every Tmin count as one.
	Grouped  bool
	PerGroup float64
	Tmin     float64
	Single   Limit // the MPE for one pulse (or one group of Tmin)
	AvgLimit Limit // the MPE for the whole exposure
	// Irradiance is the per-pulse limit × f, W/m²: the average irradiance
	// the train may have.
	Irradiance float64
	Provenance Provenance
	// Set is the limit set whose rules and limits gave the train's limit.
	Set LimitSet
}

// PulsedEyeMPE applies the repetitive-pulse rules at the eye for pulses of
// duration τ (s) at rate f (Hz) over an exposure of T (s), as IEC
// 60825-1:2014 applies them (from memory): in 400–1400 nm N is counted over
// at most T2, and rule 3 applies only to pulses shorter than 0.25 s.
func PulsedEyeMPE(λ, τ, f, T, α float64) (PulsedLimit, error) {
	return pulseRules(λ, τ, f, T, α, iecTrain)
}

// trainRules is how a limit set applies the repetitive-pulse rules.
type trainRules struct {
	set LimitSet
	// eye is the set's single-exposure eye MPE.
	eye func(λ, t, α float64) (Limit, error)
	// countOverT2: in 400–1400 nm N is counted over at most T2 (IEC);
	// otherwise over the whole exposure (the directive).
	countOverT2 bool
	// shortOnly: rule 3 applies only to pulses shorter than 0.25 s (IEC).
	shortOnly bool
	// rules is where the rules come from; counted the provenance when N is
	// counted over less than the exposure or a long pulse skips rule 3.
	rules, counted func() Provenance
	// note says how C5 was applied; countedNote when N is counted over less
	// than the exposure.
	note, countedNote string
}

var iecTrain = trainRules{
	set: SetIEC, eye: EyeMPE, countOverT2: true, shortOnly: true,
	rules: func() Provenance { return checked(TableRepetitive, "rules 1–3", SourceDirectiveRepetitive) },
	counted: func() Provenance {
		return memory(TableRepetitive, "rules 1–3 as the IEC applies them: N counted over at most T2, rule 3 only below 0.25 s")
	},
	note:        "C5 = N^−0.25 as the directive prints it, N counted over the whole exposure; Edition 3's relaxation for small sources is not applied, as no published source confirmed it",
	countedNote: "C5 = N^−0.25 with N counted over at most T2 (the IEC rule, from memory; the directive counts every pulse of the exposure); Edition 3's relaxation for small sources is not applied, as no published source confirmed it",
}

// pulseRules applies the three rules of a limit set.
func pulseRules(λ, τ, f, T, α float64, r trainRules) (PulsedLimit, error) {
	if !(f > 0) || τ*f > 1 {
		return PulsedLimit{}, &RangeError{"repetition rate", fmt.Sprintf("%g Hz", f), "0 < f ≤ 1/τ"}
	}
	single, err := r.eye(λ, τ, α)
	if err != nil {
		return PulsedLimit{}, err
	}
	avg, err := r.eye(λ, T, α)
	if err != nil {
		return PulsedLimit{}, err
	}
	p := PulsedLimit{Single: single, AvgLimit: avg, C5: 1, Train: math.NaN(), Set: r.set, Provenance: r.rules()}
	// Rule 1.
	p.SinglePulse = single.RadiantExposure
	tmin, hasTmin := Tmin(λ)
	p.Tmin = tmin
	if hasTmin && 1/f < tmin {
		// Pulses within Tmin are one pulse of duration Tmin.
		p.Grouped, p.PerGroup = true, f*tmin
		g, err := r.eye(λ, math.Min(tmin, T), α)
		if err != nil {
			return PulsedLimit{}, err
		}
		p.Single = g
		p.SinglePulse = math.Min(p.SinglePulse, g.RadiantExposure/p.PerGroup)
	}
	// Rule 2.
	p.Average = avg.RadiantExposure / math.Max(1, f*T)
	// Rule 3.
	p.CountedOver = T
	nm := λ * 1e9
	if r.countOverT2 && nm >= 400 && nm < 1400 {
		p.CountedOver = math.Min(T, T2(α))
	}
	switch {
	case !hasTmin:
		p.TrainNote = "rule 3 does not apply below 315 nm (no thermal limit there)"
	case r.shortOnly && τ >= 0.25:
		p.TrainNote = "rule 3 applies only to pulses shorter than 0.25 s (the IEC rule, from memory; the directive applies it to every thermal train)"
		p.Provenance = r.counted()
	case !p.Single.Thermal:
		p.TrainNote = "rule 3 applies only to thermal limits; the single-pulse limit here is " + p.Single.Effect
	default:
		p.TrainApplies = true
		if p.Grouped {
			p.N = math.Max(1, p.CountedOver/tmin)
		} else {
			p.N = math.Max(1, f*p.CountedOver)
		}
		p.C5 = C5(p.N)
		perPulse := p.Single.RadiantExposure
		if p.Grouped {
			perPulse /= p.PerGroup
		}
		p.Train = p.C5 * perPulse
		p.TrainNote = r.note
		if p.CountedOver < T {
			p.TrainNote = r.countedNote
			p.Provenance = r.counted()
		}
	}
	p.PerPulse, p.Rule = p.SinglePulse, RuleSingle
	if p.Average < p.PerPulse {
		p.PerPulse, p.Rule = p.Average, RuleAverage
	}
	if p.TrainApplies && p.Train < p.PerPulse {
		p.PerPulse, p.Rule = p.Train, RuleTrain
	}
	p.Irradiance = p.PerPulse * f
	return p, nil
}
