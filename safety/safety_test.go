package safety

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"beamledger/budget"
	"beamledger/budget/optics"
	"beamledger/budget/setup"
	"beamledger/budget/setup/synth"
	"beamledger/limits"
)

func load(t testing.TB, src string) *Assessment {
	t.Helper()
	s, err := setup.Parse("t.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	a, err := Evaluate(s)
	if err != nil {
		t.Fatal(err)
	}
	return a
}

// The demo's first drive segment by hand: 1.5 W in a 1.1 × 0.6 mm beam lies
// wholly inside the 7 mm eye aperture, so E = 1.5 W / (π (3.5 mm)²) =
// 3.898 W/cm²; the 780.24 nm, 10 s MPE of a small source is 10 C4 C7 =
// 14.470 W/m² (C4 = 10^(0.002 · 80.24), C7 = 1; IEC 60825-1:2014 Annex A,
// eye from 10 s, 400–1400 nm, α ≤ 1.5 mrad, from memory); ratio 2693.6, OD 4.
func TestDemoFirstSegmentByHand(t *testing.T) {
	s, err := setup.Load("../testdata/examples/table-c.toml")
	if err != nil {
		t.Fatal(err)
	}
	a, err := Evaluate(s)
	if err != nil {
		t.Fatal(err)
	}
	e := a.Hazards.Exposures[0]
	wantE := 1.5 / (math.Pi * 3.5e-3 * 3.5e-3)
	if math.Abs(e.Irradiance-wantE) > 1e-4*wantE {
		t.Errorf("E = %g W/m², want %g", e.Irradiance, wantE)
	}
	if mpe := 10 * math.Pow(10, 0.002*80.24); math.Abs(e.Laser.EyeIrradiance-mpe) > 1e-9*mpe {
		t.Errorf("MPE = %g, want %g", e.Laser.EyeIrradiance, mpe)
	}
	if e.OD != 4 || math.Abs(e.Ratio-2693.6) > 0.5 {
		t.Errorf("ratio %g, OD %g; want 2693.6, 4", e.Ratio, e.OD)
	}
	if a.Hazards.Lasers[0].Class != limits.Class4 {
		t.Errorf("class %q", a.Hazards.Lasers[0].Class)
	}
}

// The irradiance averaged over a round aperture agrees with the closed form
// P(1 − exp(−2r²/w²))/(πr²) for a round beam (Siegman, Lasers (1986), §17.1).
func TestApertureIrradianceRound(t *testing.T) {
	const λ = 633e-9
	for _, w := range []float64{0.5e-3, 3.5e-3, 10e-3} {
		b := optics.Beam{Wavelength: λ, X: optics.NewPlane(w, 0, 1, λ), Y: optics.NewPlane(w, 0, 1, λ)}
		got := apertureIrradiance(b, 1, 7e-3)
		want := limits.ApertureAverage(1, w, 7e-3)
		if math.Abs(got-want) > 1e-9*want {
			t.Errorf("w = %g: %g, closed form %g", w, got, want)
		}
	}
}

// The worst point of a focusing segment is at the focus.
func TestMaxAlongFindsFocus(t *testing.T) {
	const λ = 1064e-9
	b := optics.Beam{Wavelength: λ, X: optics.NewPlane(5e-3, 0, 1, λ), Y: optics.NewPlane(5e-3, 0, 1, λ)}.Lens(0.5)
	irr, at := maxAlong(b, 1, 1e-3, 2)
	focus := b.X.WaistDistance()
	if math.Abs(at-focus) > 1e-3 {
		t.Errorf("worst at %g m, focus at %g m", at, focus)
	}
	want := apertureIrradiance(b.Propagate(focus), 1, 1e-3)
	if irr < want*(1-1e-9) {
		t.Errorf("irr %g below the focus value %g", irr, want)
	}
}

// Far from the waist, where the beam is much larger than the aperture, the
// numerical hazard distance agrees with the standard's closed form
// NOHD = (√(4P/(π MPE)) − a)/φ in 1/e quantities.
func TestHazardDistanceMatchesClosedForm(t *testing.T) {
	const λ, w0, p, mpe = 1064e-9, 0.2e-3, 1.0, 50.61
	b := optics.Beam{Wavelength: λ, X: optics.NewPlane(w0, 0, 1, λ), Y: optics.NewPlane(w0, 0, 1, λ)}
	θ := b.X.Divergence(λ)
	got := hazardDistance(b, p, 7e-3, mpe)
	want := limits.NOHD(p, 2*w0, 2*θ, mpe)
	if math.Abs(got-want) > 0.01*want {
		t.Errorf("numerical %g m, closed form %g m", got, want)
	}
}

// A Lambertian reflector's hazard zone r = √(ρP cos θ/(π E_MPE)): 1 W,
// ρ = 1, θ = 0, MPE 10 W/m² gives 0.1784 m (evaluated by hand); at θ = 60°
// the zone shrinks by √cos θ = 0.7071.
func ExampleDiffuseHazardRadius() {
	fmt.Printf("%.4f m\n", DiffuseHazardRadius(1, 1, 1, 10))
	fmt.Printf("%.4f m\n", DiffuseHazardRadius(1, 1, 0.5, 10))
	// Output:
	// 0.1784 m
	// 0.1262 m
}

// messages lists the messages of the findings of one kind.
func messages(a *Assessment, kind budget.FindingKind) []string {
	var out []string
	for _, f := range a.Findings {
		if f.Kind == kind {
			out = append(out, f.Message)
		}
	}
	return out
}

const eyewearLab = `
[[laser]]
name = "l"
wavelength = "1064 nm"
power = "1 W"
waist = "1 mm"

[[path]]
name = "p"
from = "l"
  [[path.element]]
  type = "dump"
  at = "1 m"
  rating = "5 W"
`

// 1 W in a 1 mm beam over the 7 mm aperture: 2.598e4 W/m² against 50.61 W/m²
// at 1064 nm, 10 s: ratio 513, OD 3 (by hand).
func TestEyewearCoverage(t *testing.T) {
	a := load(t, eyewearLab)
	gap := func(a *Assessment) string { return strings.Join(messages(a, FindingEyewearGap), "; ") }
	if g := gap(a); !strings.Contains(g, "no eyewear is declared; OD 3 is needed at 1064 nm") {
		t.Errorf("gap finding %q", g)
	}
	a = load(t, eyewearLab+"[[eyewear]]\nname = \"g\"\nbands = [{ from = \"900 nm\", to = \"1100 nm\", od = 2 }]\n")
	if g := gap(a); !strings.Contains(g, "no declared eyewear gives OD 3 at 1064 nm") {
		t.Errorf("gap finding %q", g)
	}
	a = load(t, eyewearLab+"[[eyewear]]\nname = \"g\"\nbands = [{ from = \"900 nm\", to = \"1100 nm\", od = 3 }]\n")
	if g := gap(a); g != "" || len(a.Hazards.Eyewear) != 1 || a.Hazards.Eyewear[0].CoveredBy[0] != "g" {
		t.Errorf("covered eyewear still a gap: %q", g)
	}
}

// Enclosed and vacuum segments are not open exposures; the segment after an
// element is open unless it says otherwise.
func TestAccessOfSegments(t *testing.T) {
	src := strings.Replace(eyewearLab, "from = \"l\"", "from = \"l\"\naccess = \"enclosed\"", 1)
	a := load(t, src)
	if n := len(a.Hazards.Exposures); n != 0 {
		t.Errorf("%d exposures on an enclosed path", n)
	}
}

// Properties over generated labs: the OD needed never falls when every
// power rises, and a hazard never disappears when the beams get smaller.
func TestHazardMonotone(t *testing.T) {
	for seed := uint64(1); seed <= 40; seed++ {
		src := synth.Lab(seed, synth.Options{Lasers: 2, ElementsPerPath: 6, Splits: 1, OpenEnds: true})
		base := load(t, src)
		s, _ := setup.Parse("x.toml", []byte(src))
		for _, las := range s.Lasers {
			las.Power *= 3
			las.OperatingPower *= 3
		}
		up, err := Evaluate(s)
		if err != nil {
			t.Fatal(err)
		}
		for i, e := range base.Hazards.Exposures {
			if up.Hazards.Exposures[i].OD < e.OD {
				t.Fatalf("seed %d: OD fell from %g to %g when the power tripled", seed, e.OD, up.Hazards.Exposures[i].OD)
			}
		}
		s2, _ := setup.Parse("x.toml", []byte(src))
		for _, las := range s2.Lasers {
			las.Waist[0] /= 2
			las.Waist[1] /= 2
		}
		small, err := Evaluate(s2)
		if err != nil {
			t.Fatal(err)
		}
		if countAbove(small) < countAbove(base) {
			t.Fatalf("seed %d: hazards above the MPE fell from %d to %d when the beams got smaller", seed, countAbove(base), countAbove(small))
		}
	}
}

// countAbove counts the segments straight from each laser that exceed the
// MPE: there a smaller waist can only concentrate the light (further on, a
// smaller source waist may well make the beam larger).
func countAbove(a *Assessment) int {
	n := 0
	for _, e := range a.Hazards.Exposures {
		if e.Ratio > 1 && e.Segment.After == 0 {
			n++
		}
	}
	return n
}

func BenchmarkEvaluateDemo(b *testing.B) {
	s, err := setup.Load("../testdata/examples/table-c.toml")
	if err != nil {
		b.Fatal(err)
	}
	for i := 0; i < b.N; i++ {
		if _, err := Evaluate(s); err != nil {
			b.Fatal(err)
		}
	}
}

// For an astigmatic beam the search between the two waists finds the same
// worst point as a dense scan of the whole stretch.
func TestMaxAlongAstigmatic(t *testing.T) {
	const λ = 780e-9
	for _, c := range []struct{ wx, wy, zx, zy, p, d, L float64 }{
		{3e-3, 0.5e-3, 0.4, 0.1, 1, 7e-3, 1},
		{4e-3, 4e-3, 0.2, 0.3, 1, 7e-3, 1},
		{1e-3, 6e-3, -0.2, 0.5, 1, 3.5e-3, 0.3},
	} {
		t.Run(fmt.Sprint(c), func(t *testing.T) {
			b := optics.Beam{Wavelength: λ, X: optics.NewPlane(c.wx, c.zx, 1.3, λ), Y: optics.NewPlane(c.wy, c.zy, 1.1, λ)}.Lens(0.3)
			got, _ := maxAlong(b, c.p, c.d, c.L)
			dense := 0.0
			for i := 0; i <= 20000; i++ {
				dense = math.Max(dense, apertureIrradiance(b.Propagate(c.L*float64(i)/20000), c.p, c.d))
			}
			if got < dense*(1-1e-6) {
				t.Errorf("%+v: search %g, dense scan %g", c, got, dense)
			}
		})
	}
}

// Any setup that loads evaluates without a panic, and every figure the
// hazards report is a number (never NaN).
func FuzzEvaluate(f *testing.F) {
	for _, name := range []string{"table-c", "splitter-tree", "elliptical-diode", "clipped-telescope", "weak-probe"} {
		if data, err := os.ReadFile("../testdata/examples/" + name + ".toml"); err == nil {
			f.Add(data)
		}
	}
	hostile, _ := filepath.Glob("../testdata/hostile/*.toml")
	for _, h := range hostile {
		if data, err := os.ReadFile(h); err == nil {
			f.Add(data)
		}
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		var a *Assessment
		var err error
		done := make(chan struct{})
		go func() {
			defer close(done)
			var s *setup.Setup
			if s, err = setup.Parse("fuzz.toml", data); err == nil {
				a, err = Evaluate(s)
			}
		}()
		select {
		case <-done:
		case <-time.After(5 * time.Second):
			t.Fatalf("loading and evaluating took more than 5 s")
		}
		if err != nil {
			return
		}
		// Every hazard figure is a finite number (a hazard distance past the
		// search is +Inf by design and printed as "beyond").
		for _, e := range a.Hazards.Exposures {
			for _, v := range []float64{e.Power, e.Irradiance, e.Ratio, e.OD, e.SkinIrr, e.SkinRatio, e.PeakIrr, e.At} {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					t.Fatalf("non-finite figure in exposure %+v", e)
				}
			}
			if math.IsNaN(e.NOHD) || e.NOHD < 0 {
				t.Fatalf("bad NOHD in exposure %+v", e)
			}
		}
		for _, r := range a.Hazards.Reflections {
			for _, v := range []float64{r.Power, r.Irradiance, r.Ratio, r.OD, r.Radius} {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					t.Fatalf("non-finite figure in reflection %+v", r)
				}
			}
		}
		for _, at := range a.Atoms {
			for _, v := range []float64{at.Power, at.PeakIrradiance, at.Saturation, at.Rabi, at.OpticalDepth, at.Detuning} {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					t.Fatalf("non-finite drive figure at %s element %d: %v", at.Path.Path.Name, at.Row.Element.Index, v)
				}
			}
			if g := at.Goal; g != nil {
				for _, v := range []float64{g.Intensity, g.PowerAtAtoms, g.SourcePower, g.MarginDB} {
					if math.IsNaN(v) || math.IsInf(v, 0) {
						t.Fatalf("non-finite goal figure %+v", g)
					}
				}
			}
		}
		for _, f := range a.Findings {
			if strings.Contains(f.Message, "NaN") || strings.Contains(f.Message, "Inf") {
				t.Fatalf("finding prints a non-finite number: %s", f.Message)
			}
		}
	})
}

