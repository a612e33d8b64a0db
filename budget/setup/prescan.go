package setup

import (
	"fmt"
	"strconv"
	"strings"
)

// Limits on the shape of a setup file, checked before the TOML decoder runs:
// the decoder slows down badly on deeply nested values, and no real setup
// comes near these. The depth of a value counts every table it sits in: the
// parts of its table header, the parts of each dotted key on the way, and
// each array or inline table around it ([[path.element]] with
// transmission = { a = 0.9 } is 3 deep).
const (
	MaxNesting  = 32 // tables, arrays and dotted-key parts inside one another
	MaxKeyParts = 16 // parts of one dotted key or table header
	// MaxKeyDots bounds the dots of all dotted keys and table headers of a
	// file together: each dot opens a table in the decoder, and a file full
	// of long dotted keys costs it far more time and memory than its size
	// suggests. A setup uses one per [[path.element]] header.
	MaxKeyDots = 100000
)

// lineIndex maps keys of a TOML document to the lines they stand on, so that
// errors found after decoding can name a line. Keys are written as
// "path[0].element[2].focal_length"; a table (a header, or an inline table
// in an array such as element = [{ … }]) is indexed under its own key.
type lineIndex map[string]int

// line returns the line of a key, else of its table, else 0.
func (idx lineIndex) line(table, key string) int {
	if key != "" {
		full := key
		if table != "" {
			full = table + "." + key
		}
		if n, ok := idx[full]; ok {
			return n
		}
	}
	return idx[table]
}

// prescan reads the layout of a setup file in one linear pass, before the
// decoder: it refuses a file whose nesting or keys are beyond the limits, and
// indexes the line of every key and table. It follows TOML 1.1 (the
// decoder's version): strings of all four kinds, comments, arrays, inline
// tables over several lines, dotted and quoted keys. Where the file is not
// TOML it stops indexing and leaves the error to the decoder, which names
// the line itself.
func prescan(filename, src string) (lineIndex, error) {
	s := &scanner{src: src, file: filename, line: 1, idx: make(lineIndex, strings.Count(src, "\n")+1), counts: map[string]int{}}
	s.document()
	if s.err != nil {
		return nil, s.err
	}
	return s.idx, nil
}

type scanner struct {
	// parts is the scratch space of key (read before the next key)
	parts     []string
	src, file string
	i, line   int
	idx       lineIndex
	counts    map[string]int // array-of-tables key (with parents' indices) -> entries so far
	dots      int            // dots of all keys so far
	err       error          // a limit passed
	stop      bool           // not TOML here: leave the rest to the decoder
}

func (s *scanner) limit(format string, args ...any) {
	if s.err == nil {
		s.err = &InputError{[]string{fmt.Sprintf("%s:%d: ", s.file, s.line) + fmt.Sprintf(format, args...)}}
	}
	s.stop = true
}

func (s *scanner) tooDeep() {
	s.limit("tables and values are nested more than %d deep (counting each part of a dotted key)", MaxNesting)
}

func (s *scanner) peek() byte {
	if s.i < len(s.src) {
		return s.src[s.i]
	}
	return 0
}

// blank skips spaces and tabs, and with newlines also line breaks and
// comments.
func (s *scanner) blank(newlines bool) {
	for s.i < len(s.src) {
		switch c := s.src[s.i]; {
		case c == ' ' || c == '\t' || c == '\r':
			s.i++
		case c == '#':
			for s.i < len(s.src) && s.src[s.i] != '\n' {
				s.i++
			}
		case c == '\n' && newlines:
			s.line++
			s.i++
		default:
			return
		}
	}
}

func (s *scanner) document() {
	current := "" // key of the current table
	depth := 0    // its depth: the parts of its header
	for !s.stop {
		s.blank(true)
		if s.i >= len(s.src) {
			return
		}
		line := s.line
		if s.peek() == '[' {
			array := strings.HasPrefix(s.src[s.i:], "[[")
			if array {
				s.i += 2
			} else {
				s.i++
			}
			s.blank(false)
			parts := s.key()
			if s.stop {
				return
			}
			s.blank(false)
			closing := "]"
			if array {
				closing = "]]"
			}
			if !strings.HasPrefix(s.src[s.i:], closing) {
				s.stop = true
				return
			}
			s.i += len(closing)
			if depth = len(parts); depth > MaxNesting {
				s.tooDeep()
				return
			}
			current = s.tableKey(parts, array)
			if _, seen := s.idx[current]; !seen {
				s.idx[current] = line
			}
			continue
		}
		s.keyValue(current, depth)
	}
}

// tableKey turns a header's parts into an index key: "path.element" becomes
// "path[3].element[5]", using the latest entry of each parent array; an
// array header also counts its new entry.
func (s *scanner) tableKey(parts []string, array bool) string {
	prefix := ""
	for i, p := range parts {
		if prefix != "" {
			prefix += "."
		}
		prefix += p
		if i < len(parts)-1 {
			if c := s.counts[prefix]; c > 0 {
				prefix = prefix + "[" + strconv.Itoa(c-1) + "]"
			}
		}
	}
	if array {
		n := s.counts[prefix]
		s.counts[prefix] = n + 1
		prefix = prefix + "[" + strconv.Itoa(n) + "]"
	}
	return prefix
}

