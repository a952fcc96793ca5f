package dataio

import (
	"archive/zip"
	"bufio"
	"bytes"
	"fmt"
	"io"
)

// Bounds on a workbook, checked before the workbook library reads it.
// The library builds every cell of a sheet in memory, including blank
// cells and the cells a far-away reference implies (a cell in column
// XFD makes a row 16,384 cells wide), at several kilobytes each; a
// small compressed file can therefore ask for gigabytes. The bounds
// are far above the size of a time-series data set (a thousand
// quarters of a hundred series is 100,000 cells).
const (
	// maxExpanded bounds the total uncompressed size of the parts.
	maxExpanded = 64 << 20
	// maxCells bounds the cells the sheets span: the sum over rows of
	// the rightmost column each row reaches.
	maxCells = 500_000
	// maxParts bounds the number of parts in the package.
	maxParts = 10_000
	// maxRow is the last row of a worksheet (ECMA-376: 1,048,576 rows).
	maxRow = 1 << 20
)

// boundsError describes a workbook beyond the bounds.
type boundsError struct{ msg string }

func (e *boundsError) Error() string { return e.msg }

// checkBounds reads the package directory and streams every part once,
// counting the cells that each row of each sheet spans, without
// building anything. It returns nil for a workbook inside the bounds
// and for a file that is not a zip package at all (the library then
// reports what is wrong with it).
func checkBounds(b []byte) error {
	zr, err := zip.NewReader(bytes.NewReader(b), int64(len(b)))
	if err != nil {
		return nil
	}
	if len(zr.File) > maxParts {
		return &boundsError{fmt.Sprintf("the workbook has %d parts, more than the %d galley reads; save the sheet as CSV", len(zr.File), maxParts)}
	}
	var total uint64
	for _, f := range zr.File {
		total += f.UncompressedSize64
		if total > maxExpanded {
			return &boundsError{fmt.Sprintf("the workbook expands to more than %d MB (%d KB compressed); galley reads workbooks up to %d MB expanded: save the sheet as CSV", maxExpanded>>20, len(b)>>10, maxExpanded>>20)}
		}
	}
	cells := 0
	for _, f := range zr.File {
		rc, err := f.Open()
		if err != nil {
			continue // the library reports it
		}
		n, err := spanCells(bufio.NewReaderSize(rc, 64<<10), maxCells-cells)
		rc.Close()
		if err != nil {
			return err
		}
		cells += n
	}
	return nil
}

// spanCells scans XML for row and cell elements (any namespace
// prefix) and returns the cells the rows span: for each row, the
// rightmost column a cell in it names (r="XFD7") or reaches by
// counting (a cell without r follows the one before). It stops with
// an error once the count passes budget or a row passes maxRow.
func spanCells(r *bufio.Reader, budget int) (int, error) {
	total, row, col, wide := 0, 0, 0, 0
	endRow := func() error {
		total += wide
		w := wide
		wide = 0
		if total > budget {
			return &boundsError{fmt.Sprintf("the workbook spans more than %d cells (counting the blank cells up to the rightmost one of each row; row %d reaches column %s); save the sheet as CSV, which galley reads without this limit", maxCells, row, colName(w-1))}
		}
		return nil
	}
	for {
		c, err := r.ReadByte()
		if err == io.EOF {
			return total, endRow()
		}
		if err != nil {
			return total, nil // the library reports a damaged part
		}
		if c != '<' {
			continue
		}
		name, closing, err := tagName(r)
		if err != nil {
			return total, endRow()
		}
		switch {
		case name == "row" && !closing:
			if err := endRow(); err != nil {
				return total, err
			}
			v := attrR(r)
			if n, ok := digitsOnly(v); ok {
				row = n
			} else {
				row++
			}
			if row > maxRow {
				return total, &boundsError{fmt.Sprintf("the workbook names row %d; a worksheet ends at row %d", row, maxRow)}
			}
			col = 0
		case name == "c" && !closing:
			v := attrR(r)
			if k, ok := columnOf(v); ok {
				col = k
			} else {
				col++
			}
			if col > wide {
				wide = col
			}
			if total+wide > budget {
				return total, endRow()
			}
		}
	}
}

// tagName reads the name after '<' without its namespace prefix, and
// whether the tag closes an element. Declarations, comments and
// processing instructions give a name that matches nothing.
func tagName(r *bufio.Reader) (string, bool, error) {
	var buf [16]byte
	n, closing := 0, false
	for i := 0; ; i++ {
		c, err := r.ReadByte()
		if err != nil {
			return "", false, err
		}
		if i == 0 && c == '/' {
			closing = true
			continue
		}
		if c == ':' {
			n = 0 // drop the prefix
			continue
		}
		if c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '>' || c == '/' {
			r.UnreadByte()
			return string(buf[:n]), closing, nil
		}
		if n == len(buf) {
			return "", closing, nil // a long name: none we look for
		}
		buf[n] = c
		n++
	}
}

// attrR reads the attributes of the current tag up to its '>' and
// returns the value of the attribute r ("" when absent).
func attrR(r *bufio.Reader) string {
	val := ""
	var prev byte = ' '
	for {
		c, err := r.ReadByte()
		if err != nil || c == '>' {
			return val
		}
		isSpace := prev == ' ' || prev == '\t' || prev == '\n' || prev == '\r'
		prev = c
		if c != 'r' || !isSpace {
			continue
		}
		// "r" at the start of an attribute name: is it r= ?
		c2, err := r.ReadByte()
		if err != nil {
			return val
		}
		if c2 != '=' {
			r.UnreadByte()
			continue
		}
		q, err := r.ReadByte()
		if err != nil || (q != '"' && q != '\'') {
			return val
		}
		var v []byte
		for {
			c, err := r.ReadByte()
			if err != nil {
				return val
			}
			if c == q {
				break
			}
			if len(v) < 16 {
				v = append(v, c)
			}
		}
		val = string(v)
		prev = q
	}
}

// columnOf reads the column of a cell reference such as "XFD7" as a
// 1-based number.
func columnOf(ref string) (int, bool) {
	k, i := 0, 0
	for i < len(ref) && i < 4 {
		c := ref[i] | 0x20
		if c < 'a' || c > 'z' {
			break
		}
		k = k*26 + int(c-'a'+1)
		i++
	}
	if i == 0 {
		return 0, false
	}
	return k, true
}

// digitsOnly parses a row number.
func digitsOnly(s string) (int, bool) {
	if s == "" || len(s) > 9 {
		return 0, false
	}
	n := 0
	for i := 0; i < len(s); i++ {
		if s[i] < '0' || s[i] > '9' {
			return 0, false
		}
		n = n*10 + int(s[i]-'0')
	}
	return n, true
}

// colName writes a 0-based column index as letters: 0 → A, 27 → AB.
func colName(col int) string {
	if col < 0 {
		col = 0
	}
	s := ""
	for col++; col > 0; col = (col - 1) / 26 {
		s = string(rune('A'+(col-1)%26)) + s
	}
	return s
}
