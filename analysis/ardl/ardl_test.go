package ardl

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/rules"
	"github.com/galley-econ/galley/internal/refdata"
)

type fixture struct {
	Library, Version string
	Fixed            []struct {
		Name, Y  string
		X        []string
		P        int
		Q        []int
		Case     int
		Names    []string
		Coef, SE []float64
		Nobs     int
		F        float64
		TYLevel  float64 `json:"t_ylevel"`
		SSR      float64
		CINames  []string  `json:"ci_names"`
		CIParams []float64 `json:"ci_params"`
		CIBse    []float64 `json:"ci_bse"`
	}
	Selections []struct {
		Name, Y          string
		X                []string
		Maxlag, Maxorder int
		Trend            string
		AIC, BIC         map[string]float64
		Nobs             int
	}
	Nardl []struct {
		Name, Y, Xasym string
		Xsym           []string
		Tau            float64
		P              int
		Qsym           []int
		Qasym          int
		Horizon        int
		Pos, Neg       []float64
		Names          []string
		Coef, SE       []float64
		Nobs           int
		LrF            float64   `json:"lr_f"`
		LrP            float64   `json:"lr_p"`
		SrF            float64   `json:"sr_f"`
		SrP            float64   `json:"sr_p"`
		ThetaPos       float64   `json:"theta_pos"`
		ThetaNeg       float64   `json:"theta_neg"`
		MultPos        []float64 `json:"mult_pos"`
		MultNeg        []float64 `json:"mult_neg"`
		MultAsym       []float64 `json:"mult_asym"`
	}
}

func rel(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}

func loadData(t *testing.T) map[string]map[string][]float64 {
	dk := refdata.CSVFile(t, "../../testdata/data/denmark.csv")
	mac := refdata.CSVFile(t, "../../testdata/data/macrodata.csv")
	n := len(mac["realcons"])
	mv := map[string][]float64{"lc": make([]float64, n), "ly": make([]float64, n), "r": mac["tbilrate"]}
	for i := 0; i < n; i++ {
		mv["lc"][i] = math.Log(mac["realcons"][i])
		mv["ly"][i] = math.Log(mac["realdpi"][i])
	}
	return map[string]map[string][]float64{"denmark": dk, "macro": mv}
}

func dataFor(name string, d map[string]map[string][]float64) map[string][]float64 {
	if strings.HasPrefix(name, "denmark") {
		return d["denmark"]
	}
	return d["macro"]
}

// smName maps statsmodels' UECM term names to galley's.
func smName(s string) string {
	switch {
	case s == "const" || s == "trend":
		return s
	case strings.HasPrefix(s, "D.") && strings.Contains(s, ".L"):
		i := strings.LastIndex(s, ".L")
		var l int
		fmt.Sscan(s[i+2:], &l)
		return DiffName(s[2:i], l)
	case strings.HasSuffix(s, ".L1"):
		return LevelName(strings.TrimSuffix(s, ".L1"))
	}
	return s
}

var caseOf = []Case{0, NoDet, RestConst, Const, RestTrend, ConstTrend}

