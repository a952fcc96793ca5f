package figure

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"slices"
	"strings"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/figures"
)

// plot: roots and plot: recursive-rank — the stability of a cointegrated
// system named by of: (a johansen or vecm result). roots reads the
// companion roots from the result's values (contract.ReadRoots);
// recursive-rank re-estimates the system on expanding samples from the
// estimated system itself (contract.SystemSource, asked for with
// engine.Context.Live) through analysis/johansen.Recursive.

var systemKinds = []string{"johansen", "vecm"}

// systemPlotKeys are the keys each system plot accepts besides id,
// caption, note and missing.
var systemPlotKeys = map[string][]string{
	"roots":          {"plot", "of", "names", "xlabel", "ylabel", "legend", "width", "height"},
	"recursive-rank": {"plot", "of", "form", "first", "eigenvalues", "ylabels", "xlabel", "legend", "width", "height", "shade"},
}

// systemOnlyKeys are the keys that only the system plots take.
var systemOnlyKeys = []string{"form", "first", "eigenvalues"}

func isSystemPlot(p string) bool { return systemPlotKeys[p] != nil }

// checkSystem returns an error for a key plot p does not take, an of:
// that names no johansen or vecm result, or a bad form, first or
// eigenvalues.
func (s *figureSpec) checkSystem(c *engine.Context, p string) error {
	for _, k := range []string{"data", "series", "panels", "residuals", "relation", "y", "x", "const", "coef", "sample", "shade",
		"names", "ylabel", "ylabels", "xlabel", "legend", "width", "height", "lags", "alpha", "form", "first", "eigenvalues"} {
		if c.Has(k) && !slices.Contains(systemPlotKeys[p], k) {
			return c.Errorf(k, "plot %s draws the system named by of and does not take %s; its keys: %s", p, k, strings.Join(systemPlotKeys[p][1:], ", "))
		}
	}
	if s.Of == "" {
		return c.Errorf("", "plot %s needs of: the id of a johansen or vecm result", p)
	}
	if err := c.CheckRef("of", s.Of, systemKinds...); err != nil {
		return err
	}
	if p == "roots" && len(s.Names) > 2 {
		return c.Errorf("names", "plot roots names two kinds of root (the unit roots, the others); %d names given", len(s.Names))
	}
	if _, err := s.form(c); err != nil {
		return err
	}
	if s.First != "" {
		if _, err := series.ParseDate(s.First); err != nil {
			return c.Errorf("first", "first %q: %v", s.First, err)
		}
	}
	if e := s.Eigenvalues; e != "" && e != "rank" && e != "all" {
		return c.Errorf("eigenvalues", "eigenvalues: write rank (the first r, the default) or all (all K), not %q", e)
	}
	return nil
}

// form is the recursive form asked for: x (the default) or r.
func (s *figureSpec) form(c *engine.Context) (johansen.Form, error) {
	switch strings.ToLower(strings.TrimSpace(s.Form)) {
	case "", "x":
		return johansen.XForm, nil
	case "r":
		return johansen.RForm, nil
	}
	return 0, c.Errorf("form", "form: write x (every parameter re-estimated on each sample, the default) or r (short-run dynamics fixed at their full-sample estimates), not %q", s.Form)
}

// runRoots draws the companion roots of the system named by of: in the
// complex plane; their values (with moduli) and the number of unit roots
// go into vals.
func (s *figureSpec) runRoots(c *engine.Context, o *figures.Options, vals map[string]any) (*engine.Result, error) {
	if err := s.checkSystem(c, "roots"); err != nil {
		return nil, err
	}
	r, err := c.Result("of", s.Of, systemKinds...)
	if err != nil {
		return nil, err
	}
	roots, unit, err := contract.ReadRoots(r.Values)
	if err != nil {
		return nil, c.Errorf("of", "%q (a %s result, line %d, rank %v): %v", s.Of, r.Kind, r.Line, r.Values["rank"], err)
	}
	fig, err := figures.CompanionRoots(roots, unit, s.Names, *o)
	if err != nil {
		return nil, c.Errorf("", "%v", err)
	}
	list := make([]map[string]any, len(roots))
	largest := 0.0
	for i, z := range roots {
		list[i] = map[string]any{"re": real(z), "im": imag(z), "modulus": cmplx.Abs(z)}
		if i >= unit {
			largest = math.Max(largest, cmplx.Abs(z))
		}
	}
	vals["of"] = s.Of
	vals["roots"] = list
	vals["unit_roots"] = unit
	vals["largest_other"] = largest
	return s.finish(c, fig, vals)
}

