package drive

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"beamledger/budget"
	"beamledger/budget/atoms"
	"beamledger/budget/setup"
)

// trappedProbe is a 5 W trap beam along z (50 µm waist, no gravity) and a
// 10 µW probe along x stated on resonance, with a saturation goal s = 0.1
// at the cloud's exit, on a cloud whose excited state's polarizability at
// the trap light is −1200 a.u. (given or not).
func trappedProbe(t *testing.T, excited bool) *setup.Setup {
	t.Helper()
	probe := strings.ReplaceAll(beamOn("probe", "780.241209686 nm", "10 uW", "1 mm", "x"), "waist_at", "detuning = \"0 MHz\"\nwaist_at")
	probe = strings.Replace(probe, `cloud = "c"`, "cloud = \"c\"\n  goal = \"saturation\"\n  goal_value = 0.1\n  goal_at = \"exit\"", 1)
	extra := ""
	if excited {
		extra = "excited_polarizability = { trap = -1200 }"
	}
	src := beamOn("trap", "1064 nm", "5 W", "50 um", "z") + probe + strings.Replace(cloudC("none", extra), "atoms = 1e5", "atoms = 3e6", 1)
	s, err := setup.Parse("shift.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// A probe in a trap: its detuning at the atoms is the stated 0 less the
// trap's differential light shift δ = (U_e − U_g)/h at the trap minimum
// (U = −α I/(2 ε0 c), I = 2P/(π w0²) at the focus: by hand), and the
// element's s-dependent figures, the budget's scattered power and the
// goal all use it: the rate (Γ/2) s/(1 + s + 4Δ²/Γ²) and the column's
// detuning factor 1 + 4Δ²/Γ² (Reinaudi et al. 2007, eq. (1)) by hand.
func TestProbeInATrapTakesTheLightShift(t *testing.T) {
	s := trappedProbe(t, true)
	b, err := Budget(s, true)
	if err != nil {
		t.Fatal(err)
	}
	d := Evaluate(b)
	var probe *AtomsResult
	for _, a := range d {
		if a.Path.Laser.Name == "probe" {
			probe = a
		}
	}
	tr := probe.Transition
	// The shift by hand.
	trapD := atoms.FarDetuned(tr.Lines, 2*math.Pi*atoms.C/1064e-9)
	I := 2 * 5 / (math.Pi * 50e-6 * 50e-6)
	ug := trapD.PotentialPerIntensity * I
	ue := 1200 * atoms.AUPol / (2 * atoms.Eps0 * atoms.C) * I
	δ := (ue - ug) / atoms.H
	Δ := -2 * math.Pi * δ
	if !relNear(probe.TrapShift, δ, 1e-3) || !relNear(probe.Detuning, Δ, 1e-3) {
		t.Fatalf("shift %g Hz, detuning %g rad/s; want %g Hz and %g rad/s", probe.TrapShift, probe.Detuning, δ, Δ)
	}
	if math.Abs(Δ) < tr.Gamma {
		t.Fatalf("the case does not tell the two apart: Δ = %g Γ", Δ/tr.Gamma)
	}
	A := 1 + 4*Δ*Δ/(tr.Gamma*tr.Gamma)
	if want := tr.Gamma / 2 * probe.Saturation / (A + probe.Saturation); !relNear(probe.ScatteringRate, want, 1e-6) {
		t.Errorf("scattering rate %g /s, want %g /s", probe.ScatteringRate, want)
	}
	// The cloud section counts the same detuning.
	cs := Clouds(b, d)
	if want := tr.Gamma / 2 * probe.Saturation / (A + probe.Saturation); !relNear(cs[0].ScatteringRate, want, 1e-6) {
		t.Errorf("cloud's scattering rate %g /s, want %g /s", cs[0].ScatteringRate, want)
	}
	// The goal at the exit: s_in from ln(s_in/s) + (s_in − s)/A = b0 Φ(2)/A
	// (the column's saturable relation with the detuning factor).
	sIn := probe.Goal.Intensity / probe.Isat
	col := budget.ColumnFor(probe.Path, probe.Path.First+probe.Path.RowIndex(probe.Row), probe.Row.Element, probe.Cloud, δ)
	if lhs := A*math.Log(sIn/0.1) + sIn - 0.1; !relNear(lhs, col.B0*atoms.ColumnFraction(2), 1e-6) || !relNear(col.A, A, 1e-9) {
		t.Errorf("A ln(s_in/s) + s_in − s = %g, want b0 Φ(2) = %g (A %g, want %g)", lhs, col.B0*atoms.ColumnFraction(2), col.A, A)
	}
	// The budget row: what the atoms scatter is the shifted column's
	// absorption at the operating power.
	wx, wy := probe.Row.BeamIn.Radii()
	want := 1 - col.Absorb(probe.Power, wx, wy).Transmission
	got := 0.0
	for _, l := range probe.Row.Losses {
		if l.Kind == budget.LossScattered {
			got += l.Fraction / probe.Row.FractionIn
		}
	}
	if !relNear(got, want, 1e-9) {
		t.Errorf("budget's scattered fraction %g, the shifted column's %g", got, want)
	}
	// Without the excited state's polarizability there is no shift.
	b0, _ := Budget(trappedProbe(t, false), true)
	for _, a := range Evaluate(b0) {
		if a.Path.Laser.Name == "probe" && (a.TrapShift != 0 || a.Detuning != 0) {
			t.Errorf("no polarizability: shift %g Hz, detuning %g", a.TrapShift, a.Detuning)
		}
	}
}

// For the hazards the trap may be off: the budget lets through the more of
// with and without the shift (here with it: the shift takes the probe off
// resonance), at the maximum powers.
func TestHazardBudgetTakesTheMoreThatGetsThrough(t *testing.T) {
	s := trappedProbe(t, true)
	bare, _ := budget.Compute(s)
	shifted, err := Budget(s, false)
	if err != nil {
		t.Fatal(err)
	}
	through := func(b *budget.Budget) float64 {
		for _, pb := range b.Paths {
			if pb.Laser.Name == "probe" {
				return pb.Rows[len(pb.Rows)-1].FractionIn // into the dump after the cloud
			}
		}
		return math.NaN()
	}
	if !(through(shifted) > through(bare)) {
		t.Errorf("through the cloud: %g with the shift, %g without; want more with", through(shifted), through(bare))
	}
}

// The resonant optical depth of a beam oblique to an anisotropic cloud:
// b0 = σ0 N/(2π √(det Σ · dᵀΣ⁻¹d)) for the cloud's covariance Σ and the
// beam's direction d (the column of a Gaussian along d; by hand with
// Σ = diag(10², 20², 40²) µm², d = [1, 1, 1]/√3: det Σ · dᵀΣ⁻¹d =
// (σx²σy²σz²)(1/σx² + 1/σy² + 1/σz²)/3), and σ0 N/(2π σ_a σ_b) along each
// axis.
func TestOpticalDepthOfAnObliqueBeam(t *testing.T) {
	sizes := [3]float64{10e-6, 20e-6, 40e-6}
	for _, dir := range []string{"[1, 1, 1]", "[1, 0, 0]", "[0, 1, 0]", "[0, 0, 1]"} {
		src := strings.Replace(beamOn("p", "780.241209686 nm", "1 uW", "1 mm", "z"), `axis = "z"`, "direction = "+dir, 1) +
			strings.Replace(cloudC("none", ""), `rms_size = ["10 um", "10 um", "10 um"]`, `rms_size = ["10 um", "20 um", "40 um"]`, 1)
		b, _ := cloudsOf(t, src)
		a := Evaluate(b)[0]
		var d [3]float64
		fmt.Sscanf(dir, "[%g, %g, %g]", &d[0], &d[1], &d[2])
		norm := math.Sqrt(d[0]*d[0] + d[1]*d[1] + d[2]*d[2])
		det, quad := 1.0, 0.0
		for i := range 3 {
			det *= sizes[i] * sizes[i]
			quad += d[i] * d[i] / (norm * norm) / (sizes[i] * sizes[i])
		}
		want := a.CrossSection * 1e5 / (2 * math.Pi * math.Sqrt(det*quad))
		if !relNear(a.OpticalDepth, want, 1e-9) {
			t.Errorf("along %s: b0 %g, want %g", dir, a.OpticalDepth, want)
		}
	}
}
