package report

import (
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"math"
	"sort"
	"strings"

	"beamledger/budget"
	"beamledger/budget/atoms"
	"beamledger/budget/drive"
	"beamledger/budget/optics"
	"beamledger/budget/setup"
	"beamledger/budget/units"
	"beamledger/limits"
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
}

// SignOffRoles are the people who sign.
var SignOffRoles = []string{"Prepared by", "Reviewed by (laser safety officer)", "Approved by (responsible person)"}

// Build makes the document for an assessment.
func Build(a *safety.Assessment, m Meta) *Document {
	s := a.Setup
	sum := sha256.Sum256(m.SetupBytes)
	d := &Document{
		Title: orDefault(s.Meta.Title, "(untitled setup)"), Site: s.Meta.Site, Revision: s.Meta.Revision, PreparedBy: s.Meta.PreparedBy,
		Date: m.Date, ToolVersion: m.ToolVersion, SetupFile: s.File, SetupSHA256: hex.EncodeToString(sum[:]), Setup: m.SetupBytes,
		Hazards: safety.HazardDigest(a),
	}
	d.Summary = summary(a)
	v := view.Build(a)
	lists := map[string]*view.List{}
	for i := range v.JSON.Members {
		m := &v.JSON.Members[i]
		if m.List != nil {
			lists[m.List.Key] = m.List
		}
	}
	if m.Since != nil {
		d.Sections = append(d.Sections, since(m.Since))
	}
	d.Sections = append(d.Sections, sources(lists["lasers"]), drawings(a), paths(a, lists["paths"]))
	if len(a.Atoms) > 0 {
		d.Sections = append(d.Sections, atomsSection(a, lists["atoms"]))
	}
	if len(a.Clouds) > 0 {
		d.Sections = append(d.Sections, cloudsSection(a, lists["clouds"]))
	}
	d.Sections = append(d.Sections, hazards(lists), eyewear(lists["eyewear"]), provenance(lists["limits_used"]), assumptions(a), cautions(), signOff())
	return d
}

