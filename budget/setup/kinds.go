package setup

import (
	"beamledger/budget/atoms"
	"beamledger/budget/units"
	"slices"
)

// ElementType names an element kind in a setup file ("lens", "mirror", …).
type ElementType string

// Element types.
const (
	TypeLens     ElementType = "lens"
	TypeMirror   ElementType = "mirror"
	TypeWindow   ElementType = "window"
	TypeAOM      ElementType = "aom"
	TypeFilter   ElementType = "filter"
	TypeAperture ElementType = "aperture"
	TypeSplitter ElementType = "splitter"
	TypeFiber    ElementType = "fiber"
	TypeAtoms    ElementType = "atoms"
	TypeDump     ElementType = "dump"
	TypeCombiner ElementType = "combiner"
	TypeCylLens  ElementType = "cylindrical_lens"
)

// ElementKind describes one element type of the setup format: the keys it
// takes besides the common ones, how those are read and checked, what it
// does to the beam and its power (in words; package budget's effects table
// holds the effect itself), and how many of its surfaces can reflect a stray
// beam back. A new element type is one more entry in Kinds and one in the
// budget's effects (DEVELOPERS.md gives the recipe); TestElementKindsComplete
// checks that every entry is whole.
type ElementKind struct {
	Type ElementType
	// Does says in words what the element does to the beam and its power.
	Does string
	// Keys are the keys it takes besides the common element keys (the
	// key table's "element" table); Needs its rules of required keys.
	Keys  []KeySpec
	Needs []Requirement
	// Surfaces is the number of transmissive surfaces that reflect part of
	// the beam (the stray-reflection check); 0 for none.
	Surfaces int
	// read reads and checks the kind's own keys.
	read func(t *table, e *Element, m map[string]any)
}

// Kinds lists the element kinds in a fixed order.
var Kinds = []*ElementKind{
	{Type: TypeLens, Does: "a thin lens: the ABCD matrix (1, 0; −1/f, 1) in both planes; loss: its stated transmission", Keys: []KeySpec{quantity("focal_length", units.Length, true, "the focal length (negative: diverging)", `"250 mm"`)}, Surfaces: 2, read: readLens},
	{Type: TypeMirror, Does: "a mirror, flat or curved (a lens of focal length R/2); loss: 1 − reflectivity, which leaks through it", Keys: []KeySpec{fractionKey("reflectivity", "the fraction reflected on along the path; the rest leaks through", "0.995"), quantity("radius_of_curvature", units.Length, false, "a curved mirror's radius (positive: concave, focusing; default flat)", `"500 mm"`)}, Surfaces: 0, read: readMirror},
	{Type: TypeWindow, Does: "a window or plate; a thick one shifts the focus by t(1 − 1/n); loss: its stated transmission", Keys: []KeySpec{with(quantity("thickness", units.Length, false, "a thick plate's thickness, with index: the focus shifts by t(1 − 1/n)", `"6.35 mm"`), "index"), with(number("index", 1, 5, false, "the plate's refractive index, with thickness", "1.45"), "thickness")}, Surfaces: 2, read: readWindow},
	{Type: TypeAOM, Does: "an acousto-optic modulator: efficiency^passes goes on in the order used, the rest leaves in the other orders; its order × frequency × passes shifts the light", Keys: []KeySpec{fractionKey("efficiency", "the diffraction efficiency into the order used, per pass", "0.8"), quantity("frequency", units.Frequency, false, "the drive frequency: order × frequency × passes shifts the light", `"80 MHz"`), {Key: "order", Kind: ValInteger, Min: -10, Max: 10, Doc: "the diffraction order used (default 1; not 0)", Example: "-1"}, {Key: "passes", Kind: ValInteger, Min: 1, Max: 4, Doc: "passes through the modulator (default 1)", Example: "2"}}, Surfaces: 2, read: readAOM},
	{Type: TypeFilter, Does: "a filter: 10^−OD and its stated transmission", Keys: []KeySpec{number("optical_density", 0, 20, false, "the optical density: 10^−OD passes", "2.0")}, Needs: []Requirement{{AnyOf: []string{"optical_density", "transmission"}, Why: "a filter needs optical_density or transmission"}}, Surfaces: 2, read: readFilter},
	{Type: TypeAperture, Does: "an iris: clips the beam at its diameter", Keys: []KeySpec{quantity("diameter", units.Length, true, "the iris diameter", `"2 mm"`)}, Surfaces: 0, read: readAperture},
	{Type: TypeSplitter, Does: "a splitter: transmission goes on along this path, the rest feeds the path whose from names it (or is lost)", Needs: []Requirement{{AnyOf: []string{"transmission"}, Why: "a splitter needs the fraction sent on along this path"}}, Surfaces: 2, read: readSplitter},
	{Type: TypeFiber, Does: "a single-mode fibre: couples the beam's mode overlap × alignment (or the stated coupling) and launches a new Gaussian beam", Keys: []KeySpec{quantity("mode_field_diameter", units.Length, false, "the fibre's mode-field diameter (the coupling is its overlap with the beam)", `"5.3 um"`), fractionKey("alignment", "a practical factor on the computed overlap", "0.85"), fractionKey("coupling", "the coupled fraction, when measured (instead of the overlap and alignment)", "0.6"), quantity("output_waist", units.Length, false, "the collimated output's 1/e² radius", `"1.0 mm"`), with(quantity("output_focal_length", units.Length, false, "the output collimator's focal length (the output is sized from the mode field)", `"11 mm"`), "mode_field_diameter")}, Needs: []Requirement{{AnyOf: []string{"mode_field_diameter", "coupling"}, Why: "a fiber needs mode_field_diameter or coupling"}, {AnyOf: []string{"output_waist", "output_focal_length"}, Why: "a fiber needs output_waist or output_focal_length"}}, Surfaces: 1, read: readFiber},
	{Type: TypeAtoms, Does: "an atom cloud: the drive is evaluated here; the beam passes unchanged", Keys: atomsKeys, Needs: goalNeeds, Surfaces: 0, read: readAtoms},
	{Type: TypeDump, Does: "a beam dump: absorbs everything and ends the path", Keys: []KeySpec{quantity("rating", units.Power, false, "the power the dump is rated for", `"2 W"`), fractionKey("diffuse_reflectance", "the dump's diffuse reflectance (default 1, conservative)", "0.05")}, Surfaces: 0, read: readDump},
	{Type: TypeCombiner, Does: "a combiner (polarizing cube, dichroic): the path whose into names it joins here; transmission of this path's own beams and join_transmission of the joining ones go on, the rest leaves the path at its other port", Keys: []KeySpec{fractionKey("join_transmission", "the fraction of the joining beam passed on (transmission: of this path's own)", "0.95")}, Surfaces: 2, read: readCombiner},
	{Type: TypeCylLens, Does: "a thin cylindrical lens: the ABCD matrix (1, 0; −1/f, 1) in its plane (x or y) only; loss: its stated transmission", Keys: []KeySpec{quantity("focal_length", units.Length, true, "the focal length in its plane (negative: diverging)", `"100 mm"`), choice("plane", PlaneValues, true, "the plane it focuses in", `"x"`)}, Surfaces: 2, read: readCylLens},
}

