package johansen

import (
	"errors"
	"fmt"
	"slices"
	"strings"

	"gopkg.in/yaml.v3"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/restrict"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/manuscript"
)

// The YAML types of the johansen, vecm and var-lags keys, and their
// settings checked and resolved against the data.

// sysLags is the `lags:` key of a VECM: a number of lagged differences
// (`lags: 1`), a criterion with the default maximum (`lags: bic`), or a
// criterion with a maximum (`lags: {select: aic, max: 8}`).
type sysLags struct{ engine.LagChoice }

func (l *sysLags) UnmarshalYAML(n *yaml.Node) error {
	return l.Decode(n, func(s string) error {
		if !slices.Contains(sysCriteria, strings.ToLower(s)) {
			return fmt.Errorf("select must be aic, bic or hq, not %q", s)
		}
		return nil
	}, "lags: write a number of lagged differences, a criterion (aic, bic, hq), or {select: aic, max: 8}")
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
		if !engine.ValidID(k.Value) {
			return fmt.Errorf("line %d: restrict: test name %q: use letters, digits, '_' and '-', starting with a letter", k.Line, k.Value)
		}
		var eq manuscript.NameList
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

// settings validates the system's keys and returns them: the series and
// case, the level, the rows of β, the restriction and weak-exogeneity
// tests; the first error is at its key.
func (k *SystemKeys) settings(c *engine.Context) (sysSettings, error) {
	var st sysSettings
	if err := k.checkSeries(c); err != nil {
		return st, err
	}
	st.Names = k.Series
	cs, err := engine.SystemCase(c, k.Det, int(johansen.C))
	if err != nil {
		return st, err
	}
	st.Case = johansen.Case(cs)
	if !k.Lags.Set {
		return st, c.Errorf("", "galley %s: the key \"lags\" is required (a number of lagged differences, or aic, bic or hq)", c.Kind())
	}
	st.Level = 0.05
	if k.Level != nil {
		st.Level = *k.Level
		if !slices.Contains(johansen.Levels[:], st.Level) {
			return st, c.Errorf("level", "level must be 0.10, 0.05 or 0.01 (the levels the critical values are tabulated at), not %g", st.Level)
		}
	}
	if err := k.checkRank(c); err != nil {
		return st, err
	}
	if err := k.checkRankBoot(c); err != nil {
		return st, err
	}
	st.Coefs = slices.Clone(k.Series)
	switch st.Case {
	case johansen.RC:
		st.Coefs = append(st.Coefs, "const")
	case johansen.RT:
		st.Coefs = append(st.Coefs, "trend")
	}
	if err := k.checkDummies(c, &st); err != nil {
		return st, err
	}
	if err := k.readTests(c, &st); err != nil {
		return st, err
	}
	st.SmallSample = k.SmallSample
	// crit: simulate (simcrit.go)
	if sim, err := k.SimKeys.Settings(c); err != nil {
		return st, err
	} else if sim != nil && k.SmallSample {
		return st, c.Errorf("crit", "crit: simulate already gives critical values at this sample size; drop small_sample (the Reinsel–Ahn factor) or use the tables")
	}
	return st, nil
}

// checkSeries returns an error unless series: lists two or more series,
// none twice.
func (k *SystemKeys) checkSeries(c *engine.Context) error {
	if len(k.Series) < 2 {
		return c.Errorf("series", "a cointegrated system needs at least two series; series lists %d", len(k.Series))
	}
	for i, a := range k.Series {
		for _, b := range k.Series[:i] {
			if normName(a) == normName(b) {
				return c.Errorf("series", "series %q is listed twice; the moment matrices would be singular", a)
			}
		}
	}
	return nil
}

// checkRank returns an error for a rank outside 1 … K−1, or a normalize:
// list that is too long for K or the rank, names an unknown series or
// names one twice.
func (k *SystemKeys) checkRank(c *engine.Context) error {
	K := len(k.Series)
	if k.Rank != nil && (*k.Rank < 1 || *k.Rank > K-1) {
		return c.Errorf("rank", "rank %d is outside 1..K−1 = 1..%d for %d series", *k.Rank, K-1, K)
	}
	if len(k.Normalize) > K-1 {
		return c.Errorf("normalize", "normalize names %d series; there can be at most K−1 = %d relations", len(k.Normalize), K-1)
	}
	seen := map[int]bool{}
	for _, n := range k.Normalize {
		i, err := seriesIndex(n, k.Series)
		if err != nil {
			return c.Errorf("normalize", "normalize: %v", err)
		}
		if seen[i] {
			return c.Errorf("normalize", "normalize: %q is named twice", n)
		}
		seen[i] = true
	}
	if k.Rank != nil && len(k.Normalize) > *k.Rank {
		return c.Errorf("normalize", "normalize names %d series for rank %d; name at most one per relation", len(k.Normalize), *k.Rank)
	}
	return nil
}

// readTests parses the restrict: equations into rows of R' (st.Rows) and
// the exogeneity_tests: entries into series indices (st.Exog), or returns
// an error, also for the retired exogenous: key and for two tests of one
// name.
func (k *SystemKeys) readTests(c *engine.Context, st *sysSettings) error {
	for _, h := range k.Restrict {
		var rows []sysRestr
		for _, e := range h.Equations {
			row, err := betaRestriction(e, st.Coefs, st.Case)
			if err != nil {
				return c.Errorf("restrict", "restrict: %s: %v", h.Name, err)
			}
			rows = append(rows, sysRestr{Text: e, Row: row})
		}
		st.Rows = append(st.Rows, rows)
	}
	if k.Exogenous != nil {
		return c.Errorf("exogenous", "exogenous: the weak-exogeneity tests are now written exogeneity_tests: (the same list); stationary regressors that condition the model go in extra:")
	}
	for _, ex := range k.ExogTests {
		var idx []int
		for _, n := range ex {
			i, err := seriesIndex(n, k.Series)
			if err != nil {
				return c.Errorf("exogeneity_tests", "exogeneity_tests: %v", err)
			}
			idx = append(idx, i)
		}
		if len(idx) == 0 {
			return c.Errorf("exogeneity_tests", "exogeneity_tests: an empty list")
		}
		if len(idx) >= len(k.Series) {
			return c.Errorf("exogeneity_tests", "exogeneity_tests: every series is named; a weak-exogeneity test leaves at least as many series adjusting as the rank, so name fewer")
		}
		st.Exog = append(st.Exog, idx)
	}
	names := map[string]bool{}
	for _, n := range k.testNames() {
		if names[n] {
			return c.Errorf("restrict", "two restriction tests are both called %q", n)
		}
		names[n] = true
	}
	return nil
}

// testNames are the names of the restriction tests, in table order: the
// restrict: entries, then one exog(...) per exogenous: entry.
func (k *SystemKeys) testNames() []string {
	var out []string
	for _, h := range k.Restrict {
		out = append(out, h.Name)
	}
	for _, ex := range k.ExogTests {
		var parts []string
		for _, n := range ex {
			parts = append(parts, normName(n))
		}
		out = append(out, "exog("+strings.Join(parts, ",")+")")
	}
	return out
}

// normName returns a series name without its spaces, for comparisons.
func normName(s string) string { return strings.Join(strings.Fields(s), "") }

// seriesIndex returns the position of name among series (spaces ignored),
// or an error that lists them.
func seriesIndex(name string, series []string) (int, error) {
	for i, s := range series {
		if normName(s) == normName(name) {
			return i, nil
		}
	}
	return 0, fmt.Errorf("%q is not one of the series%s (%s)", name, manuscript.DidYouMean(name, series), strings.Join(series, ", "))
}

// betaRestriction reads one homogeneous linear equation on the
// coefficients of β (the series, and const or trend in cases rc and rt),
// in galley's one restriction grammar (analysis/restrict).
func betaRestriction(eq string, coefs []string, cs johansen.Case) ([]float64, error) {
	lin, err := engine.ParseRestriction(eq, coefs, restrict.Options{Homogeneous: true})
	var re *restrict.Error
	if errors.As(err, &re) && errors.Is(err, restrict.ErrUnknownTerm) && (re.Term == "const" || re.Term == "trend") {
		return nil, fmt.Errorf("%w; β has a %s row only in the %s case (this is the %s case)", err, re.Term, map[string]string{"const": "restricted constant", "trend": "restricted trend"}[re.Term], engine.SystemCaseWords[cs])
	}
	if err != nil {
		return nil, err
	}
	if len(lin.R) != 1 {
		return nil, fmt.Errorf("%q: write one equation per entry (each entry is one row of the restriction)", eq)
	}
	return lin.R[0], nil
}
