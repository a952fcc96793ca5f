package unitroot

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/unitroot"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
)

// urSpec is the spec of a single unit-root or stationarity test: adf,
// pp, kpss, dfgls and za share it.
type urSpec struct {
	engine.Common `yaml:",inline"`
	Data          string         `yaml:"data"`
	Series        string         `yaml:"series"`
	Sample        string         `yaml:"sample"`
	Det           string         `yaml:"det"`
	Lags          engine.LagSpec `yaml:"lags"`
	Bandwidth     string         `yaml:"bandwidth"`
	Break         string         `yaml:"break"`
	Trim          float64        `yaml:"trim"`
	Decimals      *int           `yaml:"decimals"`

	engine.SimKeys `yaml:",inline"` // crit: simulate (simcrit.go); adf only

	test string
}

// urFields are the values every single test reports; each test adds its
// own (testDef.Fields).
var urFields = []string{"test", "stat", "pvalue", "nobs", "crit", "crit_source", "reject_5", "series", "sample"}

// simFields are the values crit: simulate adds (engine/simcrit.go).
var simFields = []string{"crit_mcse", "sim_key", "sim"}

// settings validates the spec's test options.
func (s *urSpec) settings(c *engine.Context) (urTest, error) {
	return parseURTest(c, s.test, s.Det, s.Lags, s.Bandwidth, s.Break, s.Trim)
}

func parseURTest(c *engine.Context, test, det string, lags engine.LagSpec, bw, brk string, trim float64) (urTest, error) {
	u := urTest{Name: test, Lags: lags.Rule(engine.DefaultLags)}
	var err error
	if det == "" {
		det = "c"
	}
	def := lookupTest(test)
	if def == nil {
		return u, c.Errorf("", "unknown test %q", test)
	}
	if def.Lags != nil {
		u.Lags = lags.Rule(*def.Lags)
	}
	if !def.Break {
		if u.Det, err = critical.ParseCase(det); err != nil {
			return u, c.Errorf("det", "%v", err)
		}
		if def.Dets != nil && !slices.Contains(def.Dets, u.Det) {
			if strings.Contains(def.DetHelp, "%s") {
				return u, c.Errorf("det", def.DetHelp, det)
			}
			return u, c.Errorf("det", "%s", def.DetHelp)
		}
	}
	if def.Bandwidth {
		if lags.Set {
			return u, c.Errorf("lags", "%s uses a long-run variance: set bandwidth (rule4, rule12, auto, auto-hfo or a number), not lags", def.Title)
		}
		if bw == "" {
			bw = "rule4"
		}
		if u.Bandwidth, err = unitroot.ParseBandwidth(bw); err != nil {
			return u, c.Errorf("bandwidth", "%v", err)
		}
	} else if bw != "" {
		return u, c.Errorf("bandwidth", "%s selects lags (lags:), it has no bandwidth", def.Title)
	}
	if def.Break {
		if det != "c" {
			return u, c.Errorf("det", "Zivot–Andrews always has a constant and trend; choose the break with break: intercept | trend | both")
		}
		if brk == "" {
			brk = "intercept"
		}
		if u.Break, err = critical.ParseBreakModel(brk); err != nil {
			return u, c.Errorf("break", "%v", err)
		}
		if trim < 0 || trim >= 0.5 {
			return u, c.Errorf("trim", "trim must be between 0 and 0.5 (default 0.15)")
		}
		u.Trim = trim
	} else if brk != "" {
		return u, c.Errorf("break", "break applies only to the Zivot–Andrews test (za)")
	}
	return u, nil
}

func (s *urSpec) Check(c *engine.Context) error {
	if err := c.Require("series", s.Series == ""); err != nil {
		return err
	}
	if _, err := s.settings(c); err != nil {
		return err
	}
	if _, err := s.SimKeys.Settings(c); err != nil { // crit: simulate (simcrit.go)
		return err
	}
	return c.CheckData(c.DataAlias(s.Data), []string{s.Series}, s.Sample)
}

