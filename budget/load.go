package budget

import (
	"errors"
	"fmt"
	"math"
	"os"
	"sort"
	"strings"

	"github.com/BurntSushi/toml"
)

// MaxSetupBytes bounds the size of a setup file the loader reads.
const MaxSetupBytes = 4 << 20

// Load reads and checks a setup file.
func Load(filename string) (*Setup, error) {
	data, err := os.ReadFile(filename)
	if err != nil {
		return nil, fmt.Errorf("reading setup: %w", err)
	}
	return Parse(filename, data)
}

// InputError is a setup that cannot be used. It lists every problem found,
// each naming file, line where known, and field.
type InputError struct {
	Problems []string
}

func (e *InputError) Error() string { return strings.Join(e.Problems, "\n") }

// maxProblems bounds how many problems one load reports.
const maxProblems = 25

// Parse reads a setup from its bytes; filename is used in messages.
func Parse(filename string, data []byte) (*Setup, error) {
	if len(data) > MaxSetupBytes {
		return nil, &InputError{[]string{fmt.Sprintf("%s: file is %d bytes, more than the %d a setup may have", filename, len(data), MaxSetupBytes)}}
	}
	if err := prescan(filename, string(data)); err != nil {
		return nil, err
	}
	// Line numbers are indexed while the decoder runs; both only read.
	src := string(data)
	linesC := make(chan lineIndex, 1)
	go func() { linesC <- indexLines(src) }()
	var raw map[string]any
	if _, err := toml.Decode(src, &raw); err != nil {
		var pe toml.ParseError
		if errors.As(err, &pe) {
			return nil, &InputError{[]string{fmt.Sprintf("%s:%d: TOML syntax: %s", filename, pe.Position.Line, pe.Message)}}
		}
		return nil, &InputError{[]string{fmt.Sprintf("%s: TOML syntax: %v", filename, err)}}
	}
	l := &loader{file: filename, lines: <-linesC}
	s := l.setup(raw)
	if len(l.problems) > 0 {
		return nil, &InputError{l.problems}
	}
	return s, nil
}

type loader struct {
	file     string
	lines    lineIndex
	problems []string
}

func (l *loader) addf(line int, context, format string, args ...any) {
	if len(l.problems) >= maxProblems {
		return
	}
	where := l.file
	if line > 0 {
		where = fmt.Sprintf("%s:%d", l.file, line)
	}
	msg := fmt.Sprintf(format, args...)
	if context != "" {
		msg = context + ": " + msg
	}
	l.problems = append(l.problems, where+": "+msg)
	if len(l.problems) == maxProblems {
		l.problems = append(l.problems, fmt.Sprintf("%s: more problems not shown", l.file))
	}
}

// table reads the keys of one TOML table and remembers which were used, so
// that unknown keys can be reported.
type table struct {
	l       *loader
	context string // e.g. `path "drive", element 3 (lens)`
	loc     string // line-index key, e.g. "path[0].element[2]"
	m       map[string]any
	used    map[string]bool
	hint    func() string // added to "unknown key" messages, built only when needed
}

func (l *loader) table(context, loc string, m map[string]any) *table {
	return &table{l: l, context: context, loc: loc, m: m, used: map[string]bool{}}
}

func (t *table) line(key string) int { return t.l.lines.line(t.loc, key) }

func (t *table) fail(key, format string, args ...any) {
	msg := fmt.Sprintf(format, args...)
	if key != "" {
		msg = key + ": " + msg
	}
	t.l.addf(t.line(key), t.context, "%s", msg)
}

func (t *table) get(key string) (any, bool) {
	t.used[key] = true
	v, ok := t.m[key]
	return v, ok
}

func (t *table) has(key string) bool {
	_, ok := t.m[key]
	return ok
}

// done reports keys that no reader asked for.
func (t *table) done() {
	var unknown []string
	for k := range t.m {
		if !t.used[k] {
			unknown = append(unknown, k)
		}
	}
	sort.Strings(unknown)
	hint := ""
	if len(unknown) > 0 && t.hint != nil {
		hint = t.hint()
	}
	for _, k := range unknown {
		t.fail(k, "unknown key%s", hint)
	}
}

func (t *table) str(key string, required bool) string {
	v, ok := t.get(key)
	if !ok {
		if required {
			t.fail(key, "missing (a string is required)")
		}
		return ""
	}
	s, isStr := v.(string)
	if !isStr {
		t.fail(key, "want a string, got %s", tomlKind(v))
		return ""
	}
	if required && strings.TrimSpace(s) == "" {
		t.fail(key, "empty")
	}
	return s
}

func (t *table) enum(key, def string, allowed ...string) string {
	s := t.str(key, false)
	if !t.has(key) {
		return def
	}
	for _, a := range allowed {
		if s == a {
			return s
		}
	}
	if s != "" || t.has(key) {
		t.fail(key, "%q is not one of %s", s, strings.Join(allowed, ", "))
	}
	return def
}

// quantity reads a "number unit" string of the wanted dimension.
func (t *table) quantity(key string, dim Dimension, required bool) (float64, bool) {
	v, ok := t.get(key)
	if !ok {
		if required {
			t.fail(key, "missing (want %s)", dim)
		}
		return 0, false
	}
	return t.quantityValue(key, v, dim)
}

