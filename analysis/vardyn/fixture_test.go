package vardyn

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
)

// Checks against statsmodels 0.13.5 (Debian python3-statsmodels) and
// numpy 1.24 implementations of the published formulas:
// testdata/fixtures/vardyn_statsmodels.json, written by
// testdata/scripts/vardyn_statsmodels.py (which says what each entry is).
// Tolerance 1e-6 relative (with an absolute floor for values near zero).

type fixture struct {
	Library, Version string
	VAR              struct {
		Coefs                      [][][]float64
		SigmaU                     [][]float64 `json:"sigma_u"`
		Irfs, OrthIrfs, Fevd, Girf [][][]float64
		Causality                  []struct {
			Caused, Causing int
			Wald            float64
			WaldP           float64 `json:"wald_p"`
			WaldDF          int     `json:"wald_df"`
			F               float64
			FP              float64 `json:"f_p"`
			FDF             []int   `json:"f_df"`
		}
	} `json:"var"`
	VAROrder struct {
		Order    []int
		OrthIrfs [][][]float64 `json:"orth_irfs"`
	} `json:"var_order"`
	TY struct {
		P, Dmax int
		Tests   []struct {
			Caused, Causing int
			Wald, P         float64
			DF              int
		}
	} `json:"ty"`
	VECM []struct {
		Deterministic        string
		VarRep               [][][]float64 `json:"var_rep"`
		SigmaU               [][]float64   `json:"sigma_u"`
		Irfs, OrthIrfs, Girf [][][]float64
	} `json:"vecm"`
	VECMCausality []struct {
		Deterministic string
		Tests         []struct {
			Caused, Causing int
			Kind            string
			Wald, P, F      float64
			FP              float64 `json:"f_p"`
			DF              int
			FDF             []int `json:"f_df"`
		}
	} `json:"vecm_causality"`
}

func load(t testing.TB) *fixture {
	t.Helper()
	b, err := os.ReadFile("../../testdata/fixtures/vardyn_statsmodels.json")
	if err != nil {
		t.Fatal(err)
	}
	var f fixture
	if err := json.Unmarshal(b, &f); err != nil {
		t.Fatal(err)
	}
	if len(f.VAR.Irfs) != 11 || len(f.VAR.Causality) != 6 || len(f.TY.Tests) != 6 || len(f.VECM) != 2 || len(f.VECMCausality) != 2 ||
		len(f.VECMCausality[0].Tests) != 36 || len(f.VAROrder.OrthIrfs) != 11 || f.VAR.Causality[0].Wald == 0 {
		t.Fatal("the fixture lacks entries the tests need")
	}
	return &f
}

func readCSV(t testing.TB, path string, cols []string) [][]float64 {
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
	out := make([][]float64, len(cols))
	for i, c := range cols {
		at := -1
		for j, h := range recs[0] {
			if h == c {
				at = j
			}
		}
		if at < 0 {
			t.Fatalf("no column %s", c)
		}
		for _, r := range recs[1:] {
			v, err := strconv.ParseFloat(r[at], 64)
			if err != nil {
				t.Fatal(err)
			}
			out[i] = append(out[i], v)
		}
	}
	return out
}

// macroLevels: log realgdp, realcons, realinv; macroGrowth: 100·Δ of them.
func macroLevels(t testing.TB) *mat.Dense {
	c := readCSV(t, "../../testdata/data/macrodata.csv", []string{"realgdp", "realcons", "realinv"})
	y := mat.NewDense(len(c[0]), 3, nil)
	for j := range c {
		for i, v := range c[j] {
			y.Set(i, j, math.Log(v))
		}
	}
	return y
}

func macroGrowth(t testing.TB) *mat.Dense {
	l := macroLevels(t)
	n, k := l.Dims()
	y := mat.NewDense(n-1, k, nil)
	for i := 1; i < n; i++ {
		for j := 0; j < k; j++ {
			y.Set(i-1, j, 100*(l.At(i, j)-l.At(i-1, j)))
		}
	}
	return y
}

