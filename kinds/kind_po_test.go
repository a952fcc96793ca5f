package kinds

import (
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/coint"
	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
)

func TestPOWiring(t *testing.T) {
	t.Parallel()
	g := readGridlink(t)
	// det ct, bandwidth 6 as written in the manuscript.
	r, err := coint.PhillipsOuliaris(g.north, [][]float64{g.fuel}, critical.ConstTrend, 6)
	if err != nil {
		t.Fatal(err)
	}
	res := resultByID(t, cointResults(t), "po")
	v := res.Values
	wantNum(t, "pu", v["pu"], r.Pu)
	wantNum(t, "pz", v["pz"], r.Pz)
	wantNum(t, "nobs", v["nobs"], float64(r.NObs))
	wantNum(t, "bandwidth", v["bandwidth"], 6)
	for name, cv := range map[string][]critical.Value{"crit_pu": r.CritPu, "crit_pz": r.CritPz} {
		m := v[name].(map[string]any)
		for _, c := range cv {
			wantNum(t, name+"."+contract.Pct(c.Level), m[contract.Pct(c.Level)], c.Value)
		}
	}
	st := v["static"].(map[string]any)
	wantNum(t, "static.trend", st["trend"], r.Coef[1])
	wantNum(t, "static.log(fuel)", st["log(fuel)"], r.Coef[2])
	notes := strings.Join(res.Table.Notes, " ")
	for _, w := range []string{"Phillips and Ouliaris (1990), Table Ic (P̂u) and Table IIc (P̂z)", "k = 1", "case ct", "T = 264", "6 Bartlett lags"} {
		if !strings.Contains(notes, w) {
			t.Errorf("notes lack %q: %s", w, notes)
		}
	}
}

// TestPODefaultBandwidth: without bandwidth the rule rule4, ⌊4(N/100)^¼⌋
// with N = T − 1 is used.
func TestPODefaultBandwidth(t *testing.T) {
	t.Parallel()
	csvText := syntheticCSV("y", "x", gridlinkSynthetic(120, -0.5))
	p := writeProject(t, front+"\n"+fence("po", "id: p\ny: y\nx: [x]\n"), map[string]string{"data.csv": csvText})
	d, err := engine.Parse(p, engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := d.Run(); err != nil {
		t.Fatal(err)
	}
	s := gridlinkSynthetic(120, -0.5)
	r, err := coint.PhillipsOuliaris(s.y, [][]float64{s.x}, critical.Const, 4) // ⌊4·(119/100)^¼⌋ = 4
	if err != nil {
		t.Fatal(err)
	}
	v := resultByID(t, d, "p").Values
	wantNum(t, "bandwidth", v["bandwidth"], 4)
	wantNum(t, "pu", v["pu"], r.Pu)
	wantNum(t, "pz", v["pz"], r.Pz)
}

func TestPOBadInput(t *testing.T) {
	t.Parallel()
	files := map[string]string{"data.csv": syntheticCSV("y", "x", gridlinkSynthetic(80, -0.5))}
	po := func(body string) string { return front + "\n" + fence("po", body) }
	t.Run("ctt", func(t *testing.T) {
		runBad(t, po("id: p\ny: y\nx: [x]\ndet: ctt\n"), files, "paper.md:11:", "n, c and ct only")
	})
	t.Run("bad bandwidth", func(t *testing.T) {
		runBad(t, po("id: p\ny: y\nx: [x]\nbandwidth: wide\n"), files, "paper.md:11:", "bandwidth")
	})
	t.Run("too many regressors", func(t *testing.T) {
		runBad(t, po("id: p\ny: y\nx: [x, x, x, x, x, x]\n"), files, "paper.md:10:", "beyond the Phillips–Ouliaris (1990) tables", "crit: simulate")
	})
	t.Run("no y", func(t *testing.T) {
		runBad(t, po("id: p\nx: [x]\n"), files, "paper.md:7:", `"y" is required`)
	})
}
