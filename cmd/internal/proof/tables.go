package proof

import (
	"fmt"
	"sort"
	"strings"

	"kneeprint/cmd/internal/typedtable"
)

// cellKey names one cell of one table.
type cellKey struct {
	t       *typedtable.Table
	b, p, k int
}

// flaggedCells collects the outliers of every table, by cell.
func flaggedCells(tables []*typedtable.Table) (map[cellKey]typedtable.Outlier, []cellKey) {
	m := map[cellKey]typedtable.Outlier{}
	var order []cellKey
	for _, t := range tables {
		for _, o := range typedtable.Outliers(t) {
			k := cellKey{t, o.Block, o.Row, o.Col}
			m[k] = o
			order = append(order, k)
		}
	}
	return m, order
}

// groupByAxes puts tables with the same axes together, in order, so that a manual's
// ground roll and total distance print side by side.
func groupByAxes(tables []*typedtable.Table) [][]*typedtable.Table {
	var groups [][]*typedtable.Table
	for _, t := range tables {
		placed := false
		for i, g := range groups {
			if g[0].SameAxes(t) && g[0].Section == t.Section {
				groups[i] = append(groups[i], t)
				placed = true
				break
			}
		}
		if !placed {
			groups = append(groups, []*typedtable.Table{t})
		}
	}
	return groups
}

// Geometry of the manual-like table, mm.
const (
	altColMM    = 18.0 // the pressure-altitude column
	linesColMM  = 16.0 // the file lines of each printed row
	figurePt    = 8.5  // the figures: at least the sheet's 8 pt floor
	minCellMM   = 10.0 // narrower cells split the table
	rowMM       = 5.5
	tickBoxMM   = 2.2
	flagFrameMM = 0.7
)

