package unitroot

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/ols"
	"gonum.org/v1/gonum/mat"
)

// randomWalk is a seeded Gaussian random walk with AR(1) increments
// (φ = 0.3), so that lagged differences matter.
func randomWalk(n int, seed uint64) []float64 {
	r := rand.New(rand.NewPCG(seed, 1))
	y := make([]float64, n)
	var e float64
	for t := 1; t < n; t++ {
		e = 0.3*e + r.NormFloat64()
		y[t] = y[t-1] + e
	}
	return y
}

// The nested least squares of selectLag must equal separate regressions
// on the common sample (package ols, Householder QR): SSR and the t-ratio
// of the last lag for every p, to 1e-9 relative.
func TestNestedMatchesSeparateRegressions(t *testing.T) {
	y := logs(column(t, "macrodata.csv", "realcons"))
	for _, c := range []critical.Case{critical.NoConst, critical.Const, critical.ConstTrend, critical.ConstTrendSq} {
		const max = 10
		det, d := caseDet(c)
		cols, n := selectionColumns(y, det, d, max)
		m := len(cols) - 1
		// The same design row-wise from dfDesign, the response by hand.
		a := dfDesign(y, det, d, max, max+1, 0)
		full := mat.NewDense(n, m, a.Data)
		resp := make([]float64, n)
		for i := range resp {
			resp[i] = y[max+1+i] - y[max+i]
			for j := 0; j < m; j++ {
				if cols[j][i] != full.At(i, j) {
					t.Fatalf("%s: column %d row %d differs between the two designs", c, j, i)
				}
			}
			if cols[m][i] != resp[i] {
				t.Fatalf("%s: response row %d differs", c, i)
			}
		}
		ns := nested(cols)
		for p := 0; p <= max; p++ {
			j := d + 1 + p
			fit, err := ols.Regress(resp, mat.DenseCopyOf(full.Slice(0, n, 0, j)))
			if err != nil {
				t.Fatal(err)
			}
			if e := relErr(ns.ssr[j-1], fit.SSR); e > 1e-9 {
				t.Errorf("%s p=%d: nested SSR %.12g, separate %.12g", c, p, ns.ssr[j-1], fit.SSR)
			}
			tab := fit.Table(ols.CovSpec{}, false)
			if e := relErr(ns.t[j-1], tab[j-1].T); e > 1e-9 {
				t.Errorf("%s p=%d: nested t %.12g, separate %.12g", c, p, ns.t[j-1], tab[j-1].T)
			}
		}
	}
}

// The default maximum lag is Schwert's ⌊12(T/100)^{1/4}⌋: for T = 203,
// 12·2.03^{1/4} = 14.32 → 14; for T = 55, 12·0.55^{1/4} = 10.33 → 10
// (below the cap ⌊55/2⌋ − 1 − 1 = 25).
func TestDefaultMaxLag(t *testing.T) {
	for _, tc := range []struct {
		name string
		want int
	}{{"log_realgdp", 14}, {"denmark_LRM", 10}} {
		reg, err := DickeyFuller(series(t, tc.name), critical.Const, LagRule{Select: AIC, Max: -1})
		if err != nil {
			t.Fatal(err)
		}
		if reg.MaxLag != tc.want || len(reg.IC) != tc.want+1 {
			t.Errorf("%s: MaxLag %d (%d criteria), want %d", tc.name, reg.MaxLag, len(reg.IC), tc.want)
		}
	}
	// A short series: T = 12 gives ⌊12·0.12^{1/4}⌋ = 7, capped at 12/2 − 1 − 1 = 4.
	reg, err := DickeyFuller(randomWalk(12, 3), critical.Const, LagRule{Select: BIC, Max: -1})
	if err != nil {
		t.Fatal(err)
	}
	if reg.MaxLag != 4 {
		t.Errorf("T=12: MaxLag %d, want 4", reg.MaxLag)
	}
}

func TestDickeyFullerErrors(t *testing.T) {
	good := randomWalk(50, 1)
	nan := append([]float64(nil), good...)
	nan[7] = math.NaN()
	flat := make([]float64, 30)
	for i := range flat {
		flat[i] = 2.5
	}
	for _, tc := range []struct {
		name string
		y    []float64
		c    critical.Case
		r    LagRule
		want string
	}{
		{"nan", nan, critical.Const, LagRule{}, "observation 8 is not finite"},
		{"constant", flat, critical.Const, LagRule{}, "constant"},
		{"negative lags", good, critical.Const, LagRule{Lags: -1}, "negative"},
		{"too many lags", good, critical.Const, LagRule{Lags: 30}, "too few observations"},
		{"too large max", good, critical.ConstTrend, LagRule{Select: AIC, Max: 30}, "too few observations"},
		{"short", []float64{1, 2}, critical.Const, LagRule{}, "need at least 3"},
		{"selector", good, critical.Const, LagRule{Select: Selector(9)}, "unknown lag selector"},
		{"case", good, critical.Case(5), LagRule{}, "unsupported deterministic case"},
	} {
		_, err := DickeyFuller(tc.y, tc.c, tc.r)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: error %v, want %q", tc.name, err, tc.want)
		}
	}
	_, err := DickeyFuller(good, critical.Const, LagRule{Lags: 30})
	if !errors.Is(err, ols.ErrTooFewObs) {
		t.Errorf("too many lags: %v does not wrap ols.ErrTooFewObs", err)
	}
}

