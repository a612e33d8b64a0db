package report

import (
	"crypto/sha256"
	"encoding/hex"
	"slices"
	"strings"

	"beamledger/budget/setup"
	"beamledger/safety"
	"beamledger/safety/revision"
	"beamledger/safety/view"
)

// Meta is what the document takes from outside the assessment.
type Meta struct {
	Date        string // YYYY-MM-DD
	ToolVersion string
	SetupBytes  []byte // the setup file as read, for its hash
	// Since, when set, is the comparison with the previous revision the
	// document opens with (report --since).
	Since *revision.Report
	// Samples and Seed are the tolerance analysis's (safety.Options).
	Samples int
	Seed    uint64
}

// SignOffRoles are the people who sign.
var SignOffRoles = []string{"Prepared by", "Reviewed by (laser safety officer)", "Approved by (responsible person)"}

// Heading is the title and revision a setup's document states.
func Heading(s *setup.Setup) (title, revision string) {
	return orDefault(s.Meta.Title, "(untitled setup)"), s.Meta.Revision
}

// Build makes the document for an assessment.
func Build(a *safety.Assessment, m Meta) *Document {
	s := a.Setup
	sum := sha256.Sum256(m.SetupBytes)
	title, rev := Heading(s)
	d := &Document{
		Title: title, Site: s.Meta.Site, Revision: rev, PreparedBy: s.Meta.PreparedBy,
		Date: m.Date, ToolVersion: m.ToolVersion, SetupFile: s.File, SetupSHA256: hex.EncodeToString(sum[:]), Setup: m.SetupBytes,
		Hazards: safety.HazardDigest(a),
		Render:  Render{Tool: m.ToolVersion, SetupFile: s.File, Date: m.Date, Samples: m.Samples, Seed: m.Seed},
	}
	if m.Since != nil {
		d.Render.SinceSHA256, d.Render.SinceFile = m.Since.Old.SHA256, m.Since.Old.File
	}
	d.Summary = view.Summary(a)
	v := view.Build(a)
	lists := map[string]*view.List{}
	for i := range v.JSON.Members {
		m := &v.JSON.Members[i]
		if m.List != nil {
			lists[m.List.Key] = m.List
		}
	}
	dg := view.BuildDigest(a)
	if len(dg.Physicist) == 0 {
		// A heading never stands without content.
		dg.Physicist = []string{"no atoms element: the setup describes no light at atoms"}
	}
	d.Sections = append(d.Sections, Section{Heading: "At a glance", Blocks: []Block{
		{Subheading: "For the laser safety officer"}, {Bullets: dg.Officer},
		{Subheading: "For the physicist (at the operating powers)"}, {Bullets: dg.Physicist},
	}})
	if m.Since != nil {
		d.Sections = append(d.Sections, since(m.Since))
	}
	f := view.BuildFigures(a)
	dr := view.BuildDrawn(a)
	if m.Since != nil {
		dr.Changed = m.Since.ChangedElements()
	}
	d.Sections = append(d.Sections, sources(lists["lasers"]), drawings(dr), paths(f, lists["paths"]))
	if len(f.Atoms) > 0 {
		d.Sections = append(d.Sections, atomsSection(f, lists["atoms"]))
	}
	if len(f.Clouds) > 0 {
		d.Sections = append(d.Sections, cloudsSection(f, lists["clouds"]))
	}
	d.Sections = append(d.Sections, hazards(lists), eyewear(lists["eyewear"]), controls(a, lists["control_checks"]), provenance(lists["limits_used"]), assumptions(a), cautions(), signOff(a.Setup.SignOff), record(d.Hazards))
	return d
}

// record is the appendix after the signatures: the hazards found at
// sign-off as attached, one numbered line each, so that the pages and
// the attachment can be held to each other.
func record(hazards []string) Section {
	return Section{Heading: RecordHeading, Blocks: []Block{
		{Paragraph: "The hazards found at sign-off, one numbered line each, as attached to this document (" + HazardsAttachment + "). beamledger verify requires these lines, the setup hash in every footer and the attached setup file to agree, then compares the lines with what the tool finds for the attached setup; the same version also writes the document again from the attached setup and compares every page."},
		{Record: append([]string{}, hazards...)},
	}}
}

