package page

import (
	"bytes"
	"strings"
	"testing"

	"golang.org/x/net/html"

	"beamledger/safety/report"
	"beamledger/safety/safetytest"
)

func demoPage(t *testing.T, path string) ([]byte, *report.Document) {
	t.Helper()
	a, data := safetytest.EvaluateFile(t, path)
	doc := report.Build(a, report.Meta{Date: "2026-01-02", ToolVersion: "test", SetupBytes: data})
	var b bytes.Buffer
	if err := Write(&b, doc); err != nil {
		t.Fatal(err)
	}
	return b.Bytes(), doc
}

// walk calls f on every node of the tree.
func walk(n *html.Node, f func(*html.Node)) {
	f(n)
	for c := n.FirstChild; c != nil; c = c.NextSibling {
		walk(c, f)
	}
}

func text(n *html.Node) string {
	var b strings.Builder
	walk(n, func(c *html.Node) {
		if c.Type == html.TextNode {
			b.WriteString(c.Data)
		}
	})
	return b.String()
}

// The page parses as HTML (golang.org/x/net/html, the WHATWG parsing
// algorithm), holds a second-level heading for every section of the
// document in order, real tables with header cells, an SVG with a title
// for every plot and drawing, the setup's SHA-256 and the setup file
// itself; it has no script and fetches nothing. The same document gives
// the same bytes.
func TestPageValidAndComplete(t *testing.T) {
	b, doc := demoPage(t, "../../testdata/examples/table-c.toml")
	root, err := html.Parse(bytes.NewReader(b))
	if err != nil {
		t.Fatal(err)
	}
	var h2 []string
	tables, headerCells, svgs, titledSVGs, plots, drawings := 0, 0, 0, 0, 0, 0
	walk(root, func(n *html.Node) {
		if n.Type != html.ElementNode {
			return
		}
		switch n.Data {
		case "h2":
			h2 = append(h2, text(n))
		case "table":
			tables++
		case "th":
			headerCells++
		case "svg":
			svgs++
			for c := n.FirstChild; c != nil; c = c.NextSibling {
				if c.Type == html.ElementNode && c.Data == "title" && text(c) != "" {
					titledSVGs++
				}
			}
		case "script", "link", "img", "iframe":
			t.Errorf("the page has a <%s>", n.Data)
		}
		for _, a := range n.Attr {
			if a.Key == "src" || a.Key == "href" || strings.HasPrefix(a.Key, "on") {
				t.Errorf("<%s %s=%q>: the page fetches or runs nothing", n.Data, a.Key, a.Val)
			}
		}
	})
	for _, s := range doc.Sections {
		for _, bl := range s.Blocks {
			switch {
			case bl.Plot != nil:
				plots++
			case bl.Drawing != nil:
				drawings++
			}
		}
	}
	k := 0
	for _, h := range h2 {
		if k < len(doc.Sections) && strings.HasSuffix(h, " "+doc.Sections[k].Heading) {
			k++
		}
	}
	if k != len(doc.Sections) {
		t.Errorf("headings %q: found %d of the document's %d sections in order", h2, k, len(doc.Sections))
	}
	if tables == 0 || headerCells == 0 || svgs != plots+drawings || titledSVGs != svgs {
		t.Errorf("%d tables, %d header cells, %d SVGs (%d titled) for %d plots and %d drawings", tables, headerCells, svgs, titledSVGs, plots, drawings)
	}
	page := string(b)
	if !strings.Contains(page, doc.SetupSHA256) || !strings.Contains(page, html.EscapeString(string(doc.Setup))) {
		t.Error("the page does not carry the setup's SHA-256 and the setup file")
	}
	again, _ := demoPage(t, "../../testdata/examples/table-c.toml")
	if !bytes.Equal(b, again) {
		t.Error("two pages of the same document differ")
	}
}

// Hostile text in a setup (markup, a script tag, quotes, ampersands) is
// shown as text: the parsed page holds no element the setup wrote, and the
// title reads as written.
func TestPageEscapesHostileText(t *testing.T) {
	hostile := `<script>alert("x")</script><b onmouseover=y>&amp; "q" '`
	src := []byte(`[setup]
title = '''` + hostile + `'''
site = "<img src=x>"

[[laser]]
name = "a<b>"
wavelength = "780 nm"
power = "1 mW"
waist = "1 mm"

[[path]]
name = "p</table>"
from = "a<b>"

  [[path.element]]
  type = "dump"
  at = "100 mm"
  rating = "1 W"
`)
	a := safetytest.Evaluate(t, "hostile.toml", src)
	doc := report.Build(a, report.Meta{Date: "2026-01-02", ToolVersion: "test", SetupBytes: src})
	var b bytes.Buffer
	if err := Write(&b, doc); err != nil {
		t.Fatal(err)
	}
	root, err := html.Parse(&b)
	if err != nil {
		t.Fatal(err)
	}
	walk(root, func(n *html.Node) {
		if n.Type == html.ElementNode && (n.Data == "script" || n.Data == "b" || n.Data == "img") {
			t.Errorf("the setup's text became a <%s> element", n.Data)
		}
		if n.Type == html.ElementNode && n.Data == "h1" && text(n) != hostile {
			t.Errorf("title reads %q, want %q", text(n), hostile)
		}
	})
}
