package safety

import (
	"fmt"
	"maps"
	"math"
	"runtime"
	"slices"
	"sort"
	"strings"
	"sync"
	"sync/atomic"

	"beamledger/budget"
	"beamledger/budget/numeric"
	"beamledger/budget/optics"
	"beamledger/budget/setup"
	"beamledger/budget/units"
	"beamledger/limits"
)

// Standard names the standard and edition the limits come from.
const Standard = "IEC 60825-1:2014 (Edition 3)"

// ClassBasis says which standard the classes follow, whatever the limit set.
const ClassBasis = "classes by IEC 60825-1:2014 (the directive has no classes)"

// LimitsBasis says in words which exposure limits a choice of limit set
// applies.
func LimitsBasis(set limits.LimitSet) string {
	return set.Describe()
}

// GoverningSet says in words which set a limit came from, given the set
// chosen.
func GoverningSet(chosen, gov limits.LimitSet) string {
	if chosen != limits.SetStrictest {
		return "from " + gov.Governs() + " (the set chosen)"
	}
	switch gov {
	case limits.SetBoth:
		return "both sets give this value"
	case limits.SetDirective:
		return "2006/25/EC governs (stricter than IEC 60825-1:2014 here)"
	}
	return "IEC 60825-1:2014 governs (stricter than 2006/25/EC here)"
}

// Default viewing durations for unintended exposure, s: the aversion response
// in the visible, 10 s elsewhere.
const (
	DurationVisible = setup.AversionExposure
	DurationOther   = setup.InvisibleExposure
)

// DefaultSurfaceReflectance is assumed per uncoated glass surface (common
// practice: about 4 % at normal incidence for n ≈ 1.5).
const DefaultSurfaceReflectance = 0.04

// DefaultDiffuseReflectance is assumed for a diffuse reflector (conservative).
const DefaultDiffuseReflectance = 1.0

// FiberFaceLimit is the irradiance on a fibre's input face above which
// common practice expects damage to a clean silica face, W/m² (1 MW/cm²).
const FiberFaceLimit = 1e10

// LaserLimits are the exposure limits for one source at its viewing
// duration.
type LaserLimits struct {
	Laser    *setup.Laser
	Duration float64 // s
	// LimitSet is the set of limits chosen ([setup] limits); EyeSet and
	// SkinSet the set each governing limit (EyeIrradiance, SkinIrradiance)
	// comes from (limits.SetBoth where the two sets agree).
	LimitSet        limits.LimitSet
	EyeSet, SkinSet limits.LimitSet
	Eye             limits.Limit
	// EyeIrradiance is the irradiance limit against which average
	// irradiances are compared, W/m² (pulsed: per-pulse limit × rate).
	EyeIrradiance  float64
	EyeRule        string
	Skin           limits.Limit
	SkinIrradiance float64
	EyeAperture    float64 // m
	SkinAperture   float64 // m
	AEL            limits.AEL
	Class          string // "" when not assessed
	ClassNote      string
	Pulsed         *limits.PulsedLimit
	// EyeApertureRow and SkinApertureRow are where the apertures come from.
	EyeApertureRow, SkinApertureRow limits.Provenance
	// For a pulsed source at its maximum (average) power: the energy of a
	// pulse (J) and its peak power (W).
	PulseEnergy, PeakPower float64
	// EN207Mode is the EN 207 test condition of the source (D, I, R or M).
	EN207Mode string
	// AlignmentPower is the highest power at which every segment of the
	// laser's beams, enclosed ones taken as opened, stays within the eye and
	// skin MPE, W (AlignmentPower); AlignmentOD the optical density of an
	// attenuator that brings the operating power down to it (0: none).
	AlignmentPower, AlignmentOD float64
}

// Rows lists where every limit used for the laser comes from.
func (ll *LaserLimits) Rows() []limits.Provenance {
	rows := []limits.Provenance{ll.Eye.Provenance, ll.Skin.Provenance, ll.EyeApertureRow, ll.SkinApertureRow,
		ll.AEL.Class1Row, ll.AEL.Class2Row, ll.AEL.Class3RRow, ll.AEL.Class3BRow, limits.TimeBaseRow()}
	for _, k := range slices.Sorted(maps.Keys(ll.Eye.Factors)) {
		rows = append(rows, limits.FactorProvenance(k))
	}
	if p := ll.Pulsed; p != nil {
		rows = append(rows, p.Single.Provenance, p.AvgLimit.Provenance, limits.TminRow(ll.Laser.Wavelength), p.Provenance)
		if p.TrainApplies {
			rows = append(rows, limits.FactorProvenance("C5"))
		}
	}
	return rows
}

// ViewingDuration is the assumed exposure for wavelength λ: the setup's
// exposure if stated, else 0.25 s in 400–700 nm and 10 s elsewhere.
func ViewingDuration(s *setup.Setup, λ float64) float64 {
	if s.Meta.Exposure > 0 {
		return s.Meta.Exposure
	}
	return setup.DefaultViewingDuration(λ)
}

// DurationAssumption says in words which viewing durations the evaluation
// used, and why a stated one was accepted.
func DurationAssumption(s *setup.Setup) string {
	if s.Meta.Exposure == 0 {
		return "0.25 s in 400–700 nm (aversion response) and 10 s elsewhere, for unintended viewing"
	}
	d := units.FormatSI(s.Meta.Exposure, "s") + " at every wavelength, as the setup states"
	if s.Meta.ExposureReason != "" {
		d += " (reason given: " + s.Meta.ExposureReason + ")"
	}
	return d
}

