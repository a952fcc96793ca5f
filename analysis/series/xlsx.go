package series

import (
	"archive/zip"
	"bytes"
	"encoding/xml"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"time"
)

// ReadXLSX reads one sheet of an Office Open XML workbook (.xlsx) with
// the rules of ReadCSV: the first non-empty row is the header, each
// further non-empty row an observation; Frame.Lines and DataError.Line
// are sheet row numbers. sheet "" reads the first sheet; an unknown
// sheet is an error listing the sheets.
//
// Dates may be text in any form ParseDate accepts, or spreadsheet date
// numbers: cells whose number format shows a date, and whole numbers
// of five or more digits in the date column. Those become calendar
// days, and then a coarser frequency when every date is the first (or
// every date the last) day of a year, of a quarter or of a month.
// A #N/A cell is a missing value. The whole workbook is held in memory.
func ReadXLSX(r io.Reader, source, sheet string) (*Frame, error) {
	data, err := io.ReadAll(r)
	if err != nil {
		return nil, &DataError{Source: source, Msg: fmt.Sprintf("reading: %v", err)}
	}
	return ReadXLSXAt(bytes.NewReader(data), int64(len(data)), source, sheet)
}

// ReadXLSXAt is ReadXLSX for a workbook of size bytes read through r.
func ReadXLSXAt(r io.ReaderAt, size int64, source, sheet string) (*Frame, error) {
	bad := func(format string, args ...any) error {
		return &DataError{Source: source, Msg: fmt.Sprintf(format, args...)}
	}
	zr, err := zip.NewReader(r, size)
	if err != nil {
		return nil, bad("not an .xlsx workbook: %v", err)
	}
	wb, err := openWorkbook(zr)
	if err != nil {
		return nil, bad("not a readable .xlsx workbook: %v", err)
	}
	if len(wb.sheets) == 0 {
		return nil, bad("the workbook has no sheets")
	}
	ref := wb.sheets[0]
	if sheet != "" {
		found := false
		names := make([]string, len(wb.sheets))
		for i, s := range wb.sheets {
			names[i] = strconv.Quote(s.name)
			if s.name == sheet {
				ref, found = s, true
			}
		}
		if !found {
			return nil, bad("no sheet %q; the sheets are %s", sheet, strings.Join(names, ", "))
		}
	}
	rows, err := wb.readSheet(ref.part)
	if err != nil {
		return nil, bad("sheet %q: %v", ref.name, err)
	}
	return buildSheet(source, ref.name, rows, wb)
}

// xcell is one cell as read from the sheet.
type xcell struct {
	text   string  // text, or the number as written
	num    float64 // the number, if isNum
	isNum  bool
	isDate bool // a number shown as a date
}

type xrow struct {
	n     int // sheet row number
	cells []xcell
}

// readSheet reads the non-empty rows of a worksheet part.
func (wb *workbook) readSheet(part string) ([]xrow, error) {
	rc, err := wb.open(part)
	if err != nil {
		return nil, err
	}
	defer rc.Close()
	dec := xml.NewDecoder(rc)
	var rows []xrow
	var row xrow
	var cell xcell
	var typ, style string
	col, rowN := 0, 0
	var text strings.Builder
	inV, inT := false, false
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			return rows, nil
		}
		if err != nil {
			return nil, err
		}
		switch t := tok.(type) {
		case xml.StartElement:
			switch t.Name.Local {
			case "row":
				rowN++
				if v := attr(t, "r"); v != "" {
					if n, err := strconv.Atoi(v); err == nil && n >= rowN {
						rowN = n
					}
				}
				row = xrow{n: rowN}
				col = 0
			case "c":
				typ, style = attr(t, "t"), attr(t, "s")
				if ref := attr(t, "r"); ref != "" {
					if c, _, ok := cellRef(ref); ok {
						col = c
					}
				}
				text.Reset()
				cell = xcell{}
			case "v":
				inV = true
			case "t":
				inT = true
			}
		case xml.CharData:
			if inV || inT {
				text.Write(t)
			}
		case xml.EndElement:
			switch t.Name.Local {
			case "v":
				inV = false
			case "t":
				inT = false
			case "c":
				cell, err = wb.cellValue(typ, style, text.String())
				if err != nil {
					return nil, fmt.Errorf("cell %s%d: %v", colName(col), rowN, err)
				}
				if cell.text != "" {
					if col > 1<<14 {
						return nil, fmt.Errorf("cell %s%d: too many columns", colName(col), rowN)
					}
					for len(row.cells) <= col {
						row.cells = append(row.cells, xcell{})
					}
					row.cells[col] = cell
				}
				col++
			case "row":
				if len(row.cells) > 0 {
					rows = append(rows, row)
				}
			}
		}
	}
}

func attr(t xml.StartElement, name string) string {
	for _, a := range t.Attr {
		if a.Name.Local == name {
			return a.Value
		}
	}
	return ""
}

// cellValue interprets the content of a <c> element of type typ.
func (wb *workbook) cellValue(typ, style, text string) (xcell, error) {
	switch typ {
	case "s":
		i, err := strconv.Atoi(strings.TrimSpace(text))
		if err != nil || i < 0 || i >= len(wb.strings) {
			return xcell{}, fmt.Errorf("bad shared-string index %q", text)
		}
		return xcell{text: wb.strings[i]}, nil
	case "str", "inlineStr":
		return xcell{text: text}, nil
	case "e":
		if text == "#N/A" {
			return xcell{text: "NA"}, nil
		}
		return xcell{text: text}, nil
	case "d": // ISO 8601 date-time
		if len(text) >= 10 {
			return xcell{text: text[:10]}, nil
		}
		return xcell{text: text}, nil
	}
	// number (t absent, "n" or "b")
	text = strings.TrimSpace(text)
	if text == "" {
		return xcell{}, nil
	}
	v, err := strconv.ParseFloat(text, 64)
	if err != nil {
		return xcell{text: text}, nil // reported as not a number later
	}
	c := xcell{text: text, num: v, isNum: true}
	if typ != "b" && style != "" {
		if s, err := strconv.Atoi(style); err == nil && s >= 0 && s < len(wb.dateFmt) {
			c.isDate = wb.dateFmt[s]
		}
	}
	return c, nil
}

// serialDay converts a spreadsheet date number to its calendar day. In
// the 1900 date system day 1 is 1900-01-01 and day 60 is the
// nonexistent 1900-02-29 kept by common practice for compatibility, so
// days from 61 on count from 1899-12-30; in the 1904 system day 0 is
// 1904-01-01. The time of day (fraction) is dropped.
func serialDay(v float64, date1904 bool) (time.Time, bool) {
	if math.IsNaN(v) || v < 1 || v >= 2958466 { // up to 9999-12-31
		return time.Time{}, false
	}
	n := int(math.Floor(v))
	if date1904 {
		return time.Date(1904, 1, 1, 0, 0, 0, 0, time.UTC).AddDate(0, 0, n), true
	}
	if n == 60 {
		return time.Time{}, false
	}
	if n < 60 {
		return time.Date(1899, 12, 31, 0, 0, 0, 0, time.UTC).AddDate(0, 0, n), true
	}
	return time.Date(1899, 12, 30, 0, 0, 0, 0, time.UTC).AddDate(0, 0, n), true
}
