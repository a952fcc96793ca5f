package unitroot

import (
	"errors"
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/ols"
)

type ngPerronFixture struct {
	Library string `json:"library"`
	Rows    []struct {
		Series   string    `json:"series"`
		Case     string    `json:"case"`
		Select   string    `json:"select"`
		Max      int       `json:"max"`
		MaxLag   int       `json:"maxlag"`
		Lags     int       `json:"lags"`
		NObs     int       `json:"nobs"`
		RegNObs  int       `json:"regnobs"`
		Beta     []float64 `json:"beta"`
		S2AR     float64   `json:"s2ar"`
		MZa      float64   `json:"mza"`
		MZt      float64   `json:"mzt"`
		MSB      float64   `json:"msb"`
		MPT      float64   `json:"mpt"`
		DFGLSTau float64   `json:"dfgls_tau"`
		MAIC     []float64 `json:"maic"`
	} `json:"rows"`
}

// Reference: an independent numpy 1.24.2 implementation of the published
// formulas (fixture unitroot_ngperron.json, script
// testdata/scripts/unitroot_ngperron.py: GLS detrending, s²_AR, MZα, MZt,
// MSB, MPT, MAIC, each least-squares fit by numpy.linalg.lstsq) on log
// realgdp, log realcons, tbilrate, infl (macrodata) and LRM (denmark),
// constant and trend cases, fixed lags 0, 1, 4 and MAIC with maximum 4,
// 8, 12 and the Schwert default. Lags, maximum lag and observation counts
// exact; the four statistics, s²_AR, the GLS coefficients, every MAIC
// value and the DF-GLS τ with the same lag rule to 1e-8 relative.
func TestNgPerronNumpy(t *testing.T) {
	var f ngPerronFixture
	readFixture(t, "unitroot_ngperron.json", &f)
	if len(f.Rows) == 0 {
		t.Fatal("empty fixture")
	}
	nmaic := 0
	for _, r := range f.Rows {
		y := series(t, r.Series)
		c, err := critical.ParseCase(r.Case)
		if err != nil {
			t.Fatal(err)
		}
		rule := LagRule{Select: Fixed, Lags: r.Max}
		if r.Select == "maic" {
			rule = LagRule{Select: MAIC, Max: r.Max}
		}
		tag := r.Series + " " + r.Case + " " + r.Select + " max " + strconv.Itoa(r.Max)
		res, err := NgPerron(y, c, rule)
		if err != nil {
			t.Fatalf("%s: %v", tag, err)
		}
		if res.Lags != r.Lags || res.MaxLag != r.MaxLag || res.NObs != r.NObs || res.Reg.NObs != r.RegNObs {
			t.Errorf("%s: lags %d max %d nobs %d/%d, numpy %s: lags %d max %d nobs %d/%d", tag,
				res.Lags, res.MaxLag, res.NObs, res.Reg.NObs, f.Library, r.Lags, r.MaxLag, r.NObs, r.RegNObs)
			continue
		}
		for _, v := range []struct {
			name      string
			got, want float64
		}{
			{"MZa", res.MZa, r.MZa}, {"MZt", res.MZt, r.MZt}, {"MSB", res.MSB, r.MSB}, {"MPT", res.MPT, r.MPT},
			{"s2AR", res.S2AR, r.S2AR},
		} {
			if e := relErr(v.got, v.want); e > 1e-8 {
				t.Errorf("%s: %s = %.12g, %s %.12g (rel %.1e)", tag, v.name, v.got, f.Library, v.want, e)
			}
		}
		for j, b := range r.Beta {
			if e := relErr(res.Beta[j], b); e > 1e-8 {
				t.Errorf("%s: GLS β[%d] = %.12g, %s %.12g", tag, j, res.Beta[j], f.Library, b)
			}
		}
		if r.MAIC != nil {
			nmaic++
			if len(res.Reg.IC) != len(r.MAIC) {
				t.Fatalf("%s: %d MAIC values, %s %d", tag, len(res.Reg.IC), f.Library, len(r.MAIC))
			}
			for k, v := range r.MAIC {
				if e := relErr(res.Reg.IC[k], v); e > 1e-8 {
					t.Errorf("%s: MAIC(%d) = %.12g, %s %.12g", tag, k, res.Reg.IC[k], f.Library, v)
				}
			}
		}
		gls, err := DFGLS(y, c, rule)
		if err != nil {
			t.Fatal(err)
		}
		if gls.Lags != r.Lags || relErr(gls.Stat, r.DFGLSTau) > 1e-8 {
			t.Errorf("%s: DF-GLS lags %d τ %.12g, %s lags %d τ %.12g", tag, gls.Lags, gls.Stat, f.Library, r.Lags, r.DFGLSTau)
		}
	}
	if nmaic == 0 {
		t.Fatal("no MAIC rows compared")
	}
}

