package limits

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"
)

// Printed values of IEC 60825-1:2014 (Edition 3), Annex A, transcribed from
// memory of the tables (the standard's text was not available; SAFETY.md
// says so): the package must give exactly what the row prints, to the
// printed precision (1e-5 relative on expressions evaluated by hand).
func TestEyeMPETable(t *testing.T) {
	rows := []struct {
		band  string
		nm, t float64
		α     float64
		h, e  float64 // printed value: H in J/m² or E in W/m² (one of them)
	}{
		{"Annex A, eye < 10 s, 180–302.5 nm, 1e-9 s to 3e4 s: 30 J/m² (from memory)", 250, 1, 0, 30, 0},
		{"Annex A, eye < 10 s, 180–400 nm, 1e-13 s to 1e-9 s: 3e10 W/m² (from memory)", 300, 1e-10, 0, 0, 3e10},
		{"Annex A, eye < 10 s, 302.5–315 nm, t > T1: C2 = 10^(0.2(λ−295)) = 398.1 J/m² at 308 nm (from memory)", 308, 10, 0, 398.1072, 0},
		{"Annex A, eye < 10 s, 315–400 nm, 1e-9 s to 10 s: C1 = 5.6e3 t^0.25 = 5600 J/m² at 1 s (from memory)", 355, 1, 0, 5600, 0},
		{"Annex A, eye < 10 s, 315–400 nm, at 1 ns the C1 row: 5.6e3 (1e-9)^0.25 = 31.49 J/m² (from memory)", 355, 1e-9, 0, 31.4912, 0},
		{"Annex A, eye ≥ 10 s, 315–400 nm, 10 s to 1e3 s: 1e4 J/m² as printed (from memory)", 355, 100, 0, 1e4, 0},
		{"Annex A, eye ≥ 10 s, 315–400 nm, 1e3 s to 3e4 s: 10 W/m² as printed (from memory)", 355, 3e4, 0, 0, 10},
		{"Annex A, eye < 10 s, 400–700 nm, 5e-6 s to 10 s: 18 t^0.75 = 6.364 J/m² at 0.25 s (from memory)", 633, 0.25, 0, 6.36396, 0},
		{"Annex A, eye < 10 s, 400–700 nm, 5e-6 s to 10 s: 18 t^0.75 = 0.1012 J/m² at 1 ms (from memory)", 532, 1e-3, 0, 0.101221, 0},
		{"Annex A, eye < 10 s, 400–700 nm, 1e-11 s to 5e-6 s: 2e-3 J/m², Edition 3 plateau as printed (from memory)", 633, 1e-6, 0, 2e-3, 0},
		{"Annex A, eye < 10 s, 400–700 nm, 1e-11 s to 5e-6 s: 2e-3 J/m² at 100 ps, no ramp (from memory)", 633, 1e-10, 0, 2e-3, 0},
		{"Annex A, eye < 10 s, 400–700 nm, 1e-13 s to 1e-11 s: 1.5e-4 J/m² (from memory)", 633, 1e-12, 0, 1.5e-4, 0},
		{"Annex A, eye ≥ 10 s, 400–700 nm, α ≤ 1.5 mrad: E = 10 W/m² as printed (from memory)", 633, 100, 0, 0, 10},
		{"Annex A, eye ≥ 10 s, 400–1400 nm, α > 1.5 mrad, t ≥ T2: 18 C6 T2^−0.25 W/m² at 10 mrad (from memory)", 633, 1000, 10e-3, 0, 18 * (10 / 1.5) * math.Pow(10*math.Pow(10, 8.5/98.5), -0.25)},
		{"Annex A, eye ≥ 10 s, 400–600 nm photochemical, 10 s to 100 s: 100 C3 J/m² (C3 = 1 at 450 nm) (from memory)", 450, 50, 0, 100, 0},
		{"Annex A, eye ≥ 10 s, 400–600 nm photochemical, 100 s to 3e4 s: E = 1 C3 W/m² at 405 nm, 1000 s (from memory)", 405, 1000, 0, 0, 1},
		{"Annex A, eye ≥ 10 s, 400–600 nm photochemical, 100 s to 3e4 s: E = 1 C3 W/m² at 450 nm, 3e4 s (from memory)", 450, 3e4, 0, 0, 1},
		{"Annex A, eye ≥ 10 s, 700–1400 nm, α ≤ 1.5 mrad: 10 C4 C7 W/m², C4 = 10^(0.002(780.24−700)) (from memory)", 780.24, 10, 0, 0, 14.4704},
		{"Annex A, eye ≥ 10 s, 1050–1400 nm, α ≤ 1.5 mrad: 10 C4 C7 = 50 W/m² at 1064 nm (from memory)", 1064, 10, 0, 0, 50},
		{"Annex A, eye < 10 s, 1050–1400 nm, 13 µs to 10 s: 90 t^0.75 C7 J/m² at 1 ms (from memory)", 1064, 1e-3, 0, 0.506107, 0},
		{"Annex A, eye < 10 s, 1050–1400 nm, 1e-11 s to 1.3e-5 s: 2e-2 C7 J/m², Edition 3 plateau (from memory)", 1064, 1e-6, 0, 2e-2, 0},
		{"Annex A, eye < 10 s, 1050–1400 nm, 1e-11 s to 1.3e-5 s: 2e-2 J/m² at 100 ps, no ramp (from memory)", 1064, 1e-10, 0, 2e-2, 0},
		{"Annex A, eye < 10 s, 1050–1400 nm, 1e-13 s to 1e-11 s: 1.5e-3 C7 J/m² (from memory)", 1064, 1e-12, 0, 1.5e-3, 0},
		{"Annex A, eye ≥ 10 s, 1200–1400 nm: 10 C4 C7 with C7 = 8 (Directive 2006/25/EC Annex II Table 2.5, C_C = 8 for 1200–1400 nm)", 1300, 10, 0, 0, 400},
		{"Annex A, eye < 10 s, 1400–1500 nm, 1e-9 s to 1e-3 s: 1e3 J/m² as printed (from memory)", 1450, 1e-6, 0, 1e3, 0},
		{"Annex A, eye < 10 s, 1400–1500 nm, 1e-3 s to 10 s: 5.6e3 t^0.25 J/m² at 1 s (from memory)", 1450, 1, 0, 5600, 0},
		{"Annex A, eye < 10 s, 1500–1800 nm, 1e-9 s to 10 s: 1e4 J/m² (from memory)", 1550, 1, 0, 1e4, 0},
		{"Annex A, eye ≥ 10 s, 1400 nm–1 mm, 10 s to 3e4 s: 1000 W/m² (1500–1800 nm) (from memory)", 1550, 10, 0, 0, 1000},
		{"Annex A, eye ≥ 10 s, 1400 nm–1 mm, 10 s to 3e4 s: 1000 W/m² as printed (2600 nm–1 mm) (from memory)", 10600, 100, 0, 0, 1000},
		{"Annex A, eye < 10 s, 2600 nm–1 mm, 1e-9 s to 1e-7 s: 100 J/m² as printed (from memory)", 10600, 1e-8, 0, 100, 0},
		{"Annex A, eye < 10 s, 2600 nm–1 mm, 1e-13 s to 1e-9 s: 1e11 W/m² as printed (from memory)", 10600, 1e-10, 0, 0, 1e11},
	}
	for _, r := range rows {
		t.Run(r.band, func(t *testing.T) {
			l, err := EyeMPE(r.nm*1e-9, r.t, r.α)
			if err != nil {
				t.Fatal(err)
			}
			checkPrinted(t, r.band, l, r.h, r.e)
			if l.Provenance.Table == "" || l.Provenance.Status == "" {
				t.Errorf("%s: no provenance (%+v)", r.band, l.Provenance)
			}
		})
	}
}

