package limits

import (
	"fmt"
	"math"
	"strings"
)

// LimitSet names a set of exposure limits a workplace may have to apply.
type LimitSet string

// The limit sets: IEC 60825-1:2014 (Edition 3), the EU directive
// 2006/25/EC (Annex II, the values workplaces in the EU must apply, close to
// IEC 60825-1 Ed. 1.2 / ICNIRP 2000), and the strictest of the two (the
// default: every MPE evaluated in both sets, the lower governing). SetBoth
// marks a value on which the two sets agree.
const (
	SetStrictest LimitSet = "strictest"
	SetIEC       LimitSet = "IEC 60825-1:2014"
	SetDirective LimitSet = "2006/25/EC"
	SetBoth      LimitSet = "both"
)

// LimitSets are the values a setup may choose, the default first.
var LimitSets = []string{string(SetStrictest), string(SetIEC), string(SetDirective)}

// ParseLimitSet reads a setup's or a flag's choice of limit set; "" is the
// default, strictest.
func ParseLimitSet(s string) (LimitSet, error) {
	if s == "" {
		return SetStrictest, nil
	}
	for _, v := range LimitSets {
		if s == v {
			return LimitSet(v), nil
		}
	}
	return "", fmt.Errorf("%q is not a limit set: use one of %s", s, strings.Join(quoteAll(LimitSets), ", "))
}

func quoteAll(v []string) []string {
	q := make([]string, len(v))
	for i, s := range v {
		q[i] = fmt.Sprintf("%q", s)
	}
	return q
}

// Describe says in words which limits a choice applies.
func (s LimitSet) Describe() string {
	switch s {
	case SetIEC:
		return "IEC 60825-1:2014 (Edition 3) alone"
	case SetDirective:
		return "Directive 2006/25/EC, Annex II alone"
	case SetBoth:
		return "IEC 60825-1:2014 and Directive 2006/25/EC (equal here)"
	}
	return "the stricter of IEC 60825-1:2014 (Edition 3) and Directive 2006/25/EC, Annex II, value by value"
}

// Governs says in words which set a governing value came from.
func (s LimitSet) Governs() string {
	switch s {
	case SetIEC:
		return "IEC 60825-1:2014"
	case SetDirective:
		return "2006/25/EC"
	case SetBoth:
		return "both sets (equal)"
	}
	return string(s)
}

// sameValue reports whether two limits agree to the printed precision
// (1e-9 relative: both sets evaluate the same expression there).
func sameValue(a, b float64) bool { return math.Abs(a-b) <= 1e-9*math.Max(math.Abs(a), math.Abs(b)) }

// stricter picks the lower of two limits (iec from IEC 60825-1:2014, dir
// from the directive); the pick's Set says which governs, SetBoth where the
// two are equal (then the IEC value, with its provenance, is returned).
func stricter(iec, dir Limit) Limit {
	switch {
	case sameValue(iec.RadiantExposure, dir.RadiantExposure):
		iec.Set = SetBoth
		return iec
	case dir.RadiantExposure < iec.RadiantExposure:
		return dir
	}
	return iec
}

// EyeMPEIn is the eye MPE of a limit set (EyeMPE, DirectiveEyeMPE, or the
// lower of the two for SetStrictest).
func EyeMPEIn(set LimitSet, λ, t, α float64) (Limit, error) {
	return in(set, func() (Limit, error) { return EyeMPE(λ, t, α) }, func() (Limit, error) { return DirectiveEyeMPE(λ, t, α) })
}

// SkinMPEIn is the skin MPE of a limit set (SkinMPE, DirectiveSkinMPE, or
// the lower of the two for SetStrictest).
func SkinMPEIn(set LimitSet, λ, t float64) (Limit, error) {
	return in(set, func() (Limit, error) { return SkinMPE(λ, t) }, func() (Limit, error) { return DirectiveSkinMPE(λ, t) })
}

func in(set LimitSet, iec, dir func() (Limit, error)) (Limit, error) {
	switch set {
	case SetIEC:
		return iec()
	case SetDirective:
		return dir()
	case SetStrictest, "":
		a, err := iec()
		if err != nil {
			return Limit{}, err
		}
		b, err := dir()
		if err != nil {
			return Limit{}, err
		}
		return stricter(a, b), nil
	}
	return Limit{}, fmt.Errorf("unknown limit set %q", set)
}

// PulsedEyeMPEIn applies the repetitive-pulse rules of a limit set
// (PulsedEyeMPE, DirectivePulsedEyeMPE); for SetStrictest both sets' rules
// are applied, each with its own limits and counting, and the lower limit
// per pulse governs (Set says whose; SetBoth where they are equal).
func PulsedEyeMPEIn(set LimitSet, λ, τ, f, T, α float64) (PulsedLimit, error) {
	switch set {
	case SetIEC:
		return PulsedEyeMPE(λ, τ, f, T, α)
	case SetDirective:
		return DirectivePulsedEyeMPE(λ, τ, f, T, α)
	case SetStrictest, "":
		a, err := PulsedEyeMPE(λ, τ, f, T, α)
		if err != nil {
			return PulsedLimit{}, err
		}
		b, err := DirectivePulsedEyeMPE(λ, τ, f, T, α)
		if err != nil {
			return PulsedLimit{}, err
		}
		switch {
		case sameValue(a.PerPulse, b.PerPulse):
			a.Set = SetBoth
			return a, nil
		case b.PerPulse < a.PerPulse:
			return b, nil
		}
		return a, nil
	}
	return PulsedLimit{}, fmt.Errorf("unknown limit set %q", set)
}
