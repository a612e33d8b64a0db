package budget

import (
	"beamledger/budget/setup"
	"testing"
)

// Every element kind the setup format knows has its effect on the beam and
// the power, and no effect stands for a kind the format does not know.
func TestEffectsComplete(t *testing.T) {
	for _, k := range setup.Kinds {
		if effects[k.Type] == nil {
			t.Errorf("element type %s has no effect in the budget", k.Type)
		}
	}
	if len(effects) != len(setup.Kinds) {
		t.Errorf("%d effects for %d element kinds", len(effects), len(setup.Kinds))
	}
}
