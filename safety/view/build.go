package view

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"sync"

	"beamledger/budget"
	"beamledger/budget/atoms"
	"beamledger/budget/drive"
	"beamledger/budget/setup"
	"beamledger/budget/units"
	"beamledger/safety"
)

// builder hands out the members of records from large shared blocks, so
// that a record costs no allocation of its own. One builder serves one
// goroutine.
type builder struct {
	slab []Member
	tol  map[any]*drive.GoalTolerance
}

// slabSize is the number of members allocated at once.
const slabSize = 512

// members returns an empty slice with room for n members. Appending past n
// moves the record's members to an allocation of their own, so records never
// share space.
func (b *builder) members(n int) []Member {
	if cap(b.slab)-len(b.slab) < n {
		b.slab = make([]Member, 0, max(slabSize, n))
	}
	k := len(b.slab)
	b.slab = b.slab[:k+n]
	return b.slab[k : k : k+n]
}

// parallelPaths is the number of paths from which Build uses two cores.
const parallelPaths = 64

// Build makes the view of an assessment: the JSON document and the sections
// people read, from one pass over the results.
func Build(a *safety.Assessment) *Doc {
	s := a.Setup
	b := &builder{tol: a.Tolerances}
	d := &Doc{JSON: &Record{Members: b.members(16)}}
	setup := &Record{}
	setup.F(Str(dFile, s.File)).F(Str(dTitle, s.Meta.Title)).F(Str(dSite, s.Meta.Site)).
		F(Str(dPreparedBy, s.Meta.PreparedBy)).F(Str(dRevision, s.Meta.Revision))
	d.JSON.O("setup", setup, false)
	so := &Record{}
	so.F(StrList(dSignoffConditions, s.SignOff.Conditions)).F(Str(dSignoffReview, s.SignOff.Review))
	d.JSON.O("signoff", so, false)
	d.JSON.F(Str(dPowerBasis, "operating_power"))
	title := s.Meta.Title
	if title == "" {
		title = "(untitled setup)"
	}
	if s.Meta.Revision != "" {
		title += " — " + s.Meta.Revision
	}
	// The lists are independent: for a large setup, build them on two
	// cores, assembled in a fixed order, so the output does not depend on
	// timing. A small one is done sooner on one.
	var (
		paths, atomsL, balances, findings *List
		hz                                hazardView
		wg                                sync.WaitGroup
	)
	second := func(b *builder) {
		hz = b.hazards(a)
		findings = b.findingsList(a)
	}
	if len(a.Budget.Paths) < parallelPaths {
		second(b)
	} else {
		wg.Add(1)
		go func() {
			defer wg.Done()
			second(&builder{})
		}()
	}
	paths, atomsL, balances = b.pathsList(a), b.atomsList(a), b.balancesList(a)
	wg.Wait()
	d.JSON.L(paths)
	head := []Block{{Line: title}, {Line: "setup file: " + s.File}}
	if s.SignOff.Review != "" {
		head = append(head, Block{Line: "review by: " + s.SignOff.Review})
	}
	for _, c := range s.SignOff.Conditions {
		head = append(head, Block{Line: "officer's condition: " + c})
	}
	d.Sections = append(d.Sections, Section{Blocks: append(head, Block{List: paths})})

	d.JSON.L(atomsL)
	if len(atomsL.Records) > 0 {
		d.Sections = append(d.Sections, Section{Heading: "At the atoms", Blocks: []Block{{Indent: 1, List: atomsL}}})
	}
	clouds := b.cloudsList(a)
	d.JSON.L(clouds)
	if len(clouds.Records) > 0 {
		d.Sections = append(d.Sections, Section{Heading: "At each cloud, every beam counted together (cloud frame: x, y, z of rms_size)", Blocks: []Block{{Indent: 1, List: clouds}}})
	}

	d.JSON.Members = append(d.JSON.Members, hz.json.Members...)
	d.JSON.L(balances)
	d.JSON.F(Whole(dAssumedLosslessElements, a.Budget.AssumedLossless))
	d.JSON.L(findings)
	d.JSON.F(Flag(dNeedsAction, a.NeedsAction(), yesNo(a.NeedsAction())))

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
func (b *builder) pathsList(a *safety.Assessment) *List {
	l := &List{Key: "paths", Gap: true, Records: make([]Record, 0, len(a.Budget.Paths))}
	for _, pb := range a.Budget.Paths {
		l.Records = append(l.Records, b.pathRecord(pb))
	}
	return l
}

func (b *builder) pathRecord(pb *budget.PathBudget) Record {
	p, las := pb.Path, pb.Laser
	op := las.OperatingPower
	r := Record{Members: b.members(16)}
	src := fmt.Sprintf("laser %q", las.Name)
	if p.Parent != nil {
		src = fmt.Sprintf("the other port of %q on path %q (laser %q)", p.ParentPort.Name, p.Parent.Name, las.Name)
	}
	sx, sy := pb.Start.Radii()
	startP := pb.StartFraction * op
	r.F(Str(dPathName, p.Name)).F(Str(dFrom, p.From)).F(Str(dLaserRef, las.Name)).
		F(Num(dLaserWavelengthM, las.Wavelength, units.FormatWavelength(las.Wavelength))).
		F(Pow(dLaserOperatingPowerW, op)).
		F(Pow(dMaxPowerW, las.Power)).
		F(Pow(dStartPowerW, startP)).
		F(Len(dStartRadiusXM, sx)).
		F(Len(dStartRadiusYM, sy))
	r.F(Field{d: dSource, Kind: String, Text: src, People: true})
	r.Line(fmt.Sprintf("Path %q from {source}, {wavelength_m}", p.Name))
	r.Line("  powers at the operating power {operating_power_w} (maximum {max_power_w}); W = 1/e² radius arriving at the element; peak irradiance 2P/(πWxWy) on arrival")
	if las.Emission == setup.EmissionPulsed {
		r.F(Num(dPulsePeakFactor, 1/(las.RepetitionRate*las.PulseDuration), fmtG(1/(las.RepetitionRate*las.PulseDuration))))
		r.Line("  pulsed source: powers and peak irradiances here are of the average power; during a pulse the irradiance is {pulse_peak_factor} times higher (1/(f τ), rectangular pulse)")
	}
	els := b.elementsList(pb, op, "start")
	r.L(els)
	joined := &List{Key: "joined", Indent: 1, Records: make([]Record, 0, len(pb.Joined))}
	for _, jb := range pb.Joined {
		jr := Record{Members: b.members(6)}
		jop := jb.Laser.OperatingPower
		how := "from the path's start (the splitter feeding the path carries it)"
		if jb.Combiner != nil {
			how = "at combiner " + strconv.Quote(jb.Combiner.Label())
		}
		jr.F(Str(dPathBudgetLaser, jb.Laser.Name)).
			F(Num(dLaserLambdaM, jb.Laser.Wavelength, units.FormatWavelength(jb.Laser.Wavelength))).
			F(Len(dJoinedAtM, jb.JoinedAt)).
			F(Pow(dLaserOperatingPowerW, jop)).
			F(Field{d: dJoinedHow, Kind: String, Text: how, People: true})
		jr.Line("beam of laser {laser} ({wavelength_m}, operating power {operating_power_w}) joins at {joined_at_m}, {how}:")
		jr.L(b.elementsList(jb, jop, "joins"))
		joined.Records = append(joined.Records, jr)
	}
	r.L(joined)
	if p.IntoPath != nil {
		r.F(Str(dInto, p.Into)).F(Len(dIntoAtM, p.IntoAt))
		r.After = append(r.After, "  goes into {into} at {into_at_m}: {end_power_w} arrives at the combiner")
	} else {
		r.F(Absent(dInto, true)).F(Absent(dIntoAtM, true))
	}
	r.F(Flag(dPathBudgetOpenEnd, pb.OpenEnd, yesNo(pb.OpenEnd)))
	endP := pb.EndFraction * op
	r.F(Pow(dEndPowerW, endP))
	if pb.OpenEnd {
		ex, ey := pb.End.Radii()
		r.F(Field{d: dEndRadiusXM, Kind: Number, SI: ex, Text: units.FormatLength(ex), People: true})
		r.F(Field{d: dEndRadiusYM, Kind: Number, SI: ey, Text: units.FormatLength(ey), People: true})
		r.After = append(r.After, "  open end: {end_power_w} leaves the path (Wx {end_radius_x_m}, Wy {end_radius_y_m} after the last element)")
	}
	return r
}

// negligibleLoss is the fraction of the source below which the table does not
// list a loss (the JSON output and the balance keep it).
const negligibleLoss = 1e-9

// startAt writes where a beam starts on a path.
func startAt(at float64) string {
	if at == 0 {
		return "0 mm"
	}
	return units.FormatLength(at)
}

// elementsList is the table of one beam's elements, after a lead row at the
// beam's start on the path (lead names it: "start", or "joins" for a beam
// that joins at a combiner).
func (b *builder) elementsList(pb *budget.PathBudget, op float64, lead string) *List {
	sx, sy := pb.Start.Radii()
	startP := pb.StartFraction * op
	els := &List{Key: "elements", Columns: []string{"index", "element", "at_m", "radius_x_m", "radius_y_m", "power_in_w", "power_out_w", "peak_irradiance_w_m2", "cumulative_loss_db", "losses_here"}, Left: 2, Indent: 1, Records: make([]Record, 0, len(pb.Rows))}
	lr := &Record{Members: b.members(10)}
	lr.F(Whole(dRowIndex, 0)).F(Field{d: dElementLabel, Kind: String, Text: lead, People: true}).
		F(Field{d: dAtM, Kind: Number, SI: pb.JoinedAt, Text: startAt(pb.JoinedAt)}).
		F(Field{d: dRadiusXM, Kind: Number, SI: sx, Text: units.FormatLength(sx)}).
		F(Field{d: dRadiusYM, Kind: Number, SI: sy, Text: units.FormatLength(sy)}).
		F(Field{d: dPowerInW, Kind: Number, SI: math.NaN(), Text: ""}).
		F(Field{d: dPowerOutW, Kind: Number, SI: startP, Text: units.FormatPower(startP)}).
		F(Field{d: dPeakIrradianceWM2, Kind: Number, SI: pb.Start.PeakIrradiance(startP), Text: units.FormatIrradiance(pb.Start.PeakIrradiance(startP))}).
		F(Field{d: dCumulativeLossDb, Kind: Number, Text: fmtDB(pb.StartFraction)}).
		F(Field{d: dLossesHere, Kind: String, Text: ""})
	els.Lead = lr
	for i := range pb.Rows {
		els.Records = append(els.Records, b.elementRecord(&pb.Rows[i], op))
	}
	return els
}

func (b *builder) elementRecord(row *budget.Row, op float64) Record {
	e := row.Element
	wx, wy := row.BeamIn.Radii()
	r := Record{Members: b.members(20)}
	label := string(e.Type)
	if e.Name != "" {
		label += " " + e.Name
	}
	pin, pout := row.FractionIn*op, row.FractionOut*op
	peak := row.BeamIn.PeakIrradiance(pin)
	r.F(Whole(dElementIndex, e.Index)).F(Str(dElementName, e.Name)).
		F(Str(dType, string(e.Type))).F(Field{d: dElementLabel, Kind: String, Text: label, People: true}).
		F(Len(dElementAtM, e.At)).
		F(Len(dRowRadiusXM, wx)).F(Len(dRowRadiusYM, wy)).
		F(Plain(dCurvatureXPerM, row.BeamIn.X.Curvature())).
		F(Plain(dCurvatureYPerM, row.BeamIn.Y.Curvature())).
		F(Pow(dRowPowerInW, pin)).
		F(Pow(dRowPowerOutW, pout)).
		F(Irr(dRowPeakIrradianceWM2, peak))
	if row.FractionOut > 0 {
		r.F(Num(dRowCumulativeLossDb, -units.Decibels(row.FractionOut), fmtDB(row.FractionOut)))
	} else {
		r.F(Field{d: dRowCumulativeLossDb, Kind: Number, SI: math.NaN(), Text: "—"})
	}
	r.F(Plain(dClipTransmission, row.ClipFraction)).
		F(Flag(dAssumedLossless, row.AssumedLossless, yesNo(row.AssumedLossless)))
	losses := &List{Key: "losses", Records: make([]Record, 0, len(row.Losses))}
	var here []byte // "kind power, kind power"
	for _, l := range row.Losses {
		lr := Record{Members: b.members(2)}
		lr.F(Str(dLossKind, l.Kind)).F(Pow(dLossPowerW, l.Fraction*op))
		losses.Records = append(losses.Records, lr)
		if l.Fraction >= negligibleLoss {
			here = appendItem(here, l.Kind)
			here = units.AppendPower(append(here, ' '), l.Fraction*op)
		}
	}
	if row.AssumedLossless {
		here = appendItem(here, "lossless (assumed)")
	}
	r.L(losses)
	r.F(Field{d: dLossesHere, Kind: String, Text: string(here), People: true})
	var fiber *Record
	if fc := row.Fiber; fc != nil {
		fiber = b.fiberRecord(row, fc)
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

func (b *builder) fiberRecord(row *budget.Row, fc *budget.FiberCoupling) *Record {
	e := row.Element
	f := &Record{Members: b.members(10)}
	f.F(Num(dModeOverlap, fc.Overlap, fixed(100*fc.Overlap, 1, " %"))).
		F(Num(dAlignment, fc.Alignment, fmt.Sprintf("%g", fc.Alignment))).
		F(Num(dCoupling, fc.Coupling, fixed(100*fc.Coupling, 1, " %"))).
		F(Flag(dCouplingGiven, fc.Given, yesNo(fc.Given))).
		F(Flag(dUpperBound, fc.UpperBound, yesNo(fc.UpperBound))).
		F(Len(dIdealFocalLengthXM, fc.IdealFocalLength[0])).
		F(Len(dIdealFocalLengthYM, fc.IdealFocalLength[1])).
		F(Len(dIdealFocalLengthForBeamAtM, fc.LensAt))
	f.F(Field{d: dIdealFocalLengths, Kind: String, Text: budget.IdealText(fc), People: true})
	f.F(Str(dIdealFocalLengthNote, fc.IdealNote))
	f.F(Field{d: dModeFieldDiameter, Kind: Number, SI: e.ModeFieldDiameter, Text: units.FormatLength(e.ModeFieldDiameter), People: true})
	head := fmt.Sprintf("fibre %d at %s: ", e.Index, units.FormatLength(e.At))
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

func (b *builder) balancesList(a *safety.Assessment) *List {
	l := &List{Key: "balances", Records: make([]Record, 0, len(a.Budget.Balances))}
	for _, bal := range a.Budget.Balances {
		op := bal.Laser.OperatingPower
		var r Record
		r.F(Str(dLaserBalanceLaser, bal.Laser.Name)).
			F(Pow(dLaserSourcePowerW, op)).
			F(Num(dDumpedW, bal.Dumped*op, fmtPct(bal.Dumped))).
			F(Num(dLeavingW, bal.Leaving*op, fmtPct(bal.Leaving)))
		lost := &Record{}
		parts := []string{"dumps {dumped_w}", "open ends {leaving_w}"}
		for _, k := range bal.LossKinds() {
			lost.F(Num(&Desc{k, k, "LaserBalance.Lost"}, bal.Lost[k]*op, fmtPct(bal.Lost[k])))
			parts = append(parts, k+" {losses_w."+k+"}")
		}
		r.O("losses_w", lost, false)
		r.F(Num(dTotalW, bal.Total()*op, fmtPct(bal.Total())))
		r.Line(fmt.Sprintf("%s: %s; total {total_w}", bal.Laser.Name, strings.Join(parts, ", ")))
		l.Records = append(l.Records, r)
	}
	return l
}

// findingLines is the sentence of every finding (shared: records' lines are
// only read).
var findingLines = []string{"[{severity}] {where}{message}{control}"}

// groupedFindingLines is the sentence of a group of findings of one kind on
// one path: the count and the worst of them.
var groupedFindingLines = []string{"[{severity}] {where}{group}{message}{control}"}

// FindingGroups groups findings for people: findings of the same severity
// and kind on the same path share one line, with their count and the worst
// of them (the highest ratio to its limit; the first on a tie). It returns,
// for each finding, the size of its group at the group's worst member and 0
// at the others; a finding alone, or not on a path, counts 1.
func FindingGroups(fs []budget.Finding) []int {
	type key struct {
		sev     budget.Severity
		kind    budget.FindingKind
		path    string
		control string
	}
	n := make([]int, len(fs))
	worst := map[key]int{}
	count := map[key]int{}
	for i, f := range fs {
		if f.Path == "" {
			n[i] = 1
			continue
		}
		k := key{f.Severity, f.Kind, f.Path, safety.ControlText(f)}
		count[k]++
		if w, ok := worst[k]; !ok || f.Ratio() > fs[w].Ratio() {
			worst[k] = i
		}
	}
	for k, w := range worst {
		n[w] = count[k]
	}
	return n
}

func (b *builder) findingsList(a *safety.Assessment) *List {
	l := &List{Key: "findings", Empty: "none in what was evaluated (see the assumptions above)", Records: make([]Record, 0, len(a.Findings))}
	groups := FindingGroups(a.Findings)
	for i, f := range a.Findings {
		r := Record{Members: b.members(13)}
		r.F(Str(dSeverity, string(f.Severity))).F(Str(dFindingKind, string(f.Kind))).
			F(Str(dFindingPath, f.Path)).F(Whole(dFindingElement, f.Element)).
			F(Len(dFindingAtM, f.At)).F(Str(dMessage, f.Message))
		if f.Unit != "" {
			r.F(Num(dValueSi, f.Value, withUnit(f.Value, f.Unit))).
				F(Num(dLimitSi, f.Limit, withUnit(f.Limit, f.Unit))).
				F(Str(dUnit, f.Unit)).
				F(Plain(dFindingRatio, f.Ratio()))
		}
		where := ""
		if f.Path != "" {
			where = "path " + strconv.Quote(f.Path) + ": "
		}
		r.F(Field{d: dGoalWhereText, Kind: String, Text: where, People: true})
		control := ""
		if f.Severity == budget.SeverityHazard {
			r.F(StrList(dFindingControlledBy, f.ControlledBy))
			control = " — " + strings.ToUpper(safety.ControlText(f)[:1]) + safety.ControlText(f)[1:]
		}
		r.F(Field{d: dFindingControl, Kind: String, Text: control, People: true})
		switch n := groups[i]; {
		case n == 1:
			r.Lines = findingLines
		case n > 1:
			// The group's line stands at its worst member; JSON keeps
			// every finding.
			r.F(Field{d: dGroup, Kind: String, Text: strconv.Itoa(n) + " findings (" + KindWords(f.Kind) + "), each one in the JSON output; the worst: ", People: true})
			r.Lines = groupedFindingLines
		}
		l.Records = append(l.Records, r)
	}
	return l
}

// KindWords is a finding kind in words for people ("exposure above the
// MPE" for exposure_above_mpe); JSON keeps the kind itself.
func KindWords(k budget.FindingKind) string {
	w := strings.ReplaceAll(string(k), "_", " ")
	for _, r := range [][2]string{{"above mpe", "above the MPE"}, {"en207", "EN 207"}, {"in megawatts", "in megawatts (MW)"}} {
		w = strings.ReplaceAll(w, r[0], r[1])
	}
	return w
}

// appendItem appends an item to a list written "a, b, c".
func appendItem(list []byte, item string) []byte {
	if len(list) > 0 {
		list = append(list, ", "...)
	}
	return append(list, item...)
}

// withUnit writes a number and its unit: "3.2 W/m²".
func withUnit(v float64, unit string) string {
	b := units.AppendNumber(make([]byte, 0, 16+len(unit)), v)
	return string(append(append(b, ' '), unit...))
}

// fixed writes v with prec digits after the point, then the suffix.
func fixed(v float64, prec int, suffix string) string {
	b := strconv.AppendFloat(make([]byte, 0, 24+len(suffix)), v, 'f', prec, 64)
	return string(append(b, suffix...))
}

func fmtPct(f float64) string { return fixed(100*f, 2, " %") }

func fmtDB(f float64) string {
	if f <= 0 {
		return "—"
	}
	db := -units.Decibels(f)
	if math.Abs(db) < 0.005 {
		db = 0
	}
	return fixed(db, 2, "")
}

func hz(ω float64) string { return units.FormatFrequency(ω / (2 * math.Pi)) }

func fmtG(v float64) string { return units.FormatNumber(v) }

// Constants for display conversions (CODATA, via package atoms).
var (
	kB      = atoms.KB
	hPlanck = atoms.H
)
