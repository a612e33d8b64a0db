package drive

import "math"

func near(a, b, rel float64) bool { return math.Abs(a-b) <= rel*math.Abs(b) }

// okLaser is a laser "l" at 780 nm, 1 W, 1 mm waist.
const okLaser = `
[[laser]]
name = "l"
wavelength = "780 nm"
power = "1 W"
waist = "1 mm"
`
