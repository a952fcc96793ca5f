package kinds

import (
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"sort"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/table"
	"github.com/galley-econ/galley/internal/refdata"
	"github.com/galley-econ/galley/manuscript"
)

// TestProducedValuesAreAccepted: every top-level value a directive
// produces can be quoted in prose (and no table label is written in the
// old suffix notation), that is, its kind's Fields list (which
// `galley check` uses before anything runs) names it. Run on the demo
// paper and on a manuscript with the kinds the demo lacks.
func TestProducedValuesAreAccepted(t *testing.T) {
	t.Parallel()
	kinds := map[string]*engine.Kind{}
	for _, k := range engine.Kinds() {
		kinds[k.Name] = k
	}
	seen := map[string]bool{}
	oldNotation := regexp.MustCompile(`\([-+]\d+\)|(^|[^a-z])d\.|^(lag|lead|diff)\(`)
	lib := manuscript.MethodLibrary()
	check := func(results []*engine.Result) {
		for _, r := range results {
			for _, key := range r.Cites {
				if _, ok := lib.Entries[key]; !ok {
					t.Errorf("%s (%s) cites %q, which galley's reference table lacks", r.ID, r.Kind, key)
				}
			}
			// Row labels and headers are in galley's notation (Δ and time
			// subscripts), never in the suffix notation "x(-1)", "d.x".
			if r.Table != nil {
				var labels []table.Cell
				for _, h := range r.Table.Head {
					labels = append(labels, h...)
				}
				for _, row := range r.Table.Body {
					labels = append(labels, row.Cells[:min(r.Table.Stub, len(row.Cells))]...)
				}
				for _, l := range labels {
					if !l.IsNum && oldNotation.MatchString(l.Text) {
						t.Errorf("%s (%s): the label %q is in the old suffix notation or not typeset", r.ID, r.Kind, l.Text)
					}
				}
			}
			k := kinds[r.Kind]
			seen[r.Kind] = true
			if k == nil || k.Fields == nil {
				continue
			}
			var missing []string
			for key := range r.Values {
				if !slices.Contains(k.Fields, key) && !slices.Contains(engine.CommonFields, key) {
					missing = append(missing, key)
				}
			}
			sort.Strings(missing)
			if len(missing) > 0 {
				t.Errorf("%s (%s) produces %v, which its kind's Fields refuse", r.ID, r.Kind, missing)
			}
		}
	}
	withDemo(t, func(doc *engine.Document) { check(doc.Results()) })
	body := fence("adf", "id: a\nseries: log(realgdp)\n") + fence("pp", "id: p\nseries: log(realgdp)\n") +
		fence("kpss", "id: k\nseries: infl\n") + fence("dfgls", "id: g\nseries: log(realgdp)\n") +
		fence("za", "id: z\nseries: log(realgdp)\nlags: 1\n") + fence("ngperron", "id: n\nseries: log(realgdp)\n") +
		fence("po", "id: po\ny: log(realcons)\nx: [log(realdpi)]\n") +
		fence("gregory-hansen", "id: gh\ny: log(realcons)\nx: [log(realdpi)]\n") +
		fence("ccr", "id: cc\ny: log(realcons)\nx: [log(realdpi)]\nrestrict: [\"log(realdpi) = 1\"]\n") +
		fence("var-lags", "id: vl\nseries: [log(realcons), log(realdpi)]\nmax: 4\n") +
		fence("responses", "id: ir\nseries: [infl, tbilrate]\nlags: 2\nhorizon: 4\nreplications: 0\n") +
		fence("variance-shares", "id: vs\nseries: [infl, tbilrate]\nlags: 2\n") +
		fence("causality", "id: ca\nseries: [infl, tbilrate]\nlags: 2\n")
	res := runDoc(t, macroProject(t, body))
	var rs []*engine.Result
	for _, r := range res {
		rs = append(rs, r)
	}
	check(rs)
	for name := range kinds {
		if !seen[name] {
			t.Errorf("kind %s is not exercised by this test", name)
		}
	}
}

// TestDisplayLabels: the front matter's labels: name a series in table
// stubs, headers and the dependent variable of a note, in the typeset
// differences and lags of it, and in figure legends; values keep the
// expression.
func TestDisplayLabels(t *testing.T) {
	t.Parallel()
	body := "---\ndata:\n  macro: macro.csv\nlabels:\n  log(realcons): Consumption (log)\n  log(realdpi): Income (log)\n---\n\n" +
		fence("ols", "id: m\ny: diff(log(realcons))\nx: [lag(diff(log(realcons)),1), diff(log(realdpi))]\n") +
		fence("adf", "id: a\nseries: log(realcons)\n")
	csv, err := os.ReadFile(filepath.Join(refdata.Root(), "data", "macrodata.csv"))
	if err != nil {
		t.Fatal(err)
	}
	p := writeProject(t, body, map[string]string{"macro.csv": string(csv)})
	res := runDoc(t, p)
	tab := res["m"].Table
	if h := tab.Head[0][1].Plain(); h != "ΔConsumption (log)" {
		t.Errorf("ols header %q", h)
	}
	var stubs []string
	for _, r := range tab.Body {
		stubs = append(stubs, r.Cells[0].Plain())
	}
	if !slices.Contains(stubs, "ΔConsumption (log)ₜ₋₁") || !slices.Contains(stubs, "ΔIncome (log)") {
		t.Errorf("ols stubs %q", stubs)
	}
	if n := tab.Notes[0]; !strings.HasPrefix(n, "Dependent variable: ΔConsumption (log).") {
		t.Errorf("ols note %q", n)
	}
	if h := res["a"].Table.Head[0][1].Plain(); h != "Consumption (log)" {
		t.Errorf("adf header %q", h)
	}
	if res["m"].Values["coef"].([]map[string]any)[1]["term"] != "lag(diff(log(realcons)), 1)" { // as written (a flow list rejoined at its comma)
		t.Error("the values do not keep the expression as the term's name")
	}
}
