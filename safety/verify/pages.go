package verify

import (
	"strconv"
	"unicode/utf16"

	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu/model"
)

// run is one piece of text a page shows: where it starts (PDF points from
// the page's lower left corner) and what it reads.
type run struct {
	x, y float64
	text string
}

// pageRuns reads the text every page of the document shows, page by page,
// each in the order it is drawn. Text is read as a sign-off writes it:
// its fonts take two-byte Unicode (UTF-16) codes; another document's text
// reads as something else, and then does not agree with its attachment.
func pageRuns(ctx *model.Context) ([][]run, error) {
	if err := ctx.EnsurePageCount(); err != nil {
		return nil, err
	}
	pages := make([][]run, 0, ctx.PageCount)
	for i := 1; i <= ctx.PageCount; i++ {
		d, _, _, err := ctx.PageDict(i, false)
		if err != nil {
			return nil, err
		}
		var c []byte
		if d != nil {
			if c, err = ctx.PageContent(d, i); err != nil {
				return nil, err
			}
		}
		pages = append(pages, contentRuns(c))
	}
	return pages, nil
}

// contentRuns reads the text runs of one page's content stream: the
// strings of Tj, TJ, ' and " with the text position that BT, Td, TD, Tm
// and T* give (text leading and matrices' scale are not needed: a sign-off
// positions each line with Td).
func contentRuns(c []byte) []run {
	var out []run
	var ops []token
	var lx, ly, x, y, leading float64
	num := func(i int) float64 {
		if i < 0 || i >= len(ops) || ops[i].kind != tokNumber {
			return 0
		}
		return ops[i].num
	}
	show := func(s string) {
		if s != "" {
			out = append(out, run{x: x, y: y, text: s})
		}
	}
	lex := lexer{b: c}
	for {
		t, ok := lex.next()
		if !ok {
			return out
		}
		if t.kind != tokOperator {
			ops = append(ops, t)
			continue
		}
		n := len(ops)
		switch t.text {
		case "BT":
			lx, ly, x, y = 0, 0, 0, 0
		case "Td", "TD":
			lx, ly = lx+num(n-2), ly+num(n-1)
			x, y = lx, ly
			if t.text == "TD" {
				leading = -num(n - 1)
			}
		case "Tm":
			lx, ly = num(n-2), num(n-1)
			x, y = lx, ly
		case "TL":
			leading = num(n - 1)
		case "T*":
			ly -= leading
			x, y = lx, ly
		case "Tj":
			if n > 0 {
				show(decodeText(ops[n-1]))
			}
		case "'", "\"":
			ly -= leading
			x, y = lx, ly
			if n > 0 {
				show(decodeText(ops[n-1]))
			}
		case "TJ":
			var s string
			for i := n - 1; i >= 0 && ops[i].kind != tokArrayStart; i-- {
				if ops[i].kind == tokString {
					s = decodeText(ops[i]) + s
				}
			}
			show(s)
		}
		ops = ops[:0]
	}
}

// decodeText reads a string operand as UTF-16 (big-endian) codes.
func decodeText(t token) string {
	if t.kind != tokString {
		return ""
	}
	b := t.raw
	u := make([]uint16, 0, len(b)/2)
	for i := 0; i+1 < len(b); i += 2 {
		u = append(u, uint16(b[i])<<8|uint16(b[i+1]))
	}
	return string(utf16.Decode(u))
}

type tokenKind int

const (
	tokNumber tokenKind = iota
	tokString
	tokName
	tokOperator
	tokArrayStart
	tokOther
)

type token struct {
	kind tokenKind
	num  float64
	raw  []byte // a string's bytes
	text string // an operator or name
}

// lexer splits a content stream into its tokens (PDF 32000-1:2008 §7.2,
// §7.3: numbers, literal and hexadecimal strings, names, arrays,
// dictionaries, comments and operators).
type lexer struct {
	b []byte
	i int
}

