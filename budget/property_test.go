package budget_test

import (
	"fmt"
	"math"
	"testing"

	"beamledger/budget"
	"beamledger/budget/setup"
	"beamledger/budget/setup/synth"
)

func generated(t testing.TB, seed uint64, o synth.Options) *budget.Budget {
	t.Helper()
	src := synth.Lab(seed, o)
	s, err := setup.Parse(fmt.Sprintf("gen-%d.toml", seed), []byte(src))
	if err != nil {
		t.Fatalf("seed %d: generated setup does not load: %v", seed, err)
	}
	b, err := budget.Compute(s)
	if err != nil {
		t.Fatalf("seed %d: %v", seed, err)
	}
	return b
}

// The budget closes: for every laser, dumps + open ends + every named loss =
// the source power, to 1e-9 relative (energy conservation; the property the
// budget must keep whatever the optics), merged paths included: a beam that
// goes into a combiner is accounted for on the path it joins.
func TestBudgetCloses(t *testing.T) {
	joined := 0
	defer func() {
		if joined == 0 {
			t.Error("no generated lab merged a beam into another path")
		}
	}()
	for seed := uint64(1); seed <= 300; seed++ {
		b := generated(t, seed, synth.Options{Lasers: 2 + int(seed%3), ElementsPerPath: 8, Splits: 2, OpenEnds: seed%2 == 0, Fibers: seed%3 == 0, Merges: seed%4 < 2})
		for _, pb := range b.Paths {
			joined += len(pb.Joined)
		}
		for _, bal := range b.Balances {
			if got := bal.Total(); math.Abs(got-1) > 1e-9 {
				t.Fatalf("seed %d, laser %q: balance sums to %.12f of the source", seed, bal.Laser.Name, got)
			}
		}
	}
}

// An element never adds power; every stated loss is non-negative; the
// branch of a splitter never carries more than arrived at it.
func TestAttenuatorsNeverAddPower(t *testing.T) {
	for seed := uint64(1); seed <= 200; seed++ {
		b := generated(t, seed, synth.Options{Lasers: 1, ElementsPerPath: 10, Splits: 1, Fibers: seed%2 == 1})
		for _, pb := range b.Paths {
			for _, r := range pb.Rows {
				if r.FractionOut > r.FractionIn*(1+1e-12) {
					t.Fatalf("seed %d, path %q, element %d: out %g > in %g", seed, pb.Path.Name, r.Element.Index, r.FractionOut, r.FractionIn)
				}
				for _, l := range r.Losses {
					if l.Fraction < 0 {
						t.Fatalf("seed %d: negative loss %+v", seed, l)
					}
				}
			}
			if pb.Path.ParentPort != nil {
				parent := b.Path(pb.Path.Parent.Name)
				for _, r := range parent.Rows {
					if r.Element == pb.Path.ParentPort && pb.StartFraction > r.FractionIn {
						t.Fatalf("seed %d: branch %q starts with %g > %g arriving at its splitter", seed, pb.Path.Name, pb.StartFraction, r.FractionIn)
					}
				}
			}
		}
	}
}

func BenchmarkComputeLargeLab(b *testing.B) {
	src := synth.Lab(7, synth.Options{Lasers: 50, ElementsPerPath: 20, Splits: 1})
	s, err := setup.Parse("large.toml", []byte(src))
	if err != nil {
		b.Fatal(err)
	}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := budget.Compute(s); err != nil {
			b.Fatal(err)
		}
	}
}

