package drive

import (
	"fmt"
	"math"
	"os"
	"strings"
	"testing"

	"beamledger/budget"
	"beamledger/budget/atoms"
	"beamledger/budget/optics"
	"beamledger/budget/setup"
)

func demoDrive(t *testing.T) []*AtomsResult {
	t.Helper()
	s, err := setup.Load("../../testdata/examples/table-c.toml")
	if err != nil {
		t.Fatal(err)
	}
	b, err := budget.Compute(s)
	if err != nil {
		t.Fatal(err)
	}
	return Evaluate(b)
}

// The demo's drive beam, by hand: b0 = σ0 N/(2π σx σy) with σ0 = 2.906 692 ×
// 10⁻⁹ cm² (Steck, Rubidium 87 D Line Data, table 3), N = 2·10⁴, σ = 6 µm:
// B0 = 2.906692e-13 · 2e4 / (2π · 36e-12) = 25.70; Ω_c = b0 Γ/8 with
// Γ/2π = 6.0666 MHz: Ω_c/2π = 19.49 MHz; s_c = b0²/32 = 20.64. The laser's
// 80 MHz detuning and the −1 order of the 80 MHz AOM cancel: Δ = 0.
func TestDemoDriveByHand(t *testing.T) {
	d := demoDrive(t)
	if len(d) != 2 {
		t.Fatalf("%d atoms results, want 2", len(d))
	}
	a := d[0]
	if !near(a.OpticalDepth, 25.70, 2e-4) {
		t.Errorf("b0 = %g, want 25.70", a.OpticalDepth)
	}
	if a.Detuning != 0 || a.DetuningSource != setup.DetuningFromLaser {
		t.Errorf("Δ = %g (%s), want 0 from laser + AOM", a.Detuning, a.DetuningSource)
	}
	g := a.Goal
	if g == nil || g.Collective == nil {
		t.Fatal("no collective goal")
	}
	if got := g.Collective.OmegaC / (2 * math.Pi); !near(got, 19.49e6, 3e-4) {
		t.Errorf("Ω_c/2π = %g, want 19.49 MHz", got)
	}
	if !near(g.Collective.SatC, 20.64, 3e-4) {
		t.Errorf("s_c = %g, want 20.64", g.Collective.SatC)
	}
	// Power needed: s = (1.5)² s_c at the cloud centre, reached through the
	// half of the column in front of it: at resonance (a = 1) the incident
	// s_in satisfies ln(s_in/s) + s_in − s = b0/2 (the saturable-absorber
	// relation, Reinaudi et al., Opt. Lett. 32, 3143 (2007), eq. (1));
	// I = s_in I_sat, P = I π W²/2 at the atoms, divided by the path's
	// transmission to the atoms.
	wx, wy := a.Row.BeamIn.Radii()
	s := 1.5 * 1.5 * g.Collective.SatC
	sIn := g.Intensity / 16.6933
	if rel := math.Log(sIn/s) + sIn - s; !near(rel, a.OpticalDepth/2, 1e-9) {
		t.Errorf("ln(s_in/s) + s_in − s = %g, want b0/2 = %g", rel, a.OpticalDepth/2)
	}
	pAtoms := sIn * 16.6933 * math.Pi * wx * wy / 2
	if !near(g.PowerAtAtoms, pAtoms, 1e-9) || !near(g.SourcePower, pAtoms/a.Row.FractionIn, 1e-9) {
		t.Errorf("power at atoms %g (want %g), at source %g", g.PowerAtAtoms, pAtoms, g.SourcePower)
	}
	if !g.Met || !near(g.MarginDB, 10*math.Log10(1.1/g.SourcePower), 1e-12) {
		t.Errorf("margin %g dB, met %v", g.MarginDB, g.Met)
	}
}

