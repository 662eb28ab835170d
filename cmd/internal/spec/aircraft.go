package spec

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strings"

	"gopkg.in/yaml.v3"

	"kneeprint/cmd/internal/typedtable"
	"kneeprint/cmd/internal/units"
	"kneeprint/perf"
)

// Plausibility ranges for aircraft data, in SI. Light aircraft only: the methods
// kneeprint uses are for light piston aircraft (CS-23 / 14 CFR 23 normal category,
// maximum 5670 kg: 14 CFR 1.1, "small aircraft").
const (
	minMassKg     = 100.0
	maxMassKg     = 5670.0
	maxSpeedMS    = 200 * units.MetresPerSecPerKnot
	minDataTempK  = -60 + units.KelvinAtZeroCelsius
	maxDataTempK  = 60 + units.KelvinAtZeroCelsius
	minTableAltM  = -2000 * units.MetresPerFoot
	maxTableAltM  = 20000 * units.MetresPerFoot
	maxTableCells = 4000 // axes product; a real manual table has under 200
	maxWeights    = 8    // perf.MaxGridWeights
)

// Defaults applied when a profile does not say. Each is printed by validate.
const (
	// Most light-aircraft manuals give tailwind corrections up to 10 kt (from memory).
	defaultMaxTailwindKt = 10
	// About one second of rotation for small aircraft (from memory; domain notes).
	defaultRotationS = 1.0
	// Starting values of the calibration fit, never used on a card by themselves.
	// Static thrust as a fraction of the momentum-theory ideal: a fixed-pitch
	// propeller, pitched for climb or cruise, is partly stalled at rest, 0.55 to 0.6;
	// a constant-speed propeller in fine pitch somewhat higher (from memory).
	defaultStaticFixed    = 0.58
	defaultStaticConstant = 0.66
	// Propeller efficiency near lift-off speed: 0.5 to 0.55 for a fixed pitch,
	// somewhat higher for a constant speed (from memory).
	defaultEtaFixed    = 0.52
	defaultEtaConstant = 0.58
	// maxExplicitPoints bounds the calibration points a profile lists by hand.
	maxExplicitPoints = 50
)

