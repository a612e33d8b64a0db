package setup

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math"
	"os"
	"slices"
	"sort"
	"strconv"
	"strings"
	"time"
	"unicode"
	"unicode/utf8"

	"github.com/pelletier/go-toml/v2"

	"beamledger/budget/units"
	"beamledger/limits"
)

// MaxSetupBytes bounds the size of a setup file the loader reads.
const MaxSetupBytes = 4 << 20

// Load reads and checks a setup file.
func Load(filename string) (*Setup, error) {
	data, err := ReadSetupFile(filename)
	if err != nil {
		return nil, err
	}
	return Parse(filename, data)
}

// ReadSetupFile reads at most MaxSetupBytes+1 bytes of a setup file, so that
// an endless source (a device such as /dev/zero) is refused quickly. Only
// regular files and pipes are read: a directory or a device is an error.
func ReadSetupFile(filename string) ([]byte, error) {
	f, err := os.Open(filename)
	if err != nil {
		return nil, fmt.Errorf("reading setup: %w", err)
	}
	defer f.Close()
	fi, err := f.Stat()
	if err != nil {
		return nil, fmt.Errorf("reading setup: %w", err)
	}
	switch m := fi.Mode(); {
	case m.IsDir():
		return nil, &InputError{[]string{fmt.Sprintf("%s: is a directory, not a setup file", filename)}}
	case !m.IsRegular() && m&fs.ModeNamedPipe == 0:
		return nil, &InputError{[]string{fmt.Sprintf("%s: is not a regular file (%s); a setup is read from a file or a pipe", filename, m.Type())}}
	}
	data, err := io.ReadAll(io.LimitReader(f, MaxSetupBytes+1))
	if err != nil {
		return nil, fmt.Errorf("reading setup: %w", err)
	}
	if len(data) > MaxSetupBytes {
		return nil, &InputError{[]string{fmt.Sprintf("%s: file is more than the %d bytes a setup may have", filename, MaxSetupBytes)}}
	}
	return data, nil
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
		return nil, &InputError{[]string{fmt.Sprintf("%s: file is more than the %d bytes a setup may have", filename, MaxSetupBytes)}}
	}
	src := string(data)
	lines, err := prescan(filename, src)
	if err != nil {
		return nil, err
	}
	var raw map[string]any
	if err := toml.Unmarshal(data, &raw); err != nil {
		var de *toml.DecodeError
		if errors.As(err, &de) {
			row, _ := de.Position()
			return nil, &InputError{[]string{fmt.Sprintf("%s:%d: TOML syntax: %s", filename, row, strings.TrimPrefix(de.Error(), "toml: "))}}
		}
		return nil, &InputError{[]string{fmt.Sprintf("%s: TOML syntax: %v", filename, err)}}
	}
	l := &loader{file: filename, lines: lines}
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
	tols     []*pendingTol
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
		l.problems = append(l.problems, moreProblems(l.file))
	}
}

// moreProblems ends a list of problems cut at maxProblems.
func moreProblems(file string) string { return fmt.Sprintf("%s: more problems not shown", file) }

// table reads the keys of one TOML table and remembers which were used, so
// that unknown keys can be reported.
type table struct {
	l       *loader
	context string // e.g. `path "drive", element 3 (lens)`
	// Describe, when set, names the table in messages instead of context;
	// it is called only when there is something to report.
	describe func() string
	loc      string // line-index key, e.g. "path[0].element[2]"
	m        map[string]any
	// used lists the keys of m that a reader asked for, in usedBuf while
	// they are few (as in most tables).
	used    []string
	usedBuf [8]string
	// keyAs is the key a per-laser table's entries stand for ("": the
	// table's own keys); pairIndex the index of the value of an [x, y]
	// pair being read (−1: a single value).
	keyAs     string
	pairIndex int
	hint      func() string // added to "unknown key" messages, built only when needed
	// spec is the table's entry in the key table (nil: a table whose keys
	// are names, such as a per-laser table); the loader reads no key the
	// spec does not list.
	spec *TableSpec
	// failed lists the keys an error was reported for; typo maps a key of
	// the spec to the unknown key of the table that misspells it (built on
	// first use). Errors that would only follow from those (a misspelled
	// key then "missing", a refused goal then "goal_value given without
	// goal") are not reported: the first error says what to fix.
	failed map[string]bool
	typo   map[string]string
}

