// Package airfields holds kneeprint's invented demo airfields, embedded in the binary.
// None of them exists; their names, identifiers and distances are made up.
package airfields

import "embed"

// FS holds the demo airfield files at its root.
//
//go:embed *.yaml
var FS embed.FS
