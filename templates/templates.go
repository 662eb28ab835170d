// Package templates holds kneeprint's embedded files: the starter files a pilot
// fills in, the invented demo aircraft, and the card presets.
package templates

import "embed"

// FS holds starter/*.yaml and aircraft/*.yaml (the demo aircraft, invented).
//
//go:embed starter/*.yaml aircraft/*.yaml
var FS embed.FS

// Starter file names in FS, by kind.
const (
	StarterAircraft = "starter/aircraft.yaml"
	StarterAirfield = "starter/airfield.yaml"
)

// DemoAircraftDir is the folder of FS holding the invented demo aircraft.
const DemoAircraftDir = "aircraft"
