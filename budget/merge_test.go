package budget

import (
	"math"
	"testing"
)

// mergedSetup: a repumper joins the cooler on a cube, both pass an AOM after
// it (order +1, 80 MHz, one pass) and reach a cloud; a cylindrical lens in
// x; a trap-like source with astigmatic waist positions.
const mergedSetup = `
[[laser]]
name = "cool"
wavelength = "780.241 nm"
power = "100 mW"
waist = "1 mm"
detuning = "-98 MHz"

[[laser]]
name = "repump"
wavelength = "780.228 nm"
power = "10 mW"
waist = ["1 mm", "2 mm"]
waist_at = ["0 mm", "50 mm"]
detuning = "6.5 GHz"

[[path]]
name = "cool"
from = "cool"
  [[path.element]]
  type = "combiner"
  name = "cube"
  at = "100 mm"
  transmission = 0.9
  join_transmission = { repump = 0.8 }
  [[path.element]]
  type = "aom"
  at = "200 mm"
  efficiency = 0.5
  frequency = "80 MHz"
  [[path.element]]
  type = "cylindrical_lens"
  at = "300 mm"
  focal_length = "150 mm"
  plane = "x"
  [[path.element]]
  type = "atoms"
  at = "400 mm"
  cloud = "mot"
  [[path.element]]
  type = "dump"
  at = "500 mm"

[[path]]
name = "repump"
from = "repump"
into = "cool:cube"
into_at = "80 mm"

[[cloud]]
name = "mot"
transition = "Rb87 D2"
atoms = 1e6
rms_size = ["1 mm", "1 mm", "1 mm"]
`

func mergedBudget(t *testing.T) *Budget {
	t.Helper()
	s, err := Parse("merged.toml", []byte(mergedSetup))
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
// transmission; both pass the AOM, whose +80 MHz shifts each (the
// detuning at the cloud is the laser's stated detuning plus the shift).
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
	for _, a := range b.Drive() {
		want := map[string]float64{"cool": -98e6 + 80e6, "repump": 6.5e9 + 80e6}[a.Path.Laser.Name]
		if got := a.Detuning / (2 * math.Pi); math.Abs(got-want) > 1e-3 {
			t.Errorf("%s: detuning %g Hz, want %g", a.Path.Laser.Name, got, want)
		}
		if a.Path.Laser.Name == "repump" && a.Goal != nil {
			t.Error("a joined beam was judged against the element's goal")
		}
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
