package limits

import (
	"fmt"
	"math"
)

// StandardDirective is the second limit set: the exposure limit values for
// laser radiation of the EU directive on artificial optical radiation.
const StandardDirective = "Directive 2006/25/EC, Annex II"

// Tables of the directive's Annex II.
const (
	TableDirEyeShort   = "Table 2.2, eye, exposures below 10 s"
	TableDirEyeLong    = "Table 2.3, eye, exposures from 10 s"
	TableDirSkin       = "Table 2.4, skin"
	TableDirRepetitive = "Table 2.6, repetitive exposure"
)

// directiveMemory is a row of the directive transcribed from memory of its
// printed table.
func directiveMemory(table, row string) Provenance {
	return Provenance{Standard: StandardDirective, Table: table, Row: row, Status: StatusFromMemory}
}

// CE is the directive's C_E: 1 for α ≤ α_min, α/α_min up to α_max =
// 100 mrad, α²/(α_min α_max) beyond (Directive 2006/25/EC Annex II
// Table 2.5; unlike Edition 3's C6, α_max does not depend on the duration).
func CE(α float64) float64 {
	const αmax = 0.1
	switch {
	case α <= AlphaMin:
		return 1
	case α <= αmax:
		return α / AlphaMin
	}
	return α * α / (AlphaMin * αmax)
}

// DirectiveEyeMPE is the directive's exposure limit value at the cornea for
// a single exposure of duration t (s) at wavelength λ (m) from a source of
// angular subtense α (rad). Outside 400–1400 nm and for the photochemical
// limit its rows are the rows of Edition 3 (the same expressions; the
// provenance names the directive's table). In 400–1400 nm below 10 s it
// has rows of its own: a ramp 2.7e4 t^0.75 C_E J/m² from 10 ps to 1 ns and
// a plateau 5e-3 C_E J/m² to 18 µs (×10, C_C and 50 µs in 1050–1400 nm),
// where Edition 3 prints a plateau of 2e-3 from 10 ps to 5 µs.
func DirectiveEyeMPE(λ, t, α float64) (Limit, error) {
	if err := checkRange(λ, t); err != nil {
		return Limit{}, err
	}
	if α < 0 || math.IsNaN(α) || math.IsInf(α, 0) {
		return Limit{}, &RangeError{"angular subtense", fmt.Sprint(α), "α ≥ 0"}
	}
	nm := λ * 1e9
	table := TableDirEyeShort
	if t >= 10 {
		table = TableDirEyeLong
	}
	var l Limit
	switch {
	case nm < 400:
		l = relabel(uv(nm, t), table)
	case nm < 1400:
		l = directiveRetinal(nm, t, α)
		if ph, ok := retinalPhotochemical(nm, t); ok && ph.RadiantExposure < l.RadiantExposure {
			l = relabel(ph, table)
		}
	default:
		l = relabel(infrared(nm, t), table)
	}
	l.Set = SetDirective
	return l, nil
}

// relabel gives a row the directive shares with Edition 3 the directive's
// provenance.
func relabel(l Limit, table string) Limit {
	l.Provenance = directiveMemory(table, l.Provenance.Row)
	return l
}

// directiveRetinal is the directive's retinal thermal limit in 400–1400 nm.
// C_A is C4, C_C is C7 and C_E is CE (α_max = 100 mrad); in 1050–1400 nm
// C_A = 5 is folded into the printed numbers, as in Edition 3.
func directiveRetinal(nm, t, α float64) Limit {
	c4, ce, c7, t2 := C4(nm), CE(α), C7(nm), T2(α)
	f := map[string]float64{"C4": c4, "C6": ce, "C7": c7, "T2_s": t2}
	const eff = "retinal thermal"
	band, sub, ramp, plateau, knee, law := "400–700 nm", 1.5e-4, 2.7e4, 5e-3, 1.8e-5, 18.0
	k, expr := ce, "C_E"
	switch {
	case nm >= 1050:
		band, sub, ramp, plateau, knee, law = "1050–1400 nm", 1.5e-3, 2.7e5, 5e-2, 5e-5, 90
		k, expr = c7*ce, "C_C C_E"
	case nm >= 700:
		band = "700–1050 nm"
		k, expr = c4*ce, "C_A C_E"
	}
	row := func(span string) Provenance { return directiveMemory(TableDirEyeShort, band+", "+span) }
	switch {
	case t < 1e-11:
		return fromH(sub*k, t, fmt.Sprintf("%s, 1e-13 s ≤ t < 1e-11 s: H = %g %s J/m²", band, sub, expr), eff, true, f, row("1e-13 s to 1e-11 s"))
	case t < 1e-9:
		return fromH(ramp*math.Pow(t, 0.75)*k, t, fmt.Sprintf("%s, 1e-11 s ≤ t < 1e-9 s: H = %g t^0.75 %s J/m²", band, ramp, expr), eff, true, f, row("1e-11 s to 1e-9 s"))
	case t < knee:
		return fromH(plateau*k, t, fmt.Sprintf("%s, 1e-9 s ≤ t < %g s: H = %g %s J/m²", band, knee, plateau, expr), eff, true, f, row(fmt.Sprintf("1e-9 s to %g s", knee)))
	case t < 10:
		return fromH(law*math.Pow(t, 0.75)*k, t, fmt.Sprintf("%s, %g s ≤ t < 10 s: H = %g t^0.75 %s J/m²", band, knee, law, expr), eff, true, f, row(fmt.Sprintf("%g s to 10 s", knee)))
	}
	return retinalFrom10s(t, α, f, "C_A C_C", "C_A C_C C_E", func(span string) Provenance { return directiveMemory(TableDirEyeLong, "400–1400 nm, "+span) })
}

// DirectiveSkinMPE is the directive's exposure limit value for the skin: the
// rows of Edition 3's skin table (C_A = C4), with the directive's
// provenance.
func DirectiveSkinMPE(λ, t float64) (Limit, error) {
	l, err := skinMPE(λ, t)
	if err != nil {
		return Limit{}, err
	}
	l = relabel(l, TableDirSkin)
	l.Set = SetDirective
	return l, nil
}

// DirectivePulsedEyeMPE applies the directive's three rules for repetitive
// exposure (Table 2.6) with its own limits: every pulse against the single-
// pulse limit (pulses within T_min as one), every group against the limit
// for its duration, and for thermal limits every pulse against C_P =
// N^−0.25 times the single-pulse limit, N every pulse (or group of T_min)
// of the exposure, whatever the pulse duration.
func DirectivePulsedEyeMPE(λ, τ, f, T, α float64) (PulsedLimit, error) {
	return pulseRules(λ, τ, f, T, α, directiveTrain)
}

var directiveTrain = trainRules{
	set: SetDirective, eye: DirectiveEyeMPE,
	rules: func() Provenance {
		p := checked(TableDirRepetitive, "rules 1–3, C_P = N^−0.25 with N every pulse of the exposure", SourceDirectiveRepetitive)
		p.Standard = StandardDirective
		return p
	},
	note: "C_P = N^−0.25 as the directive prints it, N every pulse (or group of T_min) of the exposure",
}
