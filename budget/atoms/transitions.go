// Package atoms holds the atomic data and the light-atom formulas beamledger
// uses at an atom cloud: saturation, Rabi frequency and scattering near
// resonance; the dipole potential far from it; the resonant optical depth of
// A Gaussian cloud; and the threshold of cooperative resonance fluorescence.
//
// Units are SI: Γ and Ω in rad/s, intensities in W/m², masses in kg.
// Constants come from gonum's CODATA values.
//
// # Formulas
//
// Every figure the package computes: its expression, the source it is
// checked against, the one function that computes it and the test that
// checks that function (TestFormulaIndex keeps this table true: each
// function exists and is called by production code, each test exists and
// calls it).
//
//	| quantity | expression | source | function | test |
//	| --- | --- | --- | --- | --- |
//	| two-level I_sat | π h c Γ/(3λ³) | Steck D-line data sheets | TwoLevelIsat | TestTwoLevelIsatReproducesDataSheets |
//	| resonant cross-section | σ0 = ħωΓ/(2 I_sat) | Steck D-line data sheets | CrossSection | TestTwoLevelIsatReproducesDataSheets |
//	| trap depth from U/h | h f / k_B | CODATA 2018 (k_B/h exact) | DepthTemperature | TestDepthTemperature |
//	| trap depth as U/h | k_B T / h | CODATA 2018 (k_B/h exact) | DepthFrequency | TestDepthTemperature |
//	| linewidth in hertz | Γ/2π | Steck D-line data sheets | LinewidthHz | TestLinewidthHz |
//	| saturation parameter | s = I/I_sat | Steck D-line data sheets | Saturation | TestRabiAndScattering |
//	| Rabi frequency | Ω = Γ√(s/2) | Steck D-line data sheets | Rabi | TestRabiAndScattering |
//	| saturation for a Rabi frequency | s = 2(Ω/Γ)² | Steck D-line data sheets | SaturationForRabi | TestRabiAndScattering |
//	| scattering rate | (Γ/2) s/(1 + s + (2Δ/Γ)²) | Steck Rb-87 sheet eq. (48) | ScatteringRate | TestRabiAndScattering |
//	| resonant optical depth | b0 = σ0 N/(2π σx σy) | column density, gonum quadrature | OpticalDepth | TestOpticalDepthColumn |
//	| dipole potential and scattering | Grimm eqs. (9), (10), lines summed | Grimm et al. (2000) | FarDetuned | TestDipolePotentialGrimm |
//	| line weight | (2J′+1)/(3(2J+1)) | Grimm et al. (2000) eq. (19) | Line.Weight | TestLineWeights |
//	| radial trap frequency | ω_r = √(4U0/(m W²)) | Grimm et al. (2000) eq. (37) | RadialTrapFrequency | TestTrapFrequencies |
//	| axial trap frequency | ω_z = √(−U0 κ/m) | Grimm et al. (2000) eq. (37) | AxialTrapFrequency | TestTrapFrequencies |
//	| nearest line | min over lines of abs(ω − ω_i)/Γ_i | Steck Rb-87 tables 3 and 5 | Transition.NearestLine | TestNearestLine |
//	| collective threshold | Ω_c = DΓ/8, s_c = D²/32 | Drummond & Carmichael (1978); Carmichael (1980) | CollectiveThreshold | TestCollectiveThresholdBand |
//	| threshold from a stated rate | Ω_c = NΓ_c/2 | Carmichael (1980) | CollectiveFromRate | TestCollectiveThresholdBand |
package atoms

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"gonum.org/v1/gonum/unit/constant"
)

// Physical constants, SI (CODATA via gonum).
var (
	H     = float64(constant.Planck)
	Hbar  = H / (2 * math.Pi)
	C     = float64(constant.LightSpeedInVacuum)
	KB    = float64(constant.Boltzmann)
	AMU   = float64(constant.AtomicMass)
	Eps0  = float64(constant.ElectricConstant)
	bohr  = 5.29177210903e-11 // Bohr radius, m (CODATA 2018)
	AUPol = 4 * math.Pi * Eps0 * bohr * bohr * bohr
)

// Line is a dipole-allowed line from the ground state, used in the dipole
// potential: vacuum wavelength (m), natural linewidth Γ (rad/s) and the total
// angular momenta of the lower and upper levels.
type Line struct {
	Name       string
	Wavelength float64
	Gamma      float64
	Jg, Je     float64
}

// Weight is the share of the line in the ground state's polarizability
// relative to a two-level atom with the same Γ and ω:
// (2J' + 1) / (3 (2J + 1)); 2/3 for an alkali D2 line, 1/3 for D1, 1 for
// J = 0 → J' = 1 (Grimm, Weidemüller and Ovchinnikov, Adv. At. Mol. Opt. Phys.
// 42, 95 (2000), eq. (19) for linear polarization).
func (l Line) Weight() float64 { return (2*l.Je + 1) / (3 * (2*l.Jg + 1)) }

