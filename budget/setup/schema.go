package setup

import (
	"beamledger/budget/units"
	"encoding/json"
	"fmt"
	"regexp"
	"slices"
	"strconv"
	"strings"
)

// SchemaDraft is the JSON Schema dialect Schema writes.
const SchemaDraft = "https://json-schema.org/draft/2020-12/schema"

// Schema writes the setup format as a JSON Schema (draft 2020-12), from the
// key table (SetupTables, TopKeys and Kinds): every table and key with its
// type, the choices, a pattern for every quantity string, per-laser tables
// and tolerances, and the keys each element type takes and requires. An
// editor's TOML support validates and completes setup files with it.
func Schema(version string) ([]byte, error) {
	defs := map[string]any{}
	b := &schemaBuilder{defs: defs}
	for _, t := range SetupTables {
		if t.Name == "element" {
			continue
		}
		defs[t.Name] = b.tableSchema(t)
	}
	var branches []any
	types := TableNamed("element").Key("type")
	for _, k := range Kinds {
		name := "element_" + string(k.Type)
		defs[name] = b.tableSchema(ElementTable(k))
		branches = append(branches, map[string]any{
			"if":   map[string]any{"properties": map[string]any{"type": map[string]any{"const": string(k.Type)}}, "required": []string{"type"}},
			"then": map[string]any{"$ref": "#/$defs/" + name},
		})
	}
	for alias, k := range typeAliases {
		branches = append(branches, map[string]any{
			"if":   map[string]any{"properties": map[string]any{"type": map[string]any{"const": string(alias)}}, "required": []string{"type"}},
			"then": map[string]any{"$ref": "#/$defs/element_" + string(k)},
		})
	}
	defs["element"] = map[string]any{
		"type":        "object",
		"description": TableNamed("element").Doc,
		"properties":  map[string]any{"type": b.keySchema(types)},
		"required":    []string{"type"},
		"allOf":       branches,
	}
	top := &TableSpec{Name: "setup file", Doc: "a beamledger setup: lasers, beam paths with their elements, atom clouds and eyewear", Keys: TopKeys}
	s := b.tableSchema(top)
	s["$schema"] = SchemaDraft
	s["title"] = "beamledger setup file"
	s["description"] = fmt.Sprintf("The setup format of beamledger %s, written by `beamledger schema` from the tool's own key table. Quantities are strings of a number and a unit (\"780.24 nm\", \"1.5 W\"); the patterns accept a single unit with an SI prefix and a power (\"cm2\", \"m^2\", \"cm²\") or one quotient of two (\"mW/cm2\"); beamledger also reads products (\"W*s\") and other spellings, which the patterns do not list.", version)
	s["$defs"] = defs
	return json.MarshalIndent(s, "", "  ")
}

// schemaBuilder gathers the shared definitions (the quantity patterns,
// each written once) while the tables are written.
type schemaBuilder struct{ defs map[string]any }

// tableSchema is the schema of one table: its keys, none other, the
// required ones, and its rules.
func (b *schemaBuilder) tableSchema(t *TableSpec) map[string]any {
	props := map[string]any{}
	var required []string
	var rules []any
	for i := range t.Keys {
		k := &t.Keys[i]
		props[k.Key] = b.keySchema(k)
		if k.Required {
			required = append(required, k.Key)
		}
		if len(k.With) == 0 {
			continue
		}
		then := map[string]any{}
		var need []string
		valued := map[string]any{}
		for _, w := range k.With {
			key, value, hasValue := strings.Cut(w, "=")
			need = append(need, key)
			if hasValue {
				valued[key] = map[string]any{"const": value}
			}
		}
		then["required"] = need
		if len(valued) > 0 {
			then["properties"] = valued
		}
		rules = append(rules, map[string]any{"if": map[string]any{"required": []string{k.Key}}, "then": then})
	}
	for _, n := range t.Needs {
		var alts []any
		for _, k := range n.AnyOf {
			alts = append(alts, map[string]any{"required": []string{k}})
		}
		rule := map[string]any{"anyOf": alts}
		if n.If == "" {
			rule["$comment"] = n.Why
			rules = append(rules, rule)
			continue
		}
		cond := map[string]any{"required": []string{n.If}}
		if n.Is != "" {
			cond["properties"] = map[string]any{n.If: map[string]any{"const": n.Is}}
		}
		rules = append(rules, map[string]any{"if": cond, "then": rule, "$comment": n.Why})
	}
	s := map[string]any{"type": "object", "properties": props, "additionalProperties": false}
	if t.Doc != "" {
		s["description"] = t.Doc
	}
	if len(required) > 0 {
		s["required"] = required
	}
	if len(rules) > 0 {
		s["allOf"] = rules
	}
	return s
}