// TestAgainstStatsmodels compares the conditional ECM (coefficients and
// classical standard errors), the bounds F statistic in each of the five
// cases, the t-ratio of the lagged level of y and the long-run
// coefficients with their delta-method standard errors with statsmodels
// 0.13.5 (statsmodels.tsa.ardl.UECM, UECMResults.bounds_test, ci_params,
// ci_bse) on the Danish money data and the US macro data (fixture
// testdata/fixtures/ardl_statsmodels.json, script
// testdata/scripts/ardl_statsmodels.py), to 1e-6 relative.
func TestAgainstStatsmodels(t *testing.T) {
	var fx fixture
	refdata.JSONFile(t, "../../testdata/fixtures/ardl_statsmodels.json", &fx)
	if len(fx.Fixed) == 0 {
		t.Fatal("empty fixture")
	}
	data := loadData(t)
	const tol = 1e-6
	for _, c := range fx.Fixed {
		d := dataFor(c.Name, data)
		in := Input{Y: d[c.Y], YName: c.Y, XNames: c.X}
		for _, x := range c.X {
			in.X = append(in.X, d[x])
		}
		m, err := Estimate(in, Spec{Case: caseOf[c.Case], Fixed: &Orders{P: c.P, Q: c.Q}})
		if err != nil {
			t.Fatalf("%s: %v", c.Name, err)
		}
		if m.Fit.N != c.Nobs {
			t.Errorf("%s: N = %d, statsmodels %d", c.Name, m.Fit.N, c.Nobs)
		}
		if len(m.Names) != len(c.Names) {
			t.Fatalf("%s: terms %v, statsmodels %v", c.Name, m.Names, c.Names)
		}
		for j, sn := range c.Names {
			if m.Names[j] != smName(sn) {
				t.Errorf("%s: term %d %q, statsmodels %q", c.Name, j, m.Names[j], sn)
			}
			if rel(m.Coef[j].Est, c.Coef[j]) > tol || rel(m.Coef[j].SE, c.SE[j]) > tol {
				t.Errorf("%s %s: %.10g (%.10g), statsmodels %.10g (%.10g)", c.Name, sn, m.Coef[j].Est, m.Coef[j].SE, c.Coef[j], c.SE[j])
			}
		}
		if rel(m.F, c.F) > tol {
			t.Errorf("%s: bounds F %.10g, statsmodels %.10g", c.Name, m.F, c.F)
		}
		if caseOf[c.Case].HasT() && rel(m.T, c.TYLevel) > tol {
			t.Errorf("%s: bounds t %.10g, statsmodels %.10g", c.Name, m.T, c.TYLevel)
		}
		// statsmodels normalises the levels by the coefficient of y(-1):
		// ci = π/π_y, so θ = −ci, with the same delta-method standard error.
		for _, lr := range m.LongRun {
			found := false
			for i, n := range c.CINames {
				if n == lr.Name {
					found = true
					if rel(lr.Est, -c.CIParams[i]) > tol || rel(lr.SE, c.CIBse[i]) > tol {
						t.Errorf("%s: long-run %s %.10g (%.10g), statsmodels %.10g (%.10g)", c.Name, lr.Name, lr.Est, lr.SE, -c.CIParams[i], c.CIBse[i])
					}
				}
			}
			if !found {
				t.Errorf("%s: long-run term %s not in statsmodels' %v", c.Name, lr.Name, c.CINames)
			}
		}
		if math.Abs(m.Adjust.Alpha-m.Coef[m.Index(LevelName(c.Y))].Est) > 1e-9*math.Abs(m.Adjust.Alpha) {
			t.Errorf("%s: α = %.12g is not π_y = %.12g", c.Name, m.Adjust.Alpha, m.Coef[m.Index(LevelName(c.Y))].Est)
		}
	}
}

// TestSelectionAgainstStatsmodels compares the information criteria of
// every model of the grid with those of statsmodels 0.13.5
// ardl_select_order on the common sample, up to statsmodels' additive
// constant T(ln 2π + 1) + c_T (it counts the variance as a parameter and
// uses −2 log L), to 1e-6 relative, and checks that the same orders are
// chosen on the grid galley searches.
func TestSelectionAgainstStatsmodels(t *testing.T) {
	var fx fixture
	refdata.JSONFile(t, "../../testdata/fixtures/ardl_statsmodels.json", &fx)
	data := loadData(t)
	for _, s := range fx.Selections {
		d := dataFor(s.Name, data)
		in := Input{Y: d[s.Y], YName: s.Y, XNames: s.X}
		for _, x := range s.X {
			in.X = append(in.X, d[x])
		}
		for _, cr := range []rules.Criterion{rules.AIC, rules.BIC} {
			want := s.AIC
			if cr == rules.BIC {
				want = s.BIC
			}
			sel, best, err := Select(in, Const, cr, s.Maxlag, s.Maxorder)
			if err != nil {
				t.Fatalf("%s: %v", s.Name, err)
			}
			if sel.NObs != s.Nobs || len(sel.All) != len(want) {
				t.Fatalf("%s %s: %d models on N = %d, statsmodels %d on %d", s.Name, cr, len(sel.All), sel.NObs, len(want), s.Nobs)
			}
			tn := float64(sel.NObs)
			off := tn*(math.Log(2*math.Pi)+1) + cr.Penalty(sel.NObs)
			bestKey, bestV := "", math.Inf(1)
			for _, c := range sel.All {
				key := c.Orders.String()
				key = strings.ReplaceAll(key, " ", "")
				w, ok := want[key]
				if !ok {
					t.Fatalf("%s: model %s not in statsmodels' grid", s.Name, key)
				}
				if rel(c.Value+off, w) > 1e-6 {
					t.Errorf("%s %s ARDL(%s): %.10g, statsmodels %.10g", s.Name, cr, key, c.Value+off, w)
				}
				if w < bestV {
					bestKey, bestV = key, w
				}
			}
			if got := strings.ReplaceAll(best.String(), " ", ""); got != bestKey {
				t.Errorf("%s %s: chose ARDL(%s), statsmodels' values choose ARDL(%s)", s.Name, cr, got, bestKey)
			}
		}
	}
}

