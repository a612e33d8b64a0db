package drive

import (
	"beamledger/budget/numeric"
	"beamledger/budget/setup"
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"
	"time"

	"gonum.org/v1/gonum/mat"
)

// DefaultSamples and DefaultSeed are the analysis's defaults.
const (
	DefaultSamples = 10000
	DefaultSeed    = 20261202
)

// GoalTolerance is the tolerance analysis of one goal's margin, dB.
type GoalTolerance struct {
	Samples int
	Seed    uint64
	// Nominal is the margin at the nominal values; Worst with every
	// toleranced value at the end that hurts the goal (±3σ for normals);
	// P05, P50 and P95 the percentiles of the samples.
	Nominal, Worst, P05, P50, P95 float64
	// ProbabilityMet is the share of samples whose margin is not negative.
	ProbabilityMet float64
	// Margins are the samples' margins (−Inf where the goal cannot be met).
	Margins []float64
	// Contributors rank the inputs by their share of the margin's variance,
	// from standardized regression coefficients (a linear variance
	// decomposition: share = SRC²/ΣSRC²), largest first.
	Contributors []Contributor
}

// Contributor is one input's share of a goal's spread.
type Contributor struct {
	Input *setup.Toleranced
	Share float64
}

// goalRef finds a goal again in the budget of a copy of the setup: the
// path's index and the element's row, or (cloud ≥ 0) a cloud's index.
type goalRef struct {
	path, element int
	cloud         int
	hints         *trapHints // the nominal goal's trap, where a sample's search starts
}

// margins computes every referenced goal's margin for setup s.
func margins(s *setup.Setup, refs []goalRef) []float64 {
	out := make([]float64, len(refs))
	b, err := Budget(s, true)
	if err != nil {
		for i := range out {
			out[i] = math.Inf(-1)
		}
		return out
	}
	clouds := map[string]*setup.Cloud{}
	for _, c := range s.Clouds {
		clouds[c.Name] = c
	}
	var drive []*AtomsResult // every beam at every cloud, for cloud goals
	for i, ref := range refs {
		if ref.cloud >= 0 {
			if drive == nil {
				drive = driveAll(b, pass{goals: true})
			}
			cr := cloudResult(s.Clouds[ref.cloud], drive, pass{goals: true, given: ref.hints})
			if cr != nil && cr.Goal != nil && cr.Goal.WithoutScaling {
				out[i] = math.Inf(1) // met whatever these lasers do
			} else if cr != nil && cr.Goal != nil && cr.Goal.Impossible == "" {
				out[i] = cr.Goal.MarginDB
			} else {
				out[i] = math.Inf(-1)
			}
			continue
		}
		pb := b.Paths[ref.path]
		r := &pb.Rows[ref.element]
		a := atomsAt(b, pb, r, clouds[r.Element.Cloud], pass{goals: true, given: ref.hints})
		if g := a.Goal; g != nil && g.Impossible == "" {
			out[i] = g.MarginDB
		} else {
			out[i] = math.Inf(-1)
		}
	}
	return out
}

// Tolerances analyses every goal, of the paths' own beams at atoms
// elements and of whole clouds, in samples Monte Carlo samples from seed,
// on up to workers goroutines (0: all cores). It returns one analysis per
// goal, keyed by the *AtomsResult or the *Cloud it belongs to.
//
// Tolerance analysis: Monte Carlo over the whole budget. Every sample
// draws each toleranced value from its own distribution with its own random
// stream (PCG seeded by the seed and the sample's number), re-propagates
// every beam and re-solves every goal, so the result is the same on any
// number of cores.
func Tolerances(s *setup.Setup, drive []*AtomsResult, samples int, seed uint64, workers int) map[any]*GoalTolerance {
	return TolerancesWithProgress(s, drive, samples, seed, workers, nil)
}

// ProgressEvery is how often TolerancesWithProgress reports the samples
// done.
const ProgressEvery = 250 * time.Millisecond