// keySchema is the schema of one key's value.
func (b *schemaBuilder) keySchema(k *KeySpec) map[string]any {
	var s map[string]any
	switch k.Kind {
	case ValText:
		s = map[string]any{"type": "string", "maxLength": MaxTextLength}
	case ValName:
		s = map[string]any{"type": "string", "maxLength": MaxNameLength, "pattern": `^[^:\s](?:[^:]*[^:\s])?$`}
	case ValChoice:
		s = map[string]any{"enum": k.Enum}
	case ValQuantity:
		s = b.quantitySchema(k)
		if k.Key == "detuning" {
			// Or a number of linewidths of the driven transition.
			s = map[string]any{"anyOf": []any{s, map[string]any{"type": "string", "pattern": `^\s*[+-]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][+-]?[0-9]+)?\s*(?:Γ|Gamma|gamma)\s*$`}}}
		}
		if k.ByLaser() {
			s = map[string]any{"anyOf": []any{s, map[string]any{"type": "object", "minProperties": 1, "additionalProperties": b.quantitySchema(k),
				"description": "per laser: laser name = value"}}}
		}
	case ValInteger:
		s = map[string]any{"type": "integer"}
		if k.Min != 0 || k.Max != 0 {
			s["minimum"], s["maximum"] = k.Min, k.Max
		}
	case ValPair:
		q := b.quantitySchema(k)
		s = map[string]any{"anyOf": []any{q, map[string]any{"type": "array", "items": q, "minItems": 2, "maxItems": 2}}}
	case ValTriple:
		s = map[string]any{"type": "array", "items": b.quantitySchema(k), "minItems": 3, "maxItems": 3}
	case ValVector:
		s = map[string]any{"type": "array", "items": map[string]any{"type": "number"}, "minItems": 3, "maxItems": 3}
	case ValNames:
		s = map[string]any{"type": "array", "items": map[string]any{"type": "string"}, "minItems": 1}
	case ValTexts:
		s = map[string]any{"type": "array", "items": map[string]any{"type": "string", "maxLength": MaxTextLength}, "minItems": 1}
	case ValByLaser:
		s = map[string]any{"type": "object", "minProperties": 1, "additionalProperties": b.quantitySchema(&KeySpec{Dims: []units.Dimension{units.Dimensionless}})}
	case ValTables:
		s = map[string]any{"type": "array", "items": map[string]any{"$ref": "#/$defs/" + k.Table}}
	default:
		if k.Table != "" { // [setup], a single table
			s = map[string]any{"$ref": "#/$defs/" + k.Table}
		}
	}
	desc := k.Doc
	if k.Kind == ValQuantity || k.Kind == ValPair || k.Kind == ValTriple {
		var dims []string
		for _, d := range k.Dims {
			dims = append(dims, units.Describe(d))
		}
		desc += "; " + strings.Join(dims, " or ")
		if k.Percent() {
			desc += " (or a percentage, \"82 %\")"
		}
		if k.Toleranced() {
			desc += "; a tolerance may be written \"a .. b\" (uniform) or \"x ± s\" (normal)"
		}
		if k.ByLaser() {
			desc += "; or per laser, { laser = value }"
		}
	}
	if k.Example != "" {
		desc += "; e.g. " + k.Example
	}
	s["description"] = desc
	return s
}

// quantitySchema is the schema of one quantity of the key's dimensions: a
// string matching a quantity pattern (a shared definition), and for a
// dimensionless key also a bare number (within the key's bounds).
func (b *schemaBuilder) quantitySchema(k *KeySpec) map[string]any {
	var pats []string
	var number map[string]any
	bareOnly := false // a dimensionless value that is no fraction: a bare number, a string only for a tolerance
	for _, d := range k.Dims {
		if d == units.Dimensionless {
			number = map[string]any{"type": "number"}
			if k.Min != 0 || k.Max != 0 {
				number["minimum"] = k.Min
				if k.Max != 0 {
					number["maximum"] = k.Max
				}
			}
			if !k.Percent() {
				bareOnly = true
				continue
			}
		}
		pats = append(pats, QuantityPattern(d, k.Percent()))
	}
	name := "quantity"
	for _, d := range k.Dims {
		name += "_" + dimensionKey(d)
	}
	if k.Percent() {
		name += "_percent"
	}
	tol := `(?:\s*(?:\.\.|±|\+/-)\s*`
	var alts []string
	if len(pats) > 0 {
		q := "(?:" + strings.Join(pats, "|") + ")"
		if k.Toleranced() {
			alts = append(alts, q+tol+q+")?")
		} else {
			alts = append(alts, q)
		}
	}
	if bareOnly && k.Toleranced() {
		// A bare number's tolerance is the one string it may be.
		alts = append(alts, numberPattern+tol+numberPattern+")")
	}
	if k.Toleranced() {
		name += "_toleranced"
	}
	if len(alts) == 0 {
		return number
	}
	if _, ok := b.defs[name]; !ok {
		b.defs[name] = map[string]any{"type": "string", "pattern": "^\\s*(?:" + strings.Join(alts, "|") + ")\\s*$"}
	}
	str := map[string]any{"$ref": "#/$defs/" + name}
	if number == nil {
		return str
	}
	return map[string]any{"anyOf": []any{number, str}}
}

