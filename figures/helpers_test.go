package figures

import (
	"encoding/csv"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"testing"

	"github.com/galley-econ/galley/analysis/series"
)

// macro reads columns of the open dataset testdata/data/macrodata.csv (US
// quarterly, 1959Q1–2009Q3) as quarterly series.
func macro(t *testing.T, cols ...string) []series.Series {
	t.Helper()
	f, err := os.Open("../testdata/data/macrodata.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	idx := map[string]int{}
	for i, h := range rows[0] {
		idx[h] = i
	}
	var out []series.Series
	for _, c := range cols {
		j, ok := idx[c]
		if !ok {
			t.Fatalf("no column %q", c)
		}
		s := series.Series{Name: c}
		for _, r := range rows[1:] {
			y, _ := strconv.Atoi(r[0][:4])
			q, _ := strconv.Atoi(r[0][5:])
			v, err := strconv.ParseFloat(r[j], 64)
			if err != nil {
				t.Fatal(err)
			}
			s.Dates = append(s.Dates, series.Date{Freq: series.Quarterly, Year: y, Sub: q})
			s.Values = append(s.Values, v)
		}
		out = append(out, s)
	}
	return out
}

// monthly makes a smooth synthetic monthly series from y0-01 to y1-12
// (deterministic; the values only need to be drawable).
func monthly(name string, y0, y1 int, f func(i int) float64) series.Series {
	s := series.Series{Name: name}
	i := 0
	for y := y0; y <= y1; y++ {
		for m := 1; m <= 12; m++ {
			s.Dates = append(s.Dates, series.Date{Freq: series.Monthly, Year: y, Sub: m})
			s.Values = append(s.Values, f(i))
			i++
		}
	}
	return s
}

func wave(i int) float64 { return math.Sin(float64(i)/9) + 0.002*float64(i) }

// outDir is where example images go: $GALLEY_FIGURE_DIR if set (to look
// at them), else a temporary directory removed after the test.
func outDir(t *testing.T) string {
	if d := os.Getenv("GALLEY_FIGURE_DIR"); d != "" {
		if err := os.MkdirAll(d, 0o755); err != nil {
			t.Fatal(err)
		}
		return d
	}
	return t.TempDir()
}

func save(t *testing.T, fig *Figure, name string) map[string][]byte {
	t.Helper()
	dir := outDir(t)
	out := map[string][]byte{}
	for _, format := range []string{"svg", "pdf", "png"} {
		b, err := fig.Render(format, 200)
		if err != nil {
			t.Fatalf("%s.%s: %v", name, format, err)
		}
		out[format] = b
		if err := os.WriteFile(filepath.Join(dir, name+"."+format), b, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return out
}
