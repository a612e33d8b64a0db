package setup

import (
	"fmt"
	"strings"
	"testing"
)

func deep(line int) string {
	return fmt.Sprintf("t.toml:%d: tables and values are nested more than 32 deep (counting each part of a dotted key)", line)
}

func TestPrescan(t *testing.T) {
	ok := []string{
		"m2 = [" + strings.Repeat("1.5, ", 100) + "1.5]\n",
		"bands = [{ from = \"740 nm\", to = \"1100 nm\", od = 7 }, { from = \"1.1 um\", to = \"1.2 um\", od = 2.5 }]\n",
		"[a.b.c]\nx = 1\n",
		"s = \"[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[\"\n",
		"s = '''\n[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[\n'''\n",
		"# [[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[\nx = 1\n",
		"x = " + strings.Repeat("[", 31) + strings.Repeat("]", 31) + "\n",
		"[[path.element]]\ntransmission = { a = 0.9 }\n",
		"x = {" + strings.Repeat("a.", 14) + "a = {" + strings.Repeat("b.", 14) + "b = 1}}\n", // 1 + 15 + 15 = 31
		"a.b.c.d.e.f.g = 1\n",
	}
	for _, src := range ok {
		if _, err := prescan("t.toml", src); err != nil {
			t.Errorf("%q: %v", src, err)
		}
	}
	bad := map[string]string{
		"x = " + strings.Repeat("[", 32) + strings.Repeat("]", 32) + "\n":             deep(1),
		"\nx = " + strings.Repeat("{a = ", 40) + "1" + strings.Repeat("}", 40) + "\n": deep(2),
		// depth and dotted-key length together, each within its own limit
		"x = {" + strings.Repeat("a.", 14) + "a = {" + strings.Repeat("b.", 14) + "b = {c.d = 1}}}\n": deep(1),
		"[" + strings.Repeat("a.", 14) + "a]\n" + strings.Repeat("b.", 14) + "b = {c.d.e = 1}\n":      deep(2),
		strings.Repeat("[a.b]\n", MaxKeyDots+1):                                                       "t.toml:100001: the keys and table names of the file hold more than 100000 dots together",
		"[" + strings.Repeat("a.", 20) + "a]\n":                                                       "t.toml:1: a key or table name has more than 16 dotted parts",
		strings.Repeat("a.", 20) + "a = 1\n":                                                          "t.toml:1: a key or table name has more than 16 dotted parts",
	}
	for src, want := range bad {
		if _, err := prescan("t.toml", src); err == nil || err.Error() != want {
			t.Errorf("%.40q: %v, want %q", src, err, want)
		}
	}
}

// Line numbers come from the same pass that reads the file's structure, so
// comments, strings and inline tables cannot shift them.
func TestLineIndex(t *testing.T) {
	src := `# a comment with ''' and """ in it
[setup]
title = """two
lines""" # and ''' again
[[laser]]
name = "l"
[[path]]
name = "p"
element = [
  { type = "lens", at = "1 m", focal_length = "x" },
  { type = "mirror",
    at = "2 m" },
]
[[path]]
name = "q"
  [[path.element]]
  type = "dump"
  "at" = "1 m"
`
	idx, err := prescan("t.toml", src)
	if err != nil {
		t.Fatal(err)
	}
	for key, want := range map[string]int{
		"setup.title": 3, "laser[0].name": 6, "path[0]": 7, "path[0].element": 9,
		"path[0].element[0]": 10, "path[0].element[0].focal_length": 10,
		"path[0].element[1]": 11, "path[0].element[1].at": 12,
		"path[1].name": 15, "path[1].element[0]": 16, "path[1].element[0].at": 18,
	} {
		t.Run(key, func(t *testing.T) {
			if got := idx[key]; got != want {
				t.Errorf("%s: line %d, want %d", key, got, want)
			}
		})
	}
}
