package main

import (
	"encoding/json"
	"fmt"
	"io"
	"math"

	"github.com/spf13/cobra"

	"beamledger/budget"
	"beamledger/limits"
	"beamledger/safety"
	"beamledger/safety/view"
)

type limitsOptions struct {
	wavelength, duration, pulseDuration, repetitionRate, angularSubtense string
	power, beamDiameter, divergence                                      string
	json                                                                 bool
}

func (e *env) newLimits() *cobra.Command {
	o := &limitsOptions{}
	cmd := &cobra.Command{
		Use:   "limits --wavelength λ [flags]",
		Short: "Look up exposure limits, AELs, and with a beam its NOHD, OD and class",
		Long: `limits looks up the maximum permissible exposure (MPE) of IEC 60825-1:2014
(Edition 3) for the eye and the skin at one wavelength and exposure duration,
with the limiting aperture, the correction factors used and the accessible
emission limits (AEL) of the classes for continuous emission.

The duration defaults to 0.25 s in 400–700 nm and 10 s elsewhere (unintended
viewing). With --pulse-duration and --repetition-rate the repetitive-pulse
rules apply over the duration. With --power, --beam-diameter (1/e²) and
--divergence (full angle, 1/e²) it also gives the nominal ocular hazard
distance, the optical density needed at the exit and the class.

The values were transcribed from memory of the standard's tables; they support,
and never replace, your laser safety officer's evaluation.`,
		Example: `  beamledger limits --wavelength "780 nm"
  beamledger limits --wavelength "1064 nm" --duration "10 s" --power "5 W" --beam-diameter "2 mm" --divergence "1 mrad"
  beamledger limits --wavelength "532 nm" --pulse-duration "10 ns" --repetition-rate "1 kHz" --json`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error { return e.runLimits(o) },
	}
	f := cmd.Flags()
	f.StringVar(&o.wavelength, "wavelength", "", `vacuum wavelength, e.g. "780 nm" (required)`)
	f.StringVar(&o.duration, "duration", "", `exposure duration, e.g. "10 s" (default 0.25 s in 400–700 nm, 10 s elsewhere)`)
	f.StringVar(&o.pulseDuration, "pulse-duration", "", `pulse duration of a pulse train, e.g. "10 ns"`)
	f.StringVar(&o.repetitionRate, "repetition-rate", "", `pulse repetition rate, e.g. "1 kHz"`)
	f.StringVar(&o.angularSubtense, "angular-subtense", "", `apparent source size, e.g. "10 mrad" (default: a small source)`)
	f.StringVar(&o.power, "power", "", `beam power (pulsed: average), e.g. "50 mW"`)
	f.StringVar(&o.beamDiameter, "beam-diameter", "", `1/e² beam diameter at the exit, e.g. "2 mm"`)
	f.StringVar(&o.divergence, "divergence", "", `full divergence angle, 1/e², e.g. "1 mrad"`)
	f.BoolVar(&o.json, "json", false, "write JSON (SI units, unit-suffixed keys)")
	return cmd
}

// flagRange is the physical range of each flag, SI. A value outside it is
// refused: a divergence of 1e-320 rad or a power of 1e300 W describes no
// beam, and would only give a meaningless figure.
var flagRange = map[string][2]float64{
	"wavelength":       {budget.MinWavelength, budget.MaxWavelength},
	"duration":         {limits.MinDuration, limits.MaxDuration},
	"pulse-duration":   {limits.MinDuration, limits.MaxDuration},
	"repetition-rate":  {1e-4, 1e12},
	"angular-subtense": {0, 1}, // past α_max = 0.1 rad nothing changes
	"power":            {1e-15, 1e15},
	"beam-diameter":    {1e-6, 10},
	"divergence":       {1e-7, 1},
}

// flagQuantity reads a flag's quantity; an empty flag gives ok = false.
func flagQuantity(name, v string, dim budget.Dimension) (float64, bool, error) {
	if v == "" {
		return 0, false, nil
	}
	q, err := budget.ParseAs(v, dim)
	if err != nil {
		return 0, false, fmt.Errorf("--%s: %w", name, err)
	}
	if q < 0 || (q == 0 && name != "angular-subtense") {
		return 0, false, fmt.Errorf("--%s: must be positive, got %q", name, v)
	}
	if r, ok := flagRange[name]; ok && (q < r[0] || q > r[1]) && q != 0 {
		return 0, false, fmt.Errorf("--%s: %q is outside %g to %g in SI units, the range this flag takes", name, v, r[0], r[1])
	}
	return q, true, nil
}

