package budget

import (
	"errors"
	"fmt"
	"slices"
	"strings"
	"testing"
)

// keysBase is the rest of a setup around a table under test: the lasers,
// cloud, path and combiner that the key table's examples name.
const keysBase = `[[laser]]
name = "probe-amp"
wavelength = "780.24 nm"
power = "1.5 W"
waist = "1 mm"

[[laser]]
name = "trap"
wavelength = "1064 nm"
power = "5 W"
waist = "1 mm"

[[laser]]
name = "repump"
wavelength = "780.228 nm"
power = "50 mW"
waist = "1 mm"

[[cloud]]
name = "pencil"
transition = "Rb87 D2"
atoms = 2e4
rms_size = ["6 um", "6 um", "150 um"]

[[path]]
name = "cool"
from = "trap"

  [[path.element]]
  type = "combiner"
  name = "pbs"
  at = "100 mm"

  [[path.element]]
  type = "dump"
  at = "500 mm"
`

// minimalKeys is the smallest set of keys of a table that loads, with test
// (when not "") and the keys it needs beside it, and without drop: key →
// TOML value, from the key table's examples.
func minimalKeys(spec *TableSpec, test, drop string) map[string]string {
	out := map[string]string{}
	add := func(key, value string) {
		if key != drop {
			if _, ok := out[key]; !ok {
				out[key] = value
			}
		}
	}
	example := func(key string) string { return spec.Key(key).Example }
	var addWith func(key string)
	addWith = func(key string) {
		for _, w := range spec.Key(key).With {
			if k, v, ok := strings.Cut(w, "="); ok {
				if k != drop {
					out[k] = fmt.Sprintf("%q", v)
				}
			} else if _, seen := out[w]; !seen && w != drop {
				add(w, example(w))
				addWith(w)
			}
		}
	}
	if test != "" {
		add(test, example(test))
		addWith(test)
	}
	for _, k := range spec.Keys {
		if k.Required {
			add(k.Key, k.Example)
		}
	}
	for _, n := range spec.Needs {
		if n.If != "" {
			v, ok := out[n.If]
			if !ok || (n.Is != "" && v != fmt.Sprintf("%q", n.Is)) {
				continue
			}
		}
		if slices.ContainsFunc(n.AnyOf, func(k string) bool { _, ok := out[k]; return ok }) {
			continue
		}
		for _, k := range n.AnyOf {
			if k != drop {
				add(k, example(k))
				addWith(k)
				break
			}
		}
	}
	return out
}

// keysSetup writes a setup holding the table under test with keys.
func keysSetup(spec *TableSpec, kind ElementType, keys map[string]string) string {
	var b strings.Builder
	lines := func(sep string) string {
		var l []string
		for _, k := range slices.Sorted(func(yield func(string) bool) {
			for k := range keys {
				if !yield(k) {
					return
				}
			}
		}) {
			l = append(l, k+" = "+keys[k])
		}
		return strings.Join(l, sep)
	}
	if _, ok := keys["name"]; ok && spec.Name != "band" && kind == "" {
		keys["name"] = `"tested"`
	}
	switch {
	case kind != "":
		b.WriteString(keysBase)
		b.WriteString("\n[[path]]\nname = \"tested\"\nfrom = \"probe-amp\"\n\n  [[path.element]]\n  type = \"atoms\"\n  at = \"100 mm\"\n  cloud = \"pencil\"\n  direction = [0, 0, -1]\n\n  [[path.element]]\n  type = \"mirror\"\n  at = \"200 mm\"\n\n  [[path.element]]\n")
		if _, ok := keys["type"]; ok {
			keys["type"] = fmt.Sprintf("%q", kind)
		}
		b.WriteString(lines("\n"))
	case spec.Name == "setup":
		b.WriteString("[setup]\n" + lines("\n") + "\n\n" + keysBase)
	case spec.Name == "band":
		b.WriteString(keysBase + "\n[[eyewear]]\nname = \"tested\"\nbands = [{ " + lines(", ") + " }]\n")
	default:
		b.WriteString(keysBase + "\n[[" + spec.Name + "]]\n" + lines("\n") + "\n")
	}
	return b.String()
}