// Transition is a driven transition and the data the drive figures need.
type Transition struct {
	Name       string
	Wavelength float64 // vacuum wavelength, m
	Gamma      float64 // natural linewidth Γ, rad/s
	// IsatCycling is the saturation intensity on the cycling (or two-level)
	// transition, W/m².
	IsatCycling float64
	CyclingNote string
	// IsatIsotropic is for isotropic, unpolarized light where the data
	// sheet gives it, W/m² (0: not given).
	IsatIsotropic float64
	Mass          float64 // kg (0: unknown)
	// Lines are the ground state's lines used for the dipole potential.
	Lines  []Line
	Source string
}

// Isat returns the saturation intensity for a cloud's choice ("cycling" or
// "isotropic") and says which was used.
func (t *Transition) Isat(choice string) (float64, string, error) {
	if choice == "isotropic" {
		if t.IsatIsotropic == 0 {
			return 0, "", fmt.Errorf("transition %q has no isotropic saturation intensity in its data", t.Name)
		}
		return t.IsatIsotropic, "isotropic light", nil
	}
	return t.IsatCycling, t.CyclingNote, nil
}

// Frequency is the angular transition frequency ω0 = 2πc/λ, rad/s.
func (t *Transition) Frequency() float64 { return 2 * math.Pi * C / t.Wavelength }

// TwoLevelIsat is I_sat = π h c Γ / (3 λ³) for a two-level atom, W/m²
// (Steck, alkali D-line data sheets, eq. for the cycling saturation intensity).
func TwoLevelIsat(λ, Γ float64) float64 { return math.Pi * H * C * Γ / (3 * λ * λ * λ) }

// CrossSection is the resonant cross-section σ0 = ħωΓ/(2 I_sat), m²; for the
// two-level I_sat it is 3λ²/(2π).
func CrossSection(λ, Γ, isat float64) float64 {
	return Hbar * 2 * math.Pi * C / λ * Γ / (2 * isat)
}

const (
	twoπ = 2 * math.Pi
	mWcm = 10.0 // 1 mW/cm² in W/m²
)

func alkali(name string, d2λ, d2Γ, d1λ, d1Γ float64) []Line {
	return []Line{
		{name + " D2", d2λ, twoπ * d2Γ, 0.5, 1.5},
		{name + " D1", d1λ, twoπ * d1Γ, 0.5, 0.5},
	}
}

// builtin holds the transitions, keyed by name.
var builtin = map[string]*Transition{}

func add(ts ...*Transition) {
	for _, t := range ts {
		builtin[t.Name] = t
	}
}

const (
	cyclingAlkali = "cycling transition: σ± light between the stretched states F = I+1/2, m_F = ±F and F' = F+1, m_F' = ±F'"
	twoLevelNote  = "two-level value π h c Γ / (3 λ³)"
	d1Note        = "the data sheet's effective far-detuned value for π-polarized light; a D1 line has no cycling transition"
)

