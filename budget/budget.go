package budget

import (
	"beamledger/budget/optics"
	"beamledger/budget/setup"
	"fmt"
	"math"
	"slices"
	"sort"
)

// Loss kinds, each a named way power leaves a beam path.
const (
	LossClipping     = "clipping"               // outside a clear aperture
	LossAbsorption   = "absorption/reflection"  // an element's stated transmission
	LossMirror       = "mirror leakage"         // 1 − reflectivity
	LossDiffraction  = "undiffracted light"     // an AOM's other orders
	LossFilter       = "filter"                 // optical density
	LossSplitterPort = "splitter port"          // the other port of a splitter, not followed by any path
	LossCoupling     = "fibre coupling"         // not coupled into the fibre mode
	LossDump         = "dump"                   // absorbed in a beam dump
	LossCombiner     = "combiner port"          // rejected by a combiner, leaving at its other port
	LossScattered    = "scattered by the atoms" // absorbed by a cloud and scattered in all directions
)

// EscapingLoss reports whether a loss of this kind is a beam that leaves
// the path as a beam (mirror leakage, an AOM's other orders, a combiner's
// rejected light), which the hazards judge and the drawing shows, rather
// than power absorbed or scattered where it is lost.
func EscapingLoss(kind string) bool {
	return kind == LossMirror || kind == LossDiffraction || kind == LossCombiner
}

// Loss is power leaving the path at an element, as a fraction of the source's
// power.
type Loss struct {
	Kind     string
	Fraction float64
}

// Row is the budget at one element.
type Row struct {
	Element *setup.Element
	// BeamIn is the beam arriving at the element; BeamOut the beam leaving it.
	BeamIn, BeamOut optics.Beam
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
	// IdealNote says why no ideal focal length is given (a cylindrical
	// lens between the coupling lens and the fibre) or how to read the two
	// (an astigmatic beam: one per plane); "" for a round beam.
	IdealNote string
}

// Segment is free space between two points of a path.
type Segment struct {
	From, To float64     // positions along the path, m; To is +Inf past an open end
	After    int         // index of the element it follows (0: the path start)
	Beam     optics.Beam // at From
	Fraction float64     // power in the segment, fraction of the source
	Access   setup.Access
	// Arrival marks the zero-length arrival of a joined beam at its
	// combiner: its free space belongs to the path it came along.
	Arrival bool
}

// PathBudget is the budget of one beam on one path: the path's own laser's
// beam (Budget.Paths), or another laser's beam sharing the path (Joined),
// either from a combiner on the path or from the path's start when the
// splitter feeding the path carries it.
type PathBudget struct {
	Path  *setup.Path
	Laser *setup.Laser
	// First is the index in Path.Elements of the first element the beam
	// meets: 0 for a beam from the path's start, the combiner's for a beam
	// that joined there. Rows[k] is at Path.Elements[First+k], and
	// Segments[k] arrives at Rows[k].
	First int
	// JoinedAt is where the beam joined the path, m (0: at its start).
	JoinedAt float64
	// Combiner is the element where the beam joined the path (nil: it
	// came from the path's start).
	Combiner *setup.Element
	// ShiftIn is the AOM frequency shift the beam carries onto the path, Hz.
	ShiftIn float64
	// Joined lists the other lasers' beams on the path, in the order they
	// join (set on the path's own budget only).
	Joined        []*PathBudget
	StartFraction float64
	Start         optics.Beam
	Rows          []Row
	Segments      []Segment
	// EndFraction is the power leaving the last element (for a path that
	// goes into a combiner: arriving there).
	EndFraction float64
	// OpenEnd is set when the path neither ends in a dump nor goes into a
	// combiner.
	OpenEnd bool
	End     optics.Beam // at the path's end (at the combiner for a path that goes into one)
	// UnfollowedPorts lists splitters whose other port no path follows.
	UnfollowedPorts []*setup.Element

	arrival setup.Access // the access of the segment a joined beam arrives through
	// absorbThrough is the index (in the path) of the last element whose
	// cloud's absorption is computed (ComputeForGoals leaves out what
	// nothing reads).
	absorbThrough int
}

// IsJoined reports whether the beam is another laser's on a shared path.
func (pb *PathBudget) IsJoined() bool { return pb.Laser != pb.Path.Laser || pb.Combiner != nil }

// Beams lists the beams on the path of an own budget: itself, then the
// joined ones.
func (pb *PathBudget) Beams() []*PathBudget {
	return append([]*PathBudget{pb}, pb.Joined...)
}

