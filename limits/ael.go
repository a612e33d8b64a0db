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
// they differ only in how the emission is measured.
type AEL struct {
	Class1, Class2, Class3R, Class3B float64
	// TimeBase is the duration behind Class 1, s.
	TimeBase float64
}

// ContinuousAEL returns the AELs at wavelength λ (m) for a source of angular
// subtense α (rad), each derived as the MPE irradiance at the class's time
// base times the area of the limiting aperture.
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
	p1, err := apertureLimit(λ, base, α)
	if err != nil {
		return AEL{}, err
	}
	a.Class1 = p1
	if nm >= 400 && nm <= 700 {
		p2, err := apertureLimit(λ, TimeBaseClass2, α)
		if err != nil {
			return AEL{}, err
		}
		a.Class2 = math.Max(p2, p1)
		a.Class3R = 5 * a.Class2
	} else if nm >= 302.5 {
		a.Class3R = 5 * a.Class1
	}
	a.Class3B = class3BVisibleIR
	if nm < 315 {
		a.Class3B = class3BUV
	}
	return a, nil
}

// apertureLimit is the MPE irradiance at duration t times the area of the
// eye's limiting aperture, W.
func apertureLimit(λ, t, α float64) (float64, error) {
	l, err := EyeMPE(λ, t, α)
	if err != nil {
		return 0, err
	}
	d, err := EyeAperture(λ, t)
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

// PulsedLimit is the MPE per pulse of a train, J/m², under the three rules
// for repetitive pulses: (1) a single pulse against the MPE for its duration;
// (2) the average over the exposure T against the MPE for T, shared among
// its N = f·T pulses; (3) in 400 nm – 1 mm, each pulse against C5 times the
// single-pulse MPE. The lowest governs.
type PulsedLimit struct {
	PerPulse   float64 // J/m²
	Rule       string  // which rule governs
	N          float64
	C5         float64
	Single     Limit
	Average    Limit
	Irradiance float64 // the per-pulse limit × f, W/m²
}

// PulsedEyeMPE applies the repetitive-pulse rules at the eye for pulses of
// duration τ (s) at rate f (Hz) over an exposure of T (s).
func PulsedEyeMPE(λ, τ, f, T, α float64) (PulsedLimit, error) {
	single, err := EyeMPE(λ, τ, α)
	if err != nil {
		return PulsedLimit{}, err
	}
	avg, err := EyeMPE(λ, T, α)
	if err != nil {
		return PulsedLimit{}, err
	}
	if !(f > 0) || τ*f > 1 {
		return PulsedLimit{}, &RangeError{"repetition rate", fmt.Sprintf("%g Hz", f), "0 < f ≤ 1/τ"}
	}
	n := math.Max(1, f*T)
	p := PulsedLimit{N: n, C5: 1, Single: single, Average: avg}
	p.PerPulse, p.Rule = single.RadiantExposure, "single pulse"
	if h := avg.RadiantExposure / n; h < p.PerPulse {
		p.PerPulse, p.Rule = h, "average power"
	}
	if λ >= 400e-9 {
		p.C5 = C5(n)
		if h := p.C5 * single.RadiantExposure; h < p.PerPulse {
			p.PerPulse, p.Rule = h, "pulse train (C5)"
		}
	}
	p.Irradiance = p.PerPulse * f
	return p, nil
}
