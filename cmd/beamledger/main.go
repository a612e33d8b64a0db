// Command beamledger answers, for a setup of lasers, beam paths, optics and
// atom clouds, whether enough light reaches the atoms and what the beams'
// hazards are, and writes the sign-off document.
package main

import (
	"os"
	"runtime/debug"
)

func main() {
	// A run lasts milliseconds and holds a few megabytes: collect garbage
	// less often.
	debug.SetGCPercent(400)
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}
