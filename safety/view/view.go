// Package view builds, once, what the outputs of an assessment show: every
// figure with its JSON key, its label, its SI value and its text for people,
// grouped into the records and lists the outputs share. The text writer, the
// JSON writer and the sign-off document all draw this one model, so a figure
// shown in one is shown in the others, and a field added to a result type
// must be placed here or listed as hidden on purpose (TestFieldCoverage).
//
// Conventions: values are SI (m, W, s, Hz, K, W/m², J/m²); JSON keys carry
// the unit as a suffix; a value that does not exist is null in JSON and left
// out (or written "—") for people. No NaN or infinity reaches an output.
package view

import (
	"math"
	"strconv"
	"strings"

	"beamledger/budget/units"
)

// Kind says what a field holds.
type Kind uint8

// Field kinds.
const (
	Number Kind = iota // a finite SI value, or null when absent
	Int                // a whole number
	String
	Bool
	Strings // a list of strings
	Matrix  // rows of numbers
	Numbers // a list of numbers
)

// Desc describes a field: its JSON key (snake_case with the unit as a
// suffix), its label for people (a column header), and the result field it
// shows ("Type.Field", for the coverage test). Descriptors are shared by all
// the fields of one kind (descs.go), so a field carries one pointer for
// them.
type Desc struct {
	Key, Label, Source string
}

// Field is one figure or word, as every output shows it. It is kept small:
// A record holds many.
type Field struct {
	d *Desc
	// Text is the value written for people, with its unit; for a String it
	// is also the JSON value.
	Text string
	// SI is the value of a Number (NaN: it does not exist, null in JSON) or
	// of an Int.
	SI    float64
	extra *extra
	Kind  Kind
	// style writes Text from SI when Text is empty (so that fields nobody
	// reads are never formatted).
	style style
	// Absent marks a field that does not exist here (null in JSON);
	// OmitEmpty leaves an absent or empty field out of JSON altogether.
	Absent, OmitEmpty bool
	Bool              bool
	// People marks a field for people only (a combined cell such as
	// "lens L1", or a share in percent): JSON leaves it out.
	People bool
}

// Key is the field's JSON key.
func (f *Field) Key() string { return f.d.Key }

// Label names the field for people.
func (f *Field) Label() string { return f.d.Label }

// Source names the result field the field shows.
func (f *Field) Source() string { return f.d.Source }

// style is how a number is written for people, when its text is made only
// when needed.
type style uint8

const (
	styleNone style = iota
	stylePower
	styleLength
	styleIrradiance
	styleNumber
	styleInt
	styleSeconds
	styleNanometres
	styleRatio
)

// Display is the field's text for people.
func (f *Field) Display() string {
	if f.Text != "" || f.style == styleNone {
		return f.Text
	}
	return string(f.appendDisplay(nil))
}

// appendDisplay appends the field's text for people to dst.
func (f *Field) appendDisplay(dst []byte) []byte {
	if f.Text != "" || f.style == styleNone {
		return append(dst, f.Text...)
	}
	if math.IsNaN(f.SI) {
		return append(dst, "—"...)
	}
	switch f.style {
	case stylePower:
		return units.AppendPower(dst, f.SI)
	case styleLength:
		return units.AppendLength(dst, f.SI)
	case styleIrradiance:
		return units.AppendIrradiance(dst, f.SI)
	case styleInt:
		return strconv.AppendInt(dst, int64(f.SI), 10)
	case styleSeconds:
		return units.AppendSI(dst, f.SI, "s")
	case styleNanometres:
		return append(units.AppendNumber(dst, f.SI*1e9), " nm"...)
	case styleRatio:
		if f.SI < 1e-3 {
			return append(dst, "<0.001"...)
		}
		return units.AppendNumber(dst, f.SI)
	default:
		return units.AppendNumber(dst, f.SI)
	}
}

// Numbers whose text is made when it is read: a power, a length, an
// irradiance, or a plain number.
func Pow(d *Desc, si float64) Field   { return lazy(d, si, stylePower) }
func Len(d *Desc, si float64) Field   { return lazy(d, si, styleLength) }
func Irr(d *Desc, si float64) Field   { return lazy(d, si, styleIrradiance) }
func Plain(d *Desc, si float64) Field { return lazy(d, si, styleNumber) }

// Sec is a duration, Nm a wavelength in nm, Ratio a ratio to a limit
// ("<0.001" below a thousandth), all written when read.
func Sec(d *Desc, si float64) Field   { return lazy(d, si, styleSeconds) }
func Nm(d *Desc, si float64) Field    { return lazy(d, si, styleNanometres) }
func Ratio(d *Desc, si float64) Field { return lazy(d, si, styleRatio) }

func lazy(d *Desc, si float64, st style) Field {
	if math.IsNaN(si) || math.IsInf(si, 0) {
		return Field{d: d, Kind: Number, SI: math.NaN(), Text: "—"}
	}
	return Field{d: d, Kind: Number, SI: si, style: st}
}

// extra holds the values of the rarer kinds.
type extra struct {
	list []string
	rows [][]float64
}

// List returns a Strings field's values.
func (f *Field) List() []string {
	if f.extra == nil {
		return nil
	}
	return f.extra.list
}

// StrList is a list-of-strings field; its text joins them.
func StrList(d *Desc, list []string) Field {
	return Field{d: d, Kind: Strings, Text: strings.Join(list, ", "), extra: &extra{list: append([]string{}, list...)}}
}