// An AOM's undiffracted beam and a mirror's leakage leave the path: above the
// MPE each is a finding that needs action.
func TestEscapingBeams(t *testing.T) {
	src := `
[[laser]]
name = "l"
wavelength = "1064 nm"
power = "2 W"
waist = "1 mm"

[[path]]
name = "p"
from = "l"
access = "enclosed"
  [[path.element]]
  type = "aom"
  at = "10 cm"
  efficiency = 0.8
  surface_reflectance = 0
  access = "open"
  [[path.element]]
  type = "mirror"
  at = "20 cm"
  reflectivity = 0.99
  access = "enclosed"
  [[path.element]]
  type = "dump"
  at = "30 cm"
  rating = "5 W"
`
	a := load(t, src)
	kinds := messages(a, FindingEscaping)
	// 0.4 W undiffracted over the 7 mm aperture: 1.04e4 W/m² against
	// 50.61 W/m²; 1 % of the diffracted 1.6 W, 16 mW, leaked: 416 W/m² (by
	// hand).
	if len(kinds) != 2 || !strings.Contains(kinds[0], "400 mW leaves in the undiffracted") || !strings.Contains(kinds[1], "16 mW leaks through the mirror") {
		t.Errorf("escaping-beam findings: %q", kinds)
	}
}

