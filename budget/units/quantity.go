package units

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"
)

// Dimension is a product of powers of the base quantities used in a setup:
// length, mass, time, temperature and plane angle. Angle is kept apart from
// the dimensionless numbers so that "0.5 deg" cannot pass as a fraction.
type Dimension struct {
	Length, Mass, Time, Temperature, Angle int8
}

// Named dimensions used by the setup format.
var (
	Dimensionless      = Dimension{}
	Length             = Dimension{Length: 1}
	Mass               = Dimension{Mass: 1}
	Time               = Dimension{Time: 1}
	Frequency          = Dimension{Time: -1}
	Temperature        = Dimension{Temperature: 1}
	Angle              = Dimension{Angle: 1}
	Power              = Dimension{Length: 2, Mass: 1, Time: -3}
	Energy             = Dimension{Length: 2, Mass: 1, Time: -2}
	Irradiance         = Dimension{Mass: 1, Time: -3}
	RadiantExposure    = Dimension{Mass: 1, Time: -2}
	LinearPowerDensity = Dimension{Length: 1, Mass: 1, Time: -3}
)

var dimensionNames = map[Dimension]string{
	Dimensionless:      "a bare number",
	Length:             "a length (e.g. \"0.8 mm\")",
	Mass:               "a mass (e.g. \"86.909 u\")",
	Time:               "a duration (e.g. \"100 ms\")",
	Frequency:          "a frequency (e.g. \"6.07 MHz\")",
	Temperature:        "a temperature (e.g. \"0.5 mK\")",
	Angle:              "an angle (e.g. \"2 mrad\" or \"5 deg\")",
	Power:              "a power (e.g. \"250 mW\")",
	Energy:             "an energy (e.g. \"2 mJ\")",
	Irradiance:         "an irradiance (e.g. \"1.67 mW/cm2\")",
	RadiantExposure:    "a radiant exposure (e.g. \"5 J/cm2\")",
	LinearPowerDensity: "a linear power density (e.g. \"5 kW/cm\")",
}

// String names the dimension for error messages.
func (d Dimension) String() string {
	if s, ok := dimensionNames[d]; ok {
		return s
	}
	var parts []string
	for _, p := range []struct {
		sym string
		e   int8
	}{{"m", d.Length}, {"kg", d.Mass}, {"s", d.Time}, {"K", d.Temperature}, {"rad", d.Angle}} {
		switch {
		case p.e == 1:
			parts = append(parts, p.sym)
		case p.e != 0:
			parts = append(parts, fmt.Sprintf("%s^%d", p.sym, p.e))
		}
	}
	return "a quantity in " + strings.Join(parts, "·")
}

// Add is the dimension of a product (sign +1) or quotient (sign −1) of
// quantities of dimensions d and o.
func (d Dimension) Add(o Dimension, sign int8) Dimension {
	return Dimension{
		d.Length + sign*o.Length, d.Mass + sign*o.Mass, d.Time + sign*o.Time,
		d.Temperature + sign*o.Temperature, d.Angle + sign*o.Angle,
	}
}

// maxExponent bounds the power of each base unit in a unit, far above any
// the setup format uses, so that the int8 exponents never wrap.
const maxExponent = 12

func (d Dimension) outOfRange() bool {
	for _, e := range []int8{d.Length, d.Mass, d.Time, d.Temperature, d.Angle} {
		if e > maxExponent || e < -maxExponent {
			return true
		}
	}
	return false
}

// Scale is the dimension of a quantity of dimension d raised to the power n.
func (d Dimension) Scale(n int8) Dimension {
	return Dimension{d.Length * n, d.Mass * n, d.Time * n, d.Temperature * n, d.Angle * n}
}

// UnitDef is a unit symbol the parser knows.
type UnitDef struct {
	factor   float64 // value of one unit in SI
	Dim      Dimension
	Prefixed bool // whether SI prefixes may stand before the symbol
}

// Unit symbols the parser knows, with their value in SI base units.
var Units = map[string]UnitDef{
	"m": {1, Length, true},
	// micron: the µm as lab notes write it.
	"micron":  {1e-6, Length, false},
	"microns": {1e-6, Length, false},
	"g":       {1e-3, Mass, true},
	"u":       {1.66053906660e-27, Mass, false}, // unified atomic mass unit, CODATA 2018
	"Da":      {1.66053906660e-27, Mass, false},
	"amu":     {1.66053906660e-27, Mass, false},
	"s":       {1, Time, true},
	"min":     {60, Time, false},
	"h":       {3600, Time, false},
	"Hz":      {1, Frequency, true},
	"K":       {1, Temperature, true},
	"W":       {1, Power, true},
	"J":       {1, Energy, true},
	"rad":     {1, Angle, true},
	"deg":     {math.Pi / 180, Angle, false},
	"°":       {math.Pi / 180, Angle, false},
	"%":       {0.01, Dimensionless, false},
}

// Prefixes are the SI prefixes from f to G with their factors.
var Prefixes = map[string]float64{
	"f": 1e-15, "p": 1e-12, "n": 1e-9, "u": 1e-6, "µ": 1e-6, "μ": 1e-6,
	"m": 1e-3, "c": 1e-2, "k": 1e3, "M": 1e6, "G": 1e9,
}

