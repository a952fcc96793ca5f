package engine

import (
	"fmt"
	"strings"

	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/engine/table"
)

// condWarn is the condition number of the column-scaled design above
// which a table note warns of near-collinearity.
const condWarn = 1e8

// CoefRows lays out coefficients the usual way: the estimate with stars on
// one row, its standard error in parentheses on the next. With noStars
// the stars are left off (for estimates whose usual t-ratios are invalid).
func CoefRows(c *Context, terms []string, coefs []ols.Coef, dec int, noStars bool) []table.Row {
	var rows []table.Row
	for i, t := range terms {
		st := 0
		if !noStars {
			st = c.StarsFor(coefs[i].P)
		}
		rows = append(rows,
			table.Row{Cells: []table.Cell{c.TermCell(t), table.Starred(coefs[i].Est, dec, st)}},
			table.Row{Cells: []table.Cell{table.Empty, table.SECell(coefs[i].SE, dec)}},
		)
	}
	return rows
}

// CoefValues is the results-file form of a coefficient table.
func CoefValues(terms []string, coefs []ols.Coef) []map[string]any {
	out := make([]map[string]any, len(terms))
	for i, t := range terms {
		out[i] = map[string]any{"term": t, "est": coefs[i].Est, "se": coefs[i].SE, "t": coefs[i].T, "p": coefs[i].P}
	}
	return out
}

// CondNote warns when the design is badly conditioned.
func CondNote(f *ols.Fit) string {
	if f.Cond > condWarn {
		return fmt.Sprintf("Warning: the regressors are nearly collinear (condition number %.2g); estimates may be imprecise.", f.Cond)
	}
	return ""
}

// CollinearError names the regressor that is collinear with earlier ones.
func CollinearError(c *Context, key string, err error, terms []string) error {
	if ce, ok := err.(*ols.CollinearError); ok && ce.Col < len(terms) {
		if ce.Col == 0 {
			return c.Errorf(key, "regressor %q is zero throughout the sample", terms[0])
		}
		return c.Errorf(key, "regressor %q is collinear with %s in this sample (a linear combination of them, to numerical precision); drop one of them", terms[ce.Col], strings.Join(terms[:ce.Col], ", "))
	}
	return c.Wrap(key, err)
}
