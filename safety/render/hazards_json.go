package render

import (
	"math"

	"beamledger/safety"
)

type jsonHazards struct {
	Standard        string            `json:"standard"`
	Assumptions     []string          `json:"assumptions"`
	Cautions        []string          `json:"cautions"`
	Lasers          []jsonLaser       `json:"lasers"`
	Exposures       []jsonExposure    `json:"exposures"`
	Reflections     []jsonReflection  `json:"reflections"`
	Eyewear         []jsonEyewearNeed `json:"eyewear"`
	DefaultsAssumed []string          `json:"defaults_assumed"`
}

type jsonLaser struct {
	Name          string   `json:"name"`
	WavelengthM   float64  `json:"wavelength_m"`
	PowerW        float64  `json:"power_w"`
	Emission      string   `json:"emission"`
	Class         *string  `json:"class"`
	ClassNote     string   `json:"class_note"`
	DurationS     float64  `json:"duration_s"`
	EyeMPEWM2     float64  `json:"eye_mpe_irradiance_w_m2"`
	EyeMPERule    string   `json:"eye_mpe_rule"`
	SkinMPEWM2    float64  `json:"skin_mpe_irradiance_w_m2"`
	EyeApertureM  float64  `json:"eye_aperture_diameter_m"`
	SkinApertureM float64  `json:"skin_aperture_diameter_m"`
	AELClass1W    float64  `json:"ael_class_1_w"`
	AELClass2W    *float64 `json:"ael_class_2_w"`
	AELClass3RW   *float64 `json:"ael_class_3r_w"`
	AELClass3BW   float64  `json:"ael_class_3b_w"`
}

type jsonExposure struct {
	Path                  string   `json:"path"`
	AfterElement          int      `json:"after_element"`
	FromM                 float64  `json:"from_m"`
	ToM                   *float64 `json:"to_m"`
	WorstAtM              float64  `json:"worst_at_m"`
	WavelengthM           float64  `json:"wavelength_m"`
	DurationS             float64  `json:"duration_s"`
	PowerW                float64  `json:"power_w"`
	ApertureIrradianceWM2 float64  `json:"aperture_irradiance_w_m2"`
	MPEIrradianceWM2      float64  `json:"mpe_irradiance_w_m2"`
	Ratio                 float64  `json:"ratio"`
	ODRequired            float64  `json:"od_required"`
	SkinIrradianceWM2     float64  `json:"skin_aperture_irradiance_w_m2"`
	SkinRatio             float64  `json:"skin_ratio"`
	OpenEnd               bool     `json:"open_end"`
	NOHDM                 *float64 `json:"nohd_m"`
	// NOHDBeyondM is set, and nohd_m null, when the distance is past the
	// search's end.
	NOHDBeyondM *float64 `json:"nohd_beyond_m,omitempty"`
}

type jsonReflection struct {
	Path                  string   `json:"path"`
	Element               *int     `json:"element"`
	Kind                  string   `json:"kind"`
	WavelengthM           float64  `json:"wavelength_m"`
	Reflectance           float64  `json:"reflectance"`
	ReflectanceAssumed    bool     `json:"reflectance_assumed"`
	Surfaces              int      `json:"surfaces"`
	PowerW                float64  `json:"power_w"`
	ApertureIrradianceWM2 *float64 `json:"aperture_irradiance_w_m2"`
	Ratio                 *float64 `json:"ratio"`
	ODRequired            *float64 `json:"od_required"`
	HazardRadiusM         *float64 `json:"hazard_radius_m"`
}

type jsonEyewearNeed struct {
	WavelengthM float64  `json:"wavelength_m"`
	ODRequired  float64  `json:"od_required"`
	EN207Scale  *int     `json:"en207_scale"`
	CoveredBy   []string `json:"covered_by"`
}

func hazardsJSON(a *safety.Assessment) jsonHazards {
	h := a.Hazards
	out := jsonHazards{
		Standard: safety.Standard,
		Assumptions: []string{
			"intrabeam viewing of a small source (angular subtense at most 1.5 mrad)",
			"each laser at its maximum power",
			"irradiance averaged over the limiting aperture of the eye or skin",
			"exposure duration per laser as duration_s: " + safety.DurationAssumption(a.Setup),
		},
		Cautions:        Cautions,
		Lasers:          []jsonLaser{},
		Exposures:       []jsonExposure{},
		Reflections:     []jsonReflection{},
		Eyewear:         []jsonEyewearNeed{},
		DefaultsAssumed: append([]string{}, h.DefaultsAssumed...),
	}
	for _, ll := range h.Lasers {
		jl := jsonLaser{Name: ll.Laser.Name, WavelengthM: ll.Laser.Wavelength, PowerW: ll.Laser.Power, Emission: ll.Laser.Emission,
			ClassNote: ll.ClassNote, DurationS: ll.Duration, EyeMPEWM2: ll.EyeIrradiance, EyeMPERule: ll.EyeRule,
			SkinMPEWM2: ll.SkinIrradiance, EyeApertureM: ll.EyeAperture, SkinApertureM: ll.SkinAperture,
			AELClass1W: ll.AEL.Class1, AELClass2W: finite(ll.AEL.Class2), AELClass3RW: finite(ll.AEL.Class3R), AELClass3BW: ll.AEL.Class3B}
		if ll.Class != "" {
			c := ll.Class
			jl.Class = &c
		}
		out.Lasers = append(out.Lasers, jl)
	}
	for _, e := range h.Exposures {
		je := jsonExposure{Path: e.Path.Path.Name, AfterElement: e.Segment.After, FromM: e.Segment.From, ToM: finite(e.Segment.To),
			WorstAtM: e.At, WavelengthM: e.Path.Laser.Wavelength, DurationS: e.Laser.Duration, PowerW: e.Power,
			ApertureIrradianceWM2: e.Irradiance, MPEIrradianceWM2: e.Laser.EyeIrradiance, Ratio: e.Ratio, ODRequired: e.OD,
			SkinIrradianceWM2: e.SkinIrr, SkinRatio: e.SkinRatio, OpenEnd: e.OpenEnd}
		if e.OpenEnd {
			if math.IsInf(e.NOHD, 1) {
				je.NOHDBeyondM = finite(safety.MaxHazardDistance)
			} else {
				je.NOHDM = finite(e.NOHD)
			}
		}
		out.Exposures = append(out.Exposures, je)
	}
	for _, r := range h.Reflections {
		jr := jsonReflection{Path: r.Path.Path.Name, Kind: string(r.Kind), WavelengthM: r.Path.Laser.Wavelength, Reflectance: r.Reflectance,
			ReflectanceAssumed: r.Assumed, Surfaces: r.Surfaces, PowerW: r.Power}
		if r.Element != nil {
			i := r.Element.Index
			jr.Element = &i
		}
		if r.Kind != safety.ReflectionDiffuse {
			jr.ApertureIrradianceWM2, jr.Ratio, jr.ODRequired = finite(r.Irradiance), finite(r.Ratio), finite(r.OD)
		} else {
			jr.HazardRadiusM = finite(r.Radius)
		}
		out.Reflections = append(out.Reflections, jr)
	}
	for _, n := range h.Eyewear {
		jn := jsonEyewearNeed{WavelengthM: n.Wavelength, ODRequired: n.OD, CoveredBy: append([]string{}, n.CoveredBy...)}
		if n.LBValid {
			lb := n.LB
			jn.EN207Scale = &lb
		}
		out.Eyewear = append(out.Eyewear, jn)
	}
	return out
}
