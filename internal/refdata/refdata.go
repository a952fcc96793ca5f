// Package refdata loads the open datasets and reference fixtures under
// testdata/ for tests. It is deliberately independent of analysis/series
// so that the loaders can be tested against it.
package refdata

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"runtime"
	"strconv"

	"github.com/galley-econ/galley/internal/termname"
)

// Root is the repository's testdata folder.
func Root() string {
	_, file, _, _ := runtime.Caller(0)
	return filepath.Join(filepath.Dir(file), "..", "..", "testdata")
}

// CSV reads testdata/data/NAME.csv into columns keyed by header; the
// first column (dates) is returned as strings.
func CSV(name string) (dates []string, cols map[string][]float64, err error) {
	f, err := os.Open(filepath.Join(Root(), "data", name+".csv"))
	if err != nil {
		return nil, nil, err
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		return nil, nil, err
	}
	head := rows[0]
	cols = map[string][]float64{}
	for _, r := range rows[1:] {
		dates = append(dates, r[0])
		for j := 1; j < len(head); j++ {
			v, err := strconv.ParseFloat(r[j], 64)
			if err != nil {
				return nil, nil, fmt.Errorf("%s: %v", name, err)
			}
			cols[head[j]] = append(cols[head[j]], v)
		}
	}
	return dates, cols, nil
}

// Fixture decodes testdata/fixtures/NAME.json into v.
func Fixture(name string, v any) error {
	b, err := os.ReadFile(filepath.Join(Root(), "fixtures", name+".json"))
	if err != nil {
		return err
	}
	return json.Unmarshal(b, v)
}

// TB is the part of testing.TB these helpers use.
type TB interface {
	Helper()
	Fatal(args ...any)
	Fatalf(format string, args ...any)
}

// CSVFile reads a numeric CSV with a header and a leading date column at
// path, returning the columns by name; it fails the test on any error.
func CSVFile(t TB, path string) map[string][]float64 {
	t.Helper()
	fh, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer fh.Close()
	rows, err := csv.NewReader(fh).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	out := map[string][]float64{}
	for _, row := range rows[1:] {
		for j := 1; j < len(row); j++ {
			v, err := strconv.ParseFloat(row[j], 64)
			if err != nil {
				t.Fatalf("%s: %v", path, err)
			}
			out[rows[0][j]] = append(out[rows[0][j]], v)
		}
	}
	return out
}

// JSONFile decodes the JSON file at path into v; it fails the test on any
// error.
func JSONFile(t TB, path string, v any) {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(b, v); err != nil {
		t.Fatalf("%s: %v", path, err)
	}
}

// TermName translates a term name in the notation the fixture scripts
// write (statsmodels' style: "ect(-1)", "d.x(-2)") into galley's term
// names (termname.FromSuffix).
func TermName(s string) string {
	n, _ := termname.FromSuffix(s)
	return n
}