// checkPrinted compares a limit with a printed value, H (J/m²) when h > 0
// else E (W/m²), to 1e-5 relative.
func checkPrinted(t *testing.T, band string, l Limit, h, e float64) {
	t.Helper()
	got, want := l.RadiantExposure, h
	if h == 0 {
		got, want = l.Irradiance, e
	}
	if math.Abs(got-want) > 1e-5*want {
		t.Errorf("%s: %.6g, printed %.6g; rule %q", band, got, want, l.Rule)
	}
}

// Skin MPE rows as printed (IEC 60825-1:2014 Annex A, skin table, from
// memory; ANSI Z136.1 states the same 400–1400 nm values, 0.2 C_A W/cm² and
// 2 C_A × 10⁻² J/cm², also from memory).
func TestSkinMPETable(t *testing.T) {
	rows := []struct {
		band  string
		nm, t float64
		h, e  float64
	}{
		{"skin, 400–1400 nm, 1e-7 s to 10 s: 1.1e4 C4 t^0.25 = 1.1e4 J/m² at 1 s, 633 nm (from memory)", 633, 1, 1.1e4, 0},
		{"skin, 400–1400 nm, 10 s to 3e4 s: 2000 C4 W/m² as printed, 1064 nm (C4 = 5) (from memory)", 1064, 10, 0, 1e4},
		{"skin, 400–1400 nm, 10 s to 3e4 s: 2000 C4 W/m² as printed, 633 nm (from memory)", 633, 1000, 0, 2000},
		{"skin, 400–1400 nm, 1e-9 s to 1e-7 s: 200 C4 J/m² as printed (from memory)", 532, 1e-8, 200, 0},
		{"skin, 400–1400 nm, 1e-13 s to 1e-9 s: 2e11 C4 W/m² as printed (from memory)", 532, 1e-10, 0, 2e11},
		{"skin, 180–302.5 nm: 30 J/m² (from memory)", 250, 10, 30, 0},
		{"skin, 1500–1800 nm, 10 s to 3e4 s: 1000 W/m² (from memory)", 1550, 100, 0, 1000},
	}
	for _, r := range rows {
		t.Run(r.band, func(t *testing.T) {
			l, err := SkinMPE(r.nm*1e-9, r.t)
			if err != nil {
				t.Fatal(err)
			}
			checkPrinted(t, r.band, l, r.h, r.e)
			if l.Provenance.Table != TableSkin {
				t.Errorf("%s: provenance table %q", r.band, l.Provenance.Table)
			}
		})
	}
}

