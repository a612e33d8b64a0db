package view

import (
	"fmt"
	"math"
	"strings"
	"sync"

	"beamledger/budget"
	"beamledger/budget/atoms"
	"beamledger/safety"
)

// Build makes the view of an assessment: the JSON document and the sections
// people read, from one pass over the results.
func Build(a *safety.Assessment) *Doc {
	s := a.Setup
	d := &Doc{JSON: &Record{}}
	setup := &Record{}
	setup.F(Str("file", "setup file", s.File, "")).F(Str("title", "title", s.Meta.Title, "")).F(Str("site", "site", s.Meta.Site, "")).
		F(Str("prepared_by", "prepared by", s.Meta.PreparedBy, "")).F(Str("revision", "revision", s.Meta.Revision, ""))
	d.JSON.O("setup", setup, false)
	d.JSON.F(Str("power_basis", "powers", "operating_power", ""))
	title := s.Meta.Title
	if title == "" {
		title = "(untitled setup)"
	}
	if s.Meta.Revision != "" {
		title += " — " + s.Meta.Revision
	}
	// The lists are independent: build them on two cores, assembled in a
	// fixed order, so the output does not depend on timing.
	var (
		paths, atomsL, balances, findings *List
		hz                                hazardView
		wg                                sync.WaitGroup
	)
	wg.Add(1)
	go func() {
		defer wg.Done()
		hz = hazards(a)
		findings = findingsList(a)
	}()
	paths, atomsL, balances = pathsList(a), atomsList(a), balancesList(a)
	wg.Wait()
	d.JSON.L(paths)
	d.Sections = append(d.Sections, Section{Blocks: []Block{{Line: title}, {Line: "setup file: " + s.File}, {List: paths}}})

	d.JSON.L(atomsL)
	if len(atomsL.Records) > 0 {
		d.Sections = append(d.Sections, Section{Heading: "At the atoms", Blocks: []Block{{Indent: 1, List: atomsL}}})
	}

	d.JSON.Members = append(d.JSON.Members, hz.json.Members...)
	d.JSON.L(balances)
	d.JSON.F(Whole("assumed_lossless_elements", "elements assumed lossless", a.Budget.AssumedLossless, "Budget.AssumedLossless"))
	d.JSON.L(findings)
	d.JSON.F(Flag("needs_action", "needs action", a.NeedsAction(), yesNo(a.NeedsAction()), ""))

	d.Sections = append(d.Sections, Section{Heading: "Power balance per laser (fractions of the source; they sum to 100 %)", Blocks: []Block{{Indent: 1, List: balances}}})
	d.Sections = append(d.Sections, hz.section)
	d.Sections = append(d.Sections, Section{Heading: "Findings", Blocks: []Block{{Indent: 1, List: findings}}})
	return d
}

func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "no"
}

// pathsList is every path's budget: its start, every element, its open end.
func pathsList(a *safety.Assessment) *List {
	l := &List{Key: "paths", Gap: true}
	for _, pb := range a.Budget.Paths {
		l.Records = append(l.Records, pathRecord(pb))
	}
	return l
}

