package view

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"unicode/utf8"
)

// WriteJSON writes a record as one JSON document indented by two spaces, as
// encoding/json's indented encoder would (same number and string forms, no
// HTML escaping): members in their order, an absent value as null. It
// refuses a non-finite number, naming its key, rather than write a document
// no reader can take.
func WriteJSON(w io.Writer, r *Record) error {
	jw := &jsonWriter{b: make([]byte, 0, 4096)}
	if err := jw.record(r, 0); err != nil {
		return err
	}
	jw.b = append(jw.b, '\n')
	_, err := w.Write(jw.b)
	return err
}

type jsonWriter struct {
	b []byte
	// path is the place being written ("$", "paths", "[3]", "power_w"), for
	// the message of a refused number.
	path []string
}

func (w *jsonWriter) where() string {
	out := "$"
	for _, p := range w.path {
		if p != "" && p[0] == '[' {
			out += p
		} else {
			out += "." + p
		}
	}
	return out
}

func (w *jsonWriter) newline(depth int) {
	w.b = append(w.b, '\n')
	for i := 0; i < depth; i++ {
		w.b = append(w.b, ' ', ' ')
	}
}

func (w *jsonWriter) record(r *Record, depth int) error {
	n := 0
	for i := range r.Members {
		m := &r.Members[i]
		switch {
		case m.IsField():
			f := &m.Field
			if f.People || (f.OmitEmpty && isEmpty(f)) {
				continue
			}
			w.key(&n, f.d.Key, depth)
			w.path = append(w.path, f.d.Key)
			if err := w.value(f, depth+1); err != nil {
				return err
			}
			w.path = w.path[:len(w.path)-1]
		case m.List != nil:
			w.key(&n, m.List.Key, depth)
			if len(m.List.Records) == 0 {
				w.b = append(w.b, '[', ']')
				continue
			}
			w.b = append(w.b, '[')
			for k := range m.List.Records {
				if k > 0 {
					w.b = append(w.b, ',')
				}
				w.newline(depth + 2)
				w.path = append(w.path, m.List.Key, "["+strconv.Itoa(k)+"]")
				if err := w.record(&m.List.Records[k], depth+2); err != nil {
					return err
				}
				w.path = w.path[:len(w.path)-2]
			}
			w.newline(depth + 1)
			w.b = append(w.b, ']')
		case m.Object != nil:
			if m.Object.Record == nil {
				if m.Object.OmitEmpty {
					continue
				}
				w.key(&n, m.Object.Key, depth)
				w.b = append(w.b, "null"...)
				continue
			}
			w.key(&n, m.Object.Key, depth)
			w.path = append(w.path, m.Object.Key)
			if err := w.record(m.Object.Record, depth+1); err != nil {
				return err
			}
			w.path = w.path[:len(w.path)-1]
		}
	}
	if n == 0 {
		w.b = append(w.b, '{', '}')
		return nil
	}
	w.newline(depth)
	w.b = append(w.b, '}')
	return nil
}

// key opens the next member of an object at depth: the brace or a comma, a
// new line, the key.
func (w *jsonWriter) key(n *int, k string, depth int) {
	if *n == 0 {
		w.b = append(w.b, '{')
	} else {
		w.b = append(w.b, ',')
	}
	*n++
	w.newline(depth + 1)
	w.str(k)
	w.b = append(w.b, ':', ' ')
}

func isEmpty(f *Field) bool {
	switch {
	case f.Absent:
		return true
	case f.Kind == Number:
		return math.IsNaN(f.SI)
	case f.Kind == String:
		return f.Text == ""
	case f.Kind == Bool:
		return !f.Bool
	case f.Kind == Strings:
		return len(f.List()) == 0
	}
	return false
}