func (d *decoder) aircraft(m *mapping) *perf.Aircraft {
	root := m.n
	m.oneOf("kind", true, string(KindAircraft))
	a := &perf.Aircraft{}
	a.Name = m.str("name", true)
	a.Type = m.str("type", true)
	a.Notes = m.str("notes", false)
	mtow, mtowOK := m.quantity("mtow", units.Mass, true, minMassKg, maxMassKg)
	a.MTOWKg = mtow
	minMass, minMassOK := m.quantity("min_mass", units.Mass, false, minMassKg, maxMassKg)
	if minMassOK && mtowOK && minMass >= mtow {
		d.errorf(m.vals["min_mass"], "min_mass", "%s is not below the MTOW %s", m.vals["min_mass"].Value, m.vals["mtow"].Value)
		minMassOK = false
	}

	var weightNodes []*yaml.Node
	if ws, nodes, ok := m.quantities("weights", units.Mass, false, minMassKg, maxMassKg); len(ws) > maxWeights {
		d.errorf(m.vals["weights"], "weights", "%d weights, at most %d: a card holds no more blocks", len(ws), maxWeights)
	} else if ws != nil {
		seen := map[float64]int{}
		for i, w := range ws {
			if !ok && w == 0 {
				continue
			}
			if mtowOK && w > mtow+1e-9 {
				d.errorf(nodes[i], fmt.Sprintf("weights[%d]", i), "%s is above the MTOW %s", nodes[i].Value, m.vals["mtow"].Value)
			}
			if j, dup := seen[math.Round(w*1000)]; dup {
				d.errorf(nodes[i], fmt.Sprintf("weights[%d]", i), "%s repeats weights[%d]", nodes[i].Value, j)
			}
			seen[math.Round(w*1000)] = i
		}
		a.WeightsKg = append([]float64(nil), ws...)
		sort.Sort(sort.Reverse(sort.Float64Slice(a.WeightsKg)))
		if ok {
			weightNodes = nodes
		}
	} else if !m.has("weights") && mtowOK {
		a.WeightsKg = []float64{mtow}
		d.notef("weights not given: cards show the MTOW only")
	}

	speedsNode := m.get("speeds", false)
	sp := d.mapping(speedsNode, "speeds")
	a.RotateIASMS, _ = sp.quantity("rotation", units.Speed, false, 10*units.MetresPerSecPerKnot, maxSpeedMS)
	a.At50ftIASMS, _ = sp.quantity("at_50ft", units.Speed, false, 10*units.MetresPerSecPerKnot, maxSpeedMS)
	sp.finish()

	lim := d.mapping(m.get("limits", true), "limits")
	d.crosswindLimits(lim, a)
	if v, ok := lim.quantity("max_tailwind", units.Speed, false, 0, 30*units.MetresPerSecPerKnot); ok {
		a.MaxTailwindMS = v
	} else if !lim.has("max_tailwind") {
		a.MaxTailwindMS = defaultMaxTailwindKt * units.MetresPerSecPerKnot
		d.notef("limits.max_tailwind not given: %d kt assumed", defaultMaxTailwindKt)
	}
	minT, haveMinT := lim.quantity("min_temperature", units.Temperature, false, minDataTempK, maxDataTempK)
	maxT, haveMaxT := lim.quantity("max_temperature", units.Temperature, false, minDataTempK, maxDataTempK)
	lim.finish()

	a.TakeoffFlap = m.str("takeoff_flap", true)
	flaps := map[string]float64{}
	for i, fn := range m.list("flaps", false) {
		fm := d.mapping(fn, fmt.Sprintf("flaps[%d]", i))
		name := fm.str("name", true)
		cl, ok := fm.number("clmax", true, 0.8, 3.5)
		fm.finish()
		if _, dup := flaps[name]; dup && name != "" {
			d.errorf(fn, fmt.Sprintf("flaps[%d].name", i), "flap setting %q listed twice", name)
		}
		if ok {
			flaps[name] = cl
		}
	}

	tableNode, physNode := m.get("table", false), m.get("physics", false)
	if tableNode != nil {
		a.Table = d.table(tableNode, mtow)
	}
	if physNode != nil {
		a.Physics = d.physics(physNode)
	}
	if cn := m.get("climb", false); cn != nil {
		// The all-engines climb for obstacle clearance (issue 12): climb.go.
		a.Climb = d.climb(cn, a, physNode != nil, mtowOK, m.vals["mtow"])
	}
	model := m.oneOf("model", tableNode != nil && physNode != nil, string(perf.ModelTable), string(perf.ModelPhysics))
	switch {
	case tableNode == nil && physNode == nil:
		d.errorf(root, "table", "a profile needs a performance model: a table section, a physics section, or both")
	case model != "":
		a.Model = perf.ModelKind(model)
		if (a.Model == perf.ModelTable && tableNode == nil) || (a.Model == perf.ModelPhysics && physNode == nil) {
			d.errorf(m.vals["model"], "model", "model %s chosen but the profile has no %s section", model, model)
		}
	case tableNode != nil:
		a.Model = perf.ModelTable
	default:
		a.Model = perf.ModelPhysics
	}
	d.lowestMass(m, a, minMass, minMassOK, weightNodes)
	if a.Physics != nil && a.TakeoffFlap != "" {
		cl, ok := flaps[a.TakeoffFlap]
		if !ok {
			d.errorf(m.vals["takeoff_flap"], "takeoff_flap", "%q is not in the flaps list, which the physics model needs for CLmax", a.TakeoffFlap)
		}
		a.Physics.CLMax = cl
	}
	if a.Physics != nil {
		d.speedsForPhysics(a, root, speedsNode, sp)
	}

	// Declared operating temperature limits. Past them a cell is beyond limits; where
	// the data end (a table's hottest column) a cell has no data, which is no limit.
	if haveMinT {
		a.MinTempK = minT
	}
	if haveMaxT {
		a.MaxTempK = maxT
	}
	if haveMinT && haveMaxT && a.MinTempK >= a.MaxTempK {
		d.errorf(lim.vals["max_temperature"], "limits.max_temperature", "must be above min_temperature")
	}
	switch t := a.Table; {
	case t != nil && len(t.TempK) > 0:
		lo, hi := t.TempK[0], t.TempK[len(t.TempK)-1]
		if haveMaxT && maxT > hi+1e-9 {
			d.notef("limits.max_temperature %.0f C is above the table's hottest column %.0f C: cells in between have no data (kneeprint never extrapolates)", units.Celsius(maxT), units.Celsius(hi))
		}
		if !haveMinT && !haveMaxT {
			d.notef("limits: no operating temperature limits declared: the table's %.0f to %.0f C bound the data (hotter: no data; colder: the coldest column is used, which is conservative)", units.Celsius(lo), units.Celsius(hi))
		}
	case !haveMinT && !haveMaxT:
		d.notef("limits: no operating temperature limits declared")
	}
	landingNode := m.get("landing", false)
	if landingNode != nil {
		a.Landing = d.landing(landingNode, a, flaps, mtow, mtowOK)
	}
	m.finish()
	if a.Physics != nil && len(d.errs) == 0 {
		d.fitPhysics(a, physNode, m.vals["mtow"])
	}
	if a.Landing != nil && len(d.errs) == 0 {
		d.fitLanding(a, landingNode)
	}
	return a
}

