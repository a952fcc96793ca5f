package series

import (
	"math"
	"time"
)

// Cell is one spreadsheet cell as a workbook reader extracted it. Only
// the reader knows the file format; FromCells applies the rules.
type Cell struct {
	// Text is the cell's text, or a number as written in the file; ""
	// for an empty cell. An error cell #N/A should be passed as "NA".
	Text string
	// Number is the value of a number cell; IsNumber says it is one.
	Number   float64
	IsNumber bool
	// Day is the calendar day of Number read as a spreadsheet date
	// serial in the workbook's date system (time of day dropped), or
	// the zero time when the number is no valid serial.
	Day time.Time
	// DateFormat is set when the cell's number format shows a date.
	DateFormat bool
}

// CellRow is one non-empty row of a sheet and its 1-based row number.
type CellRow struct {
	Line  int
	Cells []Cell
}

// FromCells builds a Frame from the non-empty rows of one spreadsheet
// sheet with the rules of ReadCSV: rows[0] is the header, each further
// row an observation; Frame.Lines and DataError.Line are the rows'
// Line numbers and Frame.Sheet is sheet. A value beyond the header's
// last column is an error; a row shorter than the header is padded
// with empty (missing) cells.
//
// The date column is chosen as ReadCSV chooses it, a date-formatted
// first cell counting as its date. Its cells may be text in any form
// ParseDate accepts, or date serials: numbers whose format shows a
// date, and whole numbers of five or more digits (a four-digit number
// is a year). Serials are calendar dates: as in ReadCSV, they become
// annual, quarterly or monthly periods when they date one period each
// on one rule.
func FromCells(source, sheet string, rows []CellRow) (*Frame, error) {
	return FromCellsAs(source, sheet, rows, Undated)
}

// FromCellsAs is FromCells with the frequency declared by the caller
// (see ReadCSVAs); Undated infers it.
func FromCellsAs(source, sheet string, rows []CellRow, freq Freq) (*Frame, error) {
	t := newTable(source, freq)
	if len(rows) == 0 {
		return nil, t.errf(0, "", "sheet %q is empty: expected a header row naming the columns", sheet)
	}
	head := rows[0]
	names := make([]string, len(head.Cells))
	for j, c := range head.Cells {
		names[j] = c.Text
	}
	if err := t.setHeader(names, head.Line); err != nil {
		return nil, err
	}
	data := rows[1:]
	if len(data) == 0 {
		return nil, t.errf(0, "", "sheet %q: no data rows below the header", sheet)
	}
	width := len(names)
	for _, r := range data {
		for j := width; j < len(r.Cells); j++ {
			if r.Cells[j].Text != "" {
				return nil, t.errf(r.Line, "", "cell %s%d has a value but its column has no header", colName(j), r.Line)
			}
		}
	}
	// the date column, judged on the first row as ReadCSV does
	first := make([]string, width)
	for j := range first {
		if j < len(data[0].Cells) {
			first[j] = displayText(data[0].Cells[j])
		}
	}
	dateCol := chooseDateColumn(t.header, first)
	dates := make([]string, len(data))
	if dateCol >= 0 {
		for i, r := range data {
			var c Cell
			if dateCol < len(r.Cells) {
				c = r.Cells[dateCol]
			}
			if serialDate(c) {
				dates[i] = c.Day.Format("2006-01-02")
			} else {
				dates[i] = c.Text
			}
		}
	}
	fields := make([]string, width)
	for i, r := range data {
		for j := range fields {
			fields[j] = ""
			if j < len(r.Cells) {
				fields[j] = r.Cells[j].Text
			}
		}
		if dateCol >= 0 {
			fields[dateCol] = dates[i]
		}
		if err := t.addRow(fields, r.Line); err != nil {
			return nil, err
		}
	}
	f, err := t.finish()
	if err != nil {
		return nil, err
	}
	f.Sheet = sheet
	return f, nil
}

// displayText is the cell as a date text if it is a date-formatted
// serial, else its text.
func displayText(c Cell) string {
	if c.IsNumber && c.DateFormat && !c.Day.IsZero() {
		return c.Day.Format("2006-01-02")
	}
	return c.Text
}

// serialDate reports whether a date-column cell is read as a date
// serial: a valid one that is shown as a date, or a whole number of at
// least five digits.
func serialDate(c Cell) bool {
	if !c.IsNumber || c.Day.IsZero() {
		return false
	}
	return c.DateFormat || (c.Number == math.Trunc(c.Number) && c.Number >= 10000)
}

// colName writes a 0-based column index as spreadsheet letters:
// 0 → A, 27 → AB.
func colName(col int) string {
	s := ""
	for col++; col > 0; col = (col - 1) / 26 {
		s = string(rune('A'+(col-1)%26)) + s
	}
	return s
}
