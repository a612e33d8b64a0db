package setup

import (
	"maps"
	"slices"
	"sync"

	"beamledger/budget/atoms"
	"beamledger/budget/units"
	"beamledger/limits"
)

// ValueKind is the kind of value a key takes, as the setup file writes it.
type ValueKind string

// Value kinds.
const (
	ValText     ValueKind = "text"     // a string
	ValName     ValueKind = "name"     // a name: at most MaxNameLength characters, no ":"
	ValChoice   ValueKind = "choice"   // one of Enum
	ValQuantity ValueKind = "quantity" // "number unit" of Dims (a bare number when dimensionless)
	ValInteger  ValueKind = "integer"  // a whole number
	ValPair     ValueKind = "pair"     // one quantity for both planes, or [x, y]
	ValTriple   ValueKind = "triple"   // [x, y, z], three quantities
	ValVector   ValueKind = "vector"   // [dx, dy, dz], three numbers
	ValNames    ValueKind = "names"    // a list of names
	ValTexts    ValueKind = "texts"    // a list of texts
	ValByLaser  ValueKind = "by_laser" // an inline table of laser name = number
	ValTables   ValueKind = "tables"   // an array of tables (Table names them)
)

// KeySpec describes one key.
type KeySpec struct {
	Key  string
	Kind ValueKind
	// Dims are the dimensions a quantity may have (most have one;
	// damage_threshold two, goal_value one per goal).
	Dims []units.Dimension
	// Enum lists a choice's values.
	Enum []string
	// Min and Max bound a bare number (both zero: unbounded).
	Min, Max float64
	// Required: the key must be given.
	Required bool
	// Table names the table spec of an array of tables.
	Table string
	// With lists the keys the key needs beside it: "goal", or "goal=value"
	// for a key that needs another at one value.
	With []string
	// Doc says in a line what the key is; Example is a value as written in
	// A setup file (TOML).
	Doc, Example string
}

func with(k KeySpec, keys ...string) KeySpec {
	k.With = append(k.With, keys...)
	return k
}

// Percent reports whether the key is a fraction that may be written as a
// percentage.
func (k *KeySpec) Percent() bool { return percentKeys[k.Key] }

// Toleranced reports whether the key may carry a tolerance ("a .. b",
// "x ± s").
func (k *KeySpec) Toleranced() bool { _, ok := toleranceKeys[k.Key]; return ok }

// ByLaser reports whether the key may be given per laser, as an inline
// table of laser name = value.
func (k *KeySpec) ByLaser() bool { return slices.Contains(PerLaserKeys, k.Key) }

// Requirement is a rule of required keys: when If is set, only when the
// key If has the value Is (a key's presence when Is is ""); AnyOf lists
// keys of which at least one must be given, with Why for the message.
type Requirement struct {
	If, Is string
	AnyOf  []string
	Why    string
}

// TableSpec describes one table of the format.
type TableSpec struct {
	// Name is the table's name in messages and in the schema; Path how it
	// is written in a setup file ("[[path.element]]").
	Name, Path, Doc string
	Keys            []KeySpec
	Needs           []Requirement
}

// Key returns the spec of key (nil: the table has no such key).
func (t *TableSpec) Key(key string) *KeySpec {
	for i := range t.Keys {
		if t.Keys[i].Key == key {
			return &t.Keys[i]
		}
	}
	return nil
}

// Values of the format's choices, shared by the loader and the key table.
var (
	AccessValues       = []string{string(AccessOpen), string(AccessEnclosed), string(AccessVacuum)}
	EmissionValues     = []string{EmissionCW, EmissionPulsed}
	GoalKinds          = []string{GoalCollective, GoalSaturation, GoalRabi, GoalTrapDepth}
	GoalAtValues       = []string{GoalAtCentre, GoalAtExit, GoalAtAll}
	InterferenceValues = []string{"none", "standing_wave"}
	AxisValues         = []string{"x", "y", "z"}
	PlaneValues        = []string{"x", "y"}
	DownValues         = []string{"+x", "-x", "+y", "-y", "+z", "-z", "none"}
	SaturationValues   = []string{SaturationCycling, SaturationIsotropic}
)

func quantity(key string, dim units.Dimension, required bool, doc, example string) KeySpec {
	return KeySpec{Key: key, Kind: ValQuantity, Dims: []units.Dimension{dim}, Required: required, Doc: doc, Example: example}
}

