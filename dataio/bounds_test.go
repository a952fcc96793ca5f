package dataio

import (
	"archive/zip"
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/series"
)

const bombHead = sheetHead +
	`<row r="1"><c r="A1" t="inlineStr"><is><t>date</t></is></c><c r="B1" t="inlineStr"><is><t>x</t></is></c></row>` +
	`<row r="2"><c r="A2" t="inlineStr"><is><t>2000Q1</t></is></c><c r="B2"><v>1</v></c></row>` +
	`<row r="3"><c r="A3" t="inlineStr"><is><t>2000Q2</t></is></c><c r="B3"><v>2</v></c></row>`

// readBounded reads a workbook and reports the error and the bytes
// allocated while reading it.
func readBounded(t *testing.T, book []byte) (error, uint64) {
	t.Helper()
	runtime.GC()
	var m0, m1 runtime.MemStats
	runtime.ReadMemStats(&m0)
	_, err := ReadXLSX(bytes.NewReader(book), "bomb.xlsx", "")
	runtime.ReadMemStats(&m1)
	return err, m1.TotalAlloc - m0.TotalAlloc
}

// TestWorkbookBombs: workbooks that ask the library for far more cells
// or bytes than they store are refused before it reads them, with an
// error that says why and what to do, and in little memory (the
// library would allocate gigabytes: measured 2 GB for 500,000 blank
// cells, 612 MB for 196 rows reaching column XFD).
func TestWorkbookBombs(t *testing.T) {
	var blank, wide strings.Builder
	blank.WriteString(bombHead)
	for r := 4; r < 4+12_000; r++ {
		fmt.Fprintf(&blank, `<row r="%d">`, r)
		for c := 0; c < 50; c++ {
			fmt.Fprintf(&blank, `<c r="%s%d"/>`, colName(c), r)
		}
		blank.WriteString(`</row>`)
	}
	blank.WriteString(sheetTail)
	wide.WriteString(bombHead)
	for r := 4; r < 200; r++ {
		fmt.Fprintf(&wide, `<row r="%d"><c r="XFD%d"/></row>`, r, r)
	}
	wide.WriteString(sheetTail)
	// Cells without r attributes count from the left.
	var norefs strings.Builder
	norefs.WriteString(bombHead)
	for r := 0; r < 11_000; r++ {
		norefs.WriteString(`<row>` + strings.Repeat(`<c/>`, 50) + `</row>`)
	}
	norefs.WriteString(sheetTail)
	cases := []struct {
		name, sheet, want string
	}{
		{"blank cells", blank.String(), "spans more than 500000 cells"},
		{"far column", wide.String(), "reaches column XFD"},
		{"no references", norefs.String(), "spans more than 500000 cells"},
		{"far row", bombHead + `<row r="2000000"><c r="A2000000"/></row>` + sheetTail, "names row 2000000"},
		{"prefixed", strings.ReplaceAll(strings.ReplaceAll(wide.String(), "<row", "<x:row"), "<c ", "<x:c "), "reaches column XFD"},
	}
	for _, c := range cases {
		err, alloc := readBounded(t, makeBook(t, false, c.sheet))
		var de *series.DataError
		if !errors.As(err, &de) || !strings.Contains(err.Error(), c.want) || (c.name != "far row" && !strings.Contains(err.Error(), "save the sheet as CSV")) {
			t.Errorf("%s: got %v, want a data error with %q", c.name, err, c.want)
		}
		if alloc > 64<<20 {
			t.Errorf("%s: %d MB allocated before the refusal", c.name, alloc>>20)
		}
	}
	// A part of 80 MB of zeros compresses to under 100 KB.
	var b bytes.Buffer
	zw := zip.NewWriter(&b)
	w, _ := zw.Create("xl/worksheets/sheet1.xml")
	zero := make([]byte, 1<<20)
	for i := 0; i < 80; i++ {
		w.Write(zero)
	}
	zw.Close()
	err, alloc := readBounded(t, b.Bytes())
	if err == nil || !strings.Contains(err.Error(), "expands to more than 64 MB") {
		t.Errorf("expansion: got %v", err)
	}
	if alloc > 32<<20 {
		t.Errorf("expansion: %d MB allocated before the refusal", alloc>>20)
	}
}

