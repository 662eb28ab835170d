package perf

// Surface is a runway surface type.
type Surface string

// Surfaces kneeprint knows. Unpaved surfaces other than grass take the grass factors
// in the policies (common practice: no published factor for gravel in the sources
// used here, and the grass factor is the nearest conservative one).
const (
	Paved  Surface = "paved"
	Grass  Surface = "grass"
	Gravel Surface = "gravel"
)

// Condition is the state of a runway surface a card is printed for.
type Condition string

// Dry and wet.
const (
	Dry Condition = "dry"
	Wet Condition = "wet"
)

// Airfield is a home airfield in SI units.
type Airfield struct {
	Name         string
	Ident        string  // a local identifier of the user's choosing
	ElevationM   float64 // aerodrome elevation
	VariationDeg float64 // magnetic variation, east positive: true = magnetic + variation
	Runways      []Runway
}

// Runway is one strip with its two ends.
type Runway struct {
	Surface   Surface
	Condition Condition
	Ends      []RunwayEnd
}

// RunwayEnd is one direction of use of a runway, with its declared distances.
type RunwayEnd struct {
	Designator string
	HeadingDeg float64 // magnetic heading of the runway in this direction
	TORAM      float64 // takeoff run available
	TODAM      float64 // takeoff distance available (incl. clearway)
	ASDAM      float64 // accelerate-stop distance available (incl. stopway)
	LDAM       float64 // landing distance available (printed, not used for takeoff)
	ElevationM float64 // threshold elevation (the aerodrome elevation when not given)
	SlopePct   float64 // mean slope in this direction of takeoff, positive uphill
	Surface    Surface
	Condition  Condition
	Notes      string
	// Obstacles on the departure path past the end of the TORA (see Obstacle). Left
	// out of the canonical form when there are none, so that an end without
	// obstacles keeps the fingerprint it had before obstacles existed.
	Obstacles []Obstacle `json:",omitempty"`
}

// HasStopwayOrClearway reports whether TODA or ASDA exceed TORA.
func (e RunwayEnd) HasStopwayOrClearway() bool {
	const eps = 0.5 // half a metre: declared distances are whole metres or feet
	return e.TODAM > e.TORAM+eps || e.ASDAM > e.TORAM+eps
}

// Ends lists every runway end of the airfield in file order.
func (a Airfield) Ends() []RunwayEnd {
	var out []RunwayEnd
	for _, r := range a.Runways {
		out = append(out, r.Ends...)
	}
	return out
}