// lowestMass sets the profile's lowest flyable mass (issue 14.2): min_mass when
// given; else the table's lightest block, below which a table has no figure of its
// own; a profile without a table must state it. No card weight may be below it.
func (d *decoder) lowestMass(m *mapping, a *perf.Aircraft, minMass float64, given bool, weightNodes []*yaml.Node) {
	switch {
	case given:
		a.MinMassKg = minMass
		d.minMassWhy = "min_mass"
	case m.has("min_mass"):
		return // its error is reported
	case a.Table != nil && len(a.Table.WeightKg) > 0:
		a.MinMassKg = a.Table.WeightKg[0]
		d.minMassWhy = "the takeoff table's lightest block: min_mass not given"
		d.notef("min_mass not given: the table's lightest block, %.0f kg, is the lowest mass kneeprint answers for", a.MinMassKg)
	case a.Table == nil && a.Physics != nil:
		d.errorf(m.n, "min_mass", "missing required field \"min_mass\": a profile without a table states its lowest flyable mass (empty mass plus the lightest crew and the least fuel), so that a mistyped weight is refused")
		return
	default:
		return // the table's errors are reported
	}
	for i, n := range weightNodes {
		if w, err := units.Parse(n.Value, units.Mass); err == nil && w < a.MinMassKg-1e-9 {
			d.errorf(n, fmt.Sprintf("weights[%d]", i), "%s is below the lowest flyable mass (min_mass) %.0f kg", n.Value, a.MinMassKg)
		}
	}
}

// windFactoringHelp says how to answer table.wind_factoring_included from the manual.
const windFactoringHelp = "required, no default: write true when the manual's takeoff chart or its wind notes already credit " +
	"only part of a headwind and more than all of a tailwind (the flight manual says so beside the chart, e.g. that the wind " +
	"correction includes the factors of the certification rules), false when its wind notes are for the full reported wind " +
	"or it gives none; false is the conservative answer when in doubt"

// tableKind says which flight-manual table is read: the takeoff table (to 50 ft) or
// the landing table (from 50 ft). Both have the same form.
type tableKind struct {
	path      string // "table" or "landing.table"
	total     string // the key of the total distance: "to_50ft" or "from_50ft"
	totalText string // how messages name it
	mass      string // the mass the heaviest block is held against
}

// rollText is how the proof and the outlier warnings name the kind's ground roll.
func (k tableKind) rollText() string {
	if k.path == "table" {
		return "ground roll"
	}
	return "landing ground roll"
}

var (
	takeoffTable = tableKind{path: "table", total: "to_50ft", totalText: "distance to 50 ft", mass: "MTOW"}
	landingTable = tableKind{path: "landing.table", total: "from_50ft", totalText: "distance from 50 ft", mass: "maximum landing mass"}
)

func (d *decoder) table(n *yaml.Node, mtow float64) *perf.Table {
	t, nodes := d.tableOf(n, mtow, takeoffTable)
	if nodes[0] != nil {
		d.tableNodes = nodes // for a physics fit to the table
	}
	return t
}

