// Package report builds the sign-off document's model from an assessment:
// every number, table, plot series and sentence the PDF shows, with no
// drawing. Package pdf draws it; tests read the model as text.
package report

import (
	"fmt"
	"strconv"
	"strings"

	"beamledger/safety/view"
)

// Document is the whole sign-off document.
type Document struct {
	Title, Site, Revision, PreparedBy string
	Date                              string // YYYY-MM-DD
	ToolVersion                       string
	SetupFile                         string
	SetupSHA256                       string
	// Setup is the setup file as read, attached to the document so that
	// the document carries what it covers; Hazards the hazards found, one
	// line each (safety.HazardDigest), attached as HazardsAttachment for
	// verify to compare with a later version's.
	Setup    []byte
	Hazards  []string
	Summary  string
	Sections []Section
	// Render is what the document was written from besides its setup,
	// recorded with the hazard list so that verify can write it again.
	Render Render
}

// Render is what a sign-off is written from besides its setup file: the
// tool's version, the setup file's name as given (the pages print it),
// the date, the tolerance analysis's samples and seed, and the SHA-256 and
// name of the previous revision's setup file when the document opens with
// the changes since it ("" otherwise). The same setup and Render (with the
// previous revision's file) give the same pages.
type Render struct {
	Tool, SetupFile, Date  string
	Samples                int
	Seed                   uint64
	SinceSHA256, SinceFile string
}

// renderPrefix starts a Render's text.
const renderPrefix = "written by beamledger "

// String is the Render as the hazard list's description records it.
func (r Render) String() string {
	since := "none"
	if r.SinceSHA256 != "" {
		since = r.SinceSHA256 + " " + strconv.Quote(r.SinceFile)
	}
	return fmt.Sprintf("%s%s from the setup file %s, dated %s, tolerance samples %d, seed %d, since %s",
		renderPrefix, strconv.Quote(r.Tool), strconv.Quote(r.SetupFile), r.Date, r.Samples, r.Seed, since)
}

// ParseRender reads a Render from text that holds one as String writes it
// (after any other words); ok is false when it holds none.
func ParseRender(s string) (r Render, ok bool) {
	_, rest, found := strings.Cut(s, renderPrefix)
	if !found {
		return Render{}, false
	}
	var err error
	if r.Tool, rest, ok = cutQuoted(rest); !ok {
		return Render{}, false
	}
	if rest, ok = strings.CutPrefix(rest, " from the setup file "); !ok {
		return Render{}, false
	}
	if r.SetupFile, rest, ok = cutQuoted(rest); !ok {
		return Render{}, false
	}
	var since string
	if _, err = fmt.Sscanf(rest, ", dated %s tolerance samples %d, seed %d, since %s", &r.Date, &r.Samples, &r.Seed, &since); err != nil {
		return Render{}, false
	}
	r.Date = strings.TrimSuffix(r.Date, ",")
	if since != "none" {
		r.SinceSHA256 = since
		_, file, _ := strings.Cut(rest, " since "+since+" ")
		if r.SinceFile, _, ok = cutQuoted(file); !ok {
			return Render{}, false
		}
	}
	w := r.String()
	return r, len(w) <= len(s) && w == s[len(s)-len(w):]
}

// cutQuoted reads a Go-quoted string at the start of s.
func cutQuoted(s string) (v, rest string, ok bool) {
	q, err := strconv.QuotedPrefix(s)
	if err != nil {
		return "", s, false
	}
	v, err = strconv.Unquote(q)
	return v, s[len(q):], err == nil
}

// HazardsAttachment is the name of the attached list of hazards.
const HazardsAttachment = "hazards-at-sign-off.txt"

// Section is a numbered part of the document.
type Section struct {
	Heading string
	Blocks  []Block
}

// Block is one element of a section; exactly one field is set.
type Block struct {
	Subheading string
	Paragraph  string
	Bullets    []string
	Table      *Table
	Plot       *view.Plot
	Drawing    *Drawing
	SignOff    []string // roles, each with name, signature and date lines
	// Record lists the hazards found at sign-off, one numbered line each,
	// as attached (Document.Hazards): what verify reads off the pages.
	Record []string
}

// RecordHeading is the heading of the appendix that prints the hazards
// recorded at sign-off (verify finds the record under it).
const RecordHeading = "Hazard record"

// RecordMark is how the record numbers its n-th line (from 1).
func RecordMark(n int) string { return fmt.Sprintf("#%d", n) }

// Table is a captioned table of text cells.
type Table struct {
	Header []string
	Rows   [][]string
	// Right marks columns whose cells align right (numbers).
	Right []bool
}
