// Command beamledger answers, for a setup of lasers, beam paths, optics and
// atom clouds, whether enough light reaches the atoms and what the beams'
// hazards are, and writes the sign-off document.
package main

import (
	"os"
	"runtime/debug"
)

func main() {
	// A run lasts milliseconds and allocates a few tens of megabytes: leave
	// the collector off unless memory passes 1 GiB.
	debug.SetGCPercent(-1)
	debug.SetMemoryLimit(1 << 30)
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}