// Damage: a cw rating as linear power density P/(2W) (common practice) and
// A pulsed fluence 2E/(πW²) against a threshold scaled by √(τ/τ_rated)
// (common practice); by hand: 10 W over the 2 mm diameter of a 1 mm radius
// beam is 5 W/mm = 50 W/cm against a 40 W/cm rating; 1 mJ pulses of 10 ns in the same beam
// are 2·1e-3/(π·1e-6) = 637 J/m² = 0.0637 J/cm² against 0.5 J/cm² at 10 ns
// scaled from 20 ns by √(10/20): 0.354 J/cm², below.
func TestDamage(t *testing.T) {
	cw := `
[[laser]]
name = "l"
wavelength = "1064 nm"
power = "10 W"
waist = "1 mm"

[[path]]
name = "p"
from = "l"
access = "enclosed"
  [[path.element]]
  type = "mirror"
  at = "0 m"
  reflectivity = 1
  damage_threshold = "40 W/cm"
  access = "enclosed"
  [[path.element]]
  type = "dump"
  at = "1 cm"
  rating = "20 W"
`
	found := func(a *Assessment) []string { return messages(a, FindingDamage) }
	figures := func(a *Assessment) []budget.Finding {
		var out []budget.Finding
		for _, f := range a.Findings {
			if f.Kind == FindingDamage {
				out = append(out, f)
			}
		}
		return out
	}
	// 10 W over the 2 mm 1/e² diameter is 5000 W/m (50 W/cm) against 4000
	// W/m (by hand).
	if got := figures(load(t, cw)); len(got) != 1 || got[0].Unit != "W/m" || math.Abs(got[0].Value-5000) > 1e-9 || got[0].Limit != 4000 || math.Abs(got[0].Ratio()-1.25) > 1e-12 {
		t.Errorf("cw damage: %+v", got)
	}
	if got := found(load(t, strings.Replace(cw, `"40 W/cm"`, `"60 W/cm"`, 1))); len(got) != 0 {
		t.Errorf("cw below rating: %q", got)
	}
	pulsed := strings.Replace(cw, `waist = "1 mm"`, "waist = \"1 mm\"\nemission = \"pulsed\"\npulse_duration = \"10 ns\"\nrepetition_rate = \"10 kHz\"", 1)
	pulsed = strings.Replace(pulsed, `damage_threshold = "40 W/cm"`, "damage_threshold = \"0.5 J/cm2\"\n  damage_pulse_duration = \"20 ns\"", 1)
	if got := found(load(t, pulsed)); len(got) != 0 {
		t.Errorf("pulsed below the scaled threshold: %q", got)
	}
	over := strings.Replace(pulsed, `"0.5 J/cm2"`, `"0.08 J/cm2"`, 1) // scaled: 0.0566 J/cm² < 0.0637
	// E = 10 W / 10 kHz = 1 mJ; 2E/(πW²) = 636.6 J/m²; the 800 J/m² rating
	// at 20 ns scales by √(10/20) to 565.7 J/m² (by hand).
	if got := figures(load(t, over)); len(got) != 1 || got[0].Unit != "J/m2" || math.Abs(got[0].Value-636.6198) > 1e-3 || math.Abs(got[0].Limit-565.685) > 1e-3 {
		t.Errorf("pulsed above the scaled threshold: %+v", got)
	}
}

