// Package report builds the sign-off document's model from an assessment:
// every number, table, plot series and sentence the PDF shows, with no
// drawing. Package pdf draws it; tests read the model as text.
package report

import "beamledger/safety/view"

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
}

// Table is a captioned table of text cells.
type Table struct {
	Header []string
	Rows   [][]string
	// Right marks columns whose cells align right (numbers).
	Right []bool
}