func denmark(t testing.TB) *mat.Dense {
	c := readCSV(t, "../../testdata/data/denmark.csv", []string{"LRM", "LRY", "IBO", "IDE"})
	y := mat.NewDense(len(c[0]), 4, nil)
	for j := range c {
		for i, v := range c[j] {
			y.Set(i, j, v)
		}
	}
	return y
}

func near(got, want, tol, floor float64) bool {
	return math.Abs(got-want) <= tol*math.Max(math.Abs(want), floor)
}

func checkMats(t *testing.T, what string, got []*mat.Dense, want [][][]float64, floor float64) {
	t.Helper()
	if len(got) < len(want) {
		t.Fatalf("%s: %d horizons, want %d", what, len(got), len(want))
	}
	bad := 0
	for s := range want {
		for i := range want[s] {
			for j, w := range want[s][i] {
				if g := got[s].At(i, j); !near(g, w, 1e-6, floor) {
					if bad++; bad <= 5 {
						t.Errorf("%s[%d][%d][%d] = %.12g, want %.12g", what, s, i, j, g, w)
					}
				}
			}
		}
	}
}

func TestVARAgainstStatsmodels(t *testing.T) {
	f := load(t)
	v, err := Fit(macroGrowth(t), 2, Const)
	if err != nil {
		t.Fatal(err)
	}
	checkMats(t, "coefs", v.A, f.VAR.Coefs, 1e-3)
	sig := [][][]float64{f.VAR.SigmaU}
	checkMats(t, "sigma_u", []*mat.Dense{mat.DenseCopyOf(v.Sigma)}, sig, 1e-3)
	h := len(f.VAR.Irfs) - 1
	phi, err := MA(v.A, h)
	if err != nil {
		t.Fatal(err)
	}
	checkMats(t, "irfs ("+f.Library+" "+f.Version+")", phi, f.VAR.Irfs, 1e-6)
	theta, err := Orthogonalised(phi, v.Sigma, nil)
	if err != nil {
		t.Fatal(err)
	}
	checkMats(t, "orth_irfs", theta, f.VAR.OrthIrfs, 1e-6)
	gi, err := Generalised(phi, v.Sigma)
	if err != nil {
		t.Fatal(err)
	}
	checkMats(t, "girf (numpy)", gi, f.VAR.Girf, 1e-6)
	// fevd decomp is [series][horizon][shock].
	fe, err := FEVD(theta, len(f.VAR.Fevd[0]))
	if err != nil {
		t.Fatal(err)
	}
	for i := range f.VAR.Fevd {
		for s := range f.VAR.Fevd[i] {
			for j, w := range f.VAR.Fevd[i][s] {
				if g := fe[s][i][j]; !near(g, w, 1e-6, 1e-6) {
					t.Errorf("fevd series %d horizon %d shock %d = %.12g, want %.12g", i, s+1, j, g, w)
				}
			}
		}
	}
	for _, c := range f.VAR.Causality {
		w, err := v.Granger([]int{c.Caused}, []int{c.Causing}, v.P)
		if err != nil {
			t.Fatal(err)
		}
		if !near(w.Stat, c.Wald, 1e-6, 0) || !near(w.P, c.WaldP, 1e-6, 1e-12) || w.DF != c.WaldDF {
			t.Errorf("Granger %d→%d: W = %.10g p = %.10g df %d, want %.10g %.10g %d", c.Causing, c.Caused, w.Stat, w.P, w.DF, c.Wald, c.WaldP, c.WaldDF)
		}
		if !near(w.F, c.F, 1e-6, 0) || !near(w.PF, c.FP, 1e-6, 1e-12) || w.DF2 != c.FDF[1] {
			t.Errorf("Granger %d→%d: F = %.10g p = %.10g df2 %d, want %.10g %.10g %d", c.Causing, c.Caused, w.F, w.PF, w.DF2, c.F, c.FP, c.FDF[1])
		}
	}
	// Another Cholesky ordering: statsmodels fitted the reordered data.
	o := f.VAROrder.Order
	th2, err := Orthogonalised(phi, v.Sigma, o)
	if err != nil {
		t.Fatal(err)
	}
	for s := range f.VAROrder.OrthIrfs {
		for a := range o {
			for b := range o {
				if g, w := th2[s].At(o[a], o[b]), f.VAROrder.OrthIrfs[s][a][b]; !near(g, w, 1e-6, 1e-6) {
					t.Errorf("ordered orth irf h=%d response %d shock %d = %.12g, want %.12g", s, o[a], o[b], g, w)
				}
			}
		}
	}
}

