package view

import (
	"io"
	"strings"
	"unicode/utf8"
)

// Doc is the whole view: the JSON document, and for people its sections,
// which hold the same lists and records.
type Doc struct {
	JSON     *Record
	Sections []Section
}

// Section is a part of the document for people.
type Section struct {
	Heading string
	Blocks  []Block
}

// Block is one part of a section: a sentence, or a list drawn as a table or
// as its records' lines. Indent counts levels of two spaces.
type Block struct {
	Indent int
	// Line is a sentence; Lines of a record are expanded against its fields.
	Line string
	List *List
	// Record is a record whose lines are written (its fields are in JSON).
	Record *Record
	// Bullets are cautions and the like, one per line with a dash.
	Bullets []string
}

// Expand replaces each {key} in a line with the text of the record's field
// of that key. Only the template is read for keys: the fields' texts (which
// may hold a setup's names) are copied as they are.
func (r *Record) Expand(line string) string {
	if !strings.Contains(line, "{") {
		return line
	}
	var b strings.Builder
	for {
		i := strings.IndexByte(line, '{')
		if i < 0 {
			b.WriteString(line)
			return b.String()
		}
		j := strings.IndexByte(line[i:], '}')
		if j < 0 {
			b.WriteString(line)
			return b.String()
		}
		b.WriteString(line[:i])
		key := line[i+1 : i+j]
		if f := r.Field(key); f != nil {
			b.WriteString(f.Display())
		} else {
			b.WriteString("{" + key + "}")
		}
		line = line[i+j+1:]
	}
}

// Keys lists the field keys a line refers to.
func Keys(line string) []string {
	var keys []string
	for {
		i := strings.IndexByte(line, '{')
		if i < 0 {
			return keys
		}
		j := strings.IndexByte(line[i:], '}')
		if j < 0 {
			return keys
		}
		keys = append(keys, line[i+1:i+j])
		line = line[i+j+1:]
	}
}

// WriteText writes the sections for the terminal.
func WriteText(w io.Writer, d *Doc) error {
	ew := &errWriter{w: w}
	for i, s := range d.Sections {
		if i > 0 {
			ew.write("\n")
		}
		if s.Heading != "" {
			ew.line(s.Heading)
		}
		for _, b := range s.Blocks {
			indent := strings.Repeat("  ", b.Indent)
			switch {
			case b.List != nil:
				writeList(ew, b.List, indent)
			case b.Record != nil:
				writePeople(ew, b.Record, indent, false)
			case b.Bullets != nil:
				for _, x := range b.Bullets {
					ew.line(indent, "- ", x)
				}
			default:
				ew.line(indent, b.Line)
			}
		}
	}
	return ew.err
}

func writeList(ew *errWriter, l *List, indent string) {
	indent += strings.Repeat("  ", l.Indent)
	if l.Heading != "" {
		ew.line(indent, l.Heading)
		indent += "  "
	}
	if len(l.Records) == 0 {
		if l.Empty != "" {
			ew.line(indent, l.Empty)
		}
		return
	}
	if len(l.Columns) > 0 {
		t := &table{left: max(1, l.Left), lastLeft: true}
		var head []string
		for _, k := range l.Columns {
			if f := l.Records[0].Field(k); f != nil {
				head = append(head, f.Label())
			} else {
				head = append(head, k)
			}
		}
		t.add(head...)
		at := make([]int, len(l.Columns))
		row := func(r *Record) {
			cells := make([]string, len(l.Columns))
			for c, k := range l.Columns {
				var f *Field
				if f, at[c] = r.fieldAt(k, at[c]); f != nil {
					cells[c] = f.Display()
				}
			}
			t.add(cells...)
		}
		if l.Lead != nil {
			row(l.Lead)
		}
		for i := range l.Records {
			row(&l.Records[i])
		}
		t.write(ew, indent)
	}
	for i := range l.Records {
		if l.Gap {
			ew.write("\n")
		}
		writePeople(ew, &l.Records[i], indent, len(l.Columns) > 0)
	}
}

// writePeople writes a record for people: its lines, its lists, then its
// closing lines. In a table the record's fields are the row; only its lines
// follow.
func writePeople(ew *errWriter, r *Record, indent string, inTable bool) {
	for _, line := range r.Lines {
		ew.line(indent, r.Expand(line))
	}
	if !inTable {
		for i := range r.Members {
			m := &r.Members[i]
			if m.List != nil && (m.List.Heading != "" || len(m.List.Columns) > 0 || hasLines(m.List)) {
				writeList(ew, m.List, indent)
			}
		}
	}
	for _, line := range r.After {
		ew.line(indent, r.Expand(line))
	}
}

func hasLines(l *List) bool {
	for i := range l.Records {
		if len(l.Records[i].Lines) > 0 || len(l.Records[i].After) > 0 {
			return true
		}
	}
	return false
}

type errWriter struct {
	w   io.Writer
	err error
}

// line writes the parts of one line and its line break.
func (e *errWriter) line(parts ...string) {
	for _, p := range parts {
		e.write(p)
	}
	e.write("\n")
}

func (e *errWriter) write(s string) {
	if e.err == nil {
		_, e.err = io.WriteString(e.w, s)
	}
}

// table lays out rows in columns: the first `left` columns flush left, the
// rest flush right except the last when lastLeft is set, separated by two
// spaces.
type table struct {
	left     int
	lastLeft bool
	rows     [][]string
}

func (t *table) add(cells ...string) { t.rows = append(t.rows, cells) }

func (t *table) write(ew *errWriter, indent string) {
	var widths []int
	for _, r := range t.rows {
		for i, c := range r {
			if i >= len(widths) {
				widths = append(widths, 0)
			}
			if n := utf8.RuneCountInString(c); n > widths[i] {
				widths[i] = n
			}
		}
	}
	var b strings.Builder
	for _, r := range t.rows {
		b.WriteString(indent)
		for i, c := range r {
			pad := strings.Repeat(" ", widths[i]-utf8.RuneCountInString(c))
			if i > 0 {
				b.WriteString("  ")
			}
			if i < t.left || (t.lastLeft && i == len(r)-1) {
				b.WriteString(c)
				if i < len(r)-1 {
					b.WriteString(pad)
				}
			} else {
				b.WriteString(pad + c)
			}
		}
		b.WriteString("\n")
	}
	ew.write(b.String())
}
