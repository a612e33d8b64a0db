package view

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"math"
)

// WriteJSON writes a record as one indented JSON document: members in their
// order, numbers as Go's encoding/json writes them, an absent value as null.
// It refuses a non-finite number, naming its key, rather than write a
// document no reader can take.
func WriteJSON(w io.Writer, r *Record) error {
	var b bytes.Buffer
	if err := writeRecord(&b, r, "$"); err != nil {
		return err
	}
	var out bytes.Buffer
	if err := json.Indent(&out, b.Bytes(), "", "  "); err != nil {
		return err
	}
	out.WriteByte('\n')
	_, err := w.Write(out.Bytes())
	return err
}

func writeRecord(b *bytes.Buffer, r *Record, at string) error {
	b.WriteByte('{')
	first := true
	key := func(k string) {
		if !first {
			b.WriteByte(',')
		}
		first = false
		writeString(b, k)
		b.WriteByte(':')
	}
	for i := range r.Members {
		switch m := &r.Members[i]; {
		case m.IsField:
			f := &m.Field
			if f.People || (f.OmitEmpty && isEmpty(f)) {
				continue
			}
			key(f.Key)
			if err := writeValue(b, f, at+"."+f.Key); err != nil {
				return err
			}
		case m.List != nil:
			key(m.List.Key)
			b.WriteByte('[')
			for i := range m.List.Records {
				if i > 0 {
					b.WriteByte(',')
				}
				if err := writeRecord(b, &m.List.Records[i], fmt.Sprintf("%s.%s[%d]", at, m.List.Key, i)); err != nil {
					return err
				}
			}
			b.WriteByte(']')
		case m.Object != nil:
			if m.Object.Record == nil {
				if m.Object.OmitEmpty {
					continue
				}
				key(m.Object.Key)
				b.WriteString("null")
				continue
			}
			key(m.Object.Key)
			if err := writeRecord(b, m.Object.Record, at+"."+m.Object.Key); err != nil {
				return err
			}
		}
	}
	b.WriteByte('}')
	return nil
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

func writeValue(b *bytes.Buffer, f *Field, at string) error {
	if f.Absent {
		b.WriteString("null")
		return nil
	}
	switch f.Kind {
	case Number:
		if math.IsNaN(f.SI) {
			b.WriteString("null")
			return nil
		}
		if math.IsInf(f.SI, 0) {
			return fmt.Errorf("internal error: %s is %v; a figure of the assessment is not a finite number", at, f.SI)
		}
		v, err := json.Marshal(f.SI)
		if err != nil {
			return err
		}
		b.Write(v)
	case Int:
		fmt.Fprintf(b, "%d", int64(f.SI))
	case String:
		writeString(b, f.Text)
	case Bool:
		if f.Bool {
			b.WriteString("true")
		} else {
			b.WriteString("false")
		}
	case Matrix:
		b.WriteByte('[')
		for i, row := range f.extra.rows {
			if i > 0 {
				b.WriteByte(',')
			}
			b.WriteByte('[')
			for k, v := range row {
				if k > 0 {
					b.WriteByte(',')
				}
				if math.IsNaN(v) || math.IsInf(v, 0) {
					return fmt.Errorf("internal error: %s holds %v; a figure of the assessment is not a finite number", at, v)
				}
				x, _ := json.Marshal(v)
				b.Write(x)
			}
			b.WriteByte(']')
		}
		b.WriteByte(']')
	case Strings:
		b.WriteByte('[')
		for i, s := range f.List() {
			if i > 0 {
				b.WriteByte(',')
			}
			writeString(b, s)
		}
		b.WriteByte(']')
	}
	return nil
}

// writeString writes a JSON string without HTML escaping.
func writeString(b *bytes.Buffer, s string) {
	var tmp bytes.Buffer
	enc := json.NewEncoder(&tmp)
	enc.SetEscapeHTML(false)
	enc.Encode(s) // a string always encodes
	b.Write(bytes.TrimRight(tmp.Bytes(), "\n"))
}
