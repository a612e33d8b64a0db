// Package starter holds the commented setup that `beamledger init` writes.
package starter

import _ "embed"

// Setup is the text of the starter setup file.
//
//go:embed starter.toml
var Setup []byte
