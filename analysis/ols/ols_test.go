package ols_test

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/householder"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/internal/refdata"
)

type olsCase struct {
	Name  string               `json:"name"`
	Terms []string             `json:"terms"`
	NObs  int                  `json:"nobs"`
	Coef  []float64            `json:"coef"`
	SEOLS []float64            `json:"se_ols"`
	SEHC1 []float64            `json:"se_hc1"`
	HAC   map[string][]float64 `json:"hac"`
	R2    float64              `json:"r2"`
	R2Adj float64              `json:"r2_adj"`
	// KConst is statsmodels' k_constant (1 with a constant, 0 without);
	// R2C and R2U are 1 − ssr/centered_tss and 1 − ssr/uncentered_tss.
	KConst int     `json:"k_constant"`
	R2C    float64 `json:"r2_centred"`
	R2U    float64 `json:"r2_uncentred"`
	DW     float64 `json:"dw"`
	LogLik float64 `json:"loglik"`
}

func relClose(t *testing.T, what string, got, want, tol float64) {
	t.Helper()
	if d := math.Abs(got - want); d > tol*math.Abs(want) || math.IsNaN(got) {
		t.Errorf("%s = %.12g, want %.12g (rel tol %g)", what, got, want, tol)
	}
}

func design(cols ...[]float64) *mat.Dense {
	n := len(cols[0])
	x := mat.NewDense(n, len(cols), nil)
	for j, c := range cols {
		for i, v := range c {
			x.Set(i, j, v)
		}
	}
	return x
}

func logs(v []float64) []float64 {
	out := make([]float64, len(v))
	for i, x := range v {
		out[i] = math.Log(x)
	}
	return out
}

func diff(v []float64) []float64 {
	out := make([]float64, len(v)-1)
	for i := range out {
		out[i] = v[i+1] - v[i]
	}
	return out
}

func ones(n int) []float64 {
	out := make([]float64, n)
	for i := range out {
		out[i] = 1
	}
	return out
}

// TestAgainstStatsmodels compares coefficients, the three covariance
// types, R², adjusted R², Durbin–Watson and the log-likelihood with
// statsmodels 0.13.5 OLS (fixture testdata/fixtures/ols_macrodata.json,
// made by testdata/scripts/ols_macrodata.py) on the statsmodels US macro
// data, to 1e-8 relative.
func TestAgainstStatsmodels(t *testing.T) {
	var fx struct {
		Source string    `json:"source"`
		Cases  []olsCase `json:"cases"`
	}
	if err := refdata.Fixture("ols_macrodata", &fx); err != nil {
		t.Fatal(err)
	}
	_, d, err := refdata.CSV("macrodata")
	if err != nil {
		t.Fatal(err)
	}
	n := len(d["realcons"])
	lc, ly, li := logs(d["realcons"]), logs(d["realdpi"]), logs(d["realinv"])
	inputs := map[string]struct {
		y []float64
		x *mat.Dense
	}{
		"logcons_on_logdpi":           {lc, design(ones(n), ly)},
		"logcons_on_logdpi_loginv":    {lc, design(ones(n), ly, li)},
		"infl_on_tbil_unemp":          {d["infl"], design(ones(n), d["tbilrate"], d["unemp"])},
		"dlogcons_on_dlogdpi_noconst": {diff(lc), design(diff(ly))},
	}
	const tol = 1e-8
	for _, c := range fx.Cases {
		in, ok := inputs[c.Name]
		if !ok {
			t.Fatalf("fixture case %q has no inputs here", c.Name)
		}
		t.Run(c.Name, func(t *testing.T) {
			f, err := ols.Regress(in.y, in.x)
			if err != nil {
				t.Fatal(err)
			}
			if f.N != c.NObs {
				t.Fatalf("N = %d, want %d", f.N, c.NObs)
			}
			covs := map[string]ols.CovSpec{"ols": {Kind: ols.Classical}, "hc1": {Kind: ols.HC1}}
			want := map[string][]float64{"ols": c.SEOLS, "hc1": c.SEHC1}
			for l, se := range c.HAC {
				var L int
				for _, ch := range l {
					L = L*10 + int(ch-'0')
				}
				covs["hac"+l] = ols.CovSpec{Kind: ols.HAC, Lags: L}
				want["hac"+l] = se
			}
			for j := range c.Coef {
				relClose(t, c.Terms[j]+" coef", f.Coef[j], c.Coef[j], tol)
			}
			for name, cs := range covs {
				se := ols.SE(f.Cov(cs))
				for j := range se {
					relClose(t, name+" se "+c.Terms[j], se[j], want[name][j], tol)
				}
			}
			// statsmodels' rsquared is centred with a constant and
			// uncentred without one; both forms are in the fixture.
			relClose(t, "R2 centred", f.R2(), c.R2C, tol)
			relClose(t, "R2 uncentred", f.R2Uncentred(), c.R2U, tol)
			switch c.KConst {
			case 1:
				relClose(t, "R2", f.R2(), c.R2, tol)
				relClose(t, "R2adj", f.R2Adj(), c.R2Adj, tol)
			case 0:
				relClose(t, "R2 (no constant)", f.R2Uncentred(), c.R2, tol)
				relClose(t, "R2adj (no constant)", f.R2AdjUncentred(), c.R2Adj, tol)
				if !(f.R2() < 0) {
					t.Errorf("the centred R² of this case is negative in statsmodels (%g), here %g", c.R2C, f.R2())
				}
			default:
				t.Fatalf("k_constant %d", c.KConst)
			}
			relClose(t, "DW", f.DW(), c.DW, tol)
			relClose(t, "loglik", f.LogLik(), c.LogLik, tol)
		})
	}
}