func laserLimits(s *setup.Setup, las *setup.Laser) (*LaserLimits, error) {
	t := ViewingDuration(s, las.Wavelength)
	set := s.Meta.Limits
	ll := &LaserLimits{Laser: las, Duration: t, LimitSet: set}
	var err error
	if ll.Eye, err = limits.EyeMPEIn(set, las.Wavelength, t, 0); err != nil {
		return nil, fmt.Errorf("laser %q: %w", las.Name, err)
	}
	if ll.Skin, err = limits.SkinMPEIn(set, las.Wavelength, t); err != nil {
		return nil, fmt.Errorf("laser %q: %w", las.Name, err)
	}
	ll.EyeIrradiance, ll.EyeRule, ll.SkinIrradiance = ll.Eye.Irradiance, ll.Eye.Rule, ll.Skin.Irradiance
	ll.EyeSet, ll.SkinSet = ll.Eye.Set, ll.Skin.Set
	if las.Emission == setup.EmissionPulsed {
		p, err := limits.PulsedEyeMPEIn(set, las.Wavelength, las.PulseDuration, las.RepetitionRate, t, 0)
		if err != nil {
			return nil, fmt.Errorf("laser %q: %w", las.Name, err)
		}
		ll.Pulsed = &p
		ll.EyeIrradiance, ll.EyeSet = p.Irradiance, p.Set
		ll.EyeRule = fmt.Sprintf("repetitive pulses, the %s rule governs: %s J/m² per pulse × %s", p.Rule, units.FormatNumber(p.PerPulse), units.FormatFrequency(las.RepetitionRate))
		sp, err := limits.SkinMPEIn(set, las.Wavelength, las.PulseDuration)
		if err == nil {
			if e := math.Min(sp.RadiantExposure, ll.Skin.RadiantExposure/math.Max(1, las.RepetitionRate*t)) * las.RepetitionRate; e < ll.SkinIrradiance {
				ll.SkinIrradiance = e
				if sp.RadiantExposure*las.RepetitionRate == e {
					ll.SkinSet = sp.Set
				}
			}
		}
	}
	if ll.EyeAperture, ll.EyeApertureRow, err = limits.EyeAperture(las.Wavelength, t); err != nil {
		return nil, err
	}
	if ll.SkinAperture, ll.SkinApertureRow, err = limits.SkinAperture(las.Wavelength, t); err != nil {
		return nil, err
	}
	ll.EN207Mode = limits.EN207Mode(las.Emission == setup.EmissionPulsed, las.PulseDuration)
	if las.Emission == setup.EmissionPulsed {
		ll.PulseEnergy = optics.PulseEnergy(las.Power, las.RepetitionRate)
		ll.PeakPower = optics.PulsePeakPower(ll.PulseEnergy, las.PulseDuration)
	}
	if ll.AEL, err = limits.ContinuousAEL(las.Wavelength, 0); err != nil {
		return nil, err
	}
	if las.Emission == setup.EmissionCW {
		ll.Class = limits.ClassOf(las.Power, ll.AEL)
		ll.ClassNote = "by maximum power against the continuous-emission AELs, the whole beam taken to enter the aperture (1M/2M not distinguished)"
	} else {
		ll.ClassNote = "not assessed: the pulse AELs are not implemented; the class must come from the laser's label or the laser safety officer"
	}
	return ll, nil
}

// Exposure is the worst aperture-averaged irradiance on one open segment, at
// the laser's maximum power.
type Exposure struct {
	Path       *budget.PathBudget
	Segment    budget.Segment
	Laser      *LaserLimits
	At         float64 // position of the worst point along the path, m
	Power      float64 // W in the segment
	Irradiance float64 // eye-aperture-averaged, W/m²
	Ratio      float64 // ÷ eye MPE
	SkinIrr    float64 // skin-aperture-averaged, W/m²
	SkinRatio  float64
	OD         float64
	PeakIrr    float64 // peak irradiance at the worst point, of the average power, W/m²
	// BeamIrradiance is the beam's own highest power density on the
	// segment, W/m²: its peak irradiance where it is narrowest (PeakAlong),
	// at the average power; BeamPulseExposure its energy density per pulse,
	// J/m² (pulsed). EN 207 scale numbers are rated against these.
	BeamIrradiance, BeamPulseExposure float64
	// For a pulsed source: the radiant exposure of one pulse averaged over
	// the eye aperture (J/m²) and the peak irradiance during a pulse at the
	// worst point (W/m²).
	PulseRadiantExposure, PulsePeakIrr float64
	OpenEnd                            bool
	// Wavelengths lists every wavelength on the segment (the beams sharing
	// it). CombinedEyeRatio and CombinedSkinRatio sum the ratios on the
	// segment whose effects add to this one's (limits.EffectsAdd), itself
	// included; Additive counts the beams in the eye sum. OD is then the
	// shared OD of limits.SharedOD.
	Wavelengths []float64
	// Lasers are the lasers of the beams on the segment, one per beam.
	Lasers                              []*setup.Laser
	CombinedEyeRatio, CombinedSkinRatio float64
	Additive                            int
	NOHD                                float64 // for an open end: distance beyond the last element, m
	// Enclosed marks an enclosed segment's exposure, as when its enclosure
	// is opened for alignment.
	Enclosed bool
	// Geometry names, when the setup has toleranced positions, focal
	// lengths or waists, the geometry within those tolerances at which the
	// figures are worse than at the nominal values: the one of the highest
	// eye ratio, else of the longest NOHD, else of the other figures ("":
	// the nominal values give the worst). Each figure is then the highest
	// over the geometries evaluated (geometry.go).
	Geometry string
}

// ReflectionKind says how light leaves a path at a surface.
type ReflectionKind string

// Reflection kinds: a surface's stray reflection, a beam escaping through a
// mirror or in an AOM's unused orders, and the diffuse zone around a dump or
// A path's end.
const (
	ReflectionStray    ReflectionKind = "stray"
	ReflectionEscaping ReflectionKind = "escaping"
	ReflectionDiffuse  ReflectionKind = "diffuse"
)

// Finding kinds of the hazard evaluation.
const (
	FindingClassNotAssessed budget.FindingKind = "class_not_assessed"
	FindingLabelClass       budget.FindingKind = "label_class_differs"
	FindingDiffuseZone      budget.FindingKind = "diffuse_zone"
	FindingNoEN207Filter    budget.FindingKind = "no_en207_filter"
	FindingExposure         budget.FindingKind = "exposure_above_mpe"
	FindingStray            budget.FindingKind = "stray_reflection"
	FindingEscaping         budget.FindingKind = "escaping_beam"
	FindingEyewearGap       budget.FindingKind = "eyewear_gap"
	FindingDamage           budget.FindingKind = "damage"
	FindingDamageUnchecked  budget.FindingKind = "damage_unchecked"
	FindingFibreFace        budget.FindingKind = "fibre_face"
)

// Reflection is a stray reflection from a surface, or a diffuse hazard zone.
type Reflection struct {
	Path        *budget.PathBudget
	Element     *setup.Element
	Kind        ReflectionKind
	Reflectance float64
	Assumed     bool // the reflectance was a default
	Surfaces    int
	Power       float64 // per surface, W
	Irradiance  float64 // at the surface, eye-aperture-averaged, W/m²
	Ratio       float64
	OD          float64
	Radius      float64 // diffuse: nominal hazard zone radius, m
	Laser       *LaserLimits
	// Geometry names, as for an exposure (Exposure.Geometry), the geometry
	// within toleranced positions, focal lengths and waists whose figures
	// these are, when worse than the nominal geometry's ("" otherwise).
	Geometry string
}

