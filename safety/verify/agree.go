package verify

import (
	"fmt"
	"regexp"
	"strings"
	"unicode"

	"beamledger/budget/setup"
	"beamledger/safety/pdf"
	"beamledger/safety/report"
)

// mmToPoints converts the layout's millimetres to PDF points.
const mmToPoints = 72 / 25.4

// pagesAgree compares what the pages state with the attachments: every
// footer's title, revision and setup hash and the cover's hash against the
// attached setup (title and revision as report prints them, the hash of
// its bytes), and the hazard record against the attached list. It returns
// each disagreement, for people.
func pagesAgree(pages [][]run, s *setup.Setup, sha string, hazards []string) []string {
	var out []string
	title, revision := report.Heading(s)
	footer := pdf.Drawable(pdf.FooterText(title, revision, sha))
	band := pdf.FooterBand * mmToPoints
	var body []run
	var wrong []int
	var read string
	for i, p := range pages {
		found := ""
		for _, r := range p {
			if r.y >= band {
				body = append(body, r)
			} else if found == "" && strings.Contains(r.text, "— setup SHA-256") {
				found = r.text
			}
		}
		if found != footer {
			wrong = append(wrong, i+1)
			if read == "" {
				read = found
			}
		}
	}
	if len(wrong) > 0 {
		what := fmt.Sprintf("reads %q", read)
		if read == "" {
			what = "states no setup hash"
		}
		out = append(out, fmt.Sprintf("the footer of %s %s; the attached setup gives %q", pageList(wrong, len(pages)), what, footer))
	}
	if len(pages) > 0 {
		if got := coverRow(pages[0], "Setup SHA-256"); got != sha {
			out = append(out, fmt.Sprintf("the cover states setup SHA-256 %s; the attached setup's is %s", orNone(got), sha))
		}
	}
	return append(out, recordAgrees(body, hazards)...)
}

// pageList names pages for people: "page 3", "pages 2, 5 (2 of 7)",
// "every page (7)".
func pageList(p []int, of int) string {
	switch {
	case len(p) == of && of > 1:
		return fmt.Sprintf("every page (%d)", of)
	case len(p) == 1:
		return fmt.Sprintf("page %d", p[0])
	}
	s := make([]string, 0, 3)
	for _, n := range p[:min(3, len(p))] {
		s = append(s, fmt.Sprint(n))
	}
	more := ""
	if len(p) > 3 {
		more = ", …"
	}
	return fmt.Sprintf("pages %s%s (%d of %d)", strings.Join(s, ", "), more, len(p), of)
}

// coverRow is what the cover's row with the label states, its first line
// ("" when it has none).
func coverRow(p []run, label string) string {
	for i, r := range p {
		if r.text == label && i+1 < len(p) {
			return p[i+1].text
		}
	}
	return ""
}

// coverAgrees compares the cover's tool and date with what the document
// records it was written from: a record edited to name another version (so
// that verify would not write the document again) disagrees with the
// cover.
func coverAgrees(pages [][]run, rd report.Render) []string {
	if len(pages) == 0 {
		return nil
	}
	var out []string
	for _, c := range [][2]string{{"Tool", "beamledger " + rd.Tool}, {"Date", rd.Date}} {
		if got, want := coverRow(pages[0], c[0]), pdf.Drawable(c[1]); got != want {
			out = append(out, fmt.Sprintf("the cover's %s reads %q; the document records it was written %q", strings.ToLower(c[0]), got, want))
		}
	}
	return out
}

var recordHeading = regexp.MustCompile(`^\d+  ` + regexp.QuoteMeta(report.RecordHeading) + `$`)

// recordAgrees reads the hazard record off the pages' body text (the runs
// after the last record heading, a line starting at each run of the
// numbers' column that reads the next number) and compares it with the
// attached list, ignoring where lines wrap.
func recordAgrees(body []run, hazards []string) []string {
	start := -1
	for i, r := range body {
		if recordHeading.MatchString(r.text) {
			start = i + 1
		}
	}
	if start < 0 {
		return []string{"the pages carry no hazard record (\"" + report.RecordHeading + "\"): the document was not written by this version's report, or was altered"}
	}
	var lines []string
	markX := 0.0
	for _, r := range body[start:] {
		n := len(lines)
		if r.text == report.RecordMark(n+1) && (n == 0 || r.x == markX) {
			markX = r.x
			lines = append(lines, "")
			continue
		}
		if n > 0 {
			lines[n-1] += " " + r.text
		}
	}
	var out []string
	if len(lines) != len(hazards) {
		out = append(out, fmt.Sprintf("the pages record %d hazard line(s), the attached list %d", len(lines), len(hazards)))
	}
	shown := 0
	for i := 0; i < min(len(lines), len(hazards)) && shown < 3; i++ {
		want := pdf.Drawable(hazards[i])
		if squeeze(lines[i]) != squeeze(want) {
			out = append(out, fmt.Sprintf("hazard line %d: the pages read %q, the attached list %q", i+1, strings.TrimSpace(lines[i]), want))
			shown++
		}
	}
	return out
}

// squeeze drops white space: a line the page wraps reads the same.
func squeeze(s string) string {
	return strings.Map(func(r rune) rune {
		if unicode.IsSpace(r) {
			return -1
		}
		return r
	}, s)
}

func orNone(s string) string {
	if s == "" {
		return "none"
	}
	return s
}
