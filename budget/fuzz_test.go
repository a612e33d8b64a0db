package budget

import (
	"beamledger/budget/setup"
	"os"
	"path/filepath"
	"testing"
)

func FuzzParseSetup(f *testing.F) {
	files, _ := filepath.Glob("../testdata/examples/*.toml")
	for _, name := range files {
		data, err := os.ReadFile(name)
		if err == nil {
			f.Add(data)
		}
	}
	if data, err := os.ReadFile("testdata/merged.toml"); err == nil {
		f.Add(data)
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		s, err := setup.Parse("fuzz.toml", data)
		if err != nil {
			return
		}
		b, err := Compute(s)
		if err != nil {
			return
		}
		for _, bal := range b.Balances {
			if tot := bal.Total(); bal.Laser != nil && len(s.Paths) > 0 && !(tot >= 0 && tot <= 1+1e-9) {
				t.Fatalf("laser %q: balance total %g", bal.Laser.Name, tot)
			}
		}
	})
}
