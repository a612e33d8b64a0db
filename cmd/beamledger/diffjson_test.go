package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// farBeam is a collimated 1064 nm beam of 20 mm waist leaving its path
// open: at 1 kW its NOHD lies beyond the 100 km the search covers (the
// beam reaches 5 mW/cm² over 7 mm only where its radius is 3.6 m, about
// 210 km away: by hand, W = θ z with θ = λ/(π w0)), at 10 W about 21 km.
func farBeam(power string) string {
	return `[[laser]]
name = "l"
wavelength = "1064 nm"
power = "` + power + `"
waist = "20 mm"

[[path]]
name = "p"
from = "l"

  [[path.element]]
  type = "window"
  at = "100 mm"
  transmission = 0.99
`
}

// diff --json across an NOHD beyond the search, on either side and on
// both: exit 1, JSON that decodes, the change named with the distance
// beyond as its own figure (nohd_beyond_m), never a non-finite number.
func TestDiffJSONAcrossAnNOHDBeyondTheSearch(t *testing.T) {
	dir := t.TempDir()
	files := map[string]string{}
	for _, p := range []string{"1 kW", "2 kW", "10 W"} {
		f := filepath.Join(dir, strings.ReplaceAll(p, " ", "")+".toml")
		if err := os.WriteFile(f, []byte(farBeam(p)), 0o644); err != nil {
			t.Fatal(err)
		}
		files[p] = f
	}
	for _, c := range [][2]string{{"1 kW", "10 W"}, {"10 W", "1 kW"}, {"1 kW", "2 kW"}} {
		out, errOut, code := runCLI(t, "diff", "--json", files[c[0]], files[c[1]])
		var r struct {
			Hazards []struct {
				What    string `json:"what"`
				Old     string `json:"old"`
				New     string `json:"new"`
				Figures []struct {
					Key string   `json:"key"`
					Old *float64 `json:"old"`
					New *float64 `json:"new"`
				} `json:"figures"`
			} `json:"hazard_changes"`
		}
		if err := json.Unmarshal([]byte(out), &r); err != nil || code != exitFindings {
			t.Errorf("%v: exit %d, %v, %s", c, code, err, errOut)
			continue
		}
		found := false
		for _, h := range r.Hazards {
			beyond := false
			for _, f := range h.Figures {
				beyond = beyond || f.Key == "nohd_beyond_m"
			}
			if strings.Contains(h.Old+h.New, "NOHD beyond 100 km") != beyond {
				t.Errorf("%v: text %q → %q and figures disagree", c, h.Old, h.New)
			}
			found = found || beyond
		}
		if !found {
			t.Errorf("%v: no nohd_beyond_m figure in %s", c, out)
		}
	}
}

// Every pair of neighbouring setups of the hostile corpus diffs to JSON
// that decodes (whatever the two hold).
func TestDiffJSONOfTheHostileCorpusDecodes(t *testing.T) {
	files, _ := filepath.Glob("../../testdata/hostile/*.toml")
	for i := 1; i < len(files); i++ {
		out, errOut, code := runCLI(t, "diff", "--json", files[i-1], files[i])
		if code == exitBadInput {
			t.Errorf("diff %s %s: exit 2: %s", files[i-1], files[i], errOut)
			continue
		}
		var v any
		if err := json.Unmarshal([]byte(out), &v); err != nil {
			t.Errorf("diff %s %s: %v", files[i-1], files[i], err)
		}
	}
}
