package dataio

import (
	"archive/zip"
	"bytes"
	"fmt"
	"io"
	"strconv"
	"strings"

	"github.com/galley-econ/galley/analysis/series"
)

// ReadXLSX reads one sheet of an Office Open XML workbook (.xlsx) with
// galley's own reader of the parts a data table needs (ooxml.go:
// archive/zip and encoding/xml) and builds the frame with
// series.FromCells, that is with the rules of series.ReadCSV: the first
// non-empty row is the header, each further non-empty row an
// observation; Frame.Lines and DataError.Line are sheet row numbers.
// sheet "" reads the first sheet; an unknown sheet is an error listing
// the sheets.
//
// Dates may be text in any form series.ParseDate accepts, or
// spreadsheet date serials (see series.FromCells): cells whose number
// format shows a date, and whole numbers of five or more digits in the
// date column. A #N/A cell is a missing value. Every error is a
// *series.DataError naming the source. The whole workbook is held in
// memory; r is read up to MaxDataBytes, and a workbook that expands
// beyond maxExpanded bytes or whose sheets span more than maxCells
// cells is refused before it is read.
func ReadXLSX(r io.Reader, source, sheet string) (*series.Frame, error) {
	return ReadXLSXAs(r, source, sheet, series.Undated)
}

// ReadXLSXAs is ReadXLSX with the frequency declared by the caller
// instead of inferred from the dates (see series.FromCellsAs); Undated
// infers it.
func ReadXLSXAs(r io.Reader, source, sheet string, freq series.Freq) (fr *series.Frame, err error) {
	bad := func(format string, args ...any) error {
		return &series.DataError{Source: source, Msg: fmt.Sprintf(format, args...)}
	}
	defer func() {
		// a malformed file must give an error, whatever the library does
		if p := recover(); p != nil {
			fr, err = nil, bad("not a readable .xlsx workbook: %v", p)
		}
	}()
	b, err := io.ReadAll(io.LimitReader(r, MaxDataBytes+1))
	if err != nil {
		return nil, bad("reading: %v", err)
	}
	if len(b) > MaxDataBytes {
		return nil, bad("larger than %d MB, the most galley reads from one file", MaxDataBytes>>20)
	}
	if err := checkBounds(b); err != nil {
		return nil, bad("%v", err)
	}
	zr, err := zip.NewReader(bytes.NewReader(b), int64(len(b)))
	if err != nil {
		return nil, bad("not an .xlsx workbook: %v", err)
	}
	bk, err := loadBook(openPackage(zr))
	if err != nil {
		return nil, bad("not a readable .xlsx workbook: %v", err)
	}
	sheets := bk.names
	if len(sheets) == 0 {
		return nil, bad("the workbook has no sheets")
	}
	name, ok := chooseSheet(sheets, sheet)
	if !ok {
		return nil, bad("no sheet %q; the sheets are %s", sheet, quoteAll(sheets))
	}
	rows, err := bk.rows(bk.sheets[name])
	if err != nil {
		return nil, bad("sheet %q: %v", name, err)
	}
	return series.FromCellsAs(source, name, rows, freq)
}

// chooseSheet is the sheet to read: the one named, or the first when none
// is; ok is false when the named one is not there.
func chooseSheet(sheets []string, sheet string) (name string, ok bool) {
	if sheet == "" {
		return sheets[0], true
	}
	for _, s := range sheets {
		if s == sheet {
			return s, true
		}
	}
	return "", false
}

// quoteAll lists names quoted, separated by commas (for messages).
func quoteAll(names []string) string {
	q := make([]string, len(names))
	for i, s := range names {
		q[i] = strconv.Quote(s)
	}
	return strings.Join(q, ", ")
}
