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
	"beamledger/limits"
	"beamledger/safety"
	"beamledger/safety/view"
)

// Meta is what the document takes from outside the assessment.
type Meta struct {
	Date        string // YYYY-MM-DD
	ToolVersion string
	SetupBytes  []byte // the setup file as read, for its hash
}

// SignOffRoles are the people who sign.
var SignOffRoles = []string{"Prepared by", "Reviewed by (laser safety officer)", "Approved by (responsible person)"}

// Build makes the document for an assessment.
func Build(a *safety.Assessment, m Meta) *Document {
	s := a.Setup
	sum := sha256.Sum256(m.SetupBytes)
	d := &Document{
		Title: orDefault(s.Meta.Title, "(untitled setup)"), Site: s.Meta.Site, Revision: s.Meta.Revision, PreparedBy: s.Meta.PreparedBy,
		Date: m.Date, ToolVersion: m.ToolVersion, SetupFile: s.File, SetupSHA256: hex.EncodeToString(sum[:]),
	}
	d.Summary = summary(a)
	d.Sections = append(d.Sections, sources(a), paths(a))
	if len(a.Atoms) > 0 {
		d.Sections = append(d.Sections, atomsSection(a))
	}
	d.Sections = append(d.Sections, hazards(a), eyewear(a), assumptions(a), cautions(), signOff())
	return d
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

func sources(a *safety.Assessment) Section {
	t := &Table{Header: []string{"laser", "λ", "max power", "operating", "emission", "class", "eye MPE", "duration"},
		Widths: []float64{2.2, 1.4, 1.3, 1.3, 1.1, 0.9, 1.6, 1.1}, Right: []bool{false, true, true, true, false, false, true, true}}
	var notes []string
	for _, ll := range a.Hazards.Lasers {
		l := ll.Laser
		cl := ll.Class
		if cl == "" {
			cl = "—"
		}
		t.Rows = append(t.Rows, []string{l.Name, nm(l.Wavelength), budget.FormatPower(l.Power), budget.FormatPower(l.OperatingPower), l.Emission, cl,
			budget.FormatIrradiance(ll.EyeIrradiance), budget.FormatSI(ll.Duration, "s")})
		notes = append(notes, fmt.Sprintf("%s: eye MPE by %s (%s); class %s.", l.Name, ll.EyeRule, ll.Eye.Effect, ll.ClassNote))
	}
	return Section{Heading: "Sources", Blocks: []Block{{Table: t}, {Bullets: notes}}}
}

func nm(λ float64) string { return budget.FormatNumber(λ*1e9) + " nm" }

func paths(a *safety.Assessment) Section {
	sec := Section{Heading: "Beam paths"}
	for _, pb := range a.Budget.Paths {
		p, las := pb.Path, pb.Laser
		op := las.OperatingPower
		from := fmt.Sprintf("laser %q", las.Name)
		if p.Parent != nil {
			from = fmt.Sprintf("the other port of %q on path %q", p.ParentPort.Name, p.Parent.Name)
		}
		sec.Blocks = append(sec.Blocks,
			Block{Subheading: fmt.Sprintf("Path %q", p.Name)},
			Block{Paragraph: fmt.Sprintf("From %s at %s; powers at the operating power %s (maximum %s). W is the 1/e² radius arriving at each element.",
				from, nm(las.Wavelength), budget.FormatPower(op), budget.FormatPower(las.Power))},
			Block{Plot: beamPlot(pb)},
			Block{Plot: waterfall(pb)},
			Block{Table: budgetTable(pb)})
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
func beamAt(pb *budget.PathBudget, z float64) budget.Beam {
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

func budgetTable(pb *budget.PathBudget) *Table {
	op := pb.Laser.OperatingPower
	t := &Table{Header: []string{"#", "element", "at", "Wx", "Wy", "power in", "power out", "peak irr.", "loss dB", "losses here"},
		Widths: []float64{0.3, 1.2, 1.0, 1.25, 1.25, 1.25, 1.25, 1.6, 0.75, 2.6},
		Right:  []bool{true, false, true, true, true, true, true, true, true, false}}
	for _, r := range pb.Rows {
		e := r.Element
		wx, wy := r.BeamIn.Radii()
		var losses []string
		for _, l := range r.Losses {
			if l.Fraction >= 1e-9 {
				losses = append(losses, fmt.Sprintf("%s %s", l.Kind, budget.FormatPower(l.Fraction*op)))
			}
		}
		if r.AssumedLossless {
			losses = append(losses, "lossless (assumed)")
		}
		db := "—"
		if r.FractionOut > 0 {
			db = fmt.Sprintf("%.2f", math.Abs(budget.Decibels(r.FractionOut)))
		}
		t.Rows = append(t.Rows, []string{fmt.Sprint(e.Index), e.Label(), budget.FormatLength(e.At), budget.FormatLength(wx), budget.FormatLength(wy),
			budget.FormatPower(r.FractionIn * op), budget.FormatPower(r.FractionOut * op), budget.FormatIrradiance(r.BeamIn.PeakIrradiance(r.FractionIn * op)),
			db, strings.Join(losses, ", ")})
	}
	return t
}

func hz(ω float64) string { return budget.FormatFrequency(ω / (2 * math.Pi)) }

func atomsSection(a *safety.Assessment) Section {
	sec := Section{Heading: "At the atoms"}
	for _, at := range a.Atoms {
		e := at.Row.Element
		wx, wy := at.Row.BeamIn.Radii()
		t := &Table{Header: []string{"quantity", "value"}, Widths: []float64{3, 5}}
		add := func(k, v string) { t.Rows = append(t.Rows, []string{k, v}) }
		add("cloud, transition", fmt.Sprintf("%s, %s (%s atoms)", at.Cloud.Name, at.Transition.Name, budget.FormatNumber(at.Cloud.Atoms)))
		add("power at the cloud", budget.FormatPower(at.Power))
		add("beam radius Wx, Wy", budget.FormatLength(wx)+", "+budget.FormatLength(wy))
		add("peak irradiance", budget.FormatIrradiance(at.PeakIrradiance))
		add("detuning Δ/2π", hz(at.Detuning)+" ("+at.DetuningSource+")")
		add("I_sat", budget.FormatIrradiance(at.Isat)+" ("+at.IsatNote+")")
		add("s = I/I_sat", budget.FormatNumber(at.Saturation))
		add("Ω/2π", hz(at.Rabi))
		if at.NearLine != "" {
			add("nearby line", fmt.Sprintf("%s from %s, within %d linewidths: the dipole formula and the two-level figures do not apply; not evaluated",
				hz(at.NearLineDetuning), at.NearLine, budget.FarDetuningFactor))
		} else {
			add("scattering rate", budget.FormatNumber(at.ScatteringRate)+" photons/s")
		}
		add("optical depth b0", budget.FormatNumber(at.OpticalDepth))
		if d := at.Dipole; d != nil {
			add("dipole potential U/k_B", budget.FormatSI(d.Depth/atoms.KB, "K")+" (counter-rotating terms kept)")
			if !math.IsNaN(d.TrapX) {
				axial := "none along the beam"
				if !math.IsNaN(d.TrapAxial) {
					axial = hz(d.TrapAxial)
				}
				add("trap frequencies x, y, axial", hz(d.TrapX)+", "+hz(d.TrapY)+", "+axial)
			}
		}
		sec.Blocks = append(sec.Blocks, Block{Subheading: fmt.Sprintf("Path %q, element %d at %s", at.Path.Path.Name, e.Index, budget.FormatLength(e.At))}, Block{Table: t})
		if g := at.Goal; g != nil {
			sec.Blocks = append(sec.Blocks, Block{Paragraph: goalSentence(at, g)})
			if g.Collective != nil && g.Impossible == "" {
				sec.Blocks = append(sec.Blocks, Block{Plot: collectivePlot(at, g)})
			}
		}
	}
	return sec
}

func goalSentence(at *budget.AtomsResult, g *budget.GoalResult) string {
	var what string
	switch g.Kind {
	case budget.GoalSaturation:
		what = "saturation s = " + budget.FormatNumber(g.Target)
	case budget.GoalRabi:
		what = "Rabi frequency Ω/2π = " + hz(g.Target)
	case budget.GoalTrapDepth:
		what = "trap depth U/k_B = " + budget.FormatSI(g.Target, "K")
	case budget.GoalCollective:
		c := g.Collective
		what = fmt.Sprintf("collective drive at %s × the threshold of cooperative resonance fluorescence, Ω_c/2π = %s (D = b0 = %s) to %s (D = b0/2), s_c = %s; photon-budget scale s = D = %s",
			budget.FormatNumber(g.Factor), hz(c.OmegaC), budget.FormatNumber(c.D), hz(c.OmegaCLow), budget.FormatNumber(c.SatC), budget.FormatNumber(c.PhotonBudgetSat))
	}
	if g.Impossible != "" {
		return fmt.Sprintf("Goal: %s. It cannot be met: %s.", what, g.Impossible)
	}
	verdict := "met"
	if !g.Met {
		verdict = "not met"
	}
	return fmt.Sprintf("Goal: %s. Needs %s at the cloud centre, %s at the atoms and %s at laser %q; operating power %s; margin %+.1f dB: %s.",
		what, budget.FormatIrradiance(g.Intensity), budget.FormatPower(g.PowerAtAtoms), budget.FormatPower(g.SourcePower), at.Path.Laser.Name,
		budget.FormatPower(g.Available), g.MarginDB, verdict)
}

// collectivePlot shows the source power needed against the multiple of the
// threshold, for the upper and lower threshold estimates, with the laser's
// operating power; power scales as the square of the Rabi frequency.
func collectivePlot(at *budget.AtomsResult, g *budget.GoalResult) *Plot {
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
	pl.Markers = []Marker{{X: g.Factor, Label: fmt.Sprintf("goal ×%s", budget.FormatNumber(g.Factor))}}
	return pl
}

func hazards(a *safety.Assessment) Section {
	h := a.Hazards
	sec := Section{Heading: "Hazards"}
	t := &Table{Header: []string{"path", "segment", "power", "eye irr.", "× MPE", "OD", "× skin MPE", "worst at", "NOHD"},
		Widths: []float64{1.3, 1.6, 1.1, 1.3, 1, 0.5, 1, 1, 1.6}, Right: []bool{false, false, true, true, true, true, true, true, true}}
	for _, e := range h.Exposures {
		seg := fmt.Sprintf("%d → %d", e.Segment.After, e.Segment.After+1)
		nohd := ""
		if e.OpenEnd {
			seg = fmt.Sprintf("after %d (open end)", e.Segment.After)
			nohd = safety.FormatDistance(e.NOHD)
		}
		t.Rows = append(t.Rows, []string{e.Path.Path.Name, seg, budget.FormatPower(e.Power), budget.FormatIrradiance(e.Irradiance),
			budget.FormatNumber(e.Ratio), budget.FormatNumber(e.OD), budget.FormatNumber(e.SkinRatio), budget.FormatLength(e.At), nohd})
	}
	sec.Blocks = append(sec.Blocks, Block{Subheading: "Open segments (worst point of each; irradiance averaged over the limiting aperture, at maximum power)"})
	if len(t.Rows) == 0 {
		sec.Blocks = append(sec.Blocks, Block{Paragraph: "No open segment carries light."})
	} else {
		sec.Blocks = append(sec.Blocks, Block{Table: t})
	}
	st := &Table{Header: []string{"path", "element", "surfaces", "R", "power each", "× MPE", "OD"}, Widths: []float64{1.4, 2, 1, 1.2, 1.3, 1, 0.6},
		Right: []bool{false, false, true, true, true, true, true}}
	dt := &Table{Header: []string{"path", "where", "power", "ρ", "hazard zone radius"}, Widths: []float64{1.4, 2.4, 1.3, 1.2, 1.8},
		Right: []bool{false, false, true, true, true}}
	for _, r := range h.Reflections {
		R := budget.FormatNumber(r.Reflectance)
		if r.Assumed {
			R += " (assumed)"
		}
		if r.Kind == safety.ReflectionStray || r.Kind == safety.ReflectionEscaping {
			if r.Kind == safety.ReflectionEscaping {
				R = "leaves the path: " + budget.FormatNumber(r.Reflectance)
			}
			st.Rows = append(st.Rows, []string{r.Path.Path.Name, fmt.Sprintf("%d %s", r.Element.Index, r.Element.Label()), fmt.Sprint(r.Surfaces), R,
				budget.FormatPower(r.Power), budget.FormatNumber(r.Ratio), budget.FormatNumber(r.OD)})
		} else {
			where := "open end"
			if r.Element != nil && r.Element.Type == budget.TypeDump {
				where = fmt.Sprintf("%d %s", r.Element.Index, r.Element.Label())
			}
			dt.Rows = append(dt.Rows, []string{r.Path.Path.Name, where, budget.FormatPower(r.Power), R, safety.FormatDistance(r.Radius)})
		}
	}
	sec.Blocks = append(sec.Blocks, Block{Subheading: "Stray reflections and beams leaving the path above the eye MPE (at the element)"})
	if len(st.Rows) == 0 {
		sec.Blocks = append(sec.Blocks, Block{Paragraph: "None of the surfaces reached through open segments reflects above the MPE."})
	} else {
		sec.Blocks = append(sec.Blocks, Block{Table: st})
	}
	sec.Blocks = append(sec.Blocks, Block{Subheading: "Diffuse reflections (Lambertian, viewed along the normal, small-source MPE: conservative)"})
	if len(dt.Rows) == 0 {
		sec.Blocks = append(sec.Blocks, Block{Paragraph: "No dump or path end is reached through an open segment."})
	} else {
		sec.Blocks = append(sec.Blocks, Block{Table: dt})
	}
	var findings []string
	for _, f := range a.Findings {
		where := ""
		if f.Path != "" {
			where = fmt.Sprintf("path %q: ", f.Path)
		}
		findings = append(findings, fmt.Sprintf("[%s] %s%s", f.Severity, where, f.Message))
	}
	if len(findings) == 0 {
		findings = []string{"No findings in what was evaluated, under the stated assumptions."}
	}
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

func eyewear(a *safety.Assessment) Section {
	t := &Table{Header: []string{"wavelength", "OD needed", "EN 207 (cw)", "declared eyewear"}, Widths: []float64{1.3, 1.1, 1.2, 4},
		Right: []bool{true, true, false, false}}
	for _, n := range a.Hazards.Eyewear {
		t.Rows = append(t.Rows, []string{nm(n.Wavelength), budget.FormatNumber(n.OD), n.EN207Label(), n.Coverage()})
	}
	sec := Section{Heading: "Eyewear"}
	if len(t.Rows) == 0 {
		sec.Blocks = []Block{{Paragraph: "No open exposure was found to set an optical density."}}
	} else {
		sec.Blocks = []Block{{Table: t}, {Paragraph: "OD is log10 of the largest exposure ratio at the wavelength, rounded up; the EN 207 scale number is given for continuous emission in 315–1400 nm."}}
	}
	return sec
}

func assumptions(a *safety.Assessment) Section {
	dur := safety.DurationAssumption(a.Setup)
	b := []string{
		"Standard: " + safety.Standard + ", Annex A, MPE at the cornea and for the skin; limits transcribed from memory of the standard's tables, to be checked against its text (see SAFETY.md).",
		"Exposure duration: " + dur + ".",
		"Viewing: intrabeam, small source (α ≤ 1.5 mrad); irradiance averaged over the limiting aperture (7 mm for 400–1400 nm); each laser at its maximum power.",
		"Segments: an element's following segment is open unless the setup says enclosed or vacuum (after a cloud it stays as before).",
		"Beams: Gaussian (embedded Gaussian for M² > 1) in two aligned planes; hard-edge diffraction, aberrations and thermal lensing are not modelled; losses not stated are taken as zero.",
		"Collective threshold: driven Dicke model with one collective decay channel, N Γ_c = D Γ / 4 with D the resonant optical depth along the drive; a planning estimate, uncertain by about a factor of 2.",
	}
	for _, d := range a.Hazards.DefaultsAssumed {
		b = append(b, "Default assumed: "+d+".")
	}
	return Section{Heading: "Assumptions", Blocks: []Block{{Bullets: b}}}
}

func cautions() Section {
	return Section{Heading: "Cautions", Blocks: []Block{{Bullets: view.Cautions},
		{Paragraph: "Alignment practice (common practice): reduce the power for alignment, use viewing cards and cameras rather than eyes, keep beams horizontal at table height and below eye level, terminate every beam in a rated dump, remove reflective jewellery and watches, and wear the specified eyewear. Follow the laser safety officer, local regulations and the institution's procedures where they say otherwise."}}}
}

func signOff() Section {
	return Section{Heading: "Sign-off", Blocks: []Block{{SignOff: SignOffRoles}}}
}