// NgPerron wiring: the critical values are critical.NgPerron's for the
// case, MZt = MZα·MSB, and the statistics share DFGLS's detrended series
// and autoregression.
func TestNgPerronWiring(t *testing.T) {
	y := series(t, "tbilrate")
	for _, c := range []critical.Case{critical.Const, critical.ConstTrend} {
		res, err := NgPerron(y, c, LagRule{Select: MAIC, Max: 8})
		if err != nil {
			t.Fatal(err)
		}
		for _, w := range []struct {
			s   critical.NgPerronStat
			got []critical.Value
		}{{critical.MZa, res.CritMZa}, {critical.MZt, res.CritMZt}, {critical.MSB, res.CritMSB}, {critical.MPT, res.CritMPT}} {
			want, _ := critical.NgPerron(w.s, c)
			if len(w.got) != 3 || w.got[0] != want[0] || w.got[1] != want[1] || w.got[2] != want[2] {
				t.Errorf("%s %s: critical values %v, want %v", c, w.s, w.got, want)
			}
		}
		if res.CritSource != critical.NgPerronSource || res.Select != MAIC {
			t.Errorf("%s: source %q select %v", c, res.CritSource, res.Select)
		}
		if relErr(res.MZt, res.MZa*res.MSB) > 1e-15 {
			t.Errorf("%s: MZt %g ≠ MZα·MSB %g", c, res.MZt, res.MZa*res.MSB)
		}
		gls, _ := DFGLS(y, c, LagRule{Select: MAIC, Max: 8})
		if gls.Stat != res.Reg.Stat || gls.Lags != res.Lags || gls.CBar != res.CBar {
			t.Errorf("%s: DF-GLS τ %g lags %d, Ng–Perron regression τ %g lags %d", c, gls.Stat, gls.Lags, res.Reg.Stat, res.Lags)
		}
	}
}

func TestNgPerronErrors(t *testing.T) {
	good := randomWalk(40, 3)
	flat := make([]float64, 40)
	for i := range flat {
		flat[i] = -1.5
	}
	nan := append([]float64(nil), good...)
	nan[3] = math.NaN()
	for _, tc := range []struct {
		name string
		y    []float64
		c    critical.Case
		r    LagRule
		want string
	}{
		{"constant", flat, critical.Const, LagRule{Select: MAIC, Max: -1}, "constant"},
		{"nan", nan, critical.ConstTrend, LagRule{}, "observation 4 is not finite"},
		{"case n", good, critical.NoConst, LagRule{}, "constant (c) and trend (ct)"},
		{"case ctt", good, critical.ConstTrendSq, LagRule{}, "Ng–Perron supports"},
		{"max too large", good, critical.Const, LagRule{Select: MAIC, Max: 25}, "too few observations"},
		{"lags too many", good, critical.ConstTrend, LagRule{Lags: 30}, "too few observations"},
		{"short", []float64{1, 2, 4}, critical.Const, LagRule{}, "need at least 4"},
		{"selector", good, critical.Const, LagRule{Select: Selector(9)}, "unknown lag selector"},
	} {
		res, err := NgPerron(tc.y, tc.c, tc.r)
		if err == nil || !strings.Contains(err.Error(), tc.want) || res != nil {
			t.Errorf("%s: error %v, want %q", tc.name, err, tc.want)
		}
	}
	if _, err := NgPerron(good, critical.Const, LagRule{Select: MAIC, Max: 25}); !errors.Is(err, ols.ErrTooFewObs) {
		t.Errorf("max too large: %v does not wrap ols.ErrTooFewObs", err)
	}
	// MAIC needs a regression without deterministic terms.
	if _, err := ADF(good, critical.Const, LagRule{Select: MAIC, Max: 4}); err == nil || !strings.Contains(err.Error(), "MAIC") {
		t.Errorf("ADF with MAIC, case c: %v", err)
	}
	if _, err := DFGLS(flat, critical.Const, LagRule{Select: MAIC, Max: 4}); err == nil || !strings.Contains(err.Error(), "constant") {
		t.Errorf("DF-GLS of a constant series: %v", err)
	}
}

func TestParseSelectorMAIC(t *testing.T) {
	for _, s := range []Selector{Fixed, AIC, BIC, TStat, MAIC} {
		back, err := ParseSelector(s.String())
		if err != nil || back != s {
			t.Errorf("round trip of %v: %v, %v", s, back, err)
		}
	}
	if s, err := ParseSelector(" MAIC "); err != nil || s != MAIC {
		t.Errorf("ParseSelector(MAIC) = %v, %v", s, err)
	}
	if _, err := ParseSelector("mbic"); err == nil || !strings.Contains(err.Error(), "maic") {
		t.Errorf("ParseSelector(mbic) error %v, want one listing maic", err)
	}
}

// Size under the null, a coarse check of the statistics and the table
// together: 250 seeded Gaussian random walks of length 200, MAIC lags up
// to the Schwert maximum. Each statistic's rejection rate at the 5%
// critical value of Ng and Perron (2001) Table 1 must lie in [0.01, 0.10]
// (with 250 replications the standard error at 5% is 0.014; Ng and
// Perron 2001 report sizes near the nominal level for iid errors).
func TestNgPerronSize(t *testing.T) {
	const reps, n = 250, 200
	for _, c := range []critical.Case{critical.Const, critical.ConstTrend} {
		var rej [4]int
		for i := 0; i < reps; i++ {
			y := make([]float64, n)
			w := randomWalk(n+1, uint64(1000+i))
			for t := range y { // pure random walk: undo the AR(1) increments
				y[t] = w[t+1] - 0.3*w[t]
			}
			res, err := NgPerron(y, c, LagRule{Select: MAIC, Max: -1})
			if err != nil {
				t.Fatal(err)
			}
			for j, v := range []struct {
				stat float64
				crit []critical.Value
			}{{res.MZa, res.CritMZa}, {res.MZt, res.CritMZt}, {res.MSB, res.CritMSB}, {res.MPT, res.CritMPT}} {
				if v.stat < v.crit[1].Value {
					rej[j]++
				}
			}
		}
		for j, r := range rej {
			if p := float64(r) / reps; p < 0.01 || p > 0.10 {
				t.Errorf("%s %v: rejection rate %.3f at the nominal 5%%", c, critical.NgPerronStat(j), p)
			}
		}
		t.Logf("%s: rejections at 5%% of MZα, MZt, MSB, MPT: %v of %d", c, rej, reps)
	}
}
