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

// sourceWithoutT is a critical-value source without the sample size the
// values were taken at (the note gives each test's T beside its 5%
// values): "…, interpolated in 1/T at T=203" → "…, interpolated in 1/T";
// "simulated: …, seed 1, T=202, …" → "simulated: …, seed 1, …"; "(T=40 is
// below the table)" → "(T is below the table)". A T that names a row of
// a table ("T=50 row") stays.
func sourceWithoutT(src string) string {
	src = tAfterClause.ReplaceAllString(src, "")
	return tInBrackets.ReplaceAllString(src, "(T ")
}

var (
	tAfterClause = regexp.MustCompile(`(, | at )T ?= ?\d+\b`)
	tInBrackets  = regexp.MustCompile(`\(T ?= ?\d+ `)
)

func (s *urTableSpec) Run(c *engine.Context) (*engine.Result, error) {
	levT, difT, err := s.settings(c)
	if err != nil {
		return nil, err
	}
	dec := engine.DecimalsOr(c, s.Decimals)
	t := &table.Table{Stub: 1, Head: s.head(levT)}
	seen := [2][]critSeen{make([]critSeen, len(levT)), make([]critSeen, len(levT))}
	var vals []map[string]any
	for _, name := range s.Series {
		row, entry, err := s.seriesRow(c, name, [2][]urTest{levT, difT}, dec, &seen)
		if err != nil {
			return nil, err
		}
		t.Body = append(t.Body, table.Row{Cells: row})
		vals = append(vals, entry)
	}
	t.Notes = s.notes(c, levT, difT, seen, dec)
	return &engine.Result{Table: t, Values: map[string]any{"series": vals, "tests": s.tests(), "level": s.level()}, Cites: citesOf(s.tests())}, nil
}

// head is the two header rows: Levels and First differences over the
// tests, then the verdict.
func (s *urTableSpec) head(tests []urTest) [][]table.Cell {
	nt := len(tests)
	head1 := []table.Cell{table.T(""), table.Span("Levels", nt)}
	head2 := []table.Cell{table.T("Series")}
	blocks := 1
	if s.diffs() {
		head1 = append(head1, table.Span("First differences", nt))
		blocks = 2
	}
	for range blocks {
		for _, u := range tests {
			head2 = append(head2, table.T(title(u.Name)))
		}
	}
	return [][]table.Cell{append(head1, table.T("")), append(head2, table.T("Order"))}
}

// critSeen collects one test's 5% critical values, their T and sources
// over the rows, for the note.
type critSeen struct {
	vals    []float64
	ts      []int
	sources []string
}

// seriesRow runs every test on one series, in levels and (unless turned
// off) in first differences: the row's cells, its values and the
// critical values seen.
func (s *urTableSpec) seriesRow(c *engine.Context, name string, blocks [2][]urTest, dec int, seen *[2][]critSeen) ([]table.Cell, map[string]any, error) {
	row := []table.Cell{c.TermCell(name)}
	entry := map[string]any{"name": name}
	var verdicts [2]int
	for block, tests := range blocks {
		if block == 1 && !s.diffs() {
			break
		}
		expr, key := name, "levels"
		if block == 1 {
			expr, key = "diff("+name+")", "diff"
		}
		d, err := c.Data(c.DataAlias(s.Data), []string{expr}, s.Sample)
		if err != nil {
			return nil, nil, err
		}
		var outs []*contract.Outcome
		bv := map[string]any{}
		for i, u := range tests {
			o, err := u.run(d.Cols[0])
			if err != nil {
				return nil, nil, c.Errorf("series", "%s of %s: %v", title(u.Name), expr, err)
			}
			outs = append(outs, o)
			cell := table.Starred(o.Stat, dec, o.Stars(c.Stars()))
			cell.Suffix = fmt.Sprintf(" [%d]", o.Lags)
			row = append(row, cell)
			bv[u.Name] = testValues(u, o, d)
			if cv, ok := contract.CritAt(o.Crit, 0.05); ok {
				cs := &seen[block][i]
				cs.vals, cs.ts = append(cs.vals, cv), append(cs.ts, o.NObs)
				cs.sources = append(cs.sources, sourceWithoutT(o.CritSource))
			}
		}
		entry[key] = bv
		verdicts[block] = Verdict(outs, s.level())
	}
	ord := Order(verdicts[0], verdicts[1], s.diffs())
	entry["order"] = ord
	return append(row, table.T(ord)), entry, nil
}

// testValues is one cell's values: the outcome's, the sample, and the
// deterministic terms or the break date.
func testValues(u urTest, o *contract.Outcome, d *engine.Data) map[string]any {
	v := o.Values()
	v["sample"] = engine.SampleValues(d)
	if lookupTest(u.Name).Break {
		v["break"] = d.Dates[o.Extra["break_index"].(int)].String()
	} else {
		v["det"] = u.Det.String()
	}
	return v
}

