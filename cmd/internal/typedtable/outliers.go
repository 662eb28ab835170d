package typedtable

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
)

// OutlierThresholdPct is how far, in per cent, a typed figure may stand from what its
// neighbours predict (beyond what rounding to the table's step explains, see
// Outliers) before it is flagged. A manual's figures grow smoothly with temperature,
// pressure altitude and weight: the demo tables stay within 1.5 % of their
// neighbours' predictions (TestDemoTablesClean), while a slip of the hundreds or tens
// digit of a typical figure lies far beyond (1580 typed for 1850: -15 %; 985 for
// 895: +10 %). A threshold of its own choosing (no published figure): between the
// two, low enough to see a slip of one digit step in the hundreds of a figure under
// 2000.
const OutlierThresholdPct = 5.0

// LinearFloorFraction is the share of a Linear table's largest figure (in size) that
// its deviations are at least measured against (see Outliers): a tenth. A threshold
// of its own choosing (no published figure): a rate of climb a tenth of the table's
// best is near the ceiling the table ends at, where the figure's own size is no
// longer a fair yardstick.
const LinearFloorFraction = 0.1

// The axes a cell is predicted along.
const (
	AxisTemperature      = "temperature"
	AxisPressureAltitude = "pressure altitude"
	AxisWeight           = "weight"
)

// Deviation is a cell against the prediction of its neighbours along one axis.
type Deviation struct {
	Axis     string
	Expected float64 // in the table's unit
	// Pct is (typed - expected) / expected x 100; in a Linear table, per cent of the
	// larger of |expected| and the table's floor (see Outliers).
	Pct float64
	// RoundingPct is the most that rounding the cell and its neighbours to the
	// table's step could move Pct (see Outliers).
	RoundingPct float64
}

// Over reports whether the deviation passes OutlierThresholdPct beyond what
// rounding explains.
func (d Deviation) Over() bool { return math.Abs(d.Pct) > OutlierThresholdPct+d.RoundingPct }

// Outlier is a cell that breaks the smooth pattern of its neighbours.
type Outlier struct {
	Block, Row, Col int // indices into Table.Blocks and the block's Rows
	Cell            Cell
	Deviations      []Deviation // every axis that gave a prediction, in axis order
}

// Outliers finds the cells of t that break the smooth pattern of their neighbours.
//
// Each cell is predicted from its neighbours along every axis of the table that has
// at least 3 values (temperature, pressure altitude, weight), in the logarithm of the
// figure, since distances grow about exponentially with temperature and altitude:
// for a cell inside the axis, on the straight line between its two neighbours
//
//	ln v_k ~ ln v_(k-1) + (ln v_(k+1) - ln v_(k-1)) (x_k - x_(k-1)) / (x_(k+1) - x_(k-1))
//
// and for a cell at either end of the axis, on the continuation of the straight line
// through the two nearest cells. Axis values are used as they are (uneven steps
// allowed), the weight as its logarithm: distances grow about as a power of the
// weight (the ground roll about as its square, s_G ~ W^2: Anderson, Aircraft
// Performance and Design, sec. 6.7). The deviation is (typed - predicted) /
// predicted, in per cent.
//
// A cell is flagged when its deviation passes OutlierThresholdPct plus the most that
// rounding to the table's step (Step: 5 when every figure is a multiple of 5) could
// explain, half a step on the cell and on each neighbour used, weighted as the
// prediction weighs them, along EVERY axis that gave a prediction. A slip moves its
// own cell against all of its neighbours, so it shows along every axis alike; the
// neighbours of a slip see it along one axis only (the line through it), and a
// genuine steepening at the hot, high and heavy corner of a table (where a real
// aircraft's distances grow faster than exponentially) seldom along all. In this
// logarithmic form, figures that are not positive give no prediction and are not
// judged.
//
// A table marked Linear (a rate of climb) is judged in its figures themselves, on
// the straight line between the two neighbours
//
//	v_k ~ v_(k-1) + (v_(k+1) - v_(k-1)) (x_k - x_(k-1)) / (x_(k+1) - x_(k-1))
//
// since a rate of climb falls about linearly with pressure altitude (the straight
// line a plot of the best rate of climb is extended along to the absolute ceiling:
// Anderson, Introduction to Flight, the chapter on airplane performance, absolute
// and service ceilings; from memory) and with temperature, and a manual
// may print a zero or negative rate at the top of its table: every figure is then
// judged, zero and negative ones too. The deviation is taken in per cent of the
// larger of the predicted figure's size and LinearFloorFraction of the table's
// largest figure (in size), so that a rate near zero is judged against the table's
// scale, not against its own small size; rounding is allowed for in the same per
// cent.
func Outliers(t *Table) []Outlier {
	var out []Outlier
	for b, rows := range Deviations(t) {
		for p, row := range rows {
			for k, devs := range row {
				if len(devs) == 0 {
					continue
				}
				all := true
				for _, d := range devs {
					all = all && d.Over()
				}
				if all {
					out = append(out, Outlier{Block: b, Row: p, Col: k, Cell: t.Blocks[b].Rows[p][k], Deviations: devs})
				}
			}
		}
	}
	return out
}