func (s *urSpec) Run(c *engine.Context) (*engine.Result, error) {
	u, err := s.settings(c)
	if err != nil {
		return nil, err
	}
	d, err := c.Data(c.DataAlias(s.Data), []string{s.Series}, s.Sample)
	if err != nil {
		return nil, err
	}
	o, err := u.run(d.Cols[0])
	if err != nil {
		return nil, c.Errorf("series", "%s of %s: %v", title(u.Name), s.Series, err)
	}
	// crit: simulate (simcrit.go): simulated critical values and p-value.
	if sim, err := s.SimKeys.Settings(c); err != nil {
		return nil, err
	} else if sim != nil {
		if _, err := simADF(c, sim, u, o); err != nil {
			return nil, err
		}
	}
	dec := c.Decimals()
	if s.Decimals != nil {
		dec = *s.Decimals
	}
	t := &table.Table{Stub: 1, Head: [][]table.Cell{{table.T(""), c.TermCell(s.Series)}}}
	t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.T(o.Test + " statistic, " + o.StatName), table.Starred(o.Stat, dec, o.Stars(c.Stars()))}})
	for _, er := range lookupTest(u.Name).Rows { // further statistics, each judged by its own critical values
		v, _ := o.Extra[er.Key].(float64)
		cm, _ := o.Extra[er.CritKey].(map[string]any)
		more := contract.Outcome{Stat: v, PValue: math.NaN(), Crit: critFromMap(cm)}
		t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.T(er.Label), table.Starred(v, dec, more.Stars(c.Stars()))}})
	}
	if !math.IsNaN(o.PValue) {
		p := table.N(o.PValue, dec)
		if o.PClipped {
			if o.PValue >= 0.1 {
				p.Suffix = " (>)"
			} else {
				p.Suffix = " (<)"
			}
		}
		t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.T("p-value"), p}})
	}
	lagLabel := "Lagged differences"
	if o.IsBW {
		lagLabel = "Bandwidth (Bartlett lags)"
	}
	t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.T(lagLabel), table.I(o.Lags)}}, table.Row{Cells: []table.Cell{table.T("Observations"), table.I(o.NObs)}})
	if lookupTest(u.Name).Break {
		bi := o.Extra["break_index"].(int)
		t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.T("Break (first date of the new regime)"), table.T(d.Dates[bi].String())}})
		o.Extra["break"] = d.Dates[bi].String()
	}
	for i, cv := range o.Crit {
		row := table.Row{Cells: []table.Cell{table.T("Critical value, " + contract.Pct(cv.Level)), table.N(cv.Value, dec)}, RuleAbove: i == 0}
		t.Body = append(t.Body, row)
	}
	t.Notes = append(t.Notes, urNote(u, o, s.Series), c.StarNote()+" "+d.SampleNote())
	vals := o.Values()
	vals["series"] = s.Series
	vals["sample"] = engine.SampleValues(d)
	if lookupTest(u.Name).Break {
		vals["break_model"] = u.Break.String()
	} else {
		vals["det"] = u.Det.String()
	}
	return &engine.Result{Table: t, Values: vals, Test: o, Cites: lookupTest(c.Kind()).Cites}, nil
}

// urNote explains the test: the null, the deterministic terms, the lag
// or bandwidth choice, and the sources of the critical values and p-value.
func urNote(u urTest, o *contract.Outcome, series string) string {
	var b strings.Builder
	fmt.Fprintf(&b, "H0: %s %s.", series, o.Null)
	if lookupTest(u.Name).Break {
		fmt.Fprintf(&b, " Constant and trend, with a break in %s at the date that minimises the t-ratio (trimming %s at each end).", map[critical.BreakModel]string{critical.BreakIntercept: "the intercept", critical.BreakTrend: "the trend", critical.BreakBoth: "both the intercept and the trend"}[u.Break], contract.Pct(trimOr(u.Trim)))
	} else {
		fmt.Fprintf(&b, " Deterministic terms: %s.", contract.DetNames[u.Det])
	}
	if o.IsBW {
		fmt.Fprintf(&b, " Newey–West long-run variance with %s.", bandwidthText(u.Bandwidth, o.Lags))
	} else {
		fmt.Fprintf(&b, " Lagged differences: %d, %s.", o.Lags, engine.DescribeLags(u.Lags, o.MaxLag))
	}
	fmt.Fprintf(&b, " Critical values: %s.", o.CritSource)
	if o.PSource != "" {
		fmt.Fprintf(&b, " p-value: %s", o.PSource)
		if o.PClipped {
			b.WriteString("; the statistic lies outside the table, so the p-value shown is the table's end")
		}
		b.WriteString(".")
	}
	if o.Upper {
		b.WriteString(" The test rejects for large values.")
	}
	return b.String()
}

func trimOr(t float64) float64 {
	if t <= 0 {
		return 0.15
	}
	return t
}

// critFromMap reads critical values keyed by level ({"5%": …}) back, in
// the order of the levels.
func critFromMap(m map[string]any) []critical.Value {
	var out []critical.Value
	for _, l := range critical.MacKinnonLevels {
		if v, ok := m[contract.Pct(l)].(float64); ok {
			out = append(out, critical.Value{Level: l, Value: v})
		}
	}
	return out
}
