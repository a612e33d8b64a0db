package render

import (
	"math"

	"beamledger/budget"
)

type jsonAtoms struct {
	Path                  string        `json:"path"`
	Element               int           `json:"element"`
	Cloud                 string        `json:"cloud"`
	Transition            string        `json:"transition"`
	AtM                   float64       `json:"at_m"`
	PowerW                float64       `json:"power_w"`
	RadiusXM              float64       `json:"radius_x_m"`
	RadiusYM              float64       `json:"radius_y_m"`
	PeakIrradianceWM2     float64       `json:"peak_irradiance_w_m2"`
	EdgeRelativeX         float64       `json:"irradiance_at_rms_x_relative"`
	EdgeRelativeY         float64       `json:"irradiance_at_rms_y_relative"`
	EndRadiiM             [2][2]float64 `json:"radius_at_cloud_ends_m"`
	DetuningHz            float64       `json:"detuning_hz"`
	DetuningSource        string        `json:"detuning_source"`
	SaturationIntensity   float64       `json:"saturation_intensity_w_m2"`
	SaturationIntensityIs string        `json:"saturation_intensity_kind"`
	Saturation            float64       `json:"saturation"`
	RabiHz                float64       `json:"rabi_frequency_hz"`
	ScatteringPerS        *float64      `json:"scattering_rate_per_s"`
	CrossSectionM2        float64       `json:"cross_section_m2"`
	OpticalDepth          float64       `json:"optical_depth"`
	FarDetuned            bool          `json:"far_detuned"`
	NearLine              string        `json:"near_line,omitempty"`
	NearLineDetuningHz    *float64      `json:"near_line_detuning_hz,omitempty"`
	PotentialK            *float64      `json:"dipole_potential_k"`
	PotentialHz           *float64      `json:"dipole_potential_hz"`
	TrapDepthK            *float64      `json:"trap_depth_k"`
	TrapRadialHz          *float64      `json:"trap_frequency_radial_hz"`
	TrapXHz               *float64      `json:"trap_frequency_x_hz"`
	TrapYHz               *float64      `json:"trap_frequency_y_hz"`
	TrapAxialHz           *float64      `json:"trap_frequency_axial_hz"`
	Goal                  *jsonGoal     `json:"goal"`
}

type jsonGoal struct {
	Kind                   string   `json:"kind"`
	Target                 *float64 `json:"target_si"`
	IrradianceWM2          *float64 `json:"irradiance_needed_w_m2"`
	PowerAtAtomsW          *float64 `json:"power_at_atoms_w"`
	SourcePowerW           *float64 `json:"source_power_w"`
	AvailableSourcePowerW  float64  `json:"available_source_power_w"`
	MarginDB               *float64 `json:"margin_db"`
	Met                    bool     `json:"met"`
	Impossible             string   `json:"impossible,omitempty"`
	GoalFactor             *float64 `json:"goal_factor,omitempty"`
	ThresholdRabiHz        *float64 `json:"threshold_rabi_frequency_hz,omitempty"`
	ThresholdRabiLowHz     *float64 `json:"threshold_rabi_frequency_low_hz,omitempty"`
	ThresholdSaturation    *float64 `json:"threshold_saturation,omitempty"`
	PhotonBudgetSaturation *float64 `json:"photon_budget_saturation,omitempty"`
	Bistable               *bool    `json:"bistable,omitempty"`
	CollectiveRateGiven    *bool    `json:"collective_rate_given,omitempty"`
}

func toHz(ω float64) *float64 { return finite(ω / (2 * math.Pi)) }

func atomsJSON(a *budget.AtomsResult) jsonAtoms {
	wx, wy := a.Row.BeamIn.Radii()
	j := jsonAtoms{
		Path: a.Path.Path.Name, Element: a.Row.Element.Index, Cloud: a.Cloud.Name, Transition: a.Transition.Name,
		AtM: a.Row.Element.At, PowerW: a.Power, RadiusXM: wx, RadiusYM: wy, PeakIrradianceWM2: a.PeakIrradiance,
		EdgeRelativeX: a.EdgeRelative[0], EdgeRelativeY: a.EdgeRelative[1], EndRadiiM: a.EndRadii,
		DetuningHz: a.Detuning / (2 * math.Pi), DetuningSource: a.DetuningSource,
		SaturationIntensity: a.Isat, SaturationIntensityIs: a.IsatNote,
		Saturation: a.Saturation, RabiHz: a.Rabi / (2 * math.Pi), ScatteringPerS: finite(a.ScatteringRate),
		CrossSectionM2: a.CrossSection, OpticalDepth: a.OpticalDepth, FarDetuned: a.FarDetuned,
	}
	if a.NearLine != "" {
		j.NearLine, j.NearLineDetuningHz = a.NearLine, toHz(a.NearLineDetuning)
	}
	if d := a.Dipole; d != nil {
		j.PotentialK, j.PotentialHz = finite(d.Depth/kB), finite(d.Depth/hPlanck)
		depth := math.Max(0, -d.Depth/kB) // a repulsive beam makes no trap
		j.TrapDepthK = &depth
		j.TrapXHz, j.TrapYHz, j.TrapAxialHz = toHz(d.TrapX), toHz(d.TrapY), toHz(d.TrapAxial)
		j.TrapRadialHz = toHz(math.Sqrt(d.TrapX * d.TrapY))
	}
	if g := a.Goal; g != nil {
		jg := &jsonGoal{Kind: g.Kind, Target: finite(g.Target), AvailableSourcePowerW: g.Available, Met: g.Met, Impossible: g.Impossible}
		if g.Impossible == "" {
			jg.IrradianceWM2, jg.PowerAtAtomsW, jg.SourcePowerW, jg.MarginDB = finite(g.Intensity), finite(g.PowerAtAtoms), finite(g.SourcePower), finite(g.MarginDB)
		}
		if c := g.Collective; c != nil {
			jg.GoalFactor = finite(g.Factor)
			jg.ThresholdRabiHz, jg.ThresholdRabiLowHz = toHz(c.OmegaC), toHz(c.OmegaCLow)
			jg.ThresholdSaturation, jg.PhotonBudgetSaturation = finite(c.SatC), finite(c.PhotonBudgetSat)
			jg.Bistable, jg.CollectiveRateGiven = &c.Bistable, &c.FromRate
		}
		j.Goal = jg
	}
	return j
}
