package revision

import (
	"encoding/json"
	"fmt"
	"io"
	"strings"
)

// Line writes one change for people: "changed laser "a": power "1.5 W" →
// "2 W"". Text, the sign-off's section and the JSON's "line" all use it.
func (c Change) Line() string {
	var b strings.Builder
	b.WriteString(c.Change)
	b.WriteString(" ")
	if !setupKinds[c.Kind] || c.Kind == "eyewear" && c.Key == "" && !strings.HasPrefix(c.What, "eyewear") {
		b.WriteString(strings.ReplaceAll(c.Kind, "_", " "))
		b.WriteString(": ")
	}
	b.WriteString(c.What)
	if c.Key != "" {
		b.WriteString(": ")
		b.WriteString(c.Key)
	}
	switch {
	case c.Old != "" && c.New != "":
		fmt.Fprintf(&b, ": %s → %s", c.Old, c.New)
	case c.Old != "":
		fmt.Fprintf(&b, " (was %s)", c.Old)
	case c.New != "":
		fmt.Fprintf(&b, " (%s)", c.New)
	}
	return b.String()
}

// Marked is Line with "[safety] " before it when the change affects safety.
func (c Change) Marked() string {
	if c.AffectsSafety {
		return "[safety] " + c.Line()
	}
	return c.Line()
}

// setupKinds are the kinds of setup changes, whose What names the table.
var setupKinds = map[string]bool{"setup": true, "laser": true, "path": true, "element": true, "cloud": true, "eyewear": true, "controls": true, "signoff": true}

// Heading names the two revisions: title, revision, file and SHA-256.
func (s Side) Heading() string {
	t := s.Title
	if t == "" {
		t = "(untitled setup)"
	}
	if s.Revision != "" {
		t += ", revision " + s.Revision
	}
	return fmt.Sprintf("%s (%s, SHA-256 %s)", t, s.File, s.SHA256)
}

// Verdict says in a sentence whether a new sign-off is needed.
func (r *Report) Verdict() string {
	if r.AffectsSafety {
		return "A change affects safety (marked [safety]): the changed table needs a new sign-off by the laser safety officer before it is used."
	}
	return "No change affects safety by the rule in README (setup text, clouds and drive keys only, no hazard moved); the laser safety officer decides whether the previous sign-off still covers the table."
}

// Group is one part of a comparison, with its heading and the words for
// no change.
type Group struct {
	Heading, None string
	Changes       []Change
}

// Groups are the setup, hazard and drive changes, in that order.
func (r *Report) Groups() []Group {
	return []Group{
		{"Setup", "No change in the setup's content.", r.Setup},
		{"Hazards (ratios moving more than 10 %, classes, OD, eyewear, findings that need action)", "No hazard changed.", r.Hazards},
		{"Drive (power at each cloud, goal margins)", "No change at the atoms.", r.Drive},
	}
}

// Text writes the comparison for people.
func Text(w io.Writer, r *Report) error {
	var b strings.Builder
	fmt.Fprintf(&b, "Changes from %s\n          to %s\n", r.Old.Heading(), r.New.Heading())
	for _, g := range r.Groups() {
		b.WriteString("\n" + g.Heading + "\n")
		if len(g.Changes) == 0 {
			b.WriteString("  " + g.None + "\n")
		}
		for _, c := range g.Changes {
			mark := "        "
			if c.AffectsSafety {
				mark = "[safety]"
			}
			fmt.Fprintf(&b, "  %s %s\n", mark, c.Line())
		}
	}
	b.WriteString("\n" + r.Verdict() + "\n")
	_, err := io.WriteString(w, b.String())
	return err
}

// JSON writes the comparison as JSON: both revisions, every change with
// its line for people, and whether a change affects safety.
func JSON(w io.Writer, r *Report) error {
	type line struct {
		Change
		Line string `json:"line"`
	}
	lines := func(cs []Change) []line {
		out := make([]line, len(cs))
		for i, c := range cs {
			out[i] = line{c, c.Line()}
		}
		return out
	}
	e := json.NewEncoder(w)
	e.SetIndent("", "  ")
	return e.Encode(struct {
		Old           Side   `json:"old"`
		New           Side   `json:"new"`
		Setup         []line `json:"setup_changes"`
		Hazards       []line `json:"hazard_changes"`
		Drive         []line `json:"drive_changes"`
		AffectsSafety bool   `json:"affects_safety"`
		Verdict       string `json:"verdict"`
	}{r.Old, r.New, lines(r.Setup), lines(r.Hazards), lines(r.Drive), r.AffectsSafety, r.Verdict()})
}
