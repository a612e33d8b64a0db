package view

import (
	"beamledger/budget"
	"beamledger/budget/atoms"
	"beamledger/budget/drive"
	"beamledger/budget/optics"
	"beamledger/budget/setup"
	"beamledger/budget/units"
	"beamledger/safety"
	"fmt"
	"math"
	"slices"
	"sort"
)

// Figures are the plots of an assessment, in the order of the view's lists:
// one PathFigures per path, one AtomsFigures per atoms element, one
// CloudFigures per cloud.
//
// The figures of the sign-off document: every plot's series and every
// number a drawing prints, built here from the assessment so that the
// document takes them, like its tables, from the view.
type Figures struct {
	Paths  []PathFigures
	Atoms  []AtomsFigures
	Clouds []CloudFigures
}

// PathFigures are a path's plots: the 1/e² radii along it and the power
// after each element.
type PathFigures struct {
	Heading     string
	Beam, Power *Plot
}

// AtomsFigures are the plots at one atoms element; a plot that does not
// apply is nil.
type AtomsFigures struct {
	Heading string
	// Collective: the source power against the threshold band (a
	// collective goal that can be met); Saturation: s through the cloud
	// (near-resonant light); Margins and Contributors: the goal's
	// tolerance analysis.
	Collective, Saturation, Margins *Plot
	Contributors                    [][]string
}

// CloudFigures are the plots of one cloud; a plot that does not apply is
// nil.
type CloudFigures struct {
	Heading string
	// Potential: the combined potential along the weakest escape direction
	// (a trap that was found); Margins and Contributors: the whole-cloud
	// goal's tolerance analysis.
	Potential, Margins *Plot
	Contributors       [][]string
}

// ContributorsHeader heads the table of a goal's toleranced inputs.
var ContributorsHeader = []string{"toleranced input", "share of the spread (SRC²/ΣSRC²)"}

// BuildFigures makes the plots of an assessment.
func BuildFigures(a *safety.Assessment) *Figures {
	f := &Figures{}
	for _, pb := range a.Budget.Paths {
		f.Paths = append(f.Paths, PathFigures{Heading: fmt.Sprintf("Path %q", pb.Path.Name), Beam: beamPlot(pb), Power: waterfall(pb)})
	}
	for _, at := range a.Atoms {
		e := at.Row.Element
		af := AtomsFigures{Heading: fmt.Sprintf("Path %q, element %d at %s", at.Path.Path.Name, e.Index, units.FormatLength(e.At))}
		if g := at.Goal; g != nil && g.Collective != nil && g.Impossible == "" {
			af.Collective = collectivePlot(at, g)
		}
		if !at.FarDetuned && at.NearLine == "" && at.Row.FractionIn > 0 && at.OpticalDepth > 0 {
			af.Saturation = saturationPlot(at)
		}
		if gt := a.Tolerances[at]; gt != nil {
			af.Margins, af.Contributors = marginHistogram(gt), contributorRows(gt)
		}
		f.Atoms = append(f.Atoms, af)
	}
	for _, cr := range a.Clouds {
		cf := CloudFigures{Heading: fmt.Sprintf("Cloud %q", cr.Cloud.Name)}
		if t := cr.Trap; t != nil && t.Found && len(t.Profile) > 0 {
			cf.Potential = potentialPlot(t)
		}
		if gt := a.Tolerances[cr.Cloud]; gt != nil {
			cf.Margins, cf.Contributors = marginHistogram(gt), contributorRows(gt)
		}
		f.Clouds = append(f.Clouds, cf)
	}
	return f
}

// potentialPlot is the combined potential along the weakest escape
// direction through the trap minimum, or along the way out over the
// lowest saddle where that lies off every straight line, gravity
// included, in mK.
func potentialPlot(t *drive.Trap) *Plot {
	pl := &Plot{Title: "combined potential along the weakest escape direction, through the trap minimum", XLabel: "distance from the minimum (mm)", YLabel: "U/k_B (mK)"}
	if t.Saddle != nil {
		pl.Title, pl.XLabel = "combined potential along the way out from the trap minimum over its lowest saddle", "distance along the way out (mm)"
	}
	var xs, ys []float64
	for _, p := range t.Profile {
		xs, ys = append(xs, p[0]*1e3), append(ys, p[1]*1e3)
	}
	pl.Series = append(pl.Series, Series{Name: "U/k_B, gravity included", X: xs, Y: ys})
	if t.Saddle != nil {
		// The way out's highest point is the saddle.
		top := 0
		for i := range ys {
			if ys[i] > ys[top] {
				top = i
			}
		}
		pl.Markers = append(pl.Markers, Marker{X: xs[top], Label: "saddle"})
	}
	return pl
}