// EyewearNeed is what eyewear must give at one wavelength.
type EyewearNeed struct {
	Wavelength float64
	// Mode is the EN 207 test condition (D, I, R, M) of the sources at this
	// wavelength; a wavelength with sources of two kinds has a need for each.
	Mode    string
	OD      float64
	LB      int
	LBValid bool
	// PulseRadiantExposure is the largest eye-aperture-averaged radiant
	// exposure of one pulse on an open segment, J/m² (pulsed modes).
	PulseRadiantExposure float64
	// Irradiance is the largest eye-aperture-averaged irradiance on an open
	// segment at this wavelength, W/m² (the basis of the OD).
	Irradiance float64
	// BeamIrradiance and BeamPulseExposure are the largest power density
	// (W/m²) and energy density per pulse (J/m²) of a beam itself on an
	// open segment at this wavelength: the EN 207 scale number must
	// withstand them.
	BeamIrradiance, BeamPulseExposure float64
	CoveredBy                         []string
}

// Hazards is the safety half of the assessment.
type Hazards struct {
	Lasers    []*LaserLimits
	Exposures []*Exposure
	// Enclosed are the exposures of the enclosed segments as they would be
	// with the enclosure opened for alignment: figures only, never a
	// finding (the enclosure controls them).
	Enclosed    []*Exposure
	Reflections []*Reflection
	Eyewear     []*EyewearNeed
	Findings    []budget.Finding
	// Controls are the control measures the classes present may need, each
	// with whether the setup declares it.
	Controls []ControlCheck
	// DefaultsAssumed lists default values the evaluation had to assume.
	DefaultsAssumed []string
	// Sweep says what the sweep over toleranced positions, focal lengths
	// and waists evaluated (nil: the setup has none).
	Sweep *Sweep
}

// pathsPerWorker is the least number of paths worth another core.
const pathsPerWorker = 16

// evaluateHazards evaluates the hazards of setup s on its hazard budget b.
// sw holds the hazards at the other geometries of the sweep over
// toleranced geometry (geometry.go), nil when there is none: each
// exposure's figures, the eyewear needed and the alignment powers are then
// the worst over them and this one, and the controls are judged against
// that eyewear.
func evaluateHazards(s *setup.Setup, b *budget.Budget, sw *sweepFigures) (*Hazards, error) {
	h := &Hazards{}
	byLaser := map[*setup.Laser]*LaserLimits{}
	for _, las := range s.Lasers {
		ll, err := laserLimits(s, las)
		if err != nil {
			return nil, err
		}
		byLaser[las] = ll
		h.Lasers = append(h.Lasers, ll)
		if ll.Class == "" {
			h.Findings = append(h.Findings, budget.Finding{Severity: budget.SeverityNote, Kind: FindingClassNotAssessed,
				Message: fmt.Sprintf("laser %q: class %s", las.Name, ll.ClassNote)})
		}
		if msg := LabelClassNote(las.LabelClass, ll.Class); msg != "" {
			h.Findings = append(h.Findings, budget.Finding{Severity: budget.SeverityNote, Kind: FindingLabelClass, Message: fmt.Sprintf("laser %q: %s", las.Name, msg)})
		}
	}
	// Paths are independent: evaluate them on all cores (a few paths are
	// done sooner on one), then gather the results in the setup's order so
	// the output does not depend on timing.
	results := make([]pathHazardResult, len(b.Paths))
	workers := min(runtime.GOMAXPROCS(0), len(b.Paths)/pathsPerWorker)
	if workers <= 1 {
		for i, pb := range b.Paths {
			results[i] = pathHazards(pb, byLaser, sw.envelopeOf())
		}
	} else {
		var (
			wg   sync.WaitGroup
			next atomic.Int64
		)
		for range workers {
			wg.Add(1)
			go func() {
				defer wg.Done()
				for i := int(next.Add(1) - 1); i < len(b.Paths); i = int(next.Add(1) - 1) {
					results[i] = pathHazards(b.Paths[i], byLaser, sw.envelopeOf())
				}
			}()
		}
		wg.Wait()
	}
	strayDefault, diffuseDefault := 0, 0
	var refs []hazardRef
	for _, r := range results {
		h.Exposures = append(h.Exposures, r.exposures...)
		h.Enclosed = append(h.Enclosed, r.enclosed...)
		h.Reflections = append(h.Reflections, r.reflections...)
		for _, ref := range r.hazards {
			ref.index += len(h.Findings)
			refs = append(refs, ref)
		}
		h.Findings = append(h.Findings, r.findings...)
		strayDefault += len(r.strayDefault)
		diffuseDefault += len(r.diffuseDefault)
	}
	if strayDefault > 0 {
		h.DefaultsAssumed = append(h.DefaultsAssumed, fmt.Sprintf("surface reflectance %g per surface (uncoated glass, common practice) at %d element(s) without surface_reflectance", DefaultSurfaceReflectance, strayDefault))
	}
	if diffuseDefault > 0 {
		h.DefaultsAssumed = append(h.DefaultsAssumed, fmt.Sprintf("diffuse reflectance %g (conservative) at %d dump(s) or path end(s) without diffuse_reflectance", DefaultDiffuseReflectance, diffuseDefault))
	}
	for i, ll := range h.Lasers {
		worst := max(h.worstRatio(ll), sw.worstOf(i))
		ll.AlignmentPower = AlignmentPower(ll.Laser.Power, worst)
		ll.AlignmentOD = limits.OpticalDensity(ll.Laser.OperatingPower / ll.AlignmentPower)
	}
	h.Eyewear = eyewearNeeds(h, sw.needsOf())
	controlHazards(s, h, h.Findings, refs)
	h.Findings = append(h.Findings, checkEyewear(s, h.Eyewear)...)
	checks, missing := CheckControls(s, h)
	h.Controls = checks
	h.Findings = append(h.Findings, missing...)
	return h, nil
}

// pathHazardResult is what one path contributes to the hazards.
type pathHazardResult struct {
	exposures   []*Exposure
	enclosed    []*Exposure
	reflections []*Reflection
	findings    []budget.Finding
	// hazards ties each hazard finding to its lasers (indexes in findings)
	hazards []hazardRef
	// the elements (nil: the open end) where a default reflectance was
	// assumed, each counted once however many beams reach it
	strayDefault, diffuseDefault map[*setup.Element]bool
	// envelope holds the worst figures of each exposure over the sweep's
	// geometries (nil: no sweep)
	envelope *envelope
}

