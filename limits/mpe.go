package limits

import (
	"fmt"
	"math"
)

// Limit is an MPE for one exposure duration, with where it came from.
type Limit struct {
	// RadiantExposure H (J/m²) and Irradiance E = H/t (W/m²) over the
	// duration; both are given whichever form the table uses.
	RadiantExposure float64
	Irradiance      float64
	// Rule names the table band and expression.
	Rule string
	// Effect is "retinal thermal", "retinal photochemical", "corneal (UV)", …
	Effect string
	// Thermal is set for limits against thermal injury (the only ones the
	// pulse-train factor C5 applies to).
	Thermal    bool
	Factors    map[string]float64
	Provenance Provenance
	// Set is the limit set the value comes from (SetIEC or SetDirective;
	// SetBoth where a strictest choice found the two equal).
	Set LimitSet
}

func fromH(h, t float64, rule, effect string, thermal bool, f map[string]float64, p Provenance) Limit {
	return Limit{RadiantExposure: h, Irradiance: h / t, Rule: rule, Effect: effect, Thermal: thermal, Factors: f, Provenance: p}
}

func fromE(e, t float64, rule, effect string, thermal bool, f map[string]float64, p Provenance) Limit {
	return Limit{RadiantExposure: e * t, Irradiance: e, Rule: rule, Effect: effect, Thermal: thermal, Factors: f, Provenance: p}
}

// uv is the eye and skin limit for 180–400 nm (the skin table has the same
// values).
func uv(nm, t float64) Limit {
	if t < 1e-9 {
		return fromE(3e10, t, "180–400 nm, 1e-13 s ≤ t < 1e-9 s: E = 3e10 W/m²", "corneal (UV)", nm >= 315, nil,
			memory(TableEyeShort, "180–400 nm, 1e-13 s to 1e-9 s"))
	}
	switch {
	case nm < 302.5:
		// The reprint prints 30 J/m² for 180–315 nm from 1 ns to 0.3 ms
		// and 1e-3 W/m² (30 J/m² over 3e4 s) for a day.
		return fromH(30, t, "180–302.5 nm, 1e-9 s ≤ t ≤ 3e4 s: H = 30 J/m²", "corneal (UV photochemical)", false, nil,
			earlier(TableEyeShort, "180–302.5 nm, 1e-9 s to 3e4 s", SourceSimplifiedMPE))
	case nm < 315:
		c1, c2, t1 := C1(t), C2(nm), T1(nm)
		f := map[string]float64{"C1": c1, "C2": c2, "T1_s": t1}
		if t <= t1 {
			return fromH(c1, t, "302.5–315 nm, 1e-9 s ≤ t ≤ T1: H = C1 = 5.6e3 t^0.25 J/m²", "corneal (UV thermal)", true, f,
				memory(TableEyeShort, "302.5–315 nm, 1e-9 s to T1"))
		}
		return fromH(c2, t, "302.5–315 nm, T1 < t ≤ 3e4 s: H = C2 = 10^(0.2(λ−295)) J/m²", "corneal (UV photochemical)", false, f,
			memory(TableEyeShort, "302.5–315 nm, T1 to 3e4 s"))
	}
	switch {
	case t < 10:
		return fromH(C1(t), t, "315–400 nm, 1e-9 s ≤ t < 10 s: H = C1 = 5.6e3 t^0.25 J/m²", "corneal and lens (UV thermal)", true, map[string]float64{"C1": C1(t)},
			memory(TableEyeShort, "315–400 nm, 1e-9 s to 10 s"))
	case t < 1e3:
		return fromH(1e4, t, "315–400 nm, 10 s ≤ t < 1e3 s: H = 1e4 J/m²", "corneal and lens (UV photochemical)", false, nil,
			memory(TableEyeLong, "315–400 nm, 10 s to 1e3 s"))
	}
	return fromE(10, t, "315–400 nm, 1e3 s ≤ t ≤ 3e4 s: E = 10 W/m²", "corneal and lens (UV photochemical)", false, nil,
		memory(TableEyeLong, "315–400 nm, 1e3 s to 3e4 s"))
}

