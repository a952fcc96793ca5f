package dataio

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/xuri/excelize/v2"

	"github.com/galley-econ/galley/analysis/series"
)

// The reference for galley's workbook reader (ooxml.go) is
// github.com/xuri/excelize/v2 (the version in go.mod), which galley
// read workbooks with before: readWithExcelize is that reader, kept
// here as the reference, and TestReaderMatchesExcelize reads every
// committed workbook, every hand-made one and every sheet with both.

func readWithExcelize(r io.Reader, source, sheet string, freq series.Freq) (fr *series.Frame, err error) {
	bad := func(format string, args ...any) error {
		return &series.DataError{Source: source, Msg: fmt.Sprintf(format, args...)}
	}
	defer func() {
		if p := recover(); p != nil {
			fr, err = nil, bad("not a readable .xlsx workbook: %v", p)
		}
	}()
	b, err := io.ReadAll(r)
	if err != nil {
		return nil, err
	}
	if err := checkBounds(b); err != nil {
		return nil, bad("%v", err)
	}
	f, err := excelize.OpenReader(bytes.NewReader(b), excelize.Options{UnzipSizeLimit: maxExpanded})
	if err != nil {
		return nil, bad("not an .xlsx workbook: %v", err)
	}
	defer f.Close()
	props, err := f.GetWorkbookProps()
	if err != nil {
		return nil, bad("not a readable .xlsx workbook: %v", err)
	}
	sheets := f.GetSheetList()
	if len(sheets) == 0 {
		return nil, bad("the workbook has no sheets")
	}
	name, ok := chooseSheet(sheets, sheet)
	if !ok {
		return nil, bad("no sheet %q; the sheets are %s", sheet, quoteAll(sheets))
	}
	rd := &exSheetReader{f: f, sheet: name, date1904: props.Date1904 != nil && *props.Date1904, dateStyle: map[int]bool{}}
	rows, err := rd.rows()
	if err != nil {
		return nil, bad("sheet %q: %v", name, err)
	}
	return series.FromCellsAs(source, name, rows, freq)
}

// exSheetReader extracts the cells of one worksheet for series.FromCells.
type exSheetReader struct {
	f         *excelize.File
	sheet     string
	date1904  bool
	dateStyle map[int]bool // by cell style index: the style shows a date
}

// raw asks excelize for the values as stored, without number formats.
var exRaw = excelize.Options{RawCellValue: true}

// rows returns the non-empty rows of the sheet with their row numbers.
func (sr *exSheetReader) rows() ([]series.CellRow, error) {
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
		texts, err := it.Columns(exRaw)
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
func (sr *exSheetReader) cell(col, n int, s string) (series.Cell, error) {
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
	c.Day, _ = exSerialDay(v, sr.date1904)
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
func (sr *exSheetReader) isDateStyle(id int) (bool, error) {
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

func exSerialDay(v float64, date1904 bool) (time.Time, bool) {
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

// TestReaderMatchesExcelize: for every committed workbook (testdata
// series and bad inputs) and the hand-made ones of
// xlsx_handmade_test.go, every sheet (and the default sheet) read by
// galley's reader and by excelize gives the same frame — dates, names,
// rows, values bit for bit — or both give an error.
func TestReaderMatchesExcelize(t *testing.T) {
	books := map[string][]byte{}
	for _, pat := range []string{"../testdata/series/*.xlsx", "../testdata/bad/*/*.xlsx"} {
		files, _ := filepath.Glob(pat)
		for _, f := range files {
			b, err := os.ReadFile(f)
			if err != nil {
				t.Fatal(err)
			}
			books[f] = b
		}
	}
	if len(books) < 8 {
		t.Fatalf("found %d workbooks", len(books))
	}
	sheet := sheetHead +
		`<row r="2"><c r="A2" t="s"><v>0</v></c><c r="B2" t="s"><v>1</v></c></row>` +
		`<row r="3"><c r="A3" s="1"><v>36526</v></c><c r="B3" s="2"><v>1.5E+2</v></c></row>` +
		`<row r="4"><c r="A4" s="1"><v>36527</v></c><c r="B4" t="e"><v>#N/A</v></c></row>` +
		`<row r="5"><c r="A5" s="1"><v>36528</v></c><c r="B5" t="inlineStr"><is><t>7</t></is></c></row>` +
		sheetTail
	books["hand-made 1900"] = makeBook(t, false, sheet)
	books["hand-made 1904"] = makeBook(t, true, sheet)
	books["hand-made no r"] = makeBook(t, false, sheetHead+
		`<row><c t="inlineStr"><is><t>date</t></is></c><c t="inlineStr"><is><r><t>x</t></r><rPh><t>y</t></rPh></is></c></row>`+
		`<row><c><v>1990</v></c><c t="str"><v>2.5</v></c></row>`+
		`<row><c><v>1991</v></c><c t="b"><v>1</v></c></row>`+
		`<row><c><v>1992</v></c><c t="n"><v> 4 </v></c></row>`+sheetTail)
	books["hand-made gaps"] = makeBook(t, false, sheetHead+
		`<row r="1"><c r="A1" t="inlineStr"><is><t>date</t></is></c><c r="C1" t="inlineStr"><is><t>z</t></is></c></row>`+
		`<row r="4"><c r="A4" t="d"><v>2001-01-01T00:00:00</v></c><c r="C4"><v>3</v></c></row>`+
		`<row r="6"><c r="A6" t="d"><v>2001-01-02T00:00:00</v></c><c r="C6" s="1"><v>40000</v></c></row>`+sheetTail)
	compared := 0
	for name, b := range books {
		for _, sh := range []string{"", "Data", "Notes", "Sheet1", "Series", "Sheet9"} {
			for _, freq := range []series.Freq{series.Undated, series.Quarterly} {
				got, gerr := ReadXLSXAs(bytes.NewReader(b), "w.xlsx", sh, freq)
				want, werr := readWithExcelize(bytes.NewReader(b), "w.xlsx", sh, freq)
				if (gerr == nil) != (werr == nil) {
					t.Errorf("%s sheet %q: galley %v, excelize %v", name, sh, gerr, werr)
					continue
				}
				if gerr != nil {
					continue
				}
				compared++
				if !sameFrame(got, want) {
					t.Errorf("%s sheet %q: frames differ:\n galley   %v %v %v %v\n excelize %v %v %v %v", name, sh,
						got.Freq, got.Dates, got.Names, got.Lines, want.Freq, want.Dates, want.Names, want.Lines)
				}
			}
		}
	}
	if compared < 12 {
		t.Errorf("only %d frames were read by both", compared)
	}
	t.Logf("%d frames compared", compared)
}

func sameFrame(a, b *series.Frame) bool {
	if a.Freq != b.Freq || a.Sheet != b.Sheet || !reflect.DeepEqual(a.Dates, b.Dates) || !reflect.DeepEqual(a.Names, b.Names) || !reflect.DeepEqual(a.Lines, b.Lines) {
		return false
	}
	for _, n := range a.Names {
		x, _ := a.Column(n)
		y, _ := b.Column(n)
		if len(x) != len(y) {
			return false
		}
		for i := range x {
			if math.Float64bits(x[i]) != math.Float64bits(y[i]) && !(math.IsNaN(x[i]) && math.IsNaN(y[i])) {
				return false
			}
		}
	}
	return true
}
