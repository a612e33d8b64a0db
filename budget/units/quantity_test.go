package units

import (
	"math"
	"strings"
	"testing"
)

func TestParseQuantity(t *testing.T) {
	// Unit factors: SI brochure, 9th edition (2019), tables of prefixes and of
	// non-SI units accepted for use with the SI (min, h, degree, Da).
	tests := []struct {
		in   string
		want float64
		dim  Dimension
	}{
		{"780.24 nm", 780.24e-9, Length},
		{"1.5 W", 1.5, Power},
		{"250 mW", 0.25, Power},
		{"0.8 mm", 0.8e-3, Length},
		{"50 micron", 50e-6, Length},   // the micrometre as lab notes write it (common practice)
		{"1000 microns", 1e-3, Length}, // common practice
		{"6 um", 6e-6, Length},
		{"6 µm", 6e-6, Length},
		{"6µm", 6e-6, Length},
		{"6.07 MHz", 6.07e6, Frequency},
		{"0.25 s", 0.25, Time},
		{"100 ms", 0.1, Time},
		{"8 h", 28800, Time},
		{"2 min", 120, Time},
		{"1.67 mW/cm2", 16.7, Irradiance},    // 1 mW/cm² = 10 W/m²
		{"1.67 mW/cm²", 16.7, Irradiance},    //
		{"10 W/m^2", 10, Irradiance},         //
		{"5 J/cm2", 5e4, RadiantExposure},    // 1 J/cm² = 1e4 J/m²
		{"5 kW/cm", 5e5, LinearPowerDensity}, // 1 kW/cm = 1e5 W/m
		{"20 cm", 0.2, Length},
		{"-50 mm", -0.05, Length},
		{"0.5 mK", 0.5e-3, Temperature},
		{"3 uK", 3e-6, Temperature},
		{"82 %", 0.82, Dimensionless},
		{"0.9", 0.9, Dimensionless},
		{"2e4", 2e4, Dimensionless},
		{"5 deg", 5 * math.Pi / 180, Angle},
		{"1.5 mrad", 1.5e-3, Angle},
		{"86.909 u", 86.909 * 1.66053906660e-27, Mass},
		{"1 fs", 1e-15, Time},
		{"1 GHz", 1e9, Frequency},
		{"1e-3 W", 1e-3, Power},
		{"2 mJ", 2e-3, Energy},
		{"1 W*s", 1, Energy},
	}
	for _, tc := range tests {
		t.Run(tc.in, func(t *testing.T) {
			got, dim, err := ParseQuantity(tc.in)
			if err != nil {
				t.Errorf("ParseQuantity(%q): %v", tc.in, err)
				return

			}
			if dim != tc.dim {
				t.Errorf("ParseQuantity(%q) dimension %v, want %v", tc.in, dim, tc.dim)
			}
			if math.Abs(got-tc.want) > 1e-12*math.Abs(tc.want) {
				t.Errorf("ParseQuantity(%q) = %g, want %g", tc.in, got, tc.want)
			}
		})
	}
}

func TestParseQuantityErrors(t *testing.T) {
	tests := []struct{ in, want string }{
		{"", "empty quantity"},
		{"mm", `does not start with a number`},
		{"20 cm x", `unknown unit "cm x"`},
		{"5 furlongs", `unknown unit "furlongs"`},
		{"1 W/m/s", `one "/" at most`},
		{"nan W", "does not start with a number"},
		{"1e400 W", "bad number"},
		{"1e300 GW/fm2", "overflows"},
		{"5 %2", "unknown unit"},
		{"5 mmin", "unknown unit"},
	}
	for _, tc := range tests {
		t.Run(tc.in, func(t *testing.T) {
			_, _, err := ParseQuantity(tc.in)
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("ParseQuantity(%q) error %v, want it to contain %q", tc.in, err, tc.want)
			}
		})
	}
}

func TestParseAsDimension(t *testing.T) {
	_, err := ParseAs("5 mm", Power)
	if err == nil || err.Error() != `"5 mm" is a length, want a power (e.g. "250 mW")` {
		t.Errorf("got %v", err)
	}
}

func FuzzParseQuantity(f *testing.F) {
	for _, s := range []string{"780.24 nm", "1.67 mW/cm2", "82 %", "5 kW/cm", "-1e-3 m^2", "3 µK", "1 W*s/m2", ""} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		v, d, err := ParseQuantity(s)
		if err != nil {
			return
		}
		if math.IsNaN(v) || math.IsInf(v, 0) {
			t.Fatalf("ParseQuantity(%q) = %v (%v) without error", s, v, d)
		}
	})
}

// A unit with many factors cannot wrap the exponent counters around to a
// plain length.
func TestUnitExponentOverflow(t *testing.T) {
	u := "780 nm" + strings.Repeat("*m^4", 64)
	if _, _, err := ParseQuantity(u); err == nil || !strings.Contains(err.Error(), "powers of the base units pass") {
		t.Errorf("%q: %v", u[:20], err)
	}
	if v, err := ParseAs("1 m^4*m^4/m^4*m^3", Length); err != nil || v != 1 {
		t.Errorf("got %v, %v", v, err)
	}
}
