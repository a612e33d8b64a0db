package setup

import (
	"fmt"
	"testing"
)

// The light's frequency is c/λ plus the AOM shifts, with c = 299 792 458 m/s
// (CODATA, exact): 780.241 209 686 nm is 384.230 484 THz, the Rb-87 D2 line
// (Steck, Rubidium 87 D Line Data, rev. 2.2.1, table 3: 384.230 484 468 5 THz).
func TestLightFrequency(t *testing.T) {
	las := &Laser{Wavelength: 780.241209686e-9}
	if got := LightFrequency(las, -80e6); !near(got, 384.2304844685e12-80e6, 1e-10) {
		t.Errorf("ν = %.6f THz", got/1e12)
	}
}

// Default viewing durations: the 0.25 s aversion response for visible light
// (400–700 nm) and 10 s elsewhere for unintended viewing (IEC 60825-1:2014,
// the time bases of classification, from memory).
func TestDefaultViewingDuration(t *testing.T) {
	for _, tc := range []struct{ λ, want float64 }{{400e-9, 0.25}, {633e-9, 0.25}, {700e-9, 0.25}, {399e-9, 10}, {780e-9, 10}, {10.6e-6, 10}} {
		t.Run(fmt.Sprint(tc), func(t *testing.T) {
			if got := DefaultViewingDuration(tc.λ); got != tc.want {
				t.Errorf("%g m: %g s, want %g s", tc.λ, got, tc.want)
			}
		})
	}
}
