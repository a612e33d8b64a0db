package render

import (
	"fmt"
	"io"
	"math"
	"strings"

	"beamledger/budget"
	"beamledger/budget/atoms"
	"beamledger/safety"
)

// Text writes the assessment for the terminal.
func Text(w io.Writer, a *safety.Assessment) error {
	ew := &errWriter{w: w}
	s := a.Setup
	title := s.Meta.Title
	if title == "" {
		title = "(untitled setup)"
	}
	ew.printf("%s", title)
	if s.Meta.Revision != "" {
		ew.printf(" — %s", s.Meta.Revision)
	}
	ew.printf("\nsetup file: %s\n", s.File)
	for _, pb := range a.Budget.Paths {
		ew.printf("\n")
		writePath(ew, pb)
	}
	if len(a.Atoms) > 0 {
		ew.printf("\nAt the atoms\n")
		for _, at := range a.Atoms {
			writeAtoms(ew, at)
		}
	}
	ew.printf("\nPower balance per laser (fractions of the source; they sum to 100 %%)\n")
	for _, bal := range a.Budget.Balances {
		writeBalance(ew, bal)
	}
	writeHazards(ew, a)
	ew.printf("\nFindings\n")
	if len(a.Findings) == 0 {
		ew.printf("  none in what was evaluated (see the assumptions above)\n")
	}
	for _, f := range a.Findings {
		where := ""
		if f.Path != "" {
			where = fmt.Sprintf("path %q: ", f.Path)
		}
		ew.printf("  [%s] %s%s\n", f.Severity, where, f.Message)
	}
	return ew.err
}

func writePath(ew *errWriter, pb *budget.PathBudget) {
	p, las := pb.Path, pb.Laser
	op := las.OperatingPower
	src := fmt.Sprintf("laser %q", las.Name)
	if p.Parent != nil {
		src = fmt.Sprintf("the other port of %q on path %q (laser %q)", p.ParentPort.Name, p.Parent.Name, las.Name)
	}
	ew.printf("Path %q from %s, %s nm\n", p.Name, src, fmtFixed(las.Wavelength*1e9, 2))
	ew.printf("  powers at the operating power %s (maximum %s); W = 1/e² radius arriving at the element; peak irradiance 2P/(πWxWy) on arrival\n",
		budget.FormatPower(op), budget.FormatPower(las.Power))
	t := &table{left: 2, lastLeft: true}
	t.add("#", "element", "at", "Wx", "Wy", "power in", "power out", "peak irr.", "loss dB", "losses here")
	wx, wy := pb.Start.Radii()
	t.add("0", "start", "0 mm", budget.FormatLength(wx), budget.FormatLength(wy), "", budget.FormatPower(pb.StartFraction*op),
		budget.FormatIrradiance(pb.Start.PeakIrradiance(pb.StartFraction*op)), fmtDB(pb.StartFraction), "")
	for _, r := range pb.Rows {
		e := r.Element
		wx, wy := r.BeamIn.Radii()
		label := string(e.Type)
		if e.Name != "" {
			label += " " + e.Name
		}
		var losses []string
		for _, l := range r.Losses {
			if l.Fraction < negligibleLoss {
				continue
			}
			losses = append(losses, fmt.Sprintf("%s %s", l.Kind, budget.FormatPower(l.Fraction*op)))
		}
		if r.AssumedLossless {
			losses = append(losses, "lossless (assumed)")
		}
		t.add(fmt.Sprint(e.Index), label, budget.FormatLength(e.At), budget.FormatLength(wx), budget.FormatLength(wy),
			budget.FormatPower(r.FractionIn*op), budget.FormatPower(r.FractionOut*op),
			budget.FormatIrradiance(r.BeamIn.PeakIrradiance(r.FractionIn*op)), fmtDB(r.FractionOut), strings.Join(losses, ", "))
	}
	t.write(ew, "  ")
	for _, r := range pb.Rows {
		if fc := r.Fiber; fc != nil {
			e := r.Element
			if fc.Given {
				ew.printf("  fibre %d at %s: coupling %.1f %% as stated\n", e.Index, budget.FormatLength(e.At), 100*fc.Coupling)
			} else {
				ew.printf("  fibre %d at %s: mode overlap %.1f %% with the %s mode-field diameter", e.Index, budget.FormatLength(e.At), 100*fc.Overlap, budget.FormatLength(e.ModeFieldDiameter))
				if fc.UpperBound {
					ew.printf(", no alignment factor given: %.1f %% is an upper bound\n", 100*fc.Coupling)
				} else {
					ew.printf(" × alignment %g = %.1f %%\n", fc.Alignment, 100*fc.Coupling)
				}
				if m := math.Max(r.BeamIn.X.M2, r.BeamIn.Y.M2); m > 1 {
					ew.printf("    M² > 1: the beam is taken as a Gaussian Schell-model beam (partially coherent Gaussian of the same size, curvature and M²)\n")
				}
			}
			if e.ModeFieldDiameter > 0 {
				ew.printf("    ideal coupling-lens focal length for the beam at %s: %s\n", budget.FormatLength(fc.LensAt), budget.FormatFocalPair(fc.IdealFocalLength))
			}
		}
	}
	if pb.OpenEnd {
		ex, ey := pb.End.Radii()
		ew.printf("  open end: %s leaves the path (Wx %s, Wy %s after the last element)\n", budget.FormatPower(pb.EndFraction*op), budget.FormatLength(ex), budget.FormatLength(ey))
	}
}

func writeBalance(ew *errWriter, bal *budget.LaserBalance) {
	kinds := bal.LossKinds()
	parts := []string{fmt.Sprintf("dumps %s", fmtPct(bal.Dumped)), fmt.Sprintf("open ends %s", fmtPct(bal.Leaving))}
	for _, k := range kinds {
		parts = append(parts, fmt.Sprintf("%s %s", k, fmtPct(bal.Lost[k])))
	}
	ew.printf("  %s: %s; total %s\n", bal.Laser.Name, strings.Join(parts, ", "), fmtPct(bal.Total()))
}

// negligibleLoss is the fraction of the source below which the table does not
// list a loss (the JSON output and the balance keep it).
const negligibleLoss = 1e-9

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

func fmtFixed(v float64, decimals int) string { return fmt.Sprintf("%.*f", decimals, v) }

type errWriter struct {
	w   io.Writer
	err error
}

func (e *errWriter) Write(p []byte) (int, error) {
	if e.err != nil {
		return 0, e.err
	}
	n, err := e.w.Write(p)
	e.err = err
	return n, err
}

func (e *errWriter) printf(format string, args ...any) { fmt.Fprintf(e, format, args...) }

// Constants for display conversions (CODATA, via package atoms).
var (
	kB      = atoms.KB
	hPlanck = atoms.H
)
