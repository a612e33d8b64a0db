package drive_test

import (
	"fmt"
	"math"
	"testing"

	"beamledger/budget"
	"beamledger/budget/drive"
	"beamledger/budget/setup"
	"beamledger/budget/setup/synth"
)

// computed loads and computes a generated lab.
func computed(t testing.TB, seed uint64, o synth.Options) (*setup.Setup, *budget.Budget) {
	t.Helper()
	s, err := setup.Parse(fmt.Sprintf("gen-%d.toml", seed), []byte(synth.Lab(seed, o)))
	if err == nil {
		var b *budget.Budget
		if b, err = budget.Compute(s); err == nil {
			return s, b
		}
	}
	t.Fatalf("seed %d: generated setup: %v", seed, err)
	return nil, nil
}

// Every beam at a cloud is counted, and the combined figures are finite:
// the potential at the cloud, a trap's depth (≥ 0), frequencies (> 0) and
// position, the totals of the near-resonant beams (generated labs put
// several beams of several lasers on one cloud).
func TestCloudsFiniteOnGeneratedLabs(t *testing.T) {
	for seed := uint64(1); seed <= 60; seed++ {
		_, b := computed(t, seed, synth.Options{Lasers: 3, ElementsPerPath: 8, Splits: 1, Merges: seed%2 == 0})
		results := drive.Evaluate(b)
		clouds := drive.Clouds(b, results)
		for _, cr := range clouds {
			n := 0
			for _, a := range results {
				if a.Cloud == cr.Cloud {
					n++
				}
			}
			if n != len(cr.Beams) {
				t.Fatalf("seed %d: %d beams at cloud %q, %d atoms results", seed, len(cr.Beams), cr.Cloud.Name, n)
			}
			bad := func(v float64) bool { return math.IsNaN(v) || math.IsInf(v, 0) }
			if bad(cr.PotentialAtCloud) || bad(cr.SaturationTotal) || cr.SaturationTotal < 0 || bad(cr.ScatteringRate) || bad(cr.GroundShift) {
				t.Fatalf("seed %d: cloud figures %+v", seed, cr)
			}
			if tr := cr.Trap; tr != nil && tr.Found {
				if bad(tr.Depth) || tr.Depth < 0 || bad(tr.Sag) {
					t.Fatalf("seed %d: trap %+v", seed, tr)
				}
				for i, f := range tr.Frequencies {
					if !(f > 0) || bad(f) || bad(tr.Minimum[i]) {
						t.Fatalf("seed %d: trap frequencies %v at %v", seed, tr.Frequencies, tr.Minimum)
					}
				}
			}
		}
	}
}

// The tolerance analysis of a generated 200-element lab with 62
// tolerances and 28 goals, 10 000 samples on all cores (docs/speed.md's figure).
func BenchmarkTolerances200(b *testing.B) {
	s, bu := computed(b, 5, synth.Options{Lasers: 10, ElementsPerPath: 19, Tolerances: true})
	d := drive.Evaluate(bu)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		drive.Tolerances(s, d, drive.DefaultSamples, drive.DefaultSeed, 0)
	}
}

// The generated labs with tolerances load (the benchmark lab among them):
// every tolerance the generator writes is one the loader accepts.
func TestGeneratedTolerancesLoad(t *testing.T) {
	for seed := uint64(1); seed <= 8; seed++ {
		s, _ := computed(t, seed, synth.Options{Lasers: 10, ElementsPerPath: 19, Tolerances: true})
		if len(s.Tolerances) == 0 {
			t.Errorf("seed %d: no tolerances generated", seed)
		}
	}
}

// The tolerance analysis of the shipped weak-probe example (two
// tolerances, one goal), 10 000 samples on all cores.
func BenchmarkTolerancesWeakProbe(b *testing.B) {
	s, err := setup.Load("../../testdata/examples/weak-probe.toml")
	if err != nil {
		b.Fatal(err)
	}
	bu, err := drive.Budget(s, true)
	if err != nil {
		b.Fatal(err)
	}
	d := drive.Evaluate(bu)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		drive.Tolerances(s, d, drive.DefaultSamples, drive.DefaultSeed, 0)
	}
}
