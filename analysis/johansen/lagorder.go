package johansen

import (
	"errors"
	"fmt"
	"math"

	"github.com/galley-econ/galley/analysis/rules"
	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/householder"
)

// LagRow holds the information criteria of one VAR order in levels.
type LagRow struct {
	Lags         int     // lagged differences in the VECM (VAR order p = Lags+1)
	Params       int     // estimated mean coefficients n = K²p + K·d
	LogDet       float64 // ln|Σ̂|, Σ̂ = T⁻¹ Σ û_t û_t'
	AIC, BIC, HQ float64
}

// LagTable is the lag-order table and the choice of each criterion.
type LagTable struct {
	T    int // common sample: input rows − (maxLags+1)
	Rows []LagRow
	// Lagged differences chosen by each criterion (row with the minimum).
	AIC, BIC, HQ int
}

// LagOrder fits the VAR in levels y_t = Φd_t + Σ_{i=1}^{p} A_i y_{t−i} + u_t
// by least squares for p = 1..maxLags+1 (lags = p−1 lagged differences in
// the VECM) on the common sample that drops the first maxLags+1
// observations, with d_t empty in case N, a constant in cases RC and C, and
// a constant and trend in cases RT and CT (common practice: the VAR in
// levels carries the case's deterministic terms unrestricted). With
// n = K²p + K·d free mean coefficients, T the common sample and
// Σ̂ = T⁻¹ Σ û_t û_t' (Lütkepohl 2005, §4.3; rules.Criterion.PerObs):
//
//	AIC = ln|Σ̂| + 2n/T,  BIC = ln|Σ̂| + n ln T / T,  HQ = ln|Σ̂| + 2n ln ln T / T.
//
// As in Test, the regressions run on internally scaled series, so that the
// collinearity check and the choice do not depend on the units of y.
func LagOrder(y *mat.Dense, c Case, maxLags int) (*LagTable, error) {
	if y == nil {
		return nil, errors.New("johansen: no data")
	}
	if !c.valid() {
		return nil, fmt.Errorf("johansen: invalid deterministic case %d", int(c))
	}
	if maxLags < 0 {
		return nil, fmt.Errorf("johansen: maximum lag must be non-negative, got %d", maxLags)
	}
	if err := checkSeries(y); err != nil {
		return nil, err
	}
	// Fit on the scaled series yD⁻¹ (scale.go): Σ̂ = DΣ̃D, so every ln|Σ̂|
	// is ln|Σ̃| + shift with the same shift = 2Σ ln d_j for every order,
	// and the criteria shift alike. The choice is made on the scaled values
	// and the table reports the values in the units of y.
	scale := seriesScale(y)
	var shift float64
	for _, dj := range scale {
		shift += 2 * math.Log(dj)
	}
	y = scaleColumns(y, scale)
	rows, k := y.Dims()
	d := 0
	switch c {
	case RC, C:
		d = 1
	case RT, CT:
		d = 2
	}
	pmax := maxLags + 1
	t := rows - pmax
	if need := d + k*pmax + k; t <= need {
		return nil, fmt.Errorf("johansen: too few observations for the lag table: %d rows leave %d after %d lags; need more than %d",
			rows, max(t, 0), pmax, need)
	}
	tab := &LagTable{T: t}
	ft := float64(t)
	for p := 1; p <= pmax; p++ {
		nx := d + k*p
		x := mat.NewDense(t, nx+k, nil)
		for i := 0; i < t; i++ {
			s := i + pmax
			LevelsRow(x, i, s, d, p, y)
			for j := 0; j < k; j++ {
				x.Set(i, nx+j, y.At(s, j))
			}
		}
		var qr householder.QR
		if err := qr.Factor(householder.Columns(x, 0), nx+k); err != nil {
			return nil, fmt.Errorf("johansen: VAR(%d) in levels: %w", p, err)
		}
		if j := qr.Indep(); j < nx+k {
			return nil, fmt.Errorf("johansen: VAR(%d) in levels has collinear regressors (column %d); a constant, duplicated or collinear series?", p, j)
		}
		// |Σ̂| = Π R_jj² / T^K over the block of the dependent variables.
		ld := -float64(k) * math.Log(ft)
		for j := nx; j < nx+k; j++ {
			ld += 2 * math.Log(math.Abs(qr.RAt(j, j)))
		}
		n := k*k*p + k*d
		tab.Rows = append(tab.Rows, LagRow{
			Lags: p - 1, Params: n, LogDet: ld,
			AIC: rules.AIC.PerObs(ld, n, t),
			BIC: rules.BIC.PerObs(ld, n, t),
			HQ:  rules.HQ.PerObs(ld, n, t),
		})
	}
	best := func(f func(LagRow) float64) int {
		b := 0
		for i, r := range tab.Rows {
			if f(r) < f(tab.Rows[b]) {
				b = i
			}
		}
		return tab.Rows[b].Lags
	}
	tab.AIC = best(func(r LagRow) float64 { return r.AIC })
	tab.BIC = best(func(r LagRow) float64 { return r.BIC })
	tab.HQ = best(func(r LagRow) float64 { return r.HQ })
	for i := range tab.Rows {
		row := &tab.Rows[i]
		row.LogDet += shift
		row.AIC += shift
		row.BIC += shift
		row.HQ += shift
	}
	return tab, nil
}

// LevelsRow fills row i of the design of a VAR(p) in levels observed at
// time s: the d deterministic columns (d = 1: a constant; d = 2: a
// constant and the trend s) followed by y(s-1), …, y(s-p), each a row of
// y's k columns. It is the one layout shared by the lag table here and
// the VAR of package vardyn.
func LevelsRow(x *mat.Dense, i, s, d, p int, y mat.Matrix) {
	_, k := y.Dims()
	col := 0
	if d >= 1 {
		x.Set(i, col, 1)
		col++
	}
	if d == 2 {
		x.Set(i, col, float64(s))
		col++
	}
	for l := 1; l <= p; l++ {
		for j := 0; j < k; j++ {
			x.Set(i, col, y.At(s-l, j))
			col++
		}
	}
}
