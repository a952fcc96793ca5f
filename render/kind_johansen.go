package render

import (
	"fmt"
	"math"
	"regexp"
	"slices"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/mat"
	"gopkg.in/yaml.v3"

	"github.com/galley-econ/galley/analysis/johansen"
)

// This file holds the system-cointegration directives:
//
//	johansen  the trace and maximum-eigenvalue rank tests (one row per rank);
//	vecm      the estimated relations β, loadings α and restriction tests
//	          (show: relations), or the short-run coefficients (show: short-run),
//	          from a johansen result (from: ID) or from the same keys;
//	var-lags  the lag-order table of the VAR in levels (AIC, BIC, HQ).

// SystemKeys are the analysis keys shared by johansen and vecm (exported
// only so that the YAML decoder sees the embedded fields).
type SystemKeys struct {
	Data        string        `yaml:"data"`
	Series      []string      `yaml:"series"`
	Det         string        `yaml:"det"`
	Lags        sysLags       `yaml:"lags"`
	Sample      string        `yaml:"sample"`
	SmallSample bool          `yaml:"small_sample"`
	Level       *float64      `yaml:"level"`
	Rank        *int          `yaml:"rank"`
	Normalize   nameList      `yaml:"normalize"`
	Restrict    sysHypotheses `yaml:"restrict"`
	Exogenous   []nameList    `yaml:"exogenous"`
	Decimals    *int          `yaml:"decimals"`

	SimKeys `yaml:",inline"` // crit: simulate (simcrit.go)
}

type johansenSpec struct {
	Common     `yaml:",inline"`
	SystemKeys `yaml:",inline"`

	state *sysState // set by Run, read by vecm directives that name this one
}

type vecmSpec struct {
	Common     `yaml:",inline"`
	SystemKeys `yaml:",inline"`
	From       string `yaml:"from"`
	Show       string `yaml:"show"`
}

type varLagsSpec struct {
	Common   `yaml:",inline"`
	Data     string   `yaml:"data"`
	Series   []string `yaml:"series"`
	Det      string   `yaml:"det"`
	Max      *int     `yaml:"max"`
	Sample   string   `yaml:"sample"`
	Decimals *int     `yaml:"decimals"`
}

var sysFields = []string{"eig", "trace", "maxeig", "crit_trace", "crit_maxeig", "crit_source", "rank", "rank_chosen", "level",
	"small_sample", "factor", "beta", "beta_se", "alpha", "alpha_se", "tests", "nobs", "lags", "lag_choice", "det", "series", "sample",
	"relations", "crit_mcse_trace", "crit_mcse_maxeig", "pvalue_trace", "pvalue_maxeig", "sim_key", "sim"} // the last six with crit: simulate (simcrit.go)

func init() {
	Register(Kind{Name: "johansen", Summary: "Johansen trace and maximum-eigenvalue tests of the cointegrating rank of a VECM",
		New: func() Directive { return &johansenSpec{} }, Fields: sysFields})
	Register(Kind{Name: "vecm", Summary: "vector error-correction model: cointegrating relations, loadings, restriction tests or short-run coefficients",
		New: func() Directive { return &vecmSpec{} }, Fields: append(slices.Clone(sysFields), "short", "show")})
	Register(Kind{Name: "var-lags", Summary: "lag-order criteria (AIC, BIC, HQ) of the VAR in levels behind a VECM",
		New: func() Directive { return &varLagsSpec{} }, Fields: []string{"rows", "aic", "bic", "hq", "nobs", "max", "det", "series", "sample"}})
}

// ---------------------------------------------------------------- YAML types

// sysLags is the `lags:` key of a VECM: a number of lagged differences
// (`lags: 1`), a criterion with the default maximum (`lags: bic`), or a
// criterion with a maximum (`lags: {select: aic, max: 8}`).
type sysLags struct {
	Set    bool
	Fixed  int
	Select string
	Max    *int
}

const sysLagsHelp = "lags: write a number of lagged differences, a criterion (aic, bic, hq), or {select: aic, max: 8}"

func (l *sysLags) UnmarshalYAML(n *yaml.Node) error {
	l.Set = true
	switch n.Kind {
	case yaml.ScalarNode:
		var k int
		if err := n.Decode(&k); err == nil {
			if k < 0 {
				return fmt.Errorf("line %d: lags must be zero or more, got %d", n.Line, k)
			}
			l.Fixed = k
			return nil
		}
		if !slices.Contains(sysCriteria, strings.ToLower(n.Value)) {
			return fmt.Errorf("line %d: %s", n.Line, sysLagsHelp)
		}
		l.Select = strings.ToLower(n.Value)
		return nil
	case yaml.MappingNode:
		var m struct {
			Select string `yaml:"select"`
			Max    *int   `yaml:"max"`
		}
		if err := checkKeys(n, &m); err != nil {
			return err
		}
		if err := n.Decode(&m); err != nil {
			return err
		}
		if !slices.Contains(sysCriteria, strings.ToLower(m.Select)) {
			return fmt.Errorf("line %d: lags: select must be aic, bic or hq, not %q", n.Line, m.Select)
		}
		if m.Max != nil && *m.Max < 0 {
			return fmt.Errorf("line %d: lags: max must be zero or more", n.Line)
		}
		l.Select, l.Max = strings.ToLower(m.Select), m.Max
		return nil
	}
	return fmt.Errorf("line %d: %s", n.Line, sysLagsHelp)
}

var sysCriteria = []string{"aic", "bic", "hq"}

