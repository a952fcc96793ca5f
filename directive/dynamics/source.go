// Package dynamics is the directive family of system dynamics: impulse
// responses (a figure), forecast-error variance decompositions and Granger
// causality (tables), of a VECM estimated by a johansen or vecm directive
// (read through contract.SystemSource) or of a VAR the directive fits
// itself. The statistics come from analysis/vardyn.
//
//	responses        impulse responses, response × shock panels, bootstrap or asymptotic bands
//	variance-shares  the forecast-error variance decomposition, horizons × shocks
//	causality        Granger causality for every ordered pair of series
package dynamics

import (
	"fmt"
	"slices"
	"strings"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/vardyn"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
)

// SourceKeys say which system the dynamics are of: from: the id of a
// johansen or vecm directive (the VECM at its rank), or a VAR of the
// directive's own (series, lags, det, differences, sample, data).
type SourceKeys struct {
	From        string   `yaml:"from"`
	Data        string   `yaml:"data"`
	Series      []string `yaml:"series"`
	Lags        *int     `yaml:"lags"`
	Det         string   `yaml:"det"`
	Differences bool     `yaml:"differences"`
	Sample      string   `yaml:"sample"`
}

var upstreamKinds = []string{"johansen", "vecm"}

// model is a fitted system in the form the kinds need.
type model struct {
	names  []string
	a      []*mat.Dense
	sigma  mat.Symmetric
	levels *mat.Dense // the data the model was fitted on (levels, or differences for a VAR in differences)
	resid  *mat.Dense
	refit  vardyn.Refit
	vecm   *johansen.VECM
	sys    *contract.System
	varm   *vardyn.VAR
	det    vardyn.Det
	desc   string // for notes
}

func (k *SourceKeys) check(c *engine.Context) error {
	if k.From != "" {
		for _, key := range []string{"data", "series", "lags", "det", "differences", "sample"} {
			if c.Has(key) {
				return c.Errorf(key, "with from: the system is that of %q; %s cannot be set here as well", k.From, key)
			}
		}
		return c.CheckRef("from", k.From, upstreamKinds...)
	}
	if len(k.Series) == 0 {
		return c.Errorf("", "galley %s: give from: (the id of a johansen or vecm result) or a VAR's keys (series, lags, det)", c.Kind())
	}
	if len(k.Series) < 2 {
		return c.Errorf("series", "a system needs at least two series; series lists %d", len(k.Series))
	}
	if k.Lags == nil {
		return c.Errorf("", "galley %s: the key \"lags\" is required for a VAR (the number of lags, at least 1)", c.Kind())
	}
	if *k.Lags < 1 {
		return c.Errorf("lags", "lags must be at least 1, not %d", *k.Lags)
	}
	if _, err := k.det(c); err != nil {
		return err
	}
	return c.CheckData(c.DataAlias(k.Data), k.Series, k.Sample)
}

func (k *SourceKeys) det(c *engine.Context) (vardyn.Det, error) {
	switch strings.ToLower(strings.TrimSpace(k.Det)) {
	case "", "c":
		return vardyn.Const, nil
	case "n":
		return vardyn.NoDet, nil
	case "ct":
		return vardyn.ConstTrend, nil
	}
	return 0, c.Errorf("det", "det: %q: a VAR takes n (none), c (a constant, the default) or ct (a constant and trend)", k.Det)
}

// names returns the series of the system without running anything.
func (k *SourceKeys) fit(c *engine.Context) (*model, error) {
	if k.From != "" {
		up, err := c.Live("from", k.From, upstreamKinds...)
		if err != nil {
			return nil, err
		}
		src, ok := up.(contract.SystemSource)
		if !ok {
			return nil, c.Errorf("from", "%q does not estimate a VECM", k.From)
		}
		sys, err := src.EstimatedSystem()
		if err != nil {
			return nil, c.Errorf("from", "%s: %v", k.From, err)
		}
		m := &model{names: sys.Names, a: sys.VECM.VARForm(), sigma: sys.VECM.Omega, levels: sys.Levels, resid: sys.VECM.Resid,
			refit: vardyn.VECMRefit(sys.Case, sys.Lags, sys.Rank, sys.Norm, sys.Extra), vecm: sys.VECM, sys: sys}
		m.desc = fmt.Sprintf("the VECM of %q (rank %d, case %s, %d lagged differences; T = %d, %s–%s) in its VAR form", k.From, sys.Rank, sys.Case, sys.Lags, sys.NObs, sys.From, sys.To)
		return m, nil
	}
	det, err := k.det(c)
	if err != nil {
		return nil, err
	}
	d, err := c.Data(c.DataAlias(k.Data), k.Series, k.Sample)
	if err != nil {
		return nil, err
	}
	n, kk := d.N(), len(k.Series)
	y := mat.NewDense(n, kk, nil)
	for j, col := range d.Cols {
		y.SetCol(j, col)
	}
	what := "levels"
	first := 0
	if k.Differences {
		if n < 2 {
			return nil, c.Errorf("series", "too few observations to difference")
		}
		dy := mat.NewDense(n-1, kk, nil)
		for i := 1; i < n; i++ {
			for j := 0; j < kk; j++ {
				dy.Set(i-1, j, y.At(i, j)-y.At(i-1, j))
			}
		}
		y, what, first = dy, "first differences", 1
	}
	v, err := vardyn.Fit(y, *k.Lags, det)
	if err != nil {
		return nil, c.Errorf("lags", "%d observations in the sample %s: %v", n, d.Range(), strings.TrimPrefix(err.Error(), "vardyn: "))
	}
	m := &model{names: slices.Clone(k.Series), a: v.A, sigma: v.Sigma, levels: y, resid: v.Resid, refit: vardyn.VARRefit(*k.Lags, det), varm: v, det: det}
	detText := map[vardyn.Det]string{vardyn.NoDet: "no deterministic terms", vardyn.Const: "a constant", vardyn.ConstTrend: "a constant and trend"}[det]
	m.desc = fmt.Sprintf("a VAR(%d) in the %s of the series with %s, fitted by least squares (T = %d, %s–%s)", *k.Lags, what, detText, v.T, d.Dates[first+*k.Lags], d.Dates[n-1])
	return m, nil
}

func norm(s string) string { return strings.Join(strings.Fields(s), "") }

func init() {
	engine.Register(engine.Kind{Name: "responses", Summary: "impulse responses of a VECM or VAR (orthogonalised or generalised) with bootstrap or asymptotic bands, as a figure",
		New: func() engine.Directive { return &responsesSpec{} }, Fields: []string{"irf", "lower", "upper", "stderr", "horizon", "identify", "order", "reps", "failed", "seed", "coverage", "interval", "series", "model", "width", "height", "files"}})
	engine.Register(engine.Kind{Name: "variance-shares", Summary: "forecast-error variance decomposition of a VECM or VAR (horizons × shocks)",
		New: func() engine.Directive { return &sharesSpec{} }, Fields: []string{"shares", "horizons", "order", "series", "model"}})
	engine.Register(engine.Kind{Name: "causality", Summary: "Granger causality between every ordered pair of a system's series (VAR Wald, Toda–Yamamoto, or VECM short-run, long-run and strong)",
		New: func() engine.Directive { return &causalitySpec{} }, Fields: []string{"pairs", "test", "dmax", "series", "model"}})
}