type limitsResult struct {
	WavelengthM float64            `json:"wavelength_m"`
	DurationS   float64            `json:"duration_s"`
	Angular     float64            `json:"angular_subtense_rad"`
	Standard    string             `json:"standard"`
	Eye         limitsSide         `json:"eye"`
	Skin        limitsSide         `json:"skin"`
	AEL         limitsAEL          `json:"ael_w"`
	AELTimeBase float64            `json:"ael_time_base_s"`
	Factors     map[string]float64 `json:"factors"`
	Pulsed      *limitsPulsed      `json:"pulsed,omitempty"`
	Class       *string            `json:"class,omitempty"`
	NOHDM       *float64           `json:"nohd_m,omitempty"`
	NOHDBeyondM *float64           `json:"nohd_beyond_m,omitempty"`
	ODRequired  *float64           `json:"od_required,omitempty"`
	ExitIrr     *float64           `json:"exit_aperture_irradiance_w_m2,omitempty"`
	Cautions    []string           `json:"cautions"`
}

type limitsSide struct {
	MPEIrradianceWM2      float64 `json:"mpe_irradiance_w_m2"`
	MPERadiantExposureJM2 float64 `json:"mpe_radiant_exposure_j_m2"`
	ApertureDiameterM     float64 `json:"aperture_diameter_m"`
	Rule                  string  `json:"rule"`
	Effect                string  `json:"effect"`
}

type limitsAEL struct {
	Class1  float64  `json:"class_1"`
	Class2  *float64 `json:"class_2"`
	Class3R *float64 `json:"class_3r"`
	Class3B float64  `json:"class_3b"`
}

type limitsPulsed struct {
	PulseDurationS         float64 `json:"pulse_duration_s"`
	RepetitionRateHz       float64 `json:"repetition_rate_hz"`
	Pulses                 float64 `json:"pulses"`
	C5                     float64 `json:"c5"`
	PerPulseJM2            float64 `json:"mpe_per_pulse_j_m2"`
	Rule                   string  `json:"governing_rule"`
	AverageIrradianceLimit float64 `json:"mpe_average_irradiance_w_m2"`
}

func (e *env) runLimits(o *limitsOptions) error {
	r, err := computeLimits(o)
	if err != nil {
		return err
	}
	if o.json {
		enc := json.NewEncoder(e.stdout)
		enc.SetIndent("", "  ")
		enc.SetEscapeHTML(false)
		return enc.Encode(r)
	}
	return writeLimits(e.stdout, r)
}

func computeLimits(o *limitsOptions) (*limitsResult, error) {
	λ, ok, err := flagQuantity("wavelength", o.wavelength, budget.Length)
	if err != nil {
		return nil, err
	}
	if !ok {
		return nil, fmt.Errorf("--wavelength is required")
	}
	t, ok, err := flagQuantity("duration", o.duration, budget.Time)
	if err != nil {
		return nil, err
	}
	if !ok {
		t = safety.DefaultDuration(λ)
	}
	α, _, err := flagQuantity("angular-subtense", o.angularSubtense, budget.Angle)
	if err != nil {
		return nil, err
	}
	eye, err := limits.EyeMPE(λ, t, α)
	if err != nil {
		return nil, err
	}
	skin, err := limits.SkinMPE(λ, t)
	if err != nil {
		return nil, err
	}
	eyeAp, _ := limits.EyeAperture(λ, t)
	skinAp, _ := limits.SkinAperture(λ, t)
	ael, err := limits.ContinuousAEL(λ, α)
	if err != nil {
		return nil, err
	}
	res := &limitsResult{
		WavelengthM: λ, DurationS: t, Angular: α, Standard: safety.Standard,
		Eye:         limitsSide{eye.Irradiance, eye.RadiantExposure, eyeAp, eye.Rule, eye.Effect},
		Skin:        limitsSide{skin.Irradiance, skin.RadiantExposure, skinAp, skin.Rule, skin.Effect},
		AEL:         limitsAEL{ael.Class1, nonNaN(ael.Class2), nonNaN(ael.Class3R), ael.Class3B},
		AELTimeBase: ael.TimeBase, Cautions: view.Cautions, Factors: eye.Factors,
	}
	if res.Factors == nil {
		res.Factors = map[string]float64{}
	}
	limitIrr := eye.Irradiance
	τ, hasτ, err := flagQuantity("pulse-duration", o.pulseDuration, budget.Time)
	if err != nil {
		return nil, err
	}
	f, hasF, err := flagQuantity("repetition-rate", o.repetitionRate, budget.Frequency)
	if err != nil {
		return nil, err
	}
	if hasτ != hasF {
		return nil, fmt.Errorf("--pulse-duration and --repetition-rate go together")
	}
	if hasτ && τ*f > 1 {
		return nil, fmt.Errorf("--repetition-rate %q with --pulse-duration %q is a duty cycle above 1", o.repetitionRate, o.pulseDuration)
	}
	if hasτ && τ > t {
		return nil, fmt.Errorf("--pulse-duration %q is longer than the exposure %s", o.pulseDuration, budget.FormatSI(t, "s"))
	}
	if hasτ {
		p, err := limits.PulsedEyeMPE(λ, τ, f, t, α)
		if err != nil {
			return nil, err
		}
		res.Pulsed = &limitsPulsed{τ, f, p.N, p.C5, p.PerPulse, p.Rule, p.Irradiance}
		limitIrr = p.Irradiance
	}
	p, hasP, err := flagQuantity("power", o.power, budget.Power)
	if err != nil {
		return nil, err
	}
	d, hasD, err := flagQuantity("beam-diameter", o.beamDiameter, budget.Length)
	if err != nil {
		return nil, err
	}
	φ, hasφ, err := flagQuantity("divergence", o.divergence, budget.Angle)
	if err != nil {
		return nil, err
	}
	if hasP != hasD || hasP != hasφ {
		return nil, fmt.Errorf("--power, --beam-diameter and --divergence go together")
	}
	if hasP {
		if !hasτ {
			c := limits.ClassOf(p, ael)
			res.Class = &c
		}
		if n := limits.NOHD(p, d, φ, limitIrr); n > safety.MaxHazardDistance {
			beyond := safety.MaxHazardDistance
			res.NOHDBeyondM = &beyond
		} else {
			res.NOHDM = &n
		}
		exit := limits.ApertureAverage(p, d/2, eyeAp)
		od := limits.OpticalDensity(exit / limitIrr)
		res.ExitIrr, res.ODRequired = &exit, &od
	}
	return res, nil
}