// tableOf reads a flight-manual table of kind k; it also returns the nodes of its
// cells (nil when the table has errors), for a physics fit to it.
func (d *decoder) tableOf(n *yaml.Node, mtow float64, k tableKind) (*perf.Table, [2][][][]*yaml.Node) {
	var cellNodes [2][][][]*yaml.Node
	m := d.mapping(n, k.path)
	t := &perf.Table{}
	if !m.has("wind_factoring_included") && n != nil && n.Kind == yaml.MappingNode {
		at := n // the table, or the empty value when the key is written without one
		if v := m.vals["wind_factoring_included"]; v != nil {
			at = v
		}
		m.get("wind_factoring_included", false)
		d.errorf(at, k.path+".wind_factoring_included", "%s", windFactoringHelp)
	} else if v, ok := m.boolean("wind_factoring_included", true); ok {
		t.WindInData = v
	}
	unit := m.oneOf("distance_unit", true, "m", "ft")
	factor := 1.0
	if unit == "ft" {
		factor = units.MetresPerFoot
	}
	var ok1, ok2, ok3 bool
	var nodes []*yaml.Node
	t.PressureAltM, nodes, ok1 = m.quantities("pressure_altitudes", units.Length, true, minTableAltM, maxTableAltM)
	ok1 = ok1 && d.increasing(k.path+".pressure_altitudes", t.PressureAltM, nodes)
	t.TempK, nodes, ok2 = m.quantities("temperatures", units.Temperature, true, minDataTempK, maxDataTempK)
	ok2 = ok2 && d.increasing(k.path+".temperatures", t.TempK, nodes)
	blocks := m.list("weights", true)
	axesOK := ok1 && ok2
	if axesOK && len(t.PressureAltM)*len(t.TempK)*len(blocks) > maxTableCells {
		d.errorf(n, k.path, "the table has more than %d cells", maxTableCells)
		axesOK = false
	}
	type block struct {
		w              float64
		gr, to         [][]float64
		grNode, toNode [][]*yaml.Node
		node           *yaml.Node
		index          int        // position in the file's list
		wNode          *yaml.Node // the weight as typed
	}
	var bs []block
	ok3 = true
	for i, bn := range blocks {
		path := fmt.Sprintf("%s.weights[%d]", k.path, i)
		bm := d.mapping(bn, path)
		w, wOK := bm.quantity("weight", units.Mass, true, minMassKg, maxMassKg)
		var gr, to [][]float64
		var grN, toN [][]*yaml.Node
		if axesOK {
			gr, grN = d.grid(bm, "ground_roll", len(t.PressureAltM), len(t.TempK), factor)
			to, toN = d.grid(bm, k.total, len(t.PressureAltM), len(t.TempK), factor)
		} else {
			// Not read against unknown axes; still name any placeholder in them.
			d.placeholdersIn(bm.get("ground_roll", false), bm.field("ground_roll"))
			d.placeholdersIn(bm.get(k.total, false), bm.field(k.total))
		}
		bm.finish()
		if !wOK || gr == nil || to == nil {
			ok3 = false
			continue
		}
		bs = append(bs, block{w, gr, to, grN, toN, bn, i, bm.vals["weight"]})
	}
	if ok3 && len(bs) > 0 && len(bs) == len(blocks) {
		// The table as typed, blocks in file order, for the proof sheet and the
		// outlier check.
		for _, q := range []struct {
			quantity, short, key string
			nodes                func(block) [][]*yaml.Node
		}{
			{k.rollText(), "roll", "ground_roll", func(b block) [][]*yaml.Node { return b.grNode }},
			{k.totalText, "50 ft", k.total, func(b block) [][]*yaml.Node { return b.toNode }},
		} {
			tt := &typedtable.Table{File: d.file, Quantity: q.quantity, Short: q.short, Section: k.path, Key: q.key, Unit: unit,
				PressureAltitudes: typedLabels(m.vals["pressure_altitudes"], t.PressureAltM),
				Temperatures:      typedLabels(m.vals["temperatures"], t.TempK)}
			for _, b := range bs {
				tt.Blocks = append(tt.Blocks, typedtable.Block{Index: b.index, Weight: typedLabel(b.wNode, b.w), Rows: typedCells(q.nodes(b))})
			}
			d.typed = append(d.typed, tt)
		}
	}
	if ok3 && len(bs) > 0 {
		sort.SliceStable(bs, func(i, j int) bool { return bs[i].w < bs[j].w })
		var nodes [2][][][]*yaml.Node
		for i := range bs {
			nodes[0] = append(nodes[0], bs[i].grNode)
			nodes[1] = append(nodes[1], bs[i].toNode)
			if i > 0 && !(bs[i].w > bs[i-1].w) {
				d.errorf(bs[i].node, k.path+".weights", "weight %.1f kg appears twice", bs[i].w)
				ok3 = false
			}
			t.WeightKg = append(t.WeightKg, bs[i].w)
			t.GroundRollM = append(t.GroundRollM, bs[i].gr)
			t.To50ftM = append(t.To50ftM, bs[i].to)
		}
		if ok3 {
			d.monotone(t, nodes, k)
			cellNodes = nodes
		}
		if mtow > 0 && len(t.WeightKg) > 0 && t.WeightKg[len(t.WeightKg)-1] < mtow-1e-9 {
			d.notef("%s: heaviest block %.0f kg is below the %s %.0f kg: heavier cells have no data", k.path, t.WeightKg[len(t.WeightKg)-1], k.mass, mtow)
		}
	}
	d.corrections(m.get("corrections", false), t, k)
	m.finish()
	return t, cellNodes
}

// grid reads rows (one per pressure altitude) of columns (one per temperature) of
// plain numbers in the table's distance unit.
func (d *decoder) grid(m *mapping, key string, rows, cols int, factor float64) ([][]float64, [][]*yaml.Node) {
	items := m.list(key, true)
	if items == nil {
		return nil, nil
	}
	path := m.field(key)
	if len(items) != rows {
		d.errorf(m.vals[key], path, "has %d rows, the table has %d pressure altitudes: one row per pressure altitude", len(items), rows)
		return nil, nil
	}
	out := make([][]float64, rows)
	nodes := make([][]*yaml.Node, rows)
	ok := true
	for i, rn := range items {
		rp := fmt.Sprintf("%s[%d]", path, i)
		if rn.Kind != yaml.SequenceNode {
			d.errorf(rn, rp, "expected a row such as [250, 270, 290], found %s", describe(rn))
			ok = false
			continue
		}
		if len(rn.Content) != cols {
			d.errorf(rn, rp, "row has %d values, the table has %d temperatures (ragged table)", len(rn.Content), cols)
			ok = false
			continue
		}
		out[i] = make([]float64, cols)
		nodes[i] = rn.Content
		for j, cn := range rn.Content {
			x, good := d.number(cn, fmt.Sprintf("%s[%d]", rp, j), 1, maxDistanceM/factor)
			ok = ok && good
			out[i][j] = x * factor
		}
	}
	if !ok {
		return nil, nil
	}
	return out, nodes
}

