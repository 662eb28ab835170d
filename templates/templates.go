// Package templates holds kneeprint's embedded files: the starter files a pilot
// fills in, the invented demo aircraft, and the card presets.
package templates

import "embed"

// FS holds starter/*.yaml, aircraft/*.yaml (the demo aircraft, invented) and
// cards/*.yaml (the card presets) and plans/*.yaml (the demo season plan).
//
//go:embed starter/*.yaml aircraft/*.yaml cards/*.yaml plans/*.yaml
var FS embed.FS

// Starter file names in FS, by kind.
const (
	StarterAircraft = "starter/aircraft.yaml"
	StarterAirfield = "starter/airfield.yaml"
	StarterPlan     = "starter/plan.yaml"
	DemoPlan        = "plans/demo-season.yaml"
)

// DemoAircraftDir is the folder of FS holding the invented demo aircraft.
const DemoAircraftDir = "aircraft"

// CardsDir is the folder of FS holding the card presets; DefaultCard the one used
// when none is named.
const (
	CardsDir    = "cards"
	DefaultCard = "a5"
)
