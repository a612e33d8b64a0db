package render

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"reflect"
	"strings"

	"beamledger/budget"
	"beamledger/safety"
)

// The JSON document: snake_case keys with unit suffixes, SI numbers, null for
// a value that does not exist (never NaN).

type jsonDoc struct {
	Setup      jsonSetup   `json:"setup"`
	PowerBasis string      `json:"power_basis"`
	Paths      []jsonPath  `json:"paths"`
	Atoms      []jsonAtoms `json:"atoms"`
	jsonHazards
	Balances        []jsonBalance `json:"balances"`
	AssumedLossless int           `json:"assumed_lossless_elements"`
	Findings        []jsonFinding `json:"findings"`
	NeedsAction     bool          `json:"needs_action"`
}

type jsonSetup struct {
	File       string `json:"file"`
	Title      string `json:"title"`
	Site       string `json:"site"`
	PreparedBy string `json:"prepared_by"`
	Revision   string `json:"revision"`
}

type jsonPath struct {
	Name            string        `json:"name"`
	From            string        `json:"from"`
	Laser           string        `json:"laser"`
	WavelengthM     float64       `json:"wavelength_m"`
	OperatingPowerW float64       `json:"operating_power_w"`
	MaxPowerW       float64       `json:"max_power_w"`
	StartPowerW     float64       `json:"start_power_w"`
	StartRadiusXM   float64       `json:"start_radius_x_m"`
	StartRadiusYM   float64       `json:"start_radius_y_m"`
	Elements        []jsonElement `json:"elements"`
	OpenEnd         bool          `json:"open_end"`
	EndPowerW       float64       `json:"end_power_w"`
}

type jsonElement struct {
	Index             int        `json:"index"`
	Name              string     `json:"name"`
	Type              string     `json:"type"`
	AtM               float64    `json:"at_m"`
	RadiusXM          float64    `json:"radius_x_m"`
	RadiusYM          float64    `json:"radius_y_m"`
	CurvatureXPerM    float64    `json:"curvature_x_per_m"`
	CurvatureYPerM    float64    `json:"curvature_y_per_m"`
	PowerInW          float64    `json:"power_in_w"`
	PowerOutW         float64    `json:"power_out_w"`
	PeakIrradianceWM2 float64    `json:"peak_irradiance_w_m2"`
	CumulativeLossDB  *float64   `json:"cumulative_loss_db"`
	ClipTransmission  float64    `json:"clip_transmission"`
	AssumedLossless   bool       `json:"assumed_lossless"`
	Losses            []jsonLoss `json:"losses"`
	Fiber             *jsonFiber `json:"fiber,omitempty"`
}

type jsonLoss struct {
	Kind   string  `json:"kind"`
	PowerW float64 `json:"power_w"`
}

type jsonFiber struct {
	ModeOverlap            *float64 `json:"mode_overlap"`
	Alignment              float64  `json:"alignment"`
	Coupling               float64  `json:"coupling"`
	CouplingGiven          bool     `json:"coupling_given"`
	UpperBound             bool     `json:"upper_bound"`
	IdealFocalLengthXM     *float64 `json:"ideal_focal_length_x_m"`
	IdealFocalLengthYM     *float64 `json:"ideal_focal_length_y_m"`
	IdealFocalLengthForAtM float64  `json:"ideal_focal_length_for_beam_at_m"`
}

type jsonBalance struct {
	Laser        string             `json:"laser"`
	SourcePowerW float64            `json:"source_power_w"`
	DumpedW      float64            `json:"dumped_w"`
	LeavingW     float64            `json:"leaving_w"`
	LossesW      map[string]float64 `json:"losses_w"`
	TotalW       float64            `json:"total_w"`
}

type jsonFinding struct {
	Severity string  `json:"severity"`
	Kind     string  `json:"kind"`
	Path     string  `json:"path"`
	Element  int     `json:"element"`
	AtM      float64 `json:"at_m"`
	Message  string  `json:"message"`
	// The figure of the finding, when it has one: its value and the limit
	// it is judged against, in unit (SI), and their ratio.
	ValueSI *float64 `json:"value_si,omitempty"`
	LimitSI *float64 `json:"limit_si,omitempty"`
	Unit    string   `json:"unit,omitempty"`
	Ratio   *float64 `json:"ratio,omitempty"`
}

func finite(v float64) *float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	return &v
}

