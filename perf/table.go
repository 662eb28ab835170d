package perf

import (
	"fmt"
	"math"
	"strconv"
)

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
	// of a headwind and more than all of a tailwind (data under 14 CFR 23.1587(c)(3), pre-2017, usually do):
	// kneeprint then passes the reported wind and does not factor it again.
	WindInData  bool
	Corrections Corrections
}

// Corrections are a flight manual's correction notes, stored as data.
type Corrections struct {
	// "Decrease distances HeadwindPct % for each HeadwindPerMS of headwind up to
	// HeadwindMaxMS." Past HeadwindMaxMS the manual has no data; zero: the note
	// states no bound (see Table.applyNotes for what is then assumed). Left out of
	// the canonical form when zero, so that a profile without it keeps its
	// fingerprint.
	HeadwindPct   float64
	HeadwindPerMS float64
	HeadwindMaxMS float64 `json:",omitempty"`
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

// TableModel answers takeoff questions from a flight-manual table.
type TableModel struct {
	Table *Table
	// LiftoffIASMS is the manual's rotation speed, used for the accelerate check;
	// zero means unknown (the still-air estimate is then used).
	LiftoffIASMS float64
}

// WindFactoringIncluded reports whether the table's wind notes already factor the wind.
func (m *TableModel) WindFactoringIncluded() bool { return m.Table.WindInData }

// Takeoff interpolates the table multilinearly over pressure altitude x temperature x
// weight, then applies the manual's correction notes in the manual's order: wind
// (per knot, to both distances), then the grass note (a percentage of the corrected
// ground roll added to both distances).
//
// Outside the axes: above the highest pressure altitude, temperature or weight the
// answer is ErrNoData, never an extrapolation. Below the lowest value of an axis the
// figures of the lowest value are used, which is conservative because the loader
// guarantees distances never fall as that quantity rises; a note says so.
//
// The accelerate check uses the constant-acceleration estimate (domain notes sec. 4):
// reaching airspeed 0.7 V_LO with headwind w takes
//
//	s70 = GR ((0.7 V_LO - w) / (V_LO - w))^2      (= 0.49 GR in still air)
//
// of the ground roll GR, with V_LO the manual's rotation speed as true airspeed.
//
// The wind notes are never stretched past what they cover: a credited wind beyond a
// note's up_to has no data, and so has one beyond MaxWindFraction of the lift-off
// true airspeed when the manual's rotation speed is known (the physics model's
// bound: the steady-wind assumption then carries the whole answer).
func (m *TableModel) Takeoff(c Conditions) (Result, error) {
	t := m.Table
	var r Result
	gr, to, notes, err := t.lookup(c)
	r.Notes = notes
	if err != nil {
		return r, err
	}
	var vlo float64
	if m.LiftoffIASMS > 0 {
		sigma := DensityKgM3(c.PressureAltM, c.TempK) / isaDensity0()
		vlo = m.LiftoffIASMS / math.Sqrt(sigma) // IAS ~ EAS at these speeds (common practice)
		if math.Abs(c.HeadwindMS) > MaxWindFraction*vlo+1e-9 {
			return r, fmt.Errorf("%w: credited wind %.1f kt is beyond half the lift-off speed (%.0f kt true): kneeprint never stretches the manual's wind notes that far",
				ErrNoData, math.Abs(c.HeadwindMS)/knot, math.Floor(MaxWindFraction*vlo/knot+1e-9))
		}
	}
	if gr, to, err = t.applyNotes(c, gr, to, &r.Covers, &r.Notes, vlo > 0); err != nil {
		return r, err
	}
	r.GroundRollM, r.To50ftM = gr, to

	ratio := 0.49 // (0.7)^2, still air, constant acceleration
	if vlo > 0 {
		w := c.HeadwindMS
		r.LiftoffTASMS = vlo
		if 0.7*vlo <= w {
			ratio = 0
		} else {
			q := (0.7*vlo - w) / (vlo - w)
			ratio = q * q
		}
	}
	r.AccelCheckM = ratio * gr
	return r, nil
}

// lookup interpolates the table multilinearly over pressure altitude x temperature x
// weight and returns its ground roll and total distance (to 50 ft for a takeoff
// table, from 50 ft for a landing table) with notes on clamped axes. Above the
// highest value of an axis: ErrNoData, never an extrapolation; below the lowest, the
// lowest value's figures with a note.
func (t *Table) lookup(c Conditions) (gr, total float64, notes []string, err error) {
	wi, wf, note, err := axisPos(t.WeightKg, c.MassKg, "weight", axisKg)
	if err != nil {
		return 0, 0, notes, err
	}
	if note != "" {
		// Say what was done, not that it is conservative: a weight below the table
		// is as likely a typing slip (100 kg for 1000 kg) as a light aircraft, and
		// the profile's lowest flyable mass is checked before a model is asked.
		notes = append(notes, fmt.Sprintf("weight %.0f kg is below the table's lightest block: the %.0f kg figures are used", c.MassKg, t.WeightKg[0]))
	}
	pi, pf, note, err := axisPos(t.PressureAltM, c.PressureAltM, "pressure altitude", axisFt)
	if err != nil {
		return 0, 0, notes, err
	}
	if note != "" {
		notes = append(notes, note)
	}
	ti, tf, note, err := axisPos(t.TempK, c.TempK, "temperature", axisC)
	if err != nil {
		return 0, 0, notes, err
	}
	if note != "" {
		notes = append(notes, note)
	}
	return trilinear(t.GroundRollM, wi, wf, pi, pf, ti, tf), trilinear(t.To50ftM, wi, wf, pi, pf, ti, tf), notes, nil
}

// applyNotes applies the manual's correction notes to a ground roll gr and a total
// distance total, in the manual's order: wind (per knot, to both distances), then the
// grass note (a percentage of the corrected ground roll added to both distances). It
// sets covers.Surface when the figures include the surface (the table is for paved,
// dry; a grass note covers grass) and appends what it applied to notes. A tailwind
// the notes do not reach, or a headwind past the headwind note's up_to, is ErrNoData.
// speedBound says the caller already bounds the wind by the aircraft's speed (the
// lift-off or touchdown speed): it only changes what a note says.
//
// The headwind credit never takes off more than half the distance: no manual's
// linear note is meant to halve it (conservative, common practice). Without an
// up_to and without a speed bound that floor is all that bounds a strong headwind,
// and the note says so.
func (t *Table) applyNotes(c Conditions, gr, total float64, covers *Effects, notes *[]string, speedBound bool) (float64, float64, error) {
	k := t.Corrections
	factor := 1.0
	switch {
	case c.HeadwindMS > 0 && k.HeadwindMaxMS > 0 && c.HeadwindMS > k.HeadwindMaxMS+1e-9:
		return gr, total, fmt.Errorf("%w: headwind %.1f kt beyond the manual's correction (up to %.0f kt)", ErrNoData, c.HeadwindMS/knot, k.HeadwindMaxMS/knot)
	case c.HeadwindMS > 0 && k.HeadwindPerMS > 0:
		factor = 1 - k.HeadwindPct/100*c.HeadwindMS/k.HeadwindPerMS
		if factor < 0.5 {
			factor = 0.5
			if k.HeadwindMaxMS > 0 || speedBound {
				*notes = append(*notes, "headwind credit limited to half the distance (kneeprint's bound on a linear note)")
			} else {
				*notes = append(*notes, "headwind credit limited to half the distance: the manual's headwind note gives no upper wind (up_to) and the profile no rotation speed, so kneeprint assumes the note holds up to that and no further")
			}
		}
	case c.HeadwindMS < 0:
		tail := -c.HeadwindMS
		if k.TailwindPerMS <= 0 {
			return gr, total, fmt.Errorf("%w: the manual gives no tailwind correction", ErrNoData)
		}
		if tail > k.TailwindMaxMS+1e-9 {
			return gr, total, fmt.Errorf("%w: tailwind %.1f kt beyond the manual's correction (up to %.0f kt)", ErrNoData, tail/knot, k.TailwindMaxMS/knot)
		}
		factor = 1 + k.TailwindPct/100*tail/k.TailwindPerMS
	}
	gr *= factor
	total *= factor

	if c.Surface != Paved {
		pct := k.GrassPctOfGroundRoll
		if c.Condition == Wet {
			pct = k.WetGrassPctOfGroundRoll
		}
		if c.Surface == Grass && pct > 0 {
			add := pct / 100 * gr
			gr += add
			total += add
			covers.Surface = true
			*notes = append(*notes, grassNote(c.Condition, pct))
		}
	} else if c.Condition == Dry {
		covers.Surface = true // the table is for a paved, dry runway
	}
	return gr, total, nil
}

// grassNote is the note of a grass correction applied, as
// fmt.Sprintf("manual's %s grass note: +%g %% of ground roll", cond, pct) writes it
// (TestGrassNote), built without fmt: a table's grass page notes it in every cell.
func grassNote(cond Condition, pct float64) string {
	var buf [80]byte
	b := append(buf[:0], "manual's "...)
	b = append(b, cond...)
	b = append(b, " grass note: +"...)
	b = strconv.AppendFloat(b, pct, 'g', -1, 64)
	b = append(b, " % of ground roll"...)
	return string(b)
}

const knot = 1852.0 / 3600.0

// axisUnit is how an axis is printed in a message: a conversion from SI and a unit.
type axisUnit struct {
	conv func(float64) float64
	unit string
}

// The axes of the tables, as messages print them.
var (
	axisKg = axisUnit{func(x float64) float64 { return x }, "kg"}
	axisFt = axisUnit{func(x float64) float64 { return x / footM }, "ft"}
	axisC  = axisUnit{func(x float64) float64 { return x - 273.15 }, "C"}
)

// show prints an axis value in whole units.
func (u axisUnit) show(x float64) string { return fmt.Sprintf("%.0f %s", u.conv(x), u.unit) }

// passed prints x, which lies beyond the axis end lim, so that it never reads as lim
// itself (passedText).
func (u axisUnit) passed(x, lim float64) string {
	var buf [24]byte
	b := appendPassed(buf[:0], u.conv(x), u.conv(lim))
	return string(append(append(b, ' '), u.unit...))
}

// axisPos finds x on a strictly increasing axis: the index i and fraction f with
// x = xs[i] + f (xs[i+1]-xs[i]). Below the first value it returns (0, 0) and a note
// (conservative use of the lowest column); above the last, ErrNoData.
func axisPos(xs []float64, x float64, name string, u axisUnit) (int, float64, string, error) {
	n := len(xs)
	const eps = 1e-9
	if x > xs[n-1]+eps {
		return 0, 0, "", fmt.Errorf("%w: %s %s above the table's highest, %s", ErrNoData, name, u.passed(x, xs[n-1]), u.show(xs[n-1]))
	}
	if x < xs[0]-eps {
		return 0, 0, fmt.Sprintf("%s %s below the table: figures for %s used (conservative)", name, u.passed(x, xs[0]), u.show(xs[0])), nil
	}
	if n == 1 || x <= xs[0] {
		return 0, 0, "", nil
	}
	for i := 0; i < n-1; i++ {
		if x <= xs[i+1] {
			return i, (x - xs[i]) / (xs[i+1] - xs[i]), "", nil
		}
	}
	return n - 1, 0, "", nil
}

// trilinear interpolates g[w][p][t] at index/fraction positions.
func trilinear(g [][][]float64, wi int, wf float64, pi int, pf float64, ti int, tf float64) float64 {
	at := func(w, p, t int) float64 {
		if w >= len(g) {
			w = len(g) - 1
		}
		if p >= len(g[w]) {
			p = len(g[w]) - 1
		}
		if t >= len(g[w][p]) {
			t = len(g[w][p]) - 1
		}
		return g[w][p][t]
	}
	lerp := func(a, b, f float64) float64 { return a + (b-a)*f }
	v := 0.0
	for dw := 0; dw <= 1; dw++ {
		fw := 1 - wf
		if dw == 1 {
			fw = wf
		}
		if fw == 0 {
			continue
		}
		c00 := lerp(at(wi+dw, pi, ti), at(wi+dw, pi, ti+1), tf)
		c10 := lerp(at(wi+dw, pi+1, ti), at(wi+dw, pi+1, ti+1), tf)
		v += fw * lerp(c00, c10, pf)
	}
	return v
}
