package drive

import (
	"math"
	"strings"
	"testing"

	"beamledger/budget"
	"beamledger/budget/atoms"
	"beamledger/budget/setup"
)

// Recoil heating in one focused beam without gravity, by hand: at the
// focus the atoms scatter Γ_sc of the trap light and warm by T_r Γ_sc/3
// (T_r = ħ²k²/(m k_B) of 1064 nm; Grimm et al. (2000), §2.3), so a trap of
// depth U is climbed in (U/k_B)/(T_r Γ_sc/3); the element and the cloud,
// whose minimum is the focus, agree.
func TestTrapRecoilHeatingByHand(t *testing.T) {
	b, cs := cloudsOf(t, beamOn("trap", "1064 nm", "5 W", "50 um", "z")+cloudC("none", ""))
	a := Evaluate(b)[0]
	m := a.Cloud.Data.Mass
	k := 2 * math.Pi / 1064e-9
	tr := atoms.Hbar * atoms.Hbar * k * k / (m * atoms.KB)
	rate := tr * a.ScatteringRate / 3
	U := u0(t, 1064e-9, 5, 50e-6)
	if d := a.Dipole; !relNear(d.HeatingRate, rate, 1e-9) || !relNear(d.HeatTime, U/atoms.KB/rate, 1e-6) {
		t.Errorf("element: heating %g K/s in %g s, want %g K/s in %g s", d.HeatingRate, d.HeatTime, rate, U/atoms.KB/rate)
	}
	if tp := cs[0].Trap; !relNear(tp.HeatingRate, rate, 1e-6) || !relNear(tp.HeatTime, tp.Depth/atoms.KB/rate, 1e-6) {
		t.Errorf("cloud: heating %g K/s in %g s, want %g K/s", tp.HeatingRate, tp.HeatTime, rate)
	}
}

// An imaging pulse on a trapped cloud, by hand: each atom scatters
// (Γ/2) s/(1 + s + 4Δ²/Γ²) × pulse photons; U/(k_B T_r) random kicks or
// N with N² + N = 2U/(k_B T_r) pushes along the beam (T_r of 780 nm) take
// it out of the trap's depth U.
func TestPulsePhotonsAgainstTheDepth(t *testing.T) {
	probe := strings.ReplaceAll(beamOn("probe", "780.241209686 nm", "10 uW", "1 mm", "x"), "waist_at", "detuning = \"-6 MHz\"\nwaist_at")
	probe = strings.Replace(probe, `cloud = "c"`, "cloud = \"c\"\n  pulse = \"50 us\"", 1)
	s, err := setup.Parse("pulse.toml", []byte(beamOn("trap", "1064 nm", "5 W", "50 um", "z")+probe+cloudC("none", "")))
	if err != nil {
		t.Fatal(err)
	}
	b, err := Budget(s, true)
	if err != nil {
		t.Fatal(err)
	}
	cs := Clouds(b, Evaluate(b))
	var cb *CloudBeam
	for _, x := range cs[0].Beams {
		if x.Near {
			cb = x
		}
	}
	a := cb.Atoms
	Γ, sat := a.Transition.Gamma, a.Saturation
	Δ := -2 * math.Pi * 6e6
	photons := Γ / 2 * sat / (1 + sat + 4*Δ*Δ/(Γ*Γ)) * 50e-6
	k := 2 * math.Pi / 780.241209686e-9
	tr := atoms.Hbar * atoms.Hbar * k * k / (a.Transition.Mass * atoms.KB)
	U := cs[0].Trap.Depth
	heat := U / (atoms.KB * tr)
	push := (math.Sqrt(1+8*heat) - 1) / 2
	if !relNear(cb.Photons, photons, 1e-9) || !relNear(cb.HeatOut, heat, 1e-9) || !relNear(cb.PushOut, push, 1e-9) {
		t.Errorf("photons %g, heat out %g, push out %g; want %g, %g, %g", cb.Photons, cb.HeatOut, cb.PushOut, photons, heat, push)
	}
	if !(cb.Photons > 1 && cb.HeatOut > cb.PushOut) {
		t.Errorf("the case is degenerate: %g photons, %g, %g", cb.Photons, cb.HeatOut, cb.PushOut)
	}
	// 68.6 photons stay below the 536 that heat an atom out: no note; a
	// pulse ten times longer passes them and a note says so.
	if fs := CloudFindings(cs); len(fs) != 0 {
		t.Errorf("findings %+v", fs)
	}
	for _, cb := range cs[0].Beams {
		cb.Photons *= 10
	}
	if fs := CloudFindings(cs); len(fs) != 1 || fs[0].Kind != FindingPulseHeatsOut || fs[0].Severity != budget.SeverityNote {
		t.Errorf("findings %+v", fs)
	}
}