func TestOtherTestErrors(t *testing.T) {
	y := randomWalk(60, 2)
	if _, err := PP(y, critical.ConstTrendSq, Bandwidth{}); err == nil || !strings.Contains(err.Error(), "n, c and ct") {
		t.Errorf("PP ctt: %v", err)
	}
	if _, err := KPSS(y, critical.NoConst, Bandwidth{}); err == nil || !strings.Contains(err.Error(), "level (c) and trend (ct)") {
		t.Errorf("KPSS n: %v", err)
	}
	if _, err := DFGLS(y, critical.NoConst, LagRule{}); err == nil || !strings.Contains(err.Error(), "constant (c) and trend (ct)") {
		t.Errorf("DFGLS n: %v", err)
	}
	if _, err := ZA(y, critical.BreakBoth, 0.6, LagRule{}); err == nil || !strings.Contains(err.Error(), "below 0.5") {
		t.Errorf("ZA trim 0.6: %v", err)
	}
	if _, err := KPSS(y, critical.Const, Bandwidth{Rule: Given, Lags: 60}); err == nil {
		t.Error("KPSS with bandwidth = T gave no error")
	}
	if _, err := ADF([]float64{1, math.Inf(1), 2, 3}, critical.Const, LagRule{}); err == nil {
		t.Error("ADF with +Inf gave no error")
	}
}

// With bandwidth 0 the long-run variance equals γ0, so Z(t) must equal
// the Dickey–Fuller τ and Z(α) must equal T·γ̂ (Phillips and Perron 1988,
// by construction of the correction). This also covers case n, which
// urca's ur.pp does not offer.
func TestPPZeroBandwidthIsDickeyFuller(t *testing.T) {
	y := series(t, "tbilrate")
	for _, c := range []critical.Case{critical.NoConst, critical.Const, critical.ConstTrend} {
		res, err := PP(y, c, Bandwidth{Rule: Given})
		if err != nil {
			t.Fatal(err)
		}
		df, _ := DickeyFuller(y, c, LagRule{})
		if relErr(res.Stat, df.Stat) > 1e-12 || relErr(res.StatAlpha, float64(df.NObs)*df.Gamma) > 1e-12 {
			t.Errorf("%s: Z(t) %g vs τ %g, Z(α) %g vs Tγ̂ %g", c, res.Stat, df.Stat, res.StatAlpha, float64(df.NObs)*df.Gamma)
		}
		want, _ := critical.MacKinnonTauAll(1, c, df.NObs)
		for i := range want {
			if res.Crit[i] != want[i] {
				t.Errorf("%s: PP critical values %v, want MacKinnonTau at T=%d %v", c, res.Crit, df.NObs, want)
			}
		}
		if len(res.CritAlpha) != 4 {
			t.Errorf("%s: %d Z(α) critical values", c, len(res.CritAlpha))
		}
	}
}

// DF-GLS wiring: the constant case uses MacKinnonTau(1, n, NObs) and
// MacKinnonP(·, 1, n); the trend case ERS (1996) at T = len(y) and no
// p-value. Selection goes through DickeyFuller on the detrended series.
func TestDFGLSWiring(t *testing.T) {
	y := series(t, "log_realgdp")
	res, err := DFGLS(y, critical.Const, LagRule{Select: BIC, Max: 8})
	if err != nil {
		t.Fatal(err)
	}
	want, _ := critical.MacKinnonTauAll(1, critical.NoConst, res.NObs)
	p, _ := critical.MacKinnonP(res.Stat, 1, critical.NoConst)
	if res.Crit[0] != want[0] || res.PValue != p || res.CBar != -7 || res.NObs != len(y)-1-res.Lags {
		t.Errorf("constant case: %+v", res)
	}
	res, err = DFGLS(y, critical.ConstTrend, LagRule{Select: AIC, Max: 8})
	if err != nil {
		t.Fatal(err)
	}
	ers, _, _ := critical.ERSTau(len(y))
	if res.Crit[1] != ers[1] || !math.IsNaN(res.PValue) || res.CBar != -13.5 {
		t.Errorf("trend case: %+v", res)
	}
}

// Zivot–Andrews with lag selection at each break date: every date gets a
// lag in 0..Max and the reported statistic is the minimum of Stats.
func TestZASelection(t *testing.T) {
	y := series(t, "log_realcons")
	res, err := ZA(y, critical.BreakBoth, 0.15, LagRule{Select: TStat, Max: 6})
	if err != nil {
		t.Fatal(err)
	}
	min := math.Inf(1)
	for k, s := range res.Stats {
		if res.LagsAt[k] < 0 || res.LagsAt[k] > 6 {
			t.Errorf("date %d: lag %d", res.First+k, res.LagsAt[k])
		}
		min = math.Min(min, s)
	}
	if res.Stat != min || res.Stats[res.Break-res.First] != min || res.Lags != res.LagsAt[res.Break-res.First] {
		t.Errorf("stat %g break %d lags %d; min %g", res.Stat, res.Break, res.Lags, min)
	}
	if res.First != int(math.Ceil(0.15*float64(len(y)))) {
		t.Errorf("first break date %d", res.First)
	}
}

// BenchmarkADFSelect: AIC over 0..12 lags, T = 100000 (one nested QR of
// the 99987×15 comparison design plus the final regression).
func BenchmarkADFSelect(b *testing.B) {
	y := randomWalk(100000, 7)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := ADF(y, critical.Const, LagRule{Select: AIC, Max: 12}); err != nil {
			b.Fatal(err)
		}
	}
}