// The photochemical limit beyond 100 s is a constant irradiance of 1 C3
// W/m² (measured over γ = 1.1 t^0.5 mrad), not a constant dose: at 405 nm
// and 1000 s the limit is 1 W/m², ten times the 0.1 W/m² a constant
// 100 C3 J/m² would give. The field of view γ is checked against the
// directive's coefficients (Directive 2006/25/EC Annex II Table 2.5:
// γ = 11 mrad for t ≤ 100 s, 1.1 t^0.5 mrad up to 1e4 s, 110 mrad beyond).
func TestPhotochemicalBeyond100s(t *testing.T) {
	l, _ := EyeMPE(405e-9, 1000, 0)
	if l.Effect != "retinal photochemical" || math.Abs(l.Irradiance-1) > 1e-9 {
		t.Errorf("405 nm, 1000 s: %g W/m² (%s), want 1 W/m² photochemical", l.Irradiance, l.Rule)
	}
	for _, c := range []struct{ t, γ float64 }{{50, 11e-3}, {100, 11e-3}, {400, 22e-3}, {1e4, 110e-3}, {3e4, 110e-3}} {
		if g := Gamma(c.t); math.Abs(g-c.γ) > 1e-12 {
			t.Errorf("γ(%g s) = %g rad, want %g", c.t, g, c.γ)
		}
	}
}

// Correction factors at a point each, evaluated by hand: C3 (C_B), C4
// (C_A), C7 (C_C), C6 (C_E) below 100 mrad and T2 checked against the
// directive's coefficients (Directive 2006/25/EC Annex II Table 2.5); C1,
// T1, α_max and C5 from memory of IEC 60825-1:2014 Annex A.
func TestFactors(t *testing.T) {
	checks := []struct {
		name      string
		got, want float64
	}{
		{"C4(700 nm)", C4(700), 1},
		{"C4(850 nm) = 10^0.3", C4(850), 1.995262},
		{"C4(1064 nm)", C4(1064), 5},
		{"C3(450 nm)", C3(450), 1},
		{"C3(500 nm) = 10^1", C3(500), 10},
		{"C7(1100 nm)", C7(1100), 1},
		{"C7(1175 nm) = 10^0.45", C7(1175), 2.818383},
		{"T2(1.5 mrad)", T2(1.5e-3), 10},
		{"T2(100 mrad)", T2(0.1), 100},
		{"C6(10 mrad, 1 s)", C6(10e-3, 1), 10 / 1.5},
		{"C6(1 rad, 1 s) = α_max/α_min = 100/1.5", C6(1, 1), 100 / 1.5},
		{"C6(10 mrad, 1 µs): α_max = 5 mrad", C6(10e-3, 1e-6), 5 / 1.5},
		{"α_max(0.01 s) = 200 √t mrad", AlphaMax(0.01), 0.02},
		{"C1(1 s)", C1(1), 5600},
		{"T1(300 nm) = 10^(0.8·5)·1e-15 s", T1(300), 1e-11},
		{"C5(16 pulses) = 16^−0.25", C5(16), 0.5},
	}
	for _, c := range checks {
		t.Run(c.name, func(t *testing.T) {
			if math.Abs(c.got-c.want) > 1e-6*math.Abs(c.want) {
				t.Errorf("%s = %.7g, want %.7g", c.name, c.got, c.want)
			}
		})
	}
}

// printedEdges are the durations where the tables change band. There the
// printed values may step the "wrong" way (2e-3 J/m² before 5 µs, 18 t^0.75 =
// 1.90e-3 J/m² after); the package follows the table, so the property test
// below allows a step of at most 5 % there and none elsewhere.
var printedEdges = []float64{1e-11, 1e-9, 1e-7, 5e-6, 1.3e-5, 1e-3, 10, 100, 1e3, 1e4}

func edgeBetween(a, b float64) bool {
	for _, e := range printedEdges {
		if a < e && e <= b {
			return true
		}
	}
	return false
}