// sysHypotheses is the `restrict:` key: a mapping from a test's name to one
// linear equation on the coefficients of every cointegrating relation, or a
// list of them tested jointly:
//
//	restrict:
//	  homogeneity: "log(south) = -log(north)"
//	  no_const: ["const = 0"]
type sysHypotheses []sysHypothesis

type sysHypothesis struct {
	Name      string
	Equations []string
	Line      int
}

func (h *sysHypotheses) UnmarshalYAML(n *yaml.Node) error {
	if n.Kind != yaml.MappingNode {
		return fmt.Errorf("line %d: restrict: write a mapping from a test name to an equation, e.g. homogeneity: \"log(a) = -log(b)\"", n.Line)
	}
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := n.Content[i], n.Content[i+1]
		if !validID(k.Value) {
			return fmt.Errorf("line %d: restrict: test name %q: use letters, digits, '_' and '-', starting with a letter", k.Line, k.Value)
		}
		var eq nameList
		if err := eq.UnmarshalYAML(v); err != nil {
			return fmt.Errorf("line %d: restrict: %s: write an equation or a list of equations", v.Line, k.Value)
		}
		if len(eq) == 0 {
			return fmt.Errorf("line %d: restrict: %s has no equation", v.Line, k.Value)
		}
		*h = append(*h, sysHypothesis{Name: k.Value, Equations: eq, Line: k.Line})
	}
	return nil
}

// ---------------------------------------------------------------- settings

// sysSettings are the validated keys.
type sysSettings struct {
	Case        johansen.Case
	Level       float64
	Names       []string // series expressions as written
	Coefs       []string // names of the rows of β: the series, then const or trend
	Rows        [][]sysRestr
	Exog        [][]int
	SmallSample bool
}

// sysRestr is one parsed equation: a row of R' in R'β = 0.
type sysRestr struct {
	Text string
	Row  []float64
}

func (k *SystemKeys) settings(c *Context) (sysSettings, error) {
	var st sysSettings
	if len(k.Series) < 2 {
		return st, c.Errorf("series", "a cointegrated system needs at least two series; series lists %d", len(k.Series))
	}
	st.Names = k.Series
	for i, a := range k.Series {
		for _, b := range k.Series[:i] {
			if normName(a) == normName(b) {
				return st, c.Errorf("series", "series %q is listed twice; the moment matrices would be singular", a)
			}
		}
	}
	det := k.Det
	if det == "" {
		det = "c"
	}
	var err error
	if st.Case, err = johansen.ParseCase(det); err != nil {
		return st, c.Errorf("det", "det: %q is not a case; write n, rc, c, rt or ct", k.Det)
	}
	if !k.Lags.Set {
		return st, c.Errorf("", "galley %s: the key \"lags\" is required (a number of lagged differences, or aic, bic or hq)", c.b.kind.Name)
	}
	st.Level = 0.05
	if k.Level != nil {
		st.Level = *k.Level
		if !slices.Contains(johansen.Levels[:], st.Level) {
			return st, c.Errorf("level", "level must be 0.10, 0.05 or 0.01 (the levels the critical values are tabulated at), not %g", st.Level)
		}
	}
	K := len(k.Series)
	if k.Rank != nil && (*k.Rank < 1 || *k.Rank > K-1) {
		return st, c.Errorf("rank", "rank %d is outside 1..K−1 = 1..%d for %d series", *k.Rank, K-1, K)
	}
	if len(k.Normalize) > K-1 {
		return st, c.Errorf("normalize", "normalize names %d series; there can be at most K−1 = %d relations", len(k.Normalize), K-1)
	}
	seen := map[int]bool{}
	for _, n := range k.Normalize {
		i, err := seriesIndex(n, k.Series)
		if err != nil {
			return st, c.Errorf("normalize", "normalize: %v", err)
		}
		if seen[i] {
			return st, c.Errorf("normalize", "normalize: %q is named twice", n)
		}
		seen[i] = true
	}
	if k.Rank != nil && len(k.Normalize) > *k.Rank {
		return st, c.Errorf("normalize", "normalize names %d series for rank %d; name at most one per relation", len(k.Normalize), *k.Rank)
	}
	st.Coefs = slices.Clone(k.Series)
	switch st.Case {
	case johansen.RC:
		st.Coefs = append(st.Coefs, "const")
	case johansen.RT:
		st.Coefs = append(st.Coefs, "trend")
	}
	for _, h := range k.Restrict {
		var rows []sysRestr
		for _, e := range h.Equations {
			row, err := parseRestriction(e, st.Coefs, st.Case)
			if err != nil {
				return st, c.Errorf("restrict", "restrict: %s: %v", h.Name, err)
			}
			rows = append(rows, sysRestr{Text: e, Row: row})
		}
		st.Rows = append(st.Rows, rows)
	}
	for _, ex := range k.Exogenous {
		var idx []int
		for _, n := range ex {
			i, err := seriesIndex(n, k.Series)
			if err != nil {
				return st, c.Errorf("exogenous", "exogenous: %v", err)
			}
			idx = append(idx, i)
		}
		if len(idx) == 0 {
			return st, c.Errorf("exogenous", "exogenous: an empty list")
		}
		st.Exog = append(st.Exog, idx)
	}
	names := map[string]bool{}
	for _, n := range k.testNames() {
		if names[n] {
			return st, c.Errorf("restrict", "two restriction tests are both called %q", n)
		}
		names[n] = true
	}
	st.SmallSample = k.SmallSample
	// crit: simulate (simcrit.go)
	if sim, err := k.SimKeys.settings(c, c.b.kind.Name); err != nil {
		return st, err
	} else if sim != nil && k.SmallSample {
		return st, c.Errorf("crit", "crit: simulate already gives critical values at this sample size; drop small_sample (the Reinsel–Ahn factor) or use the tables")
	}
	return st, nil
}

