package drive

import (
	"math"
	"testing"

	"beamledger/budget"
	"beamledger/budget/setup"
)

// testdata/merged.toml (budget's): a repumper joins the cooler on a cube and
// both pass an AOM (+80 MHz, one pass) before the cloud; the detuning at the
// cloud is each laser's stated detuning plus the shift, and the joined beam
// is not judged against the element's goal, which names the path's own.
func TestJoinedBeamDetuningAndGoal(t *testing.T) {
	s, err := setup.Load("../testdata/merged.toml")
	if err != nil {
		t.Fatal(err)
	}
	b, err := budget.Compute(s)
	if err != nil {
		t.Fatal(err)
	}
	results := Evaluate(b)
	if len(results) != 2 {
		t.Fatalf("%d atoms results, want the cooler's and the repumper's", len(results))
	}
	for _, a := range Evaluate(b) {
		want := map[string]float64{"cool": -98e6 + 80e6, "repump": 6.5e9 + 80e6}[a.Path.Laser.Name]
		if got := a.Detuning / (2 * math.Pi); math.Abs(got-want) > 1e-3 {
			t.Errorf("%s: detuning %g Hz, want %g", a.Path.Laser.Name, got, want)
		}
		if a.Path.Laser.Name == "repump" && a.Goal != nil {
			t.Error("a joined beam was judged against the element's goal")
		}
	}
}
