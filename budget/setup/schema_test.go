package setup

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math/rand/v2"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"testing"

	"github.com/pelletier/go-toml/v2"
	"github.com/santhosh-tekuri/jsonschema/v6"

	"beamledger/budget/setup/starter"
	"beamledger/budget/units"
)

// compileSchema compiles a schema document; the compiler validates it
// against the draft 2020-12 meta-schema first.
func compileSchema(t testing.TB, doc []byte) *jsonschema.Schema {
	t.Helper()
	v, err := jsonschema.UnmarshalJSON(bytes.NewReader(doc))
	if err != nil {
		t.Fatalf("the schema is not JSON: %v", err)
	}
	c := jsonschema.NewCompiler()
	if err := c.AddResource("beamledger.schema.json", v); err != nil {
		t.Fatal(err)
	}
	s, err := c.Compile("beamledger.schema.json")
	if err != nil {
		t.Fatalf("the schema does not compile: %v", err)
	}
	return s
}

func schema(t testing.TB) *jsonschema.Schema {
	t.Helper()
	doc, err := Schema("test")
	if err != nil {
		t.Fatal(err)
	}
	return compileSchema(t, doc)
}

// validateTOML validates a setup file's TOML against the schema, as an
// editor's TOML support does (the TOML document read as JSON).
func validateTOML(s *jsonschema.Schema, src string) error {
	var raw map[string]any
	if err := toml.Unmarshal([]byte(src), &raw); err != nil {
		return fmt.Errorf("TOML: %v", err)
	}
	j, err := json.Marshal(raw)
	if err != nil {
		return err
	}
	v, err := jsonschema.UnmarshalJSON(bytes.NewReader(j))
	if err != nil {
		return err
	}
	return s.Validate(v)
}

// The schema `beamledger schema` prints is a valid draft 2020-12 schema.
// With BEAMLEDGER_SCHEMA set (as .ci/run does), the file the command
// printed is checked too.
func TestSchemaIsValid(t *testing.T) {
	schema(t)
	if f := os.Getenv("BEAMLEDGER_SCHEMA"); f != "" {
		doc, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		compileSchema(t, doc)
	}
}

// The schema's keys are the key table's, table by table and element type
// by element type, with the same required keys.
func TestSchemaKeysAreTheKeyTable(t *testing.T) {
	doc, err := Schema("test")
	if err != nil {
		t.Fatal(err)
	}
	var s struct {
		Defs map[string]struct {
			Properties map[string]any `json:"properties"`
			Required   []string       `json:"required"`
		} `json:"$defs"`
	}
	if err := json.Unmarshal(doc, &s); err != nil {
		t.Fatal(err)
	}
	for _, c := range specsUnderTest() {
		name := c.spec.Name
		if c.kind != "" {
			name = "element_" + string(c.kind)
		}
		def, ok := s.Defs[name]
		if !ok {
			t.Errorf("the schema has no %s", name)
			continue
		}
		var want, required []string
		for _, k := range c.spec.Keys {
			want = append(want, k.Key)
			if k.Required {
				required = append(required, k.Key)
			}
		}
		got := slices.Sorted(func(yield func(string) bool) {
			for k := range def.Properties {
				if !yield(k) {
					return
				}
			}
		})
		slices.Sort(want)
		slices.Sort(required)
		slices.Sort(def.Required)
		if !slices.Equal(got, want) {
			t.Errorf("%s: schema keys %v, key table %v", name, got, want)
		}
		if !slices.Equal(def.Required, required) {
			t.Errorf("%s: schema requires %v, key table %v", name, def.Required, required)
		}
	}
}

// The schema and the loader agree on every key of every table: what loads
// validates, and an unknown key, a required key left out, a rule's keys all
// left out and a key without the keys it needs fail both (keyCases).
func TestSchemaAgreesWithLoader(t *testing.T) {
	sch := schema(t)
	for _, c := range specsUnderTest() {
		t.Run(c.spec.Name, func(t *testing.T) {
			for _, k := range keyCases(c.spec, c.kind) {
				if loads := len(loadProblems(k.src)) == 0; loads != k.loads {
					t.Fatalf("%s: loads %v", k.what, loads)
				}
				if err := validateTOML(sch, k.src); (err == nil) != k.loads {
					t.Errorf("%s: loads %v, but the schema says %v", k.what, k.loads, err)
				}
			}
		})
	}
}

// Every shipped example, the generated lab, every accepted hostile setup
// and the starter validate.
func TestShippedSetupsValidate(t *testing.T) {
	sch := schema(t)
	files, _ := filepath.Glob("../../testdata/examples/*.toml")
	more, _ := filepath.Glob("../../testdata/hostile/*.toml")
	files = append(append(files, more...), "../../testdata/scale/lab-2000.toml")
	if len(files) < 10 {
		t.Fatalf("%d files", len(files))
	}
	for _, f := range files {
		data, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		if err := validateTOML(sch, string(data)); err != nil {
			t.Errorf("%s: %v", f, err)
		}
	}
	if err := validateTOML(sch, string(starter.Setup)); err != nil {
		t.Errorf("the starter: %v", err)
	}
}

