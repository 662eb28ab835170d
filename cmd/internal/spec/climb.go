package spec

import (
	"fmt"
	"io"
	"sort"

	"gopkg.in/yaml.v3"

	"kneeprint/cmd/internal/typedtable"
	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// Plausibility of climb data. They catch typing slips, not real aircraft.
const (
	// Climb speeds of light piston aircraft lie far inside 40 to 150 kt (common
	// practice).
	minClimbSpeedKt = 40
	maxClimbSpeedKt = 150
	// Rates of climb: a light piston aircraft climbs at most about 2000 ft/min at sea
	// level (common practice); 5000 ft/min is a slip. Down to -2000 ft/min: a manual
	// may print a negative rate where the aircraft cannot climb.
	minRateFPM = -2000.0
	maxRateFPM = 5000.0
)

// rateUnits are the units a rate-of-climb table may be printed in, with their size in m/s.
var rateUnits = map[string]float64{
	"ft/min": units.MetresPerFoot / 60,
	"m/s":    1,
}

// climbTableKeys are the keys of a climb section that make it a table.
var climbTableKeys = []string{"rate_unit", "pressure_altitudes", "temperatures", "rate_of_climb", "weights"}

// climb reads the profile's climb section: the climb speed, and a flight-manual
// rate-of-climb table (pressure altitude x temperature, optionally weight), or, in a
// physics profile, nothing more (the physics' excess power at that speed).
//
//	climb:
//	  speed: 70 kt
//	  rate_unit: ft/min
//	  pressure_altitudes: [0 ft, 4000 ft]
//	  temperatures: [0 C, 30 C]
//	  rate_of_climb:           # one row per pressure altitude: rates at the MTOW
//	    - [720, 640]
//	    - [560, 480]
//	  # or, one block per weight:
//	  # weights:
//	  #   - {weight: 1000 kg, rate_of_climb: [[720, 640], [560, 480]]}
//
// mtowNode is the profile's mtow as typed (nil when unknown), which names the one
// block of a table given without weights in the table as typed.
func (d *decoder) climb(n *yaml.Node, a *perf.Aircraft, hasPhysics bool, mtowOK bool, mtowNode *yaml.Node) *perf.Climb {
	m := d.mapping(n, "climb")
	c := &perf.Climb{}
	c.SpeedIASMS, _ = m.quantity("speed", units.Speed, true, minClimbSpeedKt*units.MetresPerSecPerKnot, maxClimbSpeedKt*units.MetresPerSecPerKnot)
	isTable := false
	for _, k := range climbTableKeys {
		isTable = isTable || m.has(k)
	}
	switch {
	case isTable:
		c.Table = d.climbTable(m, a.MTOWKg, mtowOK, mtowNode)
	case !hasPhysics && n.Kind == yaml.MappingNode:
		for _, k := range climbTableKeys {
			m.get(k, false)
		}
		d.errorf(n, "climb", "a climb needs the manual's rate-of-climb table (rate_unit, pressure_altitudes, temperatures and rate_of_climb, or weights with a rate_of_climb each); only a physics profile may give the speed alone (its excess power at that speed is used)")
	default:
		d.notef("climb: no rate-of-climb table: the physics description's excess power at %.0f kt is used (with the propeller figures the takeoff calibration fits)", units.Knots(c.SpeedIASMS))
	}
	m.finish()
	if a.RotateIASMS > 0 && c.SpeedIASMS > 0 && c.SpeedIASMS < a.RotateIASMS-1e-9 {
		d.warnf(m.vals["speed"], "climb.speed", "%s is below the rotation speed %.0f kt: check it is the manual's climb speed", m.vals["speed"].Value, units.Knots(a.RotateIASMS))
	}
	return c
}

// climbTable reads the rate-of-climb table of a climb section; nil after an error.
// When its blocks could be read it also keeps the table as typed (d.typed), for the
// proof sheet and the outlier check.
func (d *decoder) climbTable(m *mapping, mtow float64, mtowOK bool, mtowNode *yaml.Node) *perf.ClimbTable {
	t := &perf.ClimbTable{}
	unit := m.oneOf("rate_unit", true, "ft/min", "m/s")
	factor := rateUnits[unit]
	var ok1, ok2 bool
	var nodes []*yaml.Node
	t.PressureAltM, nodes, ok1 = m.quantities("pressure_altitudes", units.Length, true, minTableAltM, maxTableAltM)
	ok1 = ok1 && d.increasing("climb.pressure_altitudes", t.PressureAltM, nodes)
	t.TempK, nodes, ok2 = m.quantities("temperatures", units.Temperature, true, minDataTempK, maxDataTempK)
	ok2 = ok2 && d.increasing("climb.temperatures", t.TempK, nodes)
	axesOK := ok1 && ok2
	unitOK := factor > 0
	if !unitOK {
		factor = rateUnits["ft/min"] // to read the rows' shape; the table is refused anyway
	}
	type block struct {
		w     float64
		rates [][]float64
		nodes [][]*yaml.Node
		node  *yaml.Node
		index int              // position in the file's list of weights, or typedtable.Single
		label typedtable.Label // the weight as typed
	}
	var bs []block
	ok := true
	readRates := func(bm *mapping) ([][]float64, [][]*yaml.Node) {
		if !axesOK {
			d.placeholdersIn(bm.get("rate_of_climb", false), bm.field("rate_of_climb"))
			return nil, nil
		}
		return d.rateRows(bm, len(t.PressureAltM), len(t.TempK), factor, unit)
	}
	switch {
	case m.has("rate_of_climb") && m.has("weights"):
		m.get("rate_of_climb", false)
		m.get("weights", false)
		d.errorf(m.vals["weights"], "climb.weights", "give rate_of_climb (one table, for the MTOW) or weights (one block per weight), not both")
		return nil
	case m.has("weights"):
		items := m.list("weights", true)
		if axesOK && len(t.PressureAltM)*len(t.TempK)*len(items) > maxTableCells {
			d.errorf(m.vals["weights"], "climb", "the climb table has more than %d cells", maxTableCells)
			return nil
		}
		for i, bn := range items {
			bm := d.mapping(bn, fmt.Sprintf("climb.weights[%d]", i))
			w, wOK := bm.quantity("weight", units.Mass, true, minMassKg, maxMassKg)
			if wOK && mtowOK && w > mtow+1e-9 {
				d.errorf(bm.vals["weight"], bm.field("weight"), "%s is above the MTOW", bm.vals["weight"].Value)
			}
			rates, rn := readRates(bm)
			bm.finish()
			if !wOK || rates == nil {
				ok = false
				continue
			}
			bs = append(bs, block{w, rates, rn, bn, i, typedLabel(bm.vals["weight"], w)})
		}
	default:
		if axesOK && len(t.PressureAltM)*len(t.TempK) > maxTableCells {
			d.errorf(m.n, "climb", "the climb table has more than %d cells", maxTableCells)
			return nil
		}
		rates, rn := readRates(m)
		if rates == nil || !mtowOK {
			return nil
		}
		d.notef("climb: one rate-of-climb table, taken as the MTOW's (%.0f kg) and used at every lighter weight (conservative)", mtow)
		label := typedtable.Label{Text: "MTOW", SI: mtow}
		if mtowNode != nil {
			label = typedtable.Label{Text: "MTOW " + mtowNode.Value, SI: mtow, Line: mtowNode.Line, Column: mtowNode.Column}
		}
		bs = append(bs, block{mtow, rates, rn, m.vals["rate_of_climb"], typedtable.Single, label})
	}
	if !ok || !axesOK || !unitOK || len(bs) == 0 {
		return nil
	}
	typed := make([]typedtable.Block, len(bs)) // in file order: bs is sorted below
	for i, b := range bs {
		typed[i] = typedtable.Block{Index: b.index, Weight: b.label, Rows: typedCells(b.nodes)}
	}
	d.typedClimb(m, unit, t, typed)
	sort.SliceStable(bs, func(i, j int) bool { return bs[i].w < bs[j].w })
	var allNodes [][][]*yaml.Node
	for i, b := range bs {
		if i > 0 && !(b.w > bs[i-1].w) {
			d.errorf(b.node, "climb.weights", "weight %.1f kg appears twice", b.w)
			return nil
		}
		t.WeightKg = append(t.WeightKg, b.w)
		t.RateMS = append(t.RateMS, b.rates)
		allNodes = append(allNodes, b.nodes)
	}
	if !d.climbMonotone(t, allNodes, bs[0].index == typedtable.Single) {
		return nil
	}
	d.noClimbWarnings(t, allNodes, unit)
	if mtowOK && t.WeightKg[len(t.WeightKg)-1] < mtow-1e-9 {
		d.notef("climb: heaviest block %.0f kg is below the MTOW %.0f kg: heavier weights have no climb data", t.WeightKg[len(t.WeightKg)-1], mtow)
	}
	return t
}

// typedClimb keeps a climb section's rate-of-climb table as typed, its blocks in
// file order, for the proof sheet and the outlier check: Section "climb", Key
// "rate_of_climb", judged in its figures themselves (typedtable.Table.Linear: a rate
// falls about linearly and may be zero or negative).
func (d *decoder) typedClimb(m *mapping, unit string, t *perf.ClimbTable, blocks []typedtable.Block) {
	d.typed = append(d.typed, &typedtable.Table{File: d.file, Quantity: "rate of climb", Short: "rate", Section: "climb", Key: "rate_of_climb", Unit: unit, Linear: true,
		PressureAltitudes: typedLabels(m.vals["pressure_altitudes"], t.PressureAltM),
		Temperatures:      typedLabels(m.vals["temperatures"], t.TempK),
		Blocks:            blocks})
}

// rateRows reads rate_of_climb: rows (one per pressure altitude) of columns (one per
// temperature) of plain numbers in the table's rate unit.
func (d *decoder) rateRows(m *mapping, rows, cols int, factor float64, unit string) ([][]float64, [][]*yaml.Node) {
	items := m.list("rate_of_climb", true)
	if items == nil {
		return nil, nil
	}
	path := m.field("rate_of_climb")
	if len(items) != rows {
		d.errorf(m.vals["rate_of_climb"], path, "has %d rows, the table has %d pressure altitudes: one row per pressure altitude", len(items), rows)
		return nil, nil
	}
	lo, hi := minRateFPM*rateUnits["ft/min"]/factor, maxRateFPM*rateUnits["ft/min"]/factor
	out := make([][]float64, rows)
	nodes := make([][]*yaml.Node, rows)
	ok := true
	for i, rn := range items {
		rp := fmt.Sprintf("%s[%d]", path, i)
		if rn.Kind != yaml.SequenceNode {
			d.errorf(rn, rp, "expected a row such as [720, 680, 640], found %s", describe(rn))
			ok = false
			continue
		}
		if len(rn.Content) != cols {
			d.errorf(rn, rp, "row has %d values, the table has %d temperatures (ragged table)", len(rn.Content), cols)
			ok = false
			continue
		}
		out[i], nodes[i] = make([]float64, cols), rn.Content
		for j, cn := range rn.Content {
			x, good := d.number(cn, fmt.Sprintf("%s[%d]", rp, j), round3(lo), round3(hi))
			if !good {
				ok = false
				continue
			}
			out[i][j] = x * factor
		}
	}
	if !ok {
		return nil, nil
	}
	return out, nodes
}

// noClimbWarnings warns at every rate of climb of zero or less: a manual may print
// one where the aircraft cannot climb, and kneeprint then gives no takeoff (no
// figure) in every cell at those conditions, on every runway end, obstacles or not
// (perf's no-climb check, which also counts a positive rate under a 0.5 % still-air
// gradient as no climb).
func (d *decoder) noClimbWarnings(t *perf.ClimbTable, nodes [][][]*yaml.Node, unit string) {
	for w := range t.WeightKg {
		for p := range t.PressureAltM {
			for k := range t.TempK {
				if t.RateMS[w][p][k] > 0 {
					continue
				}
				n := nodes[w][p][k]
				d.warnf(n, fmt.Sprintf("climb (%.0f kg).rate_of_climb[%d][%d]", t.WeightKg[w], p, k),
					"%s %s at %.0f ft, %.0f C: no climb; every cell at these conditions (and wherever the rate gives under a 0.5 %% still-air gradient) is no takeoff, on every runway end",
					n.Value, unit, units.Feet(t.PressureAltM[p]), units.Celsius(t.TempK[k]))
			}
		}
	}
}

// climbMonotone refuses rates that rise with pressure altitude, temperature or
// weight: a flight manual never prints that (thinner air and a heavier aircraft climb
// worse: common practice), so it is a typing slip; kneeprint's use of the lowest
// value below an axis is conservative only because of it. A block of several is
// named by its weight (blocks are sorted by weight here); single, one table without
// weights, by its own field path (climb.rate_of_climb[1][2]).
func (d *decoder) climbMonotone(t *perf.ClimbTable, nodes [][][]*yaml.Node, single bool) bool {
	ok := true
	for w := range t.WeightKg {
		for p := range t.PressureAltM {
			for k := range t.TempK {
				v, n := t.RateMS[w][p][k], nodes[w][p][k]
				where := fmt.Sprintf("climb (%.0f kg).rate_of_climb[%d][%d]", t.WeightKg[w], p, k)
				if single {
					where = fmt.Sprintf("climb.rate_of_climb[%d][%d]", p, k)
				}
				switch {
				case k > 0 && v > t.RateMS[w][p][k-1]+1e-9:
					d.errorf(n, where, "rate of climb rises as temperature rises: check the typing")
				case p > 0 && v > t.RateMS[w][p-1][k]+1e-9:
					d.errorf(n, where, "rate of climb rises as pressure altitude rises: check the typing")
				case w > 0 && v > t.RateMS[w-1][p][k]+1e-9:
					d.errorf(n, where, "rate of climb rises as weight rises: check the typing")
				default:
					continue
				}
				ok = false
			}
		}
	}
	return ok
}

// summarizeClimb prints the profile's climb and, to hold against the manual, its rate
// of climb and still-air gradient at sea level in the ISA at the MTOW.
func summarizeClimb(w io.Writer, a *perf.Aircraft) {
	c := a.Climb
	if c == nil {
		fmt.Fprintln(w, "  climb: none given (a runway end with obstacles then has no figure)")
		return
	}
	if t := c.Table; t != nil {
		fmt.Fprintf(w, "  climb at %.0f kt (IAS): rate-of-climb table, %d pressure altitudes (%.0f to %.0f ft) x %d temperatures (%.0f to %.0f C) x %d weight(s) (%.0f to %.0f kg)\n",
			units.Knots(c.SpeedIASMS), len(t.PressureAltM), units.Feet(first(t.PressureAltM)), units.Feet(last(t.PressureAltM)),
			len(t.TempK), units.Celsius(first(t.TempK)), units.Celsius(last(t.TempK)), len(t.WeightKg), first(t.WeightKg), last(t.WeightKg))
	} else {
		fmt.Fprintf(w, "  climb at %.0f kt (IAS): the physics' excess power at that speed\n", units.Knots(c.SpeedIASMS))
	}
	cm, err := perf.ClimbFor(a)
	if err != nil {
		fmt.Fprintf(w, "  reference climb: no figure: %v\n", err)
		return
	}
	r, err := cm.Climb(perf.Conditions{PressureAltM: 0, TempK: perf.ISASeaLevelTempK, MassKg: a.MTOWKg})
	if err == nil {
		var g float64
		if g, err = r.GroundGradient(0); err == nil {
			fmt.Fprintf(w, "  reference climb, to hold against the manual: sea level ISA, MTOW %.0f kg, %.0f kt: %.0f ft/min, %.1f %% in still air\n",
				a.MTOWKg, units.Knots(c.SpeedIASMS), units.Feet(r.RateMS)*60, g*100)
			return
		}
	}
	fmt.Fprintf(w, "  reference climb (sea level ISA, MTOW): no figure: %v\n", err)
}
