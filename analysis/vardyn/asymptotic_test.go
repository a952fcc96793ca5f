package vardyn

import (
	"encoding/json"
	"math"
	"os"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
)

// Asymptotic standard errors of impulse responses against statsmodels
// 0.13.5 (VARResults.irf(10).stderr(orth=False/True) and .cov) and, for
// the generalised responses, a numpy complex-step Jacobian of Φ_h Σ D^{−1/2}
// combined with statsmodels' coefficient and vech(Σ) covariances:
// testdata/fixtures/vardyn_irf_stderr.json, written by
// testdata/scripts/vardyn_irf_stderr.py. Tolerance 1e-6 relative (with an
// absolute floor for values that are zero, such as Φ_0's).

type irfSEFixture struct {
	Library, Version, Numpy, Scipy string
	Z                              map[string]float64
	Cases                          []struct {
		Name, Trend         string
		Lags, Nobs, Horizon int
		Stderr              [][][]float64
		OrthStderr          [][][]float64 `json:"orth_stderr"`
		CovRaw              [][][]float64 `json:"cov"`
		OrthCovRaw          [][][]float64 `json:"orth_cov"`
		GirfCovRaw          [][][]float64 `json:"girf_cov"`
		Girf                [][][]float64
		GirfStderr          [][][]float64 `json:"girf_stderr"`
	}
	Ordered struct {
		Case       string
		Order      []int
		OrthStderr [][][]float64 `json:"orth_stderr"`
	}
}

func loadIRFSE(t testing.TB) *irfSEFixture {
	t.Helper()
	b, err := os.ReadFile("../../testdata/fixtures/vardyn_irf_stderr.json")
	if err != nil {
		t.Fatal(err)
	}
	var f irfSEFixture
	if err := json.Unmarshal(b, &f); err != nil {
		t.Fatal(err)
	}
	if len(f.Cases) != 3 || len(f.Cases[0].CovRaw) != 11 || len(f.Cases[0].OrthCovRaw) != 11 || len(f.Cases[0].GirfCovRaw) != 11 ||
		len(f.Ordered.OrthStderr) != 11 || len(f.Z) != 3 || !strings.HasPrefix(f.Version, "0.13.5") {
		t.Fatal("the fixture lacks entries the tests need")
	}
	for _, c := range f.Cases {
		if len(c.Stderr) != c.Horizon+1 || len(c.OrthStderr) != c.Horizon+1 || len(c.GirfStderr) != c.Horizon+1 || c.Stderr[1][0][0] == 0 {
			t.Fatalf("case %s is incomplete", c.Name)
		}
	}
	return &f
}

var caseDet = map[string]Det{"n": NoDet, "c": Const, "ct": ConstTrend}

func caseVAR(t *testing.T, name string, lags int, trend string) *VAR {
	t.Helper()
	var y *mat.Dense
	switch name {
	case "growth":
		y = macroGrowth(t)
	case "levels":
		y = macroLevels(t)
	case "denmark":
		y = denmark(t)
	default:
		t.Fatalf("unknown case %s", name)
	}
	v, err := Fit(y, lags, caseDet[trend])
	if err != nil {
		t.Fatal(err)
	}
	return v
}

// checkSymMats compares covariance matrices element by element.
func checkSymMats(t *testing.T, what string, got []*mat.SymDense, want [][][]float64, floor float64) {
	t.Helper()
	d := make([]*mat.Dense, len(got))
	for s, g := range got {
		d[s] = mat.DenseCopyOf(g)
	}
	checkMats(t, what, d, want, floor)
}

