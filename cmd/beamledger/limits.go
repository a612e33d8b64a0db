package main

import (
	"fmt"

	"github.com/spf13/cobra"

	"beamledger/budget/setup"
	"beamledger/budget/units"
	"beamledger/limits"
	"beamledger/safety"
	"beamledger/safety/view"
)

type limitsOptions struct {
	wavelength, duration, pulseDuration, repetitionRate, angularSubtense string
	power, beamDiameter, divergence                                      string
	set                                                                  string
	json                                                                 bool
}

func (e *env) newLimits() *cobra.Command {
	o := &limitsOptions{}
	cmd := &cobra.Command{
		Use:   "limits --wavelength λ [flags]",
		Short: "Look up exposure limits, AELs, and with a beam its NOHD, OD and class",
		Long: `limits looks up the maximum permissible exposure (MPE) for the eye and the
skin at one wavelength and exposure duration in both limit sets, IEC
60825-1:2014 (Edition 3) and the EU directive 2006/25/EC (Annex II), side by
side, and which governs (--limits: the stricter by default), with the
limiting aperture, the correction factors used and the accessible emission
limits (AEL) of the classes for continuous emission (IEC 60825-1:2014; the
directive has no classes).

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
	f.StringVar(&o.set, "limits", string(limits.SetStrictest), `the limit set that governs: "strictest", "IEC 60825-1:2014" or "2006/25/EC"`)
	f.BoolVar(&o.json, "json", false, "write JSON (SI units, unit-suffixed keys)")
	return cmd
}

// flagRange is the physical range of each flag, SI. A value outside it is
// refused: a divergence of 1e-320 rad or a power of 1e300 W describes no
// beam, and would only give a meaningless figure.
var flagRange = map[string][2]float64{
	"wavelength":       {setup.MinWavelength, setup.MaxWavelength},
	"duration":         {limits.MinDuration, limits.MaxDuration},
	"pulse-duration":   {limits.MinDuration, limits.MaxDuration},
	"repetition-rate":  {1e-4, 1e12},
	"angular-subtense": {0, 1}, // past α_max = 0.1 rad nothing changes
	"power":            {1e-15, 1e15},
	"beam-diameter":    {1e-6, 10},
	"divergence":       {1e-7, 1},
}

// flagQuantity reads a flag's quantity; an empty flag gives ok = false.
func flagQuantity(name, v string, dim units.Dimension) (float64, bool, error) {
	if v == "" {
		return 0, false, nil
	}
	q, err := units.ParseAs(v, dim)
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

func (e *env) runLimits(o *limitsOptions) error {
	q, err := limitsQuery(o)
	if err != nil {
		return err
	}
	l, err := safety.LookUpLimits(q)
	if err != nil {
		return err
	}
	d := view.Limits(l)
	if o.json {
		return view.WriteJSON(e.stdout, d.JSON)
	}
	return view.WriteText(e.stdout, d)
}

// limitsQuery reads the flags into a query.
func limitsQuery(o *limitsOptions) (safety.LimitsQuery, error) {
	var q safety.LimitsQuery
	λ, ok, err := flagQuantity("wavelength", o.wavelength, units.Length)
	if err != nil {
		return q, err
	}
	if !ok {
		return q, fmt.Errorf("--wavelength is required")
	}
	q.Wavelength = λ
	if q.Set, err = limits.ParseLimitSet(o.set); err != nil {
		return q, fmt.Errorf("--limits: %w", err)
	}
	for _, f := range []struct {
		name, value string
		dim         units.Dimension
		to          *float64
	}{
		{"duration", o.duration, units.Time, &q.Duration},
		{"angular-subtense", o.angularSubtense, units.Angle, &q.AngularSubtense},
		{"pulse-duration", o.pulseDuration, units.Time, &q.PulseDuration},
		{"repetition-rate", o.repetitionRate, units.Frequency, &q.RepetitionRate},
		{"power", o.power, units.Power, &q.Power},
		{"beam-diameter", o.beamDiameter, units.Length, &q.BeamDiameter},
		{"divergence", o.divergence, units.Angle, &q.Divergence},
	} {
		if *f.to, _, err = flagQuantity(f.name, f.value, f.dim); err != nil {
			return q, err
		}
	}
	return q, nil
}
