package pdf

import (
	"reflect"
	"strings"
	"sync"

	"golang.org/x/image/font/gofont/goregular"
	"golang.org/x/image/font/sfnt"

	"beamledger/safety/report"
)

// Missing is printed in place of a character the embedded font cannot draw
// (an emoji, a script the Go fonts do not cover).
const Missing = "?"

var (
	regularOnce sync.Once
	regular     *sfnt.Font
)

// drawable reports whether the embedded Go font has a glyph for r.
func drawable(r rune) bool {
	regularOnce.Do(func() {
		var err error
		if regular, err = sfnt.Parse(goregular.TTF); err != nil {
			panic("pdf: the embedded Go font does not parse: " + err.Error())
		}
	})
	if r == ' ' {
		return true
	}
	var buf sfnt.Buffer
	g, err := regular.GlyphIndex(&buf, r)
	return err == nil && g != 0
}

// glyphCache remembers which characters the font draws, for one document.
type glyphCache map[rune]bool

func (c glyphCache) drawable(r rune) bool {
	if r < 0x80 && r >= 0x20 {
		return true // the Go fonts draw printable ASCII
	}
	ok, known := c[r]
	if !known {
		ok = drawable(r)
		c[r] = ok
	}
	return ok
}

// drawableText returns s with every character the font cannot draw replaced
// by Missing, and how many were replaced. A leading report.Nested marker is
// layout, not text: it is kept.
func (c glyphCache) drawableText(s string) (string, int) {
	if rest, nested := strings.CutPrefix(s, report.Nested); nested {
		t, n := c.drawableText(rest)
		return report.Nested + t, n
	}
	n := 0
	for _, r := range s {
		if !c.drawable(r) {
			n++
		}
	}
	if n == 0 {
		return s, 0
	}
	var b strings.Builder
	for _, r := range s {
		if c.drawable(r) {
			b.WriteRune(r)
		} else {
			b.WriteString(Missing)
		}
	}
	return b.String(), n
}

// drawableCopy returns a deep copy of the document whose strings the font
// can draw, and how many characters were replaced. The caller's document is
// left as it was.
func drawableCopy(doc *report.Document) (*report.Document, int) {
	replaced := 0
	cache := glyphCache{}
	out := copyStrings(reflect.ValueOf(doc), func(s string) string {
		t, n := cache.drawableText(s)
		replaced += n
		return t
	})
	return out.Interface().(*report.Document), replaced
}

// copyStrings deep-copies v, passing every string through f.
func copyStrings(v reflect.Value, f func(string) string) reflect.Value {
	switch v.Kind() {
	case reflect.String:
		return reflect.ValueOf(f(v.String())).Convert(v.Type())
	case reflect.Pointer:
		if v.IsNil() {
			return v
		}
		p := reflect.New(v.Type().Elem())
		p.Elem().Set(copyStrings(v.Elem(), f))
		return p
	case reflect.Struct:
		c := reflect.New(v.Type()).Elem()
		for i := 0; i < v.NumField(); i++ {
			c.Field(i).Set(copyStrings(v.Field(i), f))
		}
		return c
	case reflect.Slice:
		if v.IsNil() {
			return v
		}
		c := reflect.MakeSlice(v.Type(), v.Len(), v.Len())
		for i := 0; i < v.Len(); i++ {
			c.Index(i).Set(copyStrings(v.Index(i), f))
		}
		return c
	default:
		return v
	}
}

// Drawable is s as the pages print it: every character the embedded font
// cannot draw replaced by Missing (verify compares the pages with the
// attachments through it).
func Drawable(s string) string {
	t, _ := glyphCache{}.drawableText(s)
	return t
}