func number(key string, min, max float64, required bool, doc, example string) KeySpec {
	return KeySpec{Key: key, Kind: ValQuantity, Dims: []units.Dimension{units.Dimensionless}, Min: min, Max: max, Required: required, Doc: doc, Example: example}
}

func choice(key string, values []string, required bool, doc, example string) KeySpec {
	return KeySpec{Key: key, Kind: ValChoice, Enum: values, Required: required, Doc: doc, Example: example}
}

func text(key string, required bool, doc, example string) KeySpec {
	return KeySpec{Key: key, Kind: ValText, Required: required, Doc: doc, Example: example}
}

func fractionKey(key, doc, example string) KeySpec { return number(key, 0, 1, false, doc, example) }

var nameKey = KeySpec{Key: "name", Kind: ValName, Required: true, Doc: "the name other tables refer to it by", Example: `"probe-amp"`}

// goalKeys are the keys of a drive goal, on an atoms element or a cloud.
var goalKeys = []KeySpec{
	choice("goal", GoalKinds, false, "the drive goal: the collective-emission threshold, a saturation parameter, a Rabi frequency or a trap depth", `"trap_depth"`),
	{Key: "goal_value", Kind: ValQuantity, Dims: []units.Dimension{units.Dimensionless, units.Frequency, units.Temperature}, With: []string{"goal"}, Doc: "the goal's value, to reach at least: s for saturation, Ω/2π for rabi, U/k_B (or U/h in Hz) for trap_depth (none for collective)", Example: `"0.5 mK"`},
	{Key: "goal_max", Kind: ValQuantity, Dims: []units.Dimension{units.Dimensionless, units.Frequency, units.Temperature}, With: []string{"goal"}, Doc: "instead of goal_value, a value to stay at or below (imaging light that must not saturate: goal = \"saturation\", goal_max = 0.1); not for collective", Example: `"1 mK"`},
	with(number("goal_factor", 0, 0, false, "collective: the multiple of the threshold drive to reach", "1.5"), "goal="+GoalCollective),
}

// goalNeeds: every goal but the collective one needs its value.
var goalNeeds = []Requirement{
	{If: "goal", Is: GoalSaturation, AnyOf: []string{"goal_value", "goal_max"}, Why: "a saturation goal needs its saturation parameter"},
	{If: "goal", Is: GoalRabi, AnyOf: []string{"goal_value", "goal_max"}, Why: "a Rabi-frequency goal needs its Ω/2π"},
	{If: "goal", Is: GoalTrapDepth, AnyOf: []string{"goal_value", "goal_max"}, Why: "a trap-depth goal needs its depth"},
}

