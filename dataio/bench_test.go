package dataio

import (
	"bytes"
	"fmt"
	"testing"
	"time"

	"github.com/xuri/excelize/v2"
)

// BenchmarkReadXLSX reads a sheet of 20 000 daily rows and five value
// columns, the dates as date-formatted cells.
func BenchmarkReadXLSX(b *testing.B) {
	f := excelize.NewFile()
	st, err := f.NewStyle(&excelize.Style{NumFmt: 14})
	if err != nil {
		b.Fatal(err)
	}
	sw, err := f.NewStreamWriter("Sheet1")
	if err != nil {
		b.Fatal(err)
	}
	sw.SetRow("A1", []any{"date", "a", "b", "c", "d", "e"})
	d := time.Date(1950, 1, 1, 0, 0, 0, 0, time.UTC)
	for i := 0; i < 20000; i++ {
		cell, _ := excelize.CoordinatesToCellName(1, i+2)
		v := float64(i)
		sw.SetRow(cell, []any{excelize.Cell{StyleID: st, Value: d.AddDate(0, 0, i)}, v, v / 2, v / 3, v / 4, v / 5})
	}
	if err := sw.Flush(); err != nil {
		b.Fatal(err)
	}
	var buf bytes.Buffer
	if _, err := f.WriteTo(&buf); err != nil {
		b.Fatal(err)
	}
	data := buf.Bytes()
	b.SetBytes(int64(len(data)))
	for b.Loop() {
		fr, err := ReadXLSX(bytes.NewReader(data), "bench.xlsx", "")
		if err != nil || fr.Len() != 20000 {
			b.Fatal(err, fmt.Sprint(fr.Len()))
		}
	}
}