// atomsKeys are an atoms element's own keys.
var atomsKeys = append([]KeySpec{
	{Key: "cloud", Kind: ValName, Required: true, Doc: "the cloud the beam drives here", Example: `"pencil"`},
}, append(slices.Clone(goalKeys),
	with(choice("goal_at", GoalAtValues, false, "where the goal must hold: the cloud's centre (default), its exit, or all (a fraction of the atoms)", `"exit"`), "goal"),
	with(fractionKey("goal_fraction", "with goal_at = \"all\": the fraction of the atoms that must reach the goal (default 0.9)", "0.9"), "goal", "goal_at=all"),
	quantity("detuning", units.Frequency, false, "the detuning here, overriding the laser's plus the modulators' shifts; or in linewidths of the cloud's transition, \"-2.5 Γ\" or \"-2.5 Gamma\"", `"-12 MHz"`),
	choice("axis", AxisValues, false, "the cloud axis the beam runs along (default z)", `"y"`),
	KeySpec{Key: "direction", Kind: ValVector, Doc: "the beam's direction in the cloud's frame, instead of axis", Example: `[0, -1, 0]`},
	choice("interference", InterferenceValues, false, "standing_wave: this return pass interferes with the forward one", `"standing_wave"`),
	with(KeySpec{Key: "goal_laser", Kind: ValName, Doc: "on a path several lasers' light shares: the laser whose beam the goal is for (default: the path's own laser when it serves the goal, else the one that does: near resonance for saturation, rabi and collective, far detuned for trap_depth)", Example: `"probe-amp"`}, "goal"),
	quantity("pulse", units.Time, false, "how long this near-resonant beam shines on trapped atoms at a time (an imaging or push pulse): the photons each atom scatters in it are set against the number that heats it out of the trap", `"50 us"`),
)...)

// Has reports whether the kind takes key as its own.
func (k *ElementKind) Has(key string) bool {
	for _, s := range k.Keys {
		if s.Key == key {
			return true
		}
	}
	return false
}