func nonNaN(v float64) *float64 {
	if math.IsNaN(v) {
		return nil
	}
	return &v
}

func writeLimits(w io.Writer, r *limitsResult) error {
	src := "a small source (α ≤ 1.5 mrad)"
	if r.Angular > limits.AlphaMin {
		src = fmt.Sprintf("a source of angular subtense %s", budget.FormatSI(r.Angular, "rad"))
	}
	var err error
	p := func(format string, args ...any) {
		if err == nil {
			_, err = fmt.Fprintf(w, format, args...)
		}
	}
	p("%s limits at %s nm, exposure %s, %s\n", r.Standard, budget.FormatNumber(r.WavelengthM*1e9), budget.FormatSI(r.DurationS, "s"), src)
	for _, s := range []struct {
		name string
		v    limitsSide
	}{{"eye ", r.Eye}, {"skin", r.Skin}} {
		p("  %s MPE %s = %s (H = %s), averaged over a %s aperture; %s\n", s.name,
			budget.FormatSI(s.v.MPEIrradianceWM2, "W/m²"), budget.FormatIrradiance(s.v.MPEIrradianceWM2),
			budget.FormatSI(s.v.MPERadiantExposureJM2, "J/m²"), budget.FormatLength(s.v.ApertureDiameterM), s.v.Effect)
		p("       rule: %s\n", s.v.Rule)
	}
	if len(r.Factors) > 0 {
		p("  correction factors:")
		for _, k := range []string{"C1", "C2", "T1_s", "C3", "C4", "C6", "C7", "T2_s"} {
			if v, ok := r.Factors[k]; ok {
				p(" %s = %s", k, budget.FormatNumber(v))
			}
		}
		p("\n")
	}
	if pl := r.Pulsed; pl != nil {
		p("  pulse train: %s pulses of %s at %s over %s; C5 = %s; the %s rule governs: %s J/m² per pulse (average irradiance limit %s)\n",
			budget.FormatNumber(pl.Pulses), budget.FormatSI(pl.PulseDurationS, "s"), budget.FormatFrequency(pl.RepetitionRateHz), budget.FormatSI(r.DurationS, "s"),
			budget.FormatNumber(pl.C5), pl.Rule, budget.FormatNumber(pl.PerPulseJM2), budget.FormatIrradiance(pl.AverageIrradianceLimit))
	}
	opt := func(v *float64) string {
		if v == nil {
			return "none at this wavelength"
		}
		return budget.FormatPower(*v)
	}
	p("  AEL for continuous emission (MPE at the time base × aperture area; Class 1 time base %s): Class 1/1M %s, Class 2/2M %s, Class 3R %s, Class 3B %s\n",
		budget.FormatSI(r.AELTimeBase, "s"), budget.FormatPower(r.AEL.Class1), opt(r.AEL.Class2), opt(r.AEL.Class3R), budget.FormatPower(r.AEL.Class3B))
	if r.ExitIrr != nil {
		if r.Class != nil {
			p("  class %s (whole beam through the aperture; 1M/2M not distinguished)\n", *r.Class)
		} else {
			p("  class: not assessed for pulsed emission\n")
		}
		nohd := safety.FormatDistance(math.Inf(1))
		if r.NOHDM != nil {
			nohd = safety.FormatDistance(*r.NOHDM)
		}
		p("  at the exit: %s over the eye aperture, OD %g needed; NOHD %s (rounded up)\n",
			budget.FormatIrradiance(*r.ExitIrr), *r.ODRequired, nohd)
	}
	for _, c := range r.Cautions {
		p("  - %s\n", c)
	}
	return err
}
