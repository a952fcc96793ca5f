package coint

import (
	"encoding/csv"
	"encoding/json"
	"os"
	"strconv"
	"testing"
)

// readCSV reads a numeric CSV with a header and a leading date column,
// returning the columns by name.
func readCSV(t *testing.T, path string) map[string][]float64 {
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

func readJSON(t *testing.T, path string, v any) {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(b, v); err != nil {
		t.Fatalf("%s: %v", path, err)
	}
}
