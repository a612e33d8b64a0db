package safety

import (
	"fmt"
	"math"
	"os"
	"regexp"
	"slices"
	"strings"
	"testing"

	"beamledger/budget"
	"beamledger/budget/setup"
)

// focusFile is the hostile corpus's expander whose second lens is sold as
// 200 mm ± 5 mm: collimated at the nominal focal length, focused inside the
// open run at the short end.
const focusFile = "../testdata/hostile/tolerance-focus-into-open.toml"

func readFile(t *testing.T, path string) string {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

func exposureAfter(t *testing.T, a *Assessment, path string, after int) *Exposure {
	t.Helper()
	for _, e := range a.Hazards.Exposures {
		if e.Path.Path.Name == path && e.Segment.After == after {
			return e
		}
	}
	t.Fatalf("no open exposure on %q after element %d", path, after)
	return nil
}

// The swept figures of the open run are those of the worst geometry itself,
// evaluated as a setup of its own with the focal length fixed there, and
// that geometry is the short end: the focus lies in the run. By hand (thin
// lens, Hecht, Optics (2017), §5.2.3, 1/s + 1/s' = 1/f): the first lens's
// virtual focus lies 50 mm before it, 200 mm before the second lens, whose
// image then lies at 1/(1/185 − 1/200) = 2466.7 mm beyond it, at
// 2716.7 mm on the path (the input's Rayleigh range, 0.14 mm at the
// virtual focus, is far below these distances, so the Gaussian waist lies
// there too: Self, Appl. Opt. 22, 658 (1983)); there all of the beam
// passes the 7 mm aperture: P / (π (3.5 mm)²).
func TestSweepTakesTheWorstGeometry(t *testing.T) {
	src := readFile(t, focusFile)
	swept := load(t, src)
	e := exposureAfter(t, swept, "expander", 2)
	if want := `path "expander", element 2 (lens), focal_length at 185 mm`; e.Geometry != want {
		t.Errorf("worst geometry %q, want %q", e.Geometry, want)
	}
	if !nearRel(e.At, 2.7167, 1e-3) {
		t.Errorf("worst point at %.5g m, want the focus at 2.7167 m (thin lens)", e.At)
	}
	// All that passes the second lens's 50 mm aperture: the 10 mm beam
	// loses exp(−2 (25 mm)²/(10 mm)²) = e^−12.5 of its power there
	// (Siegman, Lasers (1986), §17.1).
	if want := 0.1 * (1 - math.Exp(-12.5)) / (math.Pi * 3.5e-3 * 3.5e-3); !nearRel(e.Irradiance, want, 1e-7) {
		t.Errorf("eye irradiance %.9g W/m², want %.9g W/m² (all of the 100 mW past the lens's aperture in the 7 mm aperture)", e.Irradiance, want)
	}
	// Each geometry of the sweep as a setup of its own: the swept figures
	// are the highest of theirs, bit for bit.
	var worst Exposure
	for _, f := range []string{"185 mm", "192.5 mm", "200 mm", "207.5 mm", "215 mm"} { // ±3σ and the quarter points
		one := exposureAfter(t, load(t, strings.Replace(src, `"200 mm ± 5 mm"`, `"`+f+`"`, 1)), "expander", 2)
		if one.Ratio > worst.Ratio {
			worst.Ratio, worst.Irradiance, worst.At, worst.PeakIrr = one.Ratio, one.Irradiance, one.At, one.PeakIrr
		}
		worst.SkinRatio = max(worst.SkinRatio, one.SkinRatio)
		worst.Power = max(worst.Power, one.Power)
		worst.BeamIrradiance = max(worst.BeamIrradiance, one.BeamIrradiance)
	}
	got := [...]float64{e.Ratio, e.Irradiance, e.At, e.PeakIrr, e.SkinRatio, e.Power, e.BeamIrradiance}
	want := [...]float64{worst.Ratio, worst.Irradiance, worst.At, worst.PeakIrr, worst.SkinRatio, worst.Power, worst.BeamIrradiance}
	if got != want {
		t.Errorf("swept figures %v, want the highest of the fixed geometries %v", got, want)
	}
	// The nominal geometry alone: the OD 2, LB2 eyewear covers the run; the
	// sweep finds the focus, which needs LB6.
	nominal := load(t, strings.Replace(src, `"200 mm ± 5 mm"`, `"200 mm"`, 1))
	if nominal.Hazards.Sweep != nil || len(messages(nominal, FindingEyewearGap)) != 0 {
		t.Errorf("nominal geometry: sweep %v, eyewear gaps %q; want none", nominal.Hazards.Sweep, messages(nominal, FindingEyewearGap))
	}
	if g := messages(swept, FindingEyewearGap); len(g) != 1 || !strings.Contains(g[0], "D LB6") {
		t.Errorf("swept: eyewear gaps %q, want one naming D LB6", g)
	}
	if w := swept.Hazards.Sweep; w == nil || w.Tolerances != 1 || w.Geometries != 4 || w.Planned != 4 {
		t.Errorf("sweep %+v, want 1 tolerance and 4 geometries besides the nominal", w)
	}
}

func nearRel(got, want, rel float64) bool { return math.Abs(got-want) <= rel*math.Abs(want) }

// A finding other than an open segment's that a geometry makes worse is
// added with its geometry named, with the figures of that geometry's own
// evaluation: the expander's clipped power on the mirror and the filter
// grows when the second lens's focal length is at its short end.
func TestSweepAddsWorseFindings(t *testing.T) {
	src := readFile(t, "../testdata/examples/clipped-telescope.toml")
	swept := load(t, src)
	var added []budget.Finding
	for _, f := range swept.Findings {
		if strings.Contains(f.Message, "(within the stated tolerances)") {
			added = append(added, f)
		}
	}
	if len(added) == 0 {
		t.Fatal("no finding added by the sweep")
	}
	// Each geometry of the sweep as a setup of its own (150 mm ± 1 mm: ends
	// at ±3σ, and the points that divide the range in four).
	var fixed []*Assessment
	lengths := []string{"147 mm", "148.5 mm", "151.5 mm", "153 mm"}
	for _, f := range lengths {
		fixed = append(fixed, load(t, strings.Replace(src, `"150 mm ± 1 mm"`, `"`+f+`"`, 1)))
	}
	for _, f := range added {
		// The added finding is the worst of the fixed geometries' at its
		// place, with their figures and message, naming that geometry.
		var worst *budget.Finding
		at := ""
		for i, a := range fixed {
			for k, g := range a.Findings {
				if g.Kind == f.Kind && g.Path == f.Path && g.Element == f.Element && (worst == nil || g.Ratio() > worst.Ratio()) {
					worst, at = &a.Findings[k], lengths[i]
				}
			}
		}
		if worst == nil {
			t.Fatalf("%s at element %d: in no fixed geometry", f.Kind, f.Element)
		}
		if worst.Value != f.Value || worst.Limit != f.Limit || !strings.HasSuffix(f.Message, worst.Message) || !strings.Contains(f.Message, "focal_length at "+at) {
			t.Errorf("%s at element %d: added %v of %v %q; the worst fixed geometry (%s) %v of %v %q", f.Kind, f.Element, f.Value, f.Limit, f.Message, at, worst.Value, worst.Limit, worst.Message)
		}
	}
}

// What the sweep plans: each value at its ends and at the three points that
// divide its range in four (the middle one, the nominal value, is the
// nominal geometry: not planned again), one at a time, and the corners (all of them up to six values, 32 above).
func TestSweepPlan(t *testing.T) {
	tol := func(n int) []*setup.Toleranced {
		var g []*setup.Toleranced
		for i := range n {
			// 0.2 + (0.9 − 0.2) is not 0.9 in floating point: the ends
			// must be the ends themselves.
			g = append(g, &setup.Toleranced{Key: "focal_length", Label: "lens", Tol: setup.Tolerance{Lo: 0.2 + float64(i), Hi: 0.9 + float64(i)}})
		}
		return g
	}
	for _, c := range []struct {
		n, planned, corners, between int
		all                          bool
	}{
		{1, 4, 0, 3, false}, // the middle point is the nominal geometry
		{3, 3*4 + 8, 8, 3, true},
		{6, 6*4 + 64, 64, 3, true},
		{7, 7*4 + 32, 32, 3, false},
		{17, 17*2 + 32, 32, 0, false},
	} {
		plan, w := sweepPlan(tol(c.n))
		if len(plan) != c.planned || w.Planned != c.planned || w.Corners != c.corners || w.Between != c.between || w.AllCorners != c.all {
			t.Errorf("%d values: %d geometries, %+v; want %d, %d corners, %d between, all %v", c.n, len(plan), w, c.planned, c.corners, c.between, c.all)
		}
		g := tol(c.n)
		seen := map[string]bool{}
		for _, p := range plan {
			key := fmt.Sprint(p.values)
			for i, v := range p.values {
				if v < g[i].Tol.Lo || v > g[i].Tol.Hi {
					t.Fatalf("%d values: %g outside [%g, %g]", c.n, v, g[i].Tol.Lo, g[i].Tol.Hi)
				}
			}
			if seen[key] || p.what == "the nominal values" {
				t.Errorf("%d values: geometry %q planned twice", c.n, p.what)
			}
			seen[key] = true
		}
		// Each value alone at each of its ends, exactly.
		for i := range g {
			for _, end := range []float64{g[i].Tol.Lo, g[i].Tol.Hi} {
				if !slices.ContainsFunc(plan, func(p geometry) bool { return p.values[i] == end }) {
					t.Errorf("%d values: value %d never at its end %g exactly", c.n, i, end)
				}
			}
		}
		if c.n > 1 {
			// The first two are the corners at all-low and all-high.
			for i := range g {
				if plan[0].values[i] != g[i].Tol.Lo || plan[1].values[i] != g[i].Tol.Hi {
					t.Fatalf("%d values: the first two geometries are not all low, all high", c.n)
				}
			}
		}
	}
}

// A sweep cut short by the work bound says so with a defect, and its
// description says how much was evaluated.
func TestSweepCut(t *testing.T) {
	defer func(n int) { sweepWork = n }(sweepWork)
	sweepWork = 1
	a := load(t, readFile(t, focusFile))
	if len(messages(a, FindingSweepCut)) != 1 {
		t.Errorf("cut findings %q, want one", messages(a, FindingSweepCut))
	}
	if w := a.Hazards.Sweep; w.Geometries != 2 || !strings.Contains(w.Description(), "only 2 of the 4 geometries planned were evaluated") {
		t.Errorf("sweep %+v: %q", w, w.Description())
	}
}

// Which findings the sweep adds: per kind and place, the worst of the
// geometries' when it is worse than the nominal's (uncontrolled where the
// nominal is controlled, or a higher ratio), once.
func TestSweepFindings(t *testing.T) {
	f := func(kind budget.FindingKind, el int, v float64, controlled bool) budget.Finding {
		g := budget.Finding{Severity: budget.SeverityHazard, Kind: kind, Path: "p", Element: el, Message: "m"}.Figure(v, 1, "W/m2")
		if controlled {
			g.ControlledBy = []string{"goggles"}
		}
		return g
	}
	nominal := []budget.Finding{f(FindingStray, 1, 2, true), f(FindingStray, 2, 3, true), f(FindingEscaping, 3, 5, false)}
	plan := []geometry{{what: "A"}, {what: "B"}}
	sw := newSweepFigures(plan, 0)
	// Gathered in either order, the same findings are added.
	sw.gather(1, &Hazards{}, []budget.Finding{f(FindingStray, 1, 2.2, true), f(FindingStray, 2, 2, false), f(FindingDiffuseZone, 4, 0, false)})
	sw.gather(0, &Hazards{}, []budget.Finding{f(FindingStray, 1, 2.5, true), f(FindingStray, 2, 3, true), f(FindingEscaping, 3, 9, true)})
	got := sw.findings(nominal)
	var lines []string
	for _, g := range got {
		lines = append(lines, string(g.Kind)+" "+g.Message+" "+string(rune('0'+g.Element)))
	}
	want := []string{
		"stray_reflection with A (within the stated tolerances): m 1", // 2.5 > 2
		"stray_reflection with B (within the stated tolerances): m 2", // uncontrolled where the nominal is not
		"diffuse_zone with B (within the stated tolerances): m 4",     // none at the nominal geometry
	}
	if !slices.Equal(lines, want) {
		t.Errorf("added\n%s\nwant\n%s", strings.Join(lines, "\n"), strings.Join(want, "\n"))
	}
}

// BenchmarkSweepLargeLab is check's evaluation of the 2 200-element lab with
// every focal length toleranced (± 0.5 mm): the sweep up to its work bound.
func BenchmarkSweepLargeLab(b *testing.B) {
	src, err := os.ReadFile("../testdata/scale/lab-2000.toml")
	if err != nil {
		b.Fatal(err)
	}
	tol := regexp.MustCompile(`focal_length = "([0-9.]+) mm"`).ReplaceAll(src, []byte(`focal_length = "$1 mm ± 0.5 mm"`))
	s, err := setup.Parse("lab.toml", tol)
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if _, err := EvaluateWith(s, Options{Samples: 100, Seed: 1}); err != nil {
			b.Fatal(err)
		}
	}
}

