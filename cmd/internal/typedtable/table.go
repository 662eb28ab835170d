// Package typedtable holds a flight manual's table as a pilot typed it into a file:
// figures over pressure altitude x temperature, one block per weight, every cell with
// the text written and the place it was written. The loader (spec) fills it; the proof
// sheet prints it cell by cell beside the manual, and Outliers finds the cells that
// break the smooth pattern of their neighbours. Any such table (takeoff, landing,
// climb) is one Table per quantity.
package typedtable

import "fmt"

// Table is one quantity of a manual's table, as typed.
type Table struct {
	File     string // the file it was read from, as messages name it
	Quantity string // what the figures are, in words: "ground roll", "distance to 50 ft"
	Short    string // a column heading for them: "roll", "50 ft"
	Section  string // the file's section holding the blocks, e.g. "table"
	Key      string // the key of each block's rows, e.g. "ground_roll"
	Unit     string // the unit the figures are typed in: "ft", "m", "ft/min"
	// Linear says the figures change about linearly along each axis and may be zero
	// or negative (a rate of climb): Outliers then predicts them in themselves, not
	// in their logarithm (see Outliers).
	Linear bool

	PressureAltitudes []Label // the rows, as typed, strictly increasing
	Temperatures      []Label // the columns, as typed, strictly increasing
	Blocks            []Block // one per weight, in file order
}

// Label is an axis value as typed, with its value in SI (m, K, kg).
type Label struct {
	Text         string
	SI           float64
	Line, Column int
}

// Block is one weight's figures: Rows[pressure altitude][temperature].
type Block struct {
	// Index is the block's position in the file's list of blocks (Section.weights),
	// or Single when the section holds one table without a list of weights (a climb
	// table for the MTOW): its rows are then the section's own Key.
	Index  int
	Weight Label
	Rows   [][]Cell
}

// Cell is one figure as typed, its value in the table's unit, and where it is.
type Cell struct {
	Text         string
	Value        float64
	Line, Column int
}

// Single is the Index of a table's only block when the section gives no list of
// weights.
const Single = -1

// Field names a cell as the loader's messages do: table.weights[1].to_50ft[2][3],
// or climb.rate_of_climb[2][3] for a section without a list of weights.
func (t *Table) Field(block, row, col int) string {
	return fmt.Sprintf("%s.%s[%d][%d]", t.BlockField(block), t.Key, row, col)
}

// BlockField names a block as the loader's messages do: table.weights[1], or the
// section itself (climb) when it gives no list of weights.
func (t *Table) BlockField(block int) string {
	if i := t.Blocks[block].Index; i != Single {
		return fmt.Sprintf("%s.weights[%d]", t.Section, i)
	}
	return t.Section
}

// Where names a cell's conditions in words: "1000 kg, 2000 ft, 20 C".
func (t *Table) Where(block, row, col int) string {
	return fmt.Sprintf("%s, %s, %s", t.Blocks[block].Weight.Text, t.PressureAltitudes[row].Text, t.Temperatures[col].Text)
}

// SameAxes reports whether u has the same pressure altitudes, temperatures and
// weights as t (so that both print side by side, like a manual's ground roll and
// total distance columns).
func (t *Table) SameAxes(u *Table) bool {
	if len(t.PressureAltitudes) != len(u.PressureAltitudes) || len(t.Temperatures) != len(u.Temperatures) || len(t.Blocks) != len(u.Blocks) {
		return false
	}
	for i := range t.PressureAltitudes {
		if t.PressureAltitudes[i].SI != u.PressureAltitudes[i].SI {
			return false
		}
	}
	for i := range t.Temperatures {
		if t.Temperatures[i].SI != u.Temperatures[i].SI {
			return false
		}
	}
	for i := range t.Blocks {
		if t.Blocks[i].Weight.SI != u.Blocks[i].Weight.SI {
			return false
		}
	}
	return true
}
