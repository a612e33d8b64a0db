// Command beamledger answers, for a setup of lasers, beam paths, optics and
// atom clouds, whether enough light reaches the atoms and what the beams'
// hazards are, and writes the sign-off document.
package main

import "os"

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}