// fieldRange bounds the magnitude of a field's value, SI: wide enough for any
// laboratory, narrow enough that no later computation overflows. A zero
// value is left to the field's own checks.
var fieldRange = map[string][2]float64{
	"power": {0, 1e15}, "operating_power": {0, 1e15}, "rating": {0, 1e15},
	"waist": {1e-9, 10}, "waist_at": {0, 1e5}, "at": {0, 1e5},
	"focal_length": {1e-6, 1e5}, "radius_of_curvature": {1e-6, 1e5}, "thickness": {0, 10},
	"aperture": {1e-9, 100}, "diameter": {1e-9, 100},
	"mode_field_diameter": {1e-7, 1e-3}, "output_waist": {1e-7, 10}, "output_focal_length": {1e-6, 100},
	"frequency": {0, 1e12}, "detuning": {0, 1e16}, "linewidth": {0, 1e12}, "collective_rate": {0, 1e15},
	"saturation_intensity": {0, 1e15}, "mass": {1e-30, 1e-20}, "atoms": {0, 1e15}, "rms_size": {1e-9, 1},
	"m2": {0, 1e4}, "goal_factor": {0, 1e6},
	"repetition_rate":  {0, 1e15},
	"damage_threshold": {0, 1e20}, "damage_pulse_duration": {0, 3e4},
	"from": {0, 1e-3}, "to": {0, 1e-3}, "od": {0, 20},
}

func (t *table) quantityValue(key string, v any, dim Dimension) (float64, bool) {
	q, ok := t.rawQuantity(key, v, dim)
	if !ok {
		return 0, false
	}
	if r, bounded := fieldRange[key]; bounded && q != 0 {
		if a := math.Abs(q); a < r[0] || a > r[1] {
			t.fail(key, "%s is outside what a setup may hold (magnitude %g to %g in SI units)", show(v), r[0], r[1])
			return 0, false
		}
	}
	return q, true
}

func (t *table) rawQuantity(key string, v any, dim Dimension) (float64, bool) {
	switch x := v.(type) {
	case string:
		q, err := ParseAs(x, dim)
		if err != nil {
			t.fail(key, "%v", err)
			return 0, false
		}
		return q, true
	case int64, float64:
		if dim == Dimensionless {
			f := toFloat(x)
			if math.IsNaN(f) || math.IsInf(f, 0) {
				t.fail(key, "%v is not a finite number", f)
				return 0, false
			}
			return f, true
		}
		t.fail(key, "%v has no unit; want %s", x, dim)
		return 0, false
	default:
		t.fail(key, "want %s, got %s", dim, tomlKind(v))
		return 0, false
	}
}

// positive reads a quantity that must be > 0.
func (t *table) positive(key string, dim Dimension, required bool) float64 {
	q, ok := t.quantity(key, dim, required)
	if ok && q <= 0 {
		t.fail(key, "must be positive, got %s", show(t.m[key]))
		return 0
	}
	return q
}

// fraction reads a bare number or percentage in [lo, hi].
func (t *table) fraction(key string, lo, hi float64) *float64 {
	q, ok := t.quantity(key, Dimensionless, false)
	if !ok {
		return nil
	}
	if q < lo || q > hi {
		t.fail(key, "%s is outside [%g, %g]", show(t.m[key]), lo, hi)
		return nil
	}
	return &q
}

// pair reads one quantity (both planes) or an array of two (x, y).
func (t *table) pair(key string, dim Dimension, required bool, min float64) ([2]float64, bool) {
	v, ok := t.get(key)
	if !ok {
		if required {
			t.fail(key, "missing (want %s, or [x, y])", dim)
		}
		return [2]float64{}, false
	}
	var out [2]float64
	var vals []any
	if arr, isArr := v.([]any); isArr {
		if len(arr) != 2 {
			t.fail(key, "want one value or [x, y], got %d values", len(arr))
			return out, false
		}
		vals = arr
	} else {
		vals = []any{v, v}
	}
	for i, e := range vals {
		q, ok := t.quantityValue(key, e, dim)
		if !ok {
			return out, false
		}
		if q < min || (min == 0 && q <= 0) {
			if min == 0 {
				t.fail(key, "must be positive, got %s", show(e))
			} else {
				t.fail(key, "must be at least %g, got %s", min, show(e))
			}
			return out, false
		}
		out[i] = q
	}
	return out, true
}

func toFloat(v any) float64 {
	switch x := v.(type) {
	case int64:
		return float64(x)
	case float64:
		return x
	}
	return math.NaN()
}

func show(v any) string {
	if s, ok := v.(string); ok {
		return fmt.Sprintf("%q", s)
	}
	return fmt.Sprint(v)
}

func tomlKind(v any) string {
	switch v.(type) {
	case string:
		return "a string"
	case int64:
		return "an integer"
	case float64:
		return "a number"
	case bool:
		return "a boolean"
	case []any, []map[string]any:
		return "an array"
	case map[string]any:
		return "a table"
	}
	return fmt.Sprintf("a %T", v)
}

// tables reads an array of tables (e.g. [[laser]]).
func (t *table) tables(key string) []map[string]any {
	v, ok := t.get(key)
	if !ok {
		return nil
	}
	switch x := v.(type) {
	case []map[string]any:
		return x
	case []any:
		out := make([]map[string]any, 0, len(x))
		for _, e := range x {
			m, isMap := e.(map[string]any)
			if !isMap {
				t.fail(key, "want an array of tables, got an array holding %s", tomlKind(e))
				return nil
			}
			out = append(out, m)
		}
		return out
	}
	t.fail(key, "want an array of tables ([[%s]]), got %s", key, tomlKind(v))
	return nil
}

func (t *table) subtable(key string) map[string]any {
	v, ok := t.get(key)
	if !ok {
		return nil
	}
	m, isMap := v.(map[string]any)
	if !isMap {
		t.fail(key, "want a table ([%s]), got %s", key, tomlKind(v))
		return nil
	}
	return m
}
