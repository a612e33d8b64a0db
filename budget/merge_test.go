package budget

import (
	"beamledger/budget/setup"
	"math"
	"testing"
)

// testdata/merged.toml: a repumper joins the cooler on a cube, both pass an AOM after
// it (order +1, 80 MHz, one pass) and reach a cloud; a cylindrical lens in
// x; a trap-like source with astigmatic waist positions.
func mergedBudget(t *testing.T) *Budget {
	t.Helper()
	s, err := setup.Load("testdata/merged.toml")
	if err != nil {
		t.Fatal(err)
	}
	b, err := Compute(s)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// The joining beam meets the cube with join_transmission, the cooler with
// transmission (the drive's test checks the AOM's shift on both).
func TestJoinedBeamThroughSharedOptics(t *testing.T) {
	b := mergedBudget(t)
	cool := b.Path("cool")
	if len(cool.Joined) != 1 || cool.Joined[0].Laser.Name != "repump" {
		t.Fatalf("joined beams %v", cool.Joined)
	}
	rep := cool.Joined[0]
	if rep.First != 0 || rep.JoinedAt != 0.1 || rep.Combiner == nil {
		t.Errorf("repump joins at element %d, %g m", rep.First, rep.JoinedAt)
	}
	// cooler: 0.9 × 0.5; repumper: 0.8 × 0.5 (its own path is lossless)
	if got := cool.Rows[1].FractionIn; math.Abs(got-0.9) > 1e-12 {
		t.Errorf("cooler after the cube %g, want 0.9", got)
	}
	if got := rep.Rows[1].FractionIn; math.Abs(got-0.8) > 1e-12 {
		t.Errorf("repumper after the cube %g, want 0.8", got)
	}
	// The cube's rejected light is a named loss of each laser.
	for _, bal := range b.Balances {
		if bal.Lost[LossCombiner] <= 0 || math.Abs(bal.Total()-1) > 1e-9 {
			t.Errorf("%s: combiner loss %g, total %g", bal.Laser.Name, bal.Lost[LossCombiner], bal.Total())
		}
	}
}

// A cylindrical lens acts in its plane only: the x plane after it is the
// thin lens (Plane.Lens, tested against Self 1983) of the x plane before
// it, and the y plane is untouched.
func TestCylindricalLensActsInOnePlane(t *testing.T) {
	b := mergedBudget(t)
	r := b.Path("cool").Rows[2]
	if got, want := r.BeamOut.X, r.BeamIn.X.Lens(0.15); got != want {
		t.Errorf("x plane %v, want %v", got, want)
	}
	if r.BeamOut.Y != r.BeamIn.Y {
		t.Errorf("y plane changed: %v → %v", r.BeamIn.Y, r.BeamOut.Y)
	}
}

// An astigmatic source: waist_at = [0, 50 mm] puts the y waist 50 mm after
// the output and the x waist at it (the complex beam parameter's waist
// distance, Plane.WaistDistance).
func TestAstigmaticWaistPositions(t *testing.T) {
	b := mergedBudget(t)
	start := b.Path("repump").Start
	if x, y := start.X.WaistDistance(), start.Y.WaistDistance(); math.Abs(x) > 1e-12 || math.Abs(y-0.05) > 1e-12 {
		t.Errorf("waists at %g and %g m, want 0 and 0.05", x, y)
	}
}