// NumList is a field of a list of numbers, with its text for people.
func NumList(d *Desc, vals []float64, text string) Field {
	return Field{d: d, Kind: Numbers, Text: text, extra: &extra{rows: [][]float64{append([]float64{}, vals...)}}}
}

// NumRows is a field of rows of numbers.
func NumRows(d *Desc, rows [][]float64, text string) Field {
	return Field{d: d, Kind: Matrix, Text: text, extra: &extra{rows: rows}}
}

// Num is a number field with its text for people; a non-finite value is
// absent (null in JSON) and its text "—".
func Num(d *Desc, si float64, text string) Field {
	if math.IsNaN(si) || math.IsInf(si, 0) {
		return Field{d: d, Kind: Number, SI: math.NaN(), Text: "—"}
	}
	return Field{d: d, Kind: Number, SI: si, Text: text}
}

// Whole is an integer field, written when read.
func Whole(d *Desc, n int) Field { return Field{d: d, Kind: Int, SI: float64(n), style: styleInt} }

// Str is a string field.
func Str(d *Desc, s string) Field { return Field{d: d, Kind: String, Text: s} }

// Flag is a boolean field with its text for people.
func Flag(d *Desc, b bool, text string) Field { return Field{d: d, Kind: Bool, Bool: b, Text: text} }

// Absent is a field that does not exist here: null in JSON (or left out
// with omit), "—" for people.
func Absent(d *Desc, omit bool) Field {
	return Field{d: d, Kind: Number, SI: math.NaN(), Absent: true, OmitEmpty: omit, Text: "—"}
}

// Member is one member of a record: a field, a list of records, or a nested
// record (a JSON object); IsField tells which. The field is held by value,
// so that a record of many fields is one allocation.
type Member struct {
	Field  Field
	List   *List
	Object *Object
}

// IsField reports whether the member is a field.
func (m *Member) IsField() bool { return m.Field.d != nil }

// Object is a named nested record; a nil Record is null in JSON (or left out
// with OmitEmpty).
type Object struct {
	Key       string
	Record    *Record
	OmitEmpty bool
}

// Record is one JSON object, and for people one row of a table or one block
// of lines.
type Record struct {
	Members []Member
	// Lines are sentences for people built from the record's fields (the
	// text and the sign-off print them; JSON has the fields): Lines before
	// the record's lists, After them. Each is a template whose {key} (or
	// {object.key}) is replaced by that field's text.
	Lines, After []string
}

// List is an array of records: a JSON array, and for people a table with
// the columns named (keys of the records' fields) or the records' lines.
type List struct {
	Key     string
	Heading string
	Records []Record
	// Columns are the keys of the fields shown as table columns, in order;
	// none: the records are written as their lines.
	Columns []string
	// Empty is written for people when the list has no record.
	Empty string
	// Left is the number of table columns set flush left (at least 1).
	Left int
	// Lead is a row shown to people before the records (not in JSON), such
	// as a path's start.
	Lead *Record
	// Gap puts a blank line before each record for people.
	Gap bool
	// Indent is the extra indentation of the list for people, in levels of
	// two spaces.
	Indent int
}

// F adds a field to the record.
func (r *Record) F(f Field) *Record {
	r.Members = append(r.Members, Member{Field: f})
	return r
}

// L adds a list to the record.
func (r *Record) L(l *List) *Record {
	r.Members = append(r.Members, Member{List: l})
	return r
}

// O adds a nested record.
func (r *Record) O(key string, rec *Record, omitEmpty bool) *Record {
	r.Members = append(r.Members, Member{Object: &Object{Key: key, Record: rec, OmitEmpty: omitEmpty}})
	return r
}

// Line adds a sentence for people.
func (r *Record) Line(s string) *Record {
	if r.Lines == nil {
		r.Lines = make([]string, 0, 4)
	}
	r.Lines = append(r.Lines, s)
	return r
}

// Field returns the record's field with the key, or nil; "goal.margin_db"
// looks in the nested record "goal".
func (r *Record) Field(key string) *Field {
	if obj, rest, nested := strings.Cut(key, "."); nested {
		for i := range r.Members {
			m := &r.Members[i]
			if m.Object != nil && m.Object.Key == obj && m.Object.Record != nil {
				return m.Object.Record.Field(rest)
			}
		}
		return nil
	}
	for i := range r.Members {
		if m := &r.Members[i]; m.IsField() && m.Field.d.Key == key {
			return &m.Field
		}
	}
	return nil
}

// fieldAt returns the record's field with the key, looking first at member
// i (records of one list share their layout, so a column's member is
// usually at the same place), and the place it was found.
func (r *Record) fieldAt(key string, i int) (*Field, int) {
	if i >= 0 && i < len(r.Members) {
		if m := &r.Members[i]; m.IsField() && m.Field.d.Key == key {
			return &m.Field, i
		}
	}
	for k := range r.Members {
		if m := &r.Members[k]; m.IsField() && m.Field.d.Key == key {
			return &m.Field, k
		}
	}
	return nil, -1
}

// Walk calls f for every field of the record and of the records inside it.
func (r *Record) Walk(f func(*Field)) {
	for i := range r.Members {
		switch m := &r.Members[i]; {
		case m.IsField():
			f(&m.Field)
		case m.List != nil:
			for i := range m.List.Records {
				m.List.Records[i].Walk(f)
			}
		case m.Object != nil && m.Object.Record != nil:
			m.Object.Record.Walk(f)
		}
	}
}
