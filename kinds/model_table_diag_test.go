package kinds

import "testing"

// TestModelTableDiagnostics: a model table's lower block can show the
// residual diagnostics of ecm results, as their p-values.
func TestModelTableDiagnostics(t *testing.T) {
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