// testNames are the names of the restriction tests, in table order: the
// restrict: entries, then one exog(...) per exogenous: entry.
func (k *SystemKeys) testNames() []string {
	var out []string
	for _, h := range k.Restrict {
		out = append(out, h.Name)
	}
	for _, ex := range k.Exogenous {
		var parts []string
		for _, n := range ex {
			parts = append(parts, normName(n))
		}
		out = append(out, "exog("+strings.Join(parts, ",")+")")
	}
	return out
}

func normName(s string) string { return strings.Join(strings.Fields(s), "") }

func seriesIndex(name string, series []string) (int, error) {
	for i, s := range series {
		if normName(s) == normName(name) {
			return i, nil
		}
	}
	return 0, fmt.Errorf("%q is not one of the series%s (%s)", name, didYouMean(name, series), strings.Join(series, ", "))
}

var coefTermRE = regexp.MustCompile(`^([0-9]*\.?[0-9]+(?:[eE][-+]?[0-9]+)?)?\s*\*?\s*(.*)$`)

// parseRestriction reads one linear equation on the coefficients of a
// cointegrating relation, such as "log(north) = -log(fuel)",
// "log(south) - log(north) = 0" or "const = 0", into the row r of R' in
// R'β = 0: each side is a sum of terms [±][number[*]]name, a name being one
// of coefs (whitespace ignored), or the number 0.
func parseRestriction(eq string, coefs []string, cs johansen.Case) ([]float64, error) {
	lhs, rhs, ok := strings.Cut(eq, "=")
	if !ok || strings.Contains(rhs, "=") {
		return nil, fmt.Errorf("%q: write one equation with a single '=', e.g. \"log(a) = -log(b)\"", eq)
	}
	row := make([]float64, len(coefs))
	for side, text := range []string{lhs, rhs} {
		sign := 1.0
		if side == 1 {
			sign = -1
		}
		terms, err := splitTerms(text)
		if err != nil {
			return nil, fmt.Errorf("%q: %v", eq, err)
		}
		for _, t := range terms {
			m := coefTermRE.FindStringSubmatch(t.text)
			w := 1.0
			if m[1] != "" {
				w, _ = strconv.ParseFloat(m[1], 64)
			}
			name := normName(m[2])
			if name == "" {
				if w != 0 {
					return nil, fmt.Errorf("%q: restrictions on β are homogeneous; a constant other than 0 cannot appear (write the restricted constant as const)", eq)
				}
				continue
			}
			i := slices.IndexFunc(coefs, func(c string) bool { return normName(c) == name })
			if i < 0 {
				hint := ""
				if name == "const" || name == "trend" {
					hint = fmt.Sprintf("; β has a %s row only in case %s (this is case %s)", name, map[string]string{"const": "rc", "trend": "rt"}[name], cs)
				}
				return nil, fmt.Errorf("%q: %q is not a coefficient of the relations%s (%s)%s", eq, m[2], didYouMean(m[2], coefs), strings.Join(coefs, ", "), hint)
			}
			row[i] += sign * t.sign * w
		}
	}
	if slices.IndexFunc(row, func(v float64) bool { return v != 0 }) < 0 {
		return nil, fmt.Errorf("%q restricts nothing (its coefficients cancel)", eq)
	}
	return row, nil
}

type signedTerm struct {
	sign float64
	text string
}

// splitTerms splits a sum at its top-level + and − signs (not inside
// parentheses, not in a number's exponent).
func splitTerms(s string) ([]signedTerm, error) {
	var out []signedTerm
	depth, start := 0, 0
	sign := 1.0
	flush := func(end int) error {
		t := strings.TrimSpace(s[start:end])
		if t == "" {
			return fmt.Errorf("a term is missing")
		}
		out = append(out, signedTerm{sign, t})
		return nil
	}
	s = strings.ReplaceAll(s, "−", "-")
	for i, r := range s {
		switch r {
		case '(':
			depth++
		case ')':
			depth--
		case '+', '-':
			if depth != 0 || (i > 0 && (s[i-1] == 'e' || s[i-1] == 'E') && i > 1 && s[i-2] >= '0' && s[i-2] <= '9') {
				continue
			}
			if strings.TrimSpace(s[start:i]) == "" && len(out) == 0 {
				if r == '-' {
					sign = -sign
				}
				start = i + 1
				continue
			}
			if err := flush(i); err != nil {
				return nil, err
			}
			sign = 1
			if r == '-' {
				sign = -1
			}
			start = i + 1
		}
	}
	if depth != 0 {
		return nil, fmt.Errorf("unbalanced parentheses")
	}
	if err := flush(len(s)); err != nil {
		return nil, err
	}
	return out, nil
}

// ---------------------------------------------------------------- running

// sysState is one run of the analysis, shared with vecm directives.
type sysState struct {
	st         sysSettings
	d          *Data
	res        *johansen.Result
	lags       *johansen.LagTable // set when lags were chosen by a criterion
	lagMax     int
	trace, max []float64
	crT, crM   [][3]float64
	chosen     int
	rank       int   // rank of the estimates (0: none)
	norm       []int // normalisation series
	vecm       *johansen.VECM
	tests      []sysTest
	sim        *sysSim // crit: simulate (simcrit.go)
}

type sysTest struct {
	Name, Hyp string
	LR        *johansen.LR
}

