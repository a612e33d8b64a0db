package view

import (
	"io"
	"strings"
	"sync"
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
	return string(r.appendExpanded(nil, line))
}

// appendExpanded appends the line, expanded as by Expand, to b.
func (r *Record) appendExpanded(b []byte, line string) []byte {
	for {
		i := strings.IndexByte(line, '{')
		if i < 0 {
			return append(b, line...)
		}
		j := strings.IndexByte(line[i:], '}')
		if j < 0 {
			return append(b, line...)
		}
		b = append(b, line[:i]...)
		key := line[i+1 : i+j]
		if f := r.Field(key); f != nil {
			b = f.appendDisplay(b)
		} else {
			b = append(b, '{')
			b = append(b, key...)
			b = append(b, '}')
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
	ew := textBuffers.Get().(*errWriter)
	ew.w, ew.err = w, nil
	defer func() {
		ew.w = nil
		textBuffers.Put(ew)
	}()
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
	ew.flush()
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
		// the cells go into the writer's scratch space, handed back after
		t := &table{left: max(1, l.Left), lastLeft: true, cols: len(l.Columns),
			text: ew.cells[:0], ends: ew.ends[:0]}
		for _, k := range l.Columns {
			if f := l.Records[0].Field(k); f != nil {
				t.cell(f.Label())
			} else {
				t.cell(k)
			}
		}
		at := make([]int, len(l.Columns))
		row := func(r *Record) {
			for c, k := range l.Columns {
				f, j := r.fieldAt(k, at[c])
				if j >= 0 { // a record without the field keeps the hint
					at[c] = j
				}
				t.field(f)
			}
		}
		if l.Lead != nil {
			row(l.Lead)
		}
		for i := range l.Records {
			row(&l.Records[i])
		}
		t.write(ew, indent)
		ew.cells, ew.ends = t.text, t.ends
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
		ew.expanded(indent, r, line)
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
		ew.expanded(indent, r, line)
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

// errWriter gathers the text in a buffer, writes it in large pieces and
// keeps the first write error.
type errWriter struct {
	w   io.Writer
	buf []byte
	err error
	// cells and ends are a table's scratch space (see table).
	cells []byte
	ends  []int
}

// textBuffers keeps writers' buffers from one text to the next.
var textBuffers = sync.Pool{New: func() any {
	return &errWriter{buf: make([]byte, 0, 16<<10)}
}}

// line writes the parts of one line and its line break.
func (e *errWriter) line(parts ...string) {
	for _, p := range parts {
		e.buf = append(e.buf, p...)
	}
	e.end()
}

// expanded writes a record's line, expanded against its fields.
func (e *errWriter) expanded(indent string, r *Record, line string) {
	e.buf = append(e.buf, indent...)
	e.buf = r.appendExpanded(e.buf, line)
	e.end()
}

func (e *errWriter) write(s string) {
	e.buf = append(e.buf, s...)
}

// end ends a line, and passes the buffer on when it is large.
func (e *errWriter) end() {
	e.buf = append(e.buf, '\n')
	if len(e.buf) >= 8<<10 {
		e.flush()
	}
}

func (e *errWriter) flush() {
	if e.err == nil && len(e.buf) > 0 {
		_, e.err = e.w.Write(e.buf)
	}
	e.buf = e.buf[:0]
}

// spaces pads table cells.
const spaces = "                                                                "

// pad appends n spaces.
func (e *errWriter) pad(n int) {
	for n > len(spaces) {
		e.buf = append(e.buf, spaces...)
		n -= len(spaces)
	}
	e.buf = append(e.buf, spaces[:n]...)
}

// table lays out rows in columns: the first `left` columns flush left, the
// rest flush right except the last when lastLeft is set, separated by two
// spaces. The cells' texts are kept in one buffer.
type table struct {
	left     int
	lastLeft bool
	cols     int
	text     []byte
	ends     []int // end of each cell in text, row by row
}

// cell adds a cell with the text.
func (t *table) cell(s string) {
	t.text = append(t.text, s...)
	t.ends = append(t.ends, len(t.text))
}

// field adds a cell with the field's text (empty for no field).
func (t *table) field(f *Field) {
	if f != nil {
		t.text = f.appendDisplay(t.text)
	}
	t.ends = append(t.ends, len(t.text))
}

func (t *table) write(ew *errWriter, indent string) {
	widths := make([]int, t.cols)
	runes := make([]int, len(t.ends))
	start := 0
	for k, end := range t.ends {
		runes[k] = utf8.RuneCount(t.text[start:end])
		widths[k%t.cols] = max(widths[k%t.cols], runes[k])
		start = end
	}
	start = 0
	for k, end := range t.ends {
		i := k % t.cols
		if i == 0 {
			ew.write(indent)
		} else {
			ew.write("  ")
		}
		c := t.text[start:end]
		start = end
		pad := widths[i] - runes[k]
		if i < t.left || (t.lastLeft && i == t.cols-1) {
			ew.buf = append(ew.buf, c...)
			if i < t.cols-1 {
				ew.pad(pad)
			}
		} else {
			ew.pad(pad)
			ew.buf = append(ew.buf, c...)
		}
		if i == t.cols-1 {
			ew.end()
		}
	}
}
