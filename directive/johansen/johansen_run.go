package johansen

import (
	"fmt"
	"math/cmplx"
	"regexp"
	"slices"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/rules"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
)

// Running a system: the reduced-rank regression, the rank choice, the
// estimates and tests, and their results-file values.

// sysState is one run of the analysis, shared with vecm directives.
type sysState struct {
	st         sysSettings
	d          *engine.Data
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
	sim        *sysSim   // crit: simulate (simcrit.go)
	ex         *sysExtra // dummies and extra regressors (dummies.go)
	xr         *mat.Dense
	y          *mat.Dense         // the levels of the series (T×K)
	boot       *johansen.RankBoot // rank_bootstrap: (rankboot.go)
	bart       *johansen.Bartlett // rank_bootstrap: {bartlett: true} (bartlett.go)
	bootSeed   uint64
	rel        []contract.Dated // the relations, once computed (relations)
}

type sysTest struct {
	Name, Hyp string
	LR        *johansen.LR
}

// levelsMatrix copies aligned series into a T×K matrix.
func levelsMatrix(d *engine.Data) *mat.Dense {
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
	m := rules.Schwert12.Lag(n)
	d := map[johansen.Case]int{johansen.N: 0, johansen.RC: 1, johansen.C: 1, johansen.RT: 2, johansen.CT: 2}[cs]
	for m >= 0 && n-(m+1) <= d+k*(m+1)+k {
		m--
	}
	return m
}

// checkCritical reports a case or a system size that the critical-value
// source does not cover, at the key responsible.
func checkCritical(c *engine.Context, cs johansen.Case, k int) error {
	if _, err := johansen.CriticalValues(cs, johansen.TraceStat, 1); err != nil {
		return c.Errorf("det", "%v", strings.TrimPrefix(err.Error(), "johansen: "))
	}
	if _, err := johansen.CriticalValues(cs, johansen.TraceStat, k); err != nil {
		return c.Errorf("series", "%d series: %v", k, strings.TrimPrefix(err.Error(), "johansen: "))
	}
	return nil
}

// run validates the keys, reads the data and returns the system: the rank
// tests, the rank, and at a rank of 1 … K−1 the estimates and the
// restriction and weak-exogeneity tests.
func (k *SystemKeys) run(c *engine.Context) (*sysState, error) {
	st, err := k.settings(c)
	if err != nil {
		return nil, err
	}
	K := len(st.Names)
	sim, err := k.SimKeys.Settings(c) // crit: simulate (simcrit.go)
	if err != nil {
		return nil, err
	}
	if err := checkCritical(c, st.Case, K); sim == nil && err != nil {
		return nil, err
	}
	d, err := c.Data(c.DataAlias(k.Data), append(slices.Clone(k.Series), k.Extra...), k.Sample)
	if err != nil {
		return nil, err
	}
	s := &sysState{st: st, d: d}
	y := levelsMatrix(d)
	if len(k.Extra) > 0 {
		y = mat.DenseCopyOf(y.Slice(0, d.N(), 0, K))
	}
	s.y = y
	lags, err := k.chooseLags(c, s)
	if err != nil {
		return nil, err
	}
	if s.ex, err = k.buildExtra(c, d, st.Case, lags); err != nil {
		return nil, err
	}
	s.xr = s.ex.x.Restricted
	if s.res, err = johansen.TestExtra(y, st.Case, lags, s.ex.x); err != nil {
		key := "series"
		switch {
		case strings.Contains(err.Error(), "too few observations"):
			key = "lags"
		case strings.Contains(err.Error(), "extra regressor"):
			key = ""
		}
		return nil, c.Errorf(key, "%d observations in the sample %s: %v", d.N(), d.Range(), nameExtra(nameSeries(err, st.Names), s.ex))
	}
	r := s.res
	s.trace, s.max = r.Statistics(k.SmallSample)
	if err := k.chooseRank(c, s, sim); err != nil {
		return nil, err
	}
	if err := k.rankBoot(c, s); err != nil { // rankboot.go
		return nil, err
	}
	s.rank = s.chosen
	if k.Rank != nil {
		s.rank = *k.Rank
	}
	if s.rank < 1 || s.rank > K-1 {
		if len(k.Normalize) > 0 || len(k.Restrict) > 0 || len(k.ExogTests) > 0 {
			return nil, c.Errorf("", "the sequential trace tests at %s choose rank %d, so there are no relations to normalise or test; set rank: (1..%d) to estimate them anyway", contract.Pct(st.Level), s.chosen, K-1)
		}
		s.rank = 0
		return s, nil
	}
	if err := k.normalisation(c, s); err != nil {
		return nil, err
	}
	if s.vecm, err = r.Estimate(s.rank, s.norm); err != nil {
		return nil, c.Errorf("normalize", "%v", nameSeries(err, st.Names))
	}
	if err := k.runTests(c, s); err != nil {
		return nil, err
	}
	return s, nil
}

