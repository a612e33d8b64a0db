package setup

import (
	"beamledger/budget/atoms"
	"beamledger/limits"
)

// Setup is a whole setup file: lasers, beam paths, atom clouds and eyewear.
// Every quantity is in SI base units.
type Setup struct {
	File    string // the file it was read from, for messages
	Meta    Meta
	Lasers  []*Laser
	Paths   []*Path
	Clouds  []*Cloud
	Eyewear []*Eyewear
	// Controls are the control measures the setup declares ([controls]).
	Controls Controls
	// SignOff is what the sign-off document carries for the officer.
	SignOff SignOff
	// Tolerances lists the values written as ranges or ± tolerances; every
	// figure but the tolerance analysis uses their nominal values.
	Tolerances []*Toleranced
}

// Meta is the [setup] table: who, where, and evaluation-wide choices.
type Meta struct {
	Title, Site, PreparedBy, Revision string
	// Exposure overrides the assumed viewing duration for every wavelength,
	// s; zero means the default durations are used.
	Exposure float64
	// ExposureReason says why a viewing duration shorter than the aversion
	// response is accepted; required for one.
	ExposureReason string
	// Limits is the set of exposure limits the hazards are evaluated
	// against (default limits.SetStrictest).
	Limits limits.LimitSet
}

// Bounds on a stated viewing duration, s: AversionExposure is the shortest a
// setup may state without a reason (the aversion response of IEC
// 60825-1:2014, 0.25 s); MinExposure the shortest it may state at all (no
// viewing of a beam on a table is shorter; shorter figures would only make a
// limit look generous).
const (
	AversionExposure = 0.25
	MinExposure      = 1e-3
	// InvisibleExposure is the viewing duration assumed outside 400–700 nm,
	// where no aversion response ends an exposure, s.
	InvisibleExposure = 10
)

// DefaultViewingDuration is the viewing duration assumed for unintended
// exposure at wavelength λ (m) when the setup states none: the aversion
// response in 400–700 nm, 10 s elsewhere, s.
func DefaultViewingDuration(λ float64) float64 {
	if λ >= 400e-9 && λ <= 700e-9 {
		return AversionExposure
	}
	return InvisibleExposure
}

// Emission kinds.
const (
	EmissionCW     = "cw"
	EmissionPulsed = "pulsed"
)

// Laser is one source.
type Laser struct {
	Name       string
	Line       int     // line of its [[laser]] header
	Wavelength float64 // vacuum wavelength, m
	// Power is the most the source can emit, W; hazards use it.
	Power float64
	// OperatingPower is what the drive budget assumes, W.
	OperatingPower float64
	// Waist is the 1/e² intensity radius at the waist in x and y, m.
	Waist [2]float64
	// M2 is the beam quality factor in x and y.
	M2 [2]float64
	// WaistAt is the waist position relative to the output in x and y, m
	// (positive: after the output, along the first path).
	WaistAt  [2]float64
	Emission string
	// PulseDuration is the pulse length, s (pulsed only).
	PulseDuration float64
	// RepetitionRate is the pulse rate, Hz (pulsed only).
	RepetitionRate float64
	// Detuning is the laser frequency minus the driven transition's, Hz.
	Detuning float64
	// DetuningLinewidths is the detuning as written in linewidths Γ of the
	// driven transition ("-2.5 Γ"); the linker sets Detuning from it.
	DetuningLinewidths *float64
	// DetuningSet is set when the setup states the detuning.
	DetuningSet bool
	// Inventory: maker, model, serial number, the class on the label ("" when
	// not stated) and where the laser stands.
	Maker, Model, Serial, LabelClass, Location string
}

// LabelClasses are the classes a laser's label may state.
var LabelClasses = []string{"1", "1M", "2", "2M", "3R", "3B", "4"}

// Access says what surrounds a segment of a path.
type Access string

// Segment access kinds.
const (
	AccessOpen     Access = "open"
	AccessEnclosed Access = "enclosed"
	AccessVacuum   Access = "vacuum"
)

// Path is a beam path starting at a laser or at a splitter's other port.
type Path struct {
	Name string
	Line int
	From string // laser name or "<path>:<splitter name>"
	// Access is the first segment's (before the first element).
	Access   Access
	Elements []*Element

	// Into names the combiner on another path this path ends at,
	// "<path>:<combiner name>" ("": none); IntoAt is the free-space distance
	// from the path's start to that combiner, m.
	Into   string
	IntoAt float64

	// Resolved by the loader:
	Laser      *Laser   // the source that feeds the path
	Parent     *Path    // the path whose splitter feeds this one, or nil
	ParentPort *Element // that splitter
	IntoPath   *Path    // the path whose combiner this one ends at, or nil
	IntoPort   *Element // that combiner
}

