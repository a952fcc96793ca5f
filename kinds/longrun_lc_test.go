package kinds

import (
	"math"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/write/markdown"
)

// TestFMOLSLc: an fmols directive shows Hansen's (1992) Lc in its lower
// block and values, equal to the independent numpy implementation in
// testdata/scripts/longrun_lc.py (case c_bartlett_auto, numpy 1.24.2) to
// 1e-7 relative; 0.767 exceeds the 5% critical value 0.572 (m = 1, case
// c), so it carries stars and reject_5.
func TestFMOLSLc(t *testing.T) {
	t.Parallel()
	p := macroProject(t, "Lc is {{fm.lc.stat %.3f}}.\n\n"+fence("fmols", "id: fm\ny: log(realcons)\nx: [log(realdpi)]\n"))
	doc, err := engine.Parse(p, engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := doc.Run(); err != nil {
		t.Fatal(err)
	}
	r := doc.Results()[0]
	lc := r.Values["lc"].(map[string]any)
	if got := lc["stat"].(float64); math.Abs(got-0.7665112536103819)/0.7665112536103819 > 1e-7 {
		t.Errorf("Lc %.12g, numpy 0.7665112536103819", got)
	}
	if lc["reject_5"] != true || lc["crit"].(map[string]any)["5%"] != 0.572 {
		t.Errorf("lc values %v", lc)
	}
	var found bool
	for _, row := range r.Table.Body {
		if row.Cells[0].Text == "Hansen Lc" {
			found = row.Cells[1].Stars > 0
		}
	}
	if !found {
		t.Error("no starred Hansen Lc row in the table")
	}
	md, _ := markdown.Write(doc, markdown.Options{})
	if !strings.Contains(string(md), "Lc is 0.767.") {
		t.Error("prose reference to fm.lc.stat not substituted")
	}
}