// infrared is the eye and skin limit for 1400 nm – 1 mm (corneal; the skin
// table has the same values).
func infrared(nm, t float64) Limit {
	const eff = "corneal (infrared thermal)"
	switch {
	case nm < 1500 || (nm >= 1800 && nm < 2600):
		band := "1400–1500 nm"
		if nm >= 1800 {
			band = "1800–2600 nm"
		}
		switch {
		case t < 1e-9:
			return fromE(1e12, t, band+", 1e-13 s ≤ t < 1e-9 s: E = 1e12 W/m²", eff, true, nil, memory(TableEyeShort, band+", 1e-13 s to 1e-9 s"))
		case t < 1e-3:
			return fromH(1e3, t, band+", 1e-9 s ≤ t < 1e-3 s: H = 1e3 J/m²", eff, true, nil, memory(TableEyeShort, band+", 1e-9 s to 1e-3 s"))
		case t < 10:
			return fromH(5.6e3*math.Pow(t, 0.25), t, band+", 1e-3 s ≤ t < 10 s: H = 5.6e3 t^0.25 J/m²", eff, true, nil, memory(TableEyeShort, band+", 1e-3 s to 10 s"))
		}
		return fromE(1000, t, band+", 10 s ≤ t ≤ 3e4 s: E = 1000 W/m²", eff, true, nil, memory(TableEyeLong, "1400 nm–1 mm, 10 s to 3e4 s"))
	case nm < 1800:
		switch {
		case t < 1e-9:
			return fromE(1e13, t, "1500–1800 nm, 1e-13 s ≤ t < 1e-9 s: E = 1e13 W/m²", eff, true, nil, memory(TableEyeShort, "1500–1800 nm, 1e-13 s to 1e-9 s"))
		case t < 10:
			return fromH(1e4, t, "1500–1800 nm, 1e-9 s ≤ t < 10 s: H = 1e4 J/m²", eff, true, nil, memory(TableEyeShort, "1500–1800 nm, 1e-9 s to 10 s"))
		}
		return fromE(1000, t, "1500–1800 nm, 10 s ≤ t ≤ 3e4 s: E = 1000 W/m²", eff, true, nil, memory(TableEyeLong, "1400 nm–1 mm, 10 s to 3e4 s"))
	}
	switch {
	case t < 1e-9:
		// The reprint's 1400 nm – 1 mm values below 1 ns (1e11 W/m²) and
		// from 1 ns (100 J/m²) are this band's rows.
		return fromE(1e11, t, "2600 nm–1 mm, 1e-13 s ≤ t < 1e-9 s: E = 1e11 W/m²", eff, true, nil, earlier(TableEyeShort, "2600 nm–1 mm, 1e-13 s to 1e-9 s", SourceSimplifiedMPE))
	case t < 1e-7:
		return fromH(100, t, "2600 nm–1 mm, 1e-9 s ≤ t < 1e-7 s: H = 100 J/m²", eff, true, nil, earlier(TableEyeShort, "2600 nm–1 mm, 1e-9 s to 1e-7 s", SourceSimplifiedMPE))
	case t < 10:
		return fromH(5.6e3*math.Pow(t, 0.25), t, "2600 nm–1 mm, 1e-7 s ≤ t < 10 s: H = 5.6e3 t^0.25 J/m²", eff, true, nil, memory(TableEyeShort, "2600 nm–1 mm, 1e-7 s to 10 s"))
	}
	return fromE(1000, t, "2600 nm–1 mm, 10 s ≤ t ≤ 3e4 s: E = 1000 W/m²", eff, true, nil, memory(TableEyeLong, "1400 nm–1 mm, 10 s to 3e4 s"))
}

// retinalThermal is the 400–1400 nm thermal limit at the cornea for a source
// of angular subtense α, as Edition 3 prints it: a sub-nanosecond row
// (1e-13 to 1e-11 s), a plateau up to 5 µs (400–1050 nm) or 13 µs
// (1050–1400 nm), the t^0.75 law up to 10 s, and from 10 s a constant
// irradiance: 10 C4 C7 W/m² for a small source, 18 C4 C6 C7 T2^−0.25 W/m²
// for an extended one (with the t^0.75 law up to T2).
func retinalThermal(nm, t, α float64) Limit {
	c4, c6, c7, t2 := C4(nm), C6(α, t), C7(nm), T2(α)
	f := map[string]float64{"C4": c4, "C6": c6, "C7": c7, "T2_s": t2}
	const eff = "retinal thermal"
	band, sub, plateau, knee, law := "400–700 nm", 1.5e-4, 2e-3, 5e-6, 18.0
	k := c6 // the factors the band's expressions carry
	expr := "C6"
	switch {
	case nm >= 1050:
		// C4 = 5 is folded into the printed numbers of this band.
		band, sub, plateau, knee, law = "1050–1400 nm", 1.5e-3, 2e-2, 1.3e-5, 90
		k, expr = c6*c7, "C6 C7"
	case nm >= 700:
		band = "700–1050 nm"
		k, expr = c4*c6, "C4 C6"
	}
	row := func(span string) Provenance { return memory(TableEyeShort, band+", "+span) }
	switch {
	case t < 1e-11:
		return fromH(sub*k, t, fmt.Sprintf("%s, 1e-13 s ≤ t < 1e-11 s: H = %g %s J/m²", band, sub, expr), eff, true, f, row("1e-13 s to 1e-11 s"))
	case t < knee:
		return fromH(plateau*k, t, fmt.Sprintf("%s, 1e-11 s ≤ t < %g s: H = %g %s J/m²", band, knee, plateau, expr), eff, true, f, row(fmt.Sprintf("1e-11 s to %g s", knee)))
	case t < 10:
		return fromH(law*math.Pow(t, 0.75)*k, t, fmt.Sprintf("%s, %g s ≤ t < 10 s: H = %g t^0.75 %s J/m²", band, knee, law, expr), eff, true, f, row(fmt.Sprintf("%g s to 10 s", knee)))
	}
	return retinalFrom10s(t, α, f, "C4 C7", "C4 C6 C7", func(span string) Provenance { return memory(TableEyeLong, "400–1400 nm, "+span) })
}

