package safety

import (
	"math"
	"testing"

	"beamledger/budget"
)

// Each beam at its own worst end of a toleranced loss value: the beam that
// goes on through the element at the value's highest transmission, the
// beam that leaves the path there at its lowest. Powers by hand (the
// product of the source's power and the shares along each beam's way).
func TestToleranceEndPerBeam(t *testing.T) {
	const laser = `
[[laser]]
name = "l"
wavelength = "1064 nm"
power = "2 W"
waist = "1 mm"
`
	// line is a path "p" from laser l through one element, ending in a
	// dump.
	line := func(element string) string {
		return laser + "[[path]]\nname = \"p\"\nfrom = \"l\"\n  [[path.element]]\n" + element +
			"  [[path.element]]\n  type = \"dump\"\n  at = \"30 cm\"\n  rating = \"5 W\"\n"
	}
	// escaping finds the power of the beam of kind k leaving at the path's
	// element n, from the hazards' reflections.
	escaping := func(a *Assessment, path string, n int) float64 {
		for _, rf := range a.Hazards.Reflections {
			if rf.Kind == ReflectionEscaping && rf.Path.Path.Name == path && rf.Element.Index == n {
				return rf.Power
			}
		}
		return math.NaN()
	}
	// segment finds the power in the open segment after element n.
	segment := func(a *Assessment, path string, n int) float64 {
		for _, e := range a.Hazards.Exposures {
			if e.Path.Path.Name == path && e.Segment.After == n {
				return e.Power
			}
		}
		return math.NaN()
	}
	cases := []struct {
		name, src string
		check     func(a *Assessment) (got, want float64, what string)
		through   func(a *Assessment) (got, want float64)
	}{
		{
			// The branch at T = 0.1 carries 0.9 of 2 W; the beam that goes on at
			// T = 0.9 carries 1.8 W.
			name: "splitter, followed branch",
			src: laser + `
[[path]]
name = "p"
from = "l"
  [[path.element]]
  type = "splitter"
  name = "s"
  at = "10 cm"
  transmission = "0.1 .. 0.9"
  [[path.element]]
  type = "dump"
  at = "30 cm"
  rating = "5 W"
[[path]]
name = "b"
from = "p:s"
  [[path.element]]
  type = "dump"
  at = "20 cm"
  rating = "5 W"
`,
			check: func(a *Assessment) (float64, float64, string) {
				return segment(a, "b", 0), 1.8, "branch"
			},
			through: func(a *Assessment) (float64, float64) { return segment(a, "p", 1), 1.8 },
		},
		{
			name: "splitter, unfollowed port",
			src: line(`  type = "splitter"
  name = "s"
  at = "10 cm"
  transmission = "0.6 ± 0.1"
`),
			// Normal ends at 0.6 ∓ 3·0.1: the port at 0.3 passes 0.7 of 2 W.
			check: func(a *Assessment) (float64, float64, string) {
				for _, r := range a.HazardBudget.Paths[0].Rows {
					if r.Element.Index == 1 {
						return r.Lost(budget.LossSplitterPort) * 2, 1.4, "unfollowed port"
					}
				}
				return math.NaN(), 1.4, "unfollowed port"
			},
			through: func(a *Assessment) (float64, float64) { return segment(a, "p", 1), 1.8 },
		},
		{
			name: "mirror leak",
			src: line(`  type = "mirror"
  at = "10 cm"
  reflectivity = "0.9 .. 0.99"
`),
			check: func(a *Assessment) (float64, float64, string) {
				return escaping(a, "p", 1), 0.2, "leak"
			},
			through: func(a *Assessment) (float64, float64) { return segment(a, "p", 1), 1.98 },
		},
		{
			// Unused orders: 2 W × T 0.9 (its high end: more arrives at the
			// crystal's orders) × (1 − 0.5); the diffracted beam 2 × 0.9 × 0.9.
			name: "AOM unused orders",
			src: line(`  type = "aom"
  at = "10 cm"
  transmission = "0.8 .. 0.9"
  efficiency = "0.5 .. 0.9"
`),
			check: func(a *Assessment) (float64, float64, string) {
				return escaping(a, "p", 1), 0.9, "unused orders"
			},
			through: func(a *Assessment) (float64, float64) { return segment(a, "p", 1), 1.62 },
		},
		{
			name: "combiner rejected port",
			src: line(`  type = "combiner"
  name = "c"
  at = "10 cm"
  transmission = "0.5 .. 0.9"
`),
			check: func(a *Assessment) (float64, float64, string) {
				return escaping(a, "p", 1), 1.0, "rejected port"
			},
			through: func(a *Assessment) (float64, float64) { return segment(a, "p", 1), 1.8 },
		},
		{
			// The joining beam's rejected share at join_transmission 0.6 of 2 W.
			name: "combiner, joining beam",
			src: laser + `
[[laser]]
name = "m"
wavelength = "1064 nm"
power = "10 mW"
waist = "1 mm"
[[path]]
name = "p"
from = "m"
  [[path.element]]
  type = "combiner"
  name = "c"
  at = "10 cm"
  transmission = 0.9
  join_transmission = "0.6 .. 0.95"
  [[path.element]]
  type = "dump"
  at = "30 cm"
  rating = "5 W"
[[path]]
name = "j"
from = "l"
into = "p:c"
into_at = "10 cm"
`,
			check: func(a *Assessment) (float64, float64, string) {
				for _, rf := range a.Hazards.Reflections {
					if rf.Kind == ReflectionEscaping && rf.Laser.Laser.Name == "l" {
						return rf.Power, 0.8, "joining beam's rejected share"
					}
				}
				return math.NaN(), 0.8, "joining beam's rejected share"
			},
			through: func(a *Assessment) (float64, float64) {
				for _, e := range a.Hazards.Exposures {
					if e.Path.Path.Name == "p" && e.Segment.After == 1 && e.Laser.Laser.Name == "l" {
						return e.Power, 1.9
					}
				}
				return math.NaN(), 1.9
			},
		},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			a := load(t, c.src)
			if got, want, what := c.check(a); math.Abs(got-want) > 1e-9*want {
				t.Errorf("%s: %.6g W, want %.6g W (its own worst end)", what, got, want)
			}
			if got, want := c.through(a); math.Abs(got-want) > 1e-9*want {
				t.Errorf("the beam that goes on: %.6g W, want %.6g W (the highest transmission)", got, want)
			}
		})
	}
}
