// Command beamledger answers, for a setup of lasers, beam paths, optics and
// atom clouds, whether enough light reaches the atoms and what the beams'
// hazards are, and writes the sign-off document.
package main

import "os"

// The garbage collector keeps its default setting: measured on the shipped
// examples it costs nothing visible, and on the largest setups a run may hold
// it keeps memory at a third of what a disabled collector lets it grow to.
func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}