// Properties that hold without a table: radiant exposure never decreases with
// duration, at every wavelength, for small and extended sources (except at
// 10 s in 400–600 nm for an extended source, where the photochemical limit
// begins under the thermal one: the standard's dual limit), and for a small
// source irradiance never increases either (for an extended source it may:
// α_max grows as √t between 625 µs and 0.25 s); at the tables' band edges a
// step of up to 5 % the other way is what the tables print.
func TestMPEMonotoneInDuration(t *testing.T) {
	for nm := 180.0; nm <= 1e6; nm *= 1.013 {
		for _, α := range []float64{0, 10e-3, 0.2} {
			prevH, prevE, prevT := 0.0, math.Inf(1), 0.0
			for lt := -13.0; lt <= math.Log10(3e4); lt += 0.01 {
				tt := math.Pow(10, lt)
				l, err := EyeMPE(nm*1e-9, tt, α)
				if err != nil {
					t.Fatal(err)
				}
				slack := 1e-9
				if edgeBetween(prevT, tt) || (nm >= 302.5 && nm < 315 && edgeBetween(prevT/T1(nm)*1e-3, tt/T1(nm)*1e-3)) {
					slack = 0.05
				}
				dualStep := α > AlphaMin && nm >= 400 && nm < 600 && tt >= 10 && tt < 10.3
				// At 1e-11 s in 400–1400 nm the sub-picosecond row (1.5e-4 J/m²)
				// gives way to the plateau (2e-3 J/m²): radiant exposure rises
				// thirteenfold, and irradiance with it, as printed.
				subps := nm >= 400 && nm < 1400 && prevT < 1e-11 && tt >= 1e-11
				if (l.RadiantExposure < prevH*(1-slack) && !dualStep) || (α == 0 && !subps && l.Irradiance > prevE*(1+slack)) {
					t.Fatalf("%g nm, α = %g, t = %.3g s: H %.4g (before %.4g), E %.4g (before %.4g): %s", nm, α, tt, l.RadiantExposure, prevH, l.Irradiance, prevE, l.Rule)
				}
				prevH, prevE, prevT = l.RadiantExposure, l.Irradiance, tt
			}
		}
	}
	for nm := 180.0; nm <= 1e6; nm *= 1.05 {
		prevH, prevE, prevT := 0.0, math.Inf(1), 0.0
		for lt := -13.0; lt <= math.Log10(3e4); lt += 0.01 {
			tt := math.Pow(10, lt)
			l, _ := SkinMPE(nm*1e-9, tt)
			slack := 1e-9
			if edgeBetween(prevT, tt) || (nm >= 302.5 && nm < 315 && edgeBetween(prevT/T1(nm)*1e-3, tt/T1(nm)*1e-3)) {
				slack = 0.05
			}
			if l.RadiantExposure < prevH*(1-slack) || l.Irradiance > prevE*(1+slack) {
				t.Fatalf("skin %g nm, t = %.3g: %s", nm, tt, l.Rule)
			}
			prevH, prevE, prevT = l.RadiantExposure, l.Irradiance, tt
		}
	}
}

// Continuity across the duration edges the standard intends to be
// continuous (to the two printed figures): each limit just below and just
// above an edge agree within 5 %.
func TestMPEContinuity(t *testing.T) {
	edges := []struct{ nm, t float64 }{
		{250, 1e-9}, {355, 1e-9}, {355, 10}, {355, 1e3}, {633, 5e-6}, {633, 10}, {780, 5e-6}, {1064, 1.3e-5},
		{1064, 10}, {1450, 1e-9}, {1450, 1e-3}, {1450, 10}, {1550, 1e-9}, {1550, 10}, {10600, 1e-7}, {10600, 10}, {10600, 1e-9},
	}
	for _, e := range edges {
		a, _ := EyeMPE(e.nm*1e-9, e.t*(1-1e-9), 0)
		b, _ := EyeMPE(e.nm*1e-9, e.t*(1+1e-9), 0)
		if math.Abs(a.RadiantExposure-b.RadiantExposure) > 0.05*math.Max(a.RadiantExposure, b.RadiantExposure) {
			t.Errorf("%g nm at %g s: %.4g → %.4g J/m² (%s → %s)", e.nm, e.t, a.RadiantExposure, b.RadiantExposure, a.Rule, b.Rule)
		}
	}
}

func TestOutsideTablesIsAnError(t *testing.T) {
	for _, c := range []struct{ λ, t float64 }{{179e-9, 1}, {1.1e-3, 1}, {633e-9, 1e-14}, {633e-9, 4e4}, {math.NaN(), 1}, {633e-9, math.Inf(1)}} {
		t.Run(fmt.Sprint(c), func(t *testing.T) {
			_, err := EyeMPE(c.λ, c.t, 0)
			var re *RangeError
			if !errors.As(err, &re) {
				t.Errorf("EyeMPE(%g, %g): %v, want a RangeError", c.λ, c.t, err)
			}
			if _, err := SkinMPE(c.λ, c.t); err == nil {
				t.Errorf("SkinMPE(%g, %g): no error", c.λ, c.t)
			}
		})
	}

	if _, err := EyeMPE(633e-9, 1, -1); err == nil {
		t.Error("negative angular subtense accepted")
	}
}