// levelsMatrix copies aligned series into a T×K matrix.
func levelsMatrix(d *Data) *mat.Dense {
	y := mat.NewDense(d.N(), len(d.Cols), nil)
	for j, col := range d.Cols {
		for i, v := range col {
			y.Set(i, j, v)
		}
	}
	return y
}

// seriesNumRE finds the analysis package's "series N" (or "series N and
// M") in an error.
var seriesNumRE = regexp.MustCompile(`series (\d+)(?: and (\d+))?`)

// nameSeries replaces the column numbers in an analysis error by the
// series as written.
func nameSeries(err error, names []string) error {
	name := func(d string) string {
		i, _ := strconv.Atoi(d)
		if i >= 0 && i < len(names) {
			return strconv.Quote(names[i])
		}
		return d
	}
	msg := seriesNumRE.ReplaceAllStringFunc(err.Error(), func(m string) string {
		sub := seriesNumRE.FindStringSubmatch(m)
		if sub[2] != "" {
			return "series " + name(sub[1]) + " and " + name(sub[2])
		}
		return "series " + name(sub[1])
	})
	return fmt.Errorf("%s", strings.TrimPrefix(msg, "johansen: "))
}

// defaultMaxLags is the default largest number of lagged differences
// when a criterion chooses: ⌊12(T/100)^{1/4}⌋ (common practice for the
// lag length of a unit-root regression), lowered until the VAR in levels
// with that many lags still has more observations than regressors.
func defaultMaxLags(n, k int, cs johansen.Case) int {
	m := int(math.Floor(12 * math.Pow(float64(n)/100, 0.25)))
	d := map[johansen.Case]int{johansen.N: 0, johansen.RC: 1, johansen.C: 1, johansen.RT: 2, johansen.CT: 2}[cs]
	for m >= 0 && n-(m+1) <= d+k*(m+1)+k {
		m--
	}
	return m
}

// checkCritical reports a case or a system size that the critical-value
// source does not cover, at the key responsible.
func checkCritical(c *Context, cs johansen.Case, k int) error {
	if _, err := johansen.CriticalValues(cs, johansen.TraceStat, 1); err != nil {
		return c.Errorf("det", "%v", strings.TrimPrefix(err.Error(), "johansen: "))
	}
	if _, err := johansen.CriticalValues(cs, johansen.TraceStat, k); err != nil {
		return c.Errorf("series", "%d series: %v", k, strings.TrimPrefix(err.Error(), "johansen: "))
	}
	return nil
}

func (k *SystemKeys) run(c *Context) (*sysState, error) {
	st, err := k.settings(c)
	if err != nil {
		return nil, err
	}
	K := len(st.Names)
	sim, err := k.SimKeys.settings(c, c.b.kind.Name) // crit: simulate (simcrit.go)
	if err != nil {
		return nil, err
	}
	if err := checkCritical(c, st.Case, K); sim == nil && err != nil {
		return nil, err
	}
	d, err := c.Data(c.DataAlias(k.Data), k.Series, k.Sample)
	if err != nil {
		return nil, err
	}
	s := &sysState{st: st, d: d}
	y := levelsMatrix(d)
	lags := k.Lags.Fixed
	if k.Lags.Select != "" {
		s.lagMax = defaultMaxLags(d.N(), K, st.Case)
		if k.Lags.Max != nil {
			s.lagMax = *k.Lags.Max
		}
		if s.lagMax < 0 {
			return nil, c.Errorf("lags", "too few observations: %d in the sample %s cannot fit a VAR in levels for %d series", d.N(), d.Range(), K)
		}
		if s.lags, err = johansen.LagOrder(y, st.Case, s.lagMax); err != nil {
			return nil, c.Errorf("lags", "%d observations in the sample %s: %v", d.N(), d.Range(), nameSeries(err, st.Names))
		}
		lags = map[string]int{"aic": s.lags.AIC, "bic": s.lags.BIC, "hq": s.lags.HQ}[k.Lags.Select]
	}
	if s.res, err = johansen.Test(y, st.Case, lags); err != nil {
		key := "series"
		if strings.Contains(err.Error(), "too few observations") {
			key = "lags"
		}
		return nil, c.Errorf(key, "%d observations in the sample %s: %v", d.N(), d.Range(), nameSeries(err, st.Names))
	}
	r := s.res
	s.trace, s.max = r.Statistics(k.SmallSample)
	if sim != nil { // crit: simulate (simcrit.go): simulated tables and the rank they choose
		if s.sim, err = simJohansen(c, sim, s); err != nil {
			return nil, err
		}
	} else {
		if s.crT, err = r.Critical(johansen.TraceStat); err == nil {
			s.crM, err = r.Critical(johansen.MaxEigStat)
		}
		if err != nil {
			return nil, c.Errorf("det", "%v", strings.TrimPrefix(err.Error(), "johansen: "))
		}
		if s.chosen, err = r.Rank(st.Level, k.SmallSample); err != nil {
			return nil, c.Errorf("level", "%v", strings.TrimPrefix(err.Error(), "johansen: "))
		}
	}
	s.rank = s.chosen
	if k.Rank != nil {
		s.rank = *k.Rank
	}
	if s.rank < 1 || s.rank > K-1 {
		if len(k.Normalize) > 0 || len(k.Restrict) > 0 || len(k.Exogenous) > 0 {
			return nil, c.Errorf("", "the sequential trace tests at %s choose rank %d, so there are no relations to normalise or test; set rank: (1..%d) to estimate them anyway", pct(st.Level), s.chosen, K-1)
		}
		s.rank = 0
		return s, nil
	}
	if len(k.Normalize) > s.rank {
		return nil, c.Errorf("normalize", "normalize names %d series, but the rank is %d (chosen at %s); name at most one series per relation", len(k.Normalize), s.rank, pct(st.Level))
	}
	for _, n := range k.Normalize {
		i, _ := seriesIndex(n, st.Names)
		s.norm = append(s.norm, i)
	}
	for i := 0; len(s.norm) < s.rank; i++ {
		if !slices.Contains(s.norm, i) {
			s.norm = append(s.norm, i)
		}
	}
	if s.vecm, err = r.Estimate(s.rank, s.norm); err != nil {
		return nil, c.Errorf("normalize", "%v", nameSeries(err, st.Names))
	}
	names := k.testNames()
	for h, rows := range st.Rows {
		H, err := restrictionBasis(rows, r.P1())
		if err != nil {
			return nil, c.Errorf("restrict", "restrict: %s: %v", names[h], err)
		}
		lr, err := r.TestBeta(s.rank, H)
		if err != nil {
			return nil, c.Errorf("restrict", "restrict: %s at rank %d: %v", names[h], s.rank, nameSeries(err, st.Names))
		}
		var texts []string
		for _, e := range rows {
			texts = append(texts, e.Text)
		}
		s.tests = append(s.tests, sysTest{Name: names[h], Hyp: strings.Join(texts, "; ") + " in every relation", LR: lr})
	}
	for i, ex := range st.Exog {
		lr, err := r.WeakExogeneity(s.rank, ex...)
		if err != nil {
			return nil, c.Errorf("exogenous", "exogenous at rank %d: %v", s.rank, nameSeries(err, st.Names))
		}
		var who []string
		for _, j := range ex {
			who = append(who, st.Names[j])
		}
		s.tests = append(s.tests, sysTest{Name: names[len(st.Rows)+i], Hyp: strings.Join(who, ", ") + " weakly exogenous (zero loadings)", LR: lr})
	}
	return s, nil
}

