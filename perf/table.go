package perf

// Table is a flight-manual takeoff table: ground roll and total distance to 50 ft over
// pressure altitude x temperature x weight, for a paved, dry, level runway, plus the
// manual's own correction notes.
type Table struct {
	PressureAltM []float64 // strictly increasing
	TempK        []float64 // strictly increasing
	WeightKg     []float64 // strictly increasing
	// GroundRollM and To50ftM are indexed [weight][pressure altitude][temperature].
	GroundRollM [][][]float64
	To50ftM     [][][]float64

	// WindInData is true when the manual's wind corrections already credit only part
	// of a headwind and more than all of a tailwind (14 CFR 23.1587 data usually do):
	// kneeprint then passes the reported wind and does not factor it again.
	WindInData  bool
	Corrections Corrections
}

// Corrections are a flight manual's correction notes, stored as data.
type Corrections struct {
	// "Decrease distances HeadwindPct % for each HeadwindPerMS of headwind."
	HeadwindPct   float64
	HeadwindPerMS float64
	// "Increase distances TailwindPct % for each TailwindPerMS of tailwind up to
	// TailwindMaxMS." Past TailwindMaxMS the manual has no data.
	TailwindPct   float64
	TailwindPerMS float64
	TailwindMaxMS float64
	// "On dry grass add GrassPctOfGroundRoll % of the ground roll to both distances."
	// Zero means the manual gives no grass note.
	GrassPctOfGroundRoll float64
	// The same for wet grass; zero means no note.
	WetGrassPctOfGroundRoll float64
}
