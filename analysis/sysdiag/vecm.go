package sysdiag

import (
	"errors"
	"fmt"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
)

// VECMRegressors returns the T×(r + len(m.Terms)) regressors of the
// short-run equations of the VECM m given its β̂ — the auxiliary
// regressions of SerialLM for a VECM (Lütkepohl 2005, §8.4) take them as
// the original regressors:
//
//	x_t = (β̂'ỹ_{t−1}, d_t, Δy_{t−1}', …, Δy_{t−k}', w_t'),
//
// ỹ_{t−1} = (y_{t−1}', [1 in case RC, t in case RT], x^r_{t−1}')', d_t the
// unrestricted deterministic terms (1, and t in case CT), w_t the
// unrestricted extra regressors; in the column order of m.Terms, with row t
// the row of m.Resid (row t + k + 1 of the levels y). The trend counts the
// rows of y from 0, as in johansen.Test. y holds the levels (one row per
// date, as johansen.TestExtra saw them) and x the extra regressors.
func VECMRegressors(y *mat.Dense, c johansen.Case, m *johansen.VECM, x johansen.Extra) (*mat.Dense, error) {
	if y == nil || m == nil || m.Beta == nil || m.Resid == nil {
		return nil, errors.New("sysdiag: no estimated VECM")
	}
	rows, k := y.Dims()
	t, kr := m.Resid.Dims()
	p1, rank := m.Beta.Dims()
	lags := 0
	for _, tm := range m.Terms {
		if tm.Kind == johansen.LagDiff && tm.Lag > lags {
			lags = tm.Lag
		}
	}
	if kr != k || rows-lags-1 != t {
		return nil, fmt.Errorf("sysdiag: the VECM has %d residuals of %d equations, the levels %d rows of %d series with %d lagged differences", t, kr, rows, k, lags)
	}
	m0 := 0
	if c == johansen.RC || c == johansen.RT {
		m0 = 1
	}
	nr := 0
	if x.Restricted != nil {
		_, nr = x.Restricted.Dims()
	}
	if p1 != k+m0+nr {
		return nil, fmt.Errorf("sysdiag: β has %d rows; %d series, %d restricted terms and %d restricted regressors make %d", p1, k, m0, nr, k+m0+nr)
	}
	for _, e := range []struct {
		name string
		x    *mat.Dense
	}{{"restricted", x.Restricted}, {"unrestricted", x.Unrestricted}} {
		if e.x == nil {
			continue
		}
		if r, _ := e.x.Dims(); r != rows {
			return nil, fmt.Errorf("sysdiag: the %s extra regressors have %d rows, the levels %d", e.name, r, rows)
		}
	}
	nu := 0
	if x.Unrestricted != nil {
		_, nu = x.Unrestricted.Dims()
	}
	for _, tm := range m.Terms {
		if tm.Kind == johansen.ExtraTerm && tm.Series >= nu {
			return nil, fmt.Errorf("sysdiag: the VECM has an unrestricted extra regressor %d, but %d are given", tm.Series+1, nu)
		}
	}
	out := mat.NewDense(t, rank+len(m.Terms), nil)
	for i := 0; i < t; i++ {
		s := i + lags + 1 // row of y for Δy_t
		for j := 0; j < rank; j++ {
			var v float64
			for a := 0; a < k; a++ {
				v += m.Beta.At(a, j) * y.At(s-1, a)
			}
			switch c {
			case johansen.RC:
				v += m.Beta.At(k, j)
			case johansen.RT:
				v += m.Beta.At(k, j) * float64(s)
			}
			for h := 0; h < nr; h++ {
				v += m.Beta.At(k+m0+h, j) * x.Restricted.At(s-1, h)
			}
			out.Set(i, j, v)
		}
		for c2, tm := range m.Terms {
			var v float64
			switch tm.Kind {
			case johansen.Constant:
				v = 1
			case johansen.Trend:
				v = float64(s)
			case johansen.LagDiff:
				v = y.At(s-tm.Lag, tm.Series) - y.At(s-tm.Lag-1, tm.Series)
			case johansen.ExtraTerm:
				v = x.Unrestricted.At(s, tm.Series)
			}
			out.Set(i, rank+c2, v)
		}
	}
	return out, nil
}
