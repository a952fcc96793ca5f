package johansen

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// Fixture layouts; see testdata/scripts/johansen_statsmodels.py and
// testdata/scripts/johansen_urca.R for what each field holds.
type smFixture struct {
	Library, Version string
	CointJohansen    []struct {
		Data               string
		DetOrder           int `json:"det_order"`
		KArDiff            int `json:"k_ar_diff"`
		Eig, Trace, Maxeig []float64
		Cvt, Cvm           [][]float64
	} `json:"coint_johansen"`
	SelectOrder []struct {
		Trend   string
		Maxlags int
		Ics     map[string][]float64
	} `json:"select_order"`
	VECM []struct {
		Deterministic string
		KArDiff       int `json:"k_ar_diff"`
		Alpha         [][]float64
		StderrAlpha   [][]float64 `json:"stderr_alpha"`
		Beta          [][]float64
		StderrBeta    [][]float64 `json:"stderr_beta"`
	} `json:"vecm"`
	Tables []struct {
		DetOrder      int `json:"det_order"`
		N             int
		Trace, Maxeig []float64
	}
}

type urcaFixture struct {
	Library, Version string
	Cajo             []struct {
		Ecdet                 string
		K                     int
		Lambda, Trace, Maxeig []float64
		CvalTrace             [][]float64 `json:"cval_trace"`
		CvalMaxeig            [][]float64 `json:"cval_maxeig"`
	}
	Cajorls []struct {
		Ecdet      string
		K, R       int
		Beta       []float64
		Regressors []string
		Coef, SE   [][]float64
	}
	Tests []struct {
		Kind, Name, Ecdet string
		K, R              int
		Matrix            [][]float64
		Stat              float64
		DF                int
		P                 float64
		Lambda            []float64
	}
	Cvals []struct {
		Ecdet         string
		Maxeig, Trace [][]float64
	}
}

func loadJSON(t testing.TB, path string, v any) {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(b, v); err != nil {
		t.Fatalf("%s: %v", path, err)
	}
}

// loadCSV reads the named columns of a CSV file with a header row,
// applying f to each value.
func loadCSV(t testing.TB, path string, cols []string, f func(float64) float64) *mat.Dense {
	t.Helper()
	fh, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer fh.Close()
	recs, err := csv.NewReader(fh).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	idx := make([]int, len(cols))
	for i, c := range cols {
		idx[i] = -1
		for j, h := range recs[0] {
			if h == c {
				idx[i] = j
			}
		}
		if idx[i] < 0 {
			t.Fatalf("%s: no column %s", path, c)
		}
	}
	y := mat.NewDense(len(recs)-1, len(cols), nil)
	for r, rec := range recs[1:] {
		for i, j := range idx {
			v, err := strconv.ParseFloat(rec[j], 64)
			if err != nil {
				t.Fatal(err)
			}
			if f != nil {
				v = f(v)
			}
			y.Set(r, i, v)
		}
	}
	return y
}

var denmarkCols = []string{"LRM", "LRY", "IBO", "IDE"}

func denmark(t testing.TB) *mat.Dense {
	return loadCSV(t, "../../testdata/data/denmark.csv", denmarkCols, nil)
}

func macro(t testing.TB) *mat.Dense {
	return loadCSV(t, "../../testdata/data/macrodata.csv", []string{"realgdp", "realcons", "realinv"}, math.Log)
}

func statsmodelsFixture(t testing.TB) *smFixture {
	var f smFixture
	loadJSON(t, "../../testdata/fixtures/johansen_statsmodels.json", &f)
	return &f
}

func urcaFixtureLoad(t testing.TB) *urcaFixture {
	var f urcaFixture
	loadJSON(t, "../../testdata/fixtures/johansen_urca.json", &f)
	return &f
}

// close reports |got − want| ≤ tol·max(|want|, floor).
func closeRel(got, want, tol, floor float64) bool {
	return math.Abs(got-want) <= tol*math.Max(math.Abs(want), floor)
}

func checkVec(t *testing.T, what string, got, want []float64, tol, floor float64) {
	t.Helper()
	if len(got) != len(want) {
		t.Errorf("%s: %d values, want %d", what, len(got), len(want))
		return
	}
	for i := range want {
		if !closeRel(got[i], want[i], tol, floor) {
			t.Errorf("%s[%d] = %.12g, want %.12g (rel tol %g)", what, i, got[i], want[i], tol)
		}
	}
}