func pathRecord(pb *budget.PathBudget) Record {
	p, las := pb.Path, pb.Laser
	op := las.OperatingPower
	r := Record{Members: make([]Member, 0, 16)}
	src := fmt.Sprintf("laser %q", las.Name)
	if p.Parent != nil {
		src = fmt.Sprintf("the other port of %q on path %q (laser %q)", p.ParentPort.Name, p.Parent.Name, las.Name)
	}
	sx, sy := pb.Start.Radii()
	startP := pb.StartFraction * op
	r.F(Str("name", "path", p.Name, "Path.Name")).F(Str("from", "from", p.From, "Path.From")).F(Str("laser", "laser", las.Name, "Laser.Name")).
		F(Num("wavelength_m", "wavelength", las.Wavelength, fmt.Sprintf("%.2f nm", las.Wavelength*1e9), "Laser.Wavelength")).
		F(Pow("operating_power_w", "operating power", op, "Laser.OperatingPower")).
		F(Pow("max_power_w", "maximum power", las.Power, "Laser.Power")).
		F(Pow("start_power_w", "power at the start", startP, "PathBudget.StartFraction")).
		F(Len("start_radius_x_m", "Wx at the start", sx, "PathBudget.Start")).
		F(Len("start_radius_y_m", "Wy at the start", sy, "PathBudget.Start"))
	r.F(Field{Key: "source", Label: "source", Kind: String, Text: src, People: true})
	r.Line(fmt.Sprintf("Path %q from {source}, {wavelength_m}", p.Name))
	r.Line("  powers at the operating power {operating_power_w} (maximum {max_power_w}); W = 1/e² radius arriving at the element; peak irradiance 2P/(πWxWy) on arrival")
	els := &List{Key: "elements", Columns: []string{"index", "element", "at_m", "radius_x_m", "radius_y_m", "power_in_w", "power_out_w", "peak_irradiance_w_m2", "cumulative_loss_db", "losses_here"}, Left: 2, Indent: 1}
	lead := &Record{}
	lead.F(Whole("index", "#", 0, "")).F(Field{Key: "element", Label: "element", Kind: String, Text: "start", People: true}).
		F(Field{Key: "at_m", Label: "at", Kind: Number, SI: 0, Text: "0 mm"}).
		F(Field{Key: "radius_x_m", Label: "Wx", Kind: Number, SI: sx, Text: budget.FormatLength(sx)}).
		F(Field{Key: "radius_y_m", Label: "Wy", Kind: Number, SI: sy, Text: budget.FormatLength(sy)}).
		F(Field{Key: "power_in_w", Label: "power in", Kind: Number, SI: math.NaN(), Text: ""}).
		F(Field{Key: "power_out_w", Label: "power out", Kind: Number, SI: startP, Text: budget.FormatPower(startP)}).
		F(Field{Key: "peak_irradiance_w_m2", Label: "peak irr.", Kind: Number, SI: pb.Start.PeakIrradiance(startP), Text: budget.FormatIrradiance(pb.Start.PeakIrradiance(startP))}).
		F(Field{Key: "cumulative_loss_db", Label: "loss dB", Kind: Number, Text: fmtDB(pb.StartFraction)}).
		F(Field{Key: "losses_here", Label: "losses here", Kind: String, Text: ""})
	els.Lead = lead
	for i := range pb.Rows {
		els.Records = append(els.Records, elementRecord(&pb.Rows[i], op))
	}
	r.L(els)
	r.F(Flag("open_end", "open end", pb.OpenEnd, yesNo(pb.OpenEnd), "PathBudget.OpenEnd"))
	endP := pb.EndFraction * op
	r.F(Pow("end_power_w", "power leaving the last element", endP, "PathBudget.EndFraction"))
	if pb.OpenEnd {
		ex, ey := pb.End.Radii()
		r.F(Field{Key: "end_radius_x_m", Label: "Wx at the end", Kind: Number, SI: ex, Text: budget.FormatLength(ex), People: true, Source: "PathBudget.End"})
		r.F(Field{Key: "end_radius_y_m", Label: "Wy at the end", Kind: Number, SI: ey, Text: budget.FormatLength(ey), People: true, Source: "PathBudget.End"})
		r.After = append(r.After, "  open end: {end_power_w} leaves the path (Wx {end_radius_x_m}, Wy {end_radius_y_m} after the last element)")
	}
	return r
}

// negligibleLoss is the fraction of the source below which the table does not
// list a loss (the JSON output and the balance keep it).
const negligibleLoss = 1e-9