// Limiting apertures (IEC 60825-1:2014, table of aperture diameters, from
// memory).
func TestApertures(t *testing.T) {
	for _, c := range []struct {
		nm, t, want float64
	}{{300, 1, 1e-3}, {633, 0.25, 7e-3}, {1064, 10, 7e-3}, {1550, 0.1, 1e-3}, {1550, 1, 1.5e-3}, {1550, 100, 3.5e-3}, {2e5, 1, 11e-3}} {
		t.Run(fmt.Sprint(c), func(t *testing.T) {
			if got, _, _ := EyeAperture(c.nm*1e-9, c.t); math.Abs(got-c.want) > 1e-12 {
				t.Errorf("eye aperture at %g nm, %g s = %g, want %g", c.nm, c.t, got, c.want)
			}
		})
	}

	if got, _, _ := SkinAperture(1064e-9, 10); got != 3.5e-3 {
		t.Errorf("skin aperture %g", got)
	}
}

// Continuous AELs as the AEL tables print them (IEC 60825-1:2014, AEL
// tables for Classes 1, 2, 3R and 3B, from memory): Class 1 at 633 nm
// 3.9e-4 W, Class 2 = C6 × 1 mW, Class 3R = 5 mW in the visible, Class 1 at
// 1064 nm 3.9e-4 C4 C7 W = 1.95 mW, Class 1 at 405–450 nm (photochemical)
// 3.9e-5 C3 W = 39 µW, Class 3B 0.5 W.
func TestContinuousAEL(t *testing.T) {
	check := func(name string, got, printed float64) {
		t.Helper()
		if math.Abs(got-printed) > 1e-9*printed {
			t.Errorf("%s = %.6g W, printed %.6g W", name, got, printed)
		}
	}
	a, _ := ContinuousAEL(633e-9, 0)
	check("Class 1, 633 nm", a.Class1, 3.9e-4)
	check("Class 2, 633 nm", a.Class2, 1e-3)
	check("Class 3R, 633 nm", a.Class3R, 5e-3)
	check("Class 3B, 633 nm", a.Class3B, 0.5)
	b, _ := ContinuousAEL(1064e-9, 0)
	check("Class 1, 1064 nm", b.Class1, 1.95e-3)
	if !math.IsNaN(b.Class2) {
		t.Errorf("Class 2 at 1064 nm = %g, want none", b.Class2)
	}
	check("Class 3R, 1064 nm", b.Class3R, 5*1.95e-3)
	for _, nm := range []float64{405, 420, 450} {
		c, _ := ContinuousAEL(nm*1e-9, 0)
		check(fmt.Sprintf("Class 1, %g nm", nm), c.Class1, 3.9e-5)
	}
	// Outside 400–1400 nm the Class 1 row is not transcribed: the MPE at the
	// time base times the aperture area stands in, marked as a substitute,
	// and stays below the row as recalled (1e-2 W at 1550 nm, from memory).
	d, _ := ContinuousAEL(1550e-9, 0)
	if d.Class1Row.Status != StatusSubstitute || d.Class1 > 1e-2 {
		t.Errorf("Class 1 at 1550 nm = %g W (%s)", d.Class1, d.Class1Row)
	}
	for _, row := range []Provenance{a.Class1Row, a.Class2Row, a.Class3RRow, a.Class3BRow} {
		if row.Status == "" || row.Table == "" {
			t.Errorf("AEL without provenance: %+v", row)
		}
	}
}

// The classes of a 532 nm pointer at the Class 2 and Class 3R limits,
// which the AEL tables print as 1 mW and 5 mW (from memory; the continuity
// value 0.9797 mW would class 0.99 mW as 3R).
func TestClassAtPrintedLimits(t *testing.T) {
	a, _ := ContinuousAEL(532e-9, 0)
	for _, c := range []struct {
		p    float64
		want string
	}{{1e-4, Class1}, {0.99e-3, Class2}, {1.01e-3, Class3R}, {4.99e-3, Class3R}, {5.01e-3, Class3B}, {0.5, Class3B}, {0.51, Class4}} {
		t.Run(fmt.Sprint(c.p), func(t *testing.T) {
			if got := ClassOf(c.p, a); got != c.want {
				t.Errorf("class of %g W at 532 nm = %s, want %s", c.p, got, c.want)
			}
		})
	}
}