func init() {
	// Rb-87: D. A. Steck, "Rubidium 87 D Line Data" (revision 2.2.1, 2019),
	// tables 2 (mass), 3 (D2: λ, Γ/2π = 6.0666 MHz, I_sat 1.66933 mW/cm²
	// cycling, 3.57713 mW/cm² isotropic) and 5 (D1: λ, Γ/2π = 5.7500 MHz,
	// effective far-detuned I_sat for π light 4.4876 mW/cm², from memory).
	rb87 := alkali("Rb87", 780.241209686e-9, 6.0666e6, 794.978851156e-9, 5.7500e6)
	// Rb-85: D. A. Steck, "Rubidium 85 D Line Data" (revision 2.2.1, 2019),
	// tables 2, 3 (D2 I_sat 1.66933 mW/cm² cycling, 3.89512 mW/cm² isotropic;
	// 2.50399 mW/cm² is the far-detuned π value, not the isotropic one)
	// and 5 (D1: effective far-detuned I_sat for π light 4.4876 mW/cm², from
	// memory).
	rb85 := alkali("Rb85", 780.241368271e-9, 6.0666e6, 794.979014933e-9, 5.7500e6)
	// Cs-133: D. A. Steck, "Cesium D Line Data" (revision 2.1.4, 2010),
	// tables 2, 3 (D2: Γ/2π = 5.2227 MHz, I_sat 1.1023 mW/cm² cycling,
	// 2.7059 mW/cm² isotropic) and 5 (D1: Γ/2π = 4.5612 MHz, effective
	// far-detuned I_sat for π light 2.4981 mW/cm²). Later
	// revisions use a shorter D2 lifetime (I_sat ≈ 1.105 mW/cm²).
	cs := alkali("Cs133", 852.34727582e-9, 5.2227e6, 894.59295986e-9, 4.5612e6)
	// Na-23: D. A. Steck, "Sodium D Line Data" (revision 2.2.1, 2019), tables
	// 2, 3 (D2: Γ/2π = 9.7946 MHz, I_sat 6.2600 mW/cm² cycling, 13.4144
	// mW/cm² isotropic, the last from memory) and 5 (D1: Γ/2π = 9.7653 MHz).
	na := alkali("Na23", 589.1583264e-9, 9.7946e6, 589.7558147e-9, 9.7653e6)
	// K-39: T. G. Tiecke, "Properties of Potassium" (v1.02, 2019), table of
	// D-line properties: D2 391.01617003 THz, Γ/2π = 6.035 MHz, I_sat 1.75
	// mW/cm²; D1 389.286058716 THz, Γ/2π = 5.956 MHz.
	k := alkali("K39", 766.700674872e-9, 6.035e6, 770.108136507e-9, 5.956e6)
	// Li-6: M. E. Gehm, "Properties of 6Li" (2003), tables of D-line
	// properties: D2 670.977338 nm, D1 670.992421 nm (vacuum), Γ/2π = 5.8724
	// MHz, I_sat 2.54 mW/cm².
	li := alkali("Li6", 670.977338e-9, 5.8724e6, 670.992421e-9, 5.8724e6)
	// Sr-88: 5s² ¹S₀ → 5s5p ¹P₁ at 460.862 nm, τ = 5.263 ns (Yasuda et al.,
	// Phys. Rev. A 73, 011403 (2006)), Γ/2π = 30.24 MHz; 5s² ¹S₀ → 5s5p ³P₁ at
	// 434 829 121 311 kHz (Ferrari et al., Phys. Rev. Lett. 91, 243002 (2003)),
	// λ = 689.4489 nm, Γ/2π = 7.4 kHz (NIST Atomic Spectra Database).
	sr := []Line{
		{"Sr88 461 nm", 460.862e-9, 1 / 5.263e-9, 0, 1},
		{"Sr88 689 nm", 689.4489e-9, twoπ * 7.4e3, 0, 1},
	}
	// Yb-174: 6s² ¹S₀ → 6s6p ¹P₁ at 398.9115 nm, Γ/2π = 29.1 MHz (Takasu et
	// al., Phys. Rev. Lett. 93, 123202 (2004)); 6s² ¹S₀ → 6s6p ³P₁ at
	// 555.8025 nm, Γ/2π = 182.4 kHz (NIST Atomic Spectra Database).
	yb := []Line{
		{"Yb174 399 nm", 398.9115e-9, twoπ * 29.1e6, 0, 1},
		{"Yb174 556 nm", 555.8025e-9, twoπ * 182.4e3, 0, 1},
	}
	steck87 := `D. A. Steck, "Rubidium 87 D Line Data", rev. 2.2.1 (2019)`
	steck85 := `D. A. Steck, "Rubidium 85 D Line Data", rev. 2.2.1 (2019)`
	steckCs := `D. A. Steck, "Cesium D Line Data", rev. 2.1.4 (2010)`
	steckNa := `D. A. Steck, "Sodium D Line Data", rev. 2.2.1 (2019)`
	tiecke := `T. G. Tiecke, "Properties of Potassium", v1.02 (2019)`
	gehm := `M. E. Gehm, "Properties of 6Li" (2003)`
	srSrc := "Yasuda et al., PRA 73, 011403 (2006); Ferrari et al., PRL 91, 243002 (2003); NIST ASD"
	ybSrc := "Takasu et al., PRL 93, 123202 (2004); NIST ASD"
	mRb87 := 1.443160648e-25 // Steck Rb-87 table 2
	mRb85 := 1.409993199e-25 // Steck Rb-85 table 2
	mCs := 2.20694657e-25    // Steck Cs table 2
	mNa := 3.8175458e-26     // Steck Na table 2
	mK := 38.96370668 * AMU  // Tiecke, atomic mass of K-39
	mLi := 6.0151228874 * AMU
	mSr := 87.9056125 * AMU
	mYb := 173.9388664 * AMU
	add(
		&Transition{"Rb87 D2", rb87[0].Wavelength, rb87[0].Gamma, 1.66933 * mWcm, cyclingAlkali, 3.57713 * mWcm, mRb87, rb87, steck87},
		&Transition{"Rb87 D1", rb87[1].Wavelength, rb87[1].Gamma, 4.4876 * mWcm, d1Note, 0, mRb87, rb87, steck87},
		&Transition{"Rb85 D2", rb85[0].Wavelength, rb85[0].Gamma, 1.66933 * mWcm, cyclingAlkali, 3.89512 * mWcm, mRb85, rb85, steck85},
		&Transition{"Rb85 D1", rb85[1].Wavelength, rb85[1].Gamma, 4.4876 * mWcm, d1Note, 0, mRb85, rb85, steck85},
		&Transition{"Cs133 D2", cs[0].Wavelength, cs[0].Gamma, 1.1023 * mWcm, cyclingAlkali, 2.7059 * mWcm, mCs, cs, steckCs},
		&Transition{"Cs133 D1", cs[1].Wavelength, cs[1].Gamma, 2.4981 * mWcm, d1Note, 0, mCs, cs, steckCs},
		&Transition{"Na23 D2", na[0].Wavelength, na[0].Gamma, 6.2600 * mWcm, cyclingAlkali, 13.4144 * mWcm, mNa, na, steckNa},
		&Transition{"K39 D2", k[0].Wavelength, k[0].Gamma, 1.75 * mWcm, cyclingAlkali, 0, mK, k, tiecke},
		&Transition{"Li6 D2", li[0].Wavelength, li[0].Gamma, 2.54 * mWcm, "cycling transition, σ± light (data sheet value)", 0, mLi, li, gehm},
		&Transition{"Sr88 461 nm", sr[0].Wavelength, sr[0].Gamma, TwoLevelIsat(sr[0].Wavelength, sr[0].Gamma), twoLevelNote + " (J = 0 → 1)", 0, mSr, sr, srSrc},
		&Transition{"Sr88 689 nm", sr[1].Wavelength, sr[1].Gamma, TwoLevelIsat(sr[1].Wavelength, sr[1].Gamma), twoLevelNote + " (J = 0 → 1)", 0, mSr, sr, srSrc},
		&Transition{"Yb174 399 nm", yb[0].Wavelength, yb[0].Gamma, TwoLevelIsat(yb[0].Wavelength, yb[0].Gamma), twoLevelNote + " (J = 0 → 1)", 0, mYb, yb, ybSrc},
		&Transition{"Yb174 556 nm", yb[1].Wavelength, yb[1].Gamma, TwoLevelIsat(yb[1].Wavelength, yb[1].Gamma), twoLevelNote + " (J = 0 → 1)", 0, mYb, yb, ybSrc},
	)
}

