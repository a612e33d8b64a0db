package view

import (
	"fmt"
	"os"
	"strings"
	"testing"

	"beamledger/safety"
	"beamledger/safety/safetytest"
)

// docs/json-keys.md is written from the records the JSON writer emits for
// every shipped example and for the limits lookup (a beam, a pulse train):
// every key with its place in the document, its kind, its label and the
// result field it shows. The test fails when the page differs from what the
// writer emits (go test ./safety/view -update rewrites it), so the
// reference cannot drift from the writer.
func TestJSONKeysDoc(t *testing.T) {
	const path = "../../docs/json-keys.md"
	var check []*Record
	safetytest.ForEachExample(t, "../..", func(t *testing.T, base, f string) {
		a, _ := safetytest.EvaluateFile(t, f)
		check = append(check, Build(a).JSON)
	})
	var lookups []*Record
	for _, q := range []safety.LimitsQuery{
		{Wavelength: 1064e-9, Duration: 10, Power: 5, BeamDiameter: 2e-3, Divergence: 1e-3},
		{Wavelength: 532e-9, PulseDuration: 10e-9, RepetitionRate: 1e3},
	} {
		l, err := safety.LookUpLimits(q)
		if err != nil {
			t.Fatal(err)
		}
		lookups = append(lookups, Limits(l).JSON)
	}
	var b strings.Builder
	b.WriteString("# JSON keys\n\n")
	b.WriteString("Every key `check --json` and `limits --json` write, with its place in the document (`[]` marks a list), its kind, the label the text and the sign-off give it, and the result field it shows. ")
	b.WriteString("Written from the records the JSON writer emits for every shipped example and two lookups; a test keeps this page equal to them. ")
	b.WriteString("Numbers are SI in the unit the key's suffix names; an absent value is `null`. What the figures mean: [json.md](json.md).\n")
	section(&b, "`check --json`", check)
	section(&b, "`limits --json`", lookups)
	got := b.String()
	if *update {
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test ./safety/view -update)", err)
	}
	if string(want) != got {
		t.Errorf("%s differs from the keys the writer emits; run go test ./safety/view -update and read the diff", path)
	}
}

// keyRow is one key of the reference.
type keyRow struct{ place, kind, label, source string }

// section lists the keys of the records, each place once, in the order
// they first appear; the keys of dynamic objects (losses by name,
// correction factors by name) are listed as they occur.
func section(b *strings.Builder, title string, recs []*Record) {
	var rows []keyRow
	seen := map[string]bool{}
	var walk func(prefix string, r *Record)
	walk = func(prefix string, r *Record) {
		if r == nil {
			return
		}
		for i := range r.Members {
			m := &r.Members[i]
			switch {
			case m.IsField():
				if m.Field.People {
					continue
				}
				p := prefix + m.Field.d.Key
				if !seen[p] {
					seen[p] = true
					rows = append(rows, keyRow{p, kindName(m.Field.Kind), m.Field.d.Label, m.Field.d.Source})
				}
			case m.List != nil:
				p := prefix + m.List.Key + "[]"
				if !seen[p] {
					seen[p] = true
					rows = append(rows, keyRow{p, "list", m.List.Heading, ""})
				}
				for j := range m.List.Records {
					walk(p+".", &m.List.Records[j])
				}
			case m.Object != nil:
				p := prefix + m.Object.Key
				if !seen[p] {
					seen[p] = true
					rows = append(rows, keyRow{p, "object", "", ""})
				}
				walk(p+".", m.Object.Record)
			}
		}
	}
	for _, r := range recs {
		walk("", r)
	}
	fmt.Fprintf(b, "\n## %s\n\n| key | kind | label | shows |\n| --- | --- | --- | --- |\n", title)
	for _, r := range rows {
		fmt.Fprintf(b, "| `%s` | %s | %s | %s |\n", r.place, r.kind, cell(r.label), cell(r.source))
	}
}

func kindName(k Kind) string {
	return [...]string{Number: "number", Int: "integer", String: "text", Bool: "true/false", Strings: "list of texts", Matrix: "rows of numbers", Numbers: "list of numbers"}[k]
}

func cell(s string) string { return strings.ReplaceAll(s, "|", "\\|") }
