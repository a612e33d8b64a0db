package budget

import (
	"strings"
	"testing"
)

func TestPrescan(t *testing.T) {
	ok := []string{
		"m2 = [" + strings.Repeat("1.5, ", 100) + "1.5]\n",
		"bands = [{ from = \"740 nm\", to = \"1100 nm\", od = 7 }, { from = \"1.1 um\", to = \"1.2 um\", od = 2.5 }]\n",
		"[a.b.c]\nx = 1\n",
		"s = \"[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[\"\n",
		"s = '''\n[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[\n'''\n",
		"# [[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[\nx = 1\n",
		"x = " + strings.Repeat("[", 32) + strings.Repeat("]", 32) + "\n",
		"a.b.c.d.e.f.g = 1\n",
	}
	for _, src := range ok {
		if err := prescan("t.toml", src); err != nil {
			t.Errorf("%q: %v", src, err)
		}
	}
	bad := map[string]string{
		"x = " + strings.Repeat("[", 33) + strings.Repeat("]", 33) + "\n":             "t.toml:1: values are nested more than 32 deep",
		"\nx = " + strings.Repeat("{a = ", 40) + "1" + strings.Repeat("}", 40) + "\n": "t.toml:2: values are nested more than 32 deep",
		"[" + strings.Repeat("a.", 20) + "a]\n":                                       "t.toml:1: a key or table name has more than 16 dotted parts",
		strings.Repeat("a.", 20) + "a = 1\n":                                          "t.toml:1: a key or table name has more than 16 dotted parts",
	}
	for src, want := range bad {
		if err := prescan("t.toml", src); err == nil || err.Error() != want {
			t.Errorf("%.40q: %v, want %q", src, err, want)
		}
	}
}