// Two toleranced lenses of the expander whose ends, one at a time, leave
// its focus beyond the 5 m run, but together bring it inside: the corner
// is the worst geometry. By hand (thin lens, Hecht (2017), §5.2.3): the
// first lens's virtual focus lies |f1| before it, 150 mm + |f1| before the
// second, whose image lies at 1/(1/f2 − 1/(150 mm + |f1|)) beyond it:
// 9.09 m for f1 = −54.5 mm alone, 8.69 m for f2 = 195.5 mm alone, 4.44 m
// for both, the only one inside the run.
func TestSweepCornerFindsTheCombination(t *testing.T) {
	src := readFile(t, focusFile)
	src = strings.Replace(src, `focal_length = "-50 mm"`, `focal_length = "-50 mm ± 1.5 mm"`, 1)
	src = strings.Replace(src, `"200 mm ± 5 mm"`, `"200 mm ± 1.5 mm"`, 1)
	src = strings.Replace(src, `at = "3250 mm"`, `at = "5000 mm"`, 1)
	swept := exposureAfter(t, load(t, src), "expander", 2)
	fixed := func(f1, f2 string) *Exposure {
		s := strings.Replace(src, `"-50 mm ± 1.5 mm"`, `"`+f1+`"`, 1)
		return exposureAfter(t, load(t, strings.Replace(s, `"200 mm ± 1.5 mm"`, `"`+f2+`"`, 1)), "expander", 2)
	}
	corner := fixed("-54.5 mm", "195.5 mm")
	if want := `path "expander", element 1 (lens), focal_length at -54.5 mm, path "expander", element 2 (lens), focal_length at 195.5 mm`; swept.Geometry != want {
		t.Errorf("worst geometry %q, want the corner %q", swept.Geometry, want)
	}
	if swept.Ratio != corner.Ratio || swept.At != corner.At {
		t.Errorf("swept ratio %g at %g m, the corner's %g at %g m", swept.Ratio, swept.At, corner.Ratio, corner.At)
	}
	if !nearRel(corner.At, 0.25+4.4418, 1e-3) {
		t.Errorf("the corner's worst point at %g m, want its focus at 4.692 m", corner.At)
	}
	for _, one := range []*Exposure{fixed("-54.5 mm", "200 mm"), fixed("-50 mm", "195.5 mm")} {
		if !(one.Ratio < corner.Ratio) {
			t.Errorf("one lens at its end alone reaches %g × the MPE, the corner %g ×: the case does not need the corner", one.Ratio, corner.Ratio)
		}
	}
}