// Beams that meet on one optic add: two 5 W beams of 1 mm waist (each
// 5 W / 2 mm = 2500 W/m, 25 W/cm, by hand) on a mirror rated 40 W/cm make
// 50 W/cm together, above the rating that each alone is under; on a fibre
// face their peak irradiances add the same way.
func TestDamageAddsOverSharedBeams(t *testing.T) {
	const shared = `
[[laser]]
name = "a"
wavelength = "1064 nm"
power = "5 W"
waist = "1 mm"

[[laser]]
name = "b"
wavelength = "1070 nm"
power = "5 W"
waist = "1 mm"

[[path]]
name = "main"
from = "a"
access = "enclosed"
  [[path.element]]
  type = "combiner"
  name = "c"
  at = "0 m"
  transmission = 1
  join_transmission = 1
  access = "enclosed"
  [[path.element]]
  type = "mirror"
  at = "1 mm"
  reflectivity = 1
  damage_threshold = "40 W/cm"
  access = "enclosed"
  [[path.element]]
  type = "dump"
  at = "2 mm"
  rating = "20 W"

[[path]]
name = "join"
from = "b"
into = "main:c"
into_at = "0 m"
access = "enclosed"
`
	a := load(t, shared)
	var got []budget.Finding
	for _, f := range a.Findings {
		if f.Kind == FindingDamage {
			got = append(got, f)
		}
	}
	// By hand: each beam's 1/e² radius barely grows over 1 mm, so the sum
	// is 5000 W/m to a part in 1e5.
	if len(got) != 1 || math.Abs(got[0].Value-5000)/5000 > 1e-5 || got[0].Limit != 4000 || !strings.Contains(got[0].Message, `the 2 beams of lasers "a", "b" together`) {
		t.Fatalf("two beams at 25 W/cm each on a 40 W/cm mirror: %+v", got)
	}
	if lpd := LinearPowerDensity(a.HazardBudget.Paths[0].Rows[1].BeamIn, 5); math.Abs(lpd-2500)/2500 > 1e-5 {
		t.Errorf("one beam: %g W/m, want 2500 (5 W over a 2 mm diameter, by hand)", lpd)
	}
	// Without the joining path, laser "b" feeds nothing and the mirror
	// carries one beam.
	alone, _, _ := strings.Cut(shared, "[[path]]\nname = \"join\"")
	for _, f := range load(t, alone).Findings {
		if f.Kind == FindingDamage {
			t.Errorf("one beam of 25 W/cm on a 40 W/cm mirror: %s", f.Message)
		}
	}
}