func loadProblems(src string) []string {
	_, err := Parse("keys.toml", []byte(src))
	var ie *InputError
	if errors.As(err, &ie) {
		return ie.Problems
	}
	if err != nil {
		return []string{err.Error()}
	}
	return nil
}

// specsUnderTest lists every table of the format with its element type
// ("" for the tables that are not elements).
func specsUnderTest() []struct {
	spec *TableSpec
	kind ElementType
} {
	var out []struct {
		spec *TableSpec
		kind ElementType
	}
	for _, t := range SetupTables {
		if t.Name != "element" {
			out = append(out, struct {
				spec *TableSpec
				kind ElementType
			}{t, ""})
		}
	}
	for _, k := range Kinds {
		out = append(out, struct {
			spec *TableSpec
			kind ElementType
		}{ElementTable(k), k.Type})
	}
	return out
}

// The loader accepts exactly the keys of the key table, table by table and
// element type by element type: each key, with the keys it needs, loads
// without a problem; a key the table does not list is an unknown key; a
// required key left out, or a rule's keys all left out, is missing; and a
// key given without the keys it needs is refused.
func TestKeyTableMatchesLoader(t *testing.T) {
	for _, c := range specsUnderTest() {
		t.Run(c.spec.Name, func(t *testing.T) {
			if ps := loadProblems(keysSetup(c.spec, c.kind, minimalKeys(c.spec, "", ""))); len(ps) > 0 {
				t.Fatalf("the minimal table does not load: %q", ps)
			}
			for _, k := range c.spec.Keys {
				src := keysSetup(c.spec, c.kind, minimalKeys(c.spec, k.Key, ""))
				if ps := loadProblems(src); len(ps) > 0 {
					t.Errorf("key %s (example %s) is not accepted: %q", k.Key, k.Example, ps)
				}
				if k.ByLaser() {
					keys := minimalKeys(c.spec, k.Key, "")
					keys[k.Key] = "{ probe-amp = " + k.Example + " }"
					if c.kind == "" {
						t.Errorf("%s: a per-laser key outside an element", k.Key)
					} else if ps := loadProblems(keysSetup(c.spec, c.kind, keys)); len(ps) > 0 {
						t.Errorf("key %s per laser is not accepted: %q", k.Key, ps)
					}
				}
				for _, w := range k.With {
					need, _, _ := strings.Cut(w, "=")
					keys := minimalKeys(c.spec, k.Key, need)
					if ps := loadProblems(keysSetup(c.spec, c.kind, keys)); len(ps) == 0 {
						t.Errorf("key %s without %s is accepted", k.Key, need)
					}
				}
				if k.Required {
					ps := loadProblems(keysSetup(c.spec, c.kind, minimalKeys(c.spec, "", k.Key)))
					if !slices.ContainsFunc(ps, func(p string) bool { return strings.Contains(p, k.Key+": missing") }) {
						t.Errorf("required key %s left out: %q", k.Key, ps)
					}
				}
			}
			for _, n := range c.spec.Needs {
				keys := minimalKeys(c.spec, n.If, "")
				if n.Is != "" {
					keys[n.If] = fmt.Sprintf("%q", n.Is)
				}
				for _, k := range n.AnyOf {
					delete(keys, k)
				}
				ps := loadProblems(keysSetup(c.spec, c.kind, keys))
				if !slices.ContainsFunc(ps, func(p string) bool { return strings.Contains(p, n.AnyOf[0]+": missing") }) {
					t.Errorf("%s left out (%s): %q", strings.Join(n.AnyOf, " and "), n.Why, ps)
				}
			}
			keys := minimalKeys(c.spec, "", "")
			keys["no_such_key"] = "1"
			ps := loadProblems(keysSetup(c.spec, c.kind, keys))
			if !slices.ContainsFunc(ps, func(p string) bool { return strings.Contains(p, "no_such_key: unknown key") }) {
				t.Errorf("a key outside the table: %q", ps)
			}
		})
	}
}