// restrictionBasis returns H, an orthonormal basis of the null space of R'
// (the rows), so that R'β = 0 ⇔ β = Hφ.
func restrictionBasis(rows []sysRestr, p1 int) (*mat.Dense, error) {
	q := len(rows)
	r := mat.NewDense(q, p1, nil)
	for i, e := range rows {
		r.SetRow(i, e.Row)
	}
	var svd mat.SVD
	if !svd.Factorize(r, mat.SVDFull) {
		return nil, fmt.Errorf("the restriction matrix could not be factorised")
	}
	sv := svd.Values(nil)
	for i, v := range sv {
		if v <= 1e-10*sv[0] {
			return nil, fmt.Errorf("the equations are not independent (equation %d follows from the others)", i+1)
		}
	}
	if q >= p1 {
		return nil, fmt.Errorf("%d equations leave no free coefficient in a relation of %d", q, p1)
	}
	var v mat.Dense
	svd.VTo(&v)
	return mat.DenseCopyOf(v.Slice(0, p1, q, p1)), nil
}

// ---------------------------------------------------------------- values

var sysCaseText = map[johansen.Case]string{
	johansen.N:  "no deterministic terms",
	johansen.RC: "a constant inside the cointegrating relations",
	johansen.C:  "an unrestricted constant",
	johansen.RT: "an unrestricted constant and a trend inside the cointegrating relations",
	johansen.CT: "an unrestricted constant and trend",
}

// critSource names the origin of the critical values by case.
func critSource(cs johansen.Case) string { return johansen.CriticalSource(cs) }

func levelMap(cv [3]float64) map[string]any {
	m := map[string]any{}
	for i, l := range johansen.Levels {
		m[pct(l)] = cv[i]
	}
	return m
}

func (s *sysState) values() map[string]any {
	r := s.res
	ct := make([]map[string]any, r.K)
	cm := make([]map[string]any, r.K)
	for i := range ct {
		ct[i], cm[i] = levelMap(s.crT[i]), levelMap(s.crM[i])
	}
	v := map[string]any{
		"eig": slices.Clone(r.Eigenvalues), "trace": s.trace, "maxeig": s.max,
		"crit_trace": ct, "crit_maxeig": cm, "crit_source": critSource(r.Case),
		"rank": s.rank, "rank_chosen": s.chosen, "level": s.st.Level,
		"small_sample": s.st.SmallSample, "factor": r.SmallSampleFactor(),
		"nobs": r.T, "lags": r.Lags, "det": r.Case.String(), "series": slices.Clone(s.st.Names),
		"sample": map[string]any{"from": s.d.Dates[r.Lags+1].String(), "to": s.d.Dates[s.d.N()-1].String(), "n": r.T},
	}
	if s.lags != nil {
		v["lag_choice"] = map[string]any{"aic": s.lags.AIC, "bic": s.lags.BIC, "hq": s.lags.HQ, "max": s.lagMax, "nobs": s.lags.T}
	}
	if s.sim != nil { // crit: simulate (simcrit.go)
		s.sim.values(v)
	}
	if s.vecm == nil {
		return v
	}
	m := s.vecm
	beta, betaSE := make([]map[string]any, s.rank), make([]map[string]any, s.rank)
	alpha, alphaSE := make([]map[string]any, s.rank), make([]map[string]any, s.rank)
	for j := 0; j < s.rank; j++ {
		beta[j], betaSE[j], alpha[j], alphaSE[j] = map[string]any{}, map[string]any{}, map[string]any{}, map[string]any{}
		for i, n := range s.st.Coefs {
			beta[j][n], betaSE[j][n] = m.Beta.At(i, j), m.BetaSE.At(i, j)
		}
		for i, n := range s.st.Names {
			alpha[j][n], alphaSE[j][n] = m.Alpha.At(i, j), m.AlphaSE.At(i, j)
		}
	}
	v["beta"], v["beta_se"], v["alpha"], v["alpha_se"] = beta, betaSE, alpha, alphaSE
	v["relations"] = s.relations()
	tests := []map[string]any{}
	for _, t := range s.tests {
		tests = append(tests, map[string]any{"name": t.Name, "hypothesis": t.Hyp, "stat": t.LR.Stat, "df": t.LR.DF, "p": t.LR.P})
	}
	v["tests"] = tests
	return v
}