// The demo's trap beam against the polarizability of Rb at 1064 nm,
// α ≈ 687 a.u. (Safronova, Arora and Clark, PRA 73, 022505 (2006), from
// memory): U = −α I/(2ε0 c), within 3 % (the core is not modelled).
func TestDemoTrapDepth(t *testing.T) {
	a := demoDrive(t)[1]
	if !a.FarDetuned || a.Dipole == nil {
		t.Fatal("trap beam not far detuned")
	}
	want := -687 * atoms.AUPol * a.PeakIrradiance / (2 * atoms.Eps0 * atoms.C)
	if math.Abs(a.Dipole.Depth-want) > 0.03*math.Abs(want) {
		t.Errorf("U = %g J, α-based estimate %g J", a.Dipole.Depth, want)
	}
	g := a.Goal
	// The goal's power makes a trap whose depth, at its real minimum (here
	// 180 µm from the cloud, at the beam's focus) and with gravity, over
	// the lowest saddle of a flooded search, is the target.
	k := g.Intensity / a.PeakIrradiance
	n := a.Row.Element.Direction
	u, v := setup.BeamAxes(n)
	f := &field{mass: a.Cloud.Data.Mass, down: a.Cloud.Down, flood: true, beams: []fieldBeam{{x: a.Row.BeamIn.X, y: a.Row.BeamIn.Y, λ: a.Row.BeamIn.Wavelength, power: k * a.Power, perI: a.Dipole.PerIntensity, n: n, u: u, v: v}}}
	if tr := f.findTrap(); !tr.Holds || !near(tr.Depth/atoms.KB, 0.5e-3, 1e-3) { // the bisection stops at 1e-3
		t.Errorf("the goal's power makes a trap %g K deep (holds %v), want 0.5 mK", tr.Depth/atoms.KB, tr.Holds)
	}
}

const goalLab = `
[[laser]]
name = "l"
wavelength = "780.241 nm"
power = "20 mW"
waist = "1 mm"
detuning = "0 MHz"

[[path]]
name = "p"
from = "l"
  [[path.element]]
  type = "window"
  at = "10 cm"
  transmission = 0.5
  [[path.element]]
  type = "atoms"
  at = "20 cm"
  cloud = "c"
  GOAL
  [[path.element]]
  type = "dump"
  at = "30 cm"
  rating = "1 W"

[[cloud]]
name = "c"
transition = "custom"
wavelength = "780.241 nm"
linewidth = "6 MHz"
saturation_intensity = "2 mW/cm2"
atoms = 1000
rms_size = ["10 um", "10 um", "10 um"]
CLOUD
`

func goalFor(t *testing.T, goal, cloud string) (*AtomsResult, []budget.Finding) {
	t.Helper()
	src := strings.Replace(strings.Replace(goalLab, "GOAL", goal, 1), "CLOUD", cloud, 1)
	s, err := setup.Parse("goal.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	b, err := budget.Compute(s)
	if err != nil {
		t.Fatal(err)
	}
	d := Evaluate(b)
	return d[0], DriveFindings(d)
}

// By hand: W = 1 mm (waist at the laser, 0.2 m away: W = 1.0000 mm × √(1 +
// (0.2/4.0264)²) = 1.001233 mm), I_sat = 20 W/m², s = 1 needs P = I_sat π W²/2
// = 31.49 µW at the atoms and twice that at the laser (window T = 0.5).
func TestGoalSaturationByHand(t *testing.T) {
	a, f := goalFor(t, `goal = "saturation"`+"\n  goal_value = 1", "")
	w := 1e-3 * math.Sqrt(1+math.Pow(0.2/(math.Pi*1e-6/780.241e-9), 2))
	// s = 1 at the centre, through half the cloud's column: at resonance
	// ln(s_in) + s_in − 1 = b0/2 (Reinaudi et al. 2007, eq. (1)).
	sIn := a.Goal.Intensity / 20
	if rel := math.Log(sIn) + sIn - 1; !near(rel, a.OpticalDepth/2, 1e-9) {
		t.Errorf("ln(s_in) + s_in − 1 = %g, want b0/2 = %g", rel, a.OpticalDepth/2)
	}
	want := 20 * sIn * math.Pi * w * w / 2
	if g := a.Goal; !near(g.PowerAtAtoms, want, 1e-9) || !near(g.SourcePower, 2*want, 1e-9) || !g.Met {
		t.Errorf("goal %+v, want %g W at the atoms", *g, want)
	}
	if len(f) != 0 {
		t.Errorf("findings %v", f)
	}
	// Ω/2π = Γ/2π √(s/2): for Ω/2π = 6 MHz, s = 2 at the centre.
	a, _ = goalFor(t, `goal = "rabi"`+"\n  goal_value = \"6 MHz\"", "")
	sIn = a.Goal.Intensity / 20
	if rel := math.Log(sIn/2) + sIn - 2; !near(rel, a.OpticalDepth/2, 1e-9) {
		t.Errorf("rabi goal: ln(s_in/2) + s_in − 2 = %g, want b0/2 = %g", rel, a.OpticalDepth/2)
	}
}

func TestGoalShortIsAFinding(t *testing.T) {
	a, f := goalFor(t, `goal = "saturation"`+"\n  goal_value = 1e5", "")
	if a.Goal.Met || len(f) != 1 || f[0].Kind != FindingGoalShort || f[0].Severity != budget.SeverityDrive {
		t.Fatalf("goal %+v findings %+v", *a.Goal, f)
	}
	if !strings.Contains(f[0].Message, "short by") || !strings.Contains(f[0].Message, `laser "l"`) {
		t.Errorf("message %q", f[0].Message)
	}
}

func TestTrapGoalNearResonanceIsImpossible(t *testing.T) {
	a, f := goalFor(t, `goal = "trap_depth"`+"\n  goal_value = \"1 mK\"", "")
	if a.Goal.Impossible == "" || len(f) == 0 || f[0].Kind != FindingGoalImpossible {
		t.Errorf("goal %+v findings %+v", *a.Goal, f)
	}
}

// A stated collective rate N Γ_c/2π overrides the optical-depth estimate:
// Ω_c = N Γ_c / 2.
func TestCollectiveRateOverride(t *testing.T) {
	a, _ := goalFor(t, `goal = "collective"`, `collective_rate = "10 MHz"`)
	c := a.Goal.Collective
	if !c.FromRate || !near(c.OmegaC, math.Pi*10e6, 1e-12) || c.OmegaCLow != c.OmegaC {
		t.Errorf("collective %+v", *c)
	}
}

func BenchmarkDrive(b *testing.B) {
	s, _ := setup.Load("../../testdata/examples/table-c.toml")
	bud, _ := budget.Compute(s)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		Evaluate(bud)
	}
}

