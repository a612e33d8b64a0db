package budget

import "fmt"

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
	// suggests. A setup uses a few per table header.
	MaxKeyDots = 100000
)

// prescan rejects a file whose nesting or key depth is beyond the limits. It
// follows TOML's strings and comments well enough to skip brackets inside
// them; anything it cannot follow is left to the decoder. It is linear in
// the size of the file.
func prescan(filename, src string) error {
	type frame struct {
		open  byte // '[' or '{'
		depth int  // depth of the values inside it
	}
	var stack []frame
	line := 1
	lineStart := true
	keyDots := 0      // dots in the key (or header) being read
	inKey := false    // on a key or table header, before "=" or "]"
	header := false   // on a table header
	headerDepth := 0  // depth of the current table: its header's parts
	pendingParts := 0 // parts of the key whose value comes next
	totalDots := 0
	depth := func() int {
		if len(stack) == 0 {
			return headerDepth
		}
		return stack[len(stack)-1].depth
	}
	tooDeep := func() error {
		return &InputError{[]string{fmt.Sprintf("%s:%d: tables and values are nested more than %d deep (counting each part of a dotted key)", filename, line, MaxNesting)}}
	}
	for i := 0; i < len(src); i++ {
		c := src[i]
		switch {
		case c == '\n':
			line++
			lineStart, inKey, header, keyDots = true, false, false, 0
			continue
		case c == ' ' || c == '\t' || c == '\r':
			continue
		case c == '#':
			for i < len(src) && src[i] != '\n' {
				i++
			}
			i--
			continue
		case c == '"' || c == '\'':
			end, err := skipString(src, i)
			if err != nil {
				return nil // let the decoder report it
			}
			for _, ch := range src[i:end] {
				if ch == '\n' {
					line++
				}
			}
			i = end - 1
			lineStart = false
			continue
		}
		if lineStart && len(stack) == 0 {
			inKey, header = true, c == '['
		}
		lineStart = false
		switch c {
		case '[', '{':
			if inKey && header {
				continue
			}
			// An inline table is the table its key names; an array adds a
			// level for its elements.
			d := depth() + pendingParts + 1
			if c == '{' && pendingParts > 0 {
				d--
			}
			if d > MaxNesting {
				return tooDeep()
			}
			stack = append(stack, frame{c, d})
			pendingParts = 0
			inKey, keyDots = c == '{', 0
		case ']', '}':
			if inKey && header {
				headerDepth = keyDots + 1
				if headerDepth > MaxNesting {
					return tooDeep()
				}
				inKey = false
				continue
			}
			if len(stack) > 0 {
				stack = stack[:len(stack)-1]
			}
			inKey = false
		case '=':
			pendingParts = keyDots + 1
			if depth()+pendingParts > MaxNesting {
				return tooDeep()
			}
			inKey = false
			keyDots = 0
		case ',':
			// Inside an inline table a key follows; inside an array a value.
			inKey, keyDots = len(stack) > 0 && stack[len(stack)-1].open == '{', 0
			pendingParts = 0
		case '.':
			if inKey {
				keyDots++
				if totalDots++; totalDots > MaxKeyDots {
					return &InputError{[]string{fmt.Sprintf("%s:%d: the keys and table names of the file hold more than %d dots together", filename, line, MaxKeyDots)}}
				}
				if keyDots >= MaxKeyParts {
					return &InputError{[]string{fmt.Sprintf("%s:%d: a key or table name has more than %d dotted parts", filename, line, MaxKeyParts)}}
				}
			}
		default:
			if !inKey && pendingParts > 0 && len(stack) == 0 {
				// a scalar value of a top-level key: the key's parts are done
				pendingParts = 0
			}
		}
	}
	return nil
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
				for k < len(src) && src[k] == q { // up to two more quotes belong to the content
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
