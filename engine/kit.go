package engine

// Helpers the directive families share: reading common keys and writing
// the results-file form of dates, samples and residuals.

import (
	"errors"
	"fmt"
	"slices"
	"strings"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/restrict"
	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/manuscript"
)

// ParseDet reads a det: key (default c).
func ParseDet(c *Context, det string) (critical.Case, error) {
	if det == "" {
		return critical.Const, nil
	}
	d, err := critical.ParseCase(det)
	if err != nil {
		return d, c.Errorf("det", "%v", err)
	}
	return d, nil
}

// SampleValues is the results-file form of a sample.
func SampleValues(d *Data) map[string]any {
	return map[string]any{"from": d.Dates[0].String(), "to": d.Dates[len(d.Dates)-1].String(), "n": d.N()}
}

func DecimalsOr(c *Context, d *int) int {
	if d != nil {
		return *d
	}
	return c.Decimals()
}

// ParseRestriction reads a linear restriction in galley's one grammar
// (analysis/restrict) on the named coefficients; an unknown term is
// answered with the closest name.
func ParseRestriction(text string, names []string, opt restrict.Options) (*restrict.Linear, error) {
	lin, err := restrict.Parse(text, names, opt)
	var re *restrict.Error
	if errors.As(err, &re) && errors.Is(err, restrict.ErrUnknownTerm) {
		return nil, fmt.Errorf("%w%s", err, manuscript.DidYouMean(re.Term, names))
	}
	return lin, err
}

// modelStatKeys are the summary statistics a contract.Model carries when
// a result's values have them.
var modelStatKeys = []string{"nobs", "r2", "r2_adj", "sigma", "loglik", "dw", "alpha", "halflife", "leads", "lags", "bandwidth"}

// ModelOf is a result's contract.Model, built from what its own table and
// values already hold, so that the table, the results file and every
// reader of the model agree: the coefficients shown (terms and coefs),
// the summary statistics and residual diagnostics under their keys in
// vals, the standard errors described by vals["se_desc"] (else the
// covariance vals["cov"] names), and the sample vals["sample"]. normal
// says the t-ratios are judged against the standard normal; omitted says
// what the coefficients leave out.
func ModelOf(method, dep string, terms []string, coefs []ols.Coef, vals map[string]any, normal bool, omitted string) *contract.Model {
	m := &contract.Model{Method: method, Dependent: dep, Stats: map[string]float64{}, Normal: normal, Omitted: omitted}
	for i, t := range terms {
		m.Coefs = append(m.Coefs, contract.Coef{Term: t, Est: coefs[i].Est, SE: coefs[i].SE, T: coefs[i].T, P: coefs[i].P})
	}
	for _, k := range modelStatKeys {
		switch v := vals[k].(type) {
		case int:
			m.Stats[k] = float64(v)
		case float64:
			m.Stats[k] = v
		}
	}
	if ds, ok := vals["diagnostics"].(map[string]any); ok {
		m.Diagnostics = map[string]contract.Diagnostic{}
		for k, raw := range ds {
			d, _ := raw.(map[string]any)
			label, _ := d["test"].(string)
			stat, _ := d["stat"].(float64)
			p, _ := d["pvalue"].(float64)
			m.Diagnostics[k] = contract.Diagnostic{Label: label, Stat: stat, P: p}
		}
	}
	if _, ok := m.Stats["dw"]; !ok { // an ecm reports Durbin–Watson among its diagnostics
		if d, ok := m.Diagnostics["dw"]; ok {
			m.Stats["dw"] = d.Stat
		}
	}
	// A HAC covariance is one fact, its truncation lag L, which the
	// model's own note gives ("Bartlett kernel, 4 lags"): the model carries
	// it as hac_lags, and not also as the Bartlett bandwidth L + 1 that
	// some results store beside it (a model table would otherwise show 5
	// beside a table that says 4 lags). bandwidth remains the bandwidth of
	// a kernel estimator chosen as such (FMOLS).
	if s, ok := vals["cov"].(string); ok {
		if cv, err := ols.ParseCov(s); err == nil && cv.Kind == ols.HAC {
			m.Stats["hac_lags"] = float64(cv.Lags)
			delete(m.Stats, "bandwidth")
		}
	}
	m.SE, _ = vals["se_desc"].(string)
	if m.SE == "" {
		if s, ok := vals["cov"].(string); ok {
			if cv, err := ols.ParseCov(s); err == nil {
				m.SE = cv.Describe()
			}
		}
	}
	if s, ok := vals["sample"].(map[string]any); ok {
		m.Sample = fmt.Sprintf("%v–%v, N = %v", s["from"], s["to"], s["n"])
	}
	return m
}

// PeriodUnit names a frequency's periods in the plural, for durations
// such as half-lives: "months", "quarters", "years", else "periods".
func PeriodUnit(f series.Freq) string {
	switch f {
	case series.Monthly:
		return "months"
	case series.Quarterly:
		return "quarters"
	case series.Annual:
		return "years"
	}
	return "periods"
}

// SystemCaseWords are the five deterministic cases of a cointegrated VAR
// — and of the ARDL bounds test, whose cases I–V are the same five — in
// the trade's words, in the usual order (Johansen 1995, §5.7; Pesaran,
// Shin and Smith 2001): no deterministic terms, a constant restricted to
// the cointegrating relations, an unrestricted constant, a trend
// restricted to the relations (with an unrestricted constant), an
// unrestricted constant and trend.
var SystemCaseWords = [...]string{"none", "restricted constant", "constant", "restricted trend", "trend"}

// formerCaseCodes are the abbreviations det: took before, in the same
// order; a manuscript that still uses one is told the words.
var formerCaseCodes = [...]string{"n", "rc", "c", "rt", "ct"}

// SystemCase reads the det: key of a Johansen-type or ARDL directive in
// those words (hyphens or underscores may stand for the space; case is
// ignored); "" gives the case numbered def. It returns the case's place
// 0..4 in the usual order.
func SystemCase(c *Context, det string, def int) (int, error) {
	if det == "" {
		return def, nil
	}
	t := strings.ToLower(strings.Join(strings.FieldsFunc(det, func(r rune) bool { return r == ' ' || r == '-' || r == '_' }), " "))
	for i, w := range SystemCaseWords {
		if t == w {
			return i, nil
		}
	}
	for i, code := range formerCaseCodes {
		if t == code {
			return 0, c.Errorf("det", "det: %q is now written %q", det, SystemCaseWords[i])
		}
	}
	return 0, c.Errorf("det", "det: %q is not a case; write %s", det, strings.Join(SystemCaseWords[:], ", "))
}

// SeriesIndices resolves the list under key — names of a system's series,
// spaces ignored — to their indices in names; an empty list gives every
// index in order. An unknown or repeated name is an error at its item.
func (c *Context) SeriesIndices(key string, list, names []string) ([]int, error) {
	squeeze := func(x string) string { return strings.Join(strings.Fields(x), "") }
	if len(list) == 0 {
		out := make([]int, len(names))
		for i := range out {
			out[i] = i
		}
		return out, nil
	}
	var out []int
	for i, n := range list {
		j := slices.IndexFunc(names, func(x string) bool { return squeeze(x) == squeeze(n) })
		if j < 0 {
			return nil, c.ItemErrorf(key, i, "%s: %q is not one of the series of the system%s (%s)", key, n, manuscript.DidYouMean(n, names), strings.Join(names, ", "))
		}
		if slices.Contains(out, j) {
			return nil, c.ItemErrorf(key, i, "%s: %q is named twice", key, n)
		}
		out = append(out, j)
	}
	return out, nil
}