// retinalFrom10s is the 400–1400 nm thermal limit from 10 s with the
// factors f holds (C6 is Edition 3's C6 or the directive's C_E; the two
// agree from 0.25 s up to 100 mrad): 10 C4 C7 W/m² for a small source,
// 18 t^0.75 C4 C6 C7 J/m² up to T2 and 18 C4 C6 C7 T2^−0.25 W/m² beyond
// for an extended one. small and extended name the factors in the rules.
func retinalFrom10s(t, α float64, f map[string]float64, small, extended string, row func(string) Provenance) Limit {
	const eff = "retinal thermal"
	c4, c6, c7, t2 := f["C4"], f["C6"], f["C7"], f["T2_s"]
	if α <= AlphaMin {
		return fromE(10*c4*c7, t, "400–1400 nm, 10 s ≤ t ≤ 3e4 s, α ≤ 1.5 mrad: E = 10 "+small+" W/m²", eff, true, f, row("10 s to 3e4 s, α ≤ 1.5 mrad"))
	}
	if t < t2 {
		return fromH(18*math.Pow(t, 0.75)*c4*c6*c7, t, "400–1400 nm, 10 s ≤ t < T2, α > 1.5 mrad: H = 18 t^0.75 "+extended+" J/m²", eff, true, f, row("10 s to T2, α > 1.5 mrad"))
	}
	return fromE(18*c4*c6*c7*math.Pow(t2, -0.25), t, "400–1400 nm, T2 ≤ t ≤ 3e4 s, α > 1.5 mrad: E = 18 "+extended+" T2^−0.25 W/m²", eff, true, f, row("T2 to 3e4 s, α > 1.5 mrad"))
}

// retinalPhotochemical is the 400–600 nm limit from 10 s for a small source:
// H = 100 C3 J/m² up to 100 s (measured over a field of view γ = 11 mrad),
// then E = 1 C3 W/m² to 3e4 s (γ = 1.1 t^0.5 mrad up to 1e4 s, 110 mrad
// beyond). It is applied to extended sources unrelaxed (conservative).
func retinalPhotochemical(nm, t float64) (Limit, bool) {
	if nm >= 600 || t < 10 {
		return Limit{}, false
	}
	c3 := C3(nm)
	f := map[string]float64{"C3": c3, "gamma_rad": Gamma(t)}
	const eff = "retinal photochemical"
	if t < 100 {
		return fromH(100*c3, t, "400–600 nm, 10 s ≤ t < 100 s: H = 100 C3 J/m² (γ = 11 mrad)", eff, false, f,
			memory(TableEyeLong, "400–600 nm photochemical, 10 s to 100 s")), true
	}
	return fromE(c3, t, "400–600 nm, 100 s ≤ t ≤ 3e4 s: E = 1 C3 W/m² (γ = 1.1 t^0.5 mrad, at most 110 mrad)", eff, false, f,
		memory(TableEyeLong, "400–600 nm photochemical, 100 s to 3e4 s")), true
}

// EyeMPE is the MPE at the cornea for a single exposure of duration t (s) at
// wavelength λ (m) from a source of angular subtense α (rad; anything up to
// 1.5 mrad is a small source). In 400–600 nm for t ≥ 10 s the thermal and
// the photochemical limits both apply and the lower is returned.
//
// Band edges. The tables print each band with two figures and neighbouring
// bands do not always meet (18 t^0.75 at 5 µs is 1.90e-3 J/m² against the
// 2e-3 J/m² printed before it). This package prints what the tables print:
// A duration on an edge belongs to the band that starts there, and nothing
// is blended for continuity.
func EyeMPE(λ, t, α float64) (Limit, error) {
	if err := checkRange(λ, t); err != nil {
		return Limit{}, err
	}
	if α < 0 || math.IsNaN(α) || math.IsInf(α, 0) {
		return Limit{}, &RangeError{"angular subtense", fmt.Sprint(α), "α ≥ 0"}
	}
	nm := λ * 1e9
	var l Limit
	switch {
	case nm < 400:
		l = uv(nm, t)
	case nm < 1400:
		l = retinalThermal(nm, t, α)
		if ph, ok := retinalPhotochemical(nm, t); ok && ph.RadiantExposure < l.RadiantExposure {
			l = ph
		}
	default:
		l = infrared(nm, t)
	}
	l.Set = SetIEC
	return l, nil
}