// chooseLags returns the number of lagged differences: lags: as given, or
// the order its criterion chooses over 0 … max (the table kept in s.lags,
// the maximum in s.lagMax).
func (k *SystemKeys) chooseLags(c *engine.Context, s *sysState) (int, error) {
	st, d, K := s.st, s.d, len(s.st.Names)
	lags := k.Lags.Fixed
	if k.Lags.Select == "" {
		return lags, nil
	}
	s.lagMax = defaultMaxLags(d.N(), K, st.Case)
	if k.Lags.Max != nil {
		s.lagMax = *k.Lags.Max
	}
	if s.lagMax < 0 {
		return 0, c.Errorf("lags", "too few observations: %d in the sample %s cannot fit a VAR in levels for %d series", d.N(), d.Range(), K)
	}
	var err error
	if s.lags, err = johansen.LagOrder(s.y, st.Case, s.lagMax); err != nil {
		return 0, c.Errorf("lags", "%d observations in the sample %s: %v", d.N(), d.Range(), nameSeries(err, st.Names))
	}
	return map[string]int{"aic": s.lags.AIC, "bic": s.lags.BIC, "hq": s.lags.HQ}[k.Lags.Select], nil
}

// chooseRank sets the critical values and the sequential choice of rank:
// simulated with crit: simulate, else from the tables at level:.
func (k *SystemKeys) chooseRank(c *engine.Context, s *sysState, sim *engine.SimSettings) error {
	var err error
	if sim != nil { // crit: simulate (simcrit.go): simulated tables and the rank they choose
		s.sim, err = simJohansen(c, sim, s)
		return err
	}
	r := s.res
	if s.crT, err = r.Critical(johansen.TraceStat); err == nil {
		s.crM, err = r.Critical(johansen.MaxEigStat)
	}
	if err != nil {
		return c.Errorf("det", "%v", strings.TrimPrefix(err.Error(), "johansen: "))
	}
	if s.chosen, err = r.Rank(s.st.Level, k.SmallSample); err != nil {
		return c.Errorf("level", "%v", strings.TrimPrefix(err.Error(), "johansen: "))
	}
	return nil
}