// drawings is the section of schematics: a key, then one drawing per
// laser.
func drawings(dr *view.Drawn) Section {
	sec := Section{Heading: "Drawing of the beam paths", Blocks: []Block{
		{Paragraph: "Not to scale: one schematic per laser, drawn from the setup's paths, elements numbered as in the tables. Segments are drawn as the hazards were evaluated, each laser at its maximum power; a segment's weight is the band of its eye-exposure ratio. A drawing shows what the setup file describes, not what stands on the table."},
		{Drawing: Legend()},
	}}
	for _, d := range Diagrams(dr) {
		sec.Blocks = append(sec.Blocks, Block{Drawing: d})
	}
	return sec
}

// since is the section on the changes since the previous revision: which
// revision, then the changes to the setup, the hazards and the drive, those
// that affect safety marked.
func since(r *revision.Report) Section {
	sec := Section{Heading: "Changes since the previous revision", Blocks: []Block{
		{Paragraph: "Previous revision: " + r.Old.Heading() + ". This revision: " + r.New.Heading() + ". " + r.Verdict()},
	}}
	for _, g := range r.Groups() {
		sec.Blocks = append(sec.Blocks, Block{Subheading: g.Heading})
		if len(g.Changes) == 0 {
			sec.Blocks = append(sec.Blocks, Block{Paragraph: g.None})
			continue
		}
		lines := make([]string, len(g.Changes))
		for i, c := range g.Changes {
			lines[i] = c.Marked()
		}
		sec.Blocks = append(sec.Blocks, Block{Bullets: lines})
	}
	return sec
}

// provenance lists where each limit the document used comes from: the
// standard, table and row, and whether it was checked against a public
// source, unchecked ones first.
func provenance(l *view.List) Section {
	sec := Section{Heading: "Where the limits come from"}
	items := make([]string, 0, len(l.Records))
	for i := range l.Records {
		items = append(items, strings.TrimPrefix(lines(&l.Records[i])[0], "- "))
	}
	sec.Blocks = []Block{{Paragraph: "Status: checked (against the named public source), from memory (transcribed from memory of the standard's table, not checked against its text) or conservative substitute (our own value, at least as restrictive, in place of one we could not confirm). Confirm the unchecked values with the laser safety officer."}, {Bullets: items}}
	return sec
}

// table draws a view's list as a table: its columns' labels as the header,
// the fields' texts as cells (numbers flush right), with the lead row first.
// The PDF sizes the columns from the texts themselves.
func table(l *view.List) *Table {
	t := &Table{}
	var recs []*view.Record
	if l.Lead != nil {
		recs = append(recs, l.Lead)
	}
	for i := range l.Records {
		recs = append(recs, &l.Records[i])
	}
	for _, k := range l.Columns {
		label, right := k, false
		for _, r := range recs {
			if f := r.Field(k); f != nil {
				label = f.Label()
				right = right || f.Kind == view.Number || f.Kind == view.Int
			}
		}
		t.Header = append(t.Header, label)
		t.Right = append(t.Right, right)
	}
	for _, r := range recs {
		var row []string
		for _, k := range l.Columns {
			if f := r.Field(k); f != nil {
				row = append(row, f.Display())
			} else {
				row = append(row, "")
			}
		}
		t.Rows = append(t.Rows, row)
	}
	return t
}

// lines are a record's sentences for people, its lists' records' sentences
// after them (without the records' own table rows).
func lines(r *view.Record) []string {
	var out []string
	for _, l := range r.Lines {
		out = append(out, nestedLine(l, r.Expand(l)))
	}
	for i := range r.Members {
		m := &r.Members[i]
		if m.List != nil {
			for i := range m.List.Records {
				out = append(out, lines(&m.List.Records[i])...)
			}
		}
	}
	for _, l := range r.After {
		out = append(out, nestedLine(l, r.Expand(l)))
	}
	return out
}

// Nested marks a bullet that belongs under the one before it (a laser's
// pulse figures under the laser).
const Nested = "\t"