// ParseQuantity reads "number unit" (for example "780.24 nm", "1.67 mW/cm2",
// "82 %") and returns the value in SI base units with its dimension. A bare
// number is dimensionless. Units may be multiplied with "*" or "·" and divided
// with "/"; a unit may carry an integer power ("cm2", "m^2", "cm²").
func ParseQuantity(s string) (float64, Dimension, error) {
	t := strings.TrimSpace(s)
	if t == "" {
		return 0, Dimension{}, fmt.Errorf("empty quantity")
	}
	numEnd := numberPrefixLen(t)
	if numEnd == 0 {
		return 0, Dimension{}, fmt.Errorf("%q does not start with a number", s)
	}
	v, err := strconv.ParseFloat(t[:numEnd], 64)
	if err != nil {
		return 0, Dimension{}, fmt.Errorf("%q: bad number %q", s, t[:numEnd])
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, Dimension{}, fmt.Errorf("%q is not a finite number", s)
	}
	unit := strings.TrimSpace(t[numEnd:])
	if unit == "" {
		return v, Dimensionless, nil
	}
	f, d, err := parseUnit(unit)
	if err != nil {
		return 0, Dimension{}, err
	}
	r := v * f
	if math.IsInf(r, 0) || math.IsNaN(r) {
		return 0, Dimension{}, fmt.Errorf("%q overflows", s)
	}
	return r, d, nil
}

// numberPrefixLen returns the length of the decimal number at the start of t:
// optional sign, digits with one optional point, optional exponent.
func numberPrefixLen(t string) int {
	i := 0
	if i < len(t) && (t[i] == '+' || t[i] == '-') {
		i++
	}
	digits := 0
	for i < len(t) && t[i] >= '0' && t[i] <= '9' {
		i++
		digits++
	}
	if i < len(t) && t[i] == '.' {
		i++
		for i < len(t) && t[i] >= '0' && t[i] <= '9' {
			i++
			digits++
		}
	}
	if digits == 0 {
		return 0
	}
	if i < len(t) && (t[i] == 'e' || t[i] == 'E') {
		j := i + 1
		if j < len(t) && (t[j] == '+' || t[j] == '-') {
			j++
		}
		k := j
		for k < len(t) && t[k] >= '0' && t[k] <= '9' {
			k++
		}
		if k > j {
			i = k
		}
	}
	return i
}

func parseUnit(u string) (float64, Dimension, error) {
	factor, dim := 1.0, Dimension{}
	sign := int8(1)
	start := 0
	seenDivide := false
	for i := 0; i <= len(u); {
		var sep rune
		w := 1
		if i < len(u) {
			r, size := decodeRune(u[i:])
			w = size
			if r != '/' && r != '*' && r != '·' {
				i += w
				continue
			}
			sep = r
		}
		term := strings.TrimSpace(u[start:i])
		f, d, err := parseUnitTerm(term)
		if err != nil {
			return 0, Dimension{}, fmt.Errorf("unknown unit %q", u)
		}
		if sign > 0 {
			factor *= f
		} else {
			factor /= f
		}
		dim = dim.Add(d, sign)
		if dim.outOfRange() {
			return 0, Dimension{}, fmt.Errorf("unknown unit %q: its powers of the base units pass ±%d", u, maxExponent)
		}
		if i == len(u) {
			break
		}
		if sep == '/' {
			if seenDivide {
				return 0, Dimension{}, fmt.Errorf("unknown unit %q: use one \"/\" at most", u)
			}
			seenDivide = true
			sign = -1
		}
		i += w
		start = i
	}
	return factor, dim, nil
}

func decodeRune(s string) (rune, int) {
	for _, r := range s {
		return r, len(string(r))
	}
	return 0, 0
}

var superscripts = map[rune]int8{'¹': 1, '²': 2, '³': 3}

// parseUnitTerm reads one symbol with optional prefix and integer power.
func parseUnitTerm(term string) (float64, Dimension, error) {
	if term == "" {
		return 0, Dimension{}, fmt.Errorf("empty unit")
	}
	power := int8(1)
	body := term
	if i := strings.IndexByte(body, '^'); i >= 0 {
		n, err := strconv.Atoi(body[i+1:])
		if err != nil || n < -4 || n > 4 || n == 0 {
			return 0, Dimension{}, fmt.Errorf("bad power in %q", term)
		}
		power, body = int8(n), body[:i]
	} else if r := []rune(body); len(r) > 1 {
		last := r[len(r)-1]
		if p, ok := superscripts[last]; ok {
			power, body = p, string(r[:len(r)-1])
		} else if last >= '2' && last <= '4' && !unicode.IsDigit(r[len(r)-2]) {
			power, body = int8(last-'0'), string(r[:len(r)-1])
		}
	}
	f, d, ok := lookupSymbol(body)
	if !ok {
		return 0, Dimension{}, fmt.Errorf("unknown unit %q", term)
	}
	if power != 1 {
		if d == Dimensionless {
			return 0, Dimension{}, fmt.Errorf("power of %q", term)
		}
		f = math.Pow(f, float64(power))
		d = d.Scale(power)
	}
	return f, d, nil
}

func lookupSymbol(sym string) (float64, Dimension, bool) {
	if u, ok := Units[sym]; ok {
		return u.factor, u.Dim, true
	}
	for p, pf := range Prefixes {
		rest, found := strings.CutPrefix(sym, p)
		if !found || rest == "" {
			continue
		}
		if u, ok := Units[rest]; ok && u.Prefixed {
			return pf * u.factor, u.Dim, true
		}
	}
	return 0, Dimension{}, false
}

// ParseAs reads a quantity and checks that it has the wanted dimension.
func ParseAs(s string, want Dimension) (float64, error) {
	v, d, err := ParseQuantity(s)
	if err != nil {
		return 0, err
	}
	if d != want {
		return 0, fmt.Errorf("%q is %s, want %s", s, Describe(d), want)
	}
	return v, nil
}

// Describe names a dimension for people, without its example unit.
func Describe(d Dimension) string {
	s := d.String()
	if i := strings.Index(s, " (e.g."); i > 0 {
		return s[:i]
	}
	return s
}