func TestTodaYamamoto(t *testing.T) {
	f := load(t)
	for _, c := range f.TY.Tests {
		w, v, err := TodaYamamoto(macroLevels(t), f.TY.P, f.TY.Dmax, Const, []int{c.Caused}, []int{c.Causing})
		if err != nil {
			t.Fatal(err)
		}
		if v.P != f.TY.P+f.TY.Dmax {
			t.Fatalf("VAR order %d", v.P)
		}
		if !near(w.Stat, c.Wald, 1e-6, 0) || !near(w.P, c.P, 1e-6, 1e-12) || w.DF != c.DF {
			t.Errorf("TY %d→%d: W = %.10g p = %.10g df %d, want %.10g %.10g %d", c.Causing, c.Caused, w.Stat, w.P, w.DF, c.Wald, c.P, c.DF)
		}
	}
}

var vecmCase = map[string]johansen.Case{"ci": johansen.RC, "co": johansen.C}

func TestVECMAgainstStatsmodels(t *testing.T) {
	f := load(t)
	for _, fv := range f.VECM {
		r, err := johansen.Test(denmark(t), vecmCase[fv.Deterministic], 1)
		if err != nil {
			t.Fatal(err)
		}
		m, err := r.Estimate(1, []int{0})
		if err != nil {
			t.Fatal(err)
		}
		a := m.VARForm()
		checkMats(t, fv.Deterministic+" var_rep", a, fv.VarRep, 1e-3)
		checkMats(t, fv.Deterministic+" sigma_u", []*mat.Dense{mat.DenseCopyOf(m.Omega)}, [][][]float64{fv.SigmaU}, 1e-3)
		h := len(fv.Irfs) - 1
		phi, _ := MA(a, h)
		checkMats(t, fv.Deterministic+" irfs", phi, fv.Irfs, 1e-6)
		th, err := Orthogonalised(phi, m.Omega, nil)
		if err != nil {
			t.Fatal(err)
		}
		checkMats(t, fv.Deterministic+" orth_irfs", th, fv.OrthIrfs, 1e-6)
		gi, _ := Generalised(phi, m.Omega)
		checkMats(t, fv.Deterministic+" girf (numpy)", gi, fv.Girf, 1e-6)
	}
	kinds := map[string]CausalityKind{"short": ShortRun, "long": LongRun, "strong": Strong}
	for _, fc := range f.VECMCausality {
		r, _ := johansen.Test(denmark(t), vecmCase[fc.Deterministic], 1)
		m, _ := r.Estimate(1, []int{0})
		for _, c := range fc.Tests {
			w, err := VECMCausality(m, c.Caused, []int{c.Causing}, kinds[c.Kind])
			if err != nil {
				t.Fatal(err)
			}
			if !near(w.Stat, c.Wald, 1e-6, 0) || !near(w.P, c.P, 1e-6, 1e-12) || w.DF != c.DF || !near(w.PF, c.FP, 1e-6, 1e-12) || w.DF2 != c.FDF[1] {
				t.Errorf("%s %s %d→%d: W = %.10g p = %.10g pF = %.10g (df %d, %d), want %.10g %.10g %.10g (%d, %d)", fc.Deterministic, c.Kind, c.Causing, c.Caused,
					w.Stat, w.P, w.PF, w.DF, w.DF2, c.Wald, c.P, c.FP, c.DF, c.FDF[1])
			}
		}
	}
}