// KeyNames lists the kind's own keys.
func (k *ElementKind) KeyNames() []string { return keyNames(k.Keys) }

// KindOf returns the description of an element type.
func KindOf(t ElementType) (*ElementKind, bool) {
	for _, k := range Kinds {
		if k.Type == t {
			return k, true
		}
	}
	return nil, false
}

func readLens(t *table, e *Element, m map[string]any) {
	f, ok := t.quantity("focal_length", units.Length, true)
	if ok && f == 0 {
		t.fail("focal_length", "must not be zero")
	}
	e.FocalLength = f
}

func readMirror(t *table, e *Element, m map[string]any) {
	e.Reflectivity = t.fraction("reflectivity", 0, 1)
	var ok bool
	e.RadiusOfCurvature, ok = t.quantity("radius_of_curvature", units.Length, false)
	if ok && e.RadiusOfCurvature == 0 {
		t.fail("radius_of_curvature", "must not be zero (leave it out for a flat mirror)")
	}
}

func readWindow(t *table, e *Element, m map[string]any) {
	e.Thickness = t.positive("thickness", units.Length, false)
	if t.has("index") {
		n, ok := t.quantity("index", units.Dimensionless, true)
		if ok && (n < 1 || n > 5) {
			t.fail("index", "%s is outside [1, 5]", show(m["index"]))
		}
		if !t.has("thickness") {
			t.fail("index", "needs thickness")
		}
		e.RefractiveIndex = n
	} else if t.has("thickness") {
		t.fail("thickness", "needs index (the refractive index)")
	}
}

func readAOM(t *table, e *Element, m map[string]any) {
	e.Efficiency = t.fraction("efficiency", 0, 1)
	e.Frequency = t.positive("frequency", units.Frequency, false)
	e.Order = t.integer("order", 1, -10, 10)
	e.Passes = t.integer("passes", 1, 1, 4)
	if e.Order == 0 && t.has("order") {
		t.fail("order", "0 is the undiffracted beam; give the order used (e.g. 1 or -1)")
	}
}

func readFilter(t *table, e *Element, m map[string]any) {
	if !t.has("optical_density") && !t.has("transmission") && e.PerLaser["optical_density"] == nil && e.PerLaser["transmission"] == nil {
		t.fail("optical_density", "missing (a filter needs optical_density or transmission)")
	}
	if od, ok := t.quantity("optical_density", units.Dimensionless, false); ok {
		if od < 0 || od > 20 {
			t.fail("optical_density", "%s is outside [0, 20]", show(m["optical_density"]))
		} else {
			e.OpticalDensity = &od
		}
	}
}

func readAperture(t *table, e *Element, m map[string]any) {
	e.Diameter = t.positive("diameter", units.Length, true)
}

func readSplitter(t *table, e *Element, m map[string]any) {
	if !t.has("transmission") && e.PerLaser["transmission"] == nil {
		t.fail("transmission", "missing (a splitter needs the fraction sent on along this path)")
	}
}

func readFiber(t *table, e *Element, m map[string]any) {
	e.Coupling = t.fraction("coupling", 0, 1)
	e.ModeFieldDiameter = t.positive("mode_field_diameter", units.Length, e.Coupling == nil && !t.has("coupling") && e.PerLaser["coupling"] == nil)
	e.Alignment = t.fraction("alignment", 0, 1)
	if e.Coupling != nil && e.Alignment != nil {
		t.fail("alignment", "coupling is given, which already includes alignment")
	}
	e.OutputWaist = t.positive("output_waist", units.Length, false)
	e.OutputFocalLength = t.positive("output_focal_length", units.Length, false)
	switch {
	case t.has("output_waist") && t.has("output_focal_length"):
		t.fail("output_focal_length", "give output_waist or output_focal_length, not both")
	case !t.has("output_waist") && !t.has("output_focal_length"):
		t.fail("output_waist", "missing (a fiber needs output_waist or output_focal_length)")
	case t.has("output_focal_length") && !t.has("mode_field_diameter"):
		t.fail("output_focal_length", "needs mode_field_diameter to size the output beam")
	}
}