func elementRecord(row *budget.Row, op float64) Record {
	e := row.Element
	wx, wy := row.BeamIn.Radii()
	r := Record{Members: make([]Member, 0, 20)}
	label := string(e.Type)
	if e.Name != "" {
		label += " " + e.Name
	}
	pin, pout := row.FractionIn*op, row.FractionOut*op
	peak := row.BeamIn.PeakIrradiance(pin)
	r.F(Whole("index", "#", e.Index, "Element.Index")).F(Str("name", "name", e.Name, "Element.Name")).
		F(Str("type", "type", string(e.Type), "Element.Type")).F(Field{Key: "element", Label: "element", Kind: String, Text: label, People: true}).
		F(Len("at_m", "at", e.At, "Element.At")).
		F(Len("radius_x_m", "Wx", wx, "Row.BeamIn")).F(Len("radius_y_m", "Wy", wy, "Row.BeamIn")).
		F(Plain("curvature_x_per_m", "1/R x (1/m)", row.BeamIn.X.Curvature(), "Row.BeamIn")).
		F(Plain("curvature_y_per_m", "1/R y (1/m)", row.BeamIn.Y.Curvature(), "Row.BeamIn")).
		F(Pow("power_in_w", "power in", pin, "Row.FractionIn")).
		F(Pow("power_out_w", "power out", pout, "Row.FractionOut")).
		F(Irr("peak_irradiance_w_m2", "peak irr.", peak, "Row.BeamIn"))
	if row.FractionOut > 0 {
		r.F(Num("cumulative_loss_db", "loss dB", -budget.Decibels(row.FractionOut), fmtDB(row.FractionOut), "Row.FractionOut"))
	} else {
		r.F(Field{Key: "cumulative_loss_db", Label: "loss dB", Kind: Number, SI: math.NaN(), Text: "—", Source: "Row.FractionOut"})
	}
	r.F(Plain("clip_transmission", "passing the aperture", row.ClipFraction, "Row.ClipFraction")).
		F(Flag("assumed_lossless", "assumed lossless", row.AssumedLossless, yesNo(row.AssumedLossless), "Row.AssumedLossless"))
	losses := &List{Key: "losses", Records: make([]Record, 0, len(row.Losses))}
	var here []string
	for _, l := range row.Losses {
		lr := Record{Members: make([]Member, 0, 2)}
		lr.F(Str("kind", "loss", l.Kind, "Loss.Kind")).F(Pow("power_w", "power", l.Fraction*op, "Loss.Fraction"))
		losses.Records = append(losses.Records, lr)
		if l.Fraction >= negligibleLoss {
			here = append(here, fmt.Sprintf("%s %s", l.Kind, budget.FormatPower(l.Fraction*op)))
		}
	}
	if row.AssumedLossless {
		here = append(here, "lossless (assumed)")
	}
	r.L(losses)
	r.F(Field{Key: "losses_here", Label: "losses here", Kind: String, Text: strings.Join(here, ", "), People: true})
	var fiber *Record
	if fc := row.Fiber; fc != nil {
		fiber = fiberRecord(row, fc)
	}
	r.O("fiber", fiber, true)
	if fiber != nil {
		r.After = append(r.After, fiber.Lines...)
		// the fibre's lines refer to its fields
		r.After = prefixKeys(r.After, "fiber.")
	}
	return r
}

// prefixKeys makes the {key}s of lines refer to a nested record.
func prefixKeys(lines []string, prefix string) []string {
	out := make([]string, len(lines))
	for i, l := range lines {
		for _, k := range Keys(l) {
			l = strings.ReplaceAll(l, "{"+k+"}", "{"+prefix+k+"}")
		}
		out[i] = l
	}
	return out
}

func fiberRecord(row *budget.Row, fc *budget.FiberCoupling) *Record {
	e := row.Element
	f := &Record{}
	f.F(Num("mode_overlap", "mode overlap", fc.Overlap, fmt.Sprintf("%.1f %%", 100*fc.Overlap), "FiberCoupling.Overlap")).
		F(Num("alignment", "alignment", fc.Alignment, fmt.Sprintf("%g", fc.Alignment), "FiberCoupling.Alignment")).
		F(Num("coupling", "coupling", fc.Coupling, fmt.Sprintf("%.1f %%", 100*fc.Coupling), "FiberCoupling.Coupling")).
		F(Flag("coupling_given", "coupling stated", fc.Given, yesNo(fc.Given), "FiberCoupling.Given")).
		F(Flag("upper_bound", "upper bound", fc.UpperBound, yesNo(fc.UpperBound), "FiberCoupling.UpperBound")).
		F(Len("ideal_focal_length_x_m", "ideal coupling-lens focal length x", fc.IdealFocalLength[0], "FiberCoupling.IdealFocalLength")).
		F(Len("ideal_focal_length_y_m", "ideal coupling-lens focal length y", fc.IdealFocalLength[1], "FiberCoupling.IdealFocalLength")).
		F(Len("ideal_focal_length_for_beam_at_m", "for the beam at", fc.LensAt, "FiberCoupling.LensAt"))
	f.F(Field{Key: "ideal_focal_lengths", Label: "ideal coupling-lens focal length", Kind: String, Text: budget.FormatFocalPair(fc.IdealFocalLength), People: true})
	f.F(Field{Key: "mode_field_diameter", Label: "mode-field diameter", Kind: Number, SI: e.ModeFieldDiameter, Text: budget.FormatLength(e.ModeFieldDiameter), People: true})
	head := fmt.Sprintf("fibre %d at %s: ", e.Index, budget.FormatLength(e.At))
	switch {
	case fc.Given:
		f.Line(head + "coupling {coupling} as stated")
	case fc.UpperBound:
		f.Line(head + "mode overlap {mode_overlap} with the {mode_field_diameter} mode-field diameter, no alignment factor given: {coupling} is an upper bound")
	default:
		f.Line(head + "mode overlap {mode_overlap} with the {mode_field_diameter} mode-field diameter × alignment {alignment} = {coupling}")
	}
	if !fc.Given && math.Max(row.BeamIn.X.M2, row.BeamIn.Y.M2) > 1 {
		f.Line("  M² > 1: the beam is taken as a Gaussian Schell-model beam (partially coherent Gaussian of the same size, curvature and M²)")
	}
	if e.ModeFieldDiameter > 0 {
		f.Line("  ideal coupling-lens focal length for the beam at {ideal_focal_length_for_beam_at_m}: {ideal_focal_lengths}")
	}
	return f
}

