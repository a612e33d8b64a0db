package setup

import (
	"errors"
	"fmt"
	"maps"
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
	case spec.Name == "setup" || spec.Name == "controls" || spec.Name == "signoff":
		b.WriteString("[" + spec.Name + "]\n" + lines("\n") + "\n\n" + keysBase)
	case spec.Name == "band":
		b.WriteString(keysBase + "\n[[eyewear]]\nname = \"tested\"\nbands = [{ " + lines(", ") + " }]\n")
	case spec.Name == "cloud":
		// The trap's light reaches the cloud tested (its keys name the trap).
		base := strings.Replace(keysBase, "  [[path.element]]\n  type = \"combiner\"", "  [[path.element]]\n  type = \"atoms\"\n  at = \"50 mm\"\n  cloud = \"tested\"\n\n  [[path.element]]\n  type = \"combiner\"", 1)
		b.WriteString(base + "\n[[" + spec.Name + "]]\n" + lines("\n") + "\n")
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

// keyCase is one setup the key table says loads, or fails with want in a
// problem ("" for any problem).
type keyCase struct {
	what, src, want string
	loads           bool
}

// keyCases are the cases of one table: the minimal table; each key, with
// the keys it needs (and per laser where it may be); each key without one
// it needs; each required key left out; each rule's keys all left out; an
// unknown key.
func keyCases(spec *TableSpec, kind ElementType) []keyCase {
	setup := func(keys map[string]string) string { return keysSetup(spec, kind, keys) }
	out := []keyCase{{what: "the minimal table", src: setup(minimalKeys(spec, "", "")), loads: true}}
	for _, k := range spec.Keys {
		keys := minimalKeys(spec, k.Key, "")
		if kind == TypeAtoms && (k.Key == "goal_laser" || k.Key == "goal_at" || k.Key == "goal_fraction") {
			// The example laser is near resonance: a goal it can serve.
			keys["goal"], keys["goal_value"] = `"saturation"`, "1"
		}
		out = append(out, keyCase{what: "key " + k.Key + " = " + k.Example, src: setup(keys), loads: true})
		if fraction := k.Kind == ValQuantity && k.Min == 0 && k.Max == 1; fraction || k.Percent() {
			// A fraction (a bare number in [0, 1]) may be written as a
			// percentage and, where it may carry one, with a tolerance.
			keys := maps.Clone(keys)
			keys[k.Key] = `"50 %"`
			out = append(out, keyCase{what: "key " + k.Key + " as a percentage", src: setup(keys), loads: true})
			if k.Toleranced() {
				keys[k.Key] = `"0.5 .. 0.6"`
				out = append(out, keyCase{what: "key " + k.Key + " with a tolerance", src: setup(keys), loads: true})
			}
		}
		if k.ByLaser() {
			keys := minimalKeys(spec, k.Key, "")
			keys[k.Key] = "{ probe-amp = " + k.Example + " }"
			src := setup(keys)
			if kind == TypeCombiner && k.Key == "join_transmission" {
				// The entry is for the beam that joins there.
				keys[k.Key] = "{ repump = " + k.Example + " }"
				src = setup(keys) + fmt.Sprintf("\n[[path]]\nname = \"joiner\"\nfrom = \"repump\"\ninto = \"tested:%s\"\ninto_at = \"250 mm\"\n", strings.Trim(keys["name"], `"`))
			}
			out = append(out, keyCase{what: "key " + k.Key + " per laser", src: src, loads: true})
		}
		for _, w := range k.With {
			need, _, _ := strings.Cut(w, "=")
			out = append(out, keyCase{what: "key " + k.Key + " without " + need, src: setup(minimalKeys(spec, k.Key, need))})
		}
		if k.Required && !(kind != "" && k.Key == "type") {
			out = append(out, keyCase{what: "required key " + k.Key + " left out", src: setup(minimalKeys(spec, "", k.Key)), want: k.Key + ": missing"})
		}
	}
	for _, n := range spec.Needs {
		keys := minimalKeys(spec, n.If, "")
		if n.Is != "" {
			keys[n.If] = fmt.Sprintf("%q", n.Is)
		}
		for _, k := range n.AnyOf {
			delete(keys, k)
		}
		out = append(out, keyCase{what: strings.Join(n.AnyOf, " and ") + " left out (" + n.Why + ")", src: setup(keys), want: n.AnyOf[0] + ": missing"})
	}
	keys := minimalKeys(spec, "", "")
	keys["no_such_key"] = "1"
	return append(out, keyCase{what: "an unknown key", src: setup(keys), want: "no_such_key: unknown key"})
}

// The loader accepts exactly the keys of the key table, table by table and
// element type by element type: each key, with the keys it needs, loads
// without a problem; a key the table does not list is an unknown key; a
// required key left out, or a rule's keys all left out, is missing; and a
// key given without the keys it needs is refused.
func TestKeyTableMatchesLoader(t *testing.T) {
	for _, c := range specsUnderTest() {
		t.Run(c.spec.Name, func(t *testing.T) {
			for _, k := range keyCases(c.spec, c.kind) {
				ps := loadProblems(k.src)
				switch {
				case k.loads && len(ps) > 0:
					t.Errorf("%s: not accepted: %q", k.what, ps)
				case !k.loads && len(ps) == 0:
					t.Errorf("%s: accepted", k.what)
				case k.want != "" && !slices.ContainsFunc(ps, func(p string) bool { return strings.Contains(p, k.want) }):
					t.Errorf("%s: problems %q, want %q", k.what, ps, k.want)
				}
			}
		})
	}
}
