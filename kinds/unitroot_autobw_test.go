package kinds

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/internal/refdata"
)

// TestKPSSAutoBandwidthDirective: kpss directives with bandwidth:
// auto-hfo (Hobijn, Franses and Ooms 1998) reproduce statsmodels 0.13.5
// kpss(nlags="auto") from the fixture testdata/fixtures/rules_bandwidth.json
// (script testdata/scripts/rules_bandwidth.py) for the macro series: the
// lag exactly and η to 1e-8 relative; the note names the automatic
// choice and the lag chosen. pp and kpss with bandwidth: auto (Newey–West
// 1994) run end to end and say so.
func TestKPSSAutoBandwidthDirective(t *testing.T) {
	t.Parallel()
	var fx struct {
		KPSSAuto []struct {
			Series, Case string
			Stat         float64
			Lags         int
		} `json:"kpss_auto"`
	}
	refdata.JSONFile(t, "../testdata/fixtures/rules_bandwidth.json", &fx)
	expr := map[string]string{"log_realgdp": "log(realgdp)", "log_realcons": "log(realcons)", "tbilrate": "tbilrate", "infl": "infl", "unemp": "unemp"}
	var body strings.Builder
	var want []int
	for i, c := range fx.KPSSAuto {
		e, ok := expr[c.Series]
		if !ok {
			continue
		}
		body.WriteString(fence("kpss", "id: k"+string(rune('a'+i))+"\nseries: "+e+"\ndet: "+c.Case+"\nbandwidth: auto-hfo\n"))
		want = append(want, i)
	}
	if len(want) < 8 {
		t.Fatalf("fixture has %d macro cases", len(want))
	}
	body.WriteString(fence("kpss", "id: nw\nseries: infl\nbandwidth: auto\n"))
	body.WriteString(fence("pp", "id: pp\nseries: log(realgdp)\ndet: ct\nbandwidth: auto\n"))
	doc, err := engine.Parse(macroProject(t, body.String()), engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := doc.Run(); err != nil {
		t.Fatal(err)
	}
	res := map[string]*engine.Result{}
	for _, r := range doc.Results() {
		res[r.ID] = r
	}
	for _, i := range want {
		c := fx.KPSSAuto[i]
		r := res["k"+string(rune('a'+i))]
		stat, lags := r.Values["stat"].(float64), r.Values["bandwidth"].(int)
		if lags != c.Lags || math.Abs(stat-c.Stat) > 1e-8*math.Abs(c.Stat) {
			t.Errorf("%s %s: η %.12g with %d lags, statsmodels %.12g with %d", c.Series, c.Case, stat, lags, c.Stat, c.Lags)
		}
		note := strings.Join(r.Table.Notes, " ")
		if !strings.Contains(note, "Hobijn, Franses and Ooms (1998)") || !strings.Contains(note, " "+strconv.Itoa(lags)+" Bartlett lags, chosen automatically") {
			t.Errorf("%s %s: note %q", c.Series, c.Case, note)
		}
	}
	for _, id := range []string{"nw", "pp"} {
		note := strings.Join(res[id].Table.Notes, " ")
		if !strings.Contains(note, "chosen automatically by Newey and West's (1994) rule") {
			t.Errorf("%s: note %q", id, note)
		}
	}
}