// Deviations returns, for every cell of t ([block][row][column]), its deviation from
// the prediction of its neighbours along each axis that gives one (see Outliers).
// It returns nil for a table whose rows do not match its axes.
func Deviations(t *Table) [][][][]Deviation {
	nb, np, nt := len(t.Blocks), len(t.PressureAltitudes), len(t.Temperatures)
	if nb == 0 || np == 0 || nt == 0 {
		return nil
	}
	// logs[b][p][k]: the figure as judged (its logarithm, or itself in a Linear
	// table), NaN where a figure is not usable.
	logs := make([][][]float64, nb)
	largest := 0.0 // in size, for a Linear table's floor
	for b, bl := range t.Blocks {
		if len(bl.Rows) != np {
			return nil // a ragged table is the loader's error, not ours
		}
		logs[b] = make([][]float64, np)
		for p, row := range bl.Rows {
			if len(row) != nt {
				return nil
			}
			logs[b][p] = make([]float64, nt)
			for k, c := range row {
				logs[b][p][k] = math.NaN()
				switch {
				case math.IsInf(c.Value, 0) || math.IsNaN(c.Value):
				case t.Linear:
					logs[b][p][k] = c.Value
					largest = math.Max(largest, math.Abs(c.Value))
				case c.Value > 0:
					logs[b][p][k] = math.Log(c.Value)
				}
			}
		}
	}
	floor := LinearFloorFraction * largest
	half := Step(t) / 2
	temps := axisSI(t.Temperatures)
	alts := axisSI(t.PressureAltitudes)
	// The weight axis in increasing order; unusable when two blocks share a weight.
	order := make([]int, nb)
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(i, j int) bool { return t.Blocks[order[i]].Weight.SI < t.Blocks[order[j]].Weight.SI })
	weights := make([]float64, nb)
	rank := make([]int, nb)
	weightAxis := nb >= 3
	for r, b := range order {
		weights[r], rank[b] = math.Log(t.Blocks[b].Weight.SI), r
		if r > 0 && !(weights[r] > weights[r-1]) {
			weightAxis = false
		}
	}

	out := make([][][][]Deviation, nb)
	line := make([]float64, max(nt, np, nb))
	for b := 0; b < nb; b++ {
		out[b] = make([][][]Deviation, np)
		for p := 0; p < np; p++ {
			out[b][p] = make([][]Deviation, nt)
			for k := 0; k < nt; k++ {
				v := logs[b][p][k]
				if math.IsNaN(v) {
					continue
				}
				var devs []Deviation
				add := func(axis string, xs, ys []float64, at int) {
					pred, w, idx, ok := predict(xs, ys, at)
					if !ok {
						return
					}
					if t.Linear {
						// Half a step on the cell and on each neighbour, in the
						// same yardstick as the deviation.
						ref := math.Max(math.Abs(pred), floor)
						if ref == 0 {
							return // a table of zeros: nothing to judge against
						}
						r := half * (1 + math.Abs(w[0]) + math.Abs(w[1]))
						devs = append(devs, Deviation{Axis: axis, Expected: pred, Pct: (v - pred) / ref * 100, RoundingPct: r / ref * 100})
						return
					}
					exp := math.Exp(pred)
					// d ln v = dv / v: half a step on the cell and on each neighbour.
					r := half / math.Exp(v)
					for i := range idx {
						r += math.Abs(w[i]) * half / math.Exp(ys[idx[i]])
					}
					devs = append(devs, Deviation{Axis: axis, Expected: exp, Pct: (math.Exp(v) - exp) / exp * 100, RoundingPct: r * 100})
				}
				add(AxisTemperature, temps, logs[b][p], k)
				for i := 0; i < np; i++ {
					line[i] = logs[b][i][k]
				}
				add(AxisPressureAltitude, alts, line[:np], p)
				if weightAxis {
					for r, bb := range order {
						line[r] = logs[bb][p][k]
					}
					add(AxisWeight, weights, line[:nb], rank[b])
				}
				out[b][p][k] = devs
			}
		}
	}
	return out
}

