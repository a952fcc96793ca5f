package series

// buildSheet hands the rows of a sheet to FromCells.
func buildSheet(source, sheet string, rows []xrow, wb *workbook) (*Frame, error) {
	out := make([]CellRow, len(rows))
	for i, r := range rows {
		cells := make([]Cell, len(r.cells))
		for j, c := range r.cells {
			cells[j] = Cell{Text: c.text, Number: c.num, IsNumber: c.isNum, DateFormat: c.isDate}
			if c.isNum {
				cells[j].Day, _ = serialDay(c.num, wb.date1904)
			}
		}
		out[i] = CellRow{Line: r.n, Cells: cells}
	}
	return FromCells(source, sheet, out)
}