// typos maps each key of the spec that an unknown key of the table is
// within a few edits of (and that the table does not give) to that
// unknown key.
func (t *table) typos() map[string]string {
	if t.typo != nil || t.spec == nil {
		return t.typo
	}
	t.typo = map[string]string{}
	known := keyNames(t.spec.Keys)
	for k := range t.m {
		if t.spec.Key(k) != nil {
			continue
		}
		if c, ok := closest(k, known); ok && !t.has(c) {
			t.typo[c] = k
		}
	}
	return t.typo
}

// consequence reports whether an error about key would only follow from
// one already reported: key is missing because it was misspelled, or it is
// "given without" a key whose value was refused.
func (t *table) consequence(key, format string) bool {
	if strings.HasPrefix(format, "missing") {
		_, misspelled := t.typos()[key]
		return misspelled
	}
	if rest, ok := strings.CutPrefix(format, "given without "); ok {
		need := strings.FieldsFunc(rest, func(r rune) bool { return !(r == '_' || r >= 'a' && r <= 'z') })
		return len(need) > 0 && t.failed[need[0]]
	}
	return false
}

// of sets the table's spec.
func (t *table) of(spec *TableSpec) *table {
	t.spec = spec
	return t
}

func (l *loader) table(context, loc string, m map[string]any) *table {
	t := &table{l: l, context: context, loc: loc, m: m, pairIndex: -1}
	t.used = t.usedBuf[:0]
	return t
}

// where names the table in messages.
func (t *table) where() string {
	if t.describe != nil {
		return t.describe()
	}
	return t.context
}

func (t *table) line(key string) int { return t.l.lines.line(t.loc, key) }

func (t *table) fail(key, format string, args ...any) {
	if key != "" && t.consequence(key, format) {
		return
	}
	if t.failed == nil {
		t.failed = map[string]bool{}
	}
	t.failed[key] = true
	msg := fmt.Sprintf(format, args...)
	if key != "" {
		msg = key + ": " + msg
	}
	t.l.addf(t.line(key), t.where(), "%s", msg)
}

func (t *table) get(key string) (any, bool) {
	if t.spec != nil && t.spec.Key(key) == nil {
		panic(fmt.Sprintf("budget: the loader reads key %q of %s, which the key table (keys.go) does not list for %s", key, t.loc, t.spec.Name))
	}
	v, ok := t.m[key]
	if ok && !slices.Contains(t.used, key) {
		t.used = append(t.used, key)
	}
	return v, ok
}

func (t *table) has(key string) bool {
	_, ok := t.m[key]
	return ok
}

