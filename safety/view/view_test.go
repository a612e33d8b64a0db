package view

import (
	"math"
	"path/filepath"
	"reflect"
	"slices"
	"strings"
	"testing"

	"beamledger/budget"
	"beamledger/budget/atoms"
	"beamledger/budget/drive"
	"beamledger/budget/setup"
	"beamledger/limits"
	"beamledger/safety"
	"beamledger/safety/safetytest"
)

// The JSON writer refuses a non-finite figure and names where it is, rather
// than write a document no reader can take; an absent value is null.
func TestJSONRefusesNonFinite(t *testing.T) {
	inner := &Record{}
	inner.F(Field{d: &Desc{Key: "v_w"}, Kind: Number, SI: math.Inf(1)})
	doc := &Record{}
	doc.F(Num(&Desc{Key: "a_w"}, math.NaN(), "")).L(&List{Key: "list", Records: []Record{*inner}})
	var b strings.Builder
	err := WriteJSON(&b, doc)
	if err == nil || !strings.Contains(err.Error(), "$.list[0].v_w is +Inf") {
		t.Errorf("got %v", err)
	}
	ok := &Record{}
	ok.F(Num(&Desc{Key: "a_w"}, math.NaN(), "")).F(Absent(&Desc{Key: "b"}, true))
	b.Reset()
	if err := WriteJSON(&b, ok); err != nil || b.String() != "{\n  \"a_w\": null\n}\n" {
		t.Errorf("got %q, %v", b.String(), err)
	}
}

// A line's {key} takes the field's text; the texts themselves are copied as
// they are, so a setup's name holding braces is never expanded.
func TestExpand(t *testing.T) {
	r := &Record{}
	r.F(Str(&Desc{Key: "name"}, "{power_w}")).F(Num(&Desc{Key: "power_w"}, 1, "1 W"))
	goal := &Record{}
	goal.F(Num(&Desc{Key: "margin_db"}, 3, "+3.0 dB"))
	r.O("goal", goal, false)
	if got := r.Expand("{name} carries {power_w}, margin {goal.margin_db}"); got != "{power_w} carries 1 W, margin +3.0 dB" {
		t.Errorf("got %q", got)
	}
}

// Every exported numeric field of the assessment's result types is shown by
// the view (and so in the text, the JSON and the sign-off, which all draw
// it), or listed here as hidden on purpose with the reason.
func TestFieldCoverage(t *testing.T) {
	hidden := map[string]string{
		"Row.BeamOut":               "the beam leaving an element is the next one's BeamIn, shown there",
		"Segment.Beam":              "the beam at a segment's start is the previous element's, shown there",
		"Segment.Fraction":          "the power of a segment is shown as its exposure's power",
		"CloudBeam.U":               "the beam's x plane in the cloud frame follows from its direction by the documented rule (budget.BeamAxes); the direction is shown",
		"CloudBeam.V":               "the beam's y plane completes the right-handed set with its direction and x plane (budget.BeamAxes)",
		"Toleranced.Laser":          "an index into the setup's lasers; the input's label names the laser",
		"Toleranced.Index":          "which value of an [x, y] pair; the input's label says x or y",
		"PathBudget.First":          "an index into the path's elements; the view shows where the beam joins (joined_at_m) and its table from that element",
		"PathBudget.ShiftIn":        "the AOM shift a beam carries onto a path; its effect is the detuning shown at the atoms",
		"DipoleResult.PerIntensity": "U/I words the potential attractive or repulsive; its value is U/k_B over the peak irradiance, both shown",
	}
	shown := map[string]bool{}
	examples, _ := filepath.Glob("../../testdata/examples/*.toml")
	hostile, _ := filepath.Glob("../../testdata/hostile/*.toml")
	for _, f := range append(examples, hostile...) {
		a, _ := safetytest.EvaluateFile(t, f)
		Build(a).JSON.Walk(func(f *Field) { shown[f.Source()] = true })
	}
	types := []any{budget.Row{}, budget.FiberCoupling{}, budget.PathBudget{}, budget.LaserBalance{}, budget.Segment{},
		drive.AtomsResult{}, drive.DipoleResult{}, drive.GoalResult{}, atoms.Collective{},
		safety.LaserLimits{}, safety.Exposure{}, safety.Reflection{}, safety.EyewearNeed{}, budget.Finding{}, limits.PulsedLimit{}, drive.CloudResult{}, drive.Trap{}, drive.CloudGoal{}, drive.CloudBeam{}, drive.GoalTolerance{}, drive.Contributor{}, setup.Toleranced{}, setup.Controls{}, setup.SignOff{}}
	for _, v := range types {
		typ := reflect.TypeOf(v)
		for i := 0; i < typ.NumField(); i++ {
			f := typ.Field(i)
			if !f.IsExported() || !numeric(f.Type) {
				continue
			}
			name := typ.Name() + "." + f.Name
			if _, ok := hidden[name]; ok {
				continue
			}
			if !shown[name] {
				t.Errorf("%s is neither shown by the view nor listed as hidden", name)
			}
		}
	}
	for name, why := range hidden {
		if why == "" {
			t.Errorf("%s is hidden without a reason", name)
		}
		if shown[name] {
			t.Errorf("%s is listed as hidden but shown", name)
		}
	}
}

// numeric reports whether a type holds numbers a person could be shown:
// floats and ints, arrays of them, and beams (their radii).
func numeric(t reflect.Type) bool {
	switch t.Kind() {
	case reflect.Float64, reflect.Int:
		return true
	case reflect.Array:
		return numeric(t.Elem())
	case reflect.Struct:
		return t.Name() == "Beam"
	}
	return false
}

// Findings of one kind on one path share a line at the worst of them;
// findings on no path, or of another severity, stay alone.
func TestFindingGroups(t *testing.T) {
	f := func(sev budget.Severity, kind budget.FindingKind, path string, ratio float64) budget.Finding {
		return budget.Finding{Severity: sev, Kind: kind, Path: path}.Figure(ratio, 1, "W")
	}
	fs := []budget.Finding{
		f(budget.SeverityHazard, "stray_reflection", "a", 3),
		f(budget.SeverityHazard, "stray_reflection", "a", 9),
		f(budget.SeverityHazard, "stray_reflection", "b", 1),
		f(budget.SeverityNote, "stray_reflection", "a", 50),
		f(budget.SeverityDefect, "eyewear_gap", "", 1),
		f(budget.SeverityDefect, "eyewear_gap", "", 2),
		f(budget.SeverityHazard, "stray_reflection", "a", 9),
	}
	want := []int{0, 3, 1, 1, 1, 1, 0}
	if got := FindingGroups(fs); !slices.Equal(got, want) {
		t.Errorf("groups %v, want %v", got, want)
	}
}

// Text and sign-off name finding kinds in words; JSON keeps the kind.
func TestKindWords(t *testing.T) {
	for k, want := range map[budget.FindingKind]string{"exposure_above_mpe": "exposure above the MPE", "stray_reflection": "stray reflection", "no_en207_filter": "no EN 207 filter"} {
		if got := KindWords(k); got != want {
			t.Errorf("%s: %q, want %q", k, got, want)
		}
	}
}
