package perf

import (
	"sort"
)

// Question is one set of conditions asked of every runway end of an airfield.
type Question struct {
	QNHPa       float64
	TempK       float64
	MassKg      float64
	Wind        Wind
	Variable    bool      // variable wind: taken as a full tailwind and a full crosswind on every end (conservative)
	Condition   Condition // "" keeps each runway's declared condition
	TightMargin float64
}

// EndAnswer is the answer for one runway end.
type EndAnswer struct {
	End  RunwayEnd
	Wind Components
	Cell Cell
}

// Answer is the answer for the whole airfield, runway ends ranked best first.
type Answer struct {
	ElevationM   float64
	PressureAltM float64
	DensityAltM  float64
	ISADevK      float64
	Ends         []EndAnswer
}

// Ask evaluates q on every runway end of airfield f and ranks the ends: by state
// (go first), then by required over available distance, then by designator.
func Ask(a *Aircraft, m Model, p Policy, f Airfield, q Question) Answer {
	ans := Answer{ElevationM: f.ElevationM}
	ans.PressureAltM = PressureAltitudeFromQNH(q.QNHPa, f.ElevationM)
	ans.DensityAltM = DensityAltitudeM(ans.PressureAltM, q.TempK)
	ans.ISADevK = q.TempK - ISATempK(ans.PressureAltM)
	for _, e := range f.Ends() {
		if q.Condition != "" {
			e.Condition = q.Condition
		}
		comp := WindComponents(q.Wind, e.HeadingDeg, f.VariationDeg)
		if q.Variable {
			gust := q.Wind.SpeedMS
			if q.Wind.GustMS > gust {
				gust = q.Wind.GustMS
			}
			comp = Components{HeadwindMS: -q.Wind.SpeedMS, CrosswindMS: q.Wind.SpeedMS, GustCrosswindMS: gust}
		}
		cell := Evaluate(Case{
			Aircraft: a, Model: m, Policy: p, End: e,
			PressureAltM: ans.PressureAltM, TempK: q.TempK, MassKg: q.MassKg,
			Wind: comp, TightMargin: q.TightMargin,
		})
		ans.Ends = append(ans.Ends, EndAnswer{End: e, Wind: comp, Cell: cell})
	}
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
	return ans
}
