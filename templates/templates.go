// Package templates holds kneeprint's embedded files: the starter files a pilot
// fills in, the invented demo aircraft, and the card presets.
package templates

import "embed"

// FS holds starter/*.yaml, aircraft/*.yaml (the demo aircraft, invented) and
// cards/*.yaml (the card presets).
//
//go:embed starter/*.yaml aircraft/*.yaml cards/*.yaml
var FS embed.FS

// Starter file names in FS, by kind.
const (
	StarterAircraft = "starter/aircraft.yaml"
	StarterAirfield = "starter/airfield.yaml"
)

// DemoAircraftDir is the folder of FS holding the invented demo aircraft.
const DemoAircraftDir = "aircraft"

// CardsDir is the folder of FS holding the card presets; DefaultCard the one used
// when none is named.
const (
	CardsDir    = "cards"
	DefaultCard = "a5"
)