// The budget for goals (the tolerance samples') leaves out only
// absorption nothing reads: at every atoms element of every beam, the
// power and the beam arriving are those of the full budget, in the shipped
// examples and in generated labs with branches, merges and several atoms
// elements on a path (and some absorption is left out, so that the
// comparison is not of two identical computations).
func TestBudgetForGoalsReadsTheSame(t *testing.T) {
	var setups []*setup.Setup
	for _, f := range []string{"table-c", "table-c-rev4", "table-d", "weak-probe", "goal-short", "ablation-pulse", "splitter-tree", "elliptical-diode", "clipped-telescope"} {
		s, err := setup.Load("../testdata/examples/" + f + ".toml")
		if err != nil {
			t.Fatal(err)
		}
		setups = append(setups, s)
	}
	for seed := uint64(1); seed <= 40; seed++ {
		src := synth.Lab(seed, synth.Options{Lasers: 2 + int(seed%3), ElementsPerPath: 12, Splits: int(seed % 2), Merges: seed%3 == 0})
		s, err := setup.Parse("gen.toml", []byte(src))
		if err != nil {
			t.Fatal(err)
		}
		setups = append(setups, s)
	}
	skipped := 0
	for _, s := range setups {
		full, err := budget.ComputeAtOperating(s)
		if err != nil {
			t.Fatal(err)
		}
		goals, err := budget.ComputeForGoals(s, nil, nil)
		if err != nil {
			t.Fatal(err)
		}
		for i, own := range full.Paths {
			fb, gb := own.Beams(), goals.Paths[i].Beams()
			for k, pb := range fb {
				for r := range pb.Rows {
					fr, gr := &pb.Rows[r], &gb[k].Rows[r]
					if fr.Element.Type == setup.TypeAtoms && (fr.FractionIn != gr.FractionIn || fr.BeamIn != gr.BeamIn) {
						t.Errorf("%s, path %q, element %d: arriving %g (beam %+v) for goals, %g (%+v) in full", s.File, pb.Path.Name, fr.Element.Index, gr.FractionIn, gr.BeamIn, fr.FractionIn, fr.BeamIn)
					}
					if fr.Lost(budget.LossScattered) > 0 && gr.Lost(budget.LossScattered) == 0 {
						skipped++
					}
				}
			}
		}
	}
	if skipped == 0 {
		t.Error("no absorption was left out: the comparison shows nothing")
	}
}

// A budget walked again in the memory of an earlier one (the tolerance
// samples') is the budget walked afresh: every row of every beam, after the
// toleranced values moved from one end to the other.
func TestBudgetForGoalsReused(t *testing.T) {
	var setups []*setup.Setup
	s, err := setup.Load("../testdata/examples/weak-probe.toml")
	if err != nil {
		t.Fatal(err)
	}
	setups = append(setups, s)
	for seed := uint64(1); seed <= 10; seed++ {
		s, err := setup.Parse("gen.toml", []byte(synth.Lab(seed, synth.Options{Lasers: 3, ElementsPerPath: 10, Splits: int(seed % 2), Tolerances: true})))
		if err != nil {
			t.Fatal(err)
		}
		setups = append(setups, s)
	}
	for _, s := range setups {
		c := s.Clone()
		for _, tol := range s.Tolerances {
			lo, _ := tol.Tol.Ends()
			tol.Apply(c, lo)
		}
		before, err := budget.ComputeForGoals(c, nil, nil)
		if err != nil {
			t.Fatal(err)
		}
		for _, tol := range s.Tolerances {
			_, hi := tol.Tol.Ends()
			tol.Apply(c, hi)
		}
		fresh, err := budget.ComputeForGoals(c, nil, nil)
		if err != nil {
			t.Fatal(err)
		}
		reused, err := budget.ComputeForGoals(c, nil, before)
		if err != nil {
			t.Fatal(err)
		}
		if got, want := fmt.Sprintf("%+v", dump(reused)), fmt.Sprintf("%+v", dump(fresh)); got != want {
			t.Errorf("%s: walked again:\n%s\nafresh:\n%s", s.File, got, want)
		}
	}
}

// dump lists every beam's rows and end of a budget, for comparison.
func dump(b *budget.Budget) []string {
	var out []string
	for _, own := range b.Paths {
		for _, pb := range own.Beams() {
			out = append(out, fmt.Sprintf("%s/%s start %g end %g open %v %d segments", pb.Path.Name, pb.Laser.Name, pb.StartFraction, pb.EndFraction, pb.OpenEnd, len(pb.Segments)))
			for _, r := range pb.Rows {
				out = append(out, fmt.Sprintf("  %d in %g out %g clip %g losses %v beam %+v", r.Element.Index, r.FractionIn, r.FractionOut, r.ClipFraction, r.Losses, r.BeamIn))
			}
		}
	}
	for _, bal := range b.Balances {
		out = append(out, fmt.Sprintf("%s: %g %g %v", bal.Laser.Name, bal.Dumped, bal.Leaving, bal.Lost))
	}
	return out
}
