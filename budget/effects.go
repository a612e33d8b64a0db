package budget

import (
	"beamledger/budget/optics"
	"beamledger/budget/setup"
	"math"
)

// effects holds, for every element type of the setup format, what the
// element does to the beam and its power at one step of the walk along a
// path, naming each loss so that the balance closes. TestEffectsComplete
// checks that every kind of setup.Kinds has one.
var effects = map[setup.ElementType]func(s *stage, e *setup.Element){
	setup.TypeLens:     applyLens,
	setup.TypeMirror:   applyMirror,
	setup.TypeWindow:   applyWindow,
	setup.TypeAOM:      applyAOM,
	setup.TypeFilter:   applyFilter,
	setup.TypeAperture: applyAperture,
	setup.TypeSplitter: applySplitter,
	setup.TypeFiber:    applyFiber,
	setup.TypeAtoms:    applyAtoms,
	setup.TypeDump:     applyDump,
	setup.TypeCombiner: applyCombiner,
	setup.TypeCylLens:  applyCylLens,
}

// stage is one element's step of the walk along a path: the beam and the
// power fraction it changes, and the row it fills.
type stage struct {
	pb       *PathBudget
	followed map[*setup.Element]*setup.Path // splitters whose other port a path follows
	clouds   map[string]*setup.Cloud        // by name
	index    int                            // the element's index in the path, 0-based
	lastLens int                            // index of the last lens since the start or the last fibre, -1 if none
	lastCyl  int                            // index of the last cylindrical lens since then, -1 if none
	beam     optics.Beam
	frac     float64 // power fraction of the source
	row      *Row
	rowBuf   Row // the row row points to
	// joining is set at the combiner where the beam joins the path.
	joining bool
	// power is the laser's power the clouds absorb at, W; atOperating says
	// it is the operating power (the drive's budget), not the maximum.
	power       float64
	atOperating bool
	// shifts are the trap's differential light shifts on the clouds, Hz.
	shifts map[*setup.Cloud]float64
}

// lose records a named loss of a fraction f of the source's power.
func (s *stage) lose(kind string, f float64) {
	if f > 0 {
		s.row.Losses = append(s.row.Losses, Loss{kind, f})
	}
}

// stated applies a stated transmission t (nil: none stated).
func (s *stage) stated(kind string, t *float64) {
	if t != nil {
		s.lose(kind, s.frac*(1-*t))
		s.frac *= *t
	}
}

// leave applies a stated transmission t (nil: none stated) whose loss
// leaves the path as a beam of its own; that beam is 1 − out of the
// arriving power (out is t but in the hazards' copy of a setup, where a
// toleranced value's leaving beam takes its own worst end:
// setup.Element.Leaving).
func (s *stage) leave(kind string, t, out *float64) {
	if t != nil {
		s.lose(kind, s.frac*(1-*out))
		s.frac *= *t
	}
}

func applyLens(s *stage, e *setup.Element) {
	s.beam = s.beam.Lens(e.FocalLength)
	s.stated(LossAbsorption, e.Transmission)
	s.row.AssumedLossless = e.Transmission == nil
	s.lastLens = s.index
}

func applyMirror(s *stage, e *setup.Element) {
	if e.RadiusOfCurvature != 0 {
		s.beam = s.beam.Lens(e.RadiusOfCurvature / 2)
	}
	s.leave(LossMirror, e.Reflectivity, e.Leaving("reflectivity", s.pb.Laser, e.Reflectivity))
	s.row.AssumedLossless = e.Reflectivity == nil
}

func applyWindow(s *stage, e *setup.Element) {
	if e.Thickness > 0 {
		s.beam = s.beam.Slab(e.Thickness, e.RefractiveIndex)
	}
	s.stated(LossAbsorption, e.Transmission)
	s.row.AssumedLossless = e.Transmission == nil
}