// monotone rejects tables whose distances fall with pressure altitude, temperature or
// weight, or whose distance to 50 ft is below the ground roll: a flight manual never
// prints that, so it is a typing slip (common practice).
func (d *decoder) monotone(t *perf.Table, nodes [2][][][]*yaml.Node, tk tableKind) {
	nw, np, nt := len(t.WeightKg), len(t.PressureAltM), len(t.TempK)
	names := [2]string{"ground_roll", tk.total}
	for w := 0; w < nw; w++ {
		for p := 0; p < np; p++ {
			for k := 0; k < nt; k++ {
				for gi, g := range [2][][][]float64{t.GroundRollM, t.To50ftM} {
					v, n := g[w][p][k], nodes[gi][w][p][k]
					where := fmt.Sprintf("%s.weights (%.0f kg).%s[%d][%d]", tk.path, t.WeightKg[w], names[gi], p, k)
					if k > 0 && v < g[w][p][k-1] {
						d.errorf(n, where, "distance falls as temperature rises: check the typing")
					}
					if p > 0 && v < g[w][p-1][k] {
						d.errorf(n, where, "distance falls as pressure altitude rises: check the typing")
					}
					if w > 0 && v < g[w-1][p][k] {
						d.errorf(n, where, "distance falls as weight rises: check the typing")
					}
				}
				if t.To50ftM[w][p][k] < t.GroundRollM[w][p][k] {
					d.errorf(nodes[1][w][p][k], fmt.Sprintf("%s.weights (%.0f kg).%s[%d][%d]", tk.path, t.WeightKg[w], tk.total, p, k), "%s is shorter than the ground roll", tk.totalText)
				}
			}
		}
	}
}

func (d *decoder) corrections(n *yaml.Node, t *perf.Table, k tableKind) {
	m := d.mapping(n, k.path+".corrections")
	if n == nil {
		d.notef("%s.corrections not given: no wind or grass notes; tailwind cells have no data", k.path)
		return
	}
	if hn := m.get("headwind", false); hn != nil {
		hm := d.mapping(hn, k.path+".corrections.headwind")
		t.Corrections.HeadwindPct, _ = hm.quantity("decrease", units.Percent, true, 0, 50)
		t.Corrections.HeadwindPerMS, _ = hm.quantity("per", units.Speed, true, 0.5*units.MetresPerSecPerKnot, 50*units.MetresPerSecPerKnot)
		// Optional, as in "up to 20 kt": beyond it the note has no data (perf).
		t.Corrections.HeadwindMaxMS, _ = hm.quantity("up_to", units.Speed, false, 1*units.MetresPerSecPerKnot, 60*units.MetresPerSecPerKnot)
		hm.finish()
	} else {
		d.notef("%s.corrections.headwind not given: no credit for headwind", k.path)
	}
	if tn := m.get("tailwind", false); tn != nil {
		tm := d.mapping(tn, k.path+".corrections.tailwind")
		t.Corrections.TailwindPct, _ = tm.quantity("increase", units.Percent, true, 0, 100)
		t.Corrections.TailwindPerMS, _ = tm.quantity("per", units.Speed, true, 0.5*units.MetresPerSecPerKnot, 50*units.MetresPerSecPerKnot)
		t.Corrections.TailwindMaxMS, _ = tm.quantity("up_to", units.Speed, true, 0, 30*units.MetresPerSecPerKnot)
		tm.finish()
	} else {
		d.notef("%s.corrections.tailwind not given: tailwind cells have no data", k.path)
	}
	t.Corrections.GrassPctOfGroundRoll = d.groundRollNote(m, "grass", 200, k)
	t.Corrections.WetGrassPctOfGroundRoll = d.groundRollNote(m, "wet_grass", 300, k)
	m.finish()
}

// groundRollNote reads a note "add x % of the ground roll" under key; 0 when absent.
func (d *decoder) groundRollNote(m *mapping, key string, maxPct float64, k tableKind) float64 {
	n := m.get(key, false)
	if n == nil {
		return 0
	}
	gm := d.mapping(n, k.path+".corrections."+key)
	pct, _ := gm.quantity("add_of_ground_roll", units.Percent, true, 0, maxPct)
	gm.finish()
	return pct
}

