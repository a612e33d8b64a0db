package safety

import "beamledger/budget"

// Assessment is the whole evaluation of one setup.
type Assessment struct {
	Setup  *budget.Setup
	Budget *budget.Budget
	Atoms  []*budget.AtomsResult
	// Clouds counts every beam at each cloud together.
	Clouds   []*budget.CloudResult
	Hazards  *Hazards
	Findings []budget.Finding
}

// Evaluate computes everything `check` reports.
func Evaluate(s *budget.Setup) (*Assessment, error) {
	b, err := budget.Compute(s)
	if err != nil {
		return nil, err
	}
	a := &Assessment{Setup: s, Budget: b, Atoms: b.Drive()}
	a.Clouds = b.Clouds(a.Atoms)
	a.Findings = append(a.Findings, b.Findings()...)
	a.Findings = append(a.Findings, budget.DriveFindings(a.Atoms)...)
	a.Findings = append(a.Findings, budget.CloudFindings(a.Clouds)...)
	h, err := evaluateHazards(s, b)
	if err != nil {
		return nil, err
	}
	a.Hazards = h
	a.Findings = append(a.Findings, h.Findings...)
	return a, nil
}

// NeedsAction reports whether any finding must be dealt with.
func (a *Assessment) NeedsAction() bool {
	for _, f := range a.Findings {
		if f.Severity == budget.SeverityAction {
			return true
		}
	}
	return false
}
