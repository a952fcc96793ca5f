package series

import (
	"math"
	"time"
)

// buildSheet applies the table rules to the rows of a sheet.
func buildSheet(source, sheet string, rows []xrow, wb *workbook) (*Frame, error) {
	t := newTable(source)
	if len(rows) == 0 {
		return nil, t.errf(0, "", "sheet %q is empty: expected a header row naming the columns", sheet)
	}
	head := rows[0]
	names := make([]string, len(head.cells))
	for j, c := range head.cells {
		names[j] = c.text
	}
	if err := t.setHeader(names, head.n); err != nil {
		return nil, err
	}
	data := rows[1:]
	if len(data) == 0 {
		return nil, t.errf(0, "", "sheet %q: no data rows below the header", sheet)
	}
	width := len(names)
	for _, r := range data {
		for j := width; j < len(r.cells); j++ {
			if r.cells[j].text != "" {
				return nil, t.errf(r.n, "", "cell %s%d has a value but its column has no header", colName(j), r.n)
			}
		}
	}
	// the date column, judged on the first row as ReadCSV does
	first := make([]string, width)
	for j := range first {
		if j < len(data[0].cells) {
			first[j] = displayText(data[0].cells[j], wb.date1904)
		}
	}
	dateCol := chooseDateColumn(t.header, first)
	dates := make([]string, len(data))
	if dateCol >= 0 {
		serial := true
		days := make([]time.Time, len(data))
		for i, r := range data {
			var c xcell
			if dateCol < len(r.cells) {
				c = r.cells[dateCol]
			}
			day, ok := cellDay(c, wb.date1904)
			if ok {
				days[i] = day
				dates[i] = day.Format("2006-01-02")
			} else {
				serial = false
				dates[i] = c.text
			}
		}
		if serial {
			coarsen(days, dates)
		}
	}
	fields := make([]string, width)
	for i, r := range data {
		for j := range fields {
			fields[j] = ""
			if j < len(r.cells) {
				fields[j] = r.cells[j].text
			}
		}
		if dateCol >= 0 {
			fields[dateCol] = dates[i]
		}
		if err := t.addRow(fields, r.n); err != nil {
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

// displayText is the cell as a date text if it is a date number.
func displayText(c xcell, date1904 bool) string {
	if c.isDate {
		if d, ok := serialDay(c.num, date1904); ok {
			return d.Format("2006-01-02")
		}
	}
	return c.text
}

// cellDay reads a date-column cell as a spreadsheet date number: one
// shown as a date, or a whole number of at least five digits (a
// four-digit number is a year).
func cellDay(c xcell, date1904 bool) (time.Time, bool) {
	if !c.isNum {
		return time.Time{}, false
	}
	if !c.isDate && (c.num != math.Trunc(c.num) || c.num < 10000) {
		return time.Time{}, false
	}
	return serialDay(c.num, date1904)
}

// coarsen rewrites the date texts at a coarser frequency when the days
// follow one convention: every day the first (or every day the last)
// of a year, of a quarter or of a month. One date alone stays a day.
func coarsen(days []time.Time, dates []string) {
	if len(days) < 2 {
		return
	}
	for _, f := range []Freq{Annual, Quarterly, Monthly} {
		for _, end := range []bool{false, true} {
			if allAt(days, f, end) {
				for i, d := range days {
					m := int(d.Month())
					sub := 1
					switch f {
					case Quarterly:
						sub = (m-1)/3 + 1
					case Monthly:
						sub = m
					}
					dates[i] = Date{Freq: f, Year: d.Year(), Sub: sub}.String()
				}
				return
			}
		}
	}
}

// allAt reports whether every day starts (or, with end, ends) a period
// of frequency f.
func allAt(days []time.Time, f Freq, end bool) bool {
	step := 12 / f.PerYear()
	for _, d := range days {
		m := int(d.Month())
		if end {
			if (m%step) != 0 || d.AddDate(0, 0, 1).Day() != 1 {
				return false
			}
		} else if (m-1)%step != 0 || d.Day() != 1 {
			return false
		}
	}
	return true
}