func TestCollinear(t *testing.T) {
	x := []float64{1, 2, 3, 4, 5, 6}
	y := []float64{1, 3, 2, 5, 4, 6}
	two := make([]float64, len(x))
	for i := range x {
		two[i] = 2*x[i] + 1
	}
	_, err := ols.Regress(y, design(ones(6), x, two))
	var ce *ols.CollinearError
	if !errors.As(err, &ce) || ce.Col != 2 {
		t.Fatalf("err = %v, want collinearity of column 2", err)
	}
	if _, err := ols.Regress(y[:2], design(ones(2), x[:2])); !errors.Is(err, ols.ErrTooFewObs) {
		t.Fatalf("err = %v, want ErrTooFewObs", err)
	}
}

// TestScaleInvariance: multiplying a regressor by 1e8 divides its
// coefficient by 1e8 and leaves the fit unchanged (QR on scaled columns).
func TestScaleInvariance(t *testing.T) {
	_, d, err := refdata.CSV("macrodata")
	if err != nil {
		t.Fatal(err)
	}
	n := len(d["realcons"])
	ly := logs(d["realdpi"])
	big := make([]float64, n)
	for i := range big {
		big[i] = ly[i] * 1e8
	}
	y := logs(d["realcons"])
	a, _ := ols.Regress(y, design(ones(n), ly))
	b, _ := ols.Regress(y, design(ones(n), big))
	relClose(t, "scaled coef", b.Coef[1]*1e8, a.Coef[1], 1e-8)
	relClose(t, "scaled se", ols.SE(b.Cov(ols.CovSpec{Kind: ols.HAC, Lags: 4}))[1]*1e8, ols.SE(a.Cov(ols.CovSpec{Kind: ols.HAC, Lags: 4}))[1], 1e-8)
	relClose(t, "scaled SSR", b.SSR, a.SSR, 1e-8)
}

func TestParseCov(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want string
		bad  bool
	}{{"ols", "ols", false}, {"HC1", "hc1", false}, {"hac(4)", "hac(4)", false}, {"hac( 12 )", "hac(12)", false}, {"hac(x)", "", true}, {"hc3", "", true}} {
		c, err := ols.ParseCov(tc.in)
		if tc.bad != (err != nil) || (!tc.bad && c.String() != tc.want) {
			t.Errorf("ParseCov(%q) = %v, %v", tc.in, c, err)
		}
	}
}

// TestRegressEachBitForBit: several responses fitted from one
// factorisation give exactly what Regress gives for each alone; a bad
// response is the error Regress reports.
func TestRegressEachBitForBit(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	n, k := 500, 6
	x := mat.NewDense(n, k, nil)
	for i := 0; i < n; i++ {
		x.Set(i, 0, 1)
		for j := 1; j < k; j++ {
			x.Set(i, j, r.NormFloat64()*float64(j))
		}
	}
	ys := make([][]float64, 4)
	for q := range ys {
		ys[q] = make([]float64, n)
		for i := range ys[q] {
			ys[q][i] = x.At(i, 1)*float64(q) + r.NormFloat64()
		}
	}
	fits, err := ols.RegressEach(ys, x)
	if err != nil {
		t.Fatal(err)
	}
	same := func(a, b []float64) bool {
		if len(a) != len(b) {
			return false
		}
		for i := range a {
			if math.Float64bits(a[i]) != math.Float64bits(b[i]) {
				return false
			}
		}
		return true
	}
	for q, y := range ys {
		one, err := ols.Regress(y, x)
		if err != nil {
			t.Fatal(err)
		}
		g := fits[q]
		cg, co := g.Cov(ols.CovSpec{Kind: ols.Classical}), one.Cov(ols.CovSpec{Kind: ols.Classical})
		if !same(g.Coef, one.Coef) || !same(g.Resid, one.Resid) || !same(g.Fitted, one.Fitted) ||
			g.SSR != one.SSR || g.TSS != one.TSS || g.YY != one.YY || g.Cond != one.Cond || !same(cg.RawSymmetric().Data, co.RawSymmetric().Data) {
			t.Errorf("response %d: the shared factorisation differs from Regress", q)
		}
	}
	ys[2][7] = math.NaN()
	if _, err := ols.RegressEach(ys, x); err == nil || err.Error() != "ols: y[7] is not finite" {
		t.Errorf("got %v", err)
	}
}