// drawings is the section of schematics: a key, then one drawing per
// laser.
func drawings(a *safety.Assessment) Section {
	sec := Section{Heading: "Drawing of the beam paths", Blocks: []Block{
		{Paragraph: "Not to scale: one schematic per laser, drawn from the setup's paths, elements numbered as in the tables. Segments are drawn as the hazards were evaluated, each laser at its maximum power; a segment's weight is the band of its eye-exposure ratio. A drawing shows what the setup file describes, not what stands on the table."},
		{Drawing: Legend()},
	}}
	for _, d := range Diagrams(a) {
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
		out = append(out, strings.TrimSpace(r.Expand(l)))
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
		out = append(out, strings.TrimSpace(r.Expand(l)))
	}
	return out
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

func summary(a *safety.Assessment) string {
	action, advice := 0, 0
	for _, f := range a.Findings {
		if f.Severity == budget.SeverityAction {
			action++
		} else {
			advice++
		}
	}
	var b strings.Builder
	fmt.Fprintf(&b, "This document evaluates the setup described in %s against %s and the drive goals it states. ", a.Setup.File, safety.Standard)
	switch action {
	case 0:
		b.WriteString("No finding needs action before alignment under the stated assumptions")
	case 1:
		b.WriteString("1 finding needs action before alignment")
	default:
		fmt.Fprintf(&b, "%d findings need action before alignment", action)
		lines := 0
		for i, n := range view.FindingGroups(a.Findings) {
			if n > 0 && a.Findings[i].Severity == budget.SeverityAction {
				lines++
			}
		}
		if lines < action {
			fmt.Fprintf(&b, " (%d lines in the findings list, where findings of one kind on one path share a line)", lines)
		}
	}
	fmt.Fprintf(&b, ", and %d more are advice. ", advice)
	met, goals := 0, 0
	var short []string
	for _, at := range a.Atoms {
		if g := at.Goal; g != nil {
			goals++
			if g.Met {
				met++
			} else {
				short = append(short, fmt.Sprintf("%s on path %q", g.Kind, at.Path.Path.Name))
			}
		}
	}
	if goals > 0 {
		fmt.Fprintf(&b, "Of %d drive goal(s), %d are met at the lasers' operating powers", goals, met)
		if len(short) > 0 {
			fmt.Fprintf(&b, "; not met: %s", strings.Join(short, ", "))
		}
		b.WriteString(". ")
	}
	highest, who := "", ""
	order := map[string]int{limits.Class1: 1, limits.Class2: 2, limits.Class3R: 3, limits.Class3B: 4, limits.Class4: 5}
	for _, ll := range a.Hazards.Lasers {
		if order[ll.Class] > order[highest] {
			highest, who = ll.Class, ll.Laser.Name
		}
	}
	if highest != "" {
		fmt.Fprintf(&b, "The highest class present is Class %s (laser %q). ", highest, who)
	}
	b.WriteString("These figures support, and never replace, the evaluation of the laser safety officer under local regulations; this document does not certify the setup as safe to use.")
	return b.String()
}

func sources(l *view.List) Section {
	return Section{Heading: "Sources", Blocks: []Block{{Table: table(l)}, {Bullets: listLines(l)}}}
}

func paths(a *safety.Assessment, l *view.List) Section {
	sec := Section{Heading: "Beam paths"}
	for i, pb := range a.Budget.Paths {
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
			Block{Subheading: fmt.Sprintf("Path %q", pb.Path.Name)},
			Block{Paragraph: ownLines(r)},
			Block{Plot: beamPlot(pb)},
			Block{Plot: waterfall(pb)},
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

// beamPlot samples the x and y radii along the path, in mm.
func beamPlot(pb *budget.PathBudget) *Plot {
	end := 0.0
	if n := len(pb.Path.Elements); n > 0 {
		end = pb.Path.Elements[n-1].At
	}
	if pb.OpenEnd {
		end = end*1.15 + 0.05
	}
	const n = 240
	pl := &Plot{Title: "1/e² beam radius along the path", XLabel: "position along the path (mm)", YLabel: "radius (mm)"}
	// Even samples, plus every element's position so that foci on an
	// element (a fibre face) are drawn.
	zs := make([]float64, 0, n+1+len(pb.Rows))
	for i := 0; i <= n; i++ {
		zs = append(zs, end*float64(i)/n)
	}
	for _, r := range pb.Rows {
		zs = append(zs, r.Element.At)
	}
	sort.Float64s(zs)
	var xs, wx, wy []float64
	for _, z := range zs {
		b := beamAt(pb, z)
		x, y := b.Radii()
		xs, wx, wy = append(xs, z*1e3), append(wx, x*1e3), append(wy, y*1e3)
	}
	pl.Series = []Series{{Name: "x plane", X: xs, Y: wx}, {Name: "y plane", X: xs, Y: wy, Dashed: true}}
	for _, r := range pb.Rows {
		pl.Markers = append(pl.Markers, Marker{X: r.Element.At * 1e3, Label: fmt.Sprintf("%d %s", r.Element.Index, r.Element.Label())})
	}
	return pl
}

// beamAt is the beam at position z along the path (after any element at z).
func beamAt(pb *budget.PathBudget, z float64) optics.Beam {
	for _, s := range pb.Segments {
		if z >= s.From && z <= s.To {
			return s.Beam.Propagate(z - s.From)
		}
	}
	last := pb.Segments[len(pb.Segments)-1]
	return last.Beam.Propagate(z - last.From)
}

func waterfall(pb *budget.PathBudget) *Plot {
	op := pb.Laser.OperatingPower
	pl := &Plot{Title: "power after each element (operating power)", YLabel: "power (mW)"}
	pl.Bars = append(pl.Bars, Bar{Label: "start", Value: pb.StartFraction * op * 1e3})
	for _, r := range pb.Rows {
		pl.Bars = append(pl.Bars, Bar{Label: fmt.Sprintf("%d %s", r.Element.Index, r.Element.Label()), Value: r.FractionOut * op * 1e3})
	}
	return pl
}

func atomsSection(a *safety.Assessment, l *view.List) Section {
	sec := Section{Heading: "At the atoms"}
	for i, at := range a.Atoms {
		e := at.Row.Element
		sec.Blocks = append(sec.Blocks, Block{Subheading: fmt.Sprintf("Path %q, element %d at %s", at.Path.Path.Name, e.Index, units.FormatLength(e.At))},
			Block{Bullets: lines(&l.Records[i])})
		if g := at.Goal; g != nil && g.Collective != nil && g.Impossible == "" {
			sec.Blocks = append(sec.Blocks, Block{Plot: collectivePlot(at, g)})
		}
		if !at.FarDetuned && at.NearLine == "" && at.Row.FractionIn > 0 && at.OpticalDepth > 0 {
			sec.Blocks = append(sec.Blocks, Block{Plot: saturationPlot(at)})
		}
		if gt := a.Tolerances[at]; gt != nil {
			sec.Blocks = append(sec.Blocks, Block{Plot: marginHistogram(gt)}, Block{Table: contributorTable(gt)})
		}
	}
	return sec
}

// cloudsSection draws each cloud: the table of its beams, the combined
// figures, and the combined potential along the weakest escape direction.
func cloudsSection(a *safety.Assessment, l *view.List) Section {
	sec := Section{Heading: "At each cloud, every beam counted together"}
	for i, cr := range a.Clouds {
		r := &l.Records[i]
		var beams *view.List
		for k := range r.Members {
			if m := &r.Members[k]; m.List != nil && m.List.Key == "beams" {
				beams = m.List
			}
		}
		sec.Blocks = append(sec.Blocks, Block{Subheading: fmt.Sprintf("Cloud %q", cr.Cloud.Name)}, Block{Paragraph: ownLines(r)}, Block{Table: table(beams)})
		var notes []string
		for _, x := range r.After {
			notes = append(notes, strings.TrimSpace(r.Expand(x)))
		}
		sec.Blocks = append(sec.Blocks, Block{Bullets: notes})
		if t := cr.Trap; t != nil && t.Found && len(t.Profile) > 0 {
			pl := &Plot{Title: "combined potential along the weakest escape direction, through the trap minimum", XLabel: "distance from the minimum (mm)", YLabel: "U/k_B (mK)"}
			var xs, ys []float64
			for _, p := range t.Profile {
				xs, ys = append(xs, p[0]*1e3), append(ys, p[1]*1e3)
			}
			pl.Series = append(pl.Series, Series{Name: "U/k_B, gravity included", X: xs, Y: ys})
			sec.Blocks = append(sec.Blocks, Block{Plot: pl})
		}
		if gt := a.Tolerances[cr.Cloud]; gt != nil {
			sec.Blocks = append(sec.Blocks, Block{Plot: marginHistogram(gt)}, Block{Table: contributorTable(gt)})
		}
	}
	return sec
}

// marginHistogram shows how a goal's margin spreads over the tolerance
// samples, with the 0 dB line (the goal just met) marked.
func marginHistogram(gt *drive.GoalTolerance) *Plot {
	lo, hi := math.Inf(1), math.Inf(-1)
	impossible := 0
	for _, m := range gt.Margins {
		if math.IsInf(m, 0) || math.IsNaN(m) {
			impossible++
			continue
		}
		lo, hi = math.Min(lo, m), math.Max(hi, m)
	}
	pl := &Plot{Title: fmt.Sprintf("goal margin over %d tolerance samples (seed %d)", gt.Samples, gt.Seed), XLabel: "margin (dB)", YLabel: "samples per bin"}
	if math.IsInf(lo, 1) {
		return pl
	}
	lo, hi = math.Min(lo, 0), math.Max(hi, 0)
	if hi-lo < 1e-9 {
		lo, hi = lo-0.5, hi+0.5
	}
	const bins = 30
	counts := make([]float64, bins)
	for _, m := range gt.Margins {
		if math.IsInf(m, 0) || math.IsNaN(m) {
			continue
		}
		counts[min(bins-1, int((m-lo)/(hi-lo)*bins))]++
	}
	var xs, ys []float64
	for k, c := range counts {
		a, b := lo+(hi-lo)*float64(k)/bins, lo+(hi-lo)*float64(k+1)/bins
		xs, ys = append(xs, a, b), append(ys, c, c)
	}
	pl.Series = append(pl.Series, Series{Name: "samples", X: xs, Y: ys})
	pl.Markers = append(pl.Markers, Marker{X: 0, Label: "0 dB: just met"})
	if impossible > 0 {
		pl.Title += fmt.Sprintf("; %d samples cannot meet it", impossible)
	}
	return pl
}

// contributorTable lists the inputs' shares of a goal's spread.
func contributorTable(gt *drive.GoalTolerance) *Table {
	t := &Table{Header: []string{"toleranced input", "share of the spread (SRC²/ΣSRC²)"}, Right: []bool{false, true}}
	for _, c := range gt.Contributors {
		t.Rows = append(t.Rows, []string{c.Input.Label, fmt.Sprintf("%.0f %%", 100*c.Share)})
	}
	return t
}

// saturationPlot shows s on the beam axis through the cloud (positions in
// rms sizes along the beam), at the operating power and, with a drive goal,
// at the goal's power: the saturable absorber through the column in front.
func saturationPlot(at *drive.AtomsResult) *Plot {
	tr := at.Transition
	a := atoms.DetuningFactor(at.Detuning, tr.Gamma)
	pl := &Plot{Title: "s = I/I_sat on the beam axis through the cloud", XLabel: "position along the beam (rms sizes from the centre)", YLabel: "s", LogY: true}
	series := func(name string, i0 float64, dashed bool) {
		var xs, ys []float64
		for k := -30; k <= 30; k++ {
			z := float64(k) / 10
			xs = append(xs, z)
			ys = append(ys, atoms.OutgoingIntensity(i0, at.OpticalDepth*atoms.ColumnFraction(z), a))
		}
		pl.Series = append(pl.Series, Series{Name: name, X: xs, Y: ys, Dashed: dashed})
	}
	series("at the operating power", at.PeakIrradiance/at.Isat, false)
	if g := at.Goal; g != nil && g.Impossible == "" && g.Kind != setup.GoalTrapDepth {
		series("at the goal's power", g.Intensity/at.Isat, true)
	}
	return pl
}

// collectivePlot shows the source power needed against the multiple of the
// threshold, for the upper and lower threshold estimates, with the laser's
// operating power; power scales as the square of the Rabi frequency.
func collectivePlot(at *drive.AtomsResult, g *drive.GoalResult) *Plot {
	perFactor2 := g.SourcePower / (g.Factor * g.Factor) // source power at 1 × Ω_c (upper)
	low := g.Collective.OmegaCLow / g.Collective.OmegaC
	pl := &Plot{Title: "collective drive: source power against the threshold band", XLabel: "drive as a multiple of Ω_c (upper estimate)",
		YLabel: "source power needed (W)", LogX: true, LogY: true}
	var xs, up, lo []float64
	for i := 0; i <= 60; i++ {
		f := math.Pow(10, -1+2*float64(i)/60)
		xs, up, lo = append(xs, f), append(up, perFactor2*f*f), append(lo, perFactor2*f*f*low*low)
	}
	pl.Series = []Series{{Name: "D = b0 (upper)", X: xs, Y: up}, {Name: "D = b0/2 (lower)", X: xs, Y: lo, Dashed: true}}
	pl.HLines = []HLine{{Y: g.Available, Label: fmt.Sprintf("operating power of %q", at.Path.Laser.Name)}}
	pl.Markers = []Marker{{X: g.Factor, Label: fmt.Sprintf("goal ×%s", units.FormatNumber(g.Factor))}}
	return pl
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
	sec.Blocks = append(sec.Blocks, Block{Subheading: "All findings (damage, ratings, goals and exposures), action first"}, Block{Bullets: actionFirst(findings)})
	return sec
}

func actionFirst(fs []string) []string {
	var a, b []string
	for _, f := range fs {
		if strings.HasPrefix(f, "[action]") {
			a = append(a, f)
		} else {
			b = append(b, f)
		}
	}
	return append(a, b...)
}

func eyewear(l *view.List) Section {
	sec := Section{Heading: "Eyewear"}
	if len(l.Records) == 0 {
		sec.Blocks = []Block{{Paragraph: "No open exposure was found to set an optical density."}}
	} else {
		sec.Blocks = []Block{{Bullets: listLines(l)}, {Paragraph: "OD is log10 of the largest exposure ratio at the wavelength, rounded up; the EN 207 scale number is given in 315–1400 nm with its test condition (D continuous, I long pulses, R Q-switched, M mode-locked), from the irradiance for D and the radiant exposure per pulse otherwise (scale table from memory)."}}
	}
	return sec
}

func assumptions(a *safety.Assessment) Section {
	b := []string{"Standard: " + safety.Standard + ", Annex A, MPE at the cornea and for the skin, and the AEL tables; each value's provenance is listed under where the limits come from, and those not checked against a public source must be checked against the standard's text (see SAFETY.md)."}
	for _, as := range view.Assumptions(a.Setup) {
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

func signOff() Section {
	return Section{Heading: "Sign-off", Blocks: []Block{{SignOff: SignOffRoles}}}
}
