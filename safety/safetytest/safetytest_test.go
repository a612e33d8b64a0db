package safetytest

import "testing"

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
