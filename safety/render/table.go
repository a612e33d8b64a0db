// Package render writes an assessment for people (plain text) and for
// programs (JSON). Numbers come from packages budget and safety; this package
// only chooses units and layout.
package render

import (
	"io"
	"strings"
	"unicode/utf8"
)

// table lays out rows in columns: the first `left` columns flush left, the
// rest flush right except the last when lastLeft is set, separated by two
// spaces.
type table struct {
	left     int
	lastLeft bool
	rows     [][]string
}

func (t *table) add(cells ...string) { t.rows = append(t.rows, cells) }

func (t *table) write(w io.Writer, indent string) {
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
			pad := spaces(widths[i] - utf8.RuneCountInString(c))
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
	io.WriteString(w, b.String())
}

const blanks = "                                                                                "

// spaces returns n spaces without allocating for the usual widths.
func spaces(n int) string {
	if n <= len(blanks) {
		return blanks[:n]
	}
	return strings.Repeat(" ", n)
}