// JSON writes the assessment as one indented JSON document. Powers are at
// each laser's operating power, as power_basis says.
func JSON(w io.Writer, a *safety.Assessment) error {
	s := a.Setup
	doc := jsonDoc{
		Setup:           jsonSetup{s.File, s.Meta.Title, s.Meta.Site, s.Meta.PreparedBy, s.Meta.Revision},
		PowerBasis:      "operating_power",
		AssumedLossless: a.Budget.AssumedLossless,
		Paths:           []jsonPath{},
		Atoms:           []jsonAtoms{},
		Balances:        []jsonBalance{},
		Findings:        []jsonFinding{},
		NeedsAction:     a.NeedsAction(),
	}
	for _, pb := range a.Budget.Paths {
		op := pb.Laser.OperatingPower
		sx, sy := pb.Start.Radii()
		jp := jsonPath{
			Name: pb.Path.Name, From: pb.Path.From, Laser: pb.Laser.Name, WavelengthM: pb.Laser.Wavelength,
			OperatingPowerW: op, MaxPowerW: pb.Laser.Power, StartPowerW: pb.StartFraction * op,
			StartRadiusXM: sx, StartRadiusYM: sy, Elements: []jsonElement{},
			OpenEnd: pb.OpenEnd, EndPowerW: pb.EndFraction * op,
		}
		for _, r := range pb.Rows {
			e := r.Element
			wx, wy := r.BeamIn.Radii()
			je := jsonElement{
				Index: e.Index, Name: e.Name, Type: string(e.Type), AtM: e.At, RadiusXM: wx, RadiusYM: wy,
				CurvatureXPerM: r.BeamIn.X.Curvature(), CurvatureYPerM: r.BeamIn.Y.Curvature(),
				PowerInW: r.FractionIn * op, PowerOutW: r.FractionOut * op,
				PeakIrradianceWM2: r.BeamIn.PeakIrradiance(r.FractionIn * op),
				ClipTransmission:  r.ClipFraction, AssumedLossless: r.AssumedLossless, Losses: []jsonLoss{},
			}
			if r.FractionOut > 0 {
				je.CumulativeLossDB = finite(-budget.Decibels(r.FractionOut))
			}
			for _, l := range r.Losses {
				je.Losses = append(je.Losses, jsonLoss{l.Kind, l.Fraction * op})
			}
			if fc := r.Fiber; fc != nil {
				je.Fiber = &jsonFiber{
					ModeOverlap: finite(fc.Overlap), Alignment: fc.Alignment, Coupling: fc.Coupling,
					CouplingGiven: fc.Given, UpperBound: fc.UpperBound,
					IdealFocalLengthXM: finite(fc.IdealFocalLength[0]), IdealFocalLengthYM: finite(fc.IdealFocalLength[1]),
					IdealFocalLengthForAtM: fc.LensAt,
				}
			}
			jp.Elements = append(jp.Elements, je)
		}
		doc.Paths = append(doc.Paths, jp)
	}
	for _, at := range a.Atoms {
		doc.Atoms = append(doc.Atoms, atomsJSON(at))
	}
	doc.jsonHazards = hazardsJSON(a)
	for _, bal := range a.Budget.Balances {
		op := bal.Laser.OperatingPower
		jb := jsonBalance{Laser: bal.Laser.Name, SourcePowerW: op, DumpedW: bal.Dumped * op, LeavingW: bal.Leaving * op,
			LossesW: map[string]float64{}, TotalW: bal.Total() * op}
		kinds := bal.LossKinds()
		for _, k := range kinds {
			jb.LossesW[k] = bal.Lost[k] * op
		}
		doc.Balances = append(doc.Balances, jb)
	}
	for _, f := range a.Findings {
		jf := jsonFinding{Severity: string(f.Severity), Kind: string(f.Kind), Path: f.Path, Element: f.Element, AtM: f.At, Message: f.Message}
		if f.Unit != "" {
			jf.ValueSI, jf.LimitSI, jf.Unit, jf.Ratio = finite(f.Value), finite(f.Limit), f.Unit, finite(f.Ratio())
		}
		doc.Findings = append(doc.Findings, jf)
	}
	if err := nonFinite(reflect.ValueOf(doc), "$"); err != nil {
		return err
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	enc.SetEscapeHTML(false)
	return enc.Encode(doc)
}

// nonFinite walks a value and reports the first float that is NaN or
// infinite, by its place in the document: JSON must carry a value that does
// not exist as null, never as a number that no reader can take.
func nonFinite(v reflect.Value, at string) error {
	switch v.Kind() {
	case reflect.Float64, reflect.Float32:
		if f := v.Float(); math.IsNaN(f) || math.IsInf(f, 0) {
			return fmt.Errorf("internal error: %s is %v; a figure of the assessment is not a finite number", at, f)
		}
	case reflect.Pointer, reflect.Interface:
		if !v.IsNil() {
			return nonFinite(v.Elem(), at)
		}
	case reflect.Struct:
		for i := 0; i < v.NumField(); i++ {
			name := v.Type().Field(i).Tag.Get("json")
			if name == "" {
				name = v.Type().Field(i).Name
			}
			if err := nonFinite(v.Field(i), at+"."+strings.Split(name, ",")[0]); err != nil {
				return err
			}
		}
	case reflect.Slice, reflect.Array:
		for i := 0; i < v.Len(); i++ {
			if err := nonFinite(v.Index(i), fmt.Sprintf("%s[%d]", at, i)); err != nil {
				return err
			}
		}
	case reflect.Map:
		iter := v.MapRange()
		for iter.Next() {
			if err := nonFinite(iter.Value(), fmt.Sprintf("%s[%v]", at, iter.Key())); err != nil {
				return err
			}
		}
	}
	return nil
}