// pathHazards evaluates the open segments, reflections and damage of one
// path, for every beam on it, at the lasers' maximum powers; exposures of
// beams that share a segment are combined (combine).
func pathHazards(own *budget.PathBudget, byLaser map[*setup.Laser]*LaserLimits, env *envelope) pathHazardResult {
	res := pathHazardResult{strayDefault: map[*setup.Element]bool{}, diffuseDefault: map[*setup.Element]bool{}, envelope: env}
	for _, pb := range own.Beams() {
		ll := byLaser[pb.Laser]
		for _, seg := range pb.Segments {
			res.segment(pb, ll, seg)
		}
		for i := range pb.Rows {
			res.element(pb, ll, i)
		}
		if pb.OpenEnd && pb.EndFraction > 0 {
			// What the escaping beam hits may reflect diffusely.
			n := len(pb.Rows)
			var last *setup.Element
			if n > 0 {
				last = pb.Rows[n-1].Element
			}
			res.diffuseDefault[last] = true
			res.diffuseZone(pb, ll, diffuse(pb, last, ll, pb.EndFraction*pb.Laser.Power, DefaultDiffuseReflectance, true))
		}
	}
	res.findings = append(res.findings, damage(own)...)
	// The segments' findings come first, as they always have.
	elementFindings, elementHazards := res.findings, res.hazards
	res.findings, res.hazards = nil, nil
	res.combine()
	for _, h := range elementHazards {
		h.index += len(res.findings)
		res.hazards = append(res.hazards, h)
	}
	res.findings = append(res.findings, elementFindings...)
	return res
}

// segment evaluates one open segment of a beam at its worst point, with the
// NOHD of an open end. Its finding is made by combine, which knows the
// other beams on the segment.
func (res *pathHazardResult) segment(pb *budget.PathBudget, ll *LaserLimits, seg budget.Segment) {
	if seg.Access == setup.AccessVacuum || seg.Fraction <= 0 || seg.Arrival {
		return
	}
	e := measureSegment(pb, ll, seg)
	// With toleranced geometry, each figure the worst over the sweep's
	// geometries before the figures derived from them.
	res.envelope.raise(e)
	e.OD = limits.OpticalDensity(e.Ratio)
	e.Wavelengths = []float64{pb.Laser.Wavelength}
	e.Lasers = []*setup.Laser{pb.Laser}
	e.CombinedEyeRatio, e.CombinedSkinRatio, e.Additive = e.Ratio, e.SkinRatio, 1
	if las := pb.Laser; las.Emission == setup.EmissionPulsed {
		e.BeamPulseExposure = optics.PulseEnergy(e.BeamIrradiance, las.RepetitionRate)
		e.PulseRadiantExposure = optics.PulseEnergy(e.Irradiance, las.RepetitionRate)
		e.PulsePeakIrr = optics.PulsePeakPower(optics.PulseEnergy(e.PeakIrr, las.RepetitionRate), las.PulseDuration)
	}
	if seg.Access == setup.AccessEnclosed {
		e.Enclosed = true
		res.enclosed = append(res.enclosed, e)
		return
	}
	res.exposures = append(res.exposures, e)
}

// measureSegment measures one beam's open (or enclosed) segment: the worst
// point of the eye- and skin-aperture-averaged irradiance, the peak
// irradiance there, the beam's own highest power density, and for an open
// end the NOHD. segment works out the figures derived from these.
func measureSegment(pb *budget.PathBudget, ll *LaserLimits, seg budget.Segment) *Exposure {
	p := seg.Fraction * pb.Laser.Power
	irr, at := maxAlong(seg.Beam, p, ll.EyeAperture, seg.To-seg.From)
	skin, _ := maxAlong(seg.Beam, p, ll.SkinAperture, seg.To-seg.From)
	e := &Exposure{Path: pb, Segment: seg, Laser: ll, At: seg.From + at, Power: p, Irradiance: irr,
		Ratio: irr / ll.EyeIrradiance, SkinIrr: skin, SkinRatio: skin / ll.SkinIrradiance,
		PeakIrr: seg.Beam.Propagate(at).PeakIrradiance(p), OpenEnd: math.IsInf(seg.To, 1)}
	e.BeamIrradiance, _ = PeakAlong(seg.Beam, p, seg.To-seg.From)
	if e.OpenEnd {
		e.NOHD = hazardDistance(seg.Beam, p, ll.EyeAperture, ll.EyeIrradiance)
	}
	return e
}

// combine adds up the exposures of the beams that share a segment of the
// path (combineShared), then makes one finding per open segment above a
// limit; the enclosed segments, evaluated as when opened for alignment, are
// combined alike and make no finding.
func (res *pathHazardResult) combine() {
	combineShared(res.enclosed)
	for _, g := range combineShared(res.exposures) {
		res.segmentFinding(g)
	}
}

// combineShared groups exposures by segment: each exposure's combined eye
// (skin) ratio is the sum of the ratios on the segment whose effects on the
// eye (skin) add to its own (limits.EffectsAdd), and its OD holds it to an
// equal share of the limit (limits.SharedOD).
func combineShared(exposures []*Exposure) [][]*Exposure {
	var order []int
	groups := map[int][]*Exposure{}
	for _, e := range exposures {
		k := e.Segment.After
		if _, ok := groups[k]; !ok {
			order = append(order, k)
		}
		groups[k] = append(groups[k], e)
	}
	for _, k := range order {
		g := groups[k]
		if len(g) > 1 {
			var λs []float64
			var names []*setup.Laser
			for _, f := range g {
				if !slices.Contains(λs, f.Laser.Laser.Wavelength) {
					λs = append(λs, f.Laser.Laser.Wavelength)
				}
				names = append(names, f.Laser.Laser)
			}
			for _, e := range g {
				e.Wavelengths, e.Lasers = λs, names
				e.CombinedEyeRatio, e.CombinedSkinRatio, e.Additive = 0, 0, 0
				for _, f := range g {
					eye, skin := limits.EffectsAdd(e.Laser.Laser.Wavelength, f.Laser.Laser.Wavelength)
					if eye {
						e.CombinedEyeRatio += f.Ratio
						e.Additive++
					}
					if skin {
						e.CombinedSkinRatio += f.SkinRatio
					}
				}
				e.OD = limits.SharedOD(e.Ratio, e.Additive)
			}
		}
	}
	out := make([][]*Exposure, 0, len(order))
	for _, k := range order {
		out = append(out, groups[k])
	}
	return out
}