// TestRegressEachColumnsBitForBit: the fits in the caller's storage equal
// RegressEach's bit for bit (coefficients, SSR, classical covariance,
// residuals), and to 1e-12 when the storage holds the rows of R from a QR
// of [X Y] instead of the data; malformed storage, a non-finite response and a collinear
// column are errors.
func TestRegressEachColumnsBitForBit(t *testing.T) {
	r := rand.New(rand.NewPCG(8, 9))
	n, k, q := 700, 5, 3
	x := mat.NewDense(n, k, nil)
	ys := make([][]float64, q)
	for h := range ys {
		ys[h] = make([]float64, n)
	}
	for i := 0; i < n; i++ {
		x.Set(i, 0, 1)
		for j := 1; j < k; j++ {
			x.Set(i, j, r.NormFloat64()*float64(j)+float64(i%5))
		}
		for h := range ys {
			ys[h][i] = x.At(i, 2)*float64(h) + r.NormFloat64()
		}
	}
	want, err := ols.RegressEach(ys, x)
	if err != nil {
		t.Fatal(err)
	}
	fill := func() ([][]float64, func(int, []float64, []float64), [][]float64) {
		cols := householder.Columns(x, q)
		for h, y := range ys {
			copy(cols[k+h], y)
		}
		row := func(i int, xr, yr []float64) {
			mat.Row(xr, i, x)
			for h, y := range ys {
				yr[h] = y[i]
			}
		}
		resid := make([][]float64, q)
		for h := range resid {
			resid[h] = make([]float64, n)
		}
		return cols, row, resid
	}
	cols, row, resid := fill()
	got, err := ols.RegressEachColumns(cols, k, n, row, resid)
	if err != nil {
		t.Fatal(err)
	}
	bits := func(a, b []float64) bool {
		for i := range a {
			if math.Float64bits(a[i]) != math.Float64bits(b[i]) {
				return false
			}
		}
		return len(a) == len(b)
	}
	for h, w := range want {
		g := got[h]
		wc := w.Cov(ols.CovSpec{Kind: ols.Classical})
		if g.N != n || g.K != k || !bits(g.Coef, w.Coef) || g.SSR != w.SSR || !bits(resid[h], w.Resid) ||
			!bits(g.Cov.RawSymmetric().Data, wc.RawSymmetric().Data) {
			t.Errorf("response %d differs from RegressEach", h)
		}
	}
	// The rows of R from a QR of [X Y] have X's and Y's cross-products:
	// the same fits (to rounding) from k+q rows instead of n.
	var qr householder.QR
	full, row, resid := fill()
	if err := qr.Factor(full, k+q); err != nil {
		t.Fatal(err)
	}
	small := make([][]float64, k+q)
	for j := range small {
		small[j] = make([]float64, k+q)
		for i := 0; i <= j; i++ {
			small[j][i] = qr.RAt(i, j)
		}
	}
	got, err = ols.RegressEachColumns(small, k, n, row, resid)
	if err != nil {
		t.Fatal(err)
	}
	for h, w := range want {
		g, wc := got[h], w.Cov(ols.CovSpec{Kind: ols.Classical})
		if g.N != n || g.K != k || math.Abs(g.SSR-w.SSR) > 1e-12*w.SSR {
			t.Errorf("response %d from R: N %d K %d SSR %g, want %d %d %g", h, g.N, g.K, g.SSR, n, k, w.SSR)
		}
		for j := range w.Coef {
			if se := math.Sqrt(wc.At(j, j)); math.Abs(g.Coef[j]-w.Coef[j]) > 1e-12*se || math.Abs(math.Sqrt(g.Cov.At(j, j))-se) > 1e-12*se {
				t.Errorf("response %d from R: coefficient %d %.17g (s.e. %.17g), want %.17g (%.17g)", h, j, g.Coef[j], math.Sqrt(g.Cov.At(j, j)), w.Coef[j], se)
			}
		}
		for i, e := range resid[h] {
			if math.Abs(e-w.Resid[i]) > 1e-12*math.Sqrt(w.SSR/float64(n)) {
				t.Fatalf("response %d from R: residual %d %.17g, want %.17g", h, i, e, w.Resid[i])
			}
		}
	}
	cols, row, resid = fill()
	if _, err := ols.RegressEachColumns(cols, k, n, row, resid[:2]); err == nil {
		t.Error("two residual vectors for three responses: no error")
	}
	if _, err := ols.RegressEachColumns(cols[:k], k, n, row, nil); err == nil {
		t.Error("no response: no error")
	}
	cols[k+1][9] = math.Inf(1)
	if _, err := ols.RegressEachColumns(cols, k, n, row, resid); err == nil || err.Error() != "ols: y[9] is not finite" {
		t.Errorf("infinite response: got %v", err)
	}
	cols, row, resid = fill()
	copy(cols[3], cols[1])
	var ce *ols.CollinearError
	if _, err := ols.RegressEachColumns(cols, k, n, row, resid); !errors.As(err, &ce) || ce.Col != 3 {
		t.Errorf("duplicated column: got %v", err)
	}
}
