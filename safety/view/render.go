package view

// The assessment for people (plain text) and for programs (JSON): both draw
// the one view that Build makes, so every figure reaches both with the same
// value.

import (
	"io"

	"beamledger/safety"
)

// Text writes the assessment for the terminal.
func Text(w io.Writer, a *safety.Assessment) error { return WriteText(w, Build(a)) }

// JSON writes the assessment as one indented JSON document: snake_case keys
// with unit suffixes, SI numbers, null for a value that does not exist (a
// non-finite number is refused, naming its place). Powers are at each
// laser's operating power, as power_basis says.
func JSON(w io.Writer, a *safety.Assessment) error { return WriteJSON(w, Build(a).JSON) }
