package safetytest

import (
	"encoding/json"
	"testing"
)

func TestDiff(t *testing.T) {
	got := Diff("a\nb\nc\nd\n", "a\nb\nC\nd\n")
	want := "  1  a\n  2  b\n- 3  c\n+ 3  C\n"
	if got != want {
		t.Errorf("got\n%s\nwant\n%s", got, want)
	}
	if got := Diff("a\n", "a\nb\n"); got != "  1  a\n- 2  \n+ 2  b\n" {
		t.Errorf("got %q", got)
	}
}

// Numbers agree to the relative tolerance; anything else must match.
func TestJSONDiff(t *testing.T) {
	dec := func(s string) any {
		var v any
		if err := json.Unmarshal([]byte(s), &v); err != nil {
			t.Fatal(err)
		}
		return v
	}
	for _, c := range []struct {
		want, got, where string
	}{
		{`{"a": 1.0000000000001, "b": [0, null, "x"]}`, `{"a": 1, "b": [0, null, "x"]}`, ""},
		{`{"a": 1.00001}`, `{"a": 1}`, "$.a: want 1.00001, got 1"},
		{`{"a": [1, 2]}`, `{"a": [1]}`, "$.a: want a list of 2, got a list of 1"},
		{`{"a": 1}`, `{"a": 1, "b": 2}`, "$.b: present in want false, in got true"},
		{`{"a": "x"}`, `{"a": "y"}`, "$.a: want x, got y"},
		{`{"a": null}`, `{"a": 0}`, "$.a: want <nil>, got 0"},
	} {
		if got := JSONDiff("$", dec(c.want), dec(c.got), GoldenRelTol); got != c.where {
			t.Errorf("%s vs %s: %q, want %q", c.want, c.got, got, c.where)
		}
	}
}