func balancesList(a *safety.Assessment) *List {
	l := &List{Key: "balances"}
	for _, bal := range a.Budget.Balances {
		op := bal.Laser.OperatingPower
		var r Record
		r.F(Str("laser", "laser", bal.Laser.Name, "LaserBalance.Laser")).
			F(Pow("source_power_w", "source power", op, "Laser.OperatingPower")).
			F(Num("dumped_w", "dumps", bal.Dumped*op, fmtPct(bal.Dumped), "LaserBalance.Dumped")).
			F(Num("leaving_w", "open ends", bal.Leaving*op, fmtPct(bal.Leaving), "LaserBalance.Leaving"))
		lost := &Record{}
		parts := []string{"dumps {dumped_w}", "open ends {leaving_w}"}
		for _, k := range bal.LossKinds() {
			lost.F(Num(k, k, bal.Lost[k]*op, fmtPct(bal.Lost[k]), "LaserBalance.Lost"))
			parts = append(parts, k+" {losses_w."+k+"}")
		}
		r.O("losses_w", lost, false)
		r.F(Num("total_w", "total", bal.Total()*op, fmtPct(bal.Total()), "LaserBalance.Total"))
		r.Line(fmt.Sprintf("%s: %s; total {total_w}", bal.Laser.Name, strings.Join(parts, ", ")))
		l.Records = append(l.Records, r)
	}
	return l
}

func findingsList(a *safety.Assessment) *List {
	l := &List{Key: "findings", Empty: "none in what was evaluated (see the assumptions above)"}
	for _, f := range a.Findings {
		r := Record{Members: make([]Member, 0, 11)}
		r.F(Str("severity", "severity", string(f.Severity), "Finding.Severity")).F(Str("kind", "kind", string(f.Kind), "Finding.Kind")).
			F(Str("path", "path", f.Path, "Finding.Path")).F(Whole("element", "element", f.Element, "Finding.Element")).
			F(Len("at_m", "at", f.At, "Finding.At")).F(Str("message", "message", f.Message, "Finding.Message"))
		if f.Unit != "" {
			r.F(Num("value_si", "value", f.Value, budget.FormatNumber(f.Value)+" "+f.Unit, "Finding.Value")).
				F(Num("limit_si", "limit", f.Limit, budget.FormatNumber(f.Limit)+" "+f.Unit, "Finding.Limit")).
				F(Str("unit", "unit", f.Unit, "Finding.Unit")).
				F(Plain("ratio", "ratio", f.Ratio(), "Finding.Ratio"))
		}
		where := ""
		if f.Path != "" {
			where = fmt.Sprintf("path %q: ", f.Path)
		}
		r.F(Field{Key: "where", Label: "where", Kind: String, Text: where, People: true})
		r.Line(fmt.Sprintf("[%s] {where}{message}", f.Severity))
		l.Records = append(l.Records, r)
	}
	return l
}

func fmtPct(f float64) string { return fmt.Sprintf("%.2f %%", 100*f) }

func fmtDB(f float64) string {
	if f <= 0 {
		return "—"
	}
	db := -budget.Decibels(f)
	if math.Abs(db) < 0.005 {
		db = 0
	}
	return fmt.Sprintf("%.2f", db)
}

func hz(ω float64) string { return budget.FormatFrequency(ω / (2 * math.Pi)) }

func fmtG(v float64) string { return budget.FormatNumber(v) }

// Constants for display conversions (CODATA, via package atoms).
var (
	kB      = atoms.KB
	hPlanck = atoms.H
)
