package unitroot

import (
	"math"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/rules"
)

// autoFixture is the part of rules_bandwidth.json (script
// testdata/scripts/rules_bandwidth.py, statsmodels 0.13.5 and numpy
// 1.24.2 from Debian) that concerns PP and KPSS.
type autoFixture struct {
	KPSSAuto []struct {
		Series, Case string
		Stat         float64
		Lags         int
	} `json:"kpss_auto"`
	PPResid []struct {
		Series, Case string
		NWLag        int `json:"nw_lag"`
		HFOLag       int `json:"hfo_lag"`
	} `json:"pp_resid"`
	Cap struct {
		E      []float64
		HFOLag int `json:"hfo_lag"`
		Capped int
	}
}

// autoSeries extends series with the two the automatic-bandwidth fixture
// adds.
func autoSeries(t *testing.T, name string) []float64 {
	switch name {
	case "unemp":
		return column(t, "macrodata.csv", "unemp")
	case "denmark_IBO":
		return column(t, "denmark.csv", "IBO")
	}
	return series(t, name)
}

func loadAuto(t *testing.T) autoFixture {
	var f autoFixture
	readFixture(t, "rules_bandwidth.json", &f)
	if len(f.KPSSAuto) == 0 || len(f.PPResid) == 0 || len(f.Cap.E) == 0 {
		t.Fatal("incomplete fixture rules_bandwidth.json")
	}
	return f
}

// TestKPSSAutoStatsmodels: KPSS with the bandwidth "auto-hfo" (Hobijn,
// Franses and Ooms 1998) against statsmodels 0.13.5
// kpss(nlags="auto"): the lag exactly, η to 1e-8 relative (the tolerance
// of the fixed-lag comparison in TestKPSSStatsmodels).
func TestKPSSAutoStatsmodels(t *testing.T) {
	f := loadAuto(t)
	for _, r := range f.KPSSAuto {
		c, err := critical.ParseCase(r.Case)
		if err != nil {
			t.Fatal(err)
		}
		res, err := KPSS(autoSeries(t, r.Series), c, Bandwidth{Rule: AutoHobijn})
		if err != nil {
			t.Fatalf("%s %s: %v", r.Series, r.Case, err)
		}
		if res.Bandwidth != r.Lags {
			t.Errorf("%s %s: lag %d, statsmodels 0.13.5 kpss(nlags=\"auto\") %d", r.Series, r.Case, res.Bandwidth, r.Lags)
		}
		if e := relErr(res.Stat, r.Stat); e > 1e-8 {
			t.Errorf("%s %s: η %.12g, statsmodels 0.13.5 kpss(nlags=\"auto\") %.12g", r.Series, r.Case, res.Stat, r.Stat)
		}
	}
}

// TestPPAutoLags: the lag PP uses under "auto" (Newey and West 1994) and
// "auto-hfo" equals the truncated bandwidth of the lag-free Dickey–Fuller
// residuals computed by hand in numpy 1.24.2 (the script checks its
// Hobijn et al. lag against statsmodels 0.13.5 _kpss_autolag), exactly;
// and PP with the automatic rule equals PP with that lag given.
func TestPPAutoLags(t *testing.T) {
	f := loadAuto(t)
	for _, r := range f.PPResid {
		c, err := critical.ParseCase(r.Case)
		if err != nil {
			t.Fatal(err)
		}
		y := autoSeries(t, r.Series)
		for _, x := range []struct {
			rule BandwidthRule
			want int
		}{{AutoNeweyWest, r.NWLag}, {AutoHobijn, r.HFOLag}} {
			res, err := PP(y, c, Bandwidth{Rule: x.rule})
			if err != nil {
				t.Fatalf("%s %s %v: %v", r.Series, r.Case, x.rule, err)
			}
			if res.Bandwidth != x.want {
				t.Errorf("%s %s %s: lag %d, numpy %d", r.Series, r.Case, Bandwidth{Rule: x.rule}, res.Bandwidth, x.want)
			}
			given, err := PP(y, c, Bandwidth{Rule: Given, Lags: x.want})
			if err != nil || given.Stat != res.Stat || given.StatAlpha != res.StatAlpha {
				t.Errorf("%s %s: automatic and given lag %d differ: %v", r.Series, r.Case, x.want, err)
			}
		}
	}
}

// TestAutoBandwidthCap: a series whose Hobijn et al. bandwidth (36 by
// statsmodels 0.13.5 _kpss_autolag) exceeds T − 1 = 11 gets lag 11, as
// statsmodels' kpss caps it.
func TestAutoBandwidthCap(t *testing.T) {
	f := loadAuto(t)
	b, err := rules.HobijnBandwidth(f.Cap.E)
	if err != nil || int(math.Floor(b)) != f.Cap.HFOLag {
		t.Fatalf("bandwidth %g, %v; statsmodels %d", b, err, f.Cap.HFOLag)
	}
	l, err := Bandwidth{Rule: AutoHobijn}.ResolveFor(f.Cap.E)
	if err != nil || l != f.Cap.Capped {
		t.Errorf("lag %d, %v; want %d", l, err, f.Cap.Capped)
	}
}

// TestBandwidthSpellings: the spellings, the refused former ones (each
// error names its replacement), and the errors of the automatic rules.
func TestBandwidthSpellings(t *testing.T) {
	for _, c := range []struct {
		in   string
		want Bandwidth
		str  string
	}{
		{"rule4", Bandwidth{Rule: Schwert4}, "rule4"},
		{"Rule12", Bandwidth{Rule: Schwert12}, "rule12"},
		{" AUTO ", Bandwidth{Rule: AutoNeweyWest}, "auto"},
		{"auto-hfo", Bandwidth{Rule: AutoHobijn}, "auto-hfo"},
		{"0", Bandwidth{Rule: Given}, "0"},
	} {
		b, err := ParseBandwidth(c.in)
		if err != nil || b != c.want || b.String() != c.str {
			t.Errorf("ParseBandwidth(%q) = %+v (%s), %v; want %+v (%s)", c.in, b, b, err, c.want, c.str)
		}
	}
	for old, now := range map[string]string{"short": "rule4", "Long": "rule12"} {
		if _, err := ParseBandwidth(old); err == nil || !strings.Contains(err.Error(), "now written "+now) {
			t.Errorf("ParseBandwidth(%q): %v; want an error naming %s", old, err, now)
		}
	}
	if _, err := ParseBandwidth("auto-nw"); err == nil || !strings.Contains(err.Error(), "rule4, rule12, auto, auto-hfo") {
		t.Errorf("ParseBandwidth(auto-nw): %v", err)
	}
	if _, err := (Bandwidth{Rule: AutoNeweyWest}).Resolve(100); err == nil || !strings.Contains(err.Error(), "residuals") {
		t.Errorf("Resolve of auto: %v", err)
	}
	if _, err := (Bandwidth{Rule: BandwidthRule(42)}).ResolveFor(make([]float64, 10)); err == nil {
		t.Error("unknown rule: no error")
	}
	// Residuals without variation: ŝ(0) = 0, an error, not a panic.
	if _, err := (Bandwidth{Rule: AutoHobijn}).ResolveFor(make([]float64, 30)); err == nil || !strings.Contains(err.Error(), "automatic bandwidth") {
		t.Errorf("zero residuals: %v", err)
	}
	// 4·(n/100)^{1/4} by rules.Schwert4 at n = 202: 4.77 → 4, as before.
	if l, err := (Bandwidth{Rule: Schwert4}).ResolveFor(make([]float64, 202)); err != nil || l != 4 {
		t.Errorf("rule4 at 202: %d, %v", l, err)
	}
}