// Element is one optic, cloud or dump along a path. Optional numbers are
// pointers: nil means the setup did not state them.
type Element struct {
	Index int // 1-based position in the path
	Line  int
	Type  ElementType
	Name  string
	// At is the free-space distance from the start of the path, m.
	At float64
	// Aperture is the clear aperture diameter, m (0: unlimited).
	Aperture float64
	// Transmission is the stated throughput (for a splitter: the fraction
	// sent on along this path).
	Transmission *float64
	// Access of the segment after this element; "" means open, except after
	// an atoms element, where it keeps the access before the element.
	Access Access

	FocalLength       float64  // lens, m
	Reflectivity      *float64 // mirror
	RadiusOfCurvature float64  // mirror, m (0: flat; positive: concave, focusing)
	Thickness         float64  // window, m
	RefractiveIndex   float64  // window (0: not given)
	Efficiency        *float64 // aom, per pass
	Frequency         float64  // aom drive frequency, Hz
	Order             int      // aom diffraction order
	Passes            int      // aom passes
	OpticalDensity    *float64 // filter
	Diameter          float64  // aperture (iris) diameter, m

	// fiber
	ModeFieldDiameter float64 // m
	Alignment         *float64
	Coupling          *float64
	OutputWaist       float64 // m
	OutputFocalLength float64 // m

	// atoms
	Cloud      string
	Goal       string
	GoalValue  *float64 // SI: saturation (bare), rabi (Hz), trap_depth (K)
	GoalFactor float64  // collective: multiple of the threshold
	// GoalMax marks GoalValue as an upper bound (goal_max): the figure
	// must stay at or below it.
	GoalMax bool
	// GoalAt is where the goal must hold ("centre", "exit", "all");
	// GoalFraction the share of the atoms for "all".
	GoalAt       string
	GoalFraction float64
	// GoalLaser names the laser whose beam the goal is for; the linker
	// sets it (the path's own laser when it serves the goal, else the one
	// arriving laser that does).
	GoalLaser string
	Detuning  *float64 // Hz, overrides the laser's plus AOM shifts
	// DetuningLinewidths is the detuning as written in linewidths of the
	// cloud's transition; the linker sets Detuning from it.
	DetuningLinewidths *float64
	// Direction is the unit vector the beam runs along in the cloud's frame
	// (axis = "z" by default: [0, 0, 1]).
	Direction [3]float64
	// Interference is "standing_wave" on the return pass of a retro-reflected
	// beam whose fields add coherently with the forward pass ("": none).
	Interference string
	// Pulse is how long the beam shines on the atoms at a time, s (0: not
	// given).
	Pulse float64

	// dump
	Rating float64 // W

	// combiner: the fraction of a joining beam passed on (nil: not stated)
	JoinTransmission *float64
	// cylindrical lens: the plane it focuses in, "x" or "y"
	Plane string

	// PerLaser holds values stated per laser: key → laser name → value
	// (PerLaserKeys); For applies them.
	PerLaser map[string]map[string]float64

	// hazard inputs
	SurfaceReflectance  *float64
	DiffuseReflectance  *float64
	DamageThreshold     float64 // W/m (cw) or J/m² (pulsed)
	DamagePulseDuration float64 // s
	DamageIsFluence     bool

	// leaving holds, only in the hazards' copy of a setup (Toleranced.
	// ApplyLeaving), a toleranced loss value at the end that sends the most
	// light out of the path at this element: key → laser name ("" for the
	// bare value) → value. Leaving reads it.
	leaving map[string]map[string]float64
}

// Leaving is loss value key of the element as laser las sees it (v, from
// For) for the light that leaves the path here as a beam of its own: a
// splitter's other port, a mirror's leak, an AOM's unused orders, a
// combiner's rejected port. In the hazards' copy of a setup a toleranced
// value is then at its own end that sends the most light out (the lowest
// transmission), while the beam that goes on takes the highest
// (ConservativeSetup); everywhere else it is v.
func (e *Element) Leaving(key string, las *Laser, v *float64) *float64 {
	if e.leaving == nil || v == nil {
		return v
	}
	name := ""
	if _, ok := e.PerLaser[key]; ok && las != nil {
		name = las.Name
	}
	if x, ok := e.leaving[key][name]; ok {
		return &x
	}
	return v
}

// PerLaserKeys are the keys that may be given per laser, as an inline table
// keyed by laser name ({ cool = 0.98, repump = 0.6 }).
var PerLaserKeys = []string{"transmission", "reflectivity", "efficiency", "optical_density", "alignment", "coupling", "join_transmission", "surface_reflectance"}

// For returns the element as laser las sees it: with the values stated for
// that laser in place of the per-laser tables (the element itself when it
// has none). The loader makes sure every laser that reaches the element is
// in each of its tables.
func (e *Element) For(las *Laser) *Element {
	if len(e.PerLaser) == 0 || las == nil {
		return e
	}
	c := *e
	for key, by := range e.PerLaser {
		v, ok := by[las.Name]
		if !ok {
			continue
		}
		switch key {
		case "transmission":
			c.Transmission = &v
		case "reflectivity":
			c.Reflectivity = &v
		case "efficiency":
			c.Efficiency = &v
		case "optical_density":
			c.OpticalDensity = &v
		case "alignment":
			c.Alignment = &v
		case "coupling":
			c.Coupling = &v
		case "join_transmission":
			c.JoinTransmission = &v
		case "surface_reflectance":
			c.SurfaceReflectance = &v
		}
	}
	return &c
}