// done reports keys that no reader asked for.
func (t *table) done() {
	if len(t.used) == len(t.m) {
		return
	}
	var unknown []string
	for k := range t.m {
		if !slices.Contains(t.used, k) {
			unknown = append(unknown, k)
		}
	}
	sort.Strings(unknown)
	hint := ""
	if len(unknown) > 0 && t.hint != nil {
		hint = t.hint()
	}
	meant := map[string]string{}
	for known, typed := range t.typos() {
		meant[typed] = known
	}
	for _, k := range unknown {
		if c, ok := meant[k]; ok {
			t.fail(k, "unknown key; did you mean %s?", c)
			continue
		}
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
	if strings.TrimSpace(s) == "" {
		// An empty value is never the same as leaving the key out.
		t.fail(key, "empty: give a value, or leave the key out")
		return ""
	}
	if r, bad := unprintable(s); bad {
		t.fail(key, "holds the control or direction character %U; text in a setup is printed in the sign-off and may hold no line breaks, tabs or control characters", r)
		return ""
	}
	if n := utf8.RuneCountInString(s); n > MaxTextLength {
		t.fail(key, "is %d characters long, more than the %d a setup's text may have", n, MaxTextLength)
		return ""
	}
	return s
}

// MaxTextLength bounds a string in a setup (a title, a note), in characters;
// MaxNameLength bounds a name (laser, path, element, cloud, eyewear).
const (
	MaxTextLength = 400
	MaxNameLength = 80
)

// unprintable returns the first character of s that could break or forge a
// line of the printed output: a control character (line breaks and tabs
// included), a Unicode line or paragraph separator, or a direction override.
func unprintable(s string) (rune, bool) {
	for _, r := range s {
		switch {
		case unicode.IsControl(r), r == '\u2028', r == '\u2029',
			r >= '\u202a' && r <= '\u202e', r >= '\u2066' && r <= '\u2069', r == '\u200e', r == '\u200f', r == '\ufeff':
			return r, true
		}
	}
	return 0, false
}

// name reads the name of a laser, path, element, cloud or pair of eyewear:
// printable, at most MaxNameLength characters, without ":" (which joins a
// path and an element name in a port reference such as "drive:pick").
// texts reads a list of texts, each checked as str checks one.
func (t *table) texts(key string) []string {
	v, ok := t.get(key)
	if !ok {
		return nil
	}
	arr, isArr := v.([]any)
	if !isArr || len(arr) == 0 {
		t.fail(key, "want a list of texts, e.g. [\"first\", \"second\"]")
		return nil
	}
	var out []string
	for _, e := range arr {
		s, isStr := e.(string)
		if !isStr {
			t.fail(key, "want texts, got %s", show(e))
			return nil
		}
		if r, bad := unprintable(s); bad {
			t.fail(key, "holds the control or direction character %U; text in a setup is printed in the sign-off and may hold no line breaks, tabs or control characters", r)
			return nil
		}
		if n := utf8.RuneCountInString(s); n > MaxTextLength {
			t.fail(key, "an entry is %d characters long, more than the %d a setup's text may have", n, MaxTextLength)
			return nil
		}
		out = append(out, s)
	}
	return out
}

func (t *table) name(required bool) string {
	s := t.str("name", required)
	switch {
	case strings.Contains(s, ":"):
		t.fail("name", "%q holds \":\", which is reserved for port references (\"<path>:<element>\")", s)
		return ""
	case utf8.RuneCountInString(s) > MaxNameLength:
		t.fail("name", "is %d characters long, more than the %d a name may have", utf8.RuneCountInString(s), MaxNameLength)
		return ""
	case s != strings.TrimSpace(s):
		t.fail("name", "%q starts or ends with a space", s)
		return ""
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
		t.fail(key, "%q is not one of %s%s", s, strings.Join(allowed, ", "), didYouMean(s, allowed))
	}
	return def
}

// quantity reads a "number unit" string of the wanted dimension.
func (t *table) quantity(key string, dim units.Dimension, required bool) (float64, bool) {
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
// laboratory, narrow enough that no later computation overflows or
// underflows. Every duration, rate and size has a physical lower bound above
// zero: a value such as 1e-320 s is refused, never carried into a formula. A
// zero value is left to the field's own checks (where zero means something,
// as for a position or a detuning, it is allowed there).
var fieldRange = map[string][2]float64{
	"power": {1e-15, 1e15}, "operating_power": {1e-15, 1e15}, "rating": {1e-9, 1e15},
	"waist": {1e-7, 10}, "waist_at": {0, 1e5}, "at": {0, 1e5},
	"focal_length": {1e-6, 1e5}, "radius_of_curvature": {1e-6, 1e5}, "thickness": {1e-6, 10},
	"aperture": {1e-6, 100}, "diameter": {1e-6, 100},
	"mode_field_diameter": {1e-7, 1e-3}, "output_waist": {1e-7, 10}, "output_focal_length": {1e-6, 100},
	"frequency": {1e3, 1e11}, "detuning": {0, 1e15}, "linewidth": {1e-3, 1e10}, "collective_rate": {1e-3, 1e15},
	"saturation_intensity": {1e-12, 1e12}, "mass": {1e-30, 1e-20}, "atoms": {1, 1e15}, "rms_size": {1e-7, 1},
	"m2": {0, 1e4}, "goal_factor": {1e-3, 1e3}, "goal_value": {1e-12, 1e12}, "goal_max": {1e-12, 1e12},
	"repetition_rate":  {1e-4, 1e12},
	"damage_threshold": {1e-6, 1e20}, "damage_pulse_duration": {1e-15, limits.MaxDuration},
	"from": {MinWavelength, MaxWavelength}, "to": {MinWavelength, MaxWavelength}, "od": {0, 20},
}

// MinFraction is the smallest non-zero fraction a setup may state (an
// optical density of 20).
const MinFraction = 1e-20

// percentKeys are the fractions, the only bare numbers that may be written
// as a percentage ("82 %"); an optical density, M² or atom number may not.
var percentKeys = map[string]bool{
	"transmission": true, "reflectivity": true, "efficiency": true, "alignment": true,
	"coupling": true, "join_transmission": true, "surface_reflectance": true, "diffuse_reflectance": true, "goal_fraction": true,
}

// linewidthUnits are the ways a detuning may be written in linewidths of
// the driven transition.
var linewidthUnits = []string{"Γ", "Gamma", "gamma"}

// detuning reads a detuning: a frequency ("-12 MHz"), or a number of the
// driven transition's natural linewidths Γ ("-2.5 Γ", "-2.5 Gamma"), which
// the linker converts once it knows the transition (linewidths set, hz 0).
func (t *table) detuning(key string) (hz float64, linewidths *float64, ok bool) {
	v, given := t.get(key)
	if !given {
		return 0, nil, false
	}
	if str, isStr := v.(string); isStr {
		s := strings.TrimSpace(str)
		for _, u := range linewidthUnits {
			if num, found := strings.CutSuffix(s, u); found {
				n, err := strconv.ParseFloat(strings.TrimSpace(num), 64)
				if err != nil || math.IsNaN(n) || math.IsInf(n, 0) || math.Abs(n) > 1e12 {
					t.fail(key, "%q: want a number of linewidths, such as \"-2.5 Γ\"", str)
					return 0, nil, false
				}
				return 0, &n, true
			}
		}
	}
	q, ok := t.quantityValue(key, v, units.Frequency)
	return q, nil, ok
}

func (t *table) quantityValue(key string, v any, dim units.Dimension) (float64, bool) {
	q, ok := t.rawQuantity(key, v, dim)
	if !ok {
		return 0, false
	}
	rk := key
	if t.keyAs != "" {
		rk = t.keyAs
	}
	if r, bounded := fieldRange[rk]; bounded && q != 0 {
		if a := math.Abs(q); a < r[0] || a > r[1] {
			t.fail(key, "%s is outside what a setup may hold (magnitude %g to %g in SI units)", show(v), r[0], r[1])
			return 0, false
		}
	}
	return q, true
}

func (t *table) rawQuantity(key string, v any, dim units.Dimension) (float64, bool) {
	switch x := v.(type) {
	case string:
		if a, b, normal, ok := splitTolerance(x); ok {
			return t.tolerance(key, x, a, b, normal, dim)
		}
		pk := key
		if t.keyAs != "" {
			pk = t.keyAs
		}
		if dim == units.Dimensionless && !percentKeys[pk] {
			// The format says bare numbers here (an atom number, M², an
			// optical density, a direction): a string is only for a
			// tolerance, and a percentage only for a fraction.
			if strings.Contains(x, "%") {
				t.fail(key, "%q: a bare number is wanted here; only fractions (transmission, efficiency, …) may be written as a percentage", x)
			} else {
				t.fail(key, "%q: a bare number is wanted here, without quotes (a string is for a quantity with its unit, or a tolerance)", x)
			}
			return 0, false
		}
		q, err := units.ParseAs(x, dim)
		if err != nil {
			t.fail(key, "%v", err)
			return 0, false
		}
		return q, true
	case int64, float64:
		if dim == units.Dimensionless {
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
func (t *table) positive(key string, dim units.Dimension, required bool) float64 {
	q, ok := t.quantity(key, dim, required)
	if ok && q <= 0 {
		t.fail(key, "must be positive, got %s", show(t.m[key]))
		return 0
	}
	return q
}

// fraction reads a bare number or percentage in [lo, hi].
// direction reads an atoms element's beam direction in the cloud frame:
// axis = "x", "y" or "z" (the default), or direction = [dx, dy, dz] (any
// length but zero; made a unit vector). Not both.
func (t *table) direction() [3]float64 {
	axes := map[string][3]float64{"x": {1, 0, 0}, "y": {0, 1, 0}, "z": {0, 0, 1}}
	if t.has("axis") && t.has("direction") {
		t.get("direction")
		t.fail("direction", "give axis or direction, not both")
	}
	if v, ok := t.get("direction"); ok {
		arr, isArr := v.([]any)
		if !isArr || len(arr) != 3 {
			t.fail("direction", "want [dx, dy, dz], three numbers in the cloud's frame")
			return axes["z"]
		}
		var d [3]float64
		for k, e := range arr {
			q, ok := t.quantityValue("direction", e, units.Dimensionless)
			if !ok {
				return axes["z"]
			}
			d[k] = q
		}
		n := math.Sqrt(d[0]*d[0] + d[1]*d[1] + d[2]*d[2])
		if !(n > 1e-9) || math.IsInf(n, 0) {
			t.fail("direction", "must not be zero")
			return axes["z"]
		}
		return [3]float64{d[0] / n, d[1] / n, d[2] / n}
	}
	return axes[t.enum("axis", "z", AxisValues...)]
}

func (t *table) fraction(key string, lo, hi float64) *float64 {
	q, ok := t.quantity(key, units.Dimensionless, false)
	if !ok {
		return nil
	}
	if q < lo || q > hi {
		t.fail(key, "%s is outside [%g, %g]", show(t.m[key]), lo, hi)
		return nil
	}
	if q != 0 && q < MinFraction {
		t.fail(key, "%s is below %g, no measured value; write 0 for none", show(t.m[key]), MinFraction)
		return nil
	}
	return &q
}

// pair reads one quantity (both planes) or an array of two (x, y).
func (t *table) pair(key string, dim units.Dimension, required bool, min float64) ([2]float64, bool) {
	v, ok := t.get(key)
	if !ok {
		if required {
			t.fail(key, "missing (want %s, or [x, y])", dim)
		}
		return [2]float64{}, false
	}
	var out [2]float64
	var vals []any
	arr, isArr := v.([]any)
	if isArr {
		if len(arr) != 2 {
			t.fail(key, "want one value or [x, y], got %d values", len(arr))
			return out, false
		}
		vals = arr
	} else {
		vals = []any{v} // read once (a tolerance is recorded once), used for both
	}
	for i, e := range vals {
		t.pairIndex = -1
		if isArr {
			t.pairIndex = i
		}
		q, ok := t.quantityValue(key, e, dim)
		t.pairIndex = -1
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
	if !isArr {
		out[1] = out[0]
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
	case time.Time:
		return "a date-time"
	case toml.LocalDateTime:
		return "a local date-time"
	case toml.LocalDate:
		return "a local date"
	case toml.LocalTime:
		return "a local time"
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