// segmentFinding is the finding of one segment whose exposures (one per
// beam on it) reach a limit, alone or added up.
func (res *pathHazardResult) segmentFinding(g []*Exposure) {
	worst := g[0]
	for _, e := range g {
		if max(e.CombinedEyeRatio, e.CombinedSkinRatio) > max(worst.CombinedEyeRatio, worst.CombinedSkinRatio) {
			worst = e
		}
	}
	if worst.CombinedEyeRatio <= 1 && worst.CombinedSkinRatio <= 1 {
		return
	}
	pb, ll, seg := worst.Path, worst.Laser, worst.Segment
	var msg string
	if len(g) == 1 {
		msg = fmt.Sprintf("%s: up to %s reaches %s × the eye MPE (%s averaged over %s, %s exposure) and %s × the skin MPE; eyewear needs OD %g at %s",
			segmentName(pb.Path, seg), units.FormatPower(worst.Power), units.FormatRatio(worst.Ratio), units.FormatIrradiance(worst.Irradiance), units.FormatLength(ll.EyeAperture),
			units.FormatSI(ll.Duration, "s"), units.FormatRatio(worst.SkinRatio), worst.OD, units.FormatNanometres(pb.Laser.Wavelength))
	} else {
		var parts, ods []string
		for _, e := range g {
			parts = append(parts, fmt.Sprintf("%s %s × (eye), %s × (skin)", units.FormatNanometres(e.Laser.Laser.Wavelength), units.FormatRatio(e.Ratio), units.FormatRatio(e.SkinRatio)))
			ods = append(ods, fmt.Sprintf("OD %g at %s", e.OD, units.FormatNanometres(e.Laser.Laser.Wavelength)))
		}
		msg = fmt.Sprintf("%s: %d beams share the segment (%s); where their effects add the exposures sum to %s × the eye MPE and %s × the skin MPE; eyewear needs %s (each additive wavelength held to an equal share of the limit)",
			segmentName(pb.Path, seg), len(g), strings.Join(parts, "; "), units.FormatRatio(worst.CombinedEyeRatio), units.FormatRatio(worst.CombinedSkinRatio), strings.Join(ods, ", "))
	}
	if worst.OpenEnd {
		msg += fmt.Sprintf("; the escaping beam stays above the MPE for %s beyond the path's end (NOHD)", units.FormatDistance(worst.NOHD, MaxHazardDistance))
	}
	msg += WorstNote(worst.Geometry)
	ref := hazardRef{index: len(res.findings)}
	for _, e := range g {
		ref.lasers = append(ref.lasers, e.Laser)
		ref.eye = ref.eye || e.CombinedEyeRatio > 1
		ref.skin = ref.skin || e.CombinedSkinRatio > 1
	}
	res.hazards = append(res.hazards, ref)
	res.findings = append(res.findings, budget.Finding{Severity: budget.SeverityHazard, Kind: FindingExposure, Path: pb.Path.Name,
		Element: seg.After, At: worst.At, Message: msg}.Figure(worst.CombinedEyeRatio*ll.EyeIrradiance, ll.EyeIrradiance, "W/m2"))
}

// element evaluates the surfaces of row i: its stray reflections, the beams
// leaving the path there, a dump's diffuse zone, and damage.
func (res *pathHazardResult) element(pb *budget.PathBudget, ll *LaserLimits, i int) {
	r := &pb.Rows[i]
	el := r.Element
	in := precedingAccess(pb, i)
	p := r.FractionIn * pb.Laser.Power
	if surfaces := transmissiveSurfaces(el.Type); surfaces > 0 && in == setup.AccessOpen && p > 0 {
		res.stray(pb, ll, r, surfaces, p)
	}
	// Light that leaves the path as a beam: a mirror's leakage behind it
	// and an AOM's undiffracted orders. Each is a beam of the arriving
	// size that must end in a dump.
	if in == setup.AccessOpen || followingAccess(pb, i) == setup.AccessOpen {
		res.escaping(pb, ll, r)
	}
	if el.Type == setup.TypeDump && in == setup.AccessOpen && p > 0 {
		ρ, assumed := DefaultDiffuseReflectance, true
		if el.DiffuseReflectance != nil {
			ρ, assumed = *el.DiffuseReflectance, false
		}
		if assumed {
			res.diffuseDefault[el] = true
		}
		res.diffuseZone(pb, ll, diffuse(pb, el, ll, p, ρ, assumed))
	}
}

// NearestViewing is the closest an eye is taken to view a diffuse
// reflection from, m: 100 mm, the closest distance at which the eye
// accommodates and at which the standard measures extended sources
// (IEC 60825-1:2014, from memory). A nominal hazard zone no larger is listed
// with the reflections but is not a hazard finding.
const NearestViewing = 0.1

// diffuseZone records a diffuse reflection and, when its nominal hazard
// zone reaches past NearestViewing, the hazard of standing within it (an
// eye exposure above the MPE that the eyewear worn can control).
func (res *pathHazardResult) diffuseZone(pb *budget.PathBudget, ll *LaserLimits, rf *Reflection) {
	res.envelope.raiseReflection(rf)
	res.reflections = append(res.reflections, rf)
	if !(rf.Radius > NearestViewing) {
		return
	}
	where, at := "what the beam leaving the path's end meets", 0.0
	index := 0
	if rf.Element != nil {
		where, at, index = fmt.Sprintf("element %d (%s%s)", rf.Element.Index, rf.Element.Label(), beamNote(pb)), rf.Element.At, rf.Element.Index
	}
	if rf.Element != nil && rf.Element.Type != setup.TypeDump {
		where = fmt.Sprintf("what the beam leaving the path after element %d (%s%s) meets", rf.Element.Index, rf.Element.Label(), beamNote(pb))
		index = 0
	}
	res.hazards = append(res.hazards, hazardRef{index: len(res.findings), lasers: []*LaserLimits{ll}, eye: true})
	res.findings = append(res.findings, budget.Finding{Severity: budget.SeverityHazard, Kind: FindingDiffuseZone, Path: pb.Path.Name, Element: index, At: at,
		Message: fmt.Sprintf("%s: its diffuse reflection of %s (ρ = %g%s) stays above the eye MPE within %s of it (nominal hazard zone, small-source MPE, viewed along the normal: conservative)",
			where, units.FormatPower(rf.Power), rf.Reflectance, assumedNote(rf.Assumed), units.FormatDistance(rf.Radius, MaxHazardDistance)) + WorstNote(rf.Geometry)}.Figure(rf.Radius, NearestViewing, "m"))
}