// TestNARDL checks the partial sums, the conditional ECM with decomposed
// regressors, the long- and short-run symmetry F tests and the cumulative
// dynamic multipliers against the fixture's numpy implementation of
// Shin, Yu and Greenwood-Nimmo (2014) with statsmodels 0.13.5 OLS and
// wald_test (same fixture and script), to 1e-6 relative (multipliers:
// 1e-6 relative or 1e-9 absolute near zero).
func TestNARDL(t *testing.T) {
	var fx fixture
	refdata.JSONFile(t, "../../testdata/fixtures/ardl_statsmodels.json", &fx)
	data := loadData(t)
	if len(fx.Nardl) == 0 {
		t.Fatal("no NARDL cases")
	}
	for _, c := range fx.Nardl {
		d := data["macro"]
		pos, neg, _, _, err := PartialSums(d[c.Xasym], c.Tau)
		if err != nil {
			t.Fatal(err)
		}
		for i := range pos {
			if math.Abs(pos[i]-c.Pos[i]) > 1e-9 || math.Abs(neg[i]-c.Neg[i]) > 1e-9 {
				t.Fatalf("%s: partial sums at %d: %g %g, numpy %g %g", c.Name, i, pos[i], neg[i], c.Pos[i], c.Neg[i])
			}
		}
		in := Input{Y: d[c.Y], YName: c.Y}
		var q []int
		for g, x := range c.Xsym {
			in.X = append(in.X, d[x])
			in.XNames = append(in.XNames, x)
			in.Group = append(in.Group, g)
			q = append(q, c.Qsym[g])
		}
		g := len(c.Xsym)
		in.X = append(in.X, pos, neg)
		in.XNames = append(in.XNames, c.Xasym+"_pos", c.Xasym+"_neg")
		in.Group = append(in.Group, g, g)
		q = append(q, c.Qasym)
		m, err := Estimate(in, Spec{Case: Const, Fixed: &Orders{P: c.P, Q: q}})
		if err != nil {
			t.Fatal(err)
		}
		if m.Fit.N != c.Nobs || len(m.Names) != len(c.Names) {
			t.Fatalf("%s: N %d terms %v; numpy N %d terms %v", c.Name, m.Fit.N, m.Names, c.Nobs, c.Names)
		}
		for j, n := range c.Names {
			if m.Names[j] != refdata.TermName(n) || rel(m.Coef[j].Est, c.Coef[j]) > 1e-6 || rel(m.Coef[j].SE, c.SE[j]) > 1e-6 {
				t.Errorf("%s %s: %q %.10g (%.10g), reference %.10g (%.10g)", c.Name, n, m.Names[j], m.Coef[j].Est, m.Coef[j].SE, c.Coef[j], c.SE[j])
			}
		}
		pair := Pair{Name: c.Xasym, Pos: len(in.X) - 2, Neg: len(in.X) - 1}
		lr, sr, err := m.SymmetryTests(in.XNames, pair)
		if err != nil {
			t.Fatal(err)
		}
		if rel(lr.Stat, c.LrF) > 1e-6 || rel(lr.PValue, c.LrP) > 1e-6 {
			t.Errorf("%s: long-run symmetry F %.10g p %.10g, statsmodels %.10g p %.10g", c.Name, lr.Stat, lr.PValue, c.LrF, c.LrP)
		}
		if rel(sr.Stat, c.SrF) > 1e-6 || rel(sr.PValue, c.SrP) > 1e-6 {
			t.Errorf("%s: short-run symmetry F %.10g p %.10g, statsmodels %.10g p %.10g", c.Name, sr.Stat, sr.PValue, c.SrF, c.SrP)
		}
		mu, err := m.Multipliers(pair, c.Horizon)
		if err != nil {
			t.Fatal(err)
		}
		near := func(a, b float64) bool { return rel(a, b) <= 1e-6 || math.Abs(a-b) < 1e-9 }
		for h := 0; h <= c.Horizon; h++ {
			if !near(mu.Pos[h], c.MultPos[h]) || !near(mu.Neg[h], c.MultNeg[h]) || !near(mu.Asym[h], c.MultAsym[h]) {
				t.Errorf("%s h=%d: multipliers %.10g %.10g %.10g, reference %.10g %.10g %.10g", c.Name, h, mu.Pos[h], mu.Neg[h], mu.Asym[h], c.MultPos[h], c.MultNeg[h], c.MultAsym[h])
			}
		}
		if rel(mu.LongPos, c.ThetaPos) > 1e-6 || rel(mu.LongNeg, -c.ThetaNeg) > 1e-6 {
			t.Errorf("%s: θ± %.10g %.10g, reference %.10g %.10g", c.Name, mu.LongPos, mu.LongNeg, c.ThetaPos, -c.ThetaNeg)
		}
	}
}