// notes: what the cells are, the verdict rule, the 5% critical values and
// their sources, the lags and the deterministic terms.
func (s *urTableSpec) notes(c *engine.Context, levT, difT []urTest, seen [2][]critSeen, dec int) []string {
	notes := []string{
		cellNote(levT) + " Stars mark rejection of each test's own null: " + c.StarNote(),
		fmt.Sprintf("Order: I(0) when every test points to stationarity in levels at the %s level; I(1) when every test points to a unit root in levels and to stationarity in first differences; I(2) when every test points to a unit root in both; unclear when the tests disagree.", contract.Pct(s.level())),
	}
	var cv []string
	for block, label := range []string{"levels", "differences"} {
		if block == 1 && !s.diffs() {
			break
		}
		for i, u := range [][]urTest{levT, difT}[block] {
			cs := seen[block][i]
			if len(cs.vals) == 0 {
				continue
			}
			det := contract.DetNames[u.Det]
			if lookupTest(u.Name).Break {
				det = "break in " + u.Break.String()
			}
			cv = append(cv, fmt.Sprintf("%s %s (%s) %s", title(u.Name), label, det, rangeText(cs.vals, cs.ts, dec)))
		}
	}
	if len(cv) > 0 {
		notes = append(notes, "5% critical values: "+strings.Join(cv, "; ")+".")
	}
	if src := sourcesText(levT, difT, seen, s.diffs()); src != "" {
		notes = append(notes, "Critical values from "+src+", each at its test regression's sample size.")
	}
	return append(notes, fmt.Sprintf("Lags: %s. Levels: deterministic terms %s; first differences: %s.%s",
		lagsText(levT), contract.DetNames[levT[0].Det], contract.DetNames[difT[0].Det], sampleSentence(s.Sample)))
}

// sourcesText names where each test's critical values come from, tests
// sharing a source together ("ADF, PP: MacKinnon (2010) response
// surface"), each test once: a test whose levels and differences take
// their values from different sources (DF-GLS with a trend in levels and
// a constant in differences) is named with the block each time ("DF-GLS
// levels: …; DF-GLS differences: …").
func sourcesText(levT, difT []urTest, seen [2][]critSeen, diffs bool) string {
	blocks := [][]urTest{levT, difT}
	if !diffs {
		blocks = blocks[:1]
	}
	// The sources of each test over both blocks, to see which tests need
	// the block named.
	all := map[string][]string{}
	for b, tests := range blocks {
		for i, u := range tests {
			for _, src := range seen[b][i].sources {
				if !slices.Contains(all[u.Name], src) {
					all[u.Name] = append(all[u.Name], src)
				}
			}
		}
	}
	by := map[string][]string{}
	var order []string
	for b, tests := range blocks {
		for i, u := range tests {
			who := title(u.Name)
			if len(all[u.Name]) > 1 {
				who += " " + []string{"levels", "differences"}[b]
			}
			for _, src := range seen[b][i].sources {
				if slices.Contains(by[src], who) {
					continue
				}
				if len(by[src]) == 0 {
					order = append(order, src)
				}
				by[src] = append(by[src], who)
			}
		}
	}
	var parts []string
	for _, src := range order {
		parts = append(parts, strings.Join(by[src], ", ")+": "+src)
	}
	return strings.Join(parts, "; ")
}

// cellNote says what the brackets hold and which null each test has,
// from the tests' registrations.
func cellNote(tests []urTest) string {
	var lagged, bw, stationary, unitRoot []string
	for _, u := range tests {
		d := lookupTest(u.Name)
		if d.Bandwidth {
			bw = append(bw, d.Title)
		} else {
			lagged = append(lagged, d.Title)
		}
		if d.Stationarity {
			stationary = append(stationary, d.Title)
		} else {
			unitRoot = append(unitRoot, d.Title)
		}
	}
	var in []string
	if len(lagged) > 0 {
		in = append(in, "the lagged differences ("+strings.Join(lagged, ", ")+")")
	}
	if len(bw) > 0 {
		in = append(in, "the Bartlett bandwidth ("+strings.Join(bw, ", ")+")")
	}
	note := "Each cell is the test statistic, with " + strings.Join(in, " or ") + " in brackets."
	switch {
	case len(stationary) > 0 && len(unitRoot) > 0:
		note += fmt.Sprintf(" %s test%s the null of stationarity; %s the null of a unit root.", strings.Join(stationary, ", "), map[bool]string{true: "s", false: ""}[len(stationary) == 1], strings.Join(unitRoot, ", "))
	case len(stationary) > 0:
		note += " Every test here has the null of stationarity."
	default:
		note += " Every test here has the null of a unit root."
	}
	return note
}

// lagsText describes how each test's lags were set, grouping tests that
// share a rule (only tests with lags; bandwidths are in the brackets).
func lagsText(tests []urTest) string {
	var order []string
	by := map[string][]string{}
	for _, u := range tests {
		if lookupTest(u.Name).Bandwidth {
			continue
		}
		r := engine.DescribeLags(u.Lags, -1)
		if len(by[r]) == 0 {
			order = append(order, r)
		}
		by[r] = append(by[r], title(u.Name))
	}
	if len(order) == 0 {
		return "none (the tests use a bandwidth)"
	}
	if len(order) == 1 {
		return order[0]
	}
	var parts []string
	for _, r := range order {
		parts = append(parts, strings.Join(by[r], ", ")+" "+r)
	}
	return strings.Join(parts, "; ")
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
