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
