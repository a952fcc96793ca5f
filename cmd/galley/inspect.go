package main

import (
	"bytes"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"text/tabwriter"

	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/dataio"
)

type inspectCmd struct {
	File  string `arg:"" help:"A CSV or XLSX data file." type:"existingfile"`
	Sheet string `help:"The sheet of an XLSX file (default: the first)."`
}

func (c *inspectCmd) Run() error {
	raw, err := dataio.ReadFile(c.File, dataio.MaxDataBytes)
	if err != nil {
		return err
	}
	var fr *series.Frame
	if strings.EqualFold(filepath.Ext(c.File), ".xlsx") {
		fr, err = dataio.ReadXLSX(bytes.NewReader(raw), c.File, c.Sheet)
	} else {
		fr, err = series.ReadCSV(bytes.NewReader(raw), c.File)
	}
	if err != nil {
		return err
	}
	fmt.Printf("%s\n  frequency: %s (%s)\n  rows: %d\n", c.File, fr.Freq, fr.FreqBasis, fr.Len())
	if fr.Len() > 0 {
		fmt.Printf("  dates: %s to %s\n", fr.Dates[0], fr.Dates[fr.Len()-1])
	}
	tw := tabwriter.NewWriter(os.Stdout, 2, 4, 2, ' ', 0)
	fmt.Fprintln(tw, "  column\tmissing\tfirst\tlast\tmin\tmax")
	for _, name := range fr.Names {
		col, _ := fr.Column(name)
		miss, first, last := 0, -1, -1
		lo, hi := math.Inf(1), math.Inf(-1)
		for i, v := range col {
			if math.IsNaN(v) {
				miss++
				continue
			}
			if first < 0 {
				first = i
			}
			last = i
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
		if first < 0 {
			fmt.Fprintf(tw, "  %s\t%d\t–\t–\t–\t–\n", name, miss)
			continue
		}
		fmt.Fprintf(tw, "  %s\t%d\t%s\t%s\t%.6g\t%.6g\n", name, miss, fr.Dates[first], fr.Dates[last], lo, hi)
	}
	return tw.Flush()
}
