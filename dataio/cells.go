package dataio

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"

	"github.com/galley-econ/galley/analysis/series"
)

// rows returns the non-empty rows of the worksheet part name with their
// row numbers, each cell interpreted for series.FromCells.
func (b *book) rows(name string) ([]series.CellRow, error) {
	var out []series.CellRow
	err := b.sheetRows(name, func(n int, cells []rawCell) error {
		row := series.CellRow{Line: n}
		for _, rc := range cells {
			s := rc.value
			if rc.typ == "s" && s != "" {
				k, err := strconv.Atoi(strings.TrimSpace(s))
				if err != nil || k < 0 || k >= len(b.strings) {
					return fmt.Errorf("cell %s%d: shared string %q is not in the workbook", colName(rc.col), n, s)
				}
				s = b.strings[k]
			}
			if s == "" {
				continue
			}
			c, err := b.cell(rc, n, s)
			if err != nil {
				return err
			}
			for len(row.Cells) <= rc.col {
				row.Cells = append(row.Cells, series.Cell{})
			}
			row.Cells[rc.col] = c
		}
		if len(row.Cells) > 0 {
			out = append(out, row)
		}
		return nil
	})
	return out, err
}

// cell interprets the text s of the stored cell rc of row n by its type:
// an error cell #N/A is a missing value; a date-time cell (t="d", ISO
// 8601) gives its date; text of any kind (shared, inline, a formula's
// string, TRUE/FALSE stored as 1/0) stays text; a number is a number,
// with its calendar day as a date serial and whether its style shows a
// date.
func (b *book) cell(rc rawCell, n int, s string) (series.Cell, error) {
	switch rc.typ {
	case "e":
		if s == "#N/A" {
			return series.Cell{Text: "NA"}, nil
		}
		return series.Cell{Text: s}, nil
	case "d": // ISO 8601 date-time
		if len(s) >= 10 {
			s = s[:10]
		}
		return series.Cell{Text: s}, nil
	case "s", "inlineStr", "str", "b":
		return series.Cell{Text: s}, nil
	}
	v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err != nil {
		return series.Cell{Text: s}, nil // reported as not a number later
	}
	c := series.Cell{Text: s, Number: v, IsNumber: true}
	c.Day, _ = serialDay(v, b.date1904)
	if rc.style > 0 {
		c.DateFormat, err = b.isDate(rc.style)
		if err != nil {
			return series.Cell{}, fmt.Errorf("cell %s%d: %v", colName(rc.col), n, err)
		}
	}
	return c, nil
}

// serialDay converts a spreadsheet date serial to its calendar day,
// dropping the time of day. By common practice the 1900 date system
// counts 1900-01-01 as day 1 and keeps a nonexistent 1900-02-29 as day
// 60, which is refused here, so that from day 61 on serial n is n days
// after 1899-12-30; the 1904 system counts 1904-01-01 as day 0. Serials
// below 1 and days after 9999-12-31 are refused.
func serialDay(v float64, date1904 bool) (time.Time, bool) {
	if !(v >= 1 && v < 2958466) {
		return time.Time{}, false
	}
	n := int(math.Floor(v))
	var t time.Time
	switch {
	case date1904:
		t = time.Date(1904, 1, 1, 0, 0, 0, 0, time.UTC).AddDate(0, 0, n)
	case n < 60:
		t = time.Date(1899, 12, 31, 0, 0, 0, 0, time.UTC).AddDate(0, 0, n)
	case n == 60:
		return time.Time{}, false
	default:
		t = time.Date(1899, 12, 30, 0, 0, 0, 0, time.UTC).AddDate(0, 0, n)
	}
	if t.Year() > 9999 {
		return time.Time{}, false
	}
	return t, true
}
