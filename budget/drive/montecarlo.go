package drive

import (
	"beamledger/budget"
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
	// Samples are the samples the figures are of; Requested those asked
	// for (more when the run was stopped: Interrupted).
	Samples, Requested int
	Interrupted        bool
	Seed               uint64
	// Nominal is the margin at the nominal values; Worst with every
	// toleranced value at the end that hurts the goal (±3σ for normals);
	// P05, P50 and P95 the percentiles of the samples.
	Nominal, Worst, P05, P50, P95 float64
	// ProbabilityMet is the share of samples whose margin is not negative.
	ProbabilityMet float64
	// Margins are the samples' margins (−Inf where the goal cannot be met).
	Margins []float64
	// NoSpread is set when no toleranced input moves the margin: its
	// finite samples lie within NoSpreadDB (then no Contributors).
	NoSpread bool
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
	laser         string     // the laser whose beam on the path the goal is for
	// need, in a run whose toleranced inputs move only powers (powerOnly),
	// is the nominal goal, whose power needed at the atoms no sample
	// changes: a sample settles it against the power that arrives there.
	need *GoalResult
}

// sampleShortcut lets the samples of a power-only run settle element goals
// from the power arriving (tests turn it off to compare with the full
// solution).
var sampleShortcut = true

// powerOnly reports whether every toleranced input of s only changes
// powers and no trap light shifts a detuning (a shift follows the trap's
// power): then the power an element goal needs at the atoms is the same in
// every sample.
func powerOnly(s *setup.Setup) bool {
	for _, t := range s.Tolerances {
		if !t.LossValue() && t.Key != "operating_power" {
			return false
		}
	}
	b, err := budgetForGoals(s, nil)
	return err == nil && b.Shifts == nil
}

// margins computes every referenced goal's margin for setup s.
func margins(s *setup.Setup, refs []goalRef) []float64 {
	out, _ := marginsReusing(s, refs, nil)
	return out
}