// ShiftBefore is the AOM frequency shift the beam carries when it reaches
// element k (an index into Path.Elements) of its path, Hz: what it brought
// onto the path plus order × frequency × passes of each AOM it passed there.
func (pb *PathBudget) ShiftBefore(k int) float64 {
	shift := pb.ShiftIn
	for _, e := range pb.Path.Elements[pb.First:min(k, len(pb.Path.Elements))] {
		shift += e.FrequencyShift()
	}
	return shift
}

// LaserBalance accounts for all the power of one source.
type LaserBalance struct {
	Laser   *setup.Laser
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
	Setup *setup.Setup
	// AtOperating marks a budget whose clouds absorb at each laser's
	// operating power (ComputeAtOperating: the drive's figures and the
	// tables people read); otherwise at its maximum power (Compute: the
	// hazards, where the more saturated cloud lets more light on).
	AtOperating bool
	// Shifts are the trap's differential light shifts on the clouds, Hz,
	// in the near-resonant light's detuning (nil: none).
	Shifts   map[*setup.Cloud]float64
	Paths    []*PathBudget
	Balances []*LaserBalance
	// AssumedLossless counts the elements whose loss was not stated.
	AssumedLossless int

	plan *plan
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

// Compute propagates every beam and accounts for its power. Paths are
// taken in an order where the paths feeding one (through a splitter or a
// combiner) come first; every beam a feeding path carries goes on into it.
func Compute(s *setup.Setup) (*Budget, error) { return compute(s, false, nil, false, nil) }

// ComputeAtOperating is Compute with the clouds absorbing at each laser's
// operating power: a saturable cloud scatters a different fraction at
// another power, so the power scattered and the power after a cloud are
// figures of one power or the other, never a mix.
func ComputeAtOperating(s *setup.Setup) (*Budget, error) { return compute(s, true, nil, false, nil) }

// ComputeShifted is Compute (atOperating false) or ComputeAtOperating with
// the trap's differential light shift on each cloud (Hz) in the
// near-resonant light's detuning there (DetuningAtAtoms); where a shift is
// given, the hazards' budget lets through the more of with and without it
// (the trap may be off).
func ComputeShifted(s *setup.Setup, atOperating bool, shifts map[*setup.Cloud]float64) (*Budget, error) {
	return compute(s, atOperating, shifts, false, nil)
}

// ComputeForGoals is ComputeShifted at the operating powers for what the
// drive's goals and the trap's light shift read, the power and beam
// arriving at every atoms element (the tolerance analysis's samples): a
// cloud's absorption is left out where no atoms element follows it on its
// path and the path feeds no other, since nothing read depends on it. The
// rows after such a cloud, the path's dumps, open end and balance are then
// not figures of the setup and are not to be printed. reuse, when not nil,
// is an earlier result of ComputeForGoals for the same setup s (its values
// changed since, its structure not): its memory is used again, and it must
// not be read afterwards.
func ComputeForGoals(s *setup.Setup, shifts map[*setup.Cloud]float64, reuse *Budget) (*Budget, error) {
	return compute(s, true, shifts, true, reuse)
}

// plan is what a budget's walk takes from the setup's structure alone
// (kept with the budget for ComputeForGoals to walk again), and the path
// budgets of its last walk, by path, for the next to recycle.
type plan struct {
	balances map[*setup.Laser]*LaserBalance
	followed map[*setup.Element]*setup.Path // splitters whose other port a path follows
	clouds   map[string]*setup.Cloud
	feeds    map[*setup.Path]bool // the paths another path starts from or goes on into
	// lastAtoms is the index of each path's last atoms element (−1: none).
	lastAtoms map[*setup.Path]int
	lossless  map[*setup.Element]bool
	order     []*setup.Path
	// beams are the path budgets of the last walk, by path; spare the map
	// of the walk before (its entries recycled); own the main beam of each
	// path during a walk.
	beams, spare map[*setup.Path][]*PathBudget
	own          map[*setup.Path]*PathBudget
	stage        *stage // the walk's, for every path
}

func (pl *plan) make(s *setup.Setup) {
	pl.balances = make(map[*setup.Laser]*LaserBalance, len(s.Lasers))
	for _, las := range s.Lasers {
		pl.balances[las] = &LaserBalance{Laser: las, Lost: map[string]float64{}}
	}
	pl.followed = map[*setup.Element]*setup.Path{}
	pl.feeds = map[*setup.Path]bool{}
	pl.lastAtoms = make(map[*setup.Path]int, len(s.Paths))
	for _, p := range s.Paths {
		pl.lastAtoms[p] = -1
		for k, e := range p.Elements {
			if e.Type == setup.TypeAtoms {
				pl.lastAtoms[p] = k
			}
		}
		if p.ParentPort != nil {
			pl.followed[p.ParentPort] = p
		}
		pl.feeds[p.Parent] = true
		if p.IntoPath != nil {
			pl.feeds[p] = true
		}
	}
	pl.clouds = make(map[string]*setup.Cloud, len(s.Clouds))
	for _, c := range s.Clouds {
		pl.clouds[c.Name] = c
	}
	pl.lossless = map[*setup.Element]bool{}
	pl.order = setup.PathOrder(s)
}

// compute is the budget; goalsOnly as for ComputeForGoals.
func compute(s *setup.Setup, atOperating bool, shifts map[*setup.Cloud]float64, goalsOnly bool, reuse *Budget) (*Budget, error) {
	out, pl := &Budget{}, &plan{}
	if reuse != nil && reuse.Setup == s && reuse.plan != nil {
		out, pl = reuse, reuse.plan
		for _, bal := range out.Balances {
			bal.Dumped, bal.Leaving = 0, 0
			clear(bal.Lost)
		}
		clear(pl.lossless)
	} else {
		pl.make(s)
		for _, las := range s.Lasers {
			out.Balances = append(out.Balances, pl.balances[las])
		}
	}
	out.Setup, out.AtOperating, out.Shifts, out.plan = s, atOperating, shifts, pl
	balances, followed, clouds, feeds, lossless := pl.balances, pl.followed, pl.clouds, pl.feeds, pl.lossless
	// The path budgets of the previous walk, recycled beam by beam (a
	// tolerance sample walks the same paths again).
	recycled := pl.beams
	pl.beams, pl.spare = pl.spare, recycled
	if pl.beams == nil {
		pl.beams = map[*setup.Path][]*PathBudget{}
	}
	clear(pl.beams)
	fresh := func(p *setup.Path, k int, v PathBudget) *PathBudget {
		if k >= len(recycled[p]) {
			pb := new(PathBudget)
			*pb = v
			return pb
		}
		pb := recycled[p][k]
		v.Rows, v.Segments, v.UnfollowedPorts = pb.Rows[:0], pb.Segments[:0], pb.UnfollowedPorts[:0]
		*pb = v
		return pb
	}
	if pl.stage == nil {
		pl.stage = &stage{}
	}
	st := pl.stage
	if pl.own == nil {
		pl.own = map[*setup.Path]*PathBudget{}
	}
	own := pl.own
	clear(own)
	for _, p := range pl.order {
		// The slice of the previous walk's beams, filled again in place
		// (fresh reads each entry before it is replaced).
		beams := recycled[p][:0]
		if p.Parent == nil {
			las := p.Laser
			beams = append(beams, fresh(p, 0, PathBudget{Path: p, Laser: las, StartFraction: 1, Start: optics.Beam{
				Wavelength: las.Wavelength,
				X:          optics.NewPlane(las.Waist[0], las.WaistAt[0], las.M2[0], las.Wavelength),
				Y:          optics.NewPlane(las.Waist[1], las.WaistAt[1], las.M2[1], las.Wavelength),
			}}))
		} else {
			k := setup.ElementIndex(p.Parent, p.ParentPort)
			for _, q := range own[p.Parent].Beams() {
				if q.First > k || q.row(p.ParentPort) == nil {
					continue
				}
				row := q.row(p.ParentPort)
				el := p.ParentPort.For(q.Laser)
				t := *el.Leaving("transmission", q.Laser, el.Transmission)
				beams = append(beams, fresh(p, len(beams), PathBudget{Path: p, Laser: q.Laser, Start: row.BeamOut,
					StartFraction: row.FractionIn * row.ClipFraction * (1 - t), ShiftIn: q.ShiftBefore(k)}))
			}
		}
		for _, j := range s.Paths {
			if j.IntoPath != p {
				continue
			}
			k := setup.ElementIndex(p, j.IntoPort)
			for _, q := range own[j].Beams() {
				beams = append(beams, fresh(p, len(beams), PathBudget{Path: p, Laser: q.Laser, First: k, JoinedAt: j.IntoPort.At, Combiner: j.IntoPort, Start: q.End,
					StartFraction: q.EndFraction, ShiftIn: q.ShiftBefore(len(j.Elements)), arrival: q.Segments[len(q.Segments)-1].Access}))
			}
		}
		pl.beams[p] = beams
		for _, pb := range beams {
			// The elements (by index in the path) whose clouds' absorption
			// is read: all but the last atoms element's on a path that feeds
			// no other (goalsOnly), else all.
			pb.absorbThrough = len(p.Elements)
			if goalsOnly && !feeds[p] {
				pb.absorbThrough = pl.lastAtoms[p] - 1 // the atoms elements before the last
			}
			if err := pb.propagate(st, s.File, followed, clouds, atOperating, shifts); err != nil {
				return nil, err
			}
			if pb.IsJoined() {
				if err := pb.checkJoinedDetuning(s); err != nil {
					return nil, err
				}
			}
			bal := balances[pb.Laser]
			for _, r := range pb.Rows {
				if r.AssumedLossless {
					lossless[r.Element] = true
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
		main := beams[0]
		main.Joined = beams[1:]
		own[p] = main
	}
	out.AssumedLossless = len(lossless)
	// Report paths in the order of the setup file.
	out.Paths = slices.Grow(out.Paths[:0], len(s.Paths))
	for _, p := range s.Paths {
		out.Paths = append(out.Paths, own[p])
	}
	return out, nil
}

// Lost is the fraction of the source's power the row loses in losses of
// kind k.
func (r *Row) Lost(k string) float64 {
	f := 0.0
	for _, l := range r.Losses {
		if l.Kind == k {
			f += l.Fraction
		}
	}
	return f
}

// RowIndex is the index of row r in pb.Rows.
func (pb *PathBudget) RowIndex(r *Row) int {
	for i := range pb.Rows {
		if &pb.Rows[i] == r {
			return i
		}
	}
	return -1
}

func (pb *PathBudget) row(e *setup.Element) *Row {
	for i := range pb.Rows {
		if pb.Rows[i].Element == e {
			return &pb.Rows[i]
		}
	}
	return nil
}

// propagate walks the beam through the path's elements from First.
func (pb *PathBudget) propagate(st *stage, file string, followed map[*setup.Element]*setup.Path, clouds map[string]*setup.Cloud, atOperating bool, shifts map[*setup.Cloud]float64) error {
	power := pb.Laser.Power
	if atOperating {
		power = pb.Laser.OperatingPower
	}
	p := pb.Path
	beam := pb.Start
	frac := pb.StartFraction
	pos := pb.JoinedAt
	access := p.Access
	after := 0
	if pb.Combiner != nil {
		access = pb.arrival
		if pb.First > 0 {
			after = p.Elements[pb.First-1].Index
		}
	}
	lastLens, lastCyl := -1, -1
	n := len(p.Elements) - pb.First
	pb.Rows = slices.Grow(pb.Rows, n)
	pb.Segments = slices.Grow(pb.Segments, n+1)
	// One stage and one row for the walk (the caller's, for all its
	// paths), filled anew at each element (a tolerance run walks every
	// path for every sample).
	*st = stage{pb: pb, followed: followed, clouds: clouds, power: power, atOperating: atOperating, shifts: shifts}
	row := &st.rowBuf
	st.row = row
	for i := pb.First; i < len(p.Elements); i++ {
		e := p.Elements[i]
		joining := i == pb.First && pb.Combiner != nil
		pb.Segments = append(pb.Segments, Segment{From: pos, To: e.At, After: after, Beam: beam, Fraction: frac, Access: access, Arrival: joining})
		beam = beam.Propagate(e.At - pos)
		pos = e.At
		// A recycled budget's row here has a slice of losses to use again.
		var losses []Loss
		if n := len(pb.Rows); n < cap(pb.Rows) {
			losses = pb.Rows[: n+1 : n+1][n].Losses[:0]
		}
		*row = Row{Element: e, BeamIn: beam, FractionIn: frac, ClipFraction: 1, Losses: losses}
		el := e.For(pb.Laser)
		// Clipping at the clear aperture (or the iris of an aperture element).
		if clear := el.ClearAperture(); clear > 0 {
			wx, wy := beam.Radii()
			row.ClipFraction = optics.CircleFraction(wx, wy, clear/2)
			if f := frac * (1 - row.ClipFraction); f > 0 {
				row.Losses = append(row.Losses, Loss{LossClipping, f})
			}
			frac *= row.ClipFraction
		}
		st.index, st.lastLens, st.lastCyl, st.beam, st.frac, st.joining = len(pb.Rows), lastLens, lastCyl, beam, frac, joining
		effects[e.Type](st, el)
		beam, frac, lastLens, lastCyl = st.beam, st.frac, st.lastLens, st.lastCyl
		if !beam.Valid() {
			return &setup.InputError{Problems: []string{fmt.Sprintf("%s:%d: path %q, element %d (%s): the beam of laser %q is not a finite Gaussian beam after this element; check its numbers", file, e.Line, p.Name, e.Index, e.Type, pb.Laser.Name)}}
		}
		row.BeamOut = beam
		row.FractionOut = frac
		pb.Rows = append(pb.Rows, *row)
		// The segment after an element is open unless the element says
		// otherwise; after a cloud it stays as it was (the atoms sit in their
		// chamber). Open is the conservative reading for hazards.
		switch {
		case e.Access != "":
			access = e.Access
		case e.Type != setup.TypeAtoms:
			access = setup.AccessOpen
		}
		after = e.Index
	}
	pb.EndFraction = frac
	last := len(p.Elements) - 1
	switch {
	case p.IntoPath != nil:
		// The beam goes on into the combiner of another path.
		pb.Segments = append(pb.Segments, Segment{From: pos, To: p.IntoAt, After: after, Beam: beam, Fraction: frac, Access: access})
		pb.End = beam.Propagate(p.IntoAt - pos)
	case last < 0 || p.Elements[last].Type != setup.TypeDump:
		pb.OpenEnd = true
		pb.End = beam
		pb.Segments = append(pb.Segments, Segment{From: pos, To: math.Inf(1), After: after, Beam: beam, Fraction: frac, Access: access})
	default:
		pb.End = beam
	}
	return nil
}

// checkJoinedDetuning refuses, at the atoms elements a joined beam reaches,
// light whose frequency after the AOMs is not positive or whose laser's
// stated detuning disagrees with its wavelength (as the loader does for a
// path's own beam).
func (pb *PathBudget) checkJoinedDetuning(s *setup.Setup) error {
	for k := pb.First; k < len(pb.Path.Elements); k++ {
		e := pb.Path.Elements[k]
		if e.Type != setup.TypeAtoms {
			continue
		}
		for _, c := range s.Clouds {
			if c.Name == e.Cloud && c.Data != nil {
				if msg := setup.DetuningProblem(pb.Laser, nil, pb.ShiftBefore(k), c.Data); msg != "" {
					return &setup.InputError{Problems: []string{fmt.Sprintf("%s:%d: path %q, element %d (atoms, cloud %q), beam of laser %q: detuning: %s", s.File, e.Line, pb.Path.Name, e.Index, e.Cloud, pb.Laser.Name, msg)}}
				}
			}
		}
	}
	return nil
}

// couple finds the fibre coupling at element e for the arriving beam.
func (pb *PathBudget) couple(e *setup.Element, beam optics.Beam, lastLens, lastCyl int) *FiberCoupling {
	fc := &FiberCoupling{Overlap: math.NaN(), Alignment: 1}
	if e.Coupling != nil {
		fc.Coupling, fc.Given = *e.Coupling, true
	} else {
		fc.Overlap = optics.FiberOverlap(beam, e.ModeFieldDiameter)
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
		fc.IdealFocalLength[0] = optics.IdealCouplingFocalLength(at.X, at.Wavelength, e.ModeFieldDiameter/2)
		fc.IdealFocalLength[1] = optics.IdealCouplingFocalLength(at.Y, at.Wavelength, e.ModeFieldDiameter/2)
		f := fc.IdealFocalLength
		switch {
		case lastCyl >= 0 && lastCyl >= lastLens:
			// The figure is a spherical lens's in place of the last lens,
			// which here acts on one plane only.
			fc.IdealFocalLength = [2]float64{math.NaN(), math.NaN()}
			fc.IdealNote = fmt.Sprintf("not given: the last lens before the fibre is cylindrical (element %d), acting on one plane; no single spherical lens stands for it, so match each plane with its own optics", pb.Rows[lastCyl].Element.Index)
		case !(math.IsNaN(f[0]) && math.IsNaN(f[1])) && !(math.Abs(f[0]-f[1]) < 1e-3*math.Abs(f[0])):
			fc.IdealNote = "the beam is astigmatic there: one value per plane; no single spherical lens couples both planes fully"
		}
	}
	return fc
}
