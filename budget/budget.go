package budget

import (
	"fmt"
	"math"
	"sort"
)

// Loss kinds, each a named way power leaves a beam path.
const (
	LossClipping     = "clipping"              // outside a clear aperture
	LossAbsorption   = "absorption/reflection" // an element's stated transmission
	LossMirror       = "mirror leakage"        // 1 − reflectivity
	LossDiffraction  = "undiffracted light"    // an AOM's other orders
	LossFilter       = "filter"                // optical density
	LossSplitterPort = "splitter port"         // the other port of a splitter, not followed by any path
	LossCoupling     = "fibre coupling"        // not coupled into the fibre mode
	LossDump         = "dump"                  // absorbed in a beam dump
)

// Loss is power leaving the path at an element, as a fraction of the source's
// power.
type Loss struct {
	Kind     string
	Fraction float64
}

// Row is the budget at one element.
type Row struct {
	Element *Element
	// BeamIn is the beam arriving at the element; BeamOut the beam leaving it.
	BeamIn, BeamOut Beam
	// FractionIn and FractionOut are the power arriving and leaving as
	// fractions of the source's power.
	FractionIn, FractionOut float64
	Losses                  []Loss
	// AssumedLossless is set when the element's loss was not stated.
	AssumedLossless bool
	// ClipFraction is the part passing the clear aperture (1 if none).
	ClipFraction float64
	Fiber        *FiberCoupling
}

// FiberCoupling records how a fibre's coupling was found.
type FiberCoupling struct {
	Overlap   float64 // computed mode overlap (NaN when coupling was given)
	Alignment float64 // factor applied to the overlap
	Coupling  float64 // fraction coupled into the fibre
	Given     bool    // coupling was stated, not computed
	// UpperBound is set when no alignment factor was given.
	UpperBound bool
	// IdealFocalLength is the coupling-lens focal length in x and y for the
	// beam arriving at the coupling lens (NaN where none can reach the mode), m.
	IdealFocalLength [2]float64
	// LensAt is where that beam was taken: the nearest lens before the
	// fibre, or the fibre face when there is none, m.
	LensAt float64
}

// Segment is free space between two points of a path.
type Segment struct {
	From, To float64 // positions along the path, m; To is +Inf past an open end
	After    int     // index of the element it follows (0: the path start)
	Beam     Beam    // at From
	Fraction float64 // power in the segment, fraction of the source
	Access   Access
}

// PathBudget is the budget of one path.
type PathBudget struct {
	Path          *Path
	Laser         *Laser
	StartFraction float64
	Start         Beam
	Rows          []Row
	Segments      []Segment
	// EndFraction is the power leaving the last element.
	EndFraction float64
	// OpenEnd is set when the path does not end in a dump.
	OpenEnd bool
	End     Beam
	// UnfollowedPorts lists splitters whose other port no path follows.
	UnfollowedPorts []*Element
}

// LaserBalance accounts for all the power of one source.
type LaserBalance struct {
	Laser   *Laser
	Dumped  float64 // fraction absorbed in dumps
	Leaving float64 // fraction leaving open path ends
	Lost    map[string]float64
}

// Total is dumped + leaving + all named losses; it equals 1 when the budget
// closes (unfollowed splitter ports are counted as losses).
func (b LaserBalance) Total() float64 {
	t := b.Dumped + b.Leaving
	for _, k := range b.LossKinds() {
		t += b.Lost[k]
	}
	return t
}

// LossKinds lists the kinds of loss in a fixed (sorted) order, so that sums
// and output do not depend on map order.
func (b LaserBalance) LossKinds() []string {
	kinds := make([]string, 0, len(b.Lost))
	for k := range b.Lost {
		kinds = append(kinds, k)
	}
	sort.Strings(kinds)
	return kinds
}

// Budget is the power and beam budget of a whole setup.
type Budget struct {
	Setup    *Setup
	Paths    []*PathBudget
	Balances []*LaserBalance
	// AssumedLossless counts the elements whose loss was not stated.
	AssumedLossless int
}

// Path returns the budget of the named path.
func (b *Budget) Path(name string) *PathBudget {
	for _, p := range b.Paths {
		if p.Path.Name == name {
			return p
		}
	}
	return nil
}

