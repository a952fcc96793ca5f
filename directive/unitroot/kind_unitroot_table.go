package unitroot

import (
	"fmt"
	"regexp"
	"slices"
	"strings"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
	"github.com/galley-econ/galley/manuscript"
)

// unitroot-table: several series × several tests, in levels and first
// differences, with an order-of-integration verdict per series.
type urTableSpec struct {
	engine.Common `yaml:",inline"`
	Data          string         `yaml:"data"`
	Series        []string       `yaml:"series"`
	Tests         []string       `yaml:"tests"`
	Sample        string         `yaml:"sample"`
	Det           string         `yaml:"det"`
	DetDiff       string         `yaml:"det_diff"`
	Lags          engine.LagSpec `yaml:"lags"`
	Bandwidth     string         `yaml:"bandwidth"`
	Break         string         `yaml:"break"`
	Differences   *bool          `yaml:"differences"`
	Level         float64        `yaml:"level"`
	Decimals      *int           `yaml:"decimals"`
}

func init() {
	engine.Register(engine.Kind{
		Name:    "unitroot-table",
		Summary: "unit-root and stationarity tests for several series in levels and differences, with an order-of-integration verdict",
		New:     func() engine.Directive { return &urTableSpec{} },
		Fields:  []string{"series", "tests", "level"},
	})
}

func (s *urTableSpec) tests() []string {
	if len(s.Tests) == 0 {
		return []string{"adf", "kpss"}
	}
	return s.Tests
}

func (s *urTableSpec) level() float64 {
	if s.Level == 0 {
		return 0.05
	}
	return s.Level
}

func (s *urTableSpec) diffs() bool { return s.Differences == nil || *s.Differences }

// settings returns each test's settings for levels and for differences.
func (s *urTableSpec) settings(c *engine.Context) (lev, dif []urTest, err error) {
	seen := map[string]bool{}
	for _, name := range s.tests() {
		if lookupTest(name) == nil {
			return nil, nil, c.Errorf("tests", "unknown test %q%s; tests: %s", name, manuscript.DidYouMean(name, testNames()), strings.Join(testNames(), ", "))
		}
		if seen[name] {
			return nil, nil, c.Errorf("tests", "test %q is listed twice", name)
		}
		seen[name] = true
		det, detDiff := s.Det, s.DetDiff
		if det == "" {
			det = "c"
		}
		if detDiff == "" {
			detDiff = "c"
		}
		lags, bw := s.Lags, s.Bandwidth
		def := lookupTest(name)
		if def.Bandwidth {
			lags = engine.LagSpec{}
		} else {
			bw = ""
		}
		brk := ""
		if def.Break {
			det, detDiff, brk = "c", "c", s.Break
		}
		l, err := parseURTest(c, name, det, lags, bw, brk, 0)
		if err != nil {
			return nil, nil, err
		}
		d, err := parseURTest(c, name, detDiff, lags, bw, brk, 0)
		if err != nil {
			return nil, nil, err
		}
		lev, dif = append(lev, l), append(dif, d)
	}
	if s.Break != "" && !slices.ContainsFunc(s.tests(), func(n string) bool { return lookupTest(n).Break }) {
		return nil, nil, c.Errorf("break", "break applies only to the Zivot–Andrews test; add za to tests")
	}
	if lv := s.level(); lv != 0.01 && lv != 0.05 && lv != 0.10 {
		return nil, nil, c.Errorf("level", "level must be 0.01, 0.05 or 0.10 (the tabulated levels)")
	}
	return lev, dif, nil
}

func (s *urTableSpec) Check(c *engine.Context) error {
	if err := c.Require("series", len(s.Series) == 0); err != nil {
		return err
	}
	if _, _, err := s.settings(c); err != nil {
		return err
	}
	return c.CheckData(c.DataAlias(s.Data), s.Series, s.Sample)
}

// Verdict classifies one block of tests: +1 all point to stationarity,
// −1 all point to a unit root, 0 they disagree.
func Verdict(outs []*contract.Outcome, level float64) int {
	stat, unit := 0, 0
	for _, o := range outs {
		rej := o.Rejects(level)
		if o.Upper == rej { // KPSS rejecting, or a unit-root test not rejecting
			unit++
		} else {
			stat++
		}
	}
	switch {
	case unit == 0:
		return 1
	case stat == 0:
		return -1
	}
	return 0
}

func Order(lev, dif int, diffs bool) string {
	switch {
	case lev == 1:
		return "I(0)"
	case lev == -1 && diffs && dif == 1:
		return "I(1)"
	case lev == -1 && diffs && dif == -1:
		return "I(2)"
	case lev == -1 && !diffs:
		return "not I(0)"
	}
	return "unclear"
}

var tSuffix = regexp.MustCompile(`,? ?T ?= ?\d+`)