// The clouds of the demo: its combined trap, searched for and measured.
func BenchmarkCloudsDemo(b *testing.B) {
	s, _ := setup.Load("../../testdata/examples/table-c.toml")
	bud, _ := budget.Compute(s)
	d := Evaluate(bud)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		Clouds(bud, d)
	}
}

// rbCloudSetup is laser "l" at the given wavelength (with extra keys) on an
// Rb-87 D2 cloud, then a dump.
func rbCloudSetup(wavelength, laserExtra string) string {
	return strings.Replace(okLaser, `"780 nm"`, `"`+wavelength+`"`, 1) + laserExtra + `
[[cloud]]
name = "c"
transition = "Rb87 D2"
atoms = 1e4
rms_size = ["10 um", "10 um", "100 um"]
[[path]]
name = "p"
from = "l"
  [[path.element]]
  type = "atoms"
  at = "100 mm"
  cloud = "c"
  [[path.element]]
  type = "dump"
  at = "300 mm"
`
}

// The Rb-87 lines are 7.12 THz apart (Steck, Rubidium 87 D Line Data, rev.
// 2.2.1, tables 3 and 5: D2 384.230 484 THz, D1 377.107 463 THz). Light 500
// MHz from D1 is near D1 for a cloud driven on D2, refused; 1064 nm light is
// far from both; light 10 MHz from D2 is near-resonant on D2.
func TestNearAnotherLine(t *testing.T) {

	d1 := 377.107463380e12 // Hz, Steck Rb-87 table 5
	tests := []struct {
		name        string
		ν           float64 // Hz
		far         bool
		nearLine    string
		nearLineΔHz float64
	}{
		{"500 MHz from D1", d1 + 500e6, false, "Rb87 D1", 500e6},
		{"1064 nm", atoms.C / 1064e-9, true, "", 0},
		{"10 MHz from D2", 384.230484468e12 + 10e6, false, "", 0},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			λ := atoms.C / tc.ν
			src := rbCloudSetup(fmt.Sprintf("%.9f nm", λ*1e9), "")
			s, err := setup.Parse("n.toml", []byte(src))
			if err != nil {
				t.Fatal(err)
			}
			b, err := budget.Compute(s)
			if err != nil {
				t.Fatal(err)
			}
			a := Evaluate(b)[0]
			if a.FarDetuned != tc.far || a.NearLine != tc.nearLine || (tc.nearLine != "" && !near(a.NearLineDetuning/(2*math.Pi), tc.nearLineΔHz, 1e-3)) {
				t.Errorf("far %v, near %q at %g Hz; want far %v, near %q at %g Hz", a.FarDetuned, a.NearLine, a.NearLineDetuning/(2*math.Pi), tc.far, tc.nearLine, tc.nearLineΔHz)
			}
			if (a.Dipole != nil) != tc.far {
				t.Errorf("dipole figures %v, want %v", a.Dipole != nil, tc.far)
			}
		})
	}
}

