package setup

import "math"

func near(a, b, rel float64) bool { return math.Abs(a-b) <= rel*math.Abs(b) }
