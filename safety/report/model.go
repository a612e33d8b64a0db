// Package report builds the sign-off document's model from an assessment:
// every number, table, plot series and sentence the PDF shows, with no
// drawing. Package pdf draws it; tests read the model as text.
package report

import (
	"fmt"

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