// nestedLine is a record's sentence as a bullet: nested when the view
// indents it under the record's first line.
func nestedLine(template, text string) string {
	if strings.HasPrefix(template, "  ") {
		return Nested + strings.TrimSpace(text)
	}
	return strings.TrimSpace(text)
}

// ownLines are a record's own sentences, joined.
func ownLines(r *view.Record) string {
	var out []string
	for _, l := range r.Lines {
		out = append(out, strings.TrimSpace(r.Expand(l)))
	}
	return strings.Join(out, "; ")
}

// listLines are the sentences of every record of a list, or its note when
// it is empty.
func listLines(l *view.List) []string {
	if len(l.Records) == 0 {
		return []string{l.Empty}
	}
	var out []string
	for i := range l.Records {
		out = append(out, lines(&l.Records[i])...)
	}
	return out
}

func orDefault(s, def string) string {
	if s == "" {
		return def
	}
	return s
}

func sources(l *view.List) Section {
	return Section{Heading: "Sources", Blocks: []Block{{Table: table(l)}, {Bullets: listLines(l)}}}
}

func paths(f *view.Figures, l *view.List) Section {
	sec := Section{Heading: "Beam paths"}
	for i, pf := range f.Paths {
		r := &l.Records[i]
		var els, joined *view.List
		for i := range r.Members {
			m := &r.Members[i]
			switch {
			case m.List != nil && m.List.Key == "elements":
				els = m.List
			case m.List != nil && m.List.Key == "joined":
				joined = m.List
			}
		}
		sec.Blocks = append(sec.Blocks,
			Block{Subheading: pf.Heading},
			Block{Paragraph: ownLines(r)},
			Block{Plot: pf.Beam},
			Block{Plot: pf.Power},
			Block{Table: table(els)})
		var notes []string
		for k := range els.Records {
			notes = append(notes, lines(&els.Records[k])...)
		}
		for _, x := range r.After {
			notes = append(notes, strings.TrimSpace(r.Expand(x)))
		}
		if len(notes) > 0 {
			sec.Blocks = append(sec.Blocks, Block{Bullets: notes})
		}
		// Every other laser's beam on the path, from where it joins.
		for k := range joined.Records {
			jr := &joined.Records[k]
			var jels *view.List
			for i := range jr.Members {
				if m := &jr.Members[i]; m.List != nil && m.List.Key == "elements" {
					jels = m.List
				}
			}
			sec.Blocks = append(sec.Blocks, Block{Paragraph: ownLines(jr)}, Block{Table: table(jels)})
			var jnotes []string
			for i := range jels.Records {
				jnotes = append(jnotes, lines(&jels.Records[i])...)
			}
			if len(jnotes) > 0 {
				sec.Blocks = append(sec.Blocks, Block{Bullets: jnotes})
			}
		}
	}
	return sec
}

func atomsSection(f *view.Figures, l *view.List) Section {
	sec := Section{Heading: "At the atoms"}
	for i, af := range f.Atoms {
		sec.Blocks = append(sec.Blocks, Block{Subheading: af.Heading}, Block{Bullets: lines(&l.Records[i])})
		for _, pl := range []*view.Plot{af.Collective, af.Saturation} {
			if pl != nil {
				sec.Blocks = append(sec.Blocks, Block{Plot: pl})
			}
		}
		if af.Margins != nil {
			sec.Blocks = append(sec.Blocks, Block{Plot: af.Margins}, Block{Table: contributorTable(af.Contributors)})
		}
	}
	return sec
}

// cloudsSection draws each cloud: the table of its beams, the combined
// figures, and the combined potential along the weakest escape direction.
func cloudsSection(f *view.Figures, l *view.List) Section {
	sec := Section{Heading: "At each cloud, every beam counted together"}
	for i, cf := range f.Clouds {
		r := &l.Records[i]
		var beams *view.List
		for k := range r.Members {
			if m := &r.Members[k]; m.List != nil && m.List.Key == "beams" {
				beams = m.List
			}
		}
		sec.Blocks = append(sec.Blocks, Block{Subheading: cf.Heading}, Block{Paragraph: ownLines(r)}, Block{Table: table(beams)})
		var notes []string
		for _, x := range r.After {
			notes = append(notes, strings.TrimSpace(r.Expand(x)))
		}
		sec.Blocks = append(sec.Blocks, Block{Bullets: notes})
		if cf.Potential != nil {
			sec.Blocks = append(sec.Blocks, Block{Plot: cf.Potential})
		}
		if cf.Margins != nil {
			sec.Blocks = append(sec.Blocks, Block{Plot: cf.Margins}, Block{Table: contributorTable(cf.Contributors)})
		}
	}
	return sec
}