func (d *decoder) physics(n *yaml.Node) *perf.Physics {
	m := d.mapping(n, "physics")
	p := &perf.Physics{}
	p.WingAreaM2, _ = m.quantity("wing_area", units.Area, true, 5, 60)
	p.SpanM, _ = m.quantity("span", units.Length, true, 4, 25)
	p.WingHeightM, _ = m.quantity("wing_height", units.Length, true, 0.3, 4)
	p.CD0, _ = m.number("cd0", true, 0.01, 0.15)
	p.Oswald, _ = m.number("oswald", true, 0.4, 1.0)
	p.CLGround, _ = m.number("cl_ground_run", true, 0, 1.5)
	p.PowerW, _ = m.quantity("power", units.Power, true, 20e3, 600e3)
	pm := d.mapping(m.get("propeller", true), "physics.propeller")
	p.Propeller = perf.PropellerType(pm.oneOf("type", true, string(perf.FixedPitch), string(perf.ConstantSpeed)))
	p.PropDiameterM, _ = pm.quantity("diameter", units.Length, true, 1, 3.5)
	// Both figures only start the calibration fit, which keeps them within these
	// physical bounds (perf.MinPropEfficiency...).
	if v, ok := pm.number("efficiency", false, perf.MinPropEfficiency, perf.MaxPropEfficiency); ok {
		p.PropEfficiency = v
	} else if !pm.has("efficiency") {
		p.PropEfficiency = defaultEtaFixed
		if p.Propeller == perf.ConstantSpeed {
			p.PropEfficiency = defaultEtaConstant
		}
		d.notef("physics.propeller.efficiency not given: the fit starts from the default %.2f for a %s propeller (from memory)", p.PropEfficiency, p.Propeller)
	}
	if v, ok := pm.number("static_thrust_fraction", false, perf.MinStaticThrustFrac, perf.MaxStaticThrustFrac); ok {
		p.StaticThrustFac = v
	} else if !pm.has("static_thrust_fraction") {
		p.StaticThrustFac = defaultStaticFixed
		if p.Propeller == perf.ConstantSpeed {
			p.StaticThrustFac = defaultStaticConstant
		}
		d.notef("physics.propeller.static_thrust_fraction not given: the fit starts from the default %.2f of the momentum-theory ideal for a %s propeller (from memory)", p.StaticThrustFac, p.Propeller)
	}
	pm.finish()
	if m.get("liftoff_factor", false) != nil {
		d.errorf(m.vals["liftoff_factor"], "physics.liftoff_factor", "no longer used: the physics model lifts off at the manual's speeds.rotation and reaches 50 ft at speeds.at_50ft; remove this line")
	}
	if v, ok := m.quantity("rotation_time", units.Duration, false, 0, 5); ok {
		p.RotationS = v
	} else if !m.has("rotation_time") {
		p.RotationS = defaultRotationS
		d.notef("physics.rotation_time not given: %.0f s assumed", defaultRotationS)
	}
	d.calibration(m)
	m.finish()
	return p
}

// crosswindLimits reads the crosswind figures of the limits section: the manual's
// maximum demonstrated crosswind (required; advisory, marked on the card's crosswind
// helper) and an optional real limit (the manual's, or a club's). A limit of 0 kt is
// refused: it would forbid any crosswind, and it is more often a slip for "no limit".
func (d *decoder) crosswindLimits(lim *mapping, a *perf.Aircraft) {
	const kt = units.MetresPerSecPerKnot
	if !lim.has("demonstrated_crosswind") && lim.has("max_crosswind") {
		lim.get("demonstrated_crosswind", false)
		d.errorf(lim.keys["max_crosswind"], "limits.demonstrated_crosswind",
			"missing: give the manual's maximum demonstrated crosswind as demonstrated_crosswind (advisory); max_crosswind is now an optional hard limit, yours or your club's")
	} else {
		a.DemonstratedCrosswindMS, _ = lim.quantity("demonstrated_crosswind", units.Speed, true, 1*kt, 60*kt)
	}
	v := lim.get("max_crosswind", false)
	if v == nil {
		return
	}
	if x, err := units.Parse(v.Value, units.Speed); v.Kind == yaml.ScalarNode && err == nil && x == 0 {
		d.errorf(v, "limits.max_crosswind", "0 kt would forbid any crosswind: give the real limit, or leave max_crosswind out for no limit (demonstrated_crosswind stays advisory)")
		return
	}
	if x, ok := d.quantity(v, "limits.max_crosswind", units.Speed, 1*kt, 60*kt); ok {
		a.MaxCrosswindMS, a.HasMaxCrosswind = x, true
	}
}

// calibPoint is a calibration point as read, with the nodes its figures came from.
type calibPoint struct {
	p            perf.CalibrationPoint
	label        string     // for validate: "calibration[0]" or "table 1150 kg, 2000 ft, 20 C"
	grAt, toAt   *yaml.Node // where the ground roll and the distance to 50 ft were read
	grFld, toFld string     // their field paths
}

// calibration reads physics.calibration: the flight manual's figures the physics is
// fitted to.
func (d *decoder) calibration(m *mapping) {
	d.calib = append(d.calib, d.calibrationPoints(m, "physics", takeoffTable)...)
}