// The invented Q-switched source (7 ns, 10 Hz, 50 mW average, a 1 mm waist)
// is rated for condition R of EN 207. The radiant exposure of one pulse over
// the 7 mm aperture, nearly all of 5 mJ in π(3.5 mm)², is 129.9 J/m² (the
// OD's basis); the scale number comes from the beam's own energy density
// per pulse where it is narrowest, at the window 150 mm after the f = 250 mm
// lens: by the q parameter (Siegman (1986) §20.2), W = 0.4026 mm there, so
// 2 · 0.99 · 5 mJ/(π W²) = 19441 J/m², which needs LB7 (0.05·10^(n−1) J/m²
// ≥ 19441; EN 207 scale table, from memory). The pulse energy is
// 50 mW / 10 Hz = 5 mJ and the peak power 5 mJ / 7 ns = 714 kW (common
// practice).
func TestPulsedSourceFigures(t *testing.T) {
	s, err := setup.Load("../testdata/examples/ablation-pulse.toml")
	if err != nil {
		t.Fatal(err)
	}
	a, err := Evaluate(s)
	if err != nil {
		t.Fatal(err)
	}
	ll := a.Hazards.Lasers[0]
	if math.Abs(ll.PulseEnergy-5e-3) > 1e-12 || math.Abs(ll.PeakPower-5e-3/7e-9) > 1e-3 || ll.EN207Mode != limits.EN207R {
		t.Errorf("pulse energy %g J, peak %g W, mode %s", ll.PulseEnergy, ll.PeakPower, ll.EN207Mode)
	}
	e := a.Hazards.Exposures[0]
	if math.Abs(e.PulseRadiantExposure-e.Irradiance/10) > 1e-9*e.PulseRadiantExposure || math.Abs(e.PulseRadiantExposure-129.9) > 0.1 {
		t.Errorf("per pulse %g J/m² (aperture irradiance %g W/m²)", e.PulseRadiantExposure, e.Irradiance)
	}
	if len(a.Hazards.Eyewear) != 1 {
		t.Fatalf("%d eyewear needs", len(a.Hazards.Eyewear))
	}
	if n := a.Hazards.Eyewear[0]; n.Mode != limits.EN207R || !n.LBValid || n.LB != 7 || n.EN207Label() != "R LB7" || math.Abs(n.BeamPulseExposure-19441.4) > 0.1 {
		t.Errorf("eyewear %s LB%d (%v) from %g J/m²", n.Mode, n.LB, n.LBValid, n.BeamPulseExposure)
	}
}