// contributorRows lists the inputs' shares of a goal's spread.
func contributorRows(gt *drive.GoalTolerance) [][]string {
	var rows [][]string
	for _, c := range gt.Contributors {
		rows = append(rows, []string{c.Input.Label, fmt.Sprintf("%.0f %%", 100*c.Share)})
	}
	return rows
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
	// Grey draws the series in grey with a heavier line (another laser's
	// beam on the path), to tell it from the path's own in print.
	Grey bool
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
	// The other lasers' beams on the path, from where they join it.
	for _, q := range pb.Joined {
		if len(q.Segments) == 0 {
			continue
		}
		from := q.Segments[0].From
		var qx, qwx, qwy []float64
		for _, z := range zs {
			if z < from {
				continue
			}
			x, y := beamAt(q, z).Radii()
			qx, qwx, qwy = append(qx, z*1e3), append(qwx, x*1e3), append(qwy, y*1e3)
		}
		name := fmt.Sprintf("laser %q", q.Laser.Name)
		pl.Series = append(pl.Series, Series{Name: name + ", x plane", X: qx, Y: qwx, Grey: true}, Series{Name: name + ", y plane", X: qx, Y: qwy, Dashed: true, Grey: true})
	}
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
	for _, s := range pl.Series {
		if slices.ContainsFunc(s.Y, func(y float64) bool { return Plottable(y, true) }) {
			return pl
		}
	}
	return nil // nothing a log axis can show (s underflows to 0): no plot
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

// Drawn is what the drawings of the beam paths print besides the shape of
// the setup itself: each laser's title, and the eye-exposure ratios of the
// open segments and of the beams that leave a path at an element.
type Drawn struct {
	// Budget is the budget the hazards were evaluated on (each laser at its
	// maximum power); the drawings follow its paths.
	Budget *budget.Budget
	Lasers []DrawnLaser
	// SegmentRatio is, for each beam on a path, the combined eye-exposure
	// ratio of each open segment, by the element after which it starts.
	SegmentRatio map[*budget.PathBudget]map[int]float64
	// EscapingRatio is, for each beam on a path, the largest eye-exposure
	// ratio of a beam leaving at an element.
	EscapingRatio map[*budget.PathBudget]map[*setup.Element]float64
	// OpenEnd is, for each beam whose path ends open, the NOHD beyond the
	// end as printed ("NOHD 12 m"); DumpZone, for each beam, the nominal
	// hazard zone of the diffuse reflection at a dump ("zone r 47 mm").
	OpenEnd  map[*budget.PathBudget]string
	DumpZone map[*budget.PathBudget]map[*setup.Element]string
	// Changed marks, by path name and element number, the elements added
	// or changed since the previous revision (report --since); nil without.
	Changed map[string]map[int]bool
}

// DrawnLaser is one laser's drawing: the laser and its title (name,
// wavelength and class).
type DrawnLaser struct {
	Laser *setup.Laser
	Title string
}

// BuildDrawn gathers what the drawings print from an assessment.
func BuildDrawn(a *safety.Assessment) *Drawn {
	d := &Drawn{Budget: a.HazardBudget, SegmentRatio: map[*budget.PathBudget]map[int]float64{}, EscapingRatio: map[*budget.PathBudget]map[*setup.Element]float64{},
		OpenEnd: map[*budget.PathBudget]string{}, DumpZone: map[*budget.PathBudget]map[*setup.Element]string{}}
	for _, e := range a.Hazards.Exposures {
		if d.SegmentRatio[e.Path] == nil {
			d.SegmentRatio[e.Path] = map[int]float64{}
		}
		d.SegmentRatio[e.Path][e.Segment.After] = e.CombinedEyeRatio
		if e.OpenEnd {
			d.OpenEnd[e.Path] = "NOHD " + units.FormatDistance(e.NOHD, safety.MaxHazardDistance)
		}
	}
	for _, rf := range a.Hazards.Reflections {
		if rf.Kind == safety.ReflectionDiffuse && rf.Element != nil && rf.Element.Type == setup.TypeDump {
			if d.DumpZone[rf.Path] == nil {
				d.DumpZone[rf.Path] = map[*setup.Element]string{}
			}
			d.DumpZone[rf.Path][rf.Element] = "zone r " + units.FormatDistance(rf.Radius, safety.MaxHazardDistance)
		}
	}
	for _, rf := range a.Hazards.Reflections {
		if rf.Kind == safety.ReflectionEscaping {
			if d.EscapingRatio[rf.Path] == nil {
				d.EscapingRatio[rf.Path] = map[*setup.Element]float64{}
			}
			d.EscapingRatio[rf.Path][rf.Element] = math.Max(d.EscapingRatio[rf.Path][rf.Element], rf.Ratio)
		}
	}
	// The hazards' lasers, in the setup's order: with toleranced values
	// they are those of the hazards' own copy of the setup, the ones the
	// hazard budget's beams carry.
	for _, ll := range a.Hazards.Lasers {
		las := ll.Laser
		title := fmt.Sprintf("Laser %q, %s", las.Name, units.FormatWavelength(las.Wavelength))
		if ll.Class != "" {
			title += ", Class " + ll.Class
		}
		d.Lasers = append(d.Lasers, DrawnLaser{Laser: las, Title: title})
	}
	return d
}