func TestBadInput(t *testing.T) {
	n := 20
	y, x := make([]float64, n), make([]float64, n)
	for i := 1; i < n; i++ {
		x[i] = x[i-1] + math.Sin(float64(i)*1.7)
		y[i] = 0.5*y[i-1] + 0.3*x[i] + math.Cos(float64(i)*2.3)
	}
	in := Input{Y: y, X: [][]float64{x}}
	if _, err := Estimate(in, Spec{Case: Const, Crit: rules.AIC, MaxP: 8, MaxQ: 8}); err == nil || !strings.Contains(err.Error(), "too few observations for the lag grid") {
		t.Errorf("grid too large for the sample: %v", err)
	}
	if _, err := Estimate(in, Spec{Case: Const, Fixed: &Orders{P: 25, Q: []int{1}}}); err == nil || !strings.Contains(err.Error(), "beyond the sample") {
		t.Errorf("lag beyond the sample: %v", err)
	}
	if _, err := Estimate(in, Spec{Case: Const, Fixed: &Orders{P: 1, Q: []int{1, 2}}}); err == nil {
		t.Error("wrong number of orders: no error")
	}
	if _, err := Estimate(Input{Y: y}, Spec{Case: Const, Fixed: &Orders{P: 1}}); err == nil {
		t.Error("no regressors: no error")
	}
	up := make([]float64, n)
	for i := range up {
		up[i] = float64(i * i)
	}
	if _, _, _, _, err := PartialSums(up, 0); err == nil || !strings.Contains(err.Error(), "negative partial sum") {
		t.Errorf("a rising series has no falls: %v", err)
	}
	if _, _, _, _, err := PartialSums(up, 1e9); err == nil || !strings.Contains(err.Error(), "positive partial sum") {
		t.Errorf("no change above a huge threshold: %v", err)
	}
	nan := append([]float64(nil), y...)
	nan[3] = math.NaN()
	if _, err := Estimate(Input{Y: nan, X: [][]float64{x}}, Spec{Case: Const, Fixed: &Orders{P: 1, Q: []int{1}}}); err == nil {
		t.Error("NaN: no error")
	}
}