// runRecursiveRank re-estimates the system named by of: on expanding
// samples (analysis/johansen.Recursive) and draws the eigenvalues and the
// trace statistics over their 5% critical values against the last date of
// each sample.
func (s *figureSpec) runRecursiveRank(c *engine.Context, o *figures.Options, vals map[string]any) (*engine.Result, error) {
	if err := s.checkSystem(c, "recursive-rank"); err != nil {
		return nil, err
	}
	form, _ := s.form(c)
	up, err := c.Live("of", s.Of, systemKinds...)
	if err != nil {
		return nil, err
	}
	src, ok := up.(contract.SystemSource)
	if !ok {
		return nil, c.Errorf("of", "%q does not estimate a cointegrated system", s.Of)
	}
	sys, err := src.EstimatedSystem()
	if err != nil {
		return nil, c.Errorf("of", "%s: %v", s.Of, err)
	}
	rows, k := sys.Levels.Dims()
	if len(sys.Dates) != rows {
		return nil, errors.New("internal error: the system's dates do not match its data")
	}
	first, err := s.firstWindow(c, sys)
	if err != nil {
		return nil, err
	}
	rec, err := johansen.Recursive(sys.Levels, sys.Case, sys.Lags, sys.Extra, first, form, 0)
	if err != nil {
		var se *johansen.SubsampleError
		if errors.As(err, &se) {
			return nil, c.Errorf(c.FirstSet("first", "of"), "the sample %s–%s cannot be analysed: %s; set first: to a later date",
				sys.Dates[sys.Lags+1], sys.Dates[se.End+sys.Lags], strings.TrimPrefix(se.Err.Error(), "johansen: "))
		}
		return nil, c.Errorf(c.FirstSet("first", "of"), "%v", strings.TrimPrefix(err.Error(), "johansen: "))
	}
	ratio, crit, err := rec.ScaledTrace(0.05)
	if err != nil {
		return nil, c.Errorf("of", "%v", strings.TrimPrefix(err.Error(), "johansen: "))
	}
	dates := make([]series.Date, len(rec.End))
	for i, n := range rec.End {
		dates[i] = sys.Dates[n+sys.Lags]
	}
	texts := dateTexts(dates)
	nEig := sys.Rank
	if s.Eigenvalues == "all" {
		nEig = k
	}
	column := func(m [][]float64, j int) []float64 {
		out := make([]float64, len(m))
		for i := range m {
			out[i] = m[i][j]
		}
		return out
	}
	var eigPaths, ratioPaths []figures.Path
	eigList := make([]map[string]any, nEig)
	for j := 0; j < nEig; j++ {
		v := column(rec.Eigenvalues, j)
		eigList[j] = map[string]any{"number": j + 1, "values": v, "min": slices.Min(v), "max": slices.Max(v)}
		if j < figures.MaxSeries {
			eigPaths = append(eigPaths, figures.Path{Name: fmt.Sprintf("eigenvalue %d", j+1), Values: v})
		}
	}
	traceList := make([]map[string]any, k)
	for r := 0; r < k; r++ {
		ratioR := column(ratio, r)
		if r < figures.MaxSeries {
			ratioPaths = append(ratioPaths, figures.Path{Name: fmt.Sprintf("r = %d", r), Values: ratioR})
		}
		// the first end date from which every later sample rejects H(r)
		// (or, when the full sample does not, from which none does)
		i := len(dates)
		last := ratioR[i-1] > 1
		for i > 0 && (ratioR[i-1] > 1) == last {
			i--
		}
		var rejects, accepts any = texts[i], nil
		if !last {
			rejects, accepts = nil, texts[i]
		}
		traceList[r] = map[string]any{"rank": r, "values": column(rec.Trace, r), "ratio": ratioR, "crit": crit[r],
			"rejects_from": rejects, "accepts_from": accepts}
	}
	if k > figures.MaxSeries || nEig > figures.MaxSeries {
		s.notes = append(s.notes, fmt.Sprintf("Only the first %d paths of a panel are drawn; the values hold all of them.", figures.MaxSeries))
	}
	ser := []series.Series{{Name: "recursion", Dates: dates, Values: ratioPaths[0].Values}}
	if err := s.shade(c, ser, o); err != nil {
		return nil, err
	}
	if o.XLabel == "" {
		o.XLabel = "last date of the sample"
	}
	fig, err := figures.RecursiveRank(dates, eigPaths, ratioPaths, *o)
	if err != nil {
		return nil, c.Errorf("", "%v", err)
	}
	how := "every parameter re-estimated on each sample (X-form)"
	if form == johansen.RForm {
		how = "the short-run dynamics and unrestricted deterministic terms concentrated out once on the full sample, only the long-run problem re-solved on each sample (R-form)"
	}
	s.notes = append(s.notes, fmt.Sprintf("Recursive estimates as in Hansen and Johansen (1999): samples from %s ending %s to %s, %s; the trace statistic for each rank r is divided by its 5%% asymptotic critical value, so that it rejects above 1.",
		sys.Dates[sys.Lags+1], texts[0], texts[len(texts)-1], how))
	vals["of"] = s.Of
	vals["sample"] = map[string]any{"from": texts[0], "to": texts[len(texts)-1], "n": len(texts)}
	vals["recursion"] = map[string]any{
		"form": strings.ToLower(form.String()), "start": sys.Dates[sys.Lags+1].String(), "first": texts[0],
		"dates": texts, "nobs": slices.Clone(rec.End), "eigenvalues": eigList, "trace": traceList,
	}
	res, err := s.finish(c, fig, vals)
	if err != nil {
		return nil, err
	}
	res.Cites = append(res.Cites, "hansen-johansen-1999")
	return res, nil
}

