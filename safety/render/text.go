// Package render writes an assessment for people (plain text) and for
// programs (JSON). Both draw the one view of package view, so every figure
// reaches both with the same value; this package only picks the writer.
package render

import (
	"io"

	"beamledger/safety"
	"beamledger/safety/view"
)

// Text writes the assessment for the terminal.
func Text(w io.Writer, a *safety.Assessment) error { return view.WriteText(w, view.Build(a)) }

// JSON writes the assessment as one indented JSON document: snake_case keys
// with unit suffixes, SI numbers, null for a value that does not exist (a
// non-finite number is refused, naming its place). Powers are at each
// laser's operating power, as power_basis says.
func JSON(w io.Writer, a *safety.Assessment) error { return view.WriteJSON(w, view.Build(a).JSON) }
