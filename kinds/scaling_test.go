package kinds

import (
	"math"
	"os"
	"path/filepath"
	"testing"
)

// TestPoorScaling: multiplying series by 1e8 leaves every scale-free
// statistic unchanged to 1e-8 (relative), and scales coefficients as it
// should. Regressions are solved by QR on scaled columns; the Johansen
// analysis scales each series internally and maps its results back
// (analysis/johansen/scale.go).
func TestPoorScaling(t *testing.T) {
	t.Parallel()
	csv, err := os.ReadFile(filepath.Join("..", "examples", "gridlink", "data", "gridlink.csv"))
	if err != nil {
		t.Fatal(err)
	}
	body := ""
	for _, s := range []struct{ id, kind, keys string }{
		{"o1", "ols", "y: log(north)\nx: [log(fuel)]\nse: hac(4)\n"},
		{"o2", "ols", "y: log(north)\nx: [log(fuel) * 1e8]\nse: hac(4)\n"},
		{"a1", "adf", "series: log(north)\nlags: 3\n"},
		{"a2", "adf", "series: log(north) * 1e8\nlags: 3\n"},
		{"e1", "engle-granger", "y: log(north)\nx: [log(fuel)]\nlags: 1\n"},
		{"e2", "engle-granger", "y: log(north) * 1e8\nx: [log(fuel) * 1e8]\nlags: 1\n"},
		{"j1", "johansen", "series: [log(north), log(south), log(fuel)]\nlags: 1\nrank: 1\n"},
		{"j2", "johansen", "series: [log(north) * 1e8, log(south), log(fuel) * 1e8]\nlags: 1\nrank: 1\n"},
		{"j3", "johansen", "series: [log(north), log(south) * 1e-6, log(fuel) * 1e8]\nlags: 1\nrank: 1\n"},
	} {
		body += fence(s.kind, "id: "+s.id+"\ndata: grid\n"+s.keys)
	}
	p := writeProject(t, front+"\n"+body, map[string]string{"data.csv": string(csv)})
	v := valuesOf(t, p)
	rel := func(what string, a, b float64) {
		t.Helper()
		if math.Abs(a-b) > 1e-8*math.Abs(b) {
			t.Errorf("%s: %.15g vs %.15g", what, a, b)
		}
	}
	c1 := v["o1"]["coef"].([]map[string]any)[1]
	c2 := v["o2"]["coef"].([]map[string]any)[1]
	rel("ols slope × 1e8", c2["est"].(float64)*1e8, c1["est"].(float64))
	rel("ols HAC t", c2["t"].(float64), c1["t"].(float64))
	rel("ols R²", v["o2"]["r2"].(float64), v["o1"]["r2"].(float64))
	rel("adf τ", v["a2"]["stat"].(float64), v["a1"]["stat"].(float64))
	rel("engle-granger τ", v["e2"]["stat"].(float64), v["e1"]["stat"].(float64))
	// Johansen: eigenvalues and trace statistics are unit-free; β is
	// normalised on north, so a series multiplied by m_j has coefficient
	// β_j·m_north/m_j, and fuel's coefficient × m_fuel/m_north is the
	// unscaled one (as is its standard error).
	beta := func(id, name string) (est, se float64) {
		t.Helper()
		return v[id]["beta"].([]map[string]any)[0][name].(float64), v[id]["beta_se"].([]map[string]any)[0][name].(float64)
	}
	fuel1, fuelSE1 := beta("j1", "log(fuel)")
	for _, j := range []struct {
		id, fuel string
		undo     float64 // m_fuel / m_north
	}{{"j2", "log(fuel) * 1e8", 1}, {"j3", "log(fuel) * 1e8", 1e8}} {
		e1, e2 := v["j1"]["eig"].([]float64), v[j.id]["eig"].([]float64)
		t1, t2 := v["j1"]["trace"].([]float64), v[j.id]["trace"].([]float64)
		if len(e1) != 3 || len(e2) != 3 || len(t1) != 3 || len(t2) != 3 {
			t.Fatalf("%s: %d/%d eigenvalues, %d/%d trace statistics, want 3", j.id, len(e1), len(e2), len(t1), len(t2))
		}
		for i := range e1 {
			rel(j.id+" johansen eigenvalue", e2[i], e1[i])
			rel(j.id+" johansen trace", t2[i], t1[i])
		}
		fuel, fuelSE := beta(j.id, j.fuel)
		rel(j.id+" johansen β fuel × m_fuel/m_north", fuel*j.undo, fuel1)
		rel(j.id+" johansen se(β fuel) × m_fuel/m_north", fuelSE*j.undo, fuelSE1)
	}
	south1, _ := beta("j1", "log(south)")
	south3, _ := beta("j3", "log(south) * 1e-6")
	rel("j3 johansen β south × m_south/m_north", south3*1e-6, south1)
}
