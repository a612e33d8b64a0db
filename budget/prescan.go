package budget

import "fmt"

// Limits on the shape of a setup file, checked before the TOML decoder runs:
// the decoder slows down badly on deeply nested values, and no real setup
// comes near these.
const (
	MaxNesting  = 32 // arrays and inline tables inside one another
	MaxKeyParts = 16 // parts of a dotted key or table header
)

// prescan rejects a file whose nesting or key depth is beyond the limits. It
// follows TOML's strings and comments well enough to skip brackets inside
// them; anything it cannot follow is left to the decoder.
func prescan(filename, src string) error {
	var stack []byte // open '[' and '{' of values
	line := 1
	lineStart := true
	keyDots := 0
	inKey := false // on a key or table header, before "=" or "]"
	header := false
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
			stack = append(stack, c)
			if len(stack) > MaxNesting {
				return &InputError{[]string{fmt.Sprintf("%s:%d: values are nested more than %d deep", filename, line, MaxNesting)}}
			}
			inKey, keyDots = c == '{', 0
		case ']', '}':
			if inKey && header {
				inKey = false
				continue
			}
			if len(stack) > 0 {
				stack = stack[:len(stack)-1]
			}
			inKey = false
		case '=':
			inKey = false
			keyDots = 0
		case ',':
			// Inside an inline table a key follows; inside an array a value.
			inKey, keyDots = len(stack) > 0 && stack[len(stack)-1] == '{', 0
		case '.':
			if inKey {
				keyDots++
				if keyDots >= MaxKeyParts {
					return &InputError{[]string{fmt.Sprintf("%s:%d: a key or table name has more than %d dotted parts", filename, line, MaxKeyParts)}}
				}
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