// Repetitive pulses, one test per condition of the rules (Directive
// 2006/25/EC Annex II Table 2.6: rules 1–3, C_P = N^−0.25 for thermal limits
// only, pulses within T_min counted as one; N over at most T2 in
// 400–1400 nm and C5 only below 0.25 s from memory of IEC 60825-1:2014).
func TestPulsedRules(t *testing.T) {
	t.Run("N counted over T2", func(t *testing.T) {
		// 1064 nm, 10 ns, 100 Hz, 100 s: N = 100 Hz × T2 (10 s) = 1000, not 1e4.
		p, err := PulsedEyeMPE(1064e-9, 10e-9, 100, 100, 0)
		if err != nil {
			t.Fatal(err)
		}
		if p.N != 1000 || p.CountedOver != 10 {
			t.Errorf("N = %g over %g s, want 1000 over 10 s", p.N, p.CountedOver)
		}
		want := math.Pow(1000, -0.25) * 2e-2 // C5 × the 2e-2 J/m² plateau
		if math.Abs(p.Train-want) > 1e-9*want || p.Rule != RuleTrain {
			t.Errorf("rule 3 gives %g J/m² (%s governs), want %g", p.Train, p.Rule, want)
		}
		// Outside 400–1400 nm N counts over the whole exposure.
		q, _ := PulsedEyeMPE(1550e-9, 10e-9, 100, 100, 0)
		if q.CountedOver != 100 {
			t.Errorf("1550 nm: counted over %g s, want 100", q.CountedOver)
		}
	})
	t.Run("pulses within Tmin count as one", func(t *testing.T) {
		// 532 nm, 1 ns at 1 MHz: 18 pulses in every 18 µs form one pulse.
		p, _ := PulsedEyeMPE(532e-9, 1e-9, 1e6, 0.25, 0)
		if !p.Grouped || math.Abs(p.PerGroup-18) > 1e-9 || p.Tmin != 18e-6 {
			t.Fatalf("grouped %v, %g per group, Tmin %g", p.Grouped, p.PerGroup, p.Tmin)
		}
		group := 18 * math.Pow(18e-6, 0.75) // the MPE of one 18 µs pulse, J/m²
		if want := group / 18; math.Abs(p.SinglePulse-want) > 1e-9*want {
			t.Errorf("rule 1 per pulse %g, want %g", p.SinglePulse, want)
		}
		if n := 0.25 / 18e-6; math.Abs(p.N-n) > 1e-6*n {
			t.Errorf("N = %g groups, want %g", p.N, n)
		}
		// 10 kHz (100 µs apart) is not grouped at 532 nm, but is within the
		// 1 ms T_min of 1450 nm.
		if q, _ := PulsedEyeMPE(532e-9, 1e-9, 1e4, 1, 0); q.Grouped {
			t.Error("10 kHz grouped at 532 nm")
		}
		if q, _ := PulsedEyeMPE(1450e-9, 1e-9, 1e4, 1, 0); !q.Grouped {
			t.Error("10 kHz not grouped at 1450 nm")
		}
	})
	t.Run("C5 only below 0.25 s", func(t *testing.T) {
		p, _ := PulsedEyeMPE(1064e-9, 0.3, 1, 100, 0)
		if p.TrainApplies || p.Rule == RuleTrain || !math.IsNaN(p.Train) {
			t.Errorf("rule 3 applied to 0.3 s pulses: %+v", p)
		}
	})
	t.Run("C5 only for thermal limits", func(t *testing.T) {
		// 310 nm: a 10 ms pulse is past T1 = 1 ms, on the photochemical C2 row.
		p, _ := PulsedEyeMPE(310e-9, 10e-3, 10, 100, 0)
		if p.TrainApplies || p.Single.Thermal {
			t.Errorf("rule 3 applied at 310 nm: %s", p.TrainNote)
		}
		q, _ := PulsedEyeMPE(1064e-9, 10e-9, 1e3, 1, 0)
		if !q.TrainApplies || !q.Single.Thermal {
			t.Errorf("rule 3 not applied to a thermal limit: %s", q.TrainNote)
		}
	})
	t.Run("the lowest governs", func(t *testing.T) {
		p, _ := PulsedEyeMPE(1064e-9, 10e-9, 1e3, 1, 0)
		want := math.Min(p.SinglePulse, math.Min(p.Average, p.Train))
		if p.PerPulse != want || p.Irradiance != want*1e3 {
			t.Errorf("per pulse %g (%s), want %g", p.PerPulse, p.Rule, want)
		}
	})
	if _, err := PulsedEyeMPE(1064e-9, 1e-3, 1e4, 1, 0); err == nil {
		t.Error("duty cycle above 1 accepted")
	}
}

// NOHD against the closed form with the conversion from 1/e² to 1/e made
// explicit: 1 W, 2 mm and 1 mrad (1/e²) against 10 W/m²: a = 2/√2 mm,
// φ = 1/√2 mrad, NOHD = (√(4·1/(π·10)) − a)/φ = 502.63 m, rounded up to
// 503 m (three figures). Evaluated by hand.
func ExampleNOHD() {
	fmt.Printf("NOHD = %g m\n", NOHD(1, 2e-3, 1e-3, 10))
	fmt.Printf("OD for a ratio of 1001 = %g\n", OpticalDensity(1001))
	// Output:
	// NOHD = 503 m
	// OD for a ratio of 1001 = 4
}