func axisSI(ls []Label) []float64 {
	xs := make([]float64, len(ls))
	for i, l := range ls {
		xs[i] = l.SI
	}
	return xs
}

// predict returns ys[k] as its neighbours along xs predict it (see Outliers), with
// the weights it gives the two neighbours idx; false when the axis has fewer than 3
// values or a neighbour is not usable.
func predict(xs, ys []float64, k int) (y float64, w [2]float64, idx [2]int, ok bool) {
	n := len(xs)
	if n < 3 || len(ys) != n {
		return 0, w, idx, false
	}
	i, j := k-1, k+1
	switch k {
	case 0:
		i, j = 1, 2
	case n - 1:
		i, j = n-2, n-3
	}
	if math.IsNaN(ys[i]) || math.IsNaN(ys[j]) || xs[j] == xs[i] {
		return 0, w, idx, false
	}
	f := (xs[k] - xs[i]) / (xs[j] - xs[i])
	return ys[i]*(1-f) + ys[j]*f, [2]float64{1 - f, f}, [2]int{i, j}, true
}

// Step is the step the table's figures were rounded to, as typed: the greatest
// common divisor of the figures when all are whole numbers (5 for figures all
// multiples of 5), else one unit of the last decimal place typed (0.1 for 12.5).
func Step(t *Table) float64 {
	g, decimals, whole := int64(0), 0, true
	for _, b := range t.Blocks {
		for _, row := range b.Rows {
			for _, c := range row {
				s := strings.ReplaceAll(strings.TrimSpace(c.Text), "_", "")
				if s == "" {
					s = strconv.FormatFloat(c.Value, 'f', -1, 64)
				}
				if i := strings.IndexAny(s, ".eE"); i >= 0 {
					whole = false
					if s[i] == '.' {
						decimals = max(decimals, len(s)-i-1)
					}
					continue
				}
				n, err := strconv.ParseInt(s, 10, 64)
				if err != nil {
					whole = false
					continue
				}
				g = gcd(g, abs64(n))
			}
		}
	}
	switch {
	case !whole && decimals > 0:
		return math.Pow(10, -float64(decimals))
	case g > 0:
		return float64(g)
	}
	return 1
}

func gcd(a, b int64) int64 {
	for b != 0 {
		a, b = b, a%b
	}
	return a
}

func abs64(n int64) int64 {
	if n < 0 {
		return -n
	}
	return n
}

// Message says what is suspicious about o, as a warning with the cell's place:
//
//	file:line:column: table.weights[2].to_50ft[1][3]: distance to 50 ft 1580 (1000 kg, 2000 ft, 20 C) breaks ...
func (t *Table) Message(o Outlier) string {
	var parts []string
	for _, d := range o.Deviations {
		parts = append(parts, fmt.Sprintf("about %.0f along %s (%+.0f %%)", d.Expected, d.Axis, d.Pct))
	}
	return fmt.Sprintf("%s:%d:%d: %s: %s %s (%s) breaks the smooth pattern of its neighbours, which predict %s: check it against the manual",
		t.File, o.Cell.Line, o.Cell.Column, t.Field(o.Block, o.Row, o.Col), t.Quantity, o.Cell.Text, t.Where(o.Block, o.Row, o.Col), strings.Join(parts, ", "))
}
