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

// singleBeamEscape works out by hand the escape from one round Gaussian
// beam along z with gravity along −y: the potential is
// V = −(U0/q) exp(−2y²/(w0² q)) + m g y with q = 1 + z²/z_R² (the beam of
// Siegman, Lasers (1986), §17.1, in the potential of Grimm et al. (2000),
// eq. (10); x = 0 by symmetry). ∂V/∂q = (U0/q²) e^(…) (1 − 2y²/w²) vanishes
// off z = 0 only at |y| = w/√2, and ∂V/∂y = 0 there gives the saddle in
// closed form: q*^(3/2) = 2√2 U0/(e w0 m g), V* = −U0/(e q*) − m g w0 √q*/√2
// (when q* > 1; below, the way straight down is the lowest). The minimum
// is the slice z = 0's inner force balance, the straight-down barrier its
// outer one (bisection). bent and down are their heights above the
// minimum, J; zs the saddle's distance along the beam, m.
func singleBeamEscape(U0, w0, zR, m float64) (bent, down, zs float64) {
	g := m * G
	V := func(y float64) float64 { return -U0*math.Exp(-2*y*y/(w0*w0)) + g*y }
	force := func(y float64) float64 { return U0*4*y/(w0*w0)*math.Exp(-2*y*y/(w0*w0)) + g }
	root := func(f func(float64) float64, a, b float64) float64 { // f(a) > 0 > f(b)
		for range 200 {
			c := (a + b) / 2
			if f(c) > 0 {
				a = c
			} else {
				b = c
			}
		}
		return (a + b) / 2
	}
	v0 := V(root(force, 0, -w0/2))
	down = V(root(func(y float64) float64 { return -force(y) }, -w0/2, -20*w0)) - v0
	q := math.Pow(2*math.Sqrt2*U0/(math.E*w0*g), 2.0/3)
	if q <= 1 {
		return down, down, 0
	}
	return -U0/(math.E*q) - g*w0*math.Sqrt(q)/math.Sqrt2 - v0, down, zR * math.Sqrt(q-1)
}

// One horizontal beam under gravity: the depth is the barrier on the bent
// way out (along the beam, then down), below the straight-down barrier;
// the saddle lies along the beam from the minimum. By hand as above.
func TestSingleBeamEscapesAlongTheBeam(t *testing.T) {
	_, cs := cloudsOf(t, beamOn("trap", "1064 nm", "100 mW", "30 um", "z")+cloudC("-y", ""))
	tr := cs[0].Trap
	if tr == nil || !tr.Holds || tr.Saddle == nil {
		t.Fatalf("trap %+v", tr)
	}
	m := cs[0].Cloud.Data.Mass
	U := u0(t, 1064e-9, 0.1, 30e-6)
	zR := math.Pi * 30e-6 * 30e-6 / 1064e-9
	bent, down, zs := singleBeamEscape(U, 30e-6, zR, m)
	if !(bent < 0.97*down) {
		t.Fatalf("the case does not tell the two apart: bent %g K, down %g K", bent/atoms.KB, down/atoms.KB)
	}
	if !relNear(tr.Depth, bent, 1e-3) {
		t.Errorf("depth %g K, want the bent escape's %g K (straight down %g K)", tr.Depth/atoms.KB, bent/atoms.KB, down/atoms.KB)
	}
	if s := *tr.Saddle; !relNear(math.Abs(s[2]), zs, 1e-3) || s[1] > tr.Minimum[1] {
		t.Errorf("saddle at %v m: want %g m along the beam and below the minimum at %v", s, zs, tr.Minimum)
	}
	// The profile for the plot runs from the minimum over the saddle: its
	// highest point is the depth above its first.
	hi := math.Inf(-1)
	for _, p := range tr.Profile {
		hi = math.Max(hi, p[1])
	}
	if d := (hi - tr.Profile[0][1]) * atoms.KB; !relNear(d, tr.Depth, 1e-3) {
		t.Errorf("profile rises %g K, depth %g K", d/atoms.KB, tr.Depth/atoms.KB)
	}
}

// A trap-depth goal on that beam: the power it needs makes the bent
// escape's barrier the target (by hand as above, U0 ∝ P).
func TestElementDepthGoalOverTheBentEscape(t *testing.T) {
	src := strings.Replace(beamOn("trap", "1064 nm", "100 mW", "30 um", "z"), `cloud = "c"`, "cloud = \"c\"\n  goal = \"trap_depth\"\n  goal_value = \"5 uK\"", 1) + cloudC("-y", "")
	b, _ := cloudsOf(t, src)
	a := Evaluate(b)[0]
	g := a.Goal
	if g == nil || g.Impossible != "" {
		t.Fatalf("goal %+v", g)
	}
	k := g.Intensity / a.PeakIrradiance
	zR := math.Pi * 30e-6 * 30e-6 / 1064e-9
	bent, down, _ := singleBeamEscape(k*u0(t, 1064e-9, 0.1, 30e-6), 30e-6, zR, a.Cloud.Data.Mass)
	if !relNear(bent/atoms.KB, 5e-6, 2e-3) { // the bisection stops at 1e-3
		t.Errorf("the goal's power %g W gives a bent escape of %g K (straight down %g K), want 5 µK", k, bent/atoms.KB, down/atoms.KB)
	}
}