// marginsReusing is margins that walks the budget in the memory of reuse,
// an earlier budget of s (budget.ComputeForGoals), and returns the budget
// for the next call to reuse.
func marginsReusing(s *setup.Setup, refs []goalRef, reuse *budget.Budget) ([]float64, *budget.Budget) {
	out := make([]float64, len(refs))
	b, err := budgetForGoals(s, reuse)
	if err != nil {
		for i := range out {
			out[i] = math.Inf(-1)
		}
		return out, nil
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
		// The beam on the path whose goal it is (a laser joining the path
		// on a combiner may carry it).
		var pb *budget.PathBudget
		for _, q := range b.Paths[ref.path].Beams() {
			if q.Laser.Name == ref.laser {
				pb = q
			}
		}
		if pb == nil || ref.element >= len(pb.Rows) {
			out[i] = math.Inf(-1)
			continue
		}
		r := &pb.Rows[ref.element]
		if ref.need != nil {
			// The power needed at the atoms is the nominal goal's; the
			// margin is that of the power arriving (goalOf without the
			// solution it would repeat).
			if !(r.FractionIn > 0) {
				out[i] = math.Inf(-1) // no light at the atoms
				continue
			}
			g := *ref.need
			g.settle(r.FractionIn, pb.Laser)
			out[i] = g.MarginDB
			continue
		}
		a := atomsAt(b, pb, r, clouds[r.Element.Cloud], pass{goals: true, given: ref.hints})
		if g := a.Goal; g != nil && g.Impossible == "" {
			out[i] = g.MarginDB
		} else {
			out[i] = math.Inf(-1)
		}
	}
	return out, b
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

// NoSpreadDB is the spread of a goal's margins, dB, within which no
// toleranced input counts as moving it (far below any printed figure).
const NoSpreadDB = 1e-9

// EstimateAfter is how far into a run its duration is projected.
const EstimateAfter = 750 * time.Millisecond

// ProgressEvery is how often TolerancesWithProgress reports the samples
// done.
const ProgressEvery = 250 * time.Millisecond

// TolerancesWithProgress is Tolerances that calls progress (when not nil)
// with the number of samples done every ProgressEvery while the samples
// run, and once with all of them at the end; progress runs on its own
// goroutine, never two calls at once.
func TolerancesWithProgress(s *setup.Setup, drive []*AtomsResult, samples int, seed uint64, workers int, progress func(done int)) map[any]*GoalTolerance {
	return TolerancesRun(s, drive, Run{Samples: samples, Seed: seed, Workers: workers, Progress: progress})
}

// Run is how a tolerance analysis runs.
type Run struct {
	Samples int
	Seed    uint64
	Workers int // 0: all cores
	// Progress as for TolerancesWithProgress.
	Progress func(done int)
	// Estimate, when set, is told once, EstimateAfter into the run, how
	// long the whole run is likely to take (projected from the samples done
	// by then); a run that ends sooner tells nothing.
	Estimate func(time.Duration)
	// Stop, when it closes, ends the run early: the figures are then of
	// the first samples all done (in the order of their numbers, so the
	// same on any number of cores), marked Interrupted.
	Stop <-chan struct{}
}

// TolerancesRun is Tolerances with the run's options.
func TolerancesRun(s *setup.Setup, drive []*AtomsResult, run Run) map[any]*GoalTolerance {
	samples, seed, workers, progress := run.Samples, run.Seed, run.Workers, run.Progress
	if len(s.Tolerances) == 0 || samples <= 0 {
		return nil
	}
	var refs []goalRef
	var owners []any // the *AtomsResult or *Cloud each goal belongs to
	shortcut := sampleShortcut && powerOnly(s)
	var sampleRefs []goalRef // refs as the samples take them
	for _, a := range drive {
		if a.Goal == nil {
			continue
		}
		h := a.Goal.hints
		refs = append(refs, goalRef{path: slices.Index(s.Paths, a.Path.Path), element: a.Path.RowIndex(a.Row), cloud: -1, hints: &h, laser: a.Path.Laser.Name})
		owners = append(owners, a)
	}
	if shortcut {
		sampleRefs = slices.Clone(refs)
		for i, a := range owners {
			if g := a.(*AtomsResult).Goal; g.Impossible == "" {
				sampleRefs[i].need = g
			}
		}
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
	if !shortcut {
		sampleRefs = refs
	} else {
		sampleRefs = append(sampleRefs, refs[len(sampleRefs):]...) // the clouds' goals, solved in full
	}
	nt := len(s.Tolerances)
	// The margins goal by goal (each goal's samples in one run, which its
	// GoalTolerance keeps without a copy); the inputs are not kept: a
	// sample's are drawn again from its own stream where the regression
	// needs them (sampler.sampleInputs), so memory grows only with the margins.
	results := make([]float64, samples*len(refs))
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = max(1, min(workers, samples))
	nominal := margins(s.Clone(), refs)
	completed := make([]bool, samples)
	start := time.Now()
	var done atomic.Int64
	stop := make(chan struct{})
	reported := make(chan struct{})
	go func() {
		defer close(reported)
		if progress == nil && run.Estimate == nil {
			return
		}
		tick := time.NewTicker(ProgressEvery)
		defer tick.Stop()
		estimated := run.Estimate == nil
		for {
			select {
			case <-tick.C:
				n := int(done.Load())
				if progress != nil {
					progress(n)
				}
				// The whole run's time, projected from its first samples.
				if el := time.Since(start); !estimated && n > 0 && el >= EstimateAfter {
					run.Estimate(time.Duration(float64(el) * float64(samples) / float64(n)))
					estimated = true
				}
			case <-stop:
				if progress != nil {
					progress(samples)
				}
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
			x := make([]float64, nt)
			var reuse *budget.Budget
			sm := newSampler()
			for i := w; i < samples; i += workers {
				select {
				case <-run.Stop:
					return
				default:
				}
				sm.sampleInputs(s.Tolerances, seed, i, x)
				for j, t := range s.Tolerances {
					t.Apply(c, x[j])
				}
				var ms []float64
				ms, reuse = marginsReusing(c, sampleRefs, reuse)
				for g, m := range ms {
					results[g*samples+i] = m
				}
				completed[i] = true
				done.Add(1)
			}
		}()
	}
	wg.Wait()
	close(stop)
	<-reported
	// The figures are of the first samples all done (all of them unless
	// the run was stopped).
	requested := samples
	if k := slices.Index(completed, false); k >= 0 {
		samples = k
	}
	if samples == 0 {
		return nil
	}

	// The worst cases, one input at a time for its bad end.
	c := s.Clone()
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
	var all []*GoalTolerance // in the order of refs
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
		gt := &GoalTolerance{Samples: samples, Requested: requested, Interrupted: samples < requested, Seed: seed, Nominal: nominal[g], Worst: margins(w, refs)[g]}
		gt.Margins = results[g*requested : g*requested+samples : g*requested+samples]
		met := 0
		for _, m := range gt.Margins {
			if m >= 0 {
				met++
			}
		}
		gt.ProbabilityMet = float64(met) / float64(samples)
		sorted := slices.Clone(gt.Margins)
		slices.Sort(sorted)
		gt.P05, gt.P50, gt.P95 = numeric.Percentile(sorted, 0.05), numeric.Percentile(sorted, 0.5), numeric.Percentile(sorted, 0.95)
		// A margin no toleranced input moves has no shares to give (a
		// regression on rounding noise would still print some).
		var finite []float64
		for _, m := range sorted {
			if !math.IsInf(m, 0) && !math.IsNaN(m) {
				finite = append(finite, m)
			}
		}
		gt.NoSpread = len(finite) > 0 && finite[len(finite)-1]-finite[0] <= NoSpreadDB
		out[a] = gt
		all = append(all, gt)
	}
	ys := make([][]float64, len(all))
	for g, gt := range all {
		ys[g] = gt.Margins
	}
	for g, cs := range contributors(s.Tolerances, seed, ys) {
		if !all[g].NoSpread {
			all[g].Contributors = cs
		}
	}
	return out
}

// sampleInputs draws sample i's value of every toleranced input into x,
// each from the sample's own stream (PCG seeded by the seed and i): the
// same values wherever and however often they are drawn.
func (sm *sampler) sampleInputs(ts []*setup.Toleranced, seed uint64, i int, x []float64) {
	sm.pcg.Seed(seed, uint64(i))
	for j, t := range ts {
		x[j] = t.Tol.Sample(sm.r)
	}
}

// sampler holds one generator, reseeded for each sample (a Rand keeps no
// state of its own besides its source: the same values as a new generator
// of the sample's seed).
type sampler struct {
	pcg rand.PCG
	r   *rand.Rand
}

func newSampler() *sampler {
	sm := &sampler{}
	sm.r = rand.New(&sm.pcg)
	return sm
}

// contributors ranks the inputs by their standardized regression
// coefficients on each goal's margins ys[g] (samples with a finite margin
// only): share = SRC²/ΣSRC², the SRCs solving the normal equations of the
// inputs' covariance, C_xx β = C_xy, scaled by σ_x/σ_y. The covariances
// are summed in one pass over the samples, whose inputs are drawn again
// (sampler.sampleInputs); goals whose finite samples are the same rows share one
// Cholesky factorization.
func contributors(ts []*setup.Toleranced, seed uint64, ys [][]float64) [][]Contributor {
	nt := len(ts)
	out := make([][]Contributor, len(ys))
	if len(ys) == 0 {
		return out
	}
	n := len(ys[0])
	type group struct {
		finite []bool // the samples it counts
		goals  []int
		count  float64
		sx     []float64 // Σ (x − x0), and Σ (x − x0)(x − x0)ᵀ
		sxx    []float64
		sy     []float64 // per goal: Σ y, Σ y², Σ (x − x0) y
		syy    []float64
		sxy    [][]float64
	}
	var groups []*group
	for g, y := range ys {
		finite := make([]bool, n)
		count := 0
		for i, v := range y {
			finite[i] = !math.IsInf(v, 0) && !math.IsNaN(v)
			if finite[i] {
				count++
			}
		}
		if count <= nt+1 {
			continue
		}
		k := slices.IndexFunc(groups, func(gr *group) bool { return slices.Equal(gr.finite, finite) })
		if k < 0 {
			groups = append(groups, &group{finite: finite, count: float64(count), sx: make([]float64, nt), sxx: make([]float64, nt*nt)})
			k = len(groups) - 1
		}
		gr := groups[k]
		gr.goals = append(gr.goals, g)
		gr.sy, gr.syy, gr.sxy = append(gr.sy, 0), append(gr.syy, 0), append(gr.sxy, make([]float64, nt))
	}
	if len(groups) == 0 {
		return out
	}
	// Shifted by the nominal values, against cancellation in the sums.
	x0 := make([]float64, nt)
	for j, t := range ts {
		x0[j] = t.Tol.Nominal()
	}
	x := make([]float64, nt)
	sm := newSampler()
	for i := range n {
		sm.sampleInputs(ts, seed, i, x)
		for j := range x {
			x[j] -= x0[j]
		}
		for _, gr := range groups {
			if !gr.finite[i] {
				continue
			}
			for j := range nt {
				gr.sx[j] += x[j]
				row := gr.sxx[j*nt : (j+1)*nt]
				for k := j; k < nt; k++ {
					row[k] += x[j] * x[k]
				}
			}
			for q, g := range gr.goals {
				y := ys[g][i]
				gr.sy[q] += y
				gr.syy[q] += y * y
				for j := range nt {
					gr.sxy[q][j] += x[j] * y
				}
			}
		}
	}
	for _, gr := range groups {
		m := gr.count
		cov := mat.NewSymDense(nt, nil)
		sd := make([]float64, nt)
		for j := range nt {
			for k := j; k < nt; k++ {
				cov.SetSym(j, k, (gr.sxx[j*nt+k]-gr.sx[j]*gr.sx[k]/m)/(m-1))
			}
			sd[j] = math.Sqrt(cov.At(j, j))
		}
		var ch mat.Cholesky
		if !ch.Factorize(cov) {
			continue // an input without spread: no unique coefficients
		}
		if cond := ch.Cond(); math.IsInf(cond, 1) || cond > mat.ConditionTolerance {
			continue
		}
		for q, g := range gr.goals {
			vy := (gr.syy[q] - gr.sy[q]*gr.sy[q]/m) / (m - 1)
			if !(vy > 0) {
				continue
			}
			cxy := mat.NewVecDense(nt, nil)
			for j := range nt {
				cxy.SetVec(j, (gr.sxy[q][j]-gr.sx[j]*gr.sy[q]/m)/(m-1))
			}
			var β mat.VecDense
			if err := ch.SolveVecTo(&β, cxy); err != nil {
				continue
			}
			src := make([]float64, nt)
			total := 0.0
			for j := range nt {
				src[j] = β.AtVec(j) * sd[j] / math.Sqrt(vy)
				total += src[j] * src[j]
			}
			cs := make([]Contributor, nt)
			for j := range nt {
				cs[j] = Contributor{Input: ts[j], Share: src[j] * src[j] / total}
			}
			slices.SortStableFunc(cs, func(a, b Contributor) int { return numeric.CmpFloat(b.Share, a.Share) })
			out[g] = cs
		}
	}
	return out
}
