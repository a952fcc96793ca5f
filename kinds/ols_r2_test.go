package kinds

import (
	"math"
	"strings"
	"testing"

	"github.com/galley-econ/galley/internal/refdata"
)

// TestOLSR2Convention: with a constant the ols table's R² is centred;
// without one it is uncentred (Davidson and MacKinnon 2004, §3.5), the
// convention of statsmodels 0.13.5 OLS (rsquared, rsquared_adj; fixture
// testdata/fixtures/ols_macrodata.json by testdata/scripts/ols_macrodata.py),
// checked to 1e-8 relative; the note says so and both forms are values.
func TestOLSR2Convention(t *testing.T) {
	t.Parallel()
	var fx struct {
		Cases []struct {
			Name        string  `json:"name"`
			R2          float64 `json:"r2"`
			R2Adj       float64 `json:"r2_adj"`
			R2Centred   float64 `json:"r2_centred"`
			R2Uncentred float64 `json:"r2_uncentred"`
		} `json:"cases"`
	}
	if err := refdata.Fixture("ols_macrodata", &fx); err != nil {
		t.Fatal(err)
	}
	p := macroProject(t, fence("ols", "id: nc\ndata: macro\ny: dlog(realcons)\nx: [dlog(realdpi)]\nconst: false\n")+"\n"+
		fence("ols", "id: wc\ndata: macro\ny: log(realcons)\nx: [log(realdpi)]\n"))
	res := runDoc(t, p)
	close := func(what string, got any, want float64) {
		t.Helper()
		g, ok := got.(float64)
		if !ok || math.Abs(g-want) > 1e-8*math.Abs(want) {
			t.Errorf("%s = %v, statsmodels %.12g", what, got, want)
		}
	}
	checked := 0
	for _, c := range fx.Cases {
		id := map[string]string{"dlogcons_on_dlogdpi_noconst": "nc", "logcons_on_logdpi": "wc"}[c.Name]
		if id == "" {
			continue
		}
		checked++
		v := res[id].Values
		close(id+" r2", v["r2"], c.R2)
		close(id+" r2_adj", v["r2_adj"], c.R2Adj)
		close(id+" r2_centred", v["r2_centred"], c.R2Centred)
		close(id+" r2_uncentred", v["r2_uncentred"], c.R2Uncentred)
		notes := strings.Join(res[id].Table.Notes, " ")
		if says := strings.Contains(notes, "uncentred"); says != (id == "nc") {
			t.Errorf("%s: note mentions the uncentred R²: %v; notes %q", id, says, notes)
		}
		if id == "nc" && !strings.Contains(notes, "the centred R², 1 − Σe²/Σ(y − ȳ)², is −0.152") {
			t.Errorf("nc: the note does not give the centred R² (statsmodels %.3f): %q", c.R2Centred, notes)
		}
	}
	if checked != 2 {
		t.Errorf("checked %d fixture cases, want 2", checked)
	}
}