// stray evaluates the reflection of each of an element's surfaces, at the
// surface, for power p arriving.
func (res *pathHazardResult) stray(pb *budget.PathBudget, ll *LaserLimits, r *budget.Row, surfaces int, p float64) {
	el := r.Element
	R, assumed := DefaultSurfaceReflectance, true
	if sr := el.For(pb.Laser).SurfaceReflectance; sr != nil {
		R, assumed = *sr, false
	}
	if assumed {
		res.strayDefault[el] = true
	}
	ref := res.leaving(pb, ll, r, &Reflection{Kind: ReflectionStray, Reflectance: R, Assumed: assumed, Surfaces: surfaces, Power: R * p})
	if ref != nil {
		res.hazards = append(res.hazards, hazardRef{index: len(res.findings), lasers: []*LaserLimits{ll}, eye: true})
		res.findings = append(res.findings, budget.Finding{Severity: budget.SeverityHazard, Kind: FindingStray, Path: pb.Path.Name,
			Element: el.Index, At: el.At, Message: fmt.Sprintf("element %d (%s%s): each of its %d surface(s) reflects %s (R = %g%s), %s × the eye MPE at the surface; block or enclose the back-reflection",
				el.Index, el.Label(), beamNote(pb), surfaces, units.FormatPower(ref.Power), R, assumedNote(assumed), units.FormatRatio(ref.Ratio)) + WorstNote(ref.Geometry)}.Figure(ref.Irradiance, ll.EyeIrradiance, "W/m2"))
	}
}

// escaping evaluates the beams that leave the path at an element: a
// mirror's leakage and an AOM's unused orders.
func (res *pathHazardResult) escaping(pb *budget.PathBudget, ll *LaserLimits, r *budget.Row) {
	el := r.Element
	for _, l := range r.Losses {
		if !budget.EscapingLoss(l.Kind) {
			continue
		}
		what := map[string]string{budget.LossMirror: "leaks through the mirror", budget.LossDiffraction: "leaves in the undiffracted (and other) orders",
			budget.LossCombiner: "leaves the combiner's other port"}[l.Kind]
		ref := res.leaving(pb, ll, r, &Reflection{Kind: ReflectionEscaping, Reflectance: l.Fraction / r.FractionIn, Surfaces: 1, Power: l.Fraction * pb.Laser.Power})
		if ref != nil {
			res.hazards = append(res.hazards, hazardRef{index: len(res.findings), lasers: []*LaserLimits{ll}, eye: true})
			res.findings = append(res.findings, budget.Finding{Severity: budget.SeverityHazard, Kind: FindingEscaping, Path: pb.Path.Name,
				Element: el.Index, At: el.At, Message: fmt.Sprintf("element %d (%s%s): %s %s, %s × the eye MPE; describe where it goes or end it in a rated dump",
					el.Index, el.Label(), beamNote(pb), units.FormatPower(ref.Power), what, units.FormatRatio(ref.Ratio)) + WorstNote(ref.Geometry)}.Figure(ref.Irradiance, ll.EyeIrradiance, "W/m2"))
		}
	}
}

// leaving judges light that leaves the path at row r's element with the
// beam's size there (a surface's reflection, a mirror's leak, an unused
// order): ref gives its kind, reflectance, surfaces and power; leaving fills
// in the aperture-averaged irradiance, the ratio to the eye MPE and the OD,
// and records and returns it when it is above the MPE (nil otherwise).
func (res *pathHazardResult) leaving(pb *budget.PathBudget, ll *LaserLimits, r *budget.Row, ref *Reflection) *Reflection {
	ref.Path, ref.Element, ref.Laser = pb, r.Element, ll
	ref.Irradiance = apertureIrradiance(r.BeamIn, ref.Power, ll.EyeAperture)
	ref.Ratio = ref.Irradiance / ll.EyeIrradiance
	res.envelope.raiseReflection(ref)
	ref.OD = limits.OpticalDensity(ref.Ratio)
	if !(ref.Ratio > 1) {
		return nil
	}
	res.reflections = append(res.reflections, ref)
	return ref
}

// WorstNote ends a finding or a line whose figures come from a geometry
// within the toleranced positions, focal lengths and waists (geometry.go)
// by naming it; nothing for the nominal geometry.
func WorstNote(geometry string) string {
	if geometry == "" {
		return ""
	}
	return "; the worst within the stated tolerances, with " + geometry
}

func assumedNote(assumed bool) string {
	if assumed {
		return ", assumed"
	}
	return ""
}

// diffuse is the nominal hazard zone of a Lambertian reflector receiving
// power p: r = √(ρ P cos θ / (π MPE)) at θ = 0, with the small-source MPE
// (conservative).
func diffuse(pb *budget.PathBudget, el *setup.Element, ll *LaserLimits, p, ρ float64, assumed bool) *Reflection {
	r := numeric.RoundUp(DiffuseHazardRadius(ρ, p, 1, ll.EyeIrradiance), 3)
	return &Reflection{Path: pb, Element: el, Kind: ReflectionDiffuse, Reflectance: ρ, Assumed: assumed, Surfaces: 1, Power: p, Radius: r, Laser: ll}
}

// DiffuseHazardRadius is r = √(ρ P cos θ/(π E_MPE)), m (the nominal hazard
// zone of a Lambertian reflector viewed along its normal).
func DiffuseHazardRadius(ρ, p, cosθ, mpe float64) float64 {
	return math.Sqrt(ρ * p * cosθ / (math.Pi * mpe))
}

// transmissiveSurfaces is the number of an element's surfaces that reflect
// part of the beam, from the element kinds' table.
func transmissiveSurfaces(t setup.ElementType) int {
	k, _ := setup.KindOf(t)
	return k.Surfaces
}

// followingAccess is the access of the segment leaving row i (the path's
// last segment for the last element; a dump ends the path in no segment).
func followingAccess(pb *budget.PathBudget, i int) setup.Access {
	if i+1 < len(pb.Segments) {
		return pb.Segments[i+1].Access
	}
	return setup.AccessEnclosed
}

// precedingAccess is the access of the segment arriving at row i.
func precedingAccess(pb *budget.PathBudget, i int) setup.Access {
	if i < len(pb.Segments) {
		return pb.Segments[i].Access
	}
	return setup.AccessOpen
}