func (w *jsonWriter) value(f *Field, depth int) error {
	if f.Absent {
		w.b = append(w.b, "null"...)
		return nil
	}
	switch f.Kind {
	case Number:
		if math.IsNaN(f.SI) {
			w.b = append(w.b, "null"...)
			return nil
		}
		return w.number(f.SI)
	case Int:
		w.b = strconv.AppendInt(w.b, int64(f.SI), 10)
	case String:
		w.str(f.Text)
	case Bool:
		w.b = strconv.AppendBool(w.b, f.Bool)
	case Matrix:
		rows := f.extra.rows
		return w.array(depth, len(rows), func(i int) error {
			return w.array(depth+1, len(rows[i]), func(k int) error { return w.number(rows[i][k]) })
		})
	case Numbers:
		vals := f.extra.rows[0]
		return w.array(depth, len(vals), func(i int) error { return w.number(vals[i]) })
	case Strings:
		list := f.List()
		return w.array(depth, len(list), func(i int) error { w.str(list[i]); return nil })
	}
	return nil
}

// array writes n items, one per line at depth+1 ("[]" when empty).
func (w *jsonWriter) array(depth, n int, item func(i int) error) error {
	if n == 0 {
		w.b = append(w.b, '[', ']')
		return nil
	}
	w.b = append(w.b, '[')
	for i := range n {
		if i > 0 {
			w.b = append(w.b, ',')
		}
		w.newline(depth + 1)
		if err := item(i); err != nil {
			return err
		}
	}
	w.newline(depth)
	w.b = append(w.b, ']')
	return nil
}

// number writes a float as encoding/json does: the shortest form that reads
// back the same value, in exponent form below 1e-6 and from 1e21 up.
func (w *jsonWriter) number(v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Errorf("internal error: %s is %v; a figure of the assessment is not a finite number", w.where(), v)
	}
	format := byte('f')
	if a := math.Abs(v); a != 0 && (a < 1e-6 || a >= 1e21) {
		format = 'e'
	}
	start := len(w.b)
	w.b = strconv.AppendFloat(w.b, v, format, -1, 64)
	if format == 'e' {
		// e-09 → e-9, as encoding/json writes it
		if n := len(w.b); n-start >= 4 && w.b[n-4] == 'e' && w.b[n-3] == '-' && w.b[n-2] == '0' {
			w.b[n-2] = w.b[n-1]
			w.b = w.b[:n-1]
		}
	}
	return nil
}

const hexDigits = "0123456789abcdef"

// str writes a JSON string as encoding/json does without HTML escaping:
// quotes, backslashes and control characters escaped, U+2028 and U+2029
// written as \u escapes, invalid UTF-8 as U+FFFD.
func (w *jsonWriter) str(s string) {
	w.b = append(w.b, '"')
	start := 0
	for i := 0; i < len(s); {
		if c := s[i]; c < utf8.RuneSelf {
			if c >= 0x20 && c != '"' && c != '\\' {
				i++
				continue
			}
			w.b = append(w.b, s[start:i]...)
			switch c {
			case '"', '\\':
				w.b = append(w.b, '\\', c)
			case '\n':
				w.b = append(w.b, '\\', 'n')
			case '\r':
				w.b = append(w.b, '\\', 'r')
			case '\t':
				w.b = append(w.b, '\\', 't')
			case '\b':
				w.b = append(w.b, '\\', 'b')
			case '\f':
				w.b = append(w.b, '\\', 'f')
			default:
				w.b = append(w.b, '\\', 'u', '0', '0', hexDigits[c>>4], hexDigits[c&0xf])
			}
			i++
			start = i
			continue
		}
		r, size := utf8.DecodeRuneInString(s[i:])
		if r == utf8.RuneError && size == 1 {
			w.b = append(w.b, s[start:i]...)
			w.b = append(w.b, `\ufffd`...)
			i += size
			start = i
			continue
		}
		if r == '\u2028' || r == '\u2029' {
			w.b = append(w.b, s[start:i]...)
			w.b = append(w.b, '\\', 'u', '2', '0', '2', hexDigits[r&0xf])
			i += size
			start = i
			continue
		}
		i += size
	}
	w.b = append(w.b, s[start:]...)
	w.b = append(w.b, '"')
}