// A stated detuning must agree with the wavelengths to DetuningTolerance of
// the transition frequency: Rb-87 D2 at 384.230 THz (Steck, table 3) allows
// 384 GHz; a wavelength written to the nearest nanometre (780 nm, 118 GHz
// off) passes, 1 nm further (780.24 → 781.24 nm, 492 GHz off) does not.
func TestStatedDetuningAgainstWavelengths(t *testing.T) {
	for _, tc := range []struct {
		wavelength string
		ok         bool
	}{{"780 nm", true}, {"780.241 nm", true}, {"781.24 nm", false}, {"1064 nm", false}} {
		t.Run(tc.wavelength, func(t *testing.T) {
			src := rbCloudSetup(tc.wavelength, `detuning = "-20 MHz"`)
			_, err := setup.Parse("d.toml", []byte(src))
			if (err == nil) != tc.ok {
				t.Errorf("%s: error %v, want accepted %v", tc.wavelength, err, tc.ok)
			}
			if err != nil && !strings.Contains(err.Error(), "d.toml:7: laser \"l\"") {
				t.Errorf("%s: message names no laser line: %v", tc.wavelength, err)
			}
		})
	}
}

// The axial curvature of the on-axis irradiance, and the axial trap
// frequency the drive reports from it: at the focus of a round beam
// κ = −2/z_R², so ω_z = √(2U0/(m z_R²)) (Grimm et al. (2000), eq. (37));
// at z = z_R/2, with W² = W0²(1 + z²/z_R²) (Siegman, Lasers (1986), §17.1),
// κ = (6u² − 2)/((1 + u²)² z_R²) = −0.32/z_R²; past z_R/√3 there is none.
func TestAxialTrapFrequencyAtAndOffFocus(t *testing.T) {
	const w0, λ, u0, m = 25e-6, 1064e-9, 1e-27, 1.443160648e-25
	zR := math.Pi * w0 * w0 / λ
	focus := optics.Beam{Wavelength: λ, X: optics.NewPlane(w0, 0, 1, λ), Y: optics.NewPlane(w0, 0, 1, λ)}
	for _, tc := range []struct {
		name string
		z    float64 // distance of the atoms past the focus, m
		κ    float64 // 1/m²
	}{
		{"at the focus", 0, -2 / (zR * zR)},
		{"half a Rayleigh range off", zR / 2, -0.32 / (zR * zR)},
	} {
		t.Run(tc.name, func(t *testing.T) {
			b := focus.Propagate(tc.z)
			if got := axialCurvature(b); !near(got, tc.κ, 1e-5) {
				t.Errorf("κ = %g, want %g", got, tc.κ)
			}
			want := math.Sqrt(-u0 * tc.κ / m)
			if got := atoms.AxialTrapFrequency(u0, axialCurvature(b), m); !near(got, want, 1e-5) {
				t.Errorf("ω_z = %g, want %g", got, want)
			}
		})
	}
	if κ := axialCurvature(focus.Propagate(zR)); κ <= 0 || !math.IsNaN(atoms.AxialTrapFrequency(u0, κ, m)) {
		t.Errorf("one Rayleigh range off the focus: κ = %g, want positive and no frequency", κ)
	}
}