func readAtoms(t *table, e *Element, m map[string]any) {
	e.Cloud = t.str("cloud", true)
	e.Direction = t.direction()
	e.Interference = t.enum("interference", "", InterferenceValues...)
	if e.Interference == "none" {
		e.Interference = ""
	}
	readGoal(t, &e.Goal, &e.GoalValue, &e.GoalFactor, &e.GoalMax, m)
	e.GoalAt = t.enum("goal_at", GoalAtCentre, GoalAtValues...)
	e.GoalFraction = 0.9
	if f := t.fraction("goal_fraction", 0, 1); f != nil {
		if e.GoalAt != GoalAtAll {
			t.fail("goal_fraction", "only with goal_at = \"all\"")
		} else if *f == 0 {
			t.fail("goal_fraction", "must be above 0")
		} else {
			e.GoalFraction = *f
		}
	}
	if (t.has("goal_at") || t.has("goal_fraction")) && e.Goal == "" {
		t.fail("goal_at", "given without goal")
	}
	if (t.has("goal_at") || t.has("goal_fraction")) && e.Goal == GoalTrapDepth {
		key := "goal_at"
		if !t.has(key) {
			key = "goal_fraction"
		}
		t.fail(key, "a trap-depth goal is judged at the trap's own minimum; goal_at and goal_fraction are for the saturation, rabi and collective goals, which hold at a place in the cloud")
	}
	if e.GoalMax && e.GoalAt == GoalAtAll {
		t.fail("goal_at", "\"all\" is for a value to reach; an upper bound (goal_max) is judged at the \"centre\" or the \"exit\"")
	}
	if d, n, ok := t.detuning("detuning"); ok {
		e.Detuning, e.DetuningLinewidths = &d, n
	}
	e.Pulse = t.positive("pulse", units.Time, false)
	e.GoalLaser = t.str("goal_laser", false)
	if e.GoalLaser != "" && e.Goal == "" {
		t.fail("goal_laser", "given without goal")
	}
}

// readGoal reads goal, goal_value and goal_factor (of an atoms element or a
// cloud).
func readGoal(t *table, goal *string, value **float64, factor *float64, upper *bool, m map[string]any) {
	*goal = t.enum("goal", "", GoalKinds...)
	*factor = 1
	// The value to reach (goal_value) or to stay under (goal_max).
	key := "goal_value"
	if t.has("goal_max") {
		if t.has("goal_value") {
			t.get("goal_value")
			t.fail("goal_max", "give goal_value (a value to reach) or goal_max (a value to stay under), not both")
		}
		key, *upper = "goal_max", true
	}
	switch *goal {
	case GoalSaturation:
		*value = t.positivePtr(key, units.Dimensionless, "a saturation parameter s")
	case GoalRabi:
		*value = t.positivePtr(key, units.Frequency, "a Rabi frequency Ω/2π")
	case GoalTrapDepth:
		// A depth may be given as U/h, in Hz: converted to U/k_B.
		if v, ok := m[key].(string); ok {
			if _, d, err := units.ParseQuantity(v); err == nil && d != units.Frequency && d != units.Temperature {
				t.get(key)
				t.fail(key, "%q is %s; want a trap depth as U/k_B (a temperature, e.g. \"0.5 mK\") or U/h (a frequency, e.g. \"20 MHz\")", v, units.Describe(d))
				break
			}
			if _, d, err := units.ParseQuantity(v); err == nil && d == units.Frequency {
				if f := t.positivePtr(key, units.Frequency, "a trap depth U/h"); f != nil {
					k := atoms.DepthTemperature(*f)
					*value = &k
				}
				break
			}
		}
		*value = t.positivePtr(key, units.Temperature, "a trap depth U/k_B (or U/h in Hz)")
	case GoalCollective:
		if t.has(key) {
			t.get(key)
			t.fail(key, "a collective goal has no value; use goal_factor for a multiple of the threshold")
		}
	default:
		if t.has(key) {
			t.get(key)
			t.fail(key, "given without goal")
		}
	}
	if t.has("goal_factor") {
		if *goal != GoalCollective {
			t.get("goal_factor")
			t.fail("goal_factor", "only for goal = \"collective\"")
		} else if f, ok := t.quantity("goal_factor", units.Dimensionless, true); ok {
			if f <= 0 {
				t.fail("goal_factor", "must be positive, got %s", show(m["goal_factor"]))
			} else {
				*factor = f
			}
		}
	}
}

func readCombiner(t *table, e *Element, m map[string]any) {
	e.JoinTransmission = t.fraction("join_transmission", 0, 1)
}

func readCylLens(t *table, e *Element, m map[string]any) {
	readLens(t, e, m)
	e.Plane = t.enum("plane", "", PlaneValues...)
	if e.Plane == "" && !t.has("plane") {
		t.fail("plane", "missing (want \"x\" or \"y\", the plane the lens focuses in)")
	}
}

func readDump(t *table, e *Element, m map[string]any) {
	e.Rating = t.positive("rating", units.Power, false)
	e.DiffuseReflectance = t.fraction("diffuse_reflectance", 0, 1)
}
