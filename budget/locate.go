package budget

import (
	"fmt"
	"strings"
)

// lineIndex maps keys of a TOML document to the lines they stand on, so that
// errors found after decoding can name a line. Keys are written as
// "path[0].element[2].focal_length"; a table header is the key of its table.
// It reads the simple layout of setup files (headers and key = value lines);
// where it cannot place a key, errors go without a line.
type lineIndex map[string]int

func indexLines(src string) lineIndex {
	idx := lineIndex{}
	counts := map[string]int{} // array-of-tables name (with parents' indices) -> entries so far
	current := ""              // locator prefix of the current table
	inMultiline := ""
	for n, raw := range strings.Split(src, "\n") {
		line := strings.TrimSpace(raw)
		if inMultiline != "" {
			if strings.Count(line, inMultiline)%2 == 1 {
				inMultiline = ""
			}
			continue
		}
		if line == "" || line[0] == '#' {
			continue
		}
		switch {
		case strings.HasPrefix(line, "[["):
			end := strings.Index(line, "]]")
			if end < 0 {
				continue
			}
			name := strings.TrimSpace(line[2:end])
			prefix := arrayPrefix(name, counts)
			i := counts[prefix]
			counts[prefix] = i + 1
			current = fmt.Sprintf("%s[%d]", prefix, i)
			idx[current] = n + 1
		case line[0] == '[':
			end := strings.Index(line, "]")
			if end < 0 {
				continue
			}
			current = strings.TrimSpace(line[1:end])
			idx[current] = n + 1
		default:
			eq := strings.Index(line, "=")
			if eq <= 0 {
				continue
			}
			key := strings.Trim(strings.TrimSpace(line[:eq]), `"'`)
			full := key
			if current != "" {
				full = current + "." + key
			}
			if _, seen := idx[full]; !seen {
				idx[full] = n + 1
			}
			rest := line[eq+1:]
			for _, q := range []string{`"""`, `'''`} {
				if strings.Count(rest, q)%2 == 1 {
					inMultiline = q
				}
			}
		}
	}
	return idx
}

// arrayPrefix turns "path.element" into "path[3].element", using the index of
// the latest entry of each parent array.
func arrayPrefix(name string, counts map[string]int) string {
	parts := strings.Split(name, ".")
	prefix := ""
	for i, p := range parts {
		p = strings.Trim(strings.TrimSpace(p), `"'`)
		if prefix != "" {
			prefix += "."
		}
		prefix += p
		if i < len(parts)-1 {
			if c := counts[prefix]; c > 0 {
				prefix = fmt.Sprintf("%s[%d]", prefix, c-1)
			}
		}
	}
	return prefix
}

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
