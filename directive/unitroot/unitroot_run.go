package unitroot

import (
	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/unitroot"
)

// urTest is one unit-root or stationarity test's settings, shared by the
// single-test directives and unitroot-table.
type urTest struct {
	Name      string // a registered test: adf, pp, kpss, …
	Det       critical.Case
	Lags      unitroot.LagRule
	Bandwidth unitroot.Bandwidth
	Break     critical.BreakModel
	Trim      float64
}

func kpssNull(c critical.Case) string {
	if c == critical.ConstTrend {
		return "is stationary around a linear trend"
	}
	return "is stationary around a constant level"
}