// On table D the trap (1064 nm) joins the probe (780.2 nm) at the dichroic;
// between the dichroic and the objective both beams are open. Both lie in
// 400–1400 nm, where effects on the retina (and the skin) add (the
// standard's table of additive effects, from memory), so each exposure's
// combined ratio is the sum of the two single-wavelength ratios, worked out
// here by hand from the parts; and the equal-share OD holds the attenuated
// sum to at most 1.
func TestSharedSegmentAddsByHand(t *testing.T) {
	s, err := setup.Load("../testdata/examples/table-d.toml")
	if err != nil {
		t.Fatal(err)
	}
	a, err := Evaluate(s)
	if err != nil {
		t.Fatal(err)
	}
	var parts []*Exposure
	for _, e := range a.Hazards.Exposures {
		if e.Path.Path.Name == "probe" && e.Segment.After == 2 {
			parts = append(parts, e)
		}
	}
	if len(parts) != 2 {
		t.Fatalf("%d exposures on the shared segment, want the probe's and the trap's", len(parts))
	}
	probe, trap := parts[0], parts[1]
	if probe.Laser.Laser.Name != "probe" || trap.Laser.Laser.Name != "trap" {
		t.Fatalf("parts %q, %q", probe.Laser.Laser.Name, trap.Laser.Laser.Name)
	}
	eye := probe.Ratio + trap.Ratio
	skin := probe.SkinRatio + trap.SkinRatio
	for _, e := range parts {
		if math.Abs(e.CombinedEyeRatio-eye) > 1e-12*eye || math.Abs(e.CombinedSkinRatio-skin) > 1e-12*skin {
			t.Errorf("%s: combined %g (eye), %g (skin); by hand %g, %g", e.Laser.Laser.Name, e.CombinedEyeRatio, e.CombinedSkinRatio, eye, skin)
		}
		if len(e.Wavelengths) != 2 || e.Additive != 2 || len(e.Lasers) != 2 || e.Lasers[0].Name != "probe" || e.Lasers[1].Name != "trap" {
			t.Errorf("%s: wavelengths %v, lasers %d, %d additive", e.Laser.Laser.Name, e.Wavelengths, len(e.Lasers), e.Additive)
		}
	}
	// 8.44 × + 4216 × = 4224 × the eye MPE, as the golden text prints.
	if math.Abs(eye-4224) > 1 {
		t.Errorf("combined eye ratio %g, want about 4224", eye)
	}
	if left := probe.Ratio/math.Pow(10, probe.OD) + trap.Ratio/math.Pow(10, trap.OD); left > 1 {
		t.Errorf("with OD %g and %g the exposures still sum to %g × the MPE", probe.OD, trap.OD, left)
	}
	// One finding speaks for the segment, with the sum.
	n := 0
	for _, f := range a.Hazards.Findings {
		if f.Kind == FindingExposure && f.Path == "probe" && f.Element == 2 {
			n++
			if math.Abs(f.Ratio()-eye) > 1e-9*eye {
				t.Errorf("finding ratio %g, want the sum %g", f.Ratio(), eye)
			}
		}
	}
	if n != 1 {
		t.Errorf("%d findings for the shared segment, want 1", n)
	}
}