func applyAOM(s *stage, e *setup.Element) {
	s.stated(LossAbsorption, e.Transmission)
	if e.Efficiency != nil {
		t := math.Pow(*e.Efficiency, float64(e.Passes))
		out := math.Pow(*e.Leaving("efficiency", s.pb.Laser, e.Efficiency), float64(e.Passes))
		s.leave(LossDiffraction, &t, &out)
	}
	s.row.AssumedLossless = e.Transmission == nil && e.Efficiency == nil
}

func applyFilter(s *stage, e *setup.Element) {
	s.stated(LossAbsorption, e.Transmission)
	if e.OpticalDensity != nil {
		t := math.Pow(10, -*e.OpticalDensity)
		s.stated(LossFilter, &t)
	}
}

func applyAperture(s *stage, e *setup.Element) {
	s.stated(LossAbsorption, e.Transmission)
}

func applyAtoms(s *stage, e *setup.Element) {
	s.stated(LossAbsorption, e.Transmission)
	// The cloud scatters what it absorbs, at the budget's power: the
	// maximum for the hazards (the most that saturation lets through:
	// conservative downstream), the operating power for the drive; near
	// resonance at the detuning the trap's light shift leaves.
	if c := s.clouds[e.Cloud]; c != nil && c.Data != nil && s.frac > 0 && s.pb.First+s.index <= s.pb.absorbThrough {
		δ := s.shifts[c]
		wx, wy := s.beam.Radii()
		t := ColumnFor(s.pb, s.pb.First+s.index, s.row.Element, c, δ).Absorb(s.frac*s.power, wx, wy).Transmission
		if δ != 0 && !s.atOperating {
			// For the hazards the trap may be off while this light is on:
			// the more that gets through of the two.
			t = math.Max(t, ColumnFor(s.pb, s.pb.First+s.index, s.row.Element, c, 0).Absorb(s.frac*s.power, wx, wy).Transmission)
		}
		s.lose(LossScattered, s.frac*(1-t))
		s.frac *= t
	}
}

func applySplitter(s *stage, e *setup.Element) {
	if s.followed[s.row.Element] == nil {
		s.lose(LossSplitterPort, s.frac*(1-*e.Leaving("transmission", s.pb.Laser, e.Transmission)))
		s.pb.UnfollowedPorts = append(s.pb.UnfollowedPorts, s.row.Element)
	}
	s.frac *= *e.Transmission
}

func applyFiber(s *stage, e *setup.Element) {
	fc := s.pb.couple(e, s.beam, s.lastLens, s.lastCyl)
	s.row.Fiber = fc
	s.lose(LossCoupling, s.frac*(1-fc.Coupling))
	s.frac *= fc.Coupling
	s.stated(LossAbsorption, e.Transmission)
	w := e.OutputWaist
	if w == 0 {
		w = optics.FiberOutputWaist(s.beam.Wavelength, e.OutputFocalLength, e.ModeFieldDiameter)
	}
	s.beam = optics.Beam{Wavelength: s.beam.Wavelength, X: optics.NewPlane(w, 0, 1, s.beam.Wavelength), Y: optics.NewPlane(w, 0, 1, s.beam.Wavelength)}
	s.lastLens, s.lastCyl = -1, -1
}

func applyCombiner(s *stage, e *setup.Element) {
	t, key := e.Transmission, "transmission"
	if s.joining {
		t, key = e.JoinTransmission, "join_transmission"
	}
	s.leave(LossCombiner, t, e.Leaving(key, s.pb.Laser, t))
	s.row.AssumedLossless = t == nil
}

func applyCylLens(s *stage, e *setup.Element) {
	if e.Plane == "x" {
		s.beam.X = s.beam.X.Lens(e.FocalLength)
	} else {
		s.beam.Y = s.beam.Y.Lens(e.FocalLength)
	}
	s.stated(LossAbsorption, e.Transmission)
	s.row.AssumedLossless = e.Transmission == nil
	s.lastLens, s.lastCyl = s.index, s.index
}

func applyDump(s *stage, e *setup.Element) {
	s.stated(LossAbsorption, e.Transmission)
	s.lose(LossDump, s.frac)
	s.frac = 0
}
