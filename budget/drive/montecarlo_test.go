package drive

import (
	"beamledger/budget"
	"beamledger/budget/setup"
	"beamledger/budget/setup/synth"
	"math"
	"slices"
	"strings"
	"testing"
	"time"

	"gonum.org/v1/gonum/stat/distuv"
)

// tolLab is one laser through an AOM whose efficiency is toleranced (EFF)
// and a second toleranced transmission (T2), onto a thin cloud with a
// saturation goal (GOAL).
const tolLab = `
[[laser]]
name = "l"
wavelength = "780.241 nm"
power = "20 mW"
operating_power = "10 mW"
waist = "1 mm"
detuning = "0 MHz"

[[path]]
name = "p"
from = "l"
  [[path.element]]
  type = "aom"
  at = "10 cm"
  efficiency = EFF
  [[path.element]]
  type = "window"
  at = "15 cm"
  transmission = T2
  [[path.element]]
  type = "atoms"
  at = "20 cm"
  cloud = "c"
  goal = "saturation"
  goal_value = GOAL
  [[path.element]]
  type = "dump"
  at = "30 cm"
  rating = "1 W"

[[cloud]]
name = "c"
transition = "Rb87 D2"
atoms = 1
rms_size = ["10 um", "10 um", "10 um"]
`

