package spec

import (
	"fmt"
	"math"

	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// Reference is a profile's answer in the conditions every flight manual tabulates:
// sea level in the ISA (15 C, 1013.25 hPa), the MTOW, a paved, dry, level runway and
// still air. validate prints it so that a pilot can hold it against the manual's page.
type Reference struct {
	GroundRollM  float64
	To50ftM      float64
	LiftoffTASMS float64 // 0 when the model does not know it
	// MeanAccelG is the mean acceleration over the ground roll, in g, from
	// constant-acceleration kinematics a = V_LO^2 / (2 s_G); 0 when V_LO is unknown.
	MeanAccelG float64
	// Warning says why the figures look implausible for a light piston aircraft;
	// empty when they do not.
	Warning string
}

// Plausible mean ground-roll acceleration of a light piston aircraft at sea level ISA
// and MTOW: static thrust of this class is roughly 0.2 to 0.45 of the weight and falls
// with speed, rolling friction takes 0.02 to 0.05 of it (Raymer, Aircraft Design,
// ch. 17), so the mean lies between about 0.06 g and 0.45 g (from memory). A table
// typed in metres but marked ft (or the reverse) moves it by 3.28 times, out of
// the band for any aircraft near its middle.
const (
	minPlausibleAccelG = 0.06
	maxPlausibleAccelG = 0.45
)

// Without a lift-off speed: distances to 50 ft at sea level ISA and MTOW that light
// piston aircraft manuals print lie roughly between 150 m and 1200 m (from memory).
const (
	minPlausibleTo50ftM = 150.0
	maxPlausibleTo50ftM = 1200.0
)

// ReferenceFigures asks the profile's own model (perf.ModelFor) for its reference
// figures. The error is the model's when it has no figure there (an MTOW above a
// table's heaviest block, for instance).
func ReferenceFigures(a *perf.Aircraft) (Reference, error) {
	var r Reference
	m, err := perf.ModelFor(a)
	if err != nil {
		return r, err
	}
	res, err := m.Takeoff(perf.Conditions{
		PressureAltM: 0, TempK: perf.ISASeaLevelTempK, MassKg: a.MTOWKg,
		Surface: perf.Paved, Condition: perf.Dry,
	})
	if err != nil {
		return r, err
	}
	r.GroundRollM, r.To50ftM, r.LiftoffTASMS = res.GroundRollM, res.To50ftM, res.LiftoffTASMS
	switch {
	case r.LiftoffTASMS > 0 && r.GroundRollM > 0:
		r.MeanAccelG = r.LiftoffTASMS * r.LiftoffTASMS / (2 * r.GroundRollM) / perf.StandardGravity
		if r.MeanAccelG < minPlausibleAccelG || r.MeanAccelG > maxPlausibleAccelG {
			r.Warning = fmt.Sprintf("the reference ground roll, %.0f m to a lift-off at %.0f kt, means a mean acceleration of %.2f g; light piston aircraft lie between %.2f g and %.2f g: check the table's distance_unit (a metre table marked ft is 3.28 times too short) and its figures",
				r.GroundRollM, units.Knots(r.LiftoffTASMS), r.MeanAccelG, minPlausibleAccelG, maxPlausibleAccelG)
		}
	case r.To50ftM < minPlausibleTo50ftM || r.To50ftM > maxPlausibleTo50ftM:
		r.Warning = fmt.Sprintf("the reference distance to 50 ft, %.0f m, is outside the %.0f to %.0f m light piston aircraft manuals print: check the table's distance_unit (a metre table marked ft is 3.28 times too short) and its figures (giving speeds.rotation allows a finer check)",
			r.To50ftM, minPlausibleTo50ftM, maxPlausibleTo50ftM)
	}
	return r, nil
}

// referenceLine is validate's printout of the reference figures, rounded up.
func referenceLine(a *perf.Aircraft, r Reference) string {
	up := func(x float64) float64 { return math.Ceil(x - 1e-6) } // round up; a micrometre of float noise is not a metre
	return fmt.Sprintf("reference, to hold against the manual: sea level ISA (15 C, 1013.25 hPa), MTOW %.0f kg, paved, dry, level, calm: ground roll %.0f m (%.0f ft), to 50 ft %.0f m (%.0f ft)",
		a.MTOWKg, up(r.GroundRollM), up(units.Feet(r.GroundRollM)), up(r.To50ftM), up(units.Feet(r.To50ftM)))
}
