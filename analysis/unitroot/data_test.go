package unitroot

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"strconv"
	"testing"
)

// column reads one numeric column of a CSV file under testdata/data.
func column(t testing.TB, file, name string) []float64 {
	t.Helper()
	f, err := os.Open("../../testdata/data/" + file)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	idx := -1
	for i, h := range recs[0] {
		if h == name {
			idx = i
		}
	}
	if idx < 0 {
		t.Fatalf("%s has no column %q", file, name)
	}
	out := make([]float64, 0, len(recs)-1)
	for _, r := range recs[1:] {
		v, err := strconv.ParseFloat(r[idx], 64)
		if err != nil {
			t.Fatal(err)
		}
		out = append(out, v)
	}
	return out
}

func logs(x []float64) []float64 {
	out := make([]float64, len(x))
	for i, v := range x {
		out[i] = math.Log(v)
	}
	return out
}

// series returns the open-data series the fixtures name.
func series(t testing.TB, name string) []float64 {
	t.Helper()
	switch name {
	case "log_realgdp":
		return logs(column(t, "macrodata.csv", "realgdp"))
	case "log_realcons":
		return logs(column(t, "macrodata.csv", "realcons"))
	case "tbilrate":
		return column(t, "macrodata.csv", "tbilrate")
	case "infl":
		return column(t, "macrodata.csv", "infl")
	case "denmark_LRM":
		return column(t, "denmark.csv", "LRM")
	}
	t.Fatalf("unknown series %q", name)
	return nil
}

func readFixture(t testing.TB, name string, v any) {
	t.Helper()
	b, err := os.ReadFile("../../testdata/fixtures/" + name)
	if err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(b, v); err != nil {
		t.Fatal(err)
	}
}

func relErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}