// ClearAperture is the diameter that limits the beam at the element, m (0:
// none): its stated clear aperture, or an iris's diameter when smaller.
func (e *Element) ClearAperture() float64 {
	clear := e.Aperture
	if e.Type == TypeAperture && (clear == 0 || e.Diameter < clear) {
		clear = e.Diameter
	}
	return clear
}

// Label is how the element is named in output: its name, else its type.
func (e *Element) Label() string {
	if e.Name != "" {
		return e.Name
	}
	return string(e.Type)
}

// Goals at an atoms element.
const (
	GoalSaturation = "saturation"
	GoalRabi       = "rabi"
	GoalTrapDepth  = "trap_depth"
	GoalCollective = "collective"
)

// Saturation choices for a cloud.
const (
	SaturationCycling   = "cycling"
	SaturationIsotropic = "isotropic"
)

// Cloud is an atom cloud.
type Cloud struct {
	Name       string
	Line       int
	Transition string
	Atoms      float64
	// RMSSize is the rms radius in x, y and along the beam, m.
	RMSSize    [3]float64
	Saturation string
	// CollectiveRate is N Γ_c / 2π, Hz (0: estimate from optical depth).
	CollectiveRate float64
	// Down is the unit vector of gravity in the cloud's frame (zero: no
	// gravity).
	Down [3]float64
	// ExcitedPolarizability is the excited state's polarizability at each
	// trap laser's wavelength, in atomic units, keyed by laser name.
	ExcitedPolarizability map[string]float64
	// A goal for the whole cloud: kind, value (as for an atoms element),
	// factor (collective), and the lasers it scales (none: by kind).
	Goal       string
	GoalValue  *float64
	GoalFactor float64
	GoalMax    bool // GoalValue is an upper bound
	GoalLasers []string

	// Data is the resolved transition (built-in or custom).
	Data *atoms.Transition

	// custom transition
	Wavelength          float64 // m
	Linewidth           float64 // Γ/2π, Hz
	SaturationIntensity float64 // W/m²
	Mass                float64 // kg
}

// Eyewear is one declared pair of protective eyewear.
type Eyewear struct {
	Name  string
	Line  int
	Bands []EyewearBand
}

// EyewearBand is an optical density over a wavelength band, m, with the
// band's EN 207 marking when the eyewear states one.
type EyewearBand struct {
	From, To, OD float64
	// EN207 is the marking as written ("D LB6", "D LB5 + IR LB6"), "" when
	// none is stated; Ratings is it read, one test condition and scale
	// number each.
	EN207   string
	Ratings []EN207Rating
}

// EN207Rating is one part of an EN 207 marking: a test condition (D, I, R
// or M) and its scale number LBn.
type EN207Rating struct {
	Condition string
	LB        int
}

// Rates reports whether the band is marked for test condition mode at
// scale number lb or more; a band with no marking rates nothing.
func (b EyewearBand) Rates(mode string, lb int) bool {
	for _, r := range b.Ratings {
		if r.Condition == mode && r.LB >= lb {
			return true
		}
	}
	return false
}

// SignOff is the [signoff] table: the officer's conditions and the date
// by which the setup is reviewed again ("" when not stated).
type SignOff struct {
	Conditions []string
	Review     string
}

// Controls are the control measures a setup declares, in the trade's words
// ([controls]); a control not declared is taken as not in place.
type Controls struct {
	// Eyewear is "worn" when the [[eyewear]] entries are worn by everyone
	// in the area while any laser is on.
	Eyewear string
	// Entry is the strongest entry control: "interlock", "warning_light",
	// "sign" or "none".
	Entry string
	// KeyControl, WarningSigns and Training: "in_place", "posted",
	// "completed", or "none".
	KeyControl, WarningSigns, Training string
	// Perimeter is "barrier" (around the table's edge) or "none";
	// PerimeterRating the irradiance the barrier withstands, W/m².
	Perimeter       string
	PerimeterRating float64
	// Procedure and AlignmentProcedure are the written procedures'
	// references; Officer the laser safety officer's name; Notes free text.
	Procedure, AlignmentProcedure, Officer, Notes string
}

// Control values.
const (
	EyewearWorn      = "worn"
	EntryInterlock   = "interlock"
	EntryWarning     = "warning_light"
	EntrySign        = "sign"
	ControlNone      = "none"
	KeyInPlace       = "in_place"
	SignsPosted      = "posted"
	TrainingDone     = "completed"
	PerimeterBarrier = "barrier"
)

// Where a goal must hold.
const (
	GoalAtCentre = "centre"
	GoalAtExit   = "exit"
	GoalAtAll    = "all"
)