// calibrationPoints reads the calibration list of the section m (at path) for a
// table of kind k: each point's conditions and the manual's ground roll and total
// distance (k.total).
func (d *decoder) calibrationPoints(m *mapping, path string, k tableKind) []calibPoint {
	var out []calibPoint
	items := m.list("calibration", false)
	if len(items) > maxExplicitPoints {
		d.errorf(m.vals["calibration"], path+".calibration", "%d points, at most %d: a few well-chosen manual figures are enough (a whole table goes under %s:)", len(items), maxExplicitPoints, k.path)
		return nil
	}
	for i, it := range items {
		path := fmt.Sprintf("%s.calibration[%d]", path, i)
		pm := d.mapping(it, path)
		var cp calibPoint
		cp.label = fmt.Sprintf("calibration[%d]", i)
		if k == landingTable {
			cp.label = "landing " + cp.label
		}
		c := &cp.p.Conditions
		okPA, okT, okW := false, false, false
		c.PressureAltM, okPA = pm.quantity("pressure_altitude", units.Length, true, minTableAltM, maxTableAltM)
		c.TempK, okT = pm.quantity("temperature", units.Temperature, true, minDataTempK, maxDataTempK)
		c.MassKg, okW = pm.quantity("weight", units.Mass, true, minMassKg, maxMassKg)
		c.Surface = perf.Paved
		if pm.has("surface") {
			c.Surface = perf.Surface(pm.oneOf("surface", false, string(perf.Paved), string(perf.Grass), string(perf.Gravel)))
		} else {
			pm.get("surface", false)
		}
		c.Condition = perf.Dry
		if pm.has("condition") {
			c.Condition = perf.Condition(pm.oneOf("condition", false, string(perf.Dry), string(perf.Wet)))
		} else {
			pm.get("condition", false)
		}
		c.HeadwindMS, _ = pm.quantity("headwind", units.Speed, false, -30*units.MetresPerSecPerKnot, 30*units.MetresPerSecPerKnot)
		pm.str("source", false)
		gr, okGR := pm.quantity("ground_roll", units.Length, false, 1, maxDistanceM)
		to, okTo := pm.quantity(k.total, units.Length, false, 1, maxDistanceM)
		if !pm.has("ground_roll") && !pm.has(k.total) && it.Kind == yaml.MappingNode {
			d.errorf(it, path, "a calibration point needs the manual's ground_roll, %s or both", k.total)
		}
		if okGR && okTo && to <= gr {
			d.errorf(pm.vals[k.total], path+"."+k.total, "%s is not longer than the ground roll", k.totalText)
		}
		pm.finish()
		if !(okPA && okT && okW) || (!okGR && !okTo) {
			continue
		}
		if okGR {
			cp.p.GroundRollM, cp.grAt, cp.grFld = gr, pm.vals["ground_roll"], path+".ground_roll"
		}
		if okTo {
			cp.p.To50ftM, cp.toAt, cp.toFld = to, pm.vals[k.total], path+"."+k.total
		}
		out = append(out, cp)
	}
	return out
}

// pointsUpTo returns the calibration points cps as perf points, each checked not to
// be heavier than mass (named massName in the error), and whether one anchors the fit
// (at that mass, paved and dry: perf.IsAnchor). The takeoff and landing fits alike.
func (d *decoder) pointsUpTo(cps []calibPoint, mass float64, massName string) ([]perf.CalibrationPoint, bool) {
	anchored := false
	pts := make([]perf.CalibrationPoint, len(cps))
	for i, cp := range cps {
		pts[i] = cp.p
		anchored = anchored || perf.IsAnchor(cp.p, mass)
		if cp.p.Conditions.MassKg > mass+1e-9 {
			at, fld := cp.grAt, cp.grFld
			if at == nil {
				at, fld = cp.toAt, cp.toFld
			}
			d.errorf(at, fld, "the point's weight %.0f kg is above %s %.0f kg", cp.p.Conditions.MassKg, massName, mass)
		}
	}
	return pts, anchored
}

// fitPhysics fits a's physics to its calibration points and, when it has both, to
// every cell of its table (perf.Calibrate). A refused fit is an error at each figure
// too far off and at the physics section for a parameter on a bound; a profile with
// nothing to fit to is only warned about here: cards, check and grid refuse it.
func (d *decoder) fitPhysics(a *perf.Aircraft, physNode *yaml.Node, mtowNode *yaml.Node) {
	p := a.Physics
	if a.Table != nil && d.tableNodes[0] != nil {
		d.calib = append(d.calib, tablePoints(a.Table, d.tableNodes, takeoffTable)...)
	}
	if len(d.calib) == 0 {
		d.warnf(physNode, "physics.calibration", "not calibrated: cards, check and grid refuse this profile until it lists the flight manual's figures (at least sea level, MTOW, paved dry) under physics.calibration")
		return
	}
	if len(d.calib) > perf.MaxCalibrationPoints {
		d.errorf(physNode, "physics", "%d points to fit (calibration points and table cells), at most %d", len(d.calib), perf.MaxCalibrationPoints)
		return
	}
	pts, anchored := d.pointsUpTo(d.calib, a.MTOWKg, "the MTOW")
	if len(d.errs) > 0 {
		return
	}
	if !anchored && a.Model == perf.ModelPhysics {
		d.warnf(mtowNode, "physics.calibration", "no point is at MTOW on a paved, dry runway: cards, check and grid refuse this profile until the manual's figure there is added")
	}
	cal, err := perf.Calibrate(perf.PhysicsModel{P: *p, RotateIASMS: a.RotateIASMS, At50ftIASMS: a.At50ftIASMS}, pts)
	if d.fitErrors(err, d.calib, physNode, "physics.propeller", "physics", takeoffTable) {
		return
	}
	p.StaticThrustFac, p.PropEfficiency, p.Calibration = cal.Static, cal.Eta, cal
}

