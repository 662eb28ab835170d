package perf

import (
	"fmt"
	"math"
	"sort"
)

// Question is one set of conditions asked of every runway end of an airfield.
type Question struct {
	QNHPa       float64
	TempK       float64
	MassKg      float64
	Wind        Wind      // a variable wind (Wind.Variable) is a full tailwind and crosswind on every end
	Condition   Condition // "" keeps each runway's declared condition
	TightMargin float64
	// ObstacleMarginM is the clearance obstacles must be passed by; zero means
	// DefaultObstacleMarginM.
	ObstacleMarginM float64
}

// EndAnswer is the answer for one runway end.
type EndAnswer struct {
	End  RunwayEnd
	Wind Components
	Cell Cell
	// The atmosphere this end was answered in: the pressure altitude is taken at
	// ElevationM, the highest of the aerodrome elevation and the runway's thresholds
	// (TakeoffElevationM).
	ElevationM   float64
	PressureAltM float64
	DensityAltM  float64
	ISADevK      float64
	// Clearances is how each of the end's obstacles is passed (in file order), when
	// the end lists obstacles and the cell has a climb (Cell.HasClimb); ClimbAltM is
	// the pressure altitude the climb was worked out at (ObstacleClimbAltM).
	Clearances []Clearance
	ClimbAltM  float64
}

// Answer is the answer for the whole airfield, runway ends ranked best first.
type Answer struct {
	// The aerodrome elevation and the atmosphere there; each end's own, possibly
	// higher, figures are in its EndAnswer.
	ElevationM   float64
	PressureAltM float64
	DensityAltM  float64
	ISADevK      float64
	Ends         []EndAnswer
}

// Plausible outside air temperatures: beyond the extremes recorded at the Earth's
// surface (WMO World Weather and Climate Extremes Archive: -89.2 C at Vostok, 1983;
// 56.7 C at Death Valley, 1913 - from memory) a temperature is a typing slip, and
// no figure is computed for it.
const (
	MinPlausibleTempK = -90 + 273.15
	MaxPlausibleTempK = 60 + 273.15
)

// QNH range accepted: beyond the lowest and highest sea-level pressures ever reduced
// (about 870 and 1084 hPa, WMO extremes archive - from memory), with a margin.
const (
	MinQNHPa = 80000.0
	MaxQNHPa = 110000.0
)

// maxWindMS bounds a reported wind: 99 kt, the largest two-digit report (WMO FM 15);
// past it no light aircraft takes off.
const maxWindMS = 99 * knot

// CheckTemp refuses an outside air temperature outside the plausible range, NaN or
// infinite (issue 14.5: nothing but finite numbers reaches the output).
func CheckTemp(tempK float64) error {
	if !(tempK >= MinPlausibleTempK-1e-9 && tempK <= MaxPlausibleTempK+1e-9) { // 1e-9: "-90C" parses to 183.14999999999998 K
		return fmt.Errorf("temperature %s is outside %.0f to %.0f C, the range of air temperatures ever recorded at the surface", showC(tempK), MinPlausibleTempK-273.15, MaxPlausibleTempK-273.15)
	}
	return nil
}

func showC(k float64) string {
	if math.IsNaN(k) || math.IsInf(k, 0) || math.Abs(k) > 1e6 {
		return fmt.Sprintf("%g K", k)
	}
	return fmt.Sprintf("%.1f C", k-273.15)
}

// MaxMassOverMTOW bounds the weight a question may ask for: 1.5 times the MTOW. A
// weight above the MTOW is answered (beyond limits, which is worth knowing), but one
// half as much again is a slip, not a loading: an extra digit, or pounds written as
// kilograms (2.2 times); common practice.
const MaxMassOverMTOW = 1.5

// CheckMass refuses a takeoff mass that is not finite, not positive, below the
// profile's lowest flyable mass (issue 14.2: "100 kg" for 1000 kg is a dropped zero,
// not a light aircraft), or above MaxMassOverMTOW times the MTOW, naming the range.
func CheckMass(a *Aircraft, kg float64) error {
	switch {
	case !(kg > 0) || math.IsInf(kg, 0):
		return fmt.Errorf("weight %s kg is not a mass an aircraft can have", massText(kg))
	case a.MinMassKg > 0 && kg < a.MinMassKg-1e-9:
		return fmt.Errorf("weight %s kg is below the lowest flyable mass %.0f kg of %q (min_mass): check the figure", massText(kg), a.MinMassKg, a.Name)
	case a.MTOWKg > 0 && kg > MaxMassOverMTOW*a.MTOWKg+1e-9:
		lo := "0"
		if a.MinMassKg > 0 {
			lo = fmt.Sprintf("%.0f", a.MinMassKg)
		}
		return fmt.Errorf("weight %s kg is no loading of %q: check the figure (an extra digit, pounds written as kilograms); accepted: %s to %.0f kg (the lowest flyable mass to %g times the MTOW)",
			massText(kg), a.Name, lo, MaxMassOverMTOW*a.MTOWKg, MaxMassOverMTOW)
	}
	return nil
}

