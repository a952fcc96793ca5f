package kinds

import (
	"fmt"
	"strings"
	"testing"
)

// TestModelTableDiagnostics: a model table's lower block can show the
// residual diagnostics of ecm results, as their p-values.
func TestModelTableDiagnostics(t *testing.T) {
	t.Parallel()
	p := writeProject(t, front+"\n"+
		fence("engle-granger", "id: eg\ndata: grid\ny: north\nx: [fuel]\nlags: 0\n")+
		fence("ecm", "id: e0\nfrom: eg\nlags: 0\ndiagnostics: [jb, dw]\n")+
		fence("model-table", "id: mt\nmodels: [e0]\nstats: [nobs, jb, dw]\n"), map[string]string{"data.csv": testCSV})
	v := valuesOf(t, p)
	ecm := v["e0"]["diagnostics"].(map[string]any)
	stats := v["mt"]["stats"].(map[string]any)
	if got, want := stats["jb"].([]any)[0], ecm["jb"].(map[string]any)["pvalue"]; got != want {
		t.Errorf("jb p-value in the table %v, in the ecm %v", got, want)
	}
	if got, want := stats["dw"].([]any)[0], ecm["dw"].(map[string]any)["stat"]; got != want {
		t.Errorf("dw in the table %v, in the ecm %v", got, want)
	}
}

// TestModelTableHACLags: a model table shows a HAC covariance by its
// truncation lag, the number the model's own note gives ("Bartlett
// kernel, L lags"), for ols with se: hac(L) and for dols with its
// automatic lag; bandwidth is left to the kernel estimators chosen by a
// bandwidth (fmols), so a DOLS column never shows L + 1 beside a DOLS
// table that says L lags.
func TestModelTableHACLags(t *testing.T) {
	t.Parallel()
	files := map[string]string{"data.csv": syntheticCSV("y", "x", gridlinkSynthetic(200, -0.3))}
	p := writeProject(t, front+"\n"+
		fence("ols", "id: o\ny: y\nx: [x]\nse: hac(3)\n")+
		fence("dols", "id: d\ny: y\nx: [x]\n")+
		fence("fmols", "id: f\ny: y\nx: [x]\n")+
		fence("model-table", "id: mt\nmodels: [o, d, f]\nstats: [hac_lags, bandwidth]\n"), files)
	res := runDoc(t, p)
	stats := res["mt"].Values["stats"].(map[string]any)
	lags, bw := stats["hac_lags"].([]any), stats["bandwidth"].([]any)
	if lags[0] != 3.0 || lags[2] != nil {
		t.Errorf("hac_lags %v: want 3 for ols, none for fmols", lags)
	}
	dl := res["d"].Values["hac_lags"].(int)
	if lags[1] != float64(dl) || !strings.Contains(strings.Join(res["d"].Table.Notes, " "), fmt.Sprintf("Bartlett kernel, %d lags", dl)) {
		t.Errorf("dols: the model table shows %v HAC lags, the dols result has %d (notes %q)", lags[1], dl, res["d"].Table.Notes)
	}
	if bw[0] != nil || bw[1] != nil || bw[2] != res["f"].Values["bandwidth"] {
		t.Errorf("bandwidth %v: want only fmols's %v", bw, res["f"].Values["bandwidth"])
	}
	body := res["mt"].Table.Body
	if r := body[len(body)-2]; r.Cells[0].Text != "HAC lags" || r.Cells[2].Num != float64(dl) {
		t.Errorf("HAC lags row %+v", r)
	}
}