// contributorTable lists the inputs' shares of a goal's spread.
func contributorTable(rows [][]string) *Table {
	return &Table{Header: view.ContributorsHeader, Rows: rows, Right: []bool{false, true}}
}

func hazards(lists map[string]*view.List) Section {
	sec := Section{Heading: "Hazards"}
	ex := lists["exposures"]
	sec.Blocks = append(sec.Blocks, Block{Subheading: "Open segments (worst point of each; irradiance averaged over the limiting aperture, at maximum power)"})
	if len(ex.Records) == 0 {
		sec.Blocks = append(sec.Blocks, Block{Paragraph: ex.Empty})
	} else {
		sec.Blocks = append(sec.Blocks, Block{Table: table(ex)})
		// Pulse figures and the sums on shared segments.
		if notes := listLines(ex); len(notes) > 0 {
			sec.Blocks = append(sec.Blocks, Block{Bullets: notes})
		}
	}
	var stray, escaping, diffuse []string
	refl := lists["reflections"]
	for k := range refl.Records {
		r := &refl.Records[k]
		switch r.Field("kind").Text {
		case string(safety.ReflectionStray):
			stray = append(stray, lines(r)...)
		case string(safety.ReflectionEscaping):
			escaping = append(escaping, lines(r)...)
		default:
			diffuse = append(diffuse, lines(r)...)
		}
	}
	for _, g := range []struct {
		head, none string
		items      []string
	}{
		{"Stray reflections above the eye MPE (at the reflecting surface)", "None of the surfaces reached through open segments reflects above the MPE.", stray},
		{"Beams leaving the path above the eye MPE (mirror leakage, AOM orders other than the one used)", "None.", escaping},
		{"Diffuse reflections (Lambertian, viewed along the normal, small-source MPE: conservative)", "No dump or path end is reached through an open segment.", diffuse},
	} {
		sec.Blocks = append(sec.Blocks, Block{Subheading: g.head})
		if len(g.items) == 0 {
			sec.Blocks = append(sec.Blocks, Block{Paragraph: g.none})
		} else {
			sec.Blocks = append(sec.Blocks, Block{Bullets: g.items})
		}
	}
	findings := listLines(lists["findings"])
	sec.Blocks = append(sec.Blocks, Block{Subheading: "All findings: defects, then uncontrolled hazards, controlled hazards, drive findings and notes"}, Block{Bullets: byVerdict(findings)})
	return sec
}

// byVerdict orders finding lines for the officer: defects, uncontrolled
// hazards, controlled hazards, drive findings, notes; each group keeps its
// order.
func byVerdict(fs []string) []string {
	rank := func(f string) int {
		switch {
		case strings.HasPrefix(f, "[defect]"):
			return 0
		case strings.HasPrefix(f, "[hazard]") && strings.HasSuffix(f, "— Uncontrolled"):
			return 1
		case strings.HasPrefix(f, "[hazard]"):
			return 2
		case strings.HasPrefix(f, "[drive]"):
			return 3
		}
		return 4
	}
	out := slices.Clone(fs)
	slices.SortStableFunc(out, func(a, b string) int { return rank(a) - rank(b) })
	return out
}

func eyewear(l *view.List) Section {
	sec := Section{Heading: "Eyewear"}
	if len(l.Records) == 0 {
		sec.Blocks = []Block{{Paragraph: "No open exposure was found to set an optical density."}}
	} else {
		sec.Blocks = []Block{{Bullets: listLines(l)}, {Paragraph: "OD is log10 of the largest exposure ratio at the wavelength (aperture-averaged), rounded up; the EN 207 scale number is given in 315–1400 nm with its test condition (D continuous, I long pulses, R Q-switched, M mode-locked), from the beam's own largest power density (D) or energy density per pulse (I, R, M), its power over the area of its 63 % diameter (definition and scale table from memory); past LB10 no rated filter exists and the beam must be enclosed."}}
	}
	return sec
}