// Two beams crossed at 90° under gravity along −y: no saddle off the
// straight rays lies lower, and the depth stays one beam's less the sag's
// share within 2 % (as without gravity, TestCloudCrossedBeamsByHand).
func TestCrossedTrapKeepsItsDepth(t *testing.T) {
	src := beamOn("a", "1064 nm", "5 W", "50 um", "z") + beamOn("b", "1064 nm", "5 W", "50 um", "x")
	_, flat := cloudsOf(t, src+cloudC("none", ""))
	_, cs := cloudsOf(t, src+cloudC("-y", ""))
	U := u0(t, 1064e-9, 5, 50e-6)
	if tr := flat[0].Trap; !relNear(tr.Depth, U, 0.02) {
		t.Errorf("without gravity: depth %g K, want one beam's %g K", tr.Depth/atoms.KB, U/atoms.KB)
	}
	if tr := cs[0].Trap; !tr.Holds || tr.Depth > flat[0].Trap.Depth || !relNear(tr.Depth, U, 0.05) {
		t.Errorf("with gravity: depth %g K (saddle %v), without %g K", tr.Depth/atoms.KB, tr.Saddle, flat[0].Trap.Depth/atoms.KB)
	}
}

// The tolerance samples of a trap-depth goal on one horizontal beam under
// gravity follow the bent escape too: the nominal sample's margin is the
// goal's own (straight rays alone would give a deeper trap and a larger
// margin), for the element's goal and the whole cloud's.
func TestToleranceSamplesKeepTheBentEscape(t *testing.T) {
	beam := strings.Replace(beamOn("trap", "1064 nm", "200 mW", "30 um", "z"), `power = "200 mW"`, "power = \"200 mW\"\noperating_power = \"80 mW .. 120 mW\"", 1)
	src := strings.Replace(beam, `cloud = "c"`, "cloud = \"c\"\n  goal = \"trap_depth\"\n  goal_value = \"5 uK\"", 1) +
		cloudC("-y", "goal = \"trap_depth\"\ngoal_value = \"5 uK\"")
	s, err := setup.Parse("t.toml", []byte(src))
	if err != nil {
		t.Fatal(err)
	}
	b, _ := budget.ComputeAtOperating(s)
	d := Evaluate(b)
	cs := Clouds(b, d)
	if cs[0].Trap.Saddle == nil {
		t.Fatalf("no bent escape found: %+v", cs[0].Trap)
	}
	res := Tolerances(s, d, 50, DefaultSeed, 0)
	for owner, want := range map[any]float64{d[0]: d[0].Goal.MarginDB, s.Clouds[0]: cs[0].Goal.MarginDB} {
		gt := res[owner]
		if gt == nil || math.Abs(gt.Nominal-want) > 0.01 {
			t.Errorf("%T: nominal sample's margin %+v, want the goal's %g dB", owner, gt, want)
		}
	}
	if math.Abs(d[0].Goal.MarginDB-cs[0].Goal.MarginDB) > 0.01 {
		t.Errorf("the element's margin %g dB and the cloud's %g dB differ for one beam", d[0].Goal.MarginDB, cs[0].Goal.MarginDB)
	}
}

// Two equal beams crossing at a shallow angle, no gravity: the atoms
// leave the crossing along one beam once they are three radii from the
// other's axis, which a ray at angle θ reaches only after 3W/sin θ; the
// barrier there is the other beam's depth at the crossing, U0 (by hand:
// V = −U_a − U_b at the minimum, −U_a beyond the other beam; the focus
// lies 3W/sin 15° = 0.58 mm from the crossing, 8 % of z_R = 7.4 mm,
// where U_a falls by under 1 %). At 15°, 30° and 90°.
func TestShallowCrossingDepth(t *testing.T) {
	U := u0(t, 1064e-9, 5, 50e-6)
	for _, deg := range []float64{15, 30, 90} {
		θ := deg * math.Pi / 180
		dir := fmt.Sprintf("[%g, 0, %g]", math.Sin(θ), math.Cos(θ))
		b := strings.Replace(beamOn("b", "1064 nm", "5 W", "50 um", "z"), `axis = "z"`, "direction = "+dir, 1)
		_, cs := cloudsOf(t, beamOn("a", "1064 nm", "5 W", "50 um", "z")+b+cloudC("none", ""))
		if tr := cs[0].Trap; tr == nil || !relNear(tr.Depth, U, 0.02) {
			t.Errorf("%g°: depth %g K, want the other beam's %g K", deg, tr.Depth/atoms.KB, U/atoms.KB)
		}
	}
}

