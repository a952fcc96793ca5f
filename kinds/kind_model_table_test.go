package kinds

import (
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
)

// TestModelTableWiring: each column shows its model's own values (from
// the coef lists of the ecm, dols and fmols results), terms in first-seen
// order, the lower block from the models' values, and one note each for
// standard errors and samples.
func TestModelTableWiring(t *testing.T) {
	t.Parallel()
	doc := cointResults(t)
	mt := resultByID(t, doc, "mt")
	models := []*engine.Result{resultByID(t, doc, "ecm_north"), resultByID(t, doc, "dols"), resultByID(t, doc, "fmols")}
	var union []string
	for _, m := range models {
		for _, c := range m.Values["coef"].([]map[string]any) {
			if !containsString(union, c["term"].(string)) {
				union = append(union, c["term"].(string))
			}
		}
	}
	got := mt.Values["terms"].([]string)
	if strings.Join(got, "|") != strings.Join(union, "|") {
		t.Fatalf("terms %v, want %v", got, union)
	}
	tab := mt.Table
	if h := tab.Head[1]; h[1].Text != "Short run" || h[3].Text != "FMOLS" {
		t.Errorf("labels %v", h)
	}
	if h := tab.Head[2]; h[1].Text != "Δlog(north)" || h[2].Text != "log(north)" {
		t.Errorf("dependent row %v", h)
	}
	for i, term := range union {
		est, se := tab.Body[2*i].Cells, tab.Body[2*i+1].Cells
		if est[0].Plain() != engine.TermText(term) {
			t.Fatalf("row %d is %q, want %q (the term %s typeset)", 2*i, est[0].Plain(), engine.TermText(term), term)
		}
		for j, m := range models {
			var c map[string]any
			for _, e := range m.Values["coef"].([]map[string]any) {
				if e["term"] == term {
					c = e
				}
			}
			if c == nil {
				if est[1+j].IsNum || se[1+j].IsNum {
					t.Errorf("%s, column %d: a number for a term the model lacks", term, j+1)
				}
				continue
			}
			if est[1+j].Num != c["est"].(float64) || se[1+j].Num != c["se"].(float64) || !se[1+j].Paren {
				t.Errorf("%s, column %d: cells %+v %+v, want %v", term, j+1, est[1+j], se[1+j], c)
			}
			p := c["p"].(float64)
			if want := starsFor(p); est[1+j].Stars != want {
				t.Errorf("%s, column %d: %d stars for p = %g", term, j+1, est[1+j].Stars, p)
			}
		}
	}
	lower := tab.Body[2*len(union):]
	if len(lower) != 4 || lower[0].Cells[0].Text != "N" || !lower[0].RuleAbove {
		t.Fatalf("lower block %v", lower)
	}
	for j, m := range models {
		wantNum(t, "nobs column", lower[0].Cells[1+j].Num, float64(m.Values["nobs"].(int)))
	}
	if lower[1].Cells[3].IsNum {
		t.Errorf("FMOLS has no R² but the table shows one")
	}
	if hl := lower[2].Cells[1]; hl.Num != models[0].Values["halflife"].(float64) {
		t.Errorf("half-life cell %+v", hl)
	}
	notes := strings.Join(tab.Notes, " ")
	for _, w := range []string{"(1) conventional OLS standard errors", "(2) Newey–West HAC", "(3) FMOLS", "Samples: (1) 2004-03–2025-12, N = 262", "standard normal", "p < 10%"} {
		if !strings.Contains(notes, w) {
			t.Errorf("notes lack %q: %s", w, notes)
		}
	}

	// terms: restricts and orders the rows.
	mt2 := resultByID(t, doc, "mt_terms").Table
	if len(mt2.Body) != 2+2 || mt2.Body[0].Cells[0].Text != "log(fuel)" {
		t.Errorf("terms: [log(fuel)] gave rows %v", mt2.Body)
	}
}

func containsString(s []string, x string) bool {
	for _, e := range s {
		if e == x {
			return true
		}
	}
	return false
}

// starsFor is the default star rule (10%, 5%, 1%).
func starsFor(p float64) int {
	n := 0
	for _, l := range []float64{0.10, 0.05, 0.01} {
		if p < l {
			n++
		}
	}
	return n
}

func TestModelTableBadInput(t *testing.T) {
	t.Parallel()
	files := map[string]string{"data.csv": syntheticCSV("y", "x", gridlinkSynthetic(80, -0.5))}
	up := front + "\n" + fence("ols", "id: o\ny: y\nx: [x]\n") + "\n" + fence("engle-granger", "id: eg\ny: y\nx: [x]\n") + "\n"
	// The model-table fence is on line 19.
	mt := func(body string) string { return up + fence("model-table", body) }
	t.Run("missing model", func(t *testing.T) {
		runBad(t, mt("id: t\nmodels: [o, oo]\n"), files, "paper.md:21:", `no directive has id "oo"`)
	})
	t.Run("not a model", func(t *testing.T) {
		runBad(t, mt("id: t\nmodels: [o, eg]\n"), files, "paper.md:21:", `"eg" is a engle-granger result`, "dols or ecm or fmols or ols")
	})
	t.Run("labels", func(t *testing.T) {
		runBad(t, mt("id: t\nmodels: [o]\nlabels: [A, B]\n"), files, "paper.md:22:", "2 labels for 1 models")
	})
	t.Run("unknown term", func(t *testing.T) {
		runBad(t, mt("id: t\nmodels: [o]\nterms: [xx]\n"), files, "paper.md:22:", `the term "xx"`, "did you mean x?")
	})
	t.Run("unknown stat", func(t *testing.T) {
		runBad(t, mt("id: t\nmodels: [o]\nstats: [nobs, r3]\n"), files, "paper.md:22:", `unknown statistic "r3"`, "did you mean r2?")
	})
	t.Run("no models", func(t *testing.T) {
		runBad(t, mt("id: t\n"), files, "paper.md:19:", `"models" is required`)
	})
	t.Run("twice", func(t *testing.T) {
		runBad(t, mt("id: t\nmodels: [o, o]\n"), files, "paper.md:21:", "listed twice")
	})
}
