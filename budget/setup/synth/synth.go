// Package synth writes random but valid setup files: invented labs for
// property tests and benchmarks. Nothing in them describes a real setup.
package synth

import (
	"fmt"
	"math"
	"math/rand/v2"
	"regexp"
	"strconv"
	"strings"
)

// Options sizes a generated lab.
type Options struct {
	Lasers          int // number of sources
	ElementsPerPath int // elements on each path before its dump
	Splits          int // extra branch paths per laser, fed by splitters
	OpenEnds        bool
	// Fibers starts every path with a fibre (left out of the older labs, so
	// that their seeds still give the same files).
	Fibers bool
	// Tolerances writes every laser's operating power and every lens's
	// transmission as tolerances and gives every atoms element a
	// saturation goal (for the tolerance analysis's benchmarks).
	Tolerances bool
	// Merges sends every odd laser's first path into a combiner on the
	// previous laser's first path (with per-laser values there), and gives
	// each merged path a cylindrical lens.
	Merges bool
}

// Lab returns the text of a setup file drawn from the seeded generator.
func Lab(seed uint64, o Options) string {
	r := rand.New(rand.NewPCG(seed, 0x5eed))
	var b strings.Builder
	fmt.Fprintf(&b, "# Generated lab (seed %d): invented, for tests and benchmarks only.\n", seed)
	fmt.Fprintf(&b, "[setup]\ntitle = \"Generated lab %d\"\nsite = \"nowhere\"\nprepared_by = \"generator\"\nrevision = \"%d\"\n\n", seed, seed)
	fmt.Fprintf(&b, "[[cloud]]\nname = \"c\"\ntransition = \"Rb87 D2\"\natoms = 1e5\nrms_size = [\"20 um\", \"20 um\", \"200 um\"]\n\n")
	wavelengths := []string{"780.24 nm", "1064 nm", "532 nm", "852.35 nm", "689.45 nm", "1550 nm", "461 nm", "399 nm"}
	for l := 0; l < o.Lasers; l++ {
		op := 0.01 + r.Float64()*5
		max := op * (1 + r.Float64())
		fmt.Fprintf(&b, "[[laser]]\nname = \"L%d\"\nwavelength = %q\npower = \"%.6g W\"\noperating_power = \"%.6g W\"\n", l, wavelengths[r.IntN(len(wavelengths))], max, op)
		fmt.Fprintf(&b, "waist = [\"%.4g mm\", \"%.4g mm\"]\nm2 = [%.3g, %.3g]\nwaist_at = \"%.4g mm\"\n\n",
			0.2+2*r.Float64(), 0.2+2*r.Float64(), 1+r.Float64(), 1+r.Float64(), -200+400*r.Float64())
		paths := []string{fmt.Sprintf("L%dp0", l)}
		froms := []string{fmt.Sprintf("L%d", l)}
		for s := 0; s < o.Splits; s++ {
			paths = append(paths, fmt.Sprintf("L%dp%d", l, s+1))
			froms = append(froms, fmt.Sprintf("L%dp%d:split%d", l, s, s))
		}
		for pi, name := range paths {
			fmt.Fprintf(&b, "[[path]]\nname = %q\nfrom = %q\n", name, froms[pi])
			var eb strings.Builder // the path's elements, after its own keys
			at := 0.0
			if o.Fibers {
				at += 0.05 + 0.1*r.Float64()
				fmt.Fprintf(&eb, "  [[path.element]]\n  type = \"fiber\"\n  at = \"%.6g m\"\n  coupling = %.4g\n  output_waist = \"%.4g mm\"\n", at, 0.4+0.4*r.Float64(), 0.5+1.5*r.Float64())
			}
			for e := 0; e < o.ElementsPerPath; e++ {
				at += 0.02 + 0.2*r.Float64()
				if pi < len(paths)-1 && e == o.ElementsPerPath/2 {
					fmt.Fprintf(&eb, "  [[path.element]]\n  type = \"splitter\"\n  name = \"split%d\"\n  at = \"%.6g m\"\n  transmission = %.4g\n", pi, at, 0.05+0.9*r.Float64())
					continue
				}
				writeElement(&eb, r, at)
			}
			if o.Merges && pi == 0 {
				at += 0.02 + 0.1*r.Float64()
				fmt.Fprintf(&eb, "  [[path.element]]\n  type = \"cylindrical_lens\"\n  focal_length = \"%.4g mm\"\n  plane = %q\n  at = \"%.6g m\"\n", 100+400*r.Float64(), []string{"x", "y"}[r.IntN(2)], at)
				if l%2 == 0 && l+1 < o.Lasers {
					// the combiner the next laser's first path goes into
					at += 0.02 + 0.1*r.Float64()
					fmt.Fprintf(&eb, "  [[path.element]]\n  type = \"combiner\"\n  name = \"comb%d\"\n  at = \"%.6g m\"\n  transmission = { L%d = %.4g }\n  join_transmission = { L%d = %.4g }\n", l+1, at, l, 0.8+0.2*r.Float64(), l+1, 0.8+0.2*r.Float64())
					for e := 0; e < 2; e++ {
						at += 0.02 + 0.2*r.Float64()
						writeElement(&eb, r, at)
					}
				}
			}
			switch {
			case o.Merges && l%2 == 1 && pi == 0:
				fmt.Fprintf(&b, "into = \"L%dp0:comb%d\"\ninto_at = \"%.6g m\"\n", l-1, l, at+0.05)
				b.WriteString(eb.String())
			case !o.OpenEnds || r.IntN(2) == 0:
				b.WriteString(eb.String())
				fmt.Fprintf(&b, "  [[path.element]]\n  type = \"dump\"\n  at = \"%.6g m\"\n  rating = \"%.4g W\"\n", at+0.1, 1+20*r.Float64())
			default:
				b.WriteString(eb.String())
			}
			b.WriteString("\n")
		}
	}
	if !o.Tolerances {
		return b.String()
	}
	// Tolerances on the text already drawn, so that a seed's lab is the same
	// lab with or without them.
	out := b.String()
	// σ is 1 % of the operating power, at most a third of its way to the
	// maximum (mean + 3σ stays a power the laser has).
	out = opRE.ReplaceAllStringFunc(out, func(m string) string {
		g := opRE.FindStringSubmatch(m)
		pw, _ := strconv.ParseFloat(g[1], 64)
		op, _ := strconv.ParseFloat(g[2], 64)
		σ := math.Min(0.01*op, (pw-op)/3)
		if !(σ > 0) {
			return m
		}
		return fmt.Sprintf("power = \"%s W\"\noperating_power = \"%s W ± %.6g W\"", g[1], g[2], σ)
	})
	out = transRE.ReplaceAllString(out, `transmission = "$1 ± 0.005"`)
	out = strings.ReplaceAll(out, "  type = \"atoms\"\n  cloud = \"c\"\n", "  type = \"atoms\"\n  cloud = \"c\"\n  goal = \"saturation\"\n  goal_value = 1\n")
	return out
}