// firstWindow is the number of observations of the first sample: up to
// first: (a date in the estimation sample), or by default a third of the
// sample, and at least one more than the model's regressors in the
// short-run equations and the reduced-rank problem together.
func (s *figureSpec) firstWindow(c *engine.Context, sys *contract.System) (int, error) {
	rows, k := sys.Levels.Dims()
	t := rows - sys.Lags - 1
	nu, nr := 0, 0
	if sys.Extra.Unrestricted != nil {
		_, nu = sys.Extra.Unrestricted.Dims()
	}
	if sys.Extra.Restricted != nil {
		_, nr = sys.Extra.Restricted.Dims()
	}
	restricted := 0
	if sys.Case == johansen.RC || sys.Case == johansen.RT {
		restricted = 1
	}
	unrestricted := map[johansen.Case]int{johansen.C: 1, johansen.RT: 1, johansen.CT: 2}[sys.Case]
	need := unrestricted + k*sys.Lags + nu + k + restricted + nr + k + 1
	if s.First == "" {
		n := max((t+2)/3, need)
		if n > t {
			return 0, c.Errorf("of", "the %d observations of %q leave no room for a recursion (a sample needs at least %d)", t, s.Of, need)
		}
		return n, nil
	}
	d, _ := series.ParseDate(s.First)
	i := slices.IndexFunc(sys.Dates, func(x series.Date) bool { return x == d })
	if i < 0 {
		return 0, c.Errorf("first", "first %s is not a date of the sample of %q (%s–%s)", s.First, s.Of, sys.Dates[sys.Lags+1], sys.Dates[rows-1])
	}
	n := i - sys.Lags
	if n < need {
		at := sys.Dates[min(need+sys.Lags, rows-1)]
		return 0, c.Errorf("first", "first %s leaves %d observations in the first sample (%s–%s); the model needs at least %d, so first must be %s or later",
			s.First, max(n, 0), sys.Dates[sys.Lags+1], s.First, need, at)
	}
	return n, nil
}