// manualTables prints a group of tables sharing their axes as a flight manual prints
// them: one block per weight (in the file's order), rows of pressure altitude,
// columns of temperature, and under each temperature one column per quantity; every
// figure exactly as typed with a box to tick, and at the right the file lines the
// printed row was read from. A flagged cell has a heavy frame, a bold figure and an
// exclamation mark (no colour: the sheet is read in grey too).
func (s *sheet) manualTables(group []*typedtable.Table, flagged map[cellKey]typedtable.Outlier) {
	t0 := group[0]
	avail := s.width() - altColMM - linesColMM
	nq, nt := len(group), len(t0.Temperatures)
	// A cell holds its tick box and the widest figure, in bold with its mark.
	s.font(figurePt, true)
	need := minCellMM
	for _, t := range group {
		for _, bl := range t.Blocks {
			for _, row := range bl.Rows {
				for _, c := range row {
					need = max(need, 0.6+tickBoxMM+0.8+s.pdf.GetStringWidth(c.Text+"!")+0.8)
				}
			}
		}
	}
	if nq > 1 && avail/float64(nq*nt) < need {
		for _, t := range group { // too wide side by side: one quantity at a time
			s.manualTables([]*typedtable.Table{t}, flagged)
		}
		return
	}
	perChunk := max(1, int(avail/(need*float64(nq))))
	var names []string
	for _, t := range group {
		names = append(names, t.Quantity)
	}
	what := strings.Join(names, " and ")
	for b, bl := range t0.Blocks {
		for c0 := 0; c0 < nt; c0 += perChunk {
			cols := min(nt-c0, perChunk)
			cellW := min(avail/float64(nq*cols), 22)
			s.ensure(8 + 2*4.5 + float64(len(t0.PressureAltitudes))*rowMM + 4)
			s.font(bodyPt+1, true)
			part := ""
			if nt > perChunk {
				part = fmt.Sprintf(" (temperatures %d to %d of %d)", c0+1, c0+cols, nt)
			}
			where := fmt.Sprintf("%s, line %d", t0.BlockField(b), bl.Weight.Line)
			switch {
			case bl.Index == typedtable.Single && bl.Weight.Line > 0:
				where = fmt.Sprintf("%s.%s, the MTOW on line %d", t0.Section, t0.Key, bl.Weight.Line)
			case bl.Index == typedtable.Single:
				where = fmt.Sprintf("%s.%s", t0.Section, t0.Key)
			}
			s.pdf.MultiCell(s.width(), 5, fmt.Sprintf("%s: %s, %s%s (%s)", bl.Weight.Text, what, t0.Unit, part, where), "", "L", false)
			x0, y := s.margin, s.pdf.GetY()+0.5
			s.pdf.SetLineWidth(0.2)
			// Header: temperatures over their quantity columns.
			s.font(smallPt, true)
			s.pdf.SetFillColor(225, 225, 225)
			s.pdf.Rect(x0, y, altColMM, 9, "FD")
			s.pdf.SetXY(x0, y+0.5)
			s.pdf.MultiCell(altColMM, 4, "pressure altitude", "", "C", false)
			x := x0 + altColMM
			for k := c0; k < c0+cols; k++ {
				s.pdf.Rect(x, y, cellW*float64(nq), 4.5, "FD")
				s.pdf.SetXY(x, y)
				s.pdf.CellFormat(cellW*float64(nq), 4.5, t0.Temperatures[k].Text, "", 0, "C", false, 0, "")
				for q := range group {
					s.pdf.Rect(x+float64(q)*cellW, y+4.5, cellW, 4.5, "FD")
					s.pdf.SetXY(x+float64(q)*cellW, y+4.5)
					s.pdf.CellFormat(cellW, 4.5, group[q].Short, "", 0, "C", false, 0, "")
				}
				x += cellW * float64(nq)
			}
			s.pdf.Rect(x, y, linesColMM, 9, "FD")
			s.pdf.SetXY(x, y)
			s.pdf.CellFormat(linesColMM, 9, "file lines", "", 0, "C", false, 0, "")
			y += 9
			// Rows.
			for p, pa := range t0.PressureAltitudes {
				s.font(bodyPt, true)
				s.pdf.Rect(x0, y, altColMM, rowMM, "D")
				s.pdf.SetXY(x0, y)
				s.pdf.CellFormat(altColMM-1, rowMM, pa.Text, "", 0, "R", false, 0, "")
				x := x0 + altColMM
				var lines []string
				for _, t := range group {
					if row := t.Blocks[b].Rows[p]; len(row) > 0 {
						lines = append(lines, fmt.Sprint(row[0].Line))
					}
				}
				for k := c0; k < c0+cols; k++ {
					for q, t := range group {
						cell := t.Blocks[b].Rows[p][k]
						cx := x + float64(q)*cellW
						s.pdf.SetLineWidth(0.2)
						s.pdf.Rect(cx, y, cellW, rowMM, "D")
						// The box to tick.
						s.pdf.Rect(cx+0.6, y+(rowMM-tickBoxMM)/2, tickBoxMM, tickBoxMM, "D")
						text := cell.Text
						_, isFlagged := flagged[cellKey{t, b, p, k}]
						s.font(figurePt, isFlagged)
						if isFlagged {
							text += "!"
							s.pdf.SetLineWidth(flagFrameMM)
							s.pdf.Rect(cx+flagFrameMM/2, y+flagFrameMM/2, cellW-flagFrameMM, rowMM-flagFrameMM, "D")
							s.pdf.SetLineWidth(0.2)
						}
						// Right-aligned, 0.8 mm from the cell's edge, on the row's baseline.
						s.pdf.Text(cx+cellW-0.8-s.pdf.GetStringWidth(text), y+rowMM/2+figurePt*0.35/2.5, text)
					}
					x += cellW * float64(nq)
				}
				s.font(smallPt, false)
				s.pdf.Rect(x, y, linesColMM, rowMM, "D")
				s.pdf.SetXY(x, y)
				s.pdf.CellFormat(linesColMM, rowMM, strings.Join(lines, ", "), "", 0, "C", false, 0, "")
				y += rowMM
			}
			s.pdf.SetXY(s.margin, y+3)
		}
	}
}

// outlierRows lists the flagged cells for the sheet's table of suspicious cells, in
// file order.
func outlierRows(flagged map[cellKey]typedtable.Outlier, order []cellKey) [][]string {
	sort.SliceStable(order, func(i, j int) bool {
		a, b := flagged[order[i]].Cell, flagged[order[j]].Cell
		return a.Line < b.Line || a.Line == b.Line && a.Column < b.Column
	})
	var rows [][]string
	for _, k := range order {
		o := flagged[k]
		var pred []string
		for _, d := range o.Deviations {
			pred = append(pred, fmt.Sprintf("%.0f along %s (%+.1f %%)", d.Expected, d.Axis, d.Pct))
		}
		rows = append(rows, []string{
			fmt.Sprintf("%d:%d", o.Cell.Line, o.Cell.Column),
			k.t.Field(k.b, k.p, k.k),
			fmt.Sprintf("%s, %s", k.t.Quantity, k.t.Where(k.b, k.p, k.k)),
			o.Cell.Text,
			strings.Join(pred, "; "),
		})
	}
	return rows
}