// normalisation sets s.norm, the series each relation is normalised on:
// those normalize: names, then the first others, one per relation; an
// error when it names more than the rank.
func (k *SystemKeys) normalisation(c *engine.Context, s *sysState) error {
	st := s.st
	if len(k.Normalize) > s.rank {
		return c.Errorf("normalize", "normalize names %d series, but the rank is %d (chosen at %s); name at most one series per relation", len(k.Normalize), s.rank, contract.Pct(st.Level))
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
	return nil
}

// runTests runs the likelihood-ratio tests of the restrictions on β and of
// weak exogeneity at the system's rank, appending them to s.tests.
func (k *SystemKeys) runTests(c *engine.Context, s *sysState) error {
	st, r := s.st, s.res
	names := k.testNames()
	for h, rows := range st.Rows {
		H, err := restrictionBasis(rows, r.P1())
		if err != nil {
			return c.Errorf("restrict", "restrict: %s: %v", names[h], err)
		}
		lr, err := r.TestBeta(s.rank, H)
		if err != nil {
			return c.Errorf("restrict", "restrict: %s at rank %d: %v", names[h], s.rank, nameSeries(err, st.Names))
		}
		var texts []string
		for _, e := range rows {
			texts = append(texts, e.Text)
		}
		s.tests = append(s.tests, sysTest{Name: names[h], Hyp: strings.Join(texts, "; ") + " in every relation", LR: lr})
	}
	for i, ex := range st.Exog {
		if len(st.Names)-len(ex) < s.rank {
			// Zero loadings in len(ex) equations leave K − len(ex) rows of
			// α, fewer than the rank: the restricted model does not exist.
			return c.ItemErrorf("exogeneity_tests", i, "exogeneity_tests at rank %d: zero loadings for %d of the %d series leave %d adjusting, fewer than the rank; test fewer series at once", s.rank, len(ex), len(st.Names), len(st.Names)-len(ex))
		}
		lr, err := r.WeakExogeneity(s.rank, ex...)
		if err != nil {
			return c.Errorf("exogeneity_tests", "exogeneity_tests at rank %d: %v", s.rank, nameSeries(err, st.Names))
		}
		var who []string
		for _, j := range ex {
			who = append(who, st.Names[j])
		}
		s.tests = append(s.tests, sysTest{Name: names[len(st.Rows)+i], Hyp: strings.Join(who, ", ") + " weakly exogenous (zero loadings)", LR: lr})
	}
	return nil
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

var sysCaseText = map[johansen.Case]string{
	johansen.N:  "no deterministic terms",
	johansen.RC: "a constant inside the cointegrating relations",
	johansen.C:  "an unrestricted constant",
	johansen.RT: "an unrestricted constant and a trend inside the cointegrating relations",
	johansen.CT: "an unrestricted constant and trend",
}

// critSource names the origin of the critical values by case.
func critSource(cs johansen.Case) string { return johansen.CriticalSource(cs) }

// levelMap returns the critical values at johansen.Levels keyed by level.
func levelMap(cv [3]float64) map[string]any {
	m := map[string]any{}
	for i, l := range johansen.Levels {
		m[contract.Pct(l)] = cv[i]
	}
	return m
}

// values returns the system's results-file values.
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
		"nobs": r.T, "lags": r.Lags, "det": engine.SystemCaseWords[r.Case], "series": slices.Clone(s.st.Names),
		"sample": map[string]any{"from": s.d.Dates[r.Lags+1].String(), "to": s.d.Dates[s.d.N()-1].String(), "n": r.T},
	}
	if s.ex != nil && (len(s.ex.keys) > 0 || len(s.ex.restricted) > 0) {
		v["dummies"] = s.dummyValues()
	}
	if s.lags != nil {
		v["lag_choice"] = map[string]any{"aic": s.lags.AIC, "bic": s.lags.BIC, "hq": s.lags.HQ, "max": s.lagMax, "nobs": s.lags.T}
	}
	if s.sim != nil { // crit: simulate (simcrit.go)
		s.sim.values(v)
	}
	if s.boot != nil {
		v["rank_bootstrap"] = s.bootValues()
	}
	if s.bart != nil {
		v["bartlett"] = s.bartlettValues()
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
	if roots, err := johansen.CompanionRoots(m.VARForm()); err == nil {
		rs := make([]map[string]any, len(roots))
		for i, z := range roots {
			rs[i] = map[string]any{"re": real(z), "im": imag(z), "modulus": cmplx.Abs(z)}
		}
		v["roots"], v["unit_roots"] = rs, r.K-s.rank
	}
	v["relations"] = contract.ResultsForms(s.relations())
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
// their levels in each case). They are computed once and share the
// sample's dates themselves (nothing writes to a data set's dates or a
// result's series; contract.ViewDated).
func (s *sysState) relations() []contract.Dated {
	if s.rel != nil {
		return s.rel
	}
	zs := s.vecm.Relations(s.res.Case, s.y, s.xr)
	s.rel = make([]contract.Dated, len(zs))
	for j, z := range zs {
		s.rel[j] = contract.ViewDated(s.d.Dates, z)
	}
	return s.rel
}

// dummyValues lists the extra regressors of the model (only set when
// there are any): the unrestricted ones by their short-run keys, the
// restricted ones by their β rows.
func (s *sysState) dummyValues() map[string]any {
	v := map[string]any{}
	if len(s.ex.keys) > 0 {
		v["unrestricted"] = slices.Clone(s.ex.keys)
	}
	if len(s.ex.restricted) > 0 {
		v["restricted"] = slices.Clone(s.ex.restricted)
	}
	return v
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