// relations is the results-file form of the estimated cointegrating
// relations β_j'ỹ_t over the directive's sample, one dated series per
// relation (johansen.VECM.Relations gives the formula and the meaning of
// their levels in each case).
func (s *sysState) relations() []map[string]any {
	dates := make([]string, s.d.N())
	for i, dt := range s.d.Dates {
		dates[i] = dt.String()
	}
	zs := s.vecm.Relations(s.res.Case, levelsMatrix(s.d))
	out := make([]map[string]any, len(zs))
	for j, z := range zs {
		out[j] = map[string]any{"dates": dates, "values": z}
	}
	return out
}

// lagPhrase says how the lags were set.
func (s *sysState) lagPhrase(sel string) string {
	k := s.res.Lags
	w := "lagged differences"
	if k == 1 {
		w = "lagged difference"
	}
	if s.lags == nil {
		return fmt.Sprintf("%d %s (fixed)", k, w)
	}
	return fmt.Sprintf("%d %s, the minimum of %s over 0–%d on a common sample of %d observations", k, w, strings.ToUpper(sel), s.lagMax, s.lags.T)
}

// ---------------------------------------------------------------- johansen

func (s *johansenSpec) Check(c *Context) error {
	if err := c.Require("series", len(s.Series) == 0); err != nil {
		return err
	}
	if _, err := s.settings(c); err != nil {
		return err
	}
	return c.CheckData(c.DataAlias(s.Data), s.Series, s.Sample)
}

func (s *johansenSpec) Run(c *Context) (*Result, error) {
	st, err := s.run(c)
	if err != nil {
		return nil, err
	}
	s.state = st
	dec := c.Decimals()
	if s.Decimals != nil {
		dec = *s.Decimals
	}
	r := st.res
	t := &Table{Stub: 1, Head: [][]Cell{
		{Empty, Empty, Span("Trace", 4), Span("Maximum eigenvalue", 4)},
		{T("Rank r"), T("Eigenvalue"), T("Statistic"), T("10%"), T("5%"), T("1%"), T("Statistic"), T("10%"), T("5%"), T("1%")},
	}}
	stars := func(stat float64, cv [3]float64) int {
		n := 0
		for _, v := range cv {
			if stat > v {
				n++
			}
		}
		return n
	}
	for i := 0; i < r.K; i++ {
		row := []Cell{T(itoa(i)), N(r.Eigenvalues[i], dec), Starred(st.trace[i], 2, stars(st.trace[i], st.crT[i]))}
		for _, v := range st.crT[i] {
			row = append(row, N(v, 2))
		}
		row = append(row, Starred(st.max[i], 2, stars(st.max[i], st.crM[i])))
		for _, v := range st.crM[i] {
			row = append(row, N(v, 2))
		}
		t.Body = append(t.Body, Row{Cells: row})
	}
	t.Notes = []string{sysNote(st, s.Lags.Select)}
	if st.sim != nil { // crit: simulate (simcrit.go)
		t.Notes = append(t.Notes, st.sim.mcseNote())
	}
	if s.SmallSample {
		t.Notes = append(t.Notes, fmt.Sprintf("Statistics are multiplied by the Reinsel–Ahn small-sample factor (T − K(k+1))/T = %.3f.", r.SmallSampleFactor()))
	}
	t.Notes = append(t.Notes, "*, **, ***: the statistic exceeds its 10%, 5%, 1% critical value. "+st.d.SampleNote())
	return &Result{Table: t, Values: st.values()}, nil
}

// sysNote is the main note under the rank-test table.
func sysNote(st *sysState, sel string) string {
	r := st.res
	var b strings.Builder
	fmt.Fprintf(&b, "VECM in %s with %s (case %s) and %s; T = %d observations (%s–%s). ",
		strings.Join(st.st.Names, ", "), sysCaseText[r.Case], r.Case, st.lagPhrase(sel), r.T,
		st.d.Dates[r.Lags+1], st.d.Dates[st.d.N()-1])
	fmt.Fprintf(&b, "The trace statistic tests rank r against %d, the maximum-eigenvalue statistic r against r + 1; critical values: %s. ", r.K, st.critText()) // critText: simcrit.go
	fmt.Fprintf(&b, "Testing r = 0, 1, … in turn with the trace statistic at %s gives rank %d", pct(st.st.Level), st.chosen)
	if st.rank != st.chosen && st.rank > 0 {
		fmt.Fprintf(&b, "; the estimates use rank %d as set by the author", st.rank)
	}
	b.WriteString(".")
	return b.String()
}

// ---------------------------------------------------------------- vecm

// ownKeys lists the system keys set on a vecm directive.
func (s *vecmSpec) ownKeys(c *Context) []string {
	var out []string
	for _, k := range []string{"data", "series", "det", "lags", "sample", "small_sample", "level", "rank", "normalize", "restrict", "exogenous", "crit", "reps", "seed"} {
		if c.Has(k) {
			out = append(out, k)
		}
	}
	return out
}

