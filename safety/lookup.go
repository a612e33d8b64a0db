package safety

import (
	"fmt"

	"beamledger/budget/setup"
	"beamledger/budget/units"
	"beamledger/limits"
)

// LimitsQuery asks for the limits at one wavelength, SI; a zero value is
// not given (Duration: the default viewing duration; AngularSubtense: a
// small source). PulseDuration and RepetitionRate go together, and so do
// Power, BeamDiameter (1/e²) and Divergence (full angle, 1/e²).
type LimitsQuery struct {
	Wavelength, Duration, AngularSubtense float64
	PulseDuration, RepetitionRate         float64
	Power, BeamDiameter, Divergence       float64
	// Set is the limit set the governing values come from ("": strictest).
	Set limits.LimitSet
}

// SetLimits are one limit set's values for a lookup.
type SetLimits struct {
	Set        limits.LimitSet
	Eye, Skin  limits.Limit
	Pulsed     *limits.PulsedLimit // set for a pulse train
	EyeLimitIr float64             // the eye irradiance limit of this set, W/m²
}

// LimitsLookup is what the limits lookup found.
type LimitsLookup struct {
	Query    LimitsQuery
	Duration float64 // the duration used, s
	// Set is the limit set chosen; IEC and Directive each set's own values,
	// side by side. Eye, Skin, Pulsed and EyeIrradiance are the governing
	// ones (the lower of the two under strictest; their Set says whose).
	Set            limits.LimitSet
	IEC, Directive SetLimits
	Eye            limits.Limit
	Skin           limits.Limit
	// EyeAperture and SkinAperture are the limiting aperture diameters, m.
	EyeAperture, SkinAperture float64
	// EyeApertureRow and SkinApertureRow are where the apertures come from.
	EyeApertureRow, SkinApertureRow limits.Provenance
	AEL                             limits.AEL
	// Pulsed is set for a pulse train.
	Pulsed *limits.PulsedLimit
	// EyeIrradiance is the limit average irradiances are held to, W/m²
	// (for a pulse train, the governing per-pulse limit × the rate).
	EyeIrradiance float64
	// With a beam: its class ("" for a pulse train: not assessed), its NOHD
	// (m, +Inf past MaxHazardDistance), the irradiance at the exit averaged
	// over the eye aperture (W/m²) and the OD needed there.
	HasBeam    bool
	Class      string
	NOHD       float64
	ExitIrr    float64
	ODRequired float64
}

// LookUpLimits finds the eye and skin MPE, apertures and class AELs at one
// wavelength and duration, the pulse-train limit, and for a beam its class,
// NOHD (the closed form of the standard for a beam diverging from the exit)
// and the OD needed at the exit.
func LookUpLimits(q LimitsQuery) (*LimitsLookup, error) {
	λ, α := q.Wavelength, q.AngularSubtense
	r := &LimitsLookup{Query: q, Duration: q.Duration}
	if r.Duration == 0 {
		r.Duration = setup.DefaultViewingDuration(λ)
	}
	t := r.Duration
	pulsed := q.PulseDuration > 0 || q.RepetitionRate > 0
	if pulsed && !(q.PulseDuration > 0 && q.RepetitionRate > 0) {
		return nil, fmt.Errorf("a pulse train needs both its pulse duration and its repetition rate")
	}
	if pulsed && q.PulseDuration*q.RepetitionRate > 1 {
		return nil, fmt.Errorf("a repetition rate of %s with %s pulses is a duty cycle above 1", units.FormatFrequency(q.RepetitionRate), units.FormatSI(q.PulseDuration, "s"))
	}
	if pulsed && q.PulseDuration > t {
		return nil, fmt.Errorf("the pulse duration %s is longer than the exposure %s", units.FormatSI(q.PulseDuration, "s"), units.FormatSI(t, "s"))
	}
	beam := q.Power > 0 || q.BeamDiameter > 0 || q.Divergence > 0
	if beam && !(q.Power > 0 && q.BeamDiameter > 0 && q.Divergence > 0) {
		return nil, fmt.Errorf("a beam needs its power, 1/e² diameter and divergence together")
	}
	r.Set = q.Set
	if r.Set == "" {
		r.Set = limits.SetStrictest
	}
	gov, err := lookUpSet(r.Set, q, t)
	if err != nil {
		return nil, err
	}
	r.Eye, r.Skin, r.Pulsed, r.EyeIrradiance = gov.Eye, gov.Skin, gov.Pulsed, gov.EyeLimitIr
	if r.IEC, err = lookUpSet(limits.SetIEC, q, t); err != nil {
		return nil, err
	}
	if r.Directive, err = lookUpSet(limits.SetDirective, q, t); err != nil {
		return nil, err
	}
	if r.EyeAperture, r.EyeApertureRow, err = limits.EyeAperture(λ, t); err != nil {
		return nil, err
	}
	if r.SkinAperture, r.SkinApertureRow, err = limits.SkinAperture(λ, t); err != nil {
		return nil, err
	}
	if r.AEL, err = limits.ContinuousAEL(λ, α); err != nil {
		return nil, err
	}
	if beam {
		r.HasBeam = true
		if !pulsed {
			r.Class = limits.ClassOf(q.Power, r.AEL)
		}
		r.NOHD = limits.NOHD(q.Power, q.BeamDiameter, q.Divergence, r.EyeIrradiance)
		r.ExitIrr = limits.ApertureAverage(q.Power, q.BeamDiameter/2, r.EyeAperture)
		r.ODRequired = limits.OpticalDensity(r.ExitIrr / r.EyeIrradiance)
	}
	return r, nil
}

// lookUpSet is one limit set's eye and skin MPE and, for a pulse train, its
// repetitive-pulse limit, at duration t.
func lookUpSet(set limits.LimitSet, q LimitsQuery, t float64) (SetLimits, error) {
	λ, α := q.Wavelength, q.AngularSubtense
	sl := SetLimits{Set: set}
	var err error
	if sl.Eye, err = limits.EyeMPEIn(set, λ, t, α); err != nil {
		return sl, err
	}
	if sl.Skin, err = limits.SkinMPEIn(set, λ, t); err != nil {
		return sl, err
	}
	sl.EyeLimitIr = sl.Eye.Irradiance
	if q.PulseDuration > 0 {
		p, err := limits.PulsedEyeMPEIn(set, λ, q.PulseDuration, q.RepetitionRate, t, α)
		if err != nil {
			return sl, err
		}
		sl.Pulsed, sl.EyeLimitIr = &p, p.Irradiance
	}
	return sl, nil
}
