package coint

import (
	"math"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/critical"

	"github.com/galley-econ/galley/internal/refdata"
)

type poFixture struct {
	Library, Version string
	Cases            []struct {
		Data          string
		Columns       []string
		Demean        string
		Type          string
		Lagrule       string
		Lag           int
		Stat          float64
		Cval          []float64 // 10%, 5%, 1%
		NumpyPu       float64   `json:"numpy_pu"`
		NumpyPz       float64   `json:"numpy_pz"`
		NumpyOmega112 float64   `json:"numpy_omega11_2"`
	}
}

var poCase = map[string]critical.Case{"none": critical.NoConst, "constant": critical.Const, "trend": critical.ConstTrend}

func poColumns(t *testing.T, data string, cols []string) [][]float64 {
	path := "../../testdata/data/denmark.csv"
	if data == "macro" {
		path = "../../testdata/data/macrodata.csv"
	}
	d := refdata.CSVFile(t, path)
	out := make([][]float64, len(cols))
	for i, c := range cols {
		v, ok := d[c]
		if !ok {
			t.Fatalf("%s: no column %s", path, c)
		}
		out[i] = append([]float64(nil), v...)
		if data == "macro" {
			for j := range out[i] {
				out[i][j] = math.Log(out[i][j])
			}
		}
	}
	return out
}

// TestPhillipsOuliaris checks P̂u (cases n, c, ct) and P̂z (case n)
// against r-cran-urca 1.3.3 ca.po, which follows the same sample
// conventions, to 1e-8 relative; P̂z in cases c and ct (where urca's
// moment matrix uses the raw levels) and ω̂₁₁·₂ against the independent
// numpy implementation in testdata/scripts/coint_po.py, to 1e-8; and the
// Phillips–Ouliaris (1990) critical values against the tables carried by
// urca, exactly (fixture testdata/fixtures/coint_po.json).
func TestPhillipsOuliaris(t *testing.T) {
	var fx poFixture
	refdata.JSONFile(t, "../../testdata/fixtures/coint_po.json", &fx)
	if fx.Library != "r-cran-urca" || len(fx.Cases) == 0 {
		t.Fatalf("fixture %q with %d cases", fx.Library, len(fx.Cases))
	}
	const tol = 1e-8
	for _, c := range fx.Cases {
		name := c.Data + "/" + strings.Join(c.Columns, ",") + "/" + c.Demean + "/" + c.Type + "/" + c.Lagrule
		z := poColumns(t, c.Data, c.Columns)
		det := poCase[c.Demean]
		r, err := PhillipsOuliaris(z[0], z[1:], det, c.Lag)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if relErr(r.Omega11_2, c.NumpyOmega112) > tol {
			t.Errorf("%s: ω₁₁·₂ %.12g, numpy %.12g", name, r.Omega11_2, c.NumpyOmega112)
		}
		if relErr(r.Pu, c.NumpyPu) > tol || relErr(r.Pz, c.NumpyPz) > tol {
			t.Errorf("%s: Pu %.12g Pz %.12g, numpy %.12g %.12g", name, r.Pu, r.Pz, c.NumpyPu, c.NumpyPz)
		}
		crit := r.CritPu
		if c.Type == "Pu" {
			if relErr(r.Pu, c.Stat) > tol {
				t.Errorf("%s: Pu %.12g, urca %.12g", name, r.Pu, c.Stat)
			}
		} else {
			crit = r.CritPz
			if det == critical.NoConst && relErr(r.Pz, c.Stat) > tol {
				t.Errorf("%s: Pz %.12g, urca %.12g", name, r.Pz, c.Stat)
			}
		}
		// urca orders 10%, 5%, 1%; ours 1%, 5%, 10%.
		for i := 0; i < 3; i++ {
			if crit[i].Value != c.Cval[2-i] || crit[i].Level != POLevels[i] {
				t.Errorf("%s: critical value %g = %g, urca %g", name, crit[i].Level, crit[i].Value, c.Cval[2-i])
			}
		}
	}
}

// TestPzNormalisationFree: P̂z is invariant to which series is called y.
func TestPzNormalisationFree(t *testing.T) {
	z := poColumns(t, "denmark", []string{"LRM", "LRY", "IBO"})
	for _, det := range []critical.Case{critical.NoConst, critical.Const, critical.ConstTrend} {
		a, err := PhillipsOuliaris(z[0], z[1:], det, 3)
		if err != nil {
			t.Fatal(err)
		}
		b, err := PhillipsOuliaris(z[2], [][]float64{z[1], z[0]}, det, 3)
		if err != nil {
			t.Fatal(err)
		}
		if relErr(a.Pz, b.Pz) > 1e-10 {
			t.Errorf("%v: Pz %g vs %g after reordering", det, a.Pz, b.Pz)
		}
		if a.Pu == b.Pu {
			t.Errorf("%v: Pu unchanged by renormalisation", det)
		}
	}
}

func TestPhillipsOuliarisErrors(t *testing.T) {
	z := poColumns(t, "denmark", []string{"LRM", "LRY", "LPY", "IBO", "IDE"})
	if _, err := PhillipsOuliaris(z[0], nil, critical.Const, 3); err == nil {
		t.Error("no regressors: no error")
	}
	if _, err := PhillipsOuliaris(z[0], z[1:2], critical.ConstTrendSq, 3); err == nil {
		t.Error("case ctt: no error")
	}
	if _, err := PhillipsOuliaris(z[0], z[1:2], critical.Const, -1); err == nil {
		t.Error("negative lag: no error")
	}
	six := append(append([][]float64{}, z[1:]...), z[1], z[2])
	if _, err := PhillipsOuliaris(z[0], six, critical.Const, 3); err == nil || !strings.Contains(err.Error(), "simulate") {
		t.Errorf("six regressors: %v", err)
	}
	if _, err := PhillipsOuliaris(z[0], [][]float64{z[1], z[1]}, critical.Const, 3); err == nil {
		t.Error("collinear: no error")
	}
	if _, err := PhillipsOuliaris(z[0], [][]float64{z[1][:10]}, critical.Const, 3); err == nil {
		t.Error("length: no error")
	}
	if _, err := POCritical(0, critical.Const, false); err == nil {
		t.Error("k=0: no error")
	}
}
