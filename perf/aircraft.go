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

	MaxTailwindMS float64 // flight-manual or club limit on tailwind component

	// DemonstratedCrosswindMS is the flight manual's maximum demonstrated crosswind
	// component: advisory, not a limit (it says what was shown in certification).
	DemonstratedCrosswindMS float64
	// MaxCrosswindMS is a real crosswind limit (the manual's, or a club's), in force
	// only when HasMaxCrosswind: a limit of 0 then means no crosswind at all.
	MaxCrosswindMS  float64
	HasMaxCrosswind bool

	// MinTempK and MaxTempK are declared operating temperature limits; zero when the
	// profile declares none. Past them a cell is beyond limits. Where the data end (a
	// table's hottest column) a cell has no data, which is not a limit.
	MinTempK float64
	MaxTempK float64

	TakeoffFlap string // the flap setting the data is for, as printed in the manual

	Model   ModelKind // which model the cards use
	Table   *Table    // may be nil
	Physics *Physics  // may be nil

	// Climb is the all-engines climb after takeoff, for obstacle clearance; nil
	// when the profile gives none (left out of the canonical form then).
	Climb *Climb `json:",omitempty"`
	// Landing is the profile's landing data (perf/landing.go); nil when it has none:
	// its cards then have no landing side.
	Landing *Landing `json:",omitempty"`
}

// ModelKind selects a takeoff model.
type ModelKind string

// The two takeoff models.
const (
	ModelTable   ModelKind = "table"
	ModelPhysics ModelKind = "physics"
)
