package numeric

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/optimize"
)

// SolveScale finds the least factor that reaches the target, within 0.1 %
// and never below it: a power law (secant steps), a figure that is zero
// until a threshold (the bisection fallback), and one out of reach.
func TestSolveScale(t *testing.T) {
	for _, c := range []struct {
		name   string
		metric func(float64) float64
		target float64
		want   float64
	}{
		{"k²", func(k float64) float64 { return k * k }, 9, 3},
		{"√k", func(k float64) float64 { return math.Sqrt(k) }, 0.5, 0.25},
		{"threshold", func(k float64) float64 {
			if k < 2 {
				return 0
			}
			return k - 2
		}, 5, 7},
	} {
		k, ok := SolveScale(c.metric, c.target, 1)
		if !ok || c.metric(k) < c.target || k > c.want*(1+1e-3) {
			t.Errorf("%s: k = %g (ok %v), want %g", c.name, k, ok, c.want)
		}
	}
	if _, ok := SolveScale(func(k float64) float64 { return 0 }, 1, 1); ok {
		t.Error("an unreachable target was reached")
	}
}

// Percentiles interpolate between the nearest ranks.
func TestPercentile(t *testing.T) {
	v := []float64{1, 2, 3, 4, 5}
	if Percentile(v, 0.5) != 3 || Percentile(v, 0.25) != 2 || Percentile(v, 0.1) != 1.4 {
		t.Errorf("percentiles %g %g %g", Percentile(v, 0.5), Percentile(v, 0.25), Percentile(v, 0.1))
	}
}

// GoldenMax finds the maximum of x·e^(−x) at x = 1, value 1/e (by hand: the
// derivative (1 − x)e^(−x) vanishes there), from a bracket that does not
// centre it, to the width the steps allow.
func TestGoldenMax(t *testing.T) {
	x, v := GoldenMax(func(x float64) float64 { return x * math.Exp(-x) }, 0.2, 4, 60, 1e-9)
	if math.Abs(x-1) > 1e-4 || math.Abs(v-1/math.E) > 1e-9 {
		t.Errorf("maximum at %g, %g; want 1, 1/e", x, v)
	}
	// A step limit stops it early, the bracket still around the maximum.
	if x, _ := GoldenMax(func(x float64) float64 { return -(x - 3) * (x - 3) }, 0, 10, 5, 0); math.Abs(x-3) > 10*math.Pow(0.618034, 5) {
		t.Errorf("after 5 steps at %g, not within the bracket's width of 3", x)
	}
}