// beamAt is one beam arriving at an element, at its laser's maximum power
// p, W.
type beamAt struct {
	pb *budget.PathBudget
	r  *budget.Row
	p  float64
}

// damage checks the optics of a path against their ratings and a fibre's
// input face against the limit of a clean silica face, at the lasers'
// maximum powers. Where several beams meet an element, their continuous
// linear power densities add, each at its own size, and so do their peak
// irradiances on a fibre face (the peaks taken as falling together:
// conservative); pulsed beams are judged one by one against a fluence
// rating.
func damage(own *budget.PathBudget) []budget.Finding {
	var out []budget.Finding
	byElement := map[*setup.Element][]beamAt{}
	for _, pb := range own.Beams() {
		for i := range pb.Rows {
			r := &pb.Rows[i]
			if p := r.FractionIn * pb.Laser.Power; p > 0 {
				byElement[r.Element] = append(byElement[r.Element], beamAt{pb, r, p})
			}
		}
	}
	for _, el := range own.Path.Elements {
		beams := byElement[el]
		if len(beams) == 0 {
			continue
		}
		add := func(sev budget.Severity, kind budget.FindingKind, note, msg string, value, limit float64, unit string) {
			out = append(out, budget.Finding{Severity: sev, Kind: kind, Path: own.Path.Name, Element: el.Index, At: el.At,
				Message: fmt.Sprintf("element %d (%s%s): %s", el.Index, el.Label(), note, msg)}.Figure(value, limit, unit))
		}
		if el.DamageThreshold > 0 {
			var cw []beamAt
			var lpd float64
			for _, b := range beams {
				las := b.pb.Laser
				switch {
				case !el.DamageIsFluence && las.Emission == setup.EmissionCW:
					cw = append(cw, b)
					lpd += LinearPowerDensity(b.r.BeamIn, b.p)
				case el.DamageIsFluence && las.Emission == setup.EmissionPulsed:
					ep := b.p / las.RepetitionRate
					f := b.r.BeamIn.PeakIrradiance(ep) // peak fluence 2E/(πWxWy), same form as the irradiance
					// Scale the rated fluence by √(τ/τ_rated) (common practice).
					thr := el.DamageThreshold * math.Sqrt(las.PulseDuration/el.DamagePulseDuration)
					if f > thr {
						add(budget.SeverityDefect, FindingDamage, beamNote(b.pb), fmt.Sprintf("peak fluence %s exceeds its damage threshold scaled to the pulse length, %s",
							units.FormatSI(f*1e-4, "J/cm²"), units.FormatSI(thr*1e-4, "J/cm²")), f, thr, "J/m2")
					}
				default:
					add(budget.SeverityNote, FindingDamageUnchecked, beamNote(b.pb), "its damage threshold is for the other kind of emission (a linear power density for cw, a fluence for pulses); not checked", 0, 0, "")
				}
			}
			if lpd > el.DamageThreshold {
				add(budget.SeverityDefect, FindingDamage, beamsNote(cw), fmt.Sprintf("linear power density %s/cm%s exceeds its damage threshold %s/cm at %s",
					units.FormatPower(lpd/100), sumNote(cw), units.FormatPower(el.DamageThreshold/100), atMaxPower(cw)), lpd, el.DamageThreshold, "W/m")
			}
		}
		if el.Type == setup.TypeFiber {
			var peak float64
			for _, b := range beams {
				peak += b.r.BeamIn.PeakIrradiance(b.p)
			}
			if peak > FiberFaceLimit {
				add(budget.SeverityDefect, FindingFibreFace, beamsNote(beams), fmt.Sprintf("the focused beam%s on the input face reach%s %s%s at %s, above the %s that common practice allows a clean silica face",
					plural(beams, "", "s"), plural(beams, "es", ""), units.FormatIrradiance(peak), sumNote(beams), atMaxPower(beams), units.FormatIrradiance(FiberFaceLimit)), peak, FiberFaceLimit, "W/m2")
			}
		}
	}
	return out
}

// LinearPowerDensity is the power of a beam over its 1/e² diameter in the
// smaller axis (the larger density), W/m: the quantity continuous-wave
// damage ratings of optics are stated in (common practice).
func LinearPowerDensity(b optics.Beam, p float64) float64 {
	wx, wy := b.Radii()
	return p / (2 * math.Min(wx, wy))
}

// beamsNote names the beam of a joined laser when one beam is meant.
func beamsNote(bs []beamAt) string {
	if len(bs) == 1 {
		return beamNote(bs[0].pb)
	}
	return ""
}

// sumNote says which beams a sum is over, when there are several.
func sumNote(bs []beamAt) string {
	if len(bs) < 2 {
		return ""
	}
	var names []string
	for _, b := range bs {
		names = append(names, fmt.Sprintf("%q", b.pb.Laser.Name))
	}
	return fmt.Sprintf(" (the %d beams of lasers %s together, each at its own size)", len(bs), strings.Join(names, ", "))
}

// atMaxPower says at whose maximum power a figure is.
func atMaxPower(bs []beamAt) string {
	return plural(bs, "the laser's maximum power", "the lasers' maximum powers")
}

func plural(bs []beamAt, one, many string) string {
	if len(bs) == 1 {
		return one
	}
	return many
}

// worstRatio is the largest ratio to its limit, eye or skin, of any
// exposure of the laser ll on an open or enclosed segment.
func (h *Hazards) worstRatio(ll *LaserLimits) float64 {
	worst := 0.0
	for _, e := range slices.Concat(h.Exposures, h.Enclosed) {
		if e.Laser == ll {
			worst = max(worst, e.Ratio, e.SkinRatio)
		}
	}
	return worst
}

// raise takes the higher of each figure of n and o that the need rests on:
// the OD, the irradiances and the exposures.
func (n *EyewearNeed) raise(o EyewearNeed) {
	n.OD = math.Max(n.OD, o.OD)
	n.Irradiance = math.Max(n.Irradiance, o.Irradiance)
	n.PulseRadiantExposure = math.Max(n.PulseRadiantExposure, o.PulseRadiantExposure)
	n.BeamIrradiance = math.Max(n.BeamIrradiance, o.BeamIrradiance)
	n.BeamPulseExposure = math.Max(n.BeamPulseExposure, o.BeamPulseExposure)
}

