package engine

import (
	"fmt"
	"math"
	"strings"

	"github.com/galley-econ/galley/analysis/critical"
)

// Outcome is a test's result in a common form.
type Outcome struct {
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
func (o *Outcome) rejects(level float64) bool {
	if cv, ok := critAt(o.Crit, level); ok {
		if o.Upper {
			return o.Stat > cv
		}
		return o.Stat < cv
	}
	return !math.IsNaN(o.PValue) && o.PValue < level
}

// stars counts the star levels (largest first, as Context.Stars gives
// them) at which the test rejects.
func (o *Outcome) stars(levels []float64) int {
	n := 0
	for _, l := range levels {
		if o.rejects(l) {
			n++
		}
	}
	return n
}

// values is the results-file form of an outcome.
func (o *Outcome) values() map[string]any {
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

// detNames describe the deterministic cases in notes.
var detNames = map[critical.Case]string{
	critical.NoConst: "none", critical.Const: "constant", critical.ConstTrend: "constant and trend",
	critical.ConstTrendSq: "constant, trend and trend²",
}

// pct formats a probability as a percentage: 0.05 → "5%", 0.025 → "2.5%".
func pct(p float64) string {
	return strings.TrimSuffix(strings.TrimRight(fmt.Sprintf("%.4f", p*100), "0"), ".") + "%"
}
