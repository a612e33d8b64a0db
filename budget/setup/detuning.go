package setup

import (
	"beamledger/budget/atoms"
	"beamledger/budget/units"
	"fmt"
	"math"
)

// FarDetuningFactor: a beam counts as far detuned when its detuning from
// every line of the ground state that the dipole potential sums exceeds this
// many of that line's natural linewidths (for the alkalis, 1000 Γ is a few
// GHz, well beyond the excited-state hyperfine structure, so the D1/D2
// treatment of Grimm et al. (2000), §2.3, applies). Our threshold. Light
// within it of a line other than the driven one fits neither the far-detuned
// formula nor the two-level figures of the driven line, and is refused.
const FarDetuningFactor = 1000

// How light counts at a cloud (Classify).
const (
	LightNear      = "near resonance"
	LightFar       = "far detuned"
	LightOtherLine = "near another line"
)

// Classify says how light at detuning Δ (rad/s) from transition tr's
// driven line counts there: within FarDetuningFactor of its linewidths,
// near resonance (the two-level figures); within that many linewidths of
// another line of the ground state, near that line (line, and δ its
// detuning from it, rad/s: neither model applies); otherwise far detuned
// (the dipole potential summed over the lines).
func Classify(Δ float64, tr *atoms.Transition) (kind string, line atoms.Line, δ float64) {
	if math.Abs(Δ) <= FarDetuningFactor*tr.Gamma {
		return LightNear, line, 0
	}
	line, δ = tr.NearestLine(tr.Frequency() + Δ)
	if math.Abs(δ) <= FarDetuningFactor*line.Gamma {
		return LightOtherLine, line, δ
	}
	return LightFar, line, δ
}

// Detuning sources.
const (
	DetuningFromElement     = "stated at the atoms element"
	DetuningFromLaser       = "laser detuning plus AOM shifts"
	DetuningFromWavelengths = "laser and transition wavelengths plus AOM shifts"
)

// aomShift is the frequency shift of the AOMs before element upTo on path p
// and, through the splitters that feed it, on its parent paths, Hz: the
// shift the path's own laser carries there.
func aomShift(p *Path, upTo *Element) float64 {
	shift := 0.0
	for p != nil {
		for _, e := range p.Elements {
			if upTo != nil && e == upTo {
				break
			}
			shift += e.FrequencyShift()
		}
		upTo = p.ParentPort
		p = p.Parent
	}
	return shift
}

// FrequencyShift is the shift an element gives the light passing it, Hz:
// order × frequency × passes for an AOM, 0 for anything else.
func (e *Element) FrequencyShift() float64 {
	if e.Type != TypeAOM {
		return 0
	}
	return float64(e.Order) * e.Frequency * float64(e.Passes)
}

// LightFrequency is the optical frequency of laser las after AOM shifts
// totalling shift (Hz), from its vacuum wavelength, Hz.
func LightFrequency(las *Laser, shift float64) float64 { return atoms.C/las.Wavelength + shift }

// DetuningAt finds Δ = ω_laser − ω_atom at atoms element e for laser las
// carrying AOM shifts totalling shift (Hz), rad/s, and where it came from:
// the element's stated detuning (e nil: not to be used, as for another
// laser's beam on the path), the laser's stated detuning plus the shifts,
// or the wavelengths plus the shifts.
func DetuningAt(las *Laser, e *Element, shift float64, tr *atoms.Transition) (float64, string) {
	if e != nil && e.Detuning != nil {
		return 2 * math.Pi * *e.Detuning, DetuningFromElement
	}
	if las.DetuningSet {
		return 2 * math.Pi * (las.Detuning + shift), DetuningFromLaser
	}
	return 2 * math.Pi * (LightFrequency(las, shift) - atoms.C/tr.Wavelength), DetuningFromWavelengths
}

// DetuningTolerance is how far a stated detuning may sit from the one the
// wavelengths give, as a fraction of the transition frequency: 0.1 %, about
// 0.8 nm at 780 nm, so that a wavelength written to the nearest nanometre
// passes while a laser on another line, or a stated detuning that belongs
// to another laser, does not (our threshold).
const DetuningTolerance = 1e-3

// checkDetuning refuses, at atoms element e of path p, the path's own
// light whose frequency after the AOM shifts is not positive, and a stated
// detuning (on the element or the laser) that disagrees with the
// wavelengths by more than DetuningTolerance. It returns the problem, or "".
func checkDetuning(p *Path, e *Element, tr *atoms.Transition) string {
	return DetuningProblem(p.Laser, e, aomShift(p, e), tr)
}

// DetuningProblem is checkDetuning for laser las carrying AOM shifts
// totalling shift (Hz) to element e (nil: the element's detuning is not for
// this laser).
func DetuningProblem(las *Laser, e *Element, shift float64, tr *atoms.Transition) string {
	ν := LightFrequency(las, shift)
	if !(ν > 0) {
		return fmt.Sprintf("the AOM shifts (%s in all) take laser %q at %s to a frequency of %s, which is not positive",
			units.FormatFrequency(shift), las.Name, units.FormatLength(las.Wavelength), units.FormatFrequency(ν))
	}
	Δ, source := DetuningAt(las, e, shift, tr)
	if source == DetuningFromWavelengths {
		return ""
	}
	ν0 := atoms.C / tr.Wavelength
	stated := ν0 + Δ/(2*math.Pi)
	if diff := math.Abs(stated - ν); diff > DetuningTolerance*ν0 {
		return fmt.Sprintf("the stated detuning (%s) puts the light at %s, %s from %s, but laser %q at %s (with %s of AOM shifts) is at %s; they differ by %s, more than the %.1f %% of the transition frequency allowed; correct the wavelength or the detuning",
			source, units.FormatFrequency(stated), units.FormatFrequency(Δ/(2*math.Pi)), tr.Name, las.Name, units.FormatLength(las.Wavelength), units.FormatFrequency(shift), units.FormatFrequency(ν), units.FormatFrequency(diff), 100*DetuningTolerance)
	}
	return ""
}
