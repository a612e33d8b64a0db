//go:build race

package main

// raceEnabled: timing tests are skipped under the race detector, which
// slows the code several times over.
const raceEnabled = true