func (s *vecmSpec) show() string {
	if s.Show == "" {
		return "relations"
	}
	return s.Show
}

func (s *vecmSpec) Check(c *Context) error {
	if sh := s.show(); sh != "relations" && sh != "short-run" {
		return c.Errorf("show", "show: write relations (β, α and the restriction tests) or short-run (Γ and the deterministic terms), not %q", s.Show)
	}
	if s.From != "" {
		if own := s.ownKeys(c); len(own) > 0 {
			return c.Errorf(own[0], "with from: the system is that of %q; %s cannot be set here as well", s.From, own[0])
		}
		return c.CheckRef("from", s.From, "johansen")
	}
	if len(s.Series) == 0 {
		return c.Errorf("", "galley vecm: give from: (the id of a johansen result) or the system's keys (series, lags, …)")
	}
	if _, err := s.settings(c); err != nil {
		return err
	}
	return c.CheckData(c.DataAlias(s.Data), s.Series, s.Sample)
}

func (s *vecmSpec) Run(c *Context) (*Result, error) {
	var st *sysState
	sel := s.Lags.Select
	if s.From != "" {
		if _, err := c.Result("from", s.From, "johansen"); err != nil {
			return nil, err
		}
		jb := c.doc.byID[s.From]
		js := jb.dir.(*johansenSpec)
		if js.state == nil { // its result came from the cache: redo the analysis
			st, err := js.run(&Context{doc: c.doc, b: jb})
			if err != nil {
				return nil, err
			}
			js.state = st
		}
		st, sel = js.state, js.Lags.Select
	} else {
		var err error
		if st, err = s.run(c); err != nil {
			return nil, err
		}
	}
	if st.vecm == nil {
		return nil, c.Errorf("", "the sequential trace tests at %s choose rank %d, so there is no error-correction model to show; set rank: (1..%d)", pct(st.st.Level), st.chosen, st.res.K-1)
	}
	dec := c.Decimals()
	if s.Decimals != nil {
		dec = *s.Decimals
	}
	vals := st.values()
	vals["show"] = s.show()
	vals["short"] = shortValues(st)
	var t *Table
	if s.show() == "relations" {
		t = relationsTable(st, dec)
	} else {
		t = shortRunTable(st, dec)
	}
	t.Notes = append(t.Notes, fmt.Sprintf("VECM of rank %d in %s with %s (case %s) and %s; T = %d.",
		st.rank, strings.Join(st.st.Names, ", "), sysCaseText[st.res.Case], st.res.Case, st.lagPhrase(sel), st.res.T))
	return &Result{Table: t, Values: vals}, nil
}

// relationsTable shows β and α side by side for each relation, then the
// likelihood-ratio tests.
func relationsTable(st *sysState, dec int) *Table {
	m := st.vecm
	r := st.rank
	cols := 1 + 2*r
	head1, head2 := []Cell{Empty}, []Cell{Empty}
	for j := 0; j < r; j++ {
		head1 = append(head1, Span(fmt.Sprintf("Relation %d", j+1), 2))
		head2 = append(head2, T("β"), T("α"))
	}
	t := &Table{Stub: 1, Head: [][]Cell{head1, head2}}
	for i, name := range st.st.Coefs {
		est, se := []Cell{T(name)}, []Cell{Empty}
		for j := 0; j < r; j++ {
			est = append(est, N(m.Beta.At(i, j), dec))
			if slices.Contains(st.norm, i) {
				se = append(se, Empty)
			} else {
				se = append(se, SECell(m.BetaSE.At(i, j), dec))
			}
			if i < st.res.K {
				est = append(est, N(m.Alpha.At(i, j), dec))
				se = append(se, SECell(m.AlphaSE.At(i, j), dec))
			} else {
				est, se = append(est, Empty), append(se, Empty)
			}
		}
		t.Body = append(t.Body, Row{Cells: est}, Row{Cells: se})
	}
	for i, ts := range st.tests {
		row := []Cell{T(fmt.Sprintf("LR %s: %s", ts.Name, ts.Hyp)), N(ts.LR.Stat, dec)}
		row[1].Suffix = fmt.Sprintf(" [%d]", ts.LR.DF)
		row = append(row, N(ts.LR.P, dec))
		for len(row) < cols {
			row = append(row, Empty)
		}
		t.Body = append(t.Body, Row{Cells: row, RuleAbove: i == 0})
	}
	var norm []string
	for j, i := range st.norm {
		norm = append(norm, fmt.Sprintf("relation %d on %s", j+1, st.st.Names[i]))
	}
	t.Notes = append(t.Notes, "β normalised with "+strings.Join(norm, ", ")+
		"; standard errors in parentheses (β: Johansen's asymptotic; α: least squares given β).")
	if len(st.tests) > 0 {
		t.Notes = append(t.Notes, "LR rows: the likelihood-ratio statistic with its degrees of freedom in brackets, then its χ² p-value.")
	}
	return t
}

// shortRunTerm names a short-run regressor for tables and values.
func shortRunTerm(tm johansen.Term, names []string) (label, key string) {
	switch tm.Kind {
	case johansen.Constant:
		return "Constant", "const"
	case johansen.Trend:
		return "Trend", "trend"
	}
	n := names[tm.Series]
	return fmt.Sprintf("Δ%s, lag %d", n, tm.Lag), fmt.Sprintf("lag%d:%s", tm.Lag, normName(n))
}