// SetupTables lists the tables of the format; the element table holds the
// keys every element type takes, and Kinds adds each type's own.
//
// The setup format's key table: every table of a setup file, every key it
// takes, what kind of value, which keys are required (always, or when
// another key has a given value). The loader reads keys only from this
// table (table.get refuses any other), tests check that it accepts and
// requires exactly what the table says, and `beamledger schema` writes the
// table as a JSON Schema for editors.
var SetupTables = []*TableSpec{
	{Name: "setup", Path: "[setup]", Doc: "who, where, and evaluation-wide choices", Keys: []KeySpec{
		text("title", false, "the setup's title, printed on every page of the sign-off", `"Elongated cloud, table C"`),
		text("site", false, "where the table stands", `"Example Institute, room 2.14"`),
		text("prepared_by", false, "who prepared the setup", `"R. Example"`),
		text("revision", false, "the setup's revision", `"draft 3"`),
		quantity("exposure", units.Time, false, "the viewing duration for every wavelength (default: 0.25 s in 400–700 nm, 10 s elsewhere)", `"10 s"`),
		with(text("exposure_reason", false, "why a viewing duration shorter than the default is accepted (required for one)", `"shutter interlock closes within 0.1 s"`), "exposure"),
		choice("limits", limits.LimitSets, false, `the exposure limits the workplace must apply: "strictest" (default: IEC 60825-1:2014 and the EU directive 2006/25/EC, the lower value governing), "IEC 60825-1:2014" or "2006/25/EC"; classes always follow IEC 60825-1:2014`, `"strictest"`),
	}},
	{Name: "laser", Path: "[[laser]]", Doc: "a source", Keys: []KeySpec{
		nameKey,
		quantity("wavelength", units.Length, true, "the vacuum wavelength", `"780.24 nm"`),
		quantity("power", units.Power, true, "the most the source can emit: the hazards use it", `"1.5 W"`),
		quantity("operating_power", units.Power, false, "the power the drive budget assumes (default: power)", `"1.1 W"`),
		{Key: "waist", Kind: ValPair, Dims: []units.Dimension{units.Length}, Required: true, Doc: "1/e² intensity radius at the waist, one value or [x, y]", Example: `["1.1 mm", "0.6 mm"]`},
		{Key: "m2", Kind: ValPair, Dims: []units.Dimension{units.Dimensionless}, Min: 1, Doc: "beam quality M², one value or [x, y] (default 1)", Example: `[1.6, 1.3]`},
		{Key: "waist_at", Kind: ValPair, Dims: []units.Dimension{units.Length}, Doc: "where the waist lies from the output, one value or [x, y] (default 0)", Example: `["0 mm", "60 mm"]`},
		choice("emission", EmissionValues, false, "continuous or pulsed (default cw)", `"cw"`),
		with(quantity("pulse_duration", units.Time, false, "pulsed: the pulse duration", `"7 ns"`), "emission="+EmissionPulsed, "repetition_rate"),
		with(quantity("repetition_rate", units.Frequency, false, "pulsed: the repetition rate", `"10 Hz"`), "emission="+EmissionPulsed, "pulse_duration"),
		quantity("detuning", units.Frequency, false, "the laser frequency minus the driven transition's; or in linewidths of the transition of the clouds it reaches, \"-2.5 Γ\" or \"-2.5 Gamma\"", `"80 MHz"`),
		text("maker", false, "inventory: the maker", `"Example Photonics"`),
		text("model", false, "inventory: the model", `"TA-780"`),
		text("serial", false, "inventory: the serial number", `"SN 0042"`),
		choice("label_class", LabelClasses, false, "inventory: the class on the laser's label (compared with the class computed for the beam as used)", `"4"`),
		text("location", false, "inventory: where the laser stands", `"table C, north end"`),
	}, Needs: []Requirement{
		{If: "emission", Is: EmissionPulsed, AnyOf: []string{"pulse_duration"}, Why: "a pulsed source needs its pulse duration"},
		{If: "emission", Is: EmissionPulsed, AnyOf: []string{"repetition_rate"}, Why: "a pulsed source needs its repetition rate"},
	}},
	{Name: "path", Path: "[[path]]", Doc: "a beam path from a laser or a splitter's other port", Keys: []KeySpec{
		nameKey,
		text("from", true, `a laser, or "<path>:<splitter name>" for a splitter's other port`, `"repump"`),
		choice("access", AccessValues, false, "the first segment: open (default), enclosed or in vacuum", `"enclosed"`),
		with(text("into", false, `"<path>:<combiner name>": the path ends at that combiner`, `"cool:pbs"`), "into_at"),
		with(quantity("into_at", units.Length, false, "with into: the free-space distance from the path's start to the combiner", `"350 mm"`), "into"),
		{Key: "element", Kind: ValTables, Table: "element", Doc: "the path's elements, in order", Example: `[{ type = "lens", at = "100 mm", focal_length = "50 mm" }]`},
	}, Needs: []Requirement{
		{If: "into", AnyOf: []string{"into_at"}, Why: "a path into a combiner needs its distance to it"},
	}},
	{Name: "element", Path: "[[path.element]]", Doc: "an optic, cloud or dump along a path; its type decides which other keys it takes", Keys: []KeySpec{
		{Key: "type", Kind: ValChoice, Required: true, Doc: "the element type", Example: `"lens"`},
		{Key: "name", Kind: ValName, Doc: "a name (required for splitters and combiners, which other paths refer to)", Example: `"pick"`},
		quantity("at", units.Length, true, "free-space distance from the start of the path", `"300 mm"`),
		quantity("aperture", units.Length, false, "clear aperture diameter", `"25 mm"`),
		fractionKey("transmission", "the fraction passed on (a splitter: sent on along this path)", "0.99"),
		choice("access", AccessValues, false, "the segment after this element: open, enclosed or in vacuum", `"vacuum"`),
		fractionKey("surface_reflectance", "the reflectance of each surface, for stray reflections (default 0.04, uncoated)", "0.005"),
		{Key: "damage_threshold", Kind: ValQuantity, Dims: []units.Dimension{units.LinearPowerDensity, units.RadiantExposure}, Doc: "the optic's damage threshold: a linear power density (cw) or a radiant exposure (pulsed)", Example: `"5 kW/cm"`},
		quantity("damage_pulse_duration", units.Time, false, "with a radiant-exposure damage threshold: the pulse duration it was measured at", `"10 ns"`),
	}},
	{Name: "cloud", Path: "[[cloud]]", Doc: "an atom cloud, driven by the atoms elements that name it", Keys: append([]KeySpec{
		nameKey,
		{Key: "transition", Kind: ValChoice, Required: true, Doc: `the driven transition: built in, or "custom" with wavelength and linewidth`, Example: `"Rb87 D2"`},
		number("atoms", 0, 0, true, "the number of atoms", "2.0e4"),
		{Key: "rms_size", Kind: ValTriple, Dims: []units.Dimension{units.Length}, Required: true, Doc: "rms sizes along the cloud's x, y and z axes", Example: `["6 um", "6 um", "150 um"]`},
		choice("saturation", SaturationValues, false, "which saturation intensity: the cycling transition's (default) or the isotropic one", `"cycling"`),
		quantity("collective_rate", units.Frequency, false, "the collective decay rate, when known (default: estimated from the optical depth)", `"2 MHz"`),
		choice("down", DownValues, false, `gravity's direction in the cloud's frame (default "-y")`, `"-y"`),
		{Key: "excited_polarizability", Kind: ValByLaser, Doc: "the excited state's polarizability at each trap laser's wavelength, atomic units", Example: `{ trap = -1200 }`},
	}, append(slices.Clone(goalKeys),
		KeySpec{Key: "goal_lasers", Kind: ValNames, With: []string{"goal"}, Doc: "the lasers whose power the cloud's goal scales", Example: `["trap"]`},
		with(quantity("wavelength", units.Length, false, "custom transition: its wavelength", `"671 nm"`), "transition=custom", "linewidth"),
		with(quantity("linewidth", units.Frequency, false, "custom transition: its linewidth Γ/2π", `"5.87 MHz"`), "transition=custom", "wavelength"),
		with(quantity("saturation_intensity", units.Irradiance, false, "custom transition: its saturation intensity (default: the two-level value)", `"2.54 mW/cm2"`), "transition=custom", "wavelength", "linewidth"),
		with(quantity("mass", units.Mass, false, "custom transition: the atom's mass", `"6.015 u"`), "transition=custom", "wavelength", "linewidth"),
	)...), Needs: append([]Requirement{
		{If: "transition", Is: "custom", AnyOf: []string{"wavelength"}, Why: "a custom transition needs its wavelength"},
		{If: "transition", Is: "custom", AnyOf: []string{"linewidth"}, Why: "a custom transition needs its linewidth"},
	}, goalNeeds...)},
	{Name: "eyewear", Path: "[[eyewear]]", Doc: "eyewear the group holds, with the optical density of each band", Keys: []KeySpec{
		nameKey,
		{Key: "bands", Kind: ValTables, Table: "band", Required: true, Doc: "the bands of the eyewear", Example: `[{ from = "740 nm", to = "1100 nm", od = 7 }]`},
	}},
	{Name: "band", Path: "bands = [{ … }]", Doc: "one band of a pair of eyewear", Keys: []KeySpec{
		quantity("from", units.Length, true, "the band's shortest wavelength", `"740 nm"`),
		quantity("to", units.Length, true, "the band's longest wavelength", `"1100 nm"`),
		number("od", 0, 0, true, "the optical density over the band", "7"),
		text("en207", false, "the band's EN 207 marking: test conditions (D, I, R, M) and scale number, several joined by +", `"D LB6 + IR LB7"`),
	}},
	{Name: "signoff", Path: "[signoff]", Doc: "what the sign-off document carries for the officer", Keys: []KeySpec{
		{Key: "conditions", Kind: ValTexts, Doc: "the officer's conditions, printed in the sign-off's conditions box", Example: `["align at 1 mW or less with the attenuator in place"]`},
		text("review", false, "the date by which the setup is reviewed again (YYYY-MM-DD)", `"2027-06-01"`),
	}},
	{Name: "controls", Path: "[controls]", Doc: "the control measures in place", Keys: []KeySpec{
		choice("eyewear", []string{EyewearWorn, ControlNone}, false, "worn: the [[eyewear]] entries are worn by everyone in the area while any laser is on (default none)", `"worn"`),
		choice("entry", []string{EntryInterlock, EntryWarning, EntrySign, ControlNone}, false, "the strongest entry control at the area's doors (default none)", `"interlock"`),
		choice("key_control", []string{KeyInPlace, ControlNone}, false, "in_place: the lasers' keys are held by a named person (default none)", `"in_place"`),
		choice("warning_signs", []string{SignsPosted, ControlNone}, false, "posted: laser warning signs at the area's entrances (default none)", `"posted"`),
		choice("training", []string{TrainingDone, ControlNone}, false, "completed: everyone who works in the area has had laser safety training (default none)", `"completed"`),
		choice("perimeter", []string{PerimeterBarrier, ControlNone}, false, "barrier: a barrier around the table's edge stops beams that leave it (default none)", `"barrier"`),
		with(quantity("perimeter_rating", units.Irradiance, false, "the irradiance the perimeter barrier withstands", `"100 W/cm2"`), "perimeter="+PerimeterBarrier),
		text("procedure", false, "the written operating procedure's reference", `"LAB-SOP-12 rev. 2"`),
		text("alignment_procedure", false, "the written alignment procedure's reference", `"LAB-ALIGN-3"`),
		text("officer", false, "the laser safety officer's name", `"Dr. A. Example"`),
		text("notes", false, "anything else the officer should know", `"curtain closed during alignment"`),
	}, Needs: []Requirement{
		{If: "perimeter", Is: PerimeterBarrier, AnyOf: []string{"perimeter_rating"}, Why: "a perimeter barrier needs the irradiance it withstands"},
	}},
}

