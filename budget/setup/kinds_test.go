package setup

import (
	"os"
	"strings"
	"testing"

	"beamledger/budget/setup/synth"
)

// Every element kind is whole: it says what it does, it reads its keys,
// the generator makes it (so the property tests exercise it), the setup
// guide (docs/setup.md) lists it, and the loader accepts each of its keys (an unknown key would be an
// error).
func TestElementKindsComplete(t *testing.T) {
	var gen strings.Builder
	for seed := uint64(1); seed <= 20; seed++ {
		gen.WriteString(synth.Lab(seed, synth.Options{Lasers: 2, ElementsPerPath: 12, Splits: 1, Fibers: true, Merges: true}))
	}
	readme, err := os.ReadFile("../../docs/setup.md")
	if err != nil {
		t.Fatal(err)
	}
	for _, k := range Kinds {
		t.Run(string(k.Type), func(t *testing.T) {
			if k.Does == "" || k.read == nil {
				t.Errorf("kind %s lacks its description or reader", k.Type)
			}
			if !strings.Contains(gen.String(), `type = "`+string(k.Type)+`"`) {
				t.Errorf("the generator never makes a %s", k.Type)
			}
			if !strings.Contains(string(readme), "`"+string(k.Type)+"`") {
				t.Errorf("docs/setup.md does not list the element type %s", k.Type)
			}
			for _, key := range k.KeyNames() {
				if !strings.Contains(string(readme), "`"+key+"`") {
					t.Errorf("docs/setup.md does not name the key %s of a %s", key, k.Type)
				}
			}
		})
	}
}