// TestWorkbookInsideBounds: a sheet just inside the cell bound, and the
// far-away references a real workbook may hold, are read.
func TestWorkbookInsideBounds(t *testing.T) {
	var s strings.Builder
	s.WriteString(sheetHead + `<row r="1"><c r="A1" t="inlineStr"><is><t>date</t></is></c><c r="B1" t="inlineStr"><is><t>x</t></is></c></row>`)
	for r := 2; r <= 41; r++ {
		fmt.Fprintf(&s, `<row r="%d"><c r="A%d" t="inlineStr"><is><t>%dQ%d</t></is></c><c r="B%d"><v>%d</v></c></row>`, r, r, 2000+(r-2)/4, (r-2)%4+1, r, r)
	}
	s.WriteString(`<row r="60"><c r="Z60"/></row>` + sheetTail)
	f, err := ReadXLSX(bytes.NewReader(makeBook(t, false, s.String())), "ok.xlsx", "")
	if err != nil {
		t.Fatal(err)
	}
	if f.Len() != 40 || f.Freq != series.Quarterly {
		t.Errorf("read %d rows at %v", f.Len(), f.Freq)
	}
	n, err := spanCells(bufioReader(s.String()), maxCells)
	if err != nil || n != 2+40*2+26 {
		t.Errorf("spanCells = %d, %v; want %d", n, err, 2+40*2+26)
	}
}

// TestOpenRegular: directories, devices and named pipes are refused by
// type, without blocking on the pipe; files over the limit by size.
func TestOpenRegular(t *testing.T) {
	dir := t.TempDir()
	small := filepath.Join(dir, "small.csv")
	os.WriteFile(small, []byte("x\n1\n"), 0o644)
	if b, err := ReadFile(small, 100); err != nil || string(b) != "x\n1\n" {
		t.Errorf("regular file: %q %v", b, err)
	}
	if _, err := ReadFile(small, 3); err == nil || !strings.Contains(err.Error(), "larger than") {
		t.Errorf("over the limit: %v", err)
	}
	big := make([]byte, 300_001)
	for i := range big {
		big[i] = byte(i*7 + i/1000)
	}
	bigPath := filepath.Join(dir, "big.csv")
	os.WriteFile(bigPath, big, 0o644)
	if b, err := ReadFile(bigPath, int64(len(big))); err != nil || !bytes.Equal(b, big) {
		t.Errorf("a file of exactly the limit: %d bytes, %v", len(b), err)
	}
	if _, err := ReadFile(bigPath, int64(len(big)-1)); err == nil || !strings.Contains(err.Error(), "larger than") {
		t.Errorf("one byte over the limit: %v", err)
	}
	// a regular file whose size is given as 0 but that has content
	if want, err := os.ReadFile("/proc/self/status"); err == nil && len(want) > 0 {
		if b, err := ReadFile("/proc/self/status", 1<<20); err != nil || !bytes.HasPrefix(b, []byte("Name:")) {
			t.Errorf("/proc/self/status: %q %v", b, err)
		}
		if _, err := ReadFile("/proc/self/status", 10); err == nil || !strings.Contains(err.Error(), "larger than") {
			t.Errorf("/proc/self/status over a limit of 10: %v", err)
		}
	}
	if _, err := ReadFile(dir, 100); err == nil || !strings.Contains(err.Error(), "a folder") {
		t.Errorf("folder: %v", err)
	}
	if _, err := os.Stat("/dev/zero"); err == nil {
		if _, err := ReadFile("/dev/zero", 100); err == nil || !strings.Contains(err.Error(), "a device, not a regular file") {
			t.Errorf("/dev/zero: %v", err)
		}
		if err := CheckRegular("/dev/zero", 100); err == nil {
			t.Error("CheckRegular accepted /dev/zero")
		}
	}
	if fifo := makeFIFO(t, dir); fifo != "" {
		// With no writer, a plain open would block here forever.
		if _, err := ReadFile(fifo, 100); err == nil || !strings.Contains(err.Error(), "named pipe (FIFO)") {
			t.Errorf("FIFO: %v", err)
		}
		if err := CheckRegular(fifo, 100); err == nil || !strings.Contains(err.Error(), "named pipe (FIFO)") {
			t.Errorf("CheckRegular FIFO: %v", err)
		}
	}
}

func bufioReader(s string) *bufio.Reader { return bufio.NewReader(strings.NewReader(s)) }