func TestRoundingIsUpward(t *testing.T) {
	if OpticalDensity(1) != 0 || OpticalDensity(10) != 1 || OpticalDensity(10.0001) != 2 || OpticalDensity(0.5) != 0 {
		t.Error("OD rounding")
	}
	// The exit below the MPE has no hazard distance.
	if NOHD(1e-6, 2e-3, 1e-3, 10) != 0 {
		t.Error("NOHD of a beam below the MPE")
	}
	// OD never falls when the power rises.
	prev := 0.0
	for p := 1e-6; p < 1e3; p *= 1.1 {
		od := OpticalDensity(ApertureAverage(p, 1e-3, 7e-3) / 10)
		if od < prev {
			t.Fatalf("OD fell from %g to %g at %g W", prev, od, p)
		}
		prev = od
	}
}

// EN 207 scale numbers in 315–1400 nm (EN 207, scale table, from memory):
// LB n attenuates by 10^n and withstands 10^(n+1) W/m² (D), 0.05·10^(n−1)
// J/m² per pulse (I, R) or 1.5e-3·10^(n−1) J/m² (M).
func TestEN207(t *testing.T) {
	for _, c := range []struct {
		name     string
		mode     string
		od, x    float64
		want     int
		pulsed   bool
		τ        float64
		wantMode string
	}{
		{"D, OD governs", EN207D, 4, 1e5, 4, false, 0, EN207D},
		{"D, 1e8 W/m² needs LB7", EN207D, 2, 1e8, 7, false, 0, EN207D},
		{"R, 7 ns: 5 J/m² per pulse needs LB3", EN207R, 1, 5, 3, true, 7e-9, EN207R},
		{"I, 1 ms: 0.05 J/m² is LB1", EN207I, 0, 0.05, 1, true, 1e-3, EN207I},
		{"M, 100 fs: 1.5 J/m² needs LB4", EN207M, 2, 1.5, 4, true, 100e-15, EN207M},
		// The beam's own power density, over the area of its 63 % diameter d
		// (EN 207, from memory): 1 W in d = 1 mm at 1064 nm is
		// 1/(π (0.5 mm)²) = 1.27e6 W/m², above LB5's 1e6: LB6; 0.1 W in
		// 0.5 mm is 5.09e5 W/m²: LB5.
		{"D, 1 W in 1 mm needs LB6", EN207D, 0, 1 / (math.Pi * 0.5e-3 * 0.5e-3), 6, false, 0, EN207D},
		{"D, 0.1 W in 0.5 mm needs LB5", EN207D, 0, 0.1 / (math.Pi * 0.25e-3 * 0.25e-3), 5, false, 0, EN207D},
		// Past the table: 1e12 W/m² would need LB11, which no filter has.
		{"D, 1e12 W/m² is past LB10", EN207D, 0, 1e12, 11, false, 0, EN207D},
		// The boundaries as published: D above 0.25 s, I above 1 µs, R
		// above 1 ns (EN 207, from memory).
		{"0.25 s is I", EN207I, 0, 0.05, 1, true, 0.25, EN207I},
		{"just above 0.25 s is D", EN207D, 0, 1e2, 1, true, 0.2500001, EN207D},
		{"1 µs is R", EN207R, 0, 0.05, 1, true, 1e-6, EN207R},
		{"1 ns is M", EN207M, 0, 1.5e-3, 1, true, 1e-9, EN207M},
	} {
		t.Run(c.name, func(t *testing.T) {
			if m := EN207Mode(c.pulsed, c.τ); m != c.wantMode {
				t.Errorf("mode %s, want %s", m, c.wantMode)
			}
			if n, ok := EN207Scale(1064e-9, c.mode, c.od, c.x); !ok || n != c.want {
				t.Errorf("LB = %d, %v; want %d", n, ok, c.want)
			}
		})
	}
	if _, ok := EN207Scale(1550e-9, EN207D, 2, 1e5); ok {
		t.Error("scale number outside 315–1400 nm")
	}
}

func FuzzLimits(f *testing.F) {
	f.Add(633e-9, 0.25, 0.0)
	f.Add(1064e-9, 10.0, 0.01)
	f.Add(250e-9, 1e-12, 0.0)
	f.Fuzz(func(t *testing.T, λ, d, α float64) {
		for _, fn := range []func() (Limit, error){
			func() (Limit, error) { return EyeMPE(λ, d, α) },
			func() (Limit, error) { return SkinMPE(λ, d) },
		} {
			l, err := fn()
			if err != nil {
				continue
			}
			for _, v := range []float64{l.RadiantExposure, l.Irradiance} {
				if !(v > 0) || math.IsInf(v, 0) {
					t.Fatalf("λ %g, t %g, α %g: %v (%s)", λ, d, α, v, l.Rule)
				}
			}
		}
	})
}