func assumptions(a *safety.Assessment) Section {
	b := []string{"Limits: " + safety.LimitsBasis(a.Setup.Meta.Limits) + " (IEC 60825-1:2014 Annex A and the directive's Annex II, MPE at the cornea and for the skin); " + safety.ClassBasis + ", from its AEL tables. Each value's provenance is listed under where the limits come from, and those not checked against a public source must be checked against the standard's text (see SAFETY.md)."}
	for _, as := range view.Assumptions(a) {
		b = append(b, "Hazards: "+as+".")
	}
	b = append(b,
		"Segments: an element's following segment is open unless the setup says enclosed or vacuum (after a cloud it stays as before).",
		"Beams: Gaussian (embedded Gaussian for M² > 1) in two aligned planes; hard-edge diffraction, aberrations and thermal lensing are not modelled; losses not stated are taken as zero.",
		"Collective threshold: driven Dicke model with one collective decay channel, N Γ_c = D Γ / 4 with D the resonant optical depth along the drive; a planning estimate, uncertain by about a factor of 2.",
	)
	for _, d := range a.Hazards.DefaultsAssumed {
		b = append(b, "Default assumed: "+d+".")
	}
	return Section{Heading: "Assumptions", Blocks: []Block{{Bullets: b}}}
}

func cautions() Section {
	return Section{Heading: "Cautions", Blocks: []Block{{Bullets: view.Cautions}}}
}

// signOff is the last section before the record: the officer's decision (three boxes the
// officer ticks by hand; the tool never ticks one), the conditions (the
// setup's, or blank lines to write them on), the review date, and the
// signatures.
func signOff(so setup.SignOff) Section {
	conditions := []Block{{Bullets: so.Conditions}}
	if len(so.Conditions) == 0 {
		line := Block{Paragraph: strings.Repeat("_", 90)}
		conditions = []Block{line, line, line}
	}
	review := "Review by: " + strings.Repeat("_", 20) + " (YYYY-MM-DD)"
	if so.Review != "" {
		review = "Review by: " + so.Review + "."
	}
	blocks := []Block{
		{Subheading: "The laser safety officer's decision (ticked by hand; this tool never ticks it)"},
		{Paragraph: "[   ] approved        [   ] approved with the conditions below        [   ] not approved"},
		{Subheading: "Conditions"},
	}
	blocks = append(blocks, conditions...)
	blocks = append(blocks, Block{Paragraph: review}, Block{SignOff: SignOffRoles})
	return Section{Heading: "Sign-off", Blocks: blocks}
}

// controls is the section on the control measures: what the setup declares
// and, for each measure a class may need, whether it is needed and in place.
func controls(a *safety.Assessment, l *view.List) Section {
	t := &Table{Header: []string{"control measure", "needed by", "declared", "in place", "officer's check"}, Right: []bool{false, false, false, false, false}}
	for i := range l.Records {
		r := &l.Records[i]
		needed := r.Field("needed_by").Text
		if needed == "" {
			needed = "not needed by the classes present"
		}
		t.Rows = append(t.Rows, []string{r.Field("name").Text, needed, r.Field("declared").Text, r.Field("in_place").Text, "[   ]"})
	}
	return Section{Heading: "Control measures", Blocks: []Block{
		{Paragraph: "Declared in the setup's [controls]: " + safety.ControlSummary(a.Setup.Controls) + "."},
		{Paragraph: l.Heading + ":"},
		{Table: t},
		{Paragraph: "A hazard counts as controlled only by a control declared here: the eyewear worn, where it covers every wavelength on the hazard with the OD and, where marked, the EN 207 scale number needed; for the skin, training with a written procedure; for a beam leaving the table, a rated perimeter barrier. The laser safety officer confirms that each declared control is in place and adequate, and ticks the last column."},
	}}
}