func TestResponseStdErrAgainstStatsmodels(t *testing.T) {
	f := loadIRFSE(t)
	lib := " (" + f.Library + " " + f.Version + ")"
	for _, c := range f.Cases {
		v := caseVAR(t, c.Name, c.Lags, c.Trend)
		if v.T != c.Nobs {
			t.Fatalf("%s: T = %d, statsmodels %d", c.Name, v.T, c.Nobs)
		}
		ca, err := v.CoefCov()
		if err != nil {
			t.Fatal(err)
		}
		cs, err := VechCov(v.Sigma, v.T)
		if err != nil {
			t.Fatal(err)
		}
		phiCov, err := MACov(v.A, ca, c.Horizon)
		if err != nil {
			t.Fatal(err)
		}
		// The floor: Φ_0 and the upper triangle of Θ_0 have standard error 0.
		checkMats(t, c.Name+" stderr"+lib, StdErrs(phiCov), c.Stderr, 1e-3)
		se, err := v.ResponseStdErr(Responses{Horizon: c.Horizon})
		if err != nil {
			t.Fatal(err)
		}
		checkMats(t, c.Name+" orth_stderr"+lib, se, c.OrthStderr, 1e-3)
		gse, err := v.ResponseStdErr(Responses{Horizon: c.Horizon, Generalised: true})
		if err != nil {
			t.Fatal(err)
		}
		checkMats(t, c.Name+" girf_stderr (numpy complex step, "+f.Numpy+")", gse, c.GirfStderr, 1e-3)
		phi, _ := MA(v.A, c.Horizon)
		gi, _ := Generalised(phi, v.Sigma)
		checkMats(t, c.Name+" girf", gi, c.Girf, 1e-3)
		if c.CovRaw != nil {
			checkSymMats(t, c.Name+" cov"+lib, phiCov, c.CovRaw, 1e-3)
			oc, err := OrthogonalisedCov(v.A, v.Sigma, ca, cs, nil, c.Horizon)
			if err != nil {
				t.Fatal(err)
			}
			checkSymMats(t, c.Name+" orth_cov"+lib, oc, c.OrthCovRaw, 1e-3)
			gc, err := GeneralisedCov(v.A, v.Sigma, ca, cs, c.Horizon)
			if err != nil {
				t.Fatal(err)
			}
			checkSymMats(t, c.Name+" girf_cov (numpy complex step)", gc, c.GirfCovRaw, 1e-3)
		}
	}
}

// TestOrderedStdErr: the orthogonalised responses in another Cholesky
// ordering against statsmodels' fit of the reordered data.
func TestOrderedStdErr(t *testing.T) {
	f := loadIRFSE(t)
	v := caseVAR(t, "growth", 2, "c")
	o := f.Ordered.Order
	se, err := v.ResponseStdErr(Responses{Horizon: len(f.Ordered.OrthStderr) - 1, Order: o})
	if err != nil {
		t.Fatal(err)
	}
	for s := range f.Ordered.OrthStderr {
		for a := range o {
			for b := range o {
				if g, w := se[s].At(o[a], o[b]), f.Ordered.OrthStderr[s][a][b]; !near(g, w, 1e-6, 1e-3) {
					t.Errorf("ordered stderr h=%d response %d shock %d = %.12g, statsmodels %.12g", s, o[a], o[b], g, w)
				}
			}
		}
	}
}

func TestAsymptoticBands(t *testing.T) {
	f := loadIRFSE(t)
	v := caseVAR(t, "growth", 2, "c")
	r := Responses{Horizon: 4}
	theta, err := r.Compute(v.A, v.Sigma)
	if err != nil {
		t.Fatal(err)
	}
	se, err := v.ResponseStdErr(r)
	if err != nil {
		t.Fatal(err)
	}
	for cs, z := range f.Z {
		var c float64
		if err := json.Unmarshal([]byte(cs), &c); err != nil {
			t.Fatal(err)
		}
		b, err := AsymptoticBands(theta, se, c)
		if err != nil {
			t.Fatal(err)
		}
		if !near(b.Z, z, 1e-12, 0) {
			t.Errorf("coverage %g: z = %.15g, scipy %s %.15g", c, b.Z, f.Scipy, z)
		}
		for s := range theta {
			for i := 0; i < 3; i++ {
				for j := 0; j < 3; j++ {
					th, e := theta[s].At(i, j), se[s].At(i, j)
					if !near(b.Lower[s][i][j], th-z*e, 1e-12, 1e-12) || !near(b.Upper[s][i][j], th+z*e, 1e-12, 1e-12) {
						t.Errorf("coverage %g h=%d (%d,%d): [%g, %g], want θ ± %g·%g (z from scipy %s)", c, s, i, j, b.Lower[s][i][j], b.Upper[s][i][j], z, e, f.Scipy)
					}
				}
			}
		}
	}
	if _, err := AsymptoticBands(theta, se, 1); err == nil {
		t.Error("coverage 1 accepted")
	}
	if _, err := AsymptoticBands(theta, se[:2], 0.9); err == nil {
		t.Error("mismatched lengths accepted")
	}
}