func (s *urTableSpec) Run(c *engine.Context) (*engine.Result, error) {
	levT, difT, err := s.settings(c)
	if err != nil {
		return nil, err
	}
	dec := c.Decimals()
	if s.Decimals != nil {
		dec = *s.Decimals
	}
	nt := len(levT)
	head1 := []table.Cell{table.T(""), table.Span("Levels", nt)}
	head2 := []table.Cell{table.T("Series")}
	for _, u := range levT {
		head2 = append(head2, table.T(title(u.Name)))
	}
	if s.diffs() {
		head1 = append(head1, table.Span("First differences", nt))
		for _, u := range difT {
			head2 = append(head2, table.T(title(u.Name)))
		}
	}
	head1 = append(head1, table.T(""))
	head2 = append(head2, table.T("Order"))
	t := &table.Table{Stub: 1, Head: [][]table.Cell{head1, head2}}

	// crit5[block][test] collects 5% critical values and T for the note.
	type critSeen struct {
		vals    []float64
		ts      []int
		sources []string
	}
	crit5 := [2][]critSeen{make([]critSeen, nt), make([]critSeen, nt)}
	var vals []map[string]any
	for _, name := range s.Series {
		row := []table.Cell{table.T(name)}
		entry := map[string]any{"name": name}
		var verdicts [2]int
		for block, exprs := range [][]urTest{levT, difT} {
			if block == 1 && !s.diffs() {
				break
			}
			expr := name
			key := "levels"
			if block == 1 {
				expr = "diff(" + name + ")"
				key = "diff"
			}
			d, err := c.Data(c.DataAlias(s.Data), []string{expr}, s.Sample)
			if err != nil {
				return nil, err
			}
			var outs []*contract.Outcome
			bv := map[string]any{}
			for i, u := range exprs {
				o, err := u.run(d.Cols[0])
				if err != nil {
					return nil, c.Errorf("series", "%s of %s: %v", title(u.Name), expr, err)
				}
				outs = append(outs, o)
				cell := table.Starred(o.Stat, dec, o.Stars(c.Stars()))
				cell.Suffix = fmt.Sprintf(" [%d]", o.Lags)
				row = append(row, cell)
				v := o.Values()
				v["sample"] = engine.SampleValues(d)
				if lookupTest(u.Name).Break {
					v["break"] = d.Dates[o.Extra["break_index"].(int)].String()
				} else {
					v["det"] = u.Det.String()
				}
				bv[u.Name] = v
				if cv, ok := contract.CritAt(o.Crit, 0.05); ok {
					cs := &crit5[block][i]
					cs.vals, cs.ts = append(cs.vals, cv), append(cs.ts, o.NObs)
					cs.sources = append(cs.sources, tSuffix.ReplaceAllString(o.CritSource, ""))
				}
			}
			entry[key] = bv
			verdicts[block] = Verdict(outs, s.level())
		}
		ord := Order(verdicts[0], verdicts[1], s.diffs())
		entry["order"] = ord
		row = append(row, table.T(ord))
		t.Body = append(t.Body, table.Row{Cells: row})
		vals = append(vals, entry)
	}

	// Notes: what the cells are, the verdict rule, 5% critical values and sources.
	var tests []string
	for _, u := range levT {
		tests = append(tests, title(u.Name))
	}
	t.Notes = append(t.Notes, fmt.Sprintf(
		"Each cell is the test statistic, with the lagged differences (ADF, DF-GLS, ZA) or the Bartlett bandwidth (PP, KPSS) in brackets. KPSS tests the null of stationarity; the other tests the null of a unit root. Stars mark rejection of each test's own null: %s",
		c.StarNote()))
	t.Notes = append(t.Notes, fmt.Sprintf(
		"Order: I(0) when every test points to stationarity in levels at the %s level; I(1) when every test points to a unit root in levels and to stationarity in first differences; I(2) when every test points to a unit root in both; unclear when the tests disagree.", contract.Pct(s.level())))
	var cv []string
	sources := map[string][]string{}
	var srcOrder []string
	for block, label := range []string{"levels", "differences"} {
		if block == 1 && !s.diffs() {
			break
		}
		for i, u := range [][]urTest{levT, difT}[block] {
			cs := crit5[block][i]
			if len(cs.vals) == 0 {
				continue
			}
			det := contract.DetNames[u.Det]
			if lookupTest(u.Name).Break {
				det = "break in " + u.Break.String()
			}
			cv = append(cv, fmt.Sprintf("%s %s (%s) %s", title(u.Name), label, det, rangeText(cs.vals, cs.ts, dec)))
			for _, src := range cs.sources {
				if !slices.Contains(sources[src], title(u.Name)) {
					if len(sources[src]) == 0 {
						srcOrder = append(srcOrder, src)
					}
					sources[src] = append(sources[src], title(u.Name))
				}
			}
		}
	}
	if len(cv) > 0 {
		t.Notes = append(t.Notes, "5% critical values: "+strings.Join(cv, "; ")+".")
	}
	var src []string
	for _, s := range srcOrder {
		src = append(src, strings.Join(sources[s], ", ")+": "+s)
	}
	if len(src) > 0 {
		t.Notes = append(t.Notes, "Critical values from "+strings.Join(src, "; ")+", each at its test regression's sample size.")
	}
	lr := levT[0].Lags
	t.Notes = append(t.Notes, fmt.Sprintf("Lags: %s. Levels: deterministic terms %s; first differences: %s.%s",
		engine.DescribeLags(lr, -1), contract.DetNames[levT[0].Det], contract.DetNames[difT[0].Det], sampleSentence(s.Sample)))
	return &engine.Result{Table: t, Values: map[string]any{"series": vals, "tests": s.tests(), "level": s.level()}}, nil
}

func sampleSentence(sample string) string {
	if sample == "" {
		return ""
	}
	return " Sample " + sample + "."
}

// rangeText is "−2.873 (T = 260)" or "−2.873 to −2.871 (T = 255–260)".
func rangeText(vals []float64, ts []int, dec int) string {
	lo, hi := slices.Min(vals), slices.Max(vals)
	tlo, thi := slices.Min(ts), slices.Max(ts)
	f := func(v float64) string { return strings.Replace(fmt.Sprintf("%.*f", dec, v), "-", "−", 1) }
	tt := fmt.Sprintf("T = %d", tlo)
	if thi != tlo {
		tt = fmt.Sprintf("T = %d–%d", tlo, thi)
	}
	if f(lo) == f(hi) {
		return f(lo) + " (" + tt + ")"
	}
	return f(lo) + " to " + f(hi) + " (" + tt + ")"
}
