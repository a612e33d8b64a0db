package setup

import (
	"flag"
	"fmt"
	"os"
	"strings"
	"testing"

	"beamledger/budget/units"
)

var updateDocs = flag.Bool("update", false, "rewrite docs/setup-keys.md from the key table")

// docs/setup-keys.md is written from the key table the loader reads, so the
// reference cannot drift from the format: the test fails when the file
// differs from what the table says (go test ./budget/setup -update rewrites
// it).
func TestSetupKeysDoc(t *testing.T) {
	const path = "../../docs/setup-keys.md"
	got := keysMarkdown()
	if *updateDocs {
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test ./budget/setup -update)", err)
	}
	if string(want) != got {
		t.Errorf("%s differs from the key table; run go test ./budget/setup -update and read the diff", path)
	}
}

// keysMarkdown is the key table as a page: a section per table, a row per
// key.
func keysMarkdown() string {
	var b strings.Builder
	b.WriteString("# Setup keys\n\n")
	b.WriteString("Every table and key of a setup file, written from the key table the loader reads (`budget/setup/keys.go`; a test keeps this page equal to it). ")
	b.WriteString("A quantity is a string with its unit (`\"780.24 nm\"`); \"required\" keys must be given; a key marked \"with\" needs the keys named beside it. ")
	b.WriteString("How the keys fit together, with examples: [setup.md](setup.md) and [cookbook.md](cookbook.md).\n")
	table := func(title string, keys []KeySpec, needs []Requirement) {
		b.WriteString("\n## " + title + "\n\n")
		b.WriteString("| key | value | required | what it is | example |\n| --- | --- | --- | --- | --- |\n")
		for _, k := range keys {
			req := ""
			if k.Required {
				req = "yes"
			}
			if len(k.With) > 0 {
				req = strings.TrimSpace(req + " with " + strings.Join(k.With, ", "))
			}
			fmt.Fprintf(&b, "| `%s` | %s | %s | %s | `%s` |\n", k.Key, valueText(k), req, cell(k.Doc), cell(k.Example))
		}
		for _, n := range needs {
			b.WriteString("\n- " + n.Why)
		}
		if len(needs) > 0 {
			b.WriteString("\n")
		}
	}
	for _, ts := range SetupTables {
		table(fmt.Sprintf("`%s`: %s", ts.Path, ts.Doc), ts.Keys, ts.Needs)
	}
	for _, k := range Kinds {
		if len(k.Keys) == 0 && len(k.Needs) == 0 {
			b.WriteString(fmt.Sprintf("\n## element `type = %q`\n\n%s. It takes the common element keys only.\n", string(k.Type), k.Does))
			continue
		}
		table(fmt.Sprintf("element `type = %q`", string(k.Type)), k.Keys, k.Needs)
		b.WriteString("\n" + k.Does + ".\n")
	}
	return b.String()
}

func valueText(k KeySpec) string {
	s := string(k.Kind)
	switch {
	case k.Kind == ValChoice:
		q := make([]string, len(k.Enum))
		for i, e := range k.Enum {
			q[i] = "`" + e + "`"
		}
		s = "one of " + strings.Join(q, ", ")
	case len(k.Dims) > 0:
		var d []string
		for _, dim := range k.Dims {
			if dim == units.Dimensionless {
				d = append(d, "a number")
			} else {
				d = append(d, dim.String())
			}
		}
		s += ": " + strings.Join(d, " or ")
	}
	var extra []string
	if k.Percent() {
		extra = append(extra, "a fraction or a percentage")
	}
	if k.Toleranced() {
		extra = append(extra, "may carry a tolerance")
	}
	if k.ByLaser() {
		extra = append(extra, "may be given per laser")
	}
	if len(extra) > 0 {
		s += "; " + strings.Join(extra, "; ")
	}
	return s
}

func cell(s string) string { return strings.ReplaceAll(s, "|", "\\|") }