// TableNamed returns the spec of a table of the format.
func TableNamed(name string) *TableSpec {
	for _, t := range SetupTables {
		if t.Name == name {
			return t
		}
	}
	return nil
}

// TopKeys are the keys of a setup file's top level, each an array of
// tables but setup.
var TopKeys = []KeySpec{
	{Key: "setup", Table: "setup", Doc: "who, where, and evaluation-wide choices"},
	{Key: "laser", Kind: ValTables, Table: "laser", Required: true, Doc: "the sources"},
	{Key: "path", Kind: ValTables, Table: "path", Doc: "the beam paths"},
	{Key: "cloud", Kind: ValTables, Table: "cloud", Doc: "the atom clouds"},
	{Key: "eyewear", Kind: ValTables, Table: "eyewear", Doc: "the eyewear the group holds"},
	{Key: "controls", Table: "controls", Doc: "the control measures in place"},
	{Key: "signoff", Table: "signoff", Doc: "what the sign-off document carries for the officer"},
}

func init() {
	// Choices whose values live elsewhere.
	el := TableNamed("element")
	for _, k := range Kinds {
		el.Key("type").Enum = append(el.Key("type").Enum, string(k.Type))
	}
	for _, alias := range slices.Sorted(maps.Keys(typeAliases)) {
		el.Key("type").Enum = append(el.Key("type").Enum, string(alias))
	}
	TableNamed("cloud").Key("transition").Enum = append(atoms.Names(), "custom")
}

