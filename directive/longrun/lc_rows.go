package longrun

import (
	"fmt"
	"math"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/longrun"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
)

// lcBlock is Hansen's (1992) Lc stability test of an FMOLS fit: its row
// in the table's lower block (the statistic, starred by its critical
// values, with the 5% value beneath), its note and its values.
func lcBlock(c *engine.Context, y []float64, x [][]float64, det critical.Case, r *longrun.FMOLSResult, dec int) ([]table.Row, string, map[string]any, error) {
	lc, err := longrun.HansenLc(y, x, det, r)
	if err != nil {
		return nil, "", nil, c.Errorf("x", "Hansen's Lc test: %v", err)
	}
	o := &contract.Outcome{Stat: lc.Stat, PValue: math.NaN(), Crit: lc.Crit, Upper: true}
	rows := []table.Row{{Cells: []table.Cell{table.T("Hansen Lc"), table.Starred(lc.Stat, dec, o.Stars(c.Stars()))}, RuleAbove: true}}
	note := fmt.Sprintf("Hansen Lc: Hansen's (1992) test of the null that every coefficient is constant (against a martingale in the coefficients), from the FMOLS scores; it rejects for large values. Critical values: %s.", lc.CritSource)
	if cv, ok := contract.CritAt(lc.Crit, 0.05); ok {
		rows = append(rows, table.Row{Cells: []table.Cell{table.T("    5% critical value"), table.N(cv, dec)}})
		note += " Stars by these critical values; no p-value is tabulated."
	} else {
		note += " No stars."
	}
	vals := map[string]any{"stat": lc.Stat, "crit": contract.CritMap(lc.Crit), "crit_source": lc.CritSource, "m": lc.M}
	if lc.Crit != nil {
		vals["reject_5"] = o.Rejects(0.05)
	}
	return rows, note, vals, nil
}
