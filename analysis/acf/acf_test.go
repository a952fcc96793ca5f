package acf

import (
	"encoding/json"
	"errors"
	"math"
	"os"
	"testing"
)

// fixture produced by testdata/scripts/stability_fixtures.py with
// statsmodels 0.13.5 (Debian python3-statsmodels): acf(adjusted=False,
// fft=False) and pacf(method="ywm" and "ldb").
type acfFixture struct {
	Meta   map[string]string `json:"meta"`
	Series []struct {
		Name    string    `json:"name"`
		X       []float64 `json:"x"`
		NLags   int       `json:"nlags"`
		ACF     []float64 `json:"acf"`
		PACFYWM []float64 `json:"pacf_ywm"`
		PACFLDB []float64 `json:"pacf_ldb"`
	} `json:"series"`
}

func loadFixture(t *testing.T) acfFixture {
	t.Helper()
	b, err := os.ReadFile("../../testdata/fixtures/stability_acf.json")
	if err != nil {
		t.Fatal(err)
	}
	var f acfFixture
	if err := json.Unmarshal(b, &f); err != nil {
		t.Fatal(err)
	}
	if len(f.Series) == 0 {
		t.Fatal("empty fixture")
	}
	return f
}

func TestAgainstStatsmodels(t *testing.T) {
	f := loadFixture(t)
	const tol = 1e-10
	for _, s := range f.Series {
		c, err := Compute(s.X, s.NLags)
		if err != nil {
			t.Fatalf("%s: %v", s.Name, err)
		}
		if len(c.ACF) != len(s.ACF) || len(c.PACF) != len(s.PACFYWM) {
			t.Fatalf("%s: lengths %d/%d, want %d/%d", s.Name, len(c.ACF), len(c.PACF), len(s.ACF), len(s.PACFYWM))
		}
		for j := range s.ACF {
			if d := math.Abs(c.ACF[j] - s.ACF[j]); d > tol {
				t.Errorf("%s: acf[%d] = %.15g, statsmodels %.15g (diff %.2g)", s.Name, j, c.ACF[j], s.ACF[j], d)
			}
			// pacf method "ywm": Yule–Walker with the biased autocovariances.
			if d := math.Abs(c.PACF[j] - s.PACFYWM[j]); d > tol {
				t.Errorf("%s: pacf[%d] = %.15g, statsmodels ywm %.15g (diff %.2g)", s.Name, j, c.PACF[j], s.PACFYWM[j], d)
			}
			// pacf method "ldb": Levinson–Durbin on the same autocovariances.
			if d := math.Abs(c.PACF[j] - s.PACFLDB[j]); d > tol {
				t.Errorf("%s: pacf[%d] = %.15g, statsmodels ldb %.15g (diff %.2g)", s.Name, j, c.PACF[j], s.PACFLDB[j], d)
			}
		}
		if want := 1.96 / math.Sqrt(float64(len(s.X))); c.Band != want {
			t.Errorf("%s: band %v, want %v", s.Name, c.Band, want)
		}
	}
}

// An AR(1) autocorrelation sequence r_j = ρ^j has partial autocorrelations
// ρ at lag 1 and 0 beyond (Box and Jenkins; textbook fact).
func TestDurbinLevinsonAR1(t *testing.T) {
	rho := 0.7
	r := make([]float64, 8)
	for j := range r {
		r[j] = math.Pow(rho, float64(j))
	}
	p := durbinLevinson(r)
	if math.Abs(p[1]-rho) > 1e-14 {
		t.Errorf("φ11 = %v, want %v", p[1], rho)
	}
	for j := 2; j < len(p); j++ {
		if math.Abs(p[j]) > 1e-14 {
			t.Errorf("φ%d%d = %v, want 0", j, j, p[j])
		}
	}
}

func TestBadInput(t *testing.T) {
	cases := []struct {
		name  string
		x     []float64
		nlags int
	}{
		{"negative lags", []float64{1, 2, 3}, -1},
		{"too short", []float64{1, 2, 3}, 3},
		{"empty", nil, 0},
		{"nan", []float64{1, math.NaN(), 3, 4}, 1},
		{"constant", []float64{2, 2, 2, 2}, 1},
	}
	for _, c := range cases {
		if _, err := Compute(c.x, c.nlags); err == nil {
			t.Errorf("%s: no error", c.name)
		}
	}
	if _, err := ACF([]float64{1, 2}, 5); !errors.Is(err, ErrShort) {
		t.Errorf("want ErrShort, got %v", err)
	}
}