// elementReadSpecs are the keys the loader reads of each element type,
// built when a setup is first read (not at start-up: every command would
// pay for them).
var elementReadSpecs = sync.OnceValue(func() map[ElementType]*TableSpec {
	el := TableNamed("element")
	specs := map[ElementType]*TableSpec{}
	for _, k := range Kinds {
		spec := ElementTable(k)
		if k.Type == TypeMirror {
			// The loader reads a mirror's transmission only to refuse it
			// with its reason (the throughput is the reflectivity).
			spec.Keys = append(spec.Keys, *el.Key("transmission"))
		}
		specs[k.Type] = spec
	}
	return specs
})

// ElementTable is the spec of one element type: the common element keys
// and the type's own, with the type's requirements.
func ElementTable(k *ElementKind) *TableSpec {
	common := TableNamed("element")
	t := &TableSpec{Name: "element " + string(k.Type), Path: common.Path, Doc: k.Does, Keys: slices.Clone(common.Keys), Needs: k.Needs}
	for i := range t.Keys {
		if t.Keys[i].Key == "name" && (k.Type == TypeSplitter || k.Type == TypeCombiner) {
			t.Keys[i].Required = true
		}
	}
	if k.Type == TypeMirror {
		t.Keys = slices.DeleteFunc(t.Keys, func(s KeySpec) bool { return s.Key == "transmission" })
	}
	t.Keys = append(t.Keys, k.Keys...)
	return t
}
