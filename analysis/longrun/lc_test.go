package longrun

import (
	"math"
	"testing"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/internal/refdata"
)

// TestHansenLcNumpy compares Hansen's (1992) Lc after FMOLS with an
// independent numpy 1.24.2 implementation of the published formulas
// (fixture testdata/fixtures/longrun_lc.json, script
// testdata/scripts/longrun_lc.py) on the US macro data, Bartlett and QS
// kernels, automatic and given bandwidths, cases c and ct, to 1e-7
// relative (the unscaled Z'Z with a trend and log levels is badly
// conditioned, so the two solvers agree to about 1e-8, not better).
func TestHansenLcNumpy(t *testing.T) {
	var fx struct {
		Cases []struct {
			Name, Y, Det, Kernel string
			X                    []string
			Bandwidth            float64
			Lc                   float64
		}
	}
	refdata.JSONFile(t, "../../testdata/fixtures/longrun_lc.json", &fx)
	if len(fx.Cases) < 4 {
		t.Fatal("incomplete fixture longrun_lc.json")
	}
	v := macroVars(t)
	for _, c := range fx.Cases {
		det, _ := critical.ParseCase(c.Det)
		k := Bartlett
		if c.Kernel == "qs" {
			k = QuadraticSpectral
		}
		var xs [][]float64
		for _, x := range c.X {
			xs = append(xs, v[x])
		}
		r, err := FMOLS(v[c.Y], xs, c.X, FMOLSSpec{Det: det, Kernel: k, Bandwidth: c.Bandwidth})
		if err != nil {
			t.Fatal(err)
		}
		lc, err := HansenLc(v[c.Y], xs, det, r)
		if err != nil {
			t.Fatal(err)
		}
		if relErr(lc.Stat, c.Lc) > 1e-7 {
			t.Errorf("%s: Lc %.12g, numpy %.12g", c.Name, lc.Stat, c.Lc)
		}
		if lc.Crit == nil || lc.M != len(c.X) {
			t.Errorf("%s: no critical values", c.Name)
		}
	}
}

// TestLcTable: the table is the simulation stored in
// testdata/fixtures/longrun_lc_crit.json (numpy 1.24.2, 20,000
// replications per entry), to its three decimals, and absent where not
// simulated.
func TestLcTable(t *testing.T) {
	var fx struct {
		Entries []map[string]any
	}
	refdata.JSONFile(t, "../../testdata/fixtures/longrun_lc_crit.json", &fx)
	if len(fx.Entries) != 8 {
		t.Fatalf("%d entries", len(fx.Entries))
	}
	for _, e := range fx.Entries {
		det, _ := critical.ParseCase(e["det"].(string))
		cv, _ := LcCritical(int(e["m"].(float64)), det)
		for i, key := range []string{"0.01", "0.05", "0.1"} {
			if math.Abs(cv[i].Value-e[key].(float64)) > 0.0005 {
				t.Errorf("%v m=%v at %s: table %v, simulation %v", e["det"], e["m"], key, cv[i].Value, e[key])
			}
		}
	}
	if cv, _ := LcCritical(5, critical.Const); cv != nil {
		t.Error("m=5 tabulated")
	}
	if cv, _ := LcCritical(1, critical.NoConst); cv != nil {
		t.Error("case n tabulated")
	}
}