// On the demo's pencil cloud (b0 = 25.7 on resonance) the budget names the
// scattered light at the atoms element, at the laser's maximum power, and
// the drive gives the transmission at the operating power; the balance
// closes.
func TestScatteredByTheAtoms(t *testing.T) {
	d := demoDrive(t)
	a := d[0]
	r := a.Row
	scattered := 0.0
	for _, l := range r.Losses {
		if l.Kind == budget.LossScattered {
			scattered = l.Fraction
		}
	}
	wx, wy := r.BeamIn.Radii()
	col := budget.ColumnFor(a.Path, a.Path.First+a.Path.RowIndex(r), r.Element, a.Cloud, 0)
	atMax := col.Absorb(r.FractionIn*a.Path.Laser.Power, wx, wy).Transmission
	if want := r.FractionIn * (1 - atMax); math.Abs(scattered-want) > 1e-12 || scattered <= 0 {
		t.Errorf("scattered %g of the source, want %g", scattered, want)
	}
	if !(a.Absorption.Transmission > 0 && a.Absorption.Transmission < 1) || math.Abs(a.ScatteredPower-a.Power*(1-a.Absorption.Transmission)) > 1e-15 {
		t.Errorf("transmission %g, scattered %g W of %g W", a.Absorption.Transmission, a.ScatteredPower, a.Power)
	}
	if !(a.Absorption.Entrance > a.Absorption.Centre && a.Absorption.Centre > a.Absorption.Exit) {
		t.Errorf("s along the axis %g, %g, %g must fall", a.Absorption.Entrance, a.Absorption.Centre, a.Absorption.Exit)
	}
}

// The goal's places: at the exit the incident s satisfies ln(s_in/s) + s_in
// − s = b0 Φ(2) (the column in front of +2 rms; Reinaudi et al. 2007,
// eq. (1) at resonance); for "all", the incident drive found puts the asked
// share of the atoms above the goal.
func TestGoalAtExitAndAll(t *testing.T) {
	a, _ := goalFor(t, "goal = \"saturation\"\n  goal_value = 1\n  goal_at = \"exit\"", "")
	sIn := a.Goal.Intensity / 20
	if rel := math.Log(sIn) + sIn - 1; !near(rel, a.OpticalDepth*atoms.ColumnFraction(2), 1e-9) {
		t.Errorf("exit: ln(s_in) + s_in − 1 = %g, want b0 Φ(2) = %g", rel, a.OpticalDepth*atoms.ColumnFraction(2))
	}
	a, _ = goalFor(t, "goal = \"saturation\"\n  goal_value = 1\n  goal_at = \"all\"\n  goal_fraction = 0.8", "")
	col := budget.ColumnFor(a.Path, a.Path.First+a.Path.RowIndex(a.Row), a.Row.Element, a.Cloud, 0)
	wx, wy := a.Row.BeamIn.Radii()
	if f := col.FractionAbove(a.Goal.Intensity/20, wx, wy, 1); math.Abs(f-0.8) > 1e-3 || a.Goal.At != setup.GoalAtAll || a.Goal.Fraction != 0.8 {
		t.Errorf("all: %g of the atoms above the goal at the goal's drive, want 0.8", f)
	}
}

// A goal beyond the laser's maximum power: goal-short's probe needs more
// than its 2 mW (its power and operating power), so no setting meets it;
// the same laser able to give 3 mW at most, run at 2 mW, falls short but
// could meet it (common practice: compare the need with the laser's
// maximum, not only its operating point).
func TestGoalBeyondMaximumPower(t *testing.T) {
	src, err := os.ReadFile("../../testdata/examples/goal-short.toml")
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		power  string
		beyond bool
	}{{`power = "2 mW"`, true}, {`power = "3 mW"` + "\noperating_power = \"2 mW\"", false}} {
		s, err := setup.Parse("g.toml", []byte(strings.Replace(string(src), `power = "2 mW"`, c.power, 1)))
		if err != nil {
			t.Fatal(err)
		}
		b, err := budget.Compute(s)
		if err != nil {
			t.Fatal(err)
		}
		g := Evaluate(b)[0].Goal
		if g.Met || g.BeyondMaximum != c.beyond || g.BeyondMaximum != (g.SourcePower > g.Maximum) || g.Maximum != s.Lasers[0].Power {
			t.Errorf("%s: needs %g W, maximum %g W, beyond %v; want beyond %v", c.power, g.SourcePower, g.Maximum, g.BeyondMaximum, c.beyond)
		}
		msgs := ""
		for _, f := range DriveFindings(Evaluate(b)) {
			msgs += f.Message
		}
		if strings.Contains(msgs, "more than its maximum power") != c.beyond {
			t.Errorf("%s: findings %q", c.power, msgs)
		}
	}
}

