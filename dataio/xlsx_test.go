package dataio

import (
	"math"
	"os"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/series"
)

// The workbooks are written by github.com/xuri/excelize/v2 through
// testdata/series/genxlsx (see its comments for the contents); ReadXLSX
// reads them with galley's own reader (ooxml.go), so these tests check
// the decoding, the cell interpretation and the rules of
// series.FromCells on real workbooks (excelize_ref_test.go compares the
// frames with those excelize reads).
func readBook(t *testing.T, name, sheet string) (*series.Frame, error) {
	t.Helper()
	fh, err := os.Open("../testdata/series/" + name)
	if err != nil {
		t.Fatal(err)
	}
	defer fh.Close()
	return ReadXLSX(fh, name, sheet)
}

func TestReadXLSX(t *testing.T) {
	tests := []struct {
		file, sheet string
		freq        series.Freq
		first, last string
		n           int
		col         string
		want0       float64
	}{
		{"quarterly.xlsx", "Data", series.Quarterly, "2001Q1", "2003Q4", 12, "output", 100},
		{"serial_monthly.xlsx", "", series.Monthly, "2010-01", "2011-06", 18, "output", 100},
		{"serial_daily.xlsx", "", series.Daily, "2020-03-02", "2020-03-13", 10, "price", 52},
		{"quarter_end.xlsx", "Sheet1", series.Quarterly, "1999Q3", "2000Q4", 6, "x", 1},
		{"plain_serial.xlsx", "", series.Annual, "2000", "2002", 3, "x", 0.5},
	}
	for _, tc := range tests {
		f, err := readBook(t, tc.file, tc.sheet)
		if err != nil {
			t.Errorf("%s: %v", tc.file, err)
			continue
		}
		if f.Freq != tc.freq || f.Len() != tc.n || f.Dates[0].String() != tc.first || f.Dates[f.Len()-1].String() != tc.last {
			t.Errorf("%s: got %v, %d rows, %v…%v", tc.file, f.Freq, f.Len(), f.Dates[0], f.Dates[f.Len()-1])
		}
		v, ok := f.Column(tc.col)
		if !ok || v[0] != tc.want0 {
			t.Errorf("%s: %s[0] = %v", tc.file, tc.col, v)
		}
		if f.Lines[0] != 2 {
			t.Errorf("%s: first data row %d, want 2", tc.file, f.Lines[0])
		}
	}
}

func TestReadXLSXQuarterlyValues(t *testing.T) {
	f, err := readBook(t, "quarterly.xlsx", "Data")
	if err != nil {
		t.Fatal(err)
	}
	rate, _ := f.Column("rate")
	out, _ := f.Column("output")
	// row 7 (2002Q2, index 5) has no rate; output = 100 + 1.5 i
	for i := range rate {
		if i == 5 {
			if !math.IsNaN(rate[i]) {
				t.Errorf("rate[5] = %v, want missing", rate[i])
			}
			continue
		}
		if math.Abs(rate[i]-(2+float64(i)/10)) > 1e-12 || out[i] != 100+1.5*float64(i) {
			t.Errorf("row %d: rate %v output %v", i, rate[i], out[i])
		}
	}
	if f.Sheet != "Data" || f.Names[0] != "output" {
		t.Errorf("sheet %q names %v", f.Sheet, f.Names)
	}
}

func TestReadXLSXErrors(t *testing.T) {
	tests := []struct{ file, sheet, want string }{
		{"quarterly.xlsx", "Sheet9", `quarterly.xlsx: no sheet "Sheet9"; the sheets are "Notes", "Data"`},
		{"bad_text.xlsx", "", `bad_text.xlsx:5: column rate: not a number: "n/a?"`},
		{"quarterly.xlsx", "", `quarterly.xlsx: sheet "Notes": no data rows below the header`},
	}
	for _, tc := range tests {
		_, err := readBook(t, tc.file, tc.sheet)
		if err == nil || err.Error() != tc.want {
			t.Errorf("%s %q: got %v\nwant %s", tc.file, tc.sheet, err, tc.want)
		}
	}
	_, err := ReadXLSX(strings.NewReader("date,x\n1990,1\n"), "x.xlsx", "")
	if err == nil || !strings.HasPrefix(err.Error(), "x.xlsx: not an .xlsx workbook: ") {
		t.Errorf("got %v", err)
	}
}
