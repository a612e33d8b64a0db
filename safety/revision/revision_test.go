package revision

import (
	"bytes"
	"encoding/json"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"beamledger/safety/safetytest"
)

var update = flag.Bool("update", false, "rewrite the golden files")

func revisionOf(t *testing.T, name string, data []byte) Revision {
	t.Helper()
	if data == nil {
		var err error
		if data, err = os.ReadFile(filepath.Join("../../testdata/examples", name)); err != nil {
			t.Fatal(err)
		}
	}
	return Revision{File: name, Data: data, Assessment: safetytest.Evaluate(t, name, data)}
}

func compare(t *testing.T, old, new Revision) *Report {
	t.Helper()
	r, err := Compare(old, new)
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// The shipped pair of revisions: text and JSON against their golden files,
// and the changes the new revision was made with, each found and marked.
func TestShippedRevisions(t *testing.T) {
	r := compare(t, revisionOf(t, "table-c.toml", nil), revisionOf(t, "table-c-rev4.toml", nil))
	var text, js bytes.Buffer
	if err := Text(&text, r); err != nil {
		t.Fatal(err)
	}
	if err := JSON(&js, r); err != nil {
		t.Fatal(err)
	}
	safetytest.Golden(t, "testdata/golden/table-c-rev4.txt", text.String(), *update)
	safetytest.Golden(t, "testdata/golden/table-c-rev4.json", js.String(), *update)
	if !r.AffectsSafety {
		t.Error("raising a power and removing a dump do not affect safety")
	}
	for _, want := range []string{
		`[safety] changed laser "probe-amp": power: "1.5 W" → "2 W"`,
		`[safety] added path "photodiode"`,
		`[safety] removed path "trap", element 7 (dump) of the old revision`,
		`OD 5 → eye 10200 × MPE, skin 143 × MPE, OD 5, open end, NOHD 33 m`,
		`[safety] added finding: defect open_end, path "trap"`,
		`power at cloud: path "drive", element 7 (atoms), laser "probe-amp": 307 mW → 390.7 mW`,
		`changed [setup]: revision: "draft 3" → "rev 4"`,
	} {
		if !strings.Contains(text.String(), want) {
			t.Errorf("the comparison lacks %q", want)
		}
	}
	var back map[string]any
	if err := json.Unmarshal(js.Bytes(), &back); err != nil {
		t.Fatal(err)
	}
	if back["affects_safety"] != true || len(back["setup_changes"].([]any)) != len(r.Setup) {
		t.Errorf("JSON: affects_safety %v, %d setup changes", back["affects_safety"], len(back["setup_changes"].([]any)))
	}
}

// A file compared with itself has no change.
func TestSameRevision(t *testing.T) {
	a := revisionOf(t, "table-d.toml", nil)
	r := compare(t, a, revisionOf(t, "table-d.toml", nil))
	if len(r.Setup)+len(r.Hazards)+len(r.Drive) != 0 || r.AffectsSafety {
		t.Errorf("a file against itself: %+v", r)
	}
}

// Changes of wording, units and clouds do not affect safety; the same
// length in other units is no change at all.
func TestChangesThatDoNotAffectSafety(t *testing.T) {
	data, err := os.ReadFile("../../testdata/examples/table-c.toml")
	if err != nil {
		t.Fatal(err)
	}
	edited := strings.NewReplacer(
		`title = "Elongated cloud, table C"`, `title = "Pencil cloud, table C"`,
		`at = "300 mm"`, `at = "0.3 m"`,
		`atoms = 2.0e4`, `atoms = 3.0e4`,
	).Replace(string(data))
	r := compare(t, revisionOf(t, "table-c.toml", data), revisionOf(t, "table-c.toml", []byte(edited)))
	if r.AffectsSafety {
		t.Errorf("title, units and atom number affect safety: %+v", r)
	}
	if len(r.Setup) != 2 || r.Setup[0].Key != "title" || r.Setup[1].Kind != "cloud" || len(r.Hazards) != 0 {
		t.Errorf("setup changes %+v, hazard changes %+v", r.Setup, r.Hazards)
	}
	if len(r.Drive) == 0 {
		t.Error("more atoms change no goal margin")
	}
}

// A ratio counts as changed beyond 10 % of the larger value.
func TestMoved(t *testing.T) {
	for _, c := range []struct {
		a, b float64
		want bool
	}{{1, 1.05, false}, {1, 1.12, true}, {100, 91, false}, {100, 89, true}, {0, 1e-9, true}, {2, 2, false}} {
		if got := Moved(c.a, c.b); got != c.want {
			t.Errorf("Moved(%g, %g) = %v", c.a, c.b, got)
		}
	}
}

// Elements match by name, else by type and order: a lens put in front of
// A path takes the first lens's place, a named mirror is found wherever it
// moved, and a renamed window is the same window.
func TestElementMatching(t *testing.T) {
	el := func(typ, name string) map[string]any {
		m := map[string]any{"type": typ}
		if name != "" {
			m["name"] = name
		}
		return m
	}
	old := []map[string]any{el("lens", ""), el("mirror", "M1"), el("lens", ""), el("dump", ""), el("window", "W1")}
	new := []map[string]any{el("mirror", "M1"), el("lens", ""), el("lens", ""), el("lens", ""), el("window", "W2")}
	got := pairElements(old, new)
	want := []elementPair{{1, 0, `"M1"`}, {0, 1, "2 (lens)"}, {2, 2, "3 (lens)"}, {-1, 3, "4 (lens)"}, {4, 4, `"W2"`}, {3, -1, "4 (dump) of the old revision"}}
	if len(got) != len(want) {
		t.Fatalf("pairs %v, want %v", got, want)
	}
	for i := range want {
		if got[i] != want[i] {
			t.Errorf("pair %d: %v, want %v", i, got[i], want[i])
		}
	}
}

// Taking the eyewear off (a control removed) is a safety change, and the
// hazards it controlled become uncontrolled; the officer's own conditions
// and review date are not.
func TestControlChanges(t *testing.T) {
	data, err := os.ReadFile("../../testdata/examples/table-c.toml")
	if err != nil {
		t.Fatal(err)
	}
	noEyewear := strings.Replace(string(data), `eyewear = "worn"`, `eyewear = "none"`, 1)
	r := compare(t, revisionOf(t, "table-c.toml", data), revisionOf(t, "table-c.toml", []byte(noEyewear)))
	if !r.AffectsSafety || len(r.Setup) != 1 || r.Setup[0].Kind != "controls" || r.Setup[0].Key != "eyewear" || !r.Setup[0].AffectsSafety {
		t.Errorf("eyewear taken off: %+v", r.Setup)
	}
	var text bytes.Buffer
	if err := Text(&text, r); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(text.String(), "not controlled") {
		t.Errorf("the hazards' controls do not show as changed:\n%s", text.String())
	}
	review := strings.Replace(string(data), `review = "2027-06-01"`, `review = "2027-12-01"`, 1)
	if r := compare(t, revisionOf(t, "table-c.toml", data), revisionOf(t, "table-c.toml", []byte(review))); r.AffectsSafety || len(r.Setup) != 1 || r.Setup[0].Kind != "signoff" {
		t.Errorf("a new review date: %+v", r)
	}
}

// Choosing another limit set is a safety change, even where no value moves.
func TestLimitSetChange(t *testing.T) {
	data, err := os.ReadFile("../../testdata/examples/table-c.toml")
	if err != nil {
		t.Fatal(err)
	}
	iec := strings.Replace(string(data), "[setup]\n", "[setup]\nlimits = \"IEC 60825-1:2014\"\n", 1)
	r := compare(t, revisionOf(t, "table-c.toml", data), revisionOf(t, "table-c.toml", []byte(iec)))
	if !r.AffectsSafety || len(r.Setup) != 1 || r.Setup[0].Key != "limits" || !r.Setup[0].AffectsSafety {
		t.Errorf("limit set chosen: %+v", r.Setup)
	}
}