// shortRunTable has one column per equation: the loadings on each
// relation, then the Γ_i and the unrestricted deterministic terms.
func shortRunTable(st *sysState, dec int) *Table {
	m := st.vecm
	head := []Cell{Empty}
	for _, n := range st.st.Names {
		head = append(head, T("Δ"+n))
	}
	t := &Table{Stub: 1, Head: [][]Cell{head}}
	add := func(label string, est, se func(eq int) float64, rule bool) {
		e, s := []Cell{T(label)}, []Cell{Empty}
		for eq := range st.st.Names {
			e, s = append(e, N(est(eq), dec)), append(s, SECell(se(eq), dec))
		}
		t.Body = append(t.Body, Row{Cells: e, RuleAbove: rule}, Row{Cells: s})
	}
	for j := 0; j < st.rank; j++ {
		add(fmt.Sprintf("Relation %d (α)", j+1), func(eq int) float64 { return m.Alpha.At(eq, j) }, func(eq int) float64 { return m.AlphaSE.At(eq, j) }, false)
	}
	for k, tm := range m.Terms {
		label, _ := shortRunTerm(tm, st.st.Names)
		add(label, func(eq int) float64 { return m.Short.At(eq, k) }, func(eq int) float64 { return m.ShortSE.At(eq, k) }, k == 0)
	}
	t.Notes = append(t.Notes, "Columns are equations. Given β, each equation is fitted by least squares; standard errors in parentheses.")
	return t
}

// shortValues is the results-file form of the short-run coefficients:
// one entry per regressor, each with {est, se} per equation.
func shortValues(st *sysState) []map[string]any {
	m := st.vecm
	out := []map[string]any{}
	for k, tm := range m.Terms {
		_, key := shortRunTerm(tm, st.st.Names)
		e := map[string]any{"term": key}
		for eq, n := range st.st.Names {
			e[n] = map[string]any{"est": m.Short.At(eq, k), "se": m.ShortSE.At(eq, k)}
		}
		out = append(out, e)
	}
	return out
}

// ---------------------------------------------------------------- var-lags

func (s *varLagsSpec) Check(c *Context) error {
	if err := c.Require("series", len(s.Series) == 0); err != nil {
		return err
	}
	if _, err := s.cse(c); err != nil {
		return err
	}
	if s.Max != nil && *s.Max < 0 {
		return c.Errorf("max", "max must be zero or more")
	}
	return c.CheckData(c.DataAlias(s.Data), s.Series, s.Sample)
}

func (s *varLagsSpec) cse(c *Context) (johansen.Case, error) {
	det := s.Det
	if det == "" {
		det = "c"
	}
	cs, err := johansen.ParseCase(det)
	if err != nil {
		return cs, c.Errorf("det", "det: %q is not a case; write n, rc, c, rt or ct", s.Det)
	}
	return cs, nil
}

func (s *varLagsSpec) Run(c *Context) (*Result, error) {
	cs, err := s.cse(c)
	if err != nil {
		return nil, err
	}
	d, err := c.Data(c.DataAlias(s.Data), s.Series, s.Sample)
	if err != nil {
		return nil, err
	}
	maxL := defaultMaxLags(d.N(), len(s.Series), cs)
	if s.Max != nil {
		maxL = *s.Max
	}
	if maxL < 0 {
		return nil, c.Errorf("series", "too few observations: %d in the sample %s cannot fit a VAR in levels for %d series", d.N(), d.Range(), len(s.Series))
	}
	lt, err := johansen.LagOrder(levelsMatrix(d), cs, maxL)
	if err != nil {
		key := "series"
		if strings.Contains(err.Error(), "too few") {
			key = "max"
		}
		return nil, c.Errorf(key, "%d observations in the sample %s: %v", d.N(), d.Range(), nameSeries(err, s.Series))
	}
	dec := c.Decimals()
	if s.Decimals != nil {
		dec = *s.Decimals
	}
	t := &Table{Stub: 1, Head: [][]Cell{{T("Lagged differences"), T("Coefficients"), T("ln det Σ"), T("AIC"), T("BIC"), T("HQ")}}}
	var rows []map[string]any
	for _, r := range lt.Rows {
		t.Body = append(t.Body, Row{Cells: []Cell{T(itoa(r.Lags)), I(r.Params), N(r.LogDet, dec), N(r.AIC, dec), N(r.BIC, dec), N(r.HQ, dec)}})
		rows = append(rows, map[string]any{"lags": r.Lags, "params": r.Params, "logdet": r.LogDet, "aic": r.AIC, "bic": r.BIC, "hq": r.HQ})
	}
	t.Body = append(t.Body, Row{Cells: []Cell{T("Minimum at"), Empty, Empty, I(lt.AIC), I(lt.BIC), I(lt.HQ)}, RuleAbove: true})
	det := map[johansen.Case]string{johansen.N: "no deterministic terms", johansen.RC: "a constant", johansen.C: "a constant",
		johansen.RT: "a constant and trend", johansen.CT: "a constant and trend"}[cs]
	t.Notes = []string{fmt.Sprintf("VAR in the levels of %s with %s (for case %s), fitted by least squares with k + 1 lags for k = 0–%d lagged differences on the common sample of T = %d observations; Σ is the residual covariance, and the criteria are ln det Σ plus a penalty per coefficient (2/T, ln T/T, 2 ln ln T/T).",
		strings.Join(s.Series, ", "), det, cs, maxL, lt.T), d.SampleNote()}
	vals := map[string]any{"rows": rows, "aic": lt.AIC, "bic": lt.BIC, "hq": lt.HQ, "nobs": lt.T, "max": maxL,
		"det": cs.String(), "series": slices.Clone(s.Series), "sample": sampleValues(d)}
	return &Result{Table: t, Values: vals}, nil
}
