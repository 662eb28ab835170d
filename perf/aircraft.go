package perf

// Aircraft is a performance profile in SI units: what the flight manual says about
// one aircraft, typed in by a pilot and checked by the loader.
type Aircraft struct {
	Name  string // the profile's own name, e.g. "Trainer, club fleet"
	Type  string // the aircraft type as the flight manual names it
	Notes string

	MTOWKg    float64   // maximum takeoff mass
	MinMassKg float64   // lowest flyable mass: no question below it is answered (0: none stated)
	WeightsKg []float64 // the weights a card shows, heaviest first

	RotateIASMS float64 // rotation (lift-off) indicated airspeed from the manual
	At50ftIASMS float64 // speed at the 50 ft screen from the manual

	MaxTailwindMS  float64 // flight-manual or club limit on tailwind component
	MaxCrosswindMS float64 // maximum demonstrated crosswind component
	MinTempK       float64 // temperature range covered by the data
	MaxTempK       float64

	TakeoffFlap string // the flap setting the data is for, as printed in the manual

	Model   ModelKind // which model the cards use
	Table   *Table    // may be nil
	Physics *Physics  // may be nil
}

// ModelKind selects a takeoff model.
type ModelKind string

// The two takeoff models.
const (
	ModelTable   ModelKind = "table"
	ModelPhysics ModelKind = "physics"
)