func tolSetup(t *testing.T, eff, t2, goal string) (*setup.Setup, []*AtomsResult) {
	t.Helper()
	src := strings.NewReplacer("EFF", eff, "T2", t2, "GOAL", goal).Replace(tolLab)
	s, err := setup.Parse("tol.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	b, err := budget.Compute(s)
	if err != nil {
		t.Fatal(err)
	}
	return s, Evaluate(b)
}

// A single efficiency uniform on [a, b]: the margin is M0 + 10 log10(η/η0)
// for the nominal η0 = (a + b)/2, so the goal is met for η ≥ η* = η0
// 10^(−M0/10), with probability (b − η*)/(b − a) (the uniform
// distribution's tail); the Monte Carlo share agrees within three binomial
// standard errors at 10 000 samples.
func TestToleranceUniformProbability(t *testing.T) {
	s, d := tolSetup(t, `"0.5 .. 0.9"`, "1", "250")
	gt, a := Tolerances(s, d, 10000, DefaultSeed, 0)[d[0]], d[0]
	η0 := 0.7
	ηs := η0 * math.Pow(10, -a.Goal.MarginDB/10)
	if ηs < 0.5 || ηs > 0.9 {
		t.Fatalf("η* = %g is outside the range; adjust the goal", ηs)
	}
	want := (0.9 - ηs) / 0.4
	se := math.Sqrt(want * (1 - want) / 10000)
	if math.Abs(gt.ProbabilityMet-want) > 3*se {
		t.Errorf("P(met) = %g, want %g ± %g", gt.ProbabilityMet, want, 3*se)
	}
	if math.Abs(gt.Nominal-a.Goal.MarginDB) > 1e-9 {
		t.Errorf("nominal %g dB, the goal's %g dB", gt.Nominal, a.Goal.MarginDB)
	}
	if w := a.Goal.MarginDB + 10*math.Log10(0.5/0.7); math.Abs(gt.Worst-w) > 1e-6 {
		t.Errorf("worst %g dB, want %g dB (η at 0.5)", gt.Worst, w)
	}
}

// A normal efficiency 0.7 ± 0.05: P(met) = Φ((μ − η*)/σ) (gonum's
// distuv.Normal; the truncation to [0, 1] is 14 σ away and negligible).
func TestToleranceNormalProbability(t *testing.T) {
	s, d := tolSetup(t, `"0.7 ± 0.05"`, "1", "250")
	gt, a := Tolerances(s, d, 10000, DefaultSeed, 0)[d[0]], d[0]
	ηs := 0.7 * math.Pow(10, -a.Goal.MarginDB/10)
	want := distuv.Normal{Mu: 0, Sigma: 1}.CDF((0.7 - ηs) / 0.05)
	se := math.Sqrt(want * (1 - want) / 10000)
	if math.Abs(gt.ProbabilityMet-want) > 3*se+1e-9 {
		t.Errorf("P(met) = %g, want %g ± %g", gt.ProbabilityMet, want, 3*se)
	}
}

// Two small independent normal transmissions: the margin in dB is their
// sum of 10 log10 T_i plus a constant, so (delta method) its variance is
// (10/ln 10)² Σ σ_i²/μ_i² and its mean the nominal margin less
// (10/ln 10) Σ σ_i²/(2 μ_i²); the Monte Carlo agrees within three standard
// errors (mean) and 5 % (variance); the two inputs share the spread in the
// ratio of their σ_i²/μ_i².
func TestToleranceDeltaMethod(t *testing.T) {
	s, d := tolSetup(t, `"0.8 ± 0.008"`, `"0.9 ± 0.018"`, "1")
	gt := Tolerances(s, d, 10000, DefaultSeed, 0)[d[0]]
	k := 10 / math.Ln10
	v1, v2 := 0.008*0.008/(0.8*0.8), 0.018*0.018/(0.9*0.9)
	wantVar := k * k * (v1 + v2)
	wantMean := gt.Nominal - k*(v1+v2)/2
	mean, vari := 0.0, 0.0
	for _, m := range gt.Margins {
		mean += m
	}
	mean /= float64(len(gt.Margins))
	for _, m := range gt.Margins {
		vari += (m - mean) * (m - mean)
	}
	vari /= float64(len(gt.Margins) - 1)
	if math.Abs(mean-wantMean) > 3*math.Sqrt(wantVar/float64(len(gt.Margins))) {
		t.Errorf("mean margin %g dB, want %g dB", mean, wantMean)
	}
	if math.Abs(vari-wantVar) > 0.05*wantVar {
		t.Errorf("variance %g dB², want %g dB²", vari, wantVar)
	}
	if len(gt.Contributors) != 2 || gt.Contributors[0].Input.Key != "transmission" || math.Abs(gt.Contributors[0].Share-v2/(v1+v2)) > 0.03 {
		t.Errorf("contributors %+v, want the window first with %.2f", gt.Contributors, v2/(v1+v2))
	}
}

// The same seed gives the same samples on one goroutine and on sixteen.
func TestToleranceDeterminism(t *testing.T) {
	s, d := tolSetup(t, `"0.5 .. 0.9"`, `"0.9 ± 0.02"`, "1")
	a := Tolerances(s, d, 2000, DefaultSeed, 1)[d[0]]
	b := Tolerances(s, d, 2000, DefaultSeed, 16)[d[0]]
	if !slices.Equal(a.Margins, b.Margins) || a.P05 != b.P05 || a.ProbabilityMet != b.ProbabilityMet {
		t.Error("the analysis depends on the number of goroutines")
	}
}

// A whole-cloud goal is sampled too: a single trap beam without gravity,
// its operating power uniform on [4 W, 6 W]; the depth is linear in the
// power, so the goal is met for P ≥ P* = 5 W · 10^(−M0/10), with
// probability (6 W − P*)/(2 W), within three binomial standard errors.
func TestToleranceCloudGoal(t *testing.T) {
	src := strings.Replace(beamOn("trap", "1064 nm", "7 W", "50 um", "z"), `power = "7 W"`, "power = \"7 W\"\noperating_power = \"4 W .. 6 W\"", 1) +
		cloudC("none", "goal = \"trap_depth\"\ngoal_value = \"190 uK\"")
	s, err := setup.Parse("t.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	b, _ := budget.Compute(s)
	d := Evaluate(b)
	cs := Clouds(b, d)
	res := Tolerances(s, d, 2000, DefaultSeed, 0)
	gt := res[s.Clouds[0]]
	if gt == nil || cs[0].Goal == nil {
		t.Fatalf("no cloud goal analysis: %v", res)
	}
	ps := 5 * math.Pow(10, -cs[0].Goal.MarginDB/10)
	want := math.Max(0, math.Min(1, (6-ps)/2))
	se := math.Sqrt(want*(1-want)/2000) + 1e-3
	if math.Abs(gt.ProbabilityMet-want) > 3*se {
		t.Errorf("P(met) = %g, want %g ± %g (P* = %g W)", gt.ProbabilityMet, want, 3*se, ps)
	}
}

// The progress callback ends with every sample done, and never reports
// more than there are; the result is the one Tolerances gives.
func TestTolerancesProgress(t *testing.T) {
	s, d := tolSetup(t, `"0.5 .. 0.9"`, "1", "250")
	var last, calls int
	got := TolerancesWithProgress(s, d, 3000, DefaultSeed, 0, func(n int) {
		if n > 3000 || n < last {
			t.Errorf("progress %d after %d", n, last)
		}
		last, calls = n, calls+1
	})
	want := Tolerances(s, d, 3000, DefaultSeed, 0)
	if last != 3000 || calls < 1 || got[d[0]].P50 != want[d[0]].P50 {
		t.Errorf("last %d after %d calls; P50 %g, want %g", last, calls, got[d[0]].P50, want[d[0]].P50)
	}
}

// A run stopped early reports the first samples all done, marked as
// such, and they are the same samples a run of that many gives (each
// sample's inputs come from its own stream); a run stopped before any
// sample gives no analysis. A long run's duration is projected once it has
// run EstimateAfter.
func TestToleranceRunStopped(t *testing.T) {
	s, d := tolSetup(t, `"0.5 .. 0.9"`, "1", "250")
	closed := make(chan struct{})
	close(closed)
	if res := TolerancesRun(s, d, Run{Samples: 1000, Seed: 7, Stop: closed}); res != nil {
		t.Errorf("stopped before any sample: %v", res)
	}
	stop := make(chan struct{})
	var estimated time.Duration
	go func() { time.Sleep(EstimateAfter + 2*ProgressEvery); close(stop) }()
	res := TolerancesRun(s, d, Run{Samples: 5_000_000, Seed: 7, Stop: stop, Estimate: func(e time.Duration) { estimated = e }})
	if len(res) != 1 || !(estimated > 0) {
		t.Fatalf("analyses %v, estimate %v", res, estimated)
	}
	for owner, gt := range res {
		if !gt.Interrupted || gt.Requested != 5_000_000 || gt.Samples >= gt.Requested || gt.Samples != len(gt.Margins) {
			t.Fatalf("%+v", gt)
		}
		full := TolerancesRun(s, d, Run{Samples: gt.Samples, Seed: 7})[owner]
		if full.Interrupted || !slices.Equal(full.Margins, gt.Margins) || full.P50 != gt.P50 {
			t.Errorf("the first %d samples differ from a run of that many", gt.Samples)
		}
	}
}

// A goal no toleranced input reaches (the tolerance sits on another
// path's window) has no spread: no shares are given, and it says so
// (a regression on rounding noise printed 50 % / 50 %).
func TestToleranceWithoutSpread(t *testing.T) {
	src := tolLab + `
[[laser]]
name = "other"
wavelength = "1064 nm"
power = "1 W"
waist = "1 mm"

[[path]]
name = "other"
from = "other"

  [[path.element]]
  type = "window"
  at = "100 mm"
  transmission = "0.9 .. 0.99"

  [[path.element]]
  type = "dump"
  at = "200 mm"
  rating = "5 W"
`
	src = strings.NewReplacer("EFF", "0.8", "T2", "1", "GOAL", "250").Replace(src)
	s, err := setup.Parse("nospread.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	b, _ := budget.ComputeAtOperating(s)
	res := Tolerances(s, Evaluate(b), 500, DefaultSeed, 0)
	if len(res) != 1 {
		t.Fatalf("analyses %v", res)
	}
	for _, gt := range res {
		if !gt.NoSpread || gt.Contributors != nil {
			t.Errorf("no spread %v, contributors %+v", gt.NoSpread, gt.Contributors)
		}
	}
}

// A run whose toleranced inputs move only powers settles each sample's
// element goals from the power arriving at the atoms; every margin is the
// one the full solution gives, bit for bit (weak-probe: a saturation goal
// through a thick column; generated labs: saturation goals behind
// toleranced lenses and operating powers), and the shortcut is taken.
func TestPowerOnlySamplesSettle(t *testing.T) {
	var setups []*setup.Setup
	s, err := setup.Load("../../testdata/examples/weak-probe.toml")
	if err != nil {
		t.Fatal(err)
	}
	setups = append(setups, s)
	for _, seed := range []uint64{5, 6} { // the benchmark lab and another
		s, err := setup.Parse("gen.toml", []byte(synth.Lab(seed, synth.Options{Lasers: 10, ElementsPerPath: 19, Tolerances: true})))
		if err != nil {
			t.Fatal(err)
		}
		setups = append(setups, s)
	}
	defer func() { sampleShortcut = true }()
	for _, s := range setups {
		if !powerOnly(s) {
			t.Fatalf("%s: not a power-only run", s.File)
		}
		b, err := Budget(s, true)
		if err != nil {
			t.Fatal(err)
		}
		d := Evaluate(b)
		sampleShortcut = true
		fast := Tolerances(s, d, 300, 7, 1)
		sampleShortcut = false
		full := Tolerances(s, d, 300, 7, 1)
		if len(fast) == 0 || len(fast) != len(full) {
			t.Fatalf("%s: %d goals analysed, %d in full", s.File, len(fast), len(full))
		}
		for k, gt := range full {
			if !slices.Equal(fast[k].Margins, gt.Margins) {
				t.Errorf("%s: margins differ from the full solution", s.File)
			}
		}
	}
	// A toleranced focal length changes the beam at the atoms: no shortcut.
	c := setups[0].Clone()
	c.Tolerances = append(c.Tolerances, &setup.Toleranced{Key: "focal_length", Laser: -1})
	if powerOnly(c) {
		t.Error("a focal length counted as power only")
	}
}