// Lookup returns a built-in transition by name.
func Lookup(name string) (*Transition, bool) {
	t, ok := builtin[name]
	return t, ok
}

// Names lists the built-in transitions, sorted.
func Names() []string {
	out := make([]string, 0, len(builtin))
	for n := range builtin {
		out = append(out, n)
	}
	sort.Strings(out)
	return out
}

// Custom makes a transition from a setup's own data: wavelength (m), Γ
// (rad/s), optional saturation intensity (W/m², 0: the two-level value) and
// mass (kg, 0: unknown). Its dipole potential uses the one line as a
// two-level atom.
func Custom(λ, Γ, isat, mass float64) *Transition {
	note := "as stated in the setup"
	if isat == 0 {
		isat, note = TwoLevelIsat(λ, Γ), twoLevelNote
	}
	return &Transition{
		Name: "custom", Wavelength: λ, Gamma: Γ, IsatCycling: isat, CyclingNote: note, Mass: mass,
		Lines:  []Line{{"custom", λ, Γ, 0, 1}},
		Source: "the setup file",
	}
}

// Describe is a one-line summary for listings.
func (t *Transition) Describe() string {
	var b strings.Builder
	fmt.Fprintf(&b, "λ = %.6f nm, Γ/2π = %.5g MHz, I_sat = %.6g mW/cm² (%s)",
		t.Wavelength*1e9, t.Gamma/twoπ/1e6, t.IsatCycling/mWcm, t.CyclingNote)
	if t.IsatIsotropic > 0 {
		fmt.Fprintf(&b, ", isotropic %.6g mW/cm²", t.IsatIsotropic/mWcm)
	}
	return b.String()
}

// LineNames lists the lines used for the dipole potential.
func (t *Transition) LineNames() []string {
	out := make([]string, len(t.Lines))
	for i, l := range t.Lines {
		out[i] = l.Name
	}
	return out
}

// NearestLine returns the line of the ground state nearest to light of
// angular frequency ω, measured in its own linewidths, with the detuning
// ω − ω_i from it (rad/s).
func (t *Transition) NearestLine(ω float64) (Line, float64) {
	var best Line
	bestΔ, bestN := 0.0, math.Inf(1)
	for _, l := range t.Lines {
		δ := ω - 2*math.Pi*C/l.Wavelength
		if n := math.Abs(δ) / l.Gamma; n < bestN {
			best, bestΔ, bestN = l, δ, n
		}
	}
	return best, bestΔ
}
