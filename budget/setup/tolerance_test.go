package setup

import (
	"strings"
	"testing"
)

// tolLab is one laser through a lens onto a dump, with a waist and a focal
// length to tolerance.
const tolLab = `[[laser]]
name = "l"
wavelength = "780 nm"
power = "10 mW"
waist = "WAIST"

[[path]]
name = "p"
from = "l"

  [[path.element]]
  type = "lens"
  at = "AT"
  focal_length = "FOCAL"
  transmission = "0.995 ± 0.005"

  [[path.element]]
  type = "dump"
  at = "300 mm"
  rating = "1 W"
`

// A normal tolerance's mean ± 3σ (what the samples and the worst case
// reach) must stay where the value could be written directly; the message
// gives the largest σ that does, rounded down (1.5 mm − 0.1 µm over 3 is
// 499.97 µm: "499 µm", never "500 µm"). A position must stay between its
// neighbours. A loss value keeps its truncated normal (no transmission
// above 1). By hand.
func TestToleranceStaysInItsDomain(t *testing.T) {
	for _, c := range []struct{ waist, at, focal, want string }{
		{"1 mm", "100 mm", "200 mm", ""},
		{"1.5 mm ± 1.5 mm", "100 mm", "200 mm", "a standard deviation up to 499 µm keeps it inside"},
		{"1 mm ± 0.3 mm", "100 mm", "200 mm", ""},
		{"1 mm", "100 mm", "200 mm ± 1 m", "a standard deviation up to 66.6 mm keeps it inside"},
		{"1 mm", "100 mm", "-200 mm ± 50 mm", ""},
		{"1 mm", "100 mm", "-200 mm ± 70 mm", "a standard deviation up to 66.6 mm"},
		{"1 mm", "250 mm ± 20 mm", "200 mm", "the position may range from 0 m to 300 mm"},
		{"1 mm", "250 mm .. 299 mm", "200 mm", ""},
		{"1 mm", "250 mm .. 301 mm", "200 mm", "past its neighbours"},
		{"1 mm", "100 mm", "200 mm", ""}, // with the lens's transmission below
	} {
		src := strings.NewReplacer("WAIST", c.waist, "AT", c.at, "FOCAL", c.focal).Replace(tolLab)
		ps := strings.Join(loadProblems(src), "\n")
		if (c.want == "") != (ps == "") || !strings.Contains(ps, c.want) {
			t.Errorf("%+v: problems %q", c, ps)
		}
	}
}