// tablePoints makes every cell of table t (kind k) a calibration point, paved, dry,
// calm, with the nodes its figures were read from.
func tablePoints(t *perf.Table, nodes [2][][][]*yaml.Node, k tableKind) []calibPoint {
	var out []calibPoint
	for wi, w := range t.WeightKg {
		for pi, pa := range t.PressureAltM {
			for ti, tk := range t.TempK {
				var cp calibPoint
				cp.p = perf.CalibrationPoint{
					Conditions:  perf.Conditions{PressureAltM: pa, TempK: tk, MassKg: w, Surface: perf.Paved, Condition: perf.Dry},
					GroundRollM: t.GroundRollM[wi][pi][ti], To50ftM: t.To50ftM[wi][pi][ti], FromTable: true,
				}
				cp.label = fmt.Sprintf("%s %.0f kg, %.0f ft, %.0f C", strings.ReplaceAll(k.path, ".", " "), w, units.Feet(pa), units.Celsius(tk))
				where := fmt.Sprintf("%s.weights (%.0f kg).%%s[%d][%d]", k.path, w, pi, ti)
				cp.grAt, cp.grFld = nodes[0][wi][pi][ti], fmt.Sprintf(where, "ground_roll")
				cp.toAt, cp.toFld = nodes[1][wi][pi][ti], fmt.Sprintf(where, k.total)
				out = append(out, cp)
			}
		}
	}
	return out
}

// fitErrors reports a refused fit (a *perf.FitError) at the figures too far off,
// named by pts, and at section node (field) for a parameter on its bound; any other
// error at the section (sectionField). It reports whether err was not nil.
func (d *decoder) fitErrors(err error, pts []calibPoint, section *yaml.Node, boundField, sectionField string, k tableKind) bool {
	var fe *perf.FitError
	switch {
	case errors.As(err, &fe):
		for _, pr := range fe.Problems {
			if pr.Point < 0 {
				d.errorf(section, boundField, "%s", pr.Msg)
				continue
			}
			cp := pts[pr.Point]
			at, fld := cp.grAt, cp.grFld
			if pr.Figure == k.total || at == nil {
				at, fld = cp.toAt, cp.toFld
			}
			msg := pr.Msg
			if cp.p.FromTable {
				msg += ": a cell far off a smooth fit is often a typing slip; check it against the manual (if the manual does print this figure, the physics description cannot follow the table: correct the description or remove the physics section, and the cards use the table)"
			}
			d.errorf(at, fld, "%s", msg)
		}
		return true
	case err != nil:
		d.errorf(section, sectionField, "%v", err)
		return true
	}
	return false
}

// speedsForPhysics checks the speeds the physics model flies: both given, the 50 ft
// speed not below rotation, rotation not below the stall speed the description
// gives at MTOW at sea level (a slip in wing area, CLmax or a speed).
func (d *decoder) speedsForPhysics(a *perf.Aircraft, root, speedsNode *yaml.Node, sp *mapping) {
	for _, k := range []struct {
		key string
		v   float64
	}{{"rotation", a.RotateIASMS}, {"at_50ft", a.At50ftIASMS}} {
		if k.v == 0 && !sp.has(k.key) {
			at := speedsNode
			if at == nil {
				at = root
			}
			d.errorf(at, "speeds."+k.key, "the physics model flies the manual's speeds: speeds.%s is needed (indicated airspeed, e.g. 60 kt)", k.key)
		}
	}
	if a.RotateIASMS > 0 && a.At50ftIASMS > 0 && a.At50ftIASMS < a.RotateIASMS {
		d.errorf(sp.vals["at_50ft"], "speeds.at_50ft", "the 50 ft speed is below the rotation speed")
	}
	p := a.Physics
	if a.RotateIASMS > 0 && a.MTOWKg > 0 && p.WingAreaM2 > 0 && p.CLMax > 0 {
		vs := math.Sqrt(2 * a.MTOWKg * perf.StandardGravity / (perf.DensityKgM3(0, perf.ISASeaLevelTempK) * p.WingAreaM2 * p.CLMax))
		if a.RotateIASMS < vs {
			d.errorf(sp.vals["rotation"], "speeds.rotation", "%.0f kt is below the stall speed %.0f kt that wing_area, the takeoff flap's clmax and the MTOW give at sea level: check them", units.Knots(a.RotateIASMS), units.Knots(vs))
		}
	}
}
