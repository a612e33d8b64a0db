package drive

import (
	"math"
	"slices"

	"beamledger/budget"
	"beamledger/budget/setup"
)

// Shifts are the trap's differential light shifts (Hz, excited minus
// ground) on the clouds that near-resonant light reaches, at the trap
// minimum (at the cloud when there is none) of the lasers' operating powers
// for a budget at the operating power, of their maximum powers for the
// hazards' budget, where excited_polarizability gives them for every trap
// laser; nil when there are none.
func Shifts(b *budget.Budget) map[*setup.Cloud]float64 {
	var drive []*AtomsResult
	var out map[*setup.Cloud]float64
	for _, c := range b.Setup.Clouds {
		if c.Data == nil || len(c.ExcitedPolarizability) == 0 {
			continue
		}
		if drive == nil {
			drive = driveAll(b, pass{})
		}
		cr := beamsAt(c, drive)
		if cr == nil || !slices.ContainsFunc(cr.Beams, func(cb *CloudBeam) bool { return cb.Near }) {
			continue
		}
		f := cr.fieldAt(nil, 1, true, !b.AtOperating)
		f.trial = true
		var at [3]float64
		if len(f.beams) > 0 && len(f.beams) <= MaxTrapBeams && c.Data.Mass > 0 {
			if t := f.findTrap(); t.Found {
				at = t.Minimum
			}
		}
		if _, δ := f.lightShifts(at, c); !math.IsNaN(δ) && δ != 0 {
			if out == nil {
				out = map[*setup.Cloud]float64{}
			}
			out[c] = δ
		}
	}
	return out
}

// Budget is the setup's budget at the lasers' operating powers
// (atOperating: the drive's and the tables') or their maximum powers (the
// hazards'), with the trap's differential light shift on each cloud in
// its near-resonant light's detuning (Shifts; the far-detuned light that
// makes the shift does not depend on it, so one more pass settles it).
func Budget(s *setup.Setup, atOperating bool) (*budget.Budget, error) {
	compute := budget.Compute
	if atOperating {
		compute = budget.ComputeAtOperating
	}
	b, err := compute(s)
	if err != nil {
		return nil, err
	}
	shifts := Shifts(b)
	if shifts == nil {
		return b, nil
	}
	return budget.ComputeShifted(s, atOperating, shifts)
}

// budgetForGoals is Budget at the operating powers for the tolerance
// samples, which read only what arrives at atoms elements
// (budget.ComputeForGoals).
// reuse as for budget.ComputeForGoals.
func budgetForGoals(s *setup.Setup, reuse *budget.Budget) (*budget.Budget, error) {
	b, err := budget.ComputeForGoals(s, nil, reuse)
	if err != nil {
		return nil, err
	}
	shifts := Shifts(b)
	if shifts == nil {
		return b, nil
	}
	return budget.ComputeForGoals(s, shifts, b)
}
