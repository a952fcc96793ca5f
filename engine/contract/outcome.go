package contract

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

// CritMap keys critical values by level: {"1%": …, "5%": …}.
func CritMap(cv []critical.Value) map[string]any {
	m := map[string]any{}
	for _, v := range cv {
		m[Pct(v.Level)] = v.Value
	}
	return m
}

// CritAt returns the critical value at level, if tabulated.
func CritAt(cv []critical.Value, level float64) (float64, bool) {
	for _, v := range cv {
		if math.Abs(v.Level-level) < 1e-9 {
			return v.Value, true
		}
	}
	return 0, false
}

// Rejects says whether the test rejects its null at level, by the
// critical value when tabulated, else by the p-value.
func (o *Outcome) Rejects(level float64) bool {
	if cv, ok := CritAt(o.Crit, level); ok {
		if o.Upper {
			return o.Stat > cv
		}
		return o.Stat < cv
	}
	return !math.IsNaN(o.PValue) && o.PValue < level
}

// Stars counts the star levels (largest first, as Context.Stars gives
// them) at which the test rejects.
func (o *Outcome) Stars(levels []float64) int {
	n := 0
	for _, l := range levels {
		if o.Rejects(l) {
			n++
		}
	}
	return n
}

// Values is the results-file form of an outcome.
func (o *Outcome) Values() map[string]any {
	v := map[string]any{
		"test": o.Test, "stat": o.Stat, "pvalue": o.PValue, "nobs": o.NObs,
		"crit": CritMap(o.Crit), "crit_source": o.CritSource, "reject_5": o.Rejects(0.05),
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

// DetNames describe the deterministic cases in notes.
var DetNames = map[critical.Case]string{
	critical.NoConst: "none", critical.Const: "constant", critical.ConstTrend: "constant and trend",
	critical.ConstTrendSq: "constant, trend and trend²",
}

// Pct formats a probability as a percentage: 0.05 → "5%", 0.025 → "2.5%".
func Pct(p float64) string {
	return strings.TrimSuffix(strings.TrimRight(fmt.Sprintf("%.4f", p*100), "0"), ".") + "%"
}