// An upper bound (goal_max) is the same figure read the other way: the
// source power at which s reaches the value is the same as for goal_value,
// the margin has the opposite sign, and the verdict flips (the power at
// which s = 1 is reached, found by hand from I = s·I_sat over the beam's
// peak irradiance, is the same number both ways).
func TestUpperBoundGoal(t *testing.T) {
	src := `
[[laser]]
name = "probe"
wavelength = "780.241 nm"
power = "20 mW"
waist = "1 mm"
detuning = "0 MHz"

[[path]]
name = "p"
from = "probe"
element = [{ type = "atoms", at = "100 mm", cloud = "c", goal = "saturation", %s = %s }, { type = "dump", at = "300 mm" }]

[[cloud]]
name = "c"
transition = "Rb87 D2"
atoms = 1
rms_size = ["10 um", "10 um", "10 um"]
`
	run := func(key, v string) *GoalResult {
		s, err := setup.Parse("goal.toml", []byte(fmt.Sprintf(src, key, v)))
		if err != nil {
			t.Fatal(err)
		}
		b, err := budget.Compute(s)
		if err != nil {
			t.Fatal(err)
		}
		return Evaluate(b)[0].Goal
	}
	for _, v := range []string{"0.1", "1000"} {
		lo, hi := run("goal_value", v), run("goal_max", v)
		if !hi.Upper || lo.Upper || !near(hi.SourcePower, lo.SourcePower, 1e-12) || !near(hi.MarginDB, -lo.MarginDB, 1e-12) || hi.Met == lo.Met {
			t.Errorf("s %s: at least %+v, at most %+v", v, lo, hi)
		}
	}
	// One atom leaves the beam unabsorbed: s = 1 takes I_sat = 1.66933
	// mW/cm² (Steck, Rubidium 87 D Line Data, table 3) at the peak, 2P/(πW²)
	// with W = 1 mm: P = I_sat π W²/2 = 26.22 µW.
	if g := run("goal_max", "1"); !near(g.SourcePower, 16.6933*math.Pi*1e-6/2, 1e-3) || g.Met {
		t.Errorf("s at most 1: %g W the most, met %v", g.SourcePower, g.Met)
	}
}

// A goal on a path a probe joins on a combiner, the path's own laser far
// detuned: the saturation goal is the probe's (the one near-resonant beam
// there), judged at the probe's power and sampled with the probe's
// toleranced window; the trap's beam at the element has no goal.
func TestGoalOnASharedPathIsTheServingLasers(t *testing.T) {
	s, err := setup.Load("testdata/shared-goal.toml")
	if err != nil {
		t.Fatal(err)
	}
	b, err := budget.ComputeAtOperating(s)
	if err != nil {
		t.Fatal(err)
	}
	d := Evaluate(b)
	var probe *AtomsResult
	for _, a := range d {
		switch {
		case a.Path.Laser.Name == "probe":
			probe = a
		case a.Goal != nil:
			t.Errorf("the %s beam carries the goal", a.Path.Laser.Name)
		}
	}
	if probe == nil || probe.Goal == nil || probe.Goal.Impossible != "" || probe.Goal.Available != 1e-3 {
		t.Fatalf("probe goal %+v", probe)
	}
	// s = 0.1 at the centre through half the column (Reinaudi et al. 2007,
	// eq. (1)), the same relation as on the probe's own path.
	sIn := probe.Goal.Intensity / probe.Isat
	if lhs := math.Log(sIn/0.1) + sIn - 0.1; !near(lhs, probe.OpticalDepth/2, 1e-6) {
		t.Errorf("ln(s_in/s) + s_in − s = %g, want b0/2 = %g", lhs, probe.OpticalDepth/2)
	}
	res := Tolerances(s, d, 200, DefaultSeed, 0)
	if gt := res[probe]; gt == nil || gt.NoSpread || len(gt.Contributors) != 1 {
		t.Errorf("the probe's goal sampled: %+v", gt)
	}
}