// SimplexMin against a reference library: gonum's Nelder–Mead
// (gonum.org/v1/gonum/optimize) and the minima known by hand, on a curved
// valley, a Gaussian well tilted by a uniform force (the shape of a dipole
// trap under gravity) and a well far narrower across than along.
func TestSimplexMin(t *testing.T) {
	cases := []struct {
		name string
		f    func(x [3]float64) float64
		x0   [3]float64
		// want is the minimum by hand (NaN: not known in closed form).
		want [3]float64
		tol  float64
	}{
		{
			// The Rosenbrock valley in three dimensions: minimum 0 at
			// (1, 1, 1) (Rosenbrock, Comput. J. 3, 175 (1960); the 3-D
			// form's only minimum, by hand: every term vanishes there).
			name: "rosenbrock",
			f: func(x [3]float64) float64 {
				s := 0.0
				for i := range 2 {
					s += 100*(x[i+1]-x[i]*x[i])*(x[i+1]-x[i]*x[i]) + (1-x[i])*(1-x[i])
				}
				return s
			},
			x0: [3]float64{-1.2, 1, 0.5}, want: [3]float64{1, 1, 1}, tol: 1e-6,
		},
		{
			// −e^(−2(x² + y²))/(1 + z²/4) + 0.3 y: the force shifts the
			// minimum along y only, to where 4y e^(−2y²) = −0.3 (solved
			// below by GoldenMax), x = z = 0.
			name: "tilted well",
			f: func(x [3]float64) float64 {
				return -math.Exp(-2*(x[0]*x[0]+x[1]*x[1]))/(1+x[2]*x[2]/4) + 0.3*x[1]
			},
			x0: [3]float64{0.3, 0.2, -0.4}, want: [3]float64{0, math.NaN(), 0}, tol: 1e-6,
		},
		{
			// A well 100 times longer than wide, started off its axis and
			// 3 from its centre along it: minimum −1 at (0, 0, 3).
			name: "long well",
			f: func(x [3]float64) float64 {
				return -math.Exp(-2*(x[0]*x[0]+x[1]*x[1])) / (1 + (x[2]-3)*(x[2]-3)/1e4)
			},
			x0: [3]float64{0.1, -0.1, 0}, want: [3]float64{0, 0, 3}, tol: 1e-5,
		},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			evals := 0
			x, fx := SimplexMin(func(x [3]float64) float64 { evals++; return c.f(x) }, c.x0, 0.05, 1e-12, 40, 2000)
			if evals > 2000+4 {
				t.Errorf("%d evaluations, limit 2000 (+ one step's 4)", evals)
			}
			if fx != c.f(x) {
				t.Errorf("returned value %g, f at the returned point %g", fx, c.f(x))
			}
			p := optimize.Problem{Func: func(x []float64) float64 { return c.f([3]float64{x[0], x[1], x[2]}) }}
			res, err := optimize.Minimize(p, c.x0[:], &optimize.Settings{FuncEvaluations: 20000, Converger: &optimize.FunctionConverge{Absolute: 1e-14, Iterations: 200}}, &optimize.NelderMead{})
			if err != nil {
				t.Fatal(err)
			}
			for i := range x {
				if math.Abs(x[i]-res.X[i]) > c.tol {
					t.Errorf("x[%d] = %.6g, gonum's Nelder–Mead %.6g", i, x[i], res.X[i])
				}
				if !math.IsNaN(c.want[i]) && math.Abs(x[i]-c.want[i]) > c.tol {
					t.Errorf("x[%d] = %.6g, by hand %g", i, x[i], c.want[i])
				}
			}
			if c.name == "tilted well" {
				y, _ := GoldenMax(func(y float64) float64 { return -math.Abs(4*y*math.Exp(-2*y*y) + 0.3) }, -0.5, 0, 80, 1e-12)
				if math.Abs(x[1]-y) > c.tol {
					t.Errorf("y = %.6g, where the force balances %.6g", x[1], y)
				}
			}
			if math.Abs(fx-res.F) > 1e-9 {
				t.Errorf("minimum %.10g, gonum's %.10g", fx, res.F)
			}
		})
	}
}

// The evaluation limit stops the search.
func TestSimplexMinStopsAtLimit(t *testing.T) {
	evals := 0
	SimplexMin(func(x [3]float64) float64 { evals++; return x[0] * x[1] * x[2] }, [3]float64{1, 1, 1}, 0.5, 0, 1000, 50)
	if evals < 50 || evals > 54 {
		t.Errorf("%d evaluations with a limit of 50 on an unbounded function", evals)
	}
}

// RoundUp never rounds down, and rounds to n significant figures: by hand,
// 502.6265 → 503, 1.0001 → 1.01, 999.01 → 1000, 0.012341 → 0.0124; a value
// already at n figures stays (common practice for hazard figures: round up).
func TestRoundUp(t *testing.T) {
	for _, c := range []struct{ v, want float64 }{{502.6265, 503}, {1.0001, 1.01}, {999.01, 1000}, {0.012341, 0.0124}, {2.5, 2.5}, {1000, 1000}} {
		if r := RoundUp(c.v, 3); r < c.v || math.Abs(r-c.want) > 1e-12*c.want {
			t.Errorf("RoundUp(%g, 3) = %g, want %g", c.v, r, c.want)
		}
	}
}