// keyValue reads `key = value` in the table `table` of depth `depth`.
func (s *scanner) keyValue(table string, depth int) {
	line := s.line
	parts := s.key()
	if s.stop {
		return
	}
	s.blank(false)
	if s.peek() != '=' {
		s.stop = true
		return
	}
	s.i++
	var full string
	switch {
	case len(parts) == 1 && table == "":
		full = parts[0]
	case len(parts) == 1:
		full = table + "." + parts[0]
	default:
		full = strings.Join(parts, ".")
		if table != "" {
			full = table + "." + full
		}
	}
	if _, seen := s.idx[full]; !seen {
		s.idx[full] = line
	}
	d := depth + len(parts)
	if d > MaxNesting {
		s.tooDeep()
		return
	}
	s.blank(false)
	s.value(full, d)
}

// key reads a dotted key: bare or quoted parts joined by dots.
func (s *scanner) key() []string {
	parts := s.parts[:0]
	defer func() { s.parts = parts[:0] }()
	for {
		s.blank(false)
		c := s.peek()
		switch {
		case c == '"' || c == '\'':
			start := s.i
			end, err := skipString(s.src, s.i)
			if err != nil || strings.HasPrefix(s.src[start:], `"""`) || strings.HasPrefix(s.src[start:], `'''`) {
				s.stop = true
				return nil
			}
			s.i = end
			raw := s.src[start:end]
			if c == '"' {
				if u, err := strconv.Unquote(raw); err == nil {
					raw = u
				} else {
					raw = raw[1 : len(raw)-1]
				}
			} else {
				raw = raw[1 : len(raw)-1]
			}
			parts = append(parts, raw)
		case isBareKeyByte(c):
			start := s.i
			for s.i < len(s.src) && isBareKeyByte(s.src[s.i]) {
				s.i++
			}
			parts = append(parts, s.src[start:s.i])
		default:
			s.stop = true
			return nil
		}
		s.blank(false)
		if s.peek() != '.' {
			return parts
		}
		s.i++
		if len(parts) >= MaxKeyParts {
			s.limit("a key or table name has more than %d dotted parts", MaxKeyParts)
			return nil
		}
		if s.dots++; s.dots > MaxKeyDots {
			s.limit("the keys and table names of the file hold more than %d dots together", MaxKeyDots)
			return nil
		}
	}
}

func isBareKeyByte(c byte) bool {
	return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9' || c == '_' || c == '-'
}

// value reads one value whose key is loc, at depth d (the depth of the
// table that holds it plus its key's parts).
func (s *scanner) value(loc string, d int) {
	switch c := s.peek(); c {
	case '"', '\'':
		end, err := skipString(s.src, s.i)
		if err != nil {
			s.stop = true
			return
		}
		s.line += strings.Count(s.src[s.i:end], "\n")
		s.i = end
	case '[':
		// An array adds a level for its elements.
		if d+1 > MaxNesting {
			s.tooDeep()
			return
		}
		s.i++
		for n := 0; !s.stop; n++ {
			s.blank(true)
			if s.peek() == ']' {
				s.i++
				return
			}
			elem := loc + "[" + strconv.Itoa(n) + "]"
			if s.peek() == '{' {
				s.idx[elem] = s.line
			}
			s.value(elem, d+1)
			s.blank(true)
			switch s.peek() {
			case ',':
				s.i++
			case ']':
				s.i++
				return
			default:
				s.stop = true
			}
		}
	case '{':
		// An inline table is the table its key names: its keys add their
		// own parts.
		s.i++
		for !s.stop {
			s.blank(true)
			if s.peek() == '}' {
				s.i++
				return
			}
			s.keyValue(loc, d)
			s.blank(true)
			switch s.peek() {
			case ',':
				s.i++
			case '}':
				s.i++
				return
			default:
				s.stop = true
			}
		}
	default:
		// A number, boolean or date: up to the next delimiter.
		start := s.i
		for s.i < len(s.src) && !strings.ContainsRune(",]}\n#", rune(s.src[s.i])) {
			s.i++
		}
		if s.i == start {
			s.stop = true
		}
	}
}

// skipString returns the index just past the string starting at src[i].
func skipString(src string, i int) (int, error) {
	q := src[i]
	if i+2 < len(src) && src[i+1] == q && src[i+2] == q { // multi-line
		for j := i + 3; j+2 < len(src); j++ {
			if q == '"' && src[j] == '\\' {
				j++
				continue
			}
			if src[j] == q && src[j+1] == q && src[j+2] == q {
				k := j + 3
				for k < len(src) && src[k] == q && k < j+5 { // up to two more quotes belong to the content
					k++
				}
				return k, nil
			}
		}
		return 0, fmt.Errorf("unterminated")
	}
	for j := i + 1; j < len(src); j++ {
		switch {
		case q == '"' && src[j] == '\\':
			j++
		case src[j] == q:
			return j + 1, nil
		case src[j] == '\n':
			return 0, fmt.Errorf("unterminated")
		}
	}
	return 0, fmt.Errorf("unterminated")
}
