package engine

import (
	"fmt"
	"math"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/unitroot"
)

// urTest is one unit-root or stationarity test's settings, shared by the
// single-test directives and unitroot-table.
type urTest struct {
	Name      string // adf | pp | kpss | dfgls | za
	Det       critical.Case
	Lags      unitroot.LagRule
	Bandwidth unitroot.Bandwidth
	Break     critical.BreakModel
	Trim      float64
}

// urOutcome is a test's result in a common form.
type urOutcome struct {
	Test       string // "ADF"
	StatName   string // "τ"
	Stat       float64
	PValue     float64
	PClipped   bool
	Lags       int  // lags or bandwidth
	IsBW       bool // Lags is a bandwidth
	MaxLag     int
	NObs       int
	Crit       []critical.Value
	CritSource string
	PSource    string
	Upper      bool   // rejects in the upper tail (KPSS)
	Null       string // "a unit root" / "stationarity"
	Extra      map[string]any
}

var urTitles = map[string]string{"adf": "ADF", "pp": "PP", "kpss": "KPSS", "dfgls": "DF-GLS", "za": "ZA"}

var detNames = map[critical.Case]string{
	critical.NoConst: "none", critical.Const: "constant", critical.ConstTrend: "constant and trend",
	critical.ConstTrendSq: "constant, trend and trend²",
}

func (u urTest) run(y []float64) (*urOutcome, error) {
	switch u.Name {
	case "adf":
		r, err := unitroot.ADF(y, u.Det, u.Lags)
		if err != nil {
			return nil, err
		}
		return &urOutcome{Test: "ADF", StatName: "τ", Stat: r.Stat, PValue: r.PValue, Lags: r.Lags, MaxLag: r.Reg.MaxLag,
			NObs: r.NObs, Crit: r.Crit, CritSource: r.CritSource, PSource: "MacKinnon (1994)", Null: "has a unit root"}, nil
	case "pp":
		r, err := unitroot.PP(y, u.Det, u.Bandwidth)
		if err != nil {
			return nil, err
		}
		return &urOutcome{Test: "PP", StatName: "Z(t)", Stat: r.Stat, PValue: r.PValue, Lags: r.Bandwidth, IsBW: true,
			NObs: r.NObs, Crit: r.Crit, CritSource: r.CritSource, PSource: "MacKinnon (1994)", Null: "has a unit root",
			Extra: map[string]any{"stat_alpha": r.StatAlpha, "crit_alpha": critMap(r.CritAlpha), "crit_alpha_source": r.CritAlphaSource}}, nil
	case "kpss":
		r, err := unitroot.KPSS(y, u.Det, u.Bandwidth)
		if err != nil {
			return nil, err
		}
		return &urOutcome{Test: "KPSS", StatName: "η", Stat: r.Stat, PValue: r.PValue, PClipped: r.PClipped, Lags: r.Bandwidth, IsBW: true,
			NObs: r.NObs, Crit: r.Crit, CritSource: r.CritSource, PSource: "interpolated in KPSS (1992) Table 1", Upper: true, Null: kpssNull(u.Det)}, nil
	case "dfgls":
		r, err := unitroot.DFGLS(y, u.Det, u.Lags)
		if err != nil {
			return nil, err
		}
		ps := "MacKinnon (1994), no-constant case"
		if u.Det == critical.ConstTrend {
			ps = ""
		}
		return &urOutcome{Test: "DF-GLS", StatName: "τ", Stat: r.Stat, PValue: r.PValue, Lags: r.Lags, MaxLag: r.Reg.MaxLag,
			NObs: r.NObs, Crit: r.Crit, CritSource: r.CritSource, PSource: ps, Null: "has a unit root"}, nil
	case "za":
		r, err := unitroot.ZA(y, u.Break, u.Trim, u.Lags)
		if err != nil {
			return nil, err
		}
		return &urOutcome{Test: "ZA", StatName: "min t", Stat: r.Stat, PValue: r.PValue, Lags: r.Lags, MaxLag: r.Reg.MaxLag,
			NObs: r.NObs, Crit: r.Crit, CritSource: r.CritSource, Null: "has a unit root (and no break)",
			Extra: map[string]any{"break_index": r.Break, "trim": r.Trim}}, nil
	}
	return nil, fmt.Errorf("unknown test %q", u.Name)
}

// critMap keys critical values by level: {"1%": …, "5%": …}.
func critMap(cv []critical.Value) map[string]any {
	m := map[string]any{}
	for _, v := range cv {
		m[pct(v.Level)] = v.Value
	}
	return m
}

// critAt returns the critical value at level, if tabulated.
func critAt(cv []critical.Value, level float64) (float64, bool) {
	for _, v := range cv {
		if math.Abs(v.Level-level) < 1e-9 {
			return v.Value, true
		}
	}
	return 0, false
}

// rejects says whether the test rejects its null at level, by the
// critical value when tabulated, else by the p-value.
func (o *urOutcome) rejects(level float64) bool {
	if cv, ok := critAt(o.Crit, level); ok {
		if o.Upper {
			return o.Stat > cv
		}
		return o.Stat < cv
	}
	return !math.IsNaN(o.PValue) && o.PValue < level
}

// stars counts the document's star levels at which the test rejects.
func (o *urOutcome) stars(c *Context) int {
	n := 0
	for _, l := range c.Stars() {
		if o.rejects(l) {
			n++
		}
	}
	return n
}

// values is the results-file form of an outcome.
func (o *urOutcome) values() map[string]any {
	v := map[string]any{
		"test": o.Test, "stat": o.Stat, "pvalue": o.PValue, "nobs": o.NObs,
		"crit": critMap(o.Crit), "crit_source": o.CritSource, "reject_5": o.rejects(0.05),
	}
	if o.IsBW {
		v["bandwidth"] = o.Lags
	} else {
		v["lags"] = o.Lags
	}
	if o.PClipped {
		v["pvalue_clipped"] = true
	}
	if o.PSource != "" {
		v["pvalue_source"] = o.PSource
	}
	for k, e := range o.Extra {
		v[k] = e
	}
	return v
}

func kpssNull(c critical.Case) string {
	if c == critical.ConstTrend {
		return "is stationary around a linear trend"
	}
	return "is stationary around a constant level"
}
