// Package report builds the sign-off document's model from an assessment:
// every number, table, plot series and sentence the PDF shows, with no
// drawing. Package pdf draws it; tests read the model as text.
package report

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
	Plot       *Plot
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

// Plot is a vector chart.
type Plot struct {
	Title          string
	XLabel, YLabel string
	LogX, LogY     bool
	Series         []Series
	Markers        []Marker
	Bars           []Bar
	// HLines are horizontal reference lines.
	HLines []HLine
}

// Series is a line through points; Dashed distinguishes it in black and
// white.
type Series struct {
	Name   string
	X, Y   []float64
	Dashed bool
}

// Marker is a labelled vertical line, e.g. an element's position.
type Marker struct {
	X     float64
	Label string
}

// Bar is one bar of a bar chart.
type Bar struct {
	Label string
	Value float64
}

// HLine is a labelled horizontal line.
type HLine struct {
	Y     float64
	Label string
}