// [setup] limits chooses the set the hazards use. A 532 nm source of 10 ps
// pulses at 1 kHz: Directive 2006/25/EC Annex II Table 2.2 prints 2.7e4
// t^0.75 C_E J/m² from 10 ps (1.52e-4 J/m² per pulse), Edition 3 a plateau
// of 2e-3 J/m² (from memory); the default takes the directive's value and
// names it, IEC 60825-1:2014 alone keeps Edition 3's. Classes follow IEC
// 60825-1:2014 either way.
func TestLimitSetChoice(t *testing.T) {
	const src = `
[setup]
exposure = "0.25 s"
%s
[[laser]]
name = "ps"
wavelength = "532 nm"
power = "10 mW"
waist = "1 mm"
emission = "pulsed"
pulse_duration = "10 ps"
repetition_rate = "1 kHz"

[[path]]
name = "p"
from = "ps"
element = [{ type = "dump", at = "100 mm" }]
`
	for _, c := range []struct {
		line     string
		set      limits.LimitSet
		perPulse float64
	}{
		{"", limits.SetDirective, 2.7e4 * math.Pow(1e-11, 0.75)},
		{`limits = "strictest"`, limits.SetDirective, 2.7e4 * math.Pow(1e-11, 0.75)},
		{`limits = "2006/25/EC"`, limits.SetDirective, 2.7e4 * math.Pow(1e-11, 0.75)},
		{`limits = "IEC 60825-1:2014"`, limits.SetIEC, 2e-3},
	} {
		a := load(t, fmt.Sprintf(src, c.line))
		ll := a.Hazards.Lasers[0]
		p := ll.Pulsed
		// Rule 3 over the 250 pulses of 0.25 s: C5 = 250^−0.25.
		want := c.perPulse * math.Pow(250, -0.25)
		if math.Abs(p.PerPulse-want) > 1e-9*want || ll.EyeSet != c.set || p.Set != c.set {
			t.Errorf("%q: %g J/m² per pulse from %q (eye set %q), want %g from %q", c.line, p.PerPulse, p.Set, ll.EyeSet, want, c.set)
		}
	}
	if _, err := setup.Parse("t.toml", []byte(fmt.Sprintf(src, `limits = "ANSI Z136.1"`))); err == nil || !strings.Contains(err.Error(), "limits") {
		t.Errorf("an unknown limit set: %v", err)
	}
}