// The patterns the tolerance mode rewrites: a laser's power and operating
// power, and a bare transmission.
var (
	opRE    = regexp.MustCompile(`power = "([0-9.e+-]+) W"\noperating_power = "([0-9.e+-]+) W"`)
	transRE = regexp.MustCompile(`(?m)transmission = (0\.[0-9]+)$`)
)

func writeElement(b *strings.Builder, r *rand.Rand, at float64) {
	fmt.Fprintf(b, "  [[path.element]]\n")
	switch r.IntN(8) {
	case 0:
		fmt.Fprintf(b, "  type = \"lens\"\n  focal_length = \"%.4g mm\"\n  transmission = %.4g\n", []float64{-50, 75, 100, 150, 200, 300, 500}[r.IntN(7)], 0.9+0.1*r.Float64())
	case 1:
		fmt.Fprintf(b, "  type = \"mirror\"\n  reflectivity = %.5g\n", 0.95+0.05*r.Float64())
	case 2:
		fmt.Fprintf(b, "  type = \"window\"\n  transmission = %.4g\n  thickness = \"%.3g mm\"\n  index = 1.45\n", 0.9+0.1*r.Float64(), 1+9*r.Float64())
	case 3:
		fmt.Fprintf(b, "  type = \"aom\"\n  efficiency = %.4g\n  frequency = \"80 MHz\"\n  passes = %d\n", 0.5+0.4*r.Float64(), 1+r.IntN(2))
	case 4:
		fmt.Fprintf(b, "  type = \"filter\"\n  optical_density = %.3g\n", 3*r.Float64())
	case 5:
		fmt.Fprintf(b, "  type = \"aperture\"\n  diameter = \"%.4g mm\"\n", 0.5+10*r.Float64())
	case 6:
		fmt.Fprintf(b, "  type = \"atoms\"\n  cloud = \"c\"\n")
	default:
		fmt.Fprintf(b, "  type = \"lens\"\n  focal_length = \"%.4g mm\"\n", 100+400*r.Float64())
	}
	if r.IntN(3) == 0 {
		fmt.Fprintf(b, "  aperture = \"%.4g mm\"\n", 1+25*r.Float64())
	}
	fmt.Fprintf(b, "  at = \"%.6g m\"\n", at)
}