func BenchmarkEyeMPE(b *testing.B) {
	for i := 0; i < b.N; i++ {
		EyeMPE(780e-9, 10, 0)
	}
}

// The 1/e diameter of a Gaussian beam is the 1/e² diameter over √2 (the
// intensity falls to 1/e at r = W/√2; IEC 60825-1:2014 defines beam
// diameters and divergences at 1/e, common practice): a 2 mm beam is
// 1.414 mm at 1/e.
func ExampleOneOverEDiameter() {
	fmt.Printf("%.4f mm\n", OneOverEDiameter(2e-3)*1e3)
	// Output: 1.4142 mm
}

// Effects add on the eye within 400–1400 nm and within 180–400 nm with
// 1400 nm–1 mm, not across (retina against cornea and lens); on the skin
// always (the standard's table of additive effects, from memory).
func TestEffectsAdd(t *testing.T) {
	for _, c := range []struct {
		a, b      float64
		eye, skin bool
	}{{780e-9, 1064e-9, true, true}, {532e-9, 1550e-9, false, true}, {355e-9, 10.6e-6, true, true}, {355e-9, 532e-9, false, true}} {
		if eye, skin := EffectsAdd(c.a, c.b); eye != c.eye || skin != c.skin {
			t.Errorf("%g and %g m: eye %v skin %v", c.a, c.b, eye, skin)
		}
	}
	if SharedOD(500, 2) != 3 || SharedOD(500, 1) != 3 || SharedOD(600, 2) != 4 {
		t.Error("shared OD: ⌈log10(n·ratio)⌉")
	}
}

// Provenance says "checked" only where the cited source prints the value:
// the directive's C_E equals C6 at α ≤ α_min and, from 0.25 s, up to
// 100 mrad (Directive 2006/25/EC Annex II Table 2.5); its T_min table runs
// from 315 nm to 1800 nm and its rule 3 counts every pulse of the exposure
// (Table 2.6), so N counted over at most T2 is ours; the classification
// time bases are from memory (the user's guide gives those durations as
// worst-case exposures, not as time bases).
func TestProvenanceCheckedOnlyWhereTheSourcePrintsIt(t *testing.T) {
	for _, c := range []struct {
		name    string
		t, α    float64
		checked bool
	}{{"small source", 0.1, 0, true}, {"20 mrad from 0.25 s", 10, 20e-3, true}, {"20 mrad below 0.25 s", 0.1, 20e-3, false}, {"200 mrad", 10, 0.2, false}} {
		if got := FactorProvenanceAt("C6", c.t, c.α).Checked(); got != c.checked {
			t.Errorf("C6, %s: checked %v, want %v", c.name, got, c.checked)
		}
	}
	if TminRow(300e-9).Checked() || !TminRow(532e-9).Checked() || TminRow(2000e-9).Checked() {
		t.Error("T_min rows: checked only in 315–1800 nm")
	}
	// The rows the reprinted simplified table of earlier-edition values
	// prints (DGUV Vorschrift 11, Tab. 3 of the Haufe reprint: 30 J/m² in
	// 180–315 nm from 1 ns, 1e11 W/m² below 1 ns and 100 J/m² from 1 ns in
	// the far infrared) say so; the rows it does not print stay from memory.
	for _, c := range []struct {
		nm, t float64
		st    Status
	}{{250, 1, StatusEarlierEdition}, {10600, 1e-10, StatusEarlierEdition}, {10600, 1e-8, StatusEarlierEdition}, {10600, 1e-3, StatusFromMemory}, {355, 1, StatusFromMemory}} {
		l, err := EyeMPE(c.nm*1e-9, c.t, 0)
		if err != nil || l.Provenance.Status != c.st || (c.st == StatusEarlierEdition && len(l.Provenance.CheckedAgainst) == 0) {
			t.Errorf("%g nm, %g s: %v, want %s", c.nm, c.t, l.Provenance, c.st)
		}
	}
	if TimeBaseRow().Checked() {
		t.Error("the classification time bases are not printed by the source cited for them")
	}
	// 1064 nm, 100 µs pulses at 100 Hz for 100 s: N over T2 = 10 s, not the
	// whole exposure.
	p, err := PulsedEyeMPE(1064e-9, 100e-6, 100, 100, 0)
	if err != nil {
		t.Fatal(err)
	}
	if p.Provenance.Checked() || p.CountedOver >= 100 || !strings.Contains(p.TrainNote, "at most T2") {
		t.Errorf("counted over %g s: provenance %v, note %q", p.CountedOver, p.Provenance, p.TrainNote)
	}
	// 532 nm, 10 ns at 1 kHz for 0.25 s: every pulse of the exposure.
	if p, err = PulsedEyeMPE(532e-9, 10e-9, 1000, 0.25, 0); err != nil || !p.Provenance.Checked() {
		t.Errorf("whole exposure: %v, %v", p.Provenance, err)
	}
}
