package ardl

import (
	"math"
	"slices"

	"github.com/galley-econ/galley/analysis/ardl"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/table"
)

// body returns the table's rows: with show: ecm the restricted
// error-correction model, otherwise the long run, the adjustment, the
// bounds test and the symmetry tests; then N and the R².
func (s *ardlSpec) body(c *engine.Context, st *settings, m *ardl.Model, b *boundsResult, syms []symRow, unit string) []table.Row {
	dec := st.dec
	adj := m.Adjust
	var body []table.Row
	section := func(title string) {
		body = append(body, table.Row{Cells: []table.Cell{table.T(title), table.Empty}, RuleAbove: len(body) > 0})
	}
	hlRows := func() []table.Row {
		if adj.HasHalfLife {
			return []table.Row{{Cells: []table.Cell{table.T("    half-life, " + unit), table.N(adj.HalfLife, dec)}}, {Cells: []table.Cell{table.Empty, table.SECell(adj.HalfLifeSE, dec)}}}
		}
		return []table.Row{{Cells: []table.Cell{table.T("    half-life"), table.T("none: no error correction")}}}
	}
	if st.show == "ecm" {
		rows := engine.CoefRows(c, m.ECMNames, m.ECMCoef, dec, false)
		ia := slices.Index(m.ECMNames, ardl.ECTName)
		body = append(body, rows[:2*ia+2]...)
		body = append(body, hlRows()...)
		body = append(body, rows[2*ia+2:]...)
	} else {
		section("Long run")
		var lrNames []string
		var lrCoef = make([]ols.Coef, 0)
		for _, lr := range m.LongRun {
			lrNames = append(lrNames, lr.Name)
			lrCoef = append(lrCoef, lr.Coef)
		}
		body = append(body, engine.CoefRows(c, lrNames, lrCoef, dec, false)...)
		section("Adjustment")
		ia := slices.Index(m.ECMNames, ardl.ECTName)
		body = append(body, engine.CoefRows(c, []string{ardl.ECTName}, []ols.Coef{m.ECMCoef[ia]}, dec, false)...)
		body = append(body, hlRows()...)
		section("Bounds test")
		body = append(body, b.rows(dec)...)
		if len(syms) > 0 {
			section("Symmetry (Wald F)")
			for _, r := range syms {
				body = append(body, engine.TestRows("long run, "+r.name, r.long.Stat, r.long.PValue, dec, false)...)
				body = append(body, engine.TestRows("short run, "+r.name, r.short.Stat, r.short.PValue, dec, false)...)
			}
		}
	}
	return append(body,
		table.Row{Cells: []table.Cell{table.T("N"), table.I(m.Fit.N)}, RuleAbove: true},
		table.Row{Cells: []table.Cell{table.T("R²"), table.N(m.Fit.R2(), dec)}},
		table.Row{Cells: []table.Cell{table.T("Adjusted R²"), table.N(m.Fit.R2Adj(), dec)}},
	)
}

// values returns the results-file values of the model (without those of
// split regressors): coefficients, long run, adjustment, bounds test,
// orders, fit, settings and sample.
func (s *ardlSpec) values(st *settings, m *ardl.Model, b *boundsResult, sd *engine.Data) map[string]any {
	adj := m.Adjust
	qv := map[string]any{}
	for j, x := range s.X {
		qv[x] = m.Orders.Q[j]
	}
	vals := map[string]any{
		"coef": engine.CoefValues(m.Names, m.Coef), "ecm": engine.CoefValues(m.ECMNames, m.ECMCoef),
		"longrun": longrunValues(m), "alpha": adj.Alpha, "alpha_se": adj.SE, "halflife": nil, "halflife_se": nil,
		"error_corrects": adj.HasHalfLife, "bounds": b.values(),
		"lags": map[string]any{"p": m.Orders.P, "q": qv},
		"nobs": m.Fit.N, "r2": m.Fit.R2(), "r2_adj": m.Fit.R2Adj(), "sigma": math.Sqrt(m.Fit.Sigma2()),
		"det": engine.SystemCaseWords[st.det], "case": st.det.Roman(), "y": s.Y, "x": s.X, "show": st.show,
		"sample": engine.SampleValues(sd),
	}
	if adj.HasHalfLife {
		vals["halflife"], vals["halflife_se"] = adj.HalfLife, adj.HalfLifeSE
	}
	if m.Selection != nil {
		vals["selection"] = map[string]any{"criterion": m.Selection.Crit.String(), "max": m.Selection.MaxP,
			"nobs": m.Selection.NObs, "models": m.Selection.Models, "value": m.Selection.Value}
	}
	return vals
}

// symRow is the pair of symmetry tests of one split regressor.
type symRow struct {
	name        string
	long, short ardl.FTest
}