func isSpace(c byte) bool {
	return c == ' ' || c == '\n' || c == '\r' || c == '\t' || c == '\f' || c == 0
}

func isDelim(c byte) bool {
	switch c {
	case '(', ')', '<', '>', '[', ']', '{', '}', '/', '%':
		return true
	}
	return false
}

func (l *lexer) next() (token, bool) {
	for l.i < len(l.b) {
		c := l.b[l.i]
		switch {
		case isSpace(c):
			l.i++
		case c == '%':
			for l.i < len(l.b) && l.b[l.i] != '\n' && l.b[l.i] != '\r' {
				l.i++
			}
		case c == '(':
			return token{kind: tokString, raw: l.literal()}, true
		case c == '<' && l.i+1 < len(l.b) && l.b[l.i+1] == '<':
			l.i += 2
			return token{kind: tokOther}, true
		case c == '>' && l.i+1 < len(l.b) && l.b[l.i+1] == '>':
			l.i += 2
			return token{kind: tokOther}, true
		case c == '<':
			return token{kind: tokString, raw: l.hex()}, true
		case c == '[':
			l.i++
			return token{kind: tokArrayStart}, true
		case c == ']' || c == '{' || c == '}' || c == ')' || c == '>':
			l.i++
			return token{kind: tokOther}, true
		case c == '/':
			l.i++
			return token{kind: tokName, text: l.word()}, true
		default:
			w := l.word()
			if f, err := strconv.ParseFloat(w, 64); err == nil {
				return token{kind: tokNumber, num: f}, true
			}
			return token{kind: tokOperator, text: w}, true
		}
	}
	return token{}, false
}

func (l *lexer) word() string {
	start := l.i
	for l.i < len(l.b) && !isSpace(l.b[l.i]) && !isDelim(l.b[l.i]) {
		l.i++
	}
	if l.i == start && l.i < len(l.b) { // a lone delimiter
		l.i++
	}
	return string(l.b[start:l.i])
}

// literal reads a literal string from its "(" with its escapes and
// balanced parentheses.
func (l *lexer) literal() []byte {
	var out []byte
	depth := 0
	for l.i++; l.i < len(l.b); l.i++ {
		c := l.b[l.i]
		switch c {
		case '(':
			depth++
		case ')':
			if depth == 0 {
				l.i++
				return out
			}
			depth--
		case '\\':
			l.i++
			if l.i >= len(l.b) {
				return out
			}
			e := l.b[l.i]
			switch e {
			case 'n':
				out = append(out, '\n')
			case 'r':
				out = append(out, '\r')
			case 't':
				out = append(out, '\t')
			case 'b':
				out = append(out, '\b')
			case 'f':
				out = append(out, '\f')
			case '\r':
				if l.i+1 < len(l.b) && l.b[l.i+1] == '\n' {
					l.i++
				}
			case '\n':
			default:
				if e >= '0' && e <= '7' {
					v := 0
					for k := 0; k < 3 && l.i < len(l.b) && l.b[l.i] >= '0' && l.b[l.i] <= '7'; k++ {
						v = v*8 + int(l.b[l.i]-'0')
						l.i++
					}
					l.i--
					out = append(out, byte(v))
				} else {
					out = append(out, e)
				}
			}
			continue
		}
		out = append(out, c)
	}
	return out
}

// hex reads a hexadecimal string from its "<".
func (l *lexer) hex() []byte {
	var out []byte
	var digits []byte
	for l.i++; l.i < len(l.b) && l.b[l.i] != '>'; l.i++ {
		if c := l.b[l.i]; !isSpace(c) {
			digits = append(digits, c)
		}
	}
	l.i++
	if len(digits)%2 == 1 {
		digits = append(digits, '0')
	}
	for k := 0; k+1 < len(digits); k += 2 {
		v, err := strconv.ParseUint(string(digits[k:k+2]), 16, 8)
		if err == nil {
			out = append(out, byte(v))
		}
	}
	return out
}