// TolerancesWithProgress is Tolerances that calls progress (when not nil)
// with the number of samples done every ProgressEvery while the samples
// run, and once with all of them at the end; progress runs on its own
// goroutine, never two calls at once.
func TolerancesWithProgress(s *setup.Setup, drive []*AtomsResult, samples int, seed uint64, workers int, progress func(done int)) map[any]*GoalTolerance {
	if len(s.Tolerances) == 0 || samples <= 0 {
		return nil
	}
	var refs []goalRef
	var owners []any // the *AtomsResult or *Cloud each goal belongs to
	for _, a := range drive {
		if a.Goal == nil || a.Path.IsJoined() {
			continue
		}
		h := a.Goal.hints
		refs = append(refs, goalRef{slices.Index(s.Paths, a.Path.Path), a.Path.RowIndex(a.Row), -1, &h})
		owners = append(owners, a)
	}
	for i, c := range s.Clouds {
		if c.Goal != "" {
			ref := goalRef{cloud: i}
			if cr := cloudResult(c, drive, pass{full: true, goals: true}); cr != nil && cr.Goal != nil {
				if cr.Goal.WithoutScaling {
					continue // met with its lasers off: nothing to sample
				}
				ref.hints = &cr.Goal.hints
			}
			refs = append(refs, ref)
			owners = append(owners, c)
		}
	}
	if len(refs) == 0 {
		return nil
	}
	nt := len(s.Tolerances)
	inputs := make([]float64, samples*nt)
	results := make([]float64, samples*len(refs))
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = max(1, min(workers, samples))
	var done atomic.Int64
	stop := make(chan struct{})
	reported := make(chan struct{})
	go func() {
		defer close(reported)
		if progress == nil {
			return
		}
		tick := time.NewTicker(ProgressEvery)
		defer tick.Stop()
		for {
			select {
			case <-tick.C:
				progress(int(done.Load()))
			case <-stop:
				progress(samples)
				return
			}
		}
	}()
	var wg sync.WaitGroup
	for w := range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			c := s.Clone()
			for i := w; i < samples; i += workers {
				r := rand.New(rand.NewPCG(seed, uint64(i)))
				x := inputs[i*nt : (i+1)*nt]
				for j, t := range s.Tolerances {
					x[j] = t.Tol.Sample(r)
					t.Apply(c, x[j])
				}
				copy(results[i*len(refs):], margins(c, refs))
				done.Add(1)
			}
		}()
	}
	wg.Wait()
	close(stop)
	<-reported

	// The nominal and worst cases, one input at a time for its bad end.
	c := s.Clone()
	nominal := margins(c, refs)
	lows := make([][]float64, nt)
	highs := make([][]float64, nt)
	for j, t := range s.Tolerances {
		lo, hi := t.Tol.Ends()
		t.Apply(c, lo)
		lows[j] = margins(c, refs)
		t.Apply(c, hi)
		highs[j] = margins(c, refs)
		t.Apply(c, t.Tol.Nominal())
	}
	out := map[any]*GoalTolerance{}
	for g, a := range owners {
		w := s.Clone()
		for j, t := range s.Tolerances {
			lo, hi := t.Tol.Ends()
			if lows[j][g] < highs[j][g] {
				t.Apply(w, lo)
			} else {
				t.Apply(w, hi)
			}
		}
		gt := &GoalTolerance{Samples: samples, Seed: seed, Nominal: nominal[g], Worst: margins(w, refs)[g]}
		gt.Margins = make([]float64, samples)
		met := 0
		for i := range samples {
			m := results[i*len(refs)+g]
			gt.Margins[i] = m
			if m >= 0 {
				met++
			}
		}
		gt.ProbabilityMet = float64(met) / float64(samples)
		sorted := slices.Clone(gt.Margins)
		slices.Sort(sorted)
		gt.P05, gt.P50, gt.P95 = numeric.Percentile(sorted, 0.05), numeric.Percentile(sorted, 0.5), numeric.Percentile(sorted, 0.95)
		gt.Contributors = contributors(s.Tolerances, inputs, gt.Margins)
		out[a] = gt
	}
	return out
}

// contributors ranks the inputs by their standardized regression
// coefficients on the margin (samples with a finite margin only):
// share = SRC²/ΣSRC².
func contributors(ts []*setup.Toleranced, inputs, y []float64) []Contributor {
	nt := len(ts)
	var rows []int
	for i, v := range y {
		if !math.IsInf(v, 0) && !math.IsNaN(v) {
			rows = append(rows, i)
		}
	}
	if len(rows) <= nt+1 {
		return nil
	}
	standard := func(get func(i int) float64) (mean, sd float64) {
		for _, i := range rows {
			mean += get(i)
		}
		mean /= float64(len(rows))
		for _, i := range rows {
			d := get(i) - mean
			sd += d * d
		}
		return mean, math.Sqrt(sd / float64(len(rows)-1))
	}
	X := mat.NewDense(len(rows), nt, nil)
	Y := mat.NewDense(len(rows), 1, nil)
	for j := range nt {
		mj, sj := standard(func(i int) float64 { return inputs[i*nt+j] })
		for k, i := range rows {
			v := 0.0
			if sj > 0 {
				v = (inputs[i*nt+j] - mj) / sj
			}
			X.Set(k, j, v)
		}
	}
	my, sy := standard(func(i int) float64 { return y[i] })
	if !(sy > 0) {
		return nil
	}
	for k, i := range rows {
		Y.Set(k, 0, (y[i]-my)/sy)
	}
	var β mat.Dense
	if err := β.Solve(X, Y); err != nil {
		return nil
	}
	total := 0.0
	for j := range nt {
		total += β.At(j, 0) * β.At(j, 0)
	}
	out := make([]Contributor, nt)
	for j := range nt {
		out[j] = Contributor{Input: ts[j], Share: β.At(j, 0) * β.At(j, 0) / total}
	}
	slices.SortStableFunc(out, func(a, b Contributor) int { return numeric.CmpFloat(b.Share, a.Share) })
	return out
}