// For a toleranced waist, waist position or element position, as for a
// focal length, each open segment's swept figures are the highest of the
// geometries evaluated as setups of their own (the value fixed at each
// end and at the quarter points), NOHD included, and so are the
// reflections' (the window 290 mm past a 10 mm lens's focus meets a beam
// wider than the eye's aperture, and its stray reflections' share through
// it moves with each value)
// (common practice: the sweep is held to the evaluations it stands for).
func TestSweepEqualsItsGeometriesForEachKind(t *testing.T) {
	const base = `
[[laser]]
name = "diode"
wavelength = "850 nm"
power = "500 mW"
waist = "WAIST"
waist_at = "WAISTAT"

[[path]]
name = "out"
from = "diode"
  [[path.element]]
  type = "lens"
  at = "AT"
  focal_length = "10 mm"
  [[path.element]]
  type = "window"
  at = "400 mm"
`
	for _, c := range []struct {
		key, tol string
		fixed    []string
	}{
		{"WAIST", "0.5 mm ± 0.05 mm", []string{"0.35 mm", "0.425 mm", "0.575 mm", "0.65 mm"}},
		{"WAISTAT", "0 mm .. 40 mm", []string{"0 mm", "10 mm", "30 mm", "40 mm"}},
		{"AT", "80 mm .. 120 mm", []string{"80 mm", "90 mm", "110 mm", "120 mm"}},
	} {
		t.Run(c.key, func(t *testing.T) {
			with := func(v string) string {
				s := base
				for k, d := range map[string]string{"WAIST": "0.5 mm", "WAISTAT": "20 mm", "AT": "100 mm"} {
					if k == c.key {
						d = v
					}
					s = strings.Replace(s, `"`+k+`"`, `"`+d+`"`, 1)
				}
				return s
			}
			swept := load(t, with(c.tol))
			if w := swept.Hazards.Sweep; w == nil || w.Geometries != len(c.fixed) {
				t.Fatalf("sweep %+v, want %d geometries", w, len(c.fixed))
			}
			var fixed []*Assessment
			for _, v := range append([]string{""}, c.fixed...) {
				if v == "" { // the nominal geometry
					v = map[string]string{"WAIST": "0.5 mm", "WAISTAT": "20 mm", "AT": "100 mm"}[c.key]
				}
				fixed = append(fixed, load(t, with(v)))
			}
			for _, e := range swept.Hazards.Exposures {
				var ratio, nohd, power, beam float64
				for _, a := range fixed {
					o := exposureAfter(t, a, "out", e.Segment.After)
					ratio, nohd = max(ratio, o.Ratio), max(nohd, o.NOHD)
					power, beam = max(power, o.Power), max(beam, o.BeamIrradiance)
				}
				// To 1e-12: the sweep computes a value at a quarter point or a
				// 3σ end, the fixed setup reads it from its text.
				if !nearRel(e.Ratio, ratio, 1e-12) || !nearRel(e.NOHD, nohd, 1e-12) || !nearRel(e.Power, power, 1e-12) || !nearRel(e.BeamIrradiance, beam, 1e-12) {
					t.Errorf("after element %d: swept ratio %g, NOHD %g, power %g, beam %g; the geometries' highest %g, %g, %g, %g",
						e.Segment.After, e.Ratio, e.NOHD, e.Power, e.BeamIrradiance, ratio, nohd, power, beam)
				}
			}
			// The reflections likewise: each the worst of its own over the
			// geometries (its ratio; a diffuse zone's radius).
			if !slices.ContainsFunc(swept.Hazards.Reflections, func(r *Reflection) bool { return r.Kind == ReflectionStray && r.Element.Index == 2 }) {
				t.Fatal("no stray reflection at the window to compare")
			}
			for _, r := range swept.Hazards.Reflections {
				var ratio, radius float64
				for _, a := range fixed {
					for _, o := range a.Hazards.Reflections {
						if o.Kind == r.Kind && (o.Element == nil) == (r.Element == nil) && (o.Element == nil || o.Element.Index == r.Element.Index) {
							ratio, radius = max(ratio, o.Ratio), max(radius, o.Radius)
						}
					}
				}
				if !nearRel(r.Ratio, ratio, 1e-12) || !nearRel(r.Radius, radius, 1e-12) {
					t.Errorf("%s reflection: swept ratio %g, radius %g; the geometries' highest %g, %g", r.Kind, r.Ratio, r.Radius, ratio, radius)
				}
			}
		})
	}
}