// Compute propagates every beam and accounts for its power.
func Compute(s *Setup) (*Budget, error) {
	out := &Budget{Setup: s}
	byPath := map[*Path]*PathBudget{}
	balances := map[*Laser]*LaserBalance{}
	for _, las := range s.Lasers {
		bal := &LaserBalance{Laser: las, Lost: map[string]float64{}}
		balances[las] = bal
		out.Balances = append(out.Balances, bal)
	}
	followed := map[*Element]*Path{}
	for _, p := range s.Paths {
		if p.ParentPort != nil {
			followed[p.ParentPort] = p
		}
	}
	// Paths in an order where every parent comes before its branches.
	var order []*Path
	done := map[*Path]bool{}
	var visit func(p *Path)
	visit = func(p *Path) {
		if done[p] {
			return
		}
		if p.Parent != nil {
			visit(p.Parent)
		}
		done[p] = true
		order = append(order, p)
	}
	for _, p := range s.Paths {
		visit(p)
	}
	for _, p := range order {
		pb := &PathBudget{Path: p, Laser: p.Laser}
		if p.Parent == nil {
			las := p.Laser
			pb.Start = Beam{
				Wavelength: las.Wavelength,
				X:          NewPlane(las.Waist[0], las.WaistAt, las.M2[0], las.Wavelength),
				Y:          NewPlane(las.Waist[1], las.WaistAt, las.M2[1], las.Wavelength),
			}
			pb.StartFraction = 1
		} else {
			parent := byPath[p.Parent]
			row := parent.row(p.ParentPort)
			pb.Start = row.BeamOut
			pb.StartFraction = row.FractionIn * row.ClipFraction * (1 - *p.ParentPort.Transmission)
		}
		if err := pb.propagate(s.File, followed); err != nil {
			return nil, err
		}
		byPath[p] = pb
		out.Paths = append(out.Paths, pb)
		bal := balances[p.Laser]
		for _, r := range pb.Rows {
			if r.AssumedLossless {
				out.AssumedLossless++
			}
			for _, l := range r.Losses {
				if l.Kind == LossDump {
					bal.Dumped += l.Fraction
				} else {
					bal.Lost[l.Kind] += l.Fraction
				}
			}
		}
		if pb.OpenEnd {
			bal.Leaving += pb.EndFraction
		}
	}
	// Report paths in the order of the setup file.
	ordered := make([]*PathBudget, 0, len(s.Paths))
	for _, p := range s.Paths {
		ordered = append(ordered, byPath[p])
	}
	out.Paths = ordered
	return out, nil
}

func (pb *PathBudget) row(e *Element) *Row {
	for i := range pb.Rows {
		if pb.Rows[i].Element == e {
			return &pb.Rows[i]
		}
	}
	return nil
}

// propagate walks the path's elements.
func (pb *PathBudget) propagate(file string, followed map[*Element]*Path) error {
	p := pb.Path
	beam := pb.Start
	frac := pb.StartFraction
	pos := 0.0
	access := p.Access
	after := 0
	lastLens := -1
	for i, e := range p.Elements {
		seg := Segment{From: pos, To: e.At, After: after, Beam: beam, Fraction: frac, Access: access}
		pb.Segments = append(pb.Segments, seg)
		beam = beam.Propagate(e.At - pos)
		pos = e.At
		row := Row{Element: e, BeamIn: beam, FractionIn: frac, ClipFraction: 1}
		lose := func(kind string, f float64) {
			if f > 0 {
				row.Losses = append(row.Losses, Loss{kind, f})
			}
		}
		// Clipping at the clear aperture (or the iris of an aperture element).
		clear := e.ClearAperture()
		if clear > 0 {
			wx, wy := beam.Radii()
			row.ClipFraction = CircleFraction(wx, wy, clear/2)
			lose(LossClipping, frac*(1-row.ClipFraction))
			frac *= row.ClipFraction
		}
		st := &stage{pb: pb, followed: followed, index: i, lastLens: lastLens, beam: beam, frac: frac, row: &row}
		kind, _ := KindOf(e.Type)
		kind.apply(st, e)
		beam, frac, lastLens = st.beam, st.frac, st.lastLens
		if !beam.Valid() {
			return &InputError{[]string{fmt.Sprintf("%s:%d: path %q, element %d (%s): the beam is not a finite Gaussian beam after this element; check its numbers", file, e.Line, p.Name, e.Index, e.Type)}}
		}
		row.BeamOut = beam
		row.FractionOut = frac
		pb.Rows = append(pb.Rows, row)
		// The segment after an element is open unless the element says
		// otherwise; after a cloud it stays as it was (the atoms sit in their
		// chamber). Open is the conservative reading for hazards.
		switch {
		case e.Access != "":
			access = e.Access
		case e.Type != TypeAtoms:
			access = AccessOpen
		}
		after = e.Index
	}
	pb.EndFraction = frac
	pb.End = beam
	last := len(p.Elements) - 1
	pb.OpenEnd = last < 0 || p.Elements[last].Type != TypeDump
	if pb.OpenEnd {
		pb.Segments = append(pb.Segments, Segment{From: pos, To: math.Inf(1), After: after, Beam: beam, Fraction: frac, Access: access})
	}
	return nil
}

// couple finds the fibre coupling at element e for the arriving beam.
func (pb *PathBudget) couple(e *Element, beam Beam, lastLens int) *FiberCoupling {
	fc := &FiberCoupling{Overlap: math.NaN(), Alignment: 1}
	if e.Coupling != nil {
		fc.Coupling, fc.Given = *e.Coupling, true
	} else {
		fc.Overlap = FiberOverlap(beam, e.ModeFieldDiameter)
		if e.Alignment != nil {
			fc.Alignment = *e.Alignment
		} else {
			fc.UpperBound = true
		}
		fc.Coupling = fc.Overlap * fc.Alignment
	}
	fc.IdealFocalLength = [2]float64{math.NaN(), math.NaN()}
	if e.ModeFieldDiameter > 0 {
		at := beam
		fc.LensAt = e.At
		if lastLens >= 0 {
			at = pb.Rows[lastLens].BeamIn
			fc.LensAt = pb.Rows[lastLens].Element.At
		}
		fc.IdealFocalLength[0] = IdealCouplingFocalLength(at.X, at.Wavelength, e.ModeFieldDiameter/2)
		fc.IdealFocalLength[1] = IdealCouplingFocalLength(at.Y, at.Wavelength, e.ModeFieldDiameter/2)
	}
	return fc
}
