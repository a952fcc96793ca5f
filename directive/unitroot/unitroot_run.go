package unitroot

import (
	"fmt"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/unitroot"
	"github.com/galley-econ/galley/engine/contract"
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

var urTitles = map[string]string{"adf": "ADF", "pp": "PP", "kpss": "KPSS", "dfgls": "DF-GLS", "za": "ZA"}

func (u urTest) run(y []float64) (*contract.Outcome, error) {
	switch u.Name {
	case "adf":
		r, err := unitroot.ADF(y, u.Det, u.Lags)
		if err != nil {
			return nil, err
		}
		return &contract.Outcome{Test: "ADF", StatName: "τ", Stat: r.Stat, PValue: r.PValue, Lags: r.Lags, MaxLag: r.Reg.MaxLag,
			NObs: r.NObs, Crit: r.Crit, CritSource: r.CritSource, PSource: "MacKinnon (1994)", Null: "has a unit root"}, nil
	case "pp":
		r, err := unitroot.PP(y, u.Det, u.Bandwidth)
		if err != nil {
			return nil, err
		}
		return &contract.Outcome{Test: "PP", StatName: "Z(t)", Stat: r.Stat, PValue: r.PValue, Lags: r.Bandwidth, IsBW: true,
			NObs: r.NObs, Crit: r.Crit, CritSource: r.CritSource, PSource: "MacKinnon (1994)", Null: "has a unit root",
			Extra: map[string]any{"stat_alpha": r.StatAlpha, "crit_alpha": contract.CritMap(r.CritAlpha), "crit_alpha_source": r.CritAlphaSource}}, nil
	case "kpss":
		r, err := unitroot.KPSS(y, u.Det, u.Bandwidth)
		if err != nil {
			return nil, err
		}
		return &contract.Outcome{Test: "KPSS", StatName: "η", Stat: r.Stat, PValue: r.PValue, PClipped: r.PClipped, Lags: r.Bandwidth, IsBW: true,
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
		return &contract.Outcome{Test: "DF-GLS", StatName: "τ", Stat: r.Stat, PValue: r.PValue, Lags: r.Lags, MaxLag: r.Reg.MaxLag,
			NObs: r.NObs, Crit: r.Crit, CritSource: r.CritSource, PSource: ps, Null: "has a unit root"}, nil
	case "za":
		r, err := unitroot.ZA(y, u.Break, u.Trim, u.Lags)
		if err != nil {
			return nil, err
		}
		return &contract.Outcome{Test: "ZA", StatName: "min t", Stat: r.Stat, PValue: r.PValue, Lags: r.Lags, MaxLag: r.Reg.MaxLag,
			NObs: r.NObs, Crit: r.Crit, CritSource: r.CritSource, Null: "has a unit root (and no break)",
			Extra: map[string]any{"break_index": r.Break, "trim": r.Trim}}, nil
	}
	return nil, fmt.Errorf("unknown test %q", u.Name)
}

func kpssNull(c critical.Case) string {
	if c == critical.ConstTrend {
		return "is stationary around a linear trend"
	}
	return "is stationary around a constant level"
}