// SkinMPE is the MPE for the skin (IEC 60825-1:2014, Annex A, skin table;
// from memory).
func SkinMPE(λ, t float64) (Limit, error) {
	l, err := skinMPE(λ, t)
	l.Set = SetIEC
	return l, err
}

func skinMPE(λ, t float64) (Limit, error) {
	if err := checkRange(λ, t); err != nil {
		return Limit{}, err
	}
	nm := λ * 1e9
	switch {
	case nm < 400:
		l := uv(nm, t)
		l.Effect = "skin (UV)"
		l.Provenance.Table = TableSkin
		return l, nil
	case nm < 1400:
		c4 := C4(nm)
		f := map[string]float64{"C4": c4}
		const eff = "skin (thermal)"
		switch {
		case t < 1e-9:
			return fromE(2e11*c4, t, "400–1400 nm, 1e-13 s ≤ t < 1e-9 s: E = 2e11 C4 W/m²", eff, true, f, memory(TableSkin, "400–1400 nm, 1e-13 s to 1e-9 s")), nil
		case t < 1e-7:
			return fromH(200*c4, t, "400–1400 nm, 1e-9 s ≤ t < 1e-7 s: H = 200 C4 J/m²", eff, true, f, memory(TableSkin, "400–1400 nm, 1e-9 s to 1e-7 s")), nil
		case t < 10:
			return fromH(1.1e4*c4*math.Pow(t, 0.25), t, "400–1400 nm, 1e-7 s ≤ t < 10 s: H = 1.1e4 C4 t^0.25 J/m²", eff, true, f, memory(TableSkin, "400–1400 nm, 1e-7 s to 10 s")), nil
		}
		return fromE(2000*c4, t, "400–1400 nm, 10 s ≤ t ≤ 3e4 s: E = 2000 C4 W/m²", eff, true, f, memory(TableSkin, "400–1400 nm, 10 s to 3e4 s")), nil
	}
	l := infrared(nm, t)
	l.Effect = "skin (infrared)"
	l.Provenance.Table = TableSkin
	return l, nil
}

// EyeAperture is the diameter (m) of the limiting aperture over which
// irradiance at the eye is averaged: 1 mm in 180–400 nm, 7 mm in 400–1400 nm,
// in 1400 nm–0.1 mm 1 mm for t < 0.35 s, 1.5 t^(3/8) mm up to 10 s and 3.5 mm
// beyond, and 11 mm in 0.1–1 mm; with the row it comes from.
func EyeAperture(λ, t float64) (float64, Provenance, error) {
	if err := checkRange(λ, t); err != nil {
		return 0, Provenance{}, err
	}
	nm := λ * 1e9
	switch {
	case nm < 400:
		return 1e-3, memory(TableApertures, "eye, 180–400 nm: 1 mm"), nil
	case nm < 1400:
		return 7e-3, memory(TableApertures, "eye, 400–1400 nm: 7 mm"), nil
	case nm < 1e5:
		switch {
		case t < 0.35:
			return 1e-3, memory(TableApertures, "eye, 1400 nm–0.1 mm, t < 0.35 s: 1 mm"), nil
		case t < 10:
			return 1.5e-3 * math.Pow(t, 3.0/8), memory(TableApertures, "eye, 1400 nm–0.1 mm, 0.35 s to 10 s: 1.5 t^(3/8) mm"), nil
		}
		return 3.5e-3, memory(TableApertures, "eye, 1400 nm–0.1 mm, t ≥ 10 s: 3.5 mm"), nil
	}
	return 11e-3, memory(TableApertures, "eye, 0.1–1 mm: 11 mm"), nil
}

// SkinAperture is 3.5 mm for 180 nm–0.1 mm and 11 mm for 0.1–1 mm.
func SkinAperture(λ, t float64) (float64, Provenance, error) {
	if err := checkRange(λ, t); err != nil {
		return 0, Provenance{}, err
	}
	if λ < 1e-4 {
		return 3.5e-3, memory(TableApertures, "skin, 180 nm–0.1 mm: 3.5 mm"), nil
	}
	return 11e-3, memory(TableApertures, "skin, 0.1–1 mm: 11 mm"), nil
}