func TestAsymptoticBadInput(t *testing.T) {
	v := caseVAR(t, "growth", 2, "c")
	ca, _ := v.CoefCov()
	cs, _ := VechCov(v.Sigma, v.T)
	small := mat.NewSymDense(3, nil)
	if _, err := OrthogonalisedCov(v.A, v.Sigma, small, cs, nil, 3); err == nil {
		t.Error("a wrong-sized coefficient covariance accepted")
	}
	if _, err := GeneralisedCov(v.A, v.Sigma, ca, small, 3); err == nil {
		t.Error("a wrong-sized covariance of vech(Σ) accepted")
	}
	if _, err := OrthogonalisedCov(v.A, v.Sigma, ca, cs, []int{0, 0, 1}, 3); err == nil {
		t.Error("a bad ordering accepted")
	}
	notPD := mat.NewSymDense(3, []float64{1, 2, 0, 2, 1, 0, 0, 0, 1})
	if _, err := OrthogonalisedCov(v.A, notPD, ca, cs, nil, 3); err == nil {
		t.Error("an indefinite Σ accepted")
	}
	zero := mat.NewSymDense(3, []float64{1, 0, 0, 0, 0, 0, 0, 0, 1})
	if _, err := GeneralisedCov(v.A, zero, ca, cs, 3); err == nil {
		t.Error("a zero innovation variance accepted")
	}
	if _, err := MACov(v.A, ca, -1); err == nil {
		t.Error("a negative horizon accepted")
	}
	if _, err := MACov(nil, ca, 3); err == nil {
		t.Error("no coefficients accepted")
	}
	if _, err := VechCov(v.Sigma, 0); err == nil {
		t.Error("zero observations accepted")
	}
	if _, err := (*VAR)(nil).ResponseStdErr(Responses{Horizon: 2}); err == nil {
		t.Error("a nil VAR accepted")
	}
	if _, err := (&VAR{}).CoefCov(); err == nil {
		t.Error("an empty VAR accepted")
	}
	nonSquare := []*mat.Dense{mat.NewDense(3, 2, nil)}
	if _, err := MAJacobians(nonSquare, []*mat.Dense{identity(3)}); err == nil {
		t.Error("a non-square coefficient matrix accepted")
	}
	if se := StdErrs([]*mat.SymDense{mat.NewSymDense(4, []float64{-1e-18, 0, 0, 0, 0, 4, 0, 0, 0, 0, 9, 0, 0, 0, 0, 1})}); se[0].At(0, 0) != 0 || math.Abs(se[0].At(1, 0)-2) > 0 || se[0].At(0, 1) != 3 {
		t.Errorf("StdErrs: %v", mat.Formatted(se[0]))
	}
}

// TestVECMResponseStdErr: the responses of a VECM in its VAR form against
// statsmodels 0.13.5 VECMResults.irf(10).stderr (its cov_var_repr, β
// fixed), and the generalised ones against the numpy complex step on the
// same covariances.
func TestVECMResponseStdErr(t *testing.T) {
	b, err := os.ReadFile("../../testdata/fixtures/vardyn_irf_stderr.json")
	if err != nil {
		t.Fatal(err)
	}
	var f struct {
		Version string
		VECM    []struct {
			Name, Trend   string
			KArDiff       int `json:"k_ar_diff"`
			Nobs, Horizon int
			Stderr, Girf  [][][]float64
			OrthStderr    [][][]float64 `json:"orth_stderr"`
			GirfStderr    [][][]float64 `json:"girf_stderr"`
		} `json:"vecm"`
	}
	if err := json.Unmarshal(b, &f); err != nil {
		t.Fatal(err)
	}
	if len(f.VECM) != 4 {
		t.Fatal("the fixture lacks the VECM cases")
	}
	lib := " (statsmodels " + f.Version + ")"
	for _, c := range f.VECM {
		if len(c.Stderr) != c.Horizon+1 || len(c.OrthStderr) != c.Horizon+1 || len(c.GirfStderr) != c.Horizon+1 || c.KArDiff < 1 {
			t.Fatalf("case %s is incomplete", c.Name)
		}
		r, err := johansen.Test(denmark(t), vecmCase[c.Trend], c.KArDiff)
		if err != nil {
			t.Fatal(err)
		}
		m, err := r.Estimate(1, []int{0})
		if err != nil {
			t.Fatal(err)
		}
		if n, _ := m.Resid.Dims(); n != c.Nobs {
			t.Fatalf("%s: T = %d, statsmodels %d", c.Name, n, c.Nobs)
		}
		ca, err := VECMCoefCov(m)
		if err != nil {
			t.Fatal(err)
		}
		pc, err := MACov(m.VARForm(), ca, c.Horizon)
		if err != nil {
			t.Fatal(err)
		}
		checkMats(t, c.Name+" stderr"+lib, StdErrs(pc), c.Stderr, 1e-3)
		se, err := VECMResponseStdErr(m, Responses{Horizon: c.Horizon})
		if err != nil {
			t.Fatal(err)
		}
		checkMats(t, c.Name+" orth_stderr"+lib, se, c.OrthStderr, 1e-3)
		gse, err := VECMResponseStdErr(m, Responses{Horizon: c.Horizon, Generalised: true})
		if err != nil {
			t.Fatal(err)
		}
		checkMats(t, c.Name+" girf_stderr (numpy complex step)", gse, c.GirfStderr, 1e-3)
	}
	if _, err := VECMCoefCov(nil); err == nil {
		t.Error("a nil VECM accepted")
	}
}
