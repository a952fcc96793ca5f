package kinds

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"testing"

	"github.com/galley-econ/galley/internal/refdata"
)

// TestNgPerronDirective: the ngperron directive, with its default lag
// rule (MAIC up to Schwert's maximum), reports the four statistics of
// the independent numpy implementation of Ng and Perron (2001)
// (testdata/scripts/unitroot_ngperron.py, numpy 1.24.2) to 1e-8
// relative, with the same lag order; unitroot-table and grid read it
// through the test contract with no code of their own.
func TestNgPerronDirective(t *testing.T) {
	t.Parallel()
	raw, err := os.ReadFile(filepath.Join(refdata.Root(), "fixtures", "unitroot_ngperron.json"))
	if err != nil {
		t.Fatal(err)
	}
	var fx struct {
		Rows []struct {
			Series, Case, Select string
			Max, Lags            int
			MZa, MZt, MSB, MPT   float64
		}
	}
	if err := json.Unmarshal(raw, &fx); err != nil {
		t.Fatal(err)
	}
	want := map[string]int{}
	for i, r := range fx.Rows {
		if r.Series == "log_realgdp" && r.Select == "maic" && r.Max == -1 {
			want[r.Case] = i
		}
	}
	if len(want) != 2 {
		t.Fatalf("fixture rows for log realgdp, MAIC, default maximum: %v", want)
	}
	body := fence("ngperron", "id: npc\nseries: log(realgdp)\ndet: c\n") + "\n" +
		fence("ngperron", "id: npct\nseries: log(realgdp)\ndet: ct\n") + "\n" +
		fence("unitroot-table", "id: ut\nseries: [log(realgdp)]\ntests: [adf, ngperron]\n") + "\n" +
		fence("grid", "id: g\nof: ngperron\nseries: log(realgdp)\nover:\n  det: [c, ct]\nshow: stat\n")
	res := runDoc(t, macroProject(t, body))
	for id, c := range map[string]string{"npc": "c", "npct": "ct"} {
		r := fx.Rows[want[c]]
		v := res[id].Values
		if v["lags"] != r.Lags {
			t.Errorf("%s: lags %v, numpy %d", id, v["lags"], r.Lags)
		}
		for k, w := range map[string]float64{"mza": r.MZa, "mzt": r.MZt, "msb": r.MSB, "mpt": r.MPT, "stat": r.MZt} {
			if got := v[k].(float64); math.Abs(got-w) > 1e-8*math.Abs(w) {
				t.Errorf("%s %s = %.12g, numpy %.12g", id, k, got, w)
			}
		}
	}
	if res["ut"].Table == nil || res["g"].Table == nil {
		t.Fatal("unitroot-table or grid made no table")
	}
	cells := res["g"].Values["cells"].([]map[string]any)
	if got := cells[1]["values"].(map[string]any)["stat"].(float64); got != res["npct"].Values["stat"].(float64) {
		t.Errorf("grid cell ct: MZt %g, directive %g", got, res["npct"].Values["stat"])
	}
}