// Every bad input whose error is an unknown key, a wrong type or value, or
// A missing required key fails validation.
func TestBadInputsFailValidation(t *testing.T) {
	sch := schema(t)
	errs, _ := filepath.Glob("../../testdata/bad/*.err")
	kinds := regexp.MustCompile(`unknown key|: missing \(|, got (a|an) |has no unit|is not one of`)
	n := 0
	for _, e := range errs {
		msg, err := os.ReadFile(e)
		if err != nil {
			t.Fatal(err)
		}
		if !kinds.Match(msg) {
			continue
		}
		n++
		src, err := os.ReadFile(strings.TrimSuffix(e, ".err") + ".toml")
		if err != nil {
			t.Fatal(err)
		}
		if validateTOML(sch, string(src)) == nil {
			t.Errorf("%s (%s) validates", filepath.Base(e), strings.TrimSpace(string(msg)))
		}
	}
	if n < 10 {
		t.Errorf("only %d bad inputs of these kinds", n)
	}
}

// The quantity patterns read what ParseQuantity reads: for every unit
// symbol, prefix and power spelling, single and in quotients (a random
// sample of those), with every number form, a pattern matches exactly
// when the parser reads a value of its dimension.
func TestQuantityPatternMatchesParser(t *testing.T) {
	var terms []string
	for sym, u := range units.Units {
		if sym == "%" {
			continue
		}
		pre := []string{""}
		if u.Prefixed {
			for p := range units.Prefixes {
				pre = append(pre, p)
			}
		}
		for _, p := range pre {
			for _, pow := range []string{"", "2", "3", "4", "^2", "^+2", "^-1", "^-3", "²", "³", "¹", "^1", "1", "^5", "^0"} {
				terms = append(terms, p+sym+pow)
			}
		}
	}
	slices.Sort(terms)
	var texts []string
	texts = append(texts, terms...)
	r := rand.New(rand.NewPCG(1, 2))
	for i := 0; i < 4000; i++ {
		a, b := terms[r.IntN(len(terms))], terms[r.IntN(len(terms))]
		texts = append(texts, a+"/"+b, a+" / "+b)
	}
	texts = append(texts, "%", "m/%", "W/%", "xyz", "mm/m/s")
	numbers := []string{"5", "-2.5e-3", ".5", "5.", "+3E2", "7e"}
	dims := []units.Dimension{units.Length, units.Time, units.Frequency, units.Power, units.Irradiance, units.RadiantExposure, units.LinearPowerDensity, units.Temperature, units.Mass}
	pats := map[units.Dimension]*regexp.Regexp{}
	for _, d := range append(dims, units.Dimensionless) {
		pats[d] = regexp.MustCompile(`^\s*(?:` + QuantityPattern(d, false) + `)\s*$`)
	}
	percent := regexp.MustCompile(`^\s*(?:` + QuantityPattern(units.Dimensionless, true) + `)\s*$`)
	mismatches := 0
	for i, u := range texts {
		num := numbers[i%len(numbers)]
		for _, s := range []string{num + " " + u, num + u} {
			for _, d := range append(dims, units.Dimensionless) {
				_, err := units.ParseAs(s, d)
				parsed := err == nil && !(d == units.Dimensionless && strings.Contains(s, "%"))
				if got := pats[d].MatchString(s); got != parsed && mismatches < 20 {
					mismatches++
					t.Errorf("%q as %s: pattern %v, parser %v (%v)", s, d, got, parsed, err)
				}
			}
			_, err := units.ParseAs(s, units.Dimensionless)
			if got := percent.MatchString(s); got != (err == nil) && mismatches < 20 {
				mismatches++
				t.Errorf("%q as a fraction: pattern %v, parser %v (%v)", s, got, err == nil, err)
			}
		}
	}
}

// One tolerance per value in the schema as in the loader: a tolerance
// inside another fails validation, one alone passes.
func TestNestedToleranceFailsValidation(t *testing.T) {
	sch := schema(t)
	for _, name := range []string{"tolerance-nested-range", "tolerance-nested-normal"} {
		src, err := os.ReadFile("../../testdata/bad/" + name + ".toml")
		if err != nil {
			t.Fatal(err)
		}
		if validateTOML(sch, string(src)) == nil {
			t.Errorf("%s validates", name)
		}
		one := regexp.MustCompile(`transmission = "[^"]*"`).ReplaceAllString(string(src), `transmission = "0.9 ± 0.05"`)
		if err := validateTOML(sch, one); err != nil {
			t.Errorf("%s with one tolerance: %v", name, err)
		}
	}
}
