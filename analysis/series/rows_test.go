package series

import (
	"testing"
	"time"
)

func day(y, m, d int) time.Time { return time.Date(y, time.Month(m), d, 0, 0, 0, 0, time.UTC) }

// txt, num and serial make the cells a workbook reader would pass on.
func txt(s string) Cell { return Cell{Text: s} }
func num(s string, v float64) Cell {
	return Cell{Text: s, Number: v, IsNumber: true}
}
func serial(s string, v float64, d time.Time, shown bool) Cell {
	return Cell{Text: s, Number: v, IsNumber: true, Day: d, DateFormat: shown}
}

func sheetRows(rows ...[]Cell) []CellRow {
	out := make([]CellRow, len(rows))
	for i, r := range rows {
		out[i] = CellRow{Line: i + 2, Cells: r} // header on row 2
	}
	return out
}

func TestFromCells(t *testing.T) {
	// The serial numbers are only labels here (the reader converts
	// them); the days are chosen by hand to test each convention.
	tests := []struct {
		name        string
		rows        []CellRow
		freq        Freq
		dates       []string
		x           []float64
		lines       []int
		sheet, head string
	}{
		{"text dates", sheetRows(
			[]Cell{txt("date"), txt("x")},
			[]Cell{txt("2001Q4"), num("1", 1)},
			[]Cell{txt("2002Q1"), txt("NA")},
		), Quarterly, []string{"2001Q4", "2002Q1"}, []float64{1, nan}, []int{3, 4}, "S", "x"},
		{"shown days stay days", sheetRows(
			[]Cell{txt("date"), txt("x")},
			[]Cell{serial("1", 1, day(2020, 3, 2), true), num("5", 5)},
			[]Cell{serial("2", 2, day(2020, 3, 4), true), num("6", 6)},
		), Daily, []string{"2020-03-02", "2020-03-04"}, []float64{5, 6}, []int{3, 4}, "S", "x"},
		{"month starts", sheetRows(
			[]Cell{txt("Period"), txt("x")},
			[]Cell{serial("1", 1, day(2010, 12, 1), true), num("5", 5)},
			[]Cell{serial("2", 2, day(2011, 1, 1), true), num("6", 6)},
		), Monthly, []string{"2010-12", "2011-01"}, []float64{5, 6}, []int{3, 4}, "S", "x"},
		{"quarter ends", sheetRows(
			[]Cell{txt("date"), txt("x")},
			[]Cell{serial("1", 1, day(1999, 12, 31), true), num("5", 5)},
			[]Cell{serial("2", 2, day(2000, 3, 31), true), num("6", 6)},
		), Quarterly, []string{"1999Q4", "2000Q1"}, []float64{5, 6}, []int{3, 4}, "S", "x"},
		{"unformatted five-digit serials are dates", sheetRows(
			[]Cell{txt("date"), txt("x")},
			[]Cell{serial("36526", 36526, day(2000, 1, 1), false), num("5", 5)},
			[]Cell{serial("36892", 36892, day(2001, 1, 1), false), num("6", 6)},
		), Annual, []string{"2000", "2001"}, []float64{5, 6}, []int{3, 4}, "S", "x"},
		{"four-digit numbers are years", sheetRows(
			[]Cell{txt("date"), txt("x")},
			[]Cell{serial("1990", 1990, day(1905, 6, 12), false), num("5", 5)},
			[]Cell{serial("1991", 1991, day(1905, 6, 13), false), num("6", 6)},
		), Annual, []string{"1990", "1991"}, []float64{5, 6}, []int{3, 4}, "S", "x"},
		{"a date-formatted first cell marks the date column", sheetRows(
			[]Cell{txt("when"), txt("x")},
			[]Cell{serial("1", 1, day(2020, 3, 2), true), num("5", 5)},
			[]Cell{serial("2", 2, day(2020, 3, 3), true)}, // short row: x missing
		), Daily, []string{"2020-03-02", "2020-03-03"}, []float64{5, nan}, []int{3, 4}, "S", "x"},
	}
	for _, tc := range tests {
		f, err := FromCells("b.xlsx", tc.sheet, tc.rows)
		if err != nil {
			t.Errorf("%s: %v", tc.name, err)
			continue
		}
		got := make([]string, f.Len())
		for i, d := range f.Dates {
			got[i] = d.String()
		}
		x, _ := f.Column(tc.head)
		if f.Freq != tc.freq || len(got) != len(tc.dates) || !equalFloats(x, tc.x) || !equalInts(f.Lines, tc.lines) || f.Sheet != tc.sheet {
			t.Errorf("%s: %v %v %v %v %q", tc.name, f.Freq, got, x, f.Lines, f.Sheet)
			continue
		}
		for i := range got {
			if got[i] != tc.dates[i] {
				t.Errorf("%s: dates %v, want %v", tc.name, got, tc.dates)
				break
			}
		}
	}
}

func TestFromCellsErrors(t *testing.T) {
	tests := []struct {
		name string
		rows []CellRow
		want string
	}{
		{"empty", nil, `b.xlsx: sheet "S" is empty: expected a header row naming the columns`},
		{"header only", sheetRows([]Cell{txt("date"), txt("x")}), `b.xlsx: sheet "S": no data rows below the header`},
		{"stray cell", sheetRows(
			[]Cell{txt("date")},
			[]Cell{txt("1990"), {}, num("1", 1)},
		), "b.xlsx:3: cell C3 has a value but its column has no header"},
		{"serial among text dates", sheetRows(
			[]Cell{txt("date"), txt("x")},
			[]Cell{txt("2000-01-01"), num("1", 1)},
			[]Cell{serial("36527", 36527, day(2000, 1, 2), true), num("1", 1)},
			[]Cell{txt("2000-01-01"), num("1", 1)},
		), "b.xlsx:5: column date: date 2000-01-01 appears twice, on lines 3 and 5"},
		{"text value", sheetRows(
			[]Cell{txt("date"), txt("x")},
			[]Cell{txt("1990"), txt("#DIV/0!")},
		), `b.xlsx:3: column x: not a number: "#DIV/0!"`},
		{"duplicate name", sheetRows(
			[]Cell{txt("date"), txt("x"), txt("x")},
			[]Cell{txt("1990"), num("1", 1), num("2", 2)},
		), `b.xlsx:2: header: name "x" is used by columns 2 and 3`},
	}
	for _, tc := range tests {
		_, err := FromCells("b.xlsx", "S", tc.rows)
		if err == nil || err.Error() != tc.want {
			t.Errorf("%s:\n got %v\nwant %s", tc.name, err, tc.want)
		}
	}
}

func TestColName(t *testing.T) {
	// spreadsheet column letters: A…Z, then AA…AZ, BA…; 16383 is XFD,
	// the last column of the format
	for col, want := range map[int]string{0: "A", 25: "Z", 26: "AA", 27: "AB", 51: "AZ", 52: "BA", 701: "ZZ", 702: "AAA", 16383: "XFD"} {
		if got := colName(col); got != want {
			t.Errorf("colName(%d) = %s, want %s", col, got, want)
		}
	}
}