// massText prints a mass in a message: whole kilograms, or in short scientific form
// when it is far beyond any aircraft (1e+308, never 309 digits).
func massText(kg float64) string {
	if math.IsNaN(kg) || math.IsInf(kg, 0) || math.Abs(kg) >= 1e7 {
		return fmt.Sprintf("%.3g", kg)
	}
	return fmt.Sprintf("%.0f", kg)
}

// Check refuses a question kneeprint cannot answer honestly: an impossible weight or
// temperature, a QNH outside the range above, a wind that is not finite, negative
// or faster than 99 kt.
func (q Question) Check(a *Aircraft) error {
	if err := CheckTemp(q.TempK); err != nil {
		return err
	}
	if err := CheckMass(a, q.MassKg); err != nil {
		return err
	}
	if !(q.QNHPa >= MinQNHPa && q.QNHPa <= MaxQNHPa) {
		return fmt.Errorf("QNH %g hPa is outside %.0f to %.0f hPa", q.QNHPa/100, MinQNHPa/100, MaxQNHPa/100)
	}
	w := q.Wind
	for _, x := range []float64{w.FromDeg, w.SpeedMS, w.GustMS, w.VaryFromDeg, w.VaryToDeg} {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return fmt.Errorf("wind: %g is not a finite number", x)
		}
	}
	if w.SpeedMS < 0 || w.GustMS < 0 || w.SpeedMS > maxWindMS+1e-9 || w.GustMS > maxWindMS+1e-9 {
		return fmt.Errorf("wind: speeds must be 0 to 99 kt")
	}
	return nil
}

// Ask evaluates q on every runway end of airfield f and ranks the ends: by state
// (go first), then by required over available distance, then by designator. Each end
// takes its pressure altitude at TakeoffElevationM. A question that fails Check is
// refused with its error.
func Ask(a *Aircraft, m Model, p Policy, f Airfield, q Question) (Answer, error) {
	if err := q.Check(a); err != nil {
		return Answer{}, err
	}
	ans := Answer{ElevationM: f.ElevationM}
	ans.PressureAltM = PressureAltitudeFromQNH(q.QNHPa, f.ElevationM)
	ans.DensityAltM = DensityAltitudeM(ans.PressureAltM, q.TempK)
	ans.ISADevK = q.TempK - ISATempK(ans.PressureAltM)
	var climb ClimbModel
	climbDone := false
	for _, e := range f.Ends() {
		if len(e.Obstacles) > 0 && !climbDone {
			climb, _ = ClimbFor(a) // nil: the cell says why
			climbDone = true
		}
		ea := EndAnswer{ElevationM: TakeoffElevationM(f, e)}
		if q.Condition != "" {
			e.Condition = q.Condition
		}
		ea.End = e
		ea.PressureAltM = PressureAltitudeFromQNH(q.QNHPa, ea.ElevationM)
		ea.DensityAltM = DensityAltitudeM(ea.PressureAltM, q.TempK)
		ea.ISADevK = q.TempK - ISATempK(ea.PressureAltM)
		ea.Wind = WindComponents(q.Wind, e.HeadingDeg, f.VariationDeg)
		ea.Cell = Evaluate(Case{
			Aircraft: a, Model: m, Policy: p, End: e,
			PressureAltM: ea.PressureAltM, TempK: q.TempK, MassKg: q.MassKg,
			Wind: ea.Wind, TightMargin: q.TightMargin,
			ObstacleMarginM: q.ObstacleMarginM, Climb: climb,
		})
		if ea.Cell.HasClimb {
			ea.Clearances = ObstacleClearances(e, ea.Cell.Requirement.FactoredTODM, ea.Cell.ClimbGradient)
			ea.ClimbAltM = ObstacleClimbAltM(e, ea.PressureAltM, ObstacleMargin(q.ObstacleMarginM))
		}
		ans.Ends = append(ans.Ends, ea)
	}
	ans.rank()
	return ans, nil
}

// rank orders the runway ends best first: by state (go first), then by required over
// available distance, then by designator. Takeoff and landing answers alike.
func (ans *Answer) rank() {
	sort.SliceStable(ans.Ends, func(i, j int) bool {
		a, b := ans.Ends[i].Cell, ans.Ends[j].Cell
		if a.State != b.State {
			return a.State < b.State
		}
		if a.HasDistance && b.HasDistance {
			ra, rb := a.RequiredM/a.AvailableM, b.RequiredM/b.AvailableM
			if ra != rb {
				return ra < rb
			}
		}
		return ans.Ends[i].End.Designator < ans.Ends[j].End.Designator
	})
}