// The weak (axial) frequency of one focused beam, no gravity, is
// √(2U0/(m z_R²)) whichever way the beam runs in the cloud frame (Grimm et
// al. (2000), eq. (37)): at 0°, 25° and 45° from z in the x–z plane, the
// principal axes' own steps keep the tight axes' step out of it.
func TestAxialFrequencyOfAnObliqueBeam(t *testing.T) {
	U := u0(t, 1064e-9, 5, 50e-6)
	zR := math.Pi * 50e-6 * 50e-6 / 1064e-9
	for _, deg := range []float64{0, 25, 45} {
		θ := deg * math.Pi / 180
		b := strings.Replace(beamOn("b", "1064 nm", "5 W", "50 um", "z"), `axis = "z"`, fmt.Sprintf("direction = [%g, 0, %g]", math.Sin(θ), math.Cos(θ)), 1)
		_, cs := cloudsOf(t, b+cloudC("none", ""))
		tr := cs[0].Trap
		m := cs[0].Cloud.Data.Mass
		if want := math.Sqrt(2*U/(m*zR*zR)) / (2 * math.Pi); tr == nil || !relNear(tr.Frequencies[0], want, 0.01) {
			t.Errorf("%g°: weak frequency %g Hz, want %g Hz", deg, tr.Frequencies[0], want)
		}
	}
}

// An atoms element's own beam under gravity gives both depths, named: the
// field-free |U| at the centre and its trap's depth with gravity over the
// lowest escape (by hand as singleBeamEscape).
func TestElementDepthWithGravity(t *testing.T) {
	b, _ := cloudsOf(t, beamOn("trap", "1064 nm", "100 mW", "30 um", "z")+cloudC("-y", ""))
	a := Evaluate(b)[0]
	U := u0(t, 1064e-9, 0.1, 30e-6)
	bent, _, _ := singleBeamEscape(U, 30e-6, math.Pi*30e-6*30e-6/1064e-9, a.Cloud.Data.Mass)
	if d := a.Dipole; !relNear(-d.Depth, U, 1e-9) || !relNear(d.DepthWithGravity, bent, 1e-3) {
		t.Errorf("|U| %g K (want %g K), with gravity %g K (want %g K)", -d.Depth/atoms.KB, U/atoms.KB, d.DepthWithGravity/atoms.KB, bent/atoms.KB)
	}
}

// Two conventions, both named: a crossed trap's depth is the barrier out
// of the crossing into one arm, U0 (one beam's, without gravity); the
// energy to leave the whole potential, out of both beams, is the depth of
// both at the crossing, 2U0 (by hand: V = −2U0 at the minimum, 0 far away
// along every line).
func TestCrossedTrapLeaveEnergy(t *testing.T) {
	_, cs := cloudsOf(t, beamOn("a", "1064 nm", "5 W", "50 um", "z")+beamOn("b", "1064 nm", "5 W", "50 um", "x")+cloudC("none", ""))
	U := u0(t, 1064e-9, 5, 50e-6)
	if tr := cs[0].Trap; !relNear(tr.Depth, U, 0.02) || !relNear(tr.Leave, 2*U, 0.02) {
		t.Errorf("depth %g K (want %g K), leave %g K (want %g K)", tr.Depth/atoms.KB, U/atoms.KB, tr.Leave/atoms.KB, 2*U/atoms.KB)
	}
}

// Two beams on one line (running opposite ways, not declared a standing
// wave), no gravity: the atoms sit in both, 2U0 deep every way out (by
// hand: −2U0 at the focus, 0 far away); a ray along the line never leaves
// the other beam, so it runs to the beams' reach.
func TestTwoBeamsOnOneLine(t *testing.T) {
	b := strings.Replace(beamOn("b", "1064 nm", "5 W", "50 um", "z"), `axis = "z"`, "direction = [0, 0, -1]", 1)
	_, cs := cloudsOf(t, beamOn("a", "1064 nm", "5 W", "50 um", "z")+b+cloudC("none", ""))
	if U := u0(t, 1064e-9, 5, 50e-6); !relNear(cs[0].Trap.Depth, 2*U, 0.01) {
		t.Errorf("depth %g K, want 2U0 = %g K", cs[0].Trap.Depth/atoms.KB, 2*U/atoms.KB)
	}
}