// eyewearNeeds is the eyewear each wavelength and EN 207 test condition
// needs: the highest OD, irradiances and exposures of the open segments and
// of the reflections of h, and of the needs of the sweep's other
// geometries (none without a sweep), and the scale number they call for.
func eyewearNeeds(h *Hazards, sweep []EyewearNeed) []*EyewearNeed {
	type key struct {
		λ    float64
		mode string
	}
	by := map[key]*EyewearNeed{}
	get := func(ll *LaserLimits) *EyewearNeed {
		k := key{ll.Laser.Wavelength, ll.EN207Mode}
		if n, ok := by[k]; ok {
			return n
		}
		n := &EyewearNeed{Wavelength: k.λ, Mode: k.mode}
		by[k] = n
		return n
	}
	for _, e := range h.Exposures {
		get(e.Laser).raise(EyewearNeed{OD: e.OD, Irradiance: e.Irradiance, PulseRadiantExposure: e.PulseRadiantExposure,
			BeamIrradiance: e.BeamIrradiance, BeamPulseExposure: e.BeamPulseExposure})
	}
	for _, r := range h.Reflections {
		if r.Kind != ReflectionDiffuse {
			n := get(r.Laser)
			n.OD = math.Max(n.OD, r.OD)
		}
	}
	for _, o := range sweep {
		k := key{o.Wavelength, o.Mode}
		n, ok := by[k]
		if !ok {
			n = &EyewearNeed{Wavelength: k.λ, Mode: k.mode}
			by[k] = n
		}
		n.raise(o)
	}
	var out []*EyewearNeed
	for _, n := range by {
		exposure := n.BeamIrradiance
		if n.Mode != limits.EN207D {
			exposure = n.BeamPulseExposure
		}
		n.LB, n.LBValid = limits.EN207Scale(n.Wavelength, n.Mode, n.OD, exposure)
		out = append(out, n)
	}
	sort.Slice(out, func(i, j int) bool {
		if out[i].Wavelength != out[j].Wavelength {
			return out[i].Wavelength < out[j].Wavelength
		}
		return out[i].Mode < out[j].Mode
	})
	return out
}

// Coverage says in words whether the declared eyewear covers the need.
func (n *EyewearNeed) Coverage() string {
	switch {
	case n.OD <= 0:
		return "none needed"
	case len(n.CoveredBy) == 0:
		return "NOT covered by the declared eyewear"
	}
	return "covered by " + strings.Join(n.CoveredBy, ", ")
}

// EN207Label is the EN 207 scale number with its test condition, "—" where
// none is given.
func (n *EyewearNeed) EN207Label() string {
	switch {
	case !n.LBValid:
		return "—"
	case n.LB > limits.MaxEN207Scale:
		return fmt.Sprintf("%s beyond LB%d", n.Mode, limits.MaxEN207Scale)
	}
	return fmt.Sprintf("%s LB%d", n.Mode, n.LB)
}

func checkEyewear(s *setup.Setup, needs []*EyewearNeed) []budget.Finding {
	var out []budget.Finding
	for _, n := range needs {
		if n.OD <= 0 {
			continue
		}
		if n.LBValid && n.LB > limits.MaxEN207Scale {
			density := units.FormatIrradiance(n.BeamIrradiance)
			if n.Mode != limits.EN207D {
				density = units.FormatSI(n.BeamPulseExposure, "J/m²") + " per pulse"
			}
			out = append(out, budget.Finding{Severity: budget.SeverityDefect, Kind: FindingNoEN207Filter,
				Message: fmt.Sprintf("at %s a beam reaches %s itself, past what EN 207's LB%d withstands (condition %s): no EN 207-rated filter protects against it; enclose the beam", units.FormatNanometres(n.Wavelength), density, limits.MaxEN207Scale, n.Mode)})
		}
		var short []string
		for _, ew := range s.Eyewear {
			covered := false
			for _, b := range ew.Bands {
				ok, why := covers(b, n)
				if ok {
					covered = true
					break
				}
				if n.Wavelength >= b.From && n.Wavelength <= b.To {
					short = append(short, fmt.Sprintf("%q: %s", ew.Name, why))
				}
			}
			if covered {
				n.CoveredBy = append(n.CoveredBy, ew.Name)
			}
		}
		if len(n.CoveredBy) == 0 {
			msg := fmt.Sprintf("no declared eyewear gives OD %g at %s", n.OD, units.FormatNanometres(n.Wavelength))
			if n.LBValid {
				msg += fmt.Sprintf(" with EN 207 %s LB%d where marked", n.Mode, n.LB)
			}
			if len(short) > 0 {
				msg += " (" + strings.Join(short, "; ") + ")"
			}
			if len(s.Eyewear) == 0 {
				msg = fmt.Sprintf("no eyewear is declared; OD %g is needed at %s", n.OD, units.FormatNanometres(n.Wavelength))
			}
			out = append(out, budget.Finding{Severity: budget.SeverityDefect, Kind: FindingEyewearGap, Message: msg})
		}
	}
	return out
}

// beamNote names, in a message about an element, another laser's beam on a
// shared path ("" for the path's own).
func beamNote(pb *budget.PathBudget) string {
	if !pb.IsJoined() {
		return ""
	}
	return fmt.Sprintf(", beam of laser %q", pb.Laser.Name)
}

func segmentName(p *setup.Path, seg budget.Segment) string {
	if p.IntoPath != nil && seg.To == p.IntoAt && (len(p.Elements) == 0 || seg.After == p.Elements[len(p.Elements)-1].Index) {
		if seg.After == 0 {
			return fmt.Sprintf("from the start to the combiner it goes into, %s (%s)", p.Into, units.FormatLength(seg.To))
		}
		return fmt.Sprintf("from element %d to the combiner it goes into, %s (%s to %s)", seg.After, p.Into, units.FormatLength(seg.From), units.FormatLength(seg.To))
	}
	if math.IsInf(seg.To, 1) {
		return fmt.Sprintf("after element %d (open end, from %s)", seg.After, units.FormatLength(seg.From))
	}
	if seg.After == 0 {
		return fmt.Sprintf("from the start to element 1 (%s)", units.FormatLength(seg.To))
	}
	return fmt.Sprintf("between elements %d and %d (%s to %s)", seg.After, seg.After+1, units.FormatLength(seg.From), units.FormatLength(seg.To))
}

// AlignmentPower is the highest power of a source at which its worst
// exposure, ratio times its limit at power p, stays within the limit: the
// ratio scales with the power, so p / ratio, with the ratio rounded up to
// the three figures printed (numeric.RoundUp: the power never rounds up);
// p itself when the ratio is at most 1.
func AlignmentPower(p, ratio float64) float64 {
	if !(ratio > 1) {
		return p
	}
	return p / numeric.RoundUp(ratio, 3)
}
