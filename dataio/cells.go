package dataio

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"

	"github.com/galley-econ/galley/analysis/series"
	"github.com/xuri/excelize/v2"
)

// sheetReader extracts the cells of one worksheet for series.FromCells.
type sheetReader struct {
	f         *excelize.File
	sheet     string
	date1904  bool
	dateStyle map[int]bool // by cell style index: the style shows a date
}

// raw asks excelize for the values as stored, without number formats.
var raw = excelize.Options{RawCellValue: true}

// rows returns the non-empty rows of the sheet with their row numbers.
func (sr *sheetReader) rows() ([]series.CellRow, error) {
	// The iterator streams the worksheet as stored; it must be opened
	// before the cell queries below load the sheet into memory, or it
	// would stream a re-encoded copy.
	it, err := sr.f.Rows(sr.sheet)
	if err != nil {
		return nil, err
	}
	// The iterator stops silently at malformed XML; loading the sheet
	// (as the cell queries do) reports it.
	if _, err := sr.f.GetCellType(sr.sheet, "A1"); err != nil {
		it.Close()
		return nil, err
	}
	var out []series.CellRow
	n := 0
	for it.Next() {
		n++
		texts, err := it.Columns(raw)
		if err != nil {
			it.Close()
			return nil, fmt.Errorf("row %d: %v", n, err)
		}
		row := series.CellRow{Line: n}
		for j, s := range texts {
			if s == "" {
				continue
			}
			c, err := sr.cell(j, n, s)
			if err != nil {
				it.Close()
				return nil, err
			}
			for len(row.Cells) < j {
				row.Cells = append(row.Cells, series.Cell{})
			}
			row.Cells = append(row.Cells, c)
		}
		if len(row.Cells) > 0 {
			out = append(out, row)
		}
	}
	if err := it.Close(); err != nil {
		return nil, err
	}
	return out, nil
}

// cell interprets the stored text s of the cell in 0-based column col
// of row n.
func (sr *sheetReader) cell(col, n int, s string) (series.Cell, error) {
	ref, err := excelize.CoordinatesToCellName(col+1, n)
	if err != nil {
		return series.Cell{}, err
	}
	typ, err := sr.f.GetCellType(sr.sheet, ref)
	if err != nil {
		return series.Cell{}, fmt.Errorf("cell %s: %v", ref, err)
	}
	switch typ {
	case excelize.CellTypeError:
		if s == "#N/A" {
			return series.Cell{Text: "NA"}, nil
		}
		return series.Cell{Text: s}, nil
	case excelize.CellTypeDate: // ISO 8601 date-time
		if len(s) >= 10 {
			s = s[:10]
		}
		return series.Cell{Text: s}, nil
	case excelize.CellTypeUnset, excelize.CellTypeNumber:
	default: // text of any kind, and TRUE/FALSE stored as 1/0
		return series.Cell{Text: s}, nil
	}
	v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err != nil {
		return series.Cell{Text: s}, nil // reported as not a number later
	}
	c := series.Cell{Text: s, Number: v, IsNumber: true}
	c.Day, _ = serialDay(v, sr.date1904)
	style, err := sr.f.GetCellStyle(sr.sheet, ref)
	if err != nil {
		return series.Cell{}, fmt.Errorf("cell %s: %v", ref, err)
	}
	if style > 0 {
		c.DateFormat, err = sr.isDateStyle(style)
		if err != nil {
			return series.Cell{}, fmt.Errorf("cell %s: %v", ref, err)
		}
	}
	return c, nil
}

// isDateStyle reports (once per style) whether the number format of a
// cell style shows a date.
func (sr *sheetReader) isDateStyle(id int) (bool, error) {
	if d, ok := sr.dateStyle[id]; ok {
		return d, nil
	}
	st, err := sr.f.GetStyle(id)
	if err != nil {
		return false, err
	}
	d := false
	if st.CustomNumFmt != nil {
		d = dateFormatCode(*st.CustomNumFmt)
	} else {
		d = builtinDateFmt(st.NumFmt)
	}
	sr.dateStyle[id] = d
	return d, nil
}

// serialDay converts a spreadsheet date serial to its calendar day with
// excelize.ExcelDateToTime, dropping the time of day. By common practice
// the 1900 date system counts 1900-01-01 as day 1 and keeps a
// nonexistent 1900-02-29 as day 60, which is refused here; the 1904
// system counts 1904-01-01 as day 0. Serials below 1 and days after
// 9999-12-31 are refused.
func serialDay(v float64, date1904 bool) (time.Time, bool) {
	if !(v >= 1 && v < 2958466) {
		return time.Time{}, false
	}
	n := math.Floor(v)
	if !date1904 && n == 60 {
		return time.Time{}, false
	}
	t, err := excelize.ExcelDateToTime(n, date1904)
	if err != nil || t.Year() > 9999 {
		return time.Time{}, false
	}
	y, m, d := t.Date()
	return time.Date(y, m, d, 0, 0, 0, 0, time.UTC), true
}