// numberPattern is what numberPrefixLen reads: a sign, digits with one
// point, an exponent.
const numberPattern = `[+-]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][+-]?[0-9]+)?`

// QuantityPattern is a regular expression (without anchors) for a number
// and a unit of dimension d, as ParseQuantity reads them: one unit symbol
// with its SI prefix and power, or one quotient of two such; a bare number
// for a dimensionless value ("%" only where percent allows it).
func QuantityPattern(d units.Dimension, percent bool) string {
	// "%" is refused only in a dimensionless value that is not a
	// fraction; in a quotient of another dimension the parser reads it.
	terms := unitTerms(percent || d != units.Dimensionless)
	group := func(ts []string) string { return "(?:" + strings.Join(ts, "|") + ")" }
	var alts []string
	if t := terms[d]; len(t) > 0 {
		alts = append(alts, group(t))
	}
	dims := make([]units.Dimension, 0, len(terms))
	for a := range terms {
		dims = append(dims, a)
	}
	slices.SortFunc(dims, func(a, b units.Dimension) int { return strings.Compare(fmt.Sprint(a), fmt.Sprint(b)) })
	for _, a := range dims {
		if tb := terms[a.Add(d, -1)]; len(tb) > 0 {
			alts = append(alts, group(terms[a])+`\s*/\s*`+group(tb))
		}
	}
	unit := group(alts)
	if d == units.Dimensionless {
		if len(alts) == 0 {
			return numberPattern
		}
		return numberPattern + `(?:\s*` + unit + ")?"
	}
	return numberPattern + `\s*` + unit
}

// unitTerms lists, for every dimension a single unit term can have, the
// regular expressions of the terms: a symbol, its SI prefix where it takes
// one, and its power in the spellings parseUnitTerm reads.
func unitTerms(percent bool) map[units.Dimension][]string {
	out := map[units.Dimension][]string{}
	syms := make([]string, 0, len(units.Units))
	for s := range units.Units {
		syms = append(syms, s)
	}
	slices.Sort(syms)
	prefixSet := make([]string, 0, len(units.Prefixes))
	for p := range units.Prefixes {
		prefixSet = append(prefixSet, regexp.QuoteMeta(p))
	}
	slices.Sort(prefixSet)
	prefix := "(?:" + strings.Join(prefixSet, "|") + ")?"
	for _, sym := range syms {
		u := units.Units[sym]
		body := regexp.QuoteMeta(sym)
		if u.Prefixed {
			body = prefix + body
		}
		if u.Dim == units.Dimensionless {
			if percent {
				out[units.Dimensionless] = append(out[units.Dimensionless], body)
			}
			continue
		}
		for p := int8(-4); p <= 4; p++ {
			if p == 0 {
				continue
			}
			d := u.Dim.Scale(p)
			out[d] = append(out[d], body+powerPattern(p))
		}
	}
	return out
}

// powerPattern is how a power of a unit is written: "^2", "^+2", "2" or
// "²" (1 may be left out).
func powerPattern(p int8) string {
	n := strconv.Itoa(int(p))
	sup := map[int8]string{1: "¹", 2: "²", 3: "³"}[p]
	var alts []string
	if p > 0 {
		alts = append(alts, `\^\+?0*`+n)
		if p >= 2 {
			alts = append(alts, n)
		}
		if sup != "" {
			alts = append(alts, sup)
		}
	} else {
		alts = append(alts, `\^-0*`+strconv.Itoa(int(-p)))
	}
	s := "(?:" + strings.Join(alts, "|") + ")"
	if p == 1 {
		s += "?"
	}
	return s
}

// dimensionKey names a dimension in a definition's name: its base units'
// powers ("m2_kg1_s-3").
func dimensionKey(d units.Dimension) string {
	if d == units.Dimensionless {
		return "number"
	}
	var parts []string
	for _, p := range []struct {
		sym string
		e   int8
	}{{"m", d.Length}, {"kg", d.Mass}, {"s", d.Time}, {"K", d.Temperature}, {"rad", d.Angle}} {
		if p.e != 0 {
			parts = append(parts, p.sym+strconv.Itoa(int(p.e)))
		}
	}
	return strings.Join(parts, "_")
}
