package kinds

import (
	"fmt"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
)

// runDoc parses and runs a manuscript and returns its results by id.
func runDoc(t *testing.T, path string) map[string]*engine.Result {
	t.Helper()
	doc, err := engine.Parse(path, engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := doc.Run(); err != nil {
		t.Fatal(err)
	}
	out := map[string]*engine.Result{}
	for _, r := range doc.Results() {
		out[r.ID] = r
	}
	return out
}

// TestGridADF: every cell of an adf grid over lags × det equals a single
// adf directive with the same keys (values, and the stars of its
// statistic), and the cells are laid out rows = lags, columns = det.
func TestGridADF(t *testing.T) {
	t.Parallel()
	lags := []string{"1", "2", "4"}
	dets := []string{"c", "ct"}
	body := fence("grid", "id: g\ncaption: ADF by lag order and case\nof: adf\nseries: log(realgdp)\nover: {lags: [1, 2, 4], det: [c, ct]}\n")
	// Prose can quote a cell's values (Run fails on a reference it cannot resolve).
	body = "The fourth cell's p-value is {{g.cells.3.values.pvalue %.3f}}; the grid is {{g.shape.rows}} by {{g.shape.cols}}.\n\n" + body
	for _, l := range lags {
		for _, d := range dets {
			body += "\n" + fence("adf", fmt.Sprintf("id: a%s%s\nseries: log(realgdp)\nlags: %s\ndet: %s\n", l, d, l, d))
		}
	}
	res := runDoc(t, macroProject(t, body))
	g := res["g"]
	cells := g.Values["cells"].([]map[string]any)
	if len(cells) != 6 {
		t.Fatalf("%d cells, want 6", len(cells))
	}
	if !reflect.DeepEqual(g.Values["shape"], map[string]any{"rows": 3, "cols": 2}) {
		t.Errorf("shape %v, want 3 rows, 2 columns", g.Values["shape"])
	}
	tab := g.Table
	if tab.Stub != 1 || len(tab.Head) != 2 || len(tab.Body) != 3 {
		t.Fatalf("layout: stub %d, %d head rows, %d body rows", tab.Stub, len(tab.Head), len(tab.Body))
	}
	// Headers in words: the key's, and the deterministic cases as the notes say them.
	if h := tab.Head[1]; h[0].Text != "Lags" || h[1].Text != "constant" || h[2].Text != "constant and trend" {
		t.Errorf("second head row %+v", h)
	}
	if tab.Head[0][1].Text != "Deterministic terms" || tab.Head[0][1].Span != 2 {
		t.Errorf("first head row %+v", tab.Head[0])
	}
	i := 0
	for r, l := range lags {
		if got := tab.Body[r].Cells[0].Text; got != l {
			t.Errorf("row %d stub %q, want %q", r, got, l)
		}
		for col, d := range dets {
			single := res["a"+l+d]
			cell := cells[i]
			i++
			want := map[string]any{"lags": mustAtoi(l), "det": d}
			if !reflect.DeepEqual(cell["over"], want) {
				t.Errorf("cell %d over %v, want %v", i-1, cell["over"], want)
			}
			if !reflect.DeepEqual(cell["values"], single.Values) {
				t.Errorf("lags %s det %s: grid cell values\n%v\nsingle directive\n%v", l, d, cell["values"], single.Values)
			}
			gc := tab.Body[r].Cells[1+col]
			sc := single.Table.Body[0].Cells[1]
			if gc.Num != sc.Num || gc.Stars != sc.Stars {
				t.Errorf("lags %s det %s: grid shows %v with %d stars, the single test %v with %d", l, d, gc.Num, gc.Stars, sc.Num, sc.Stars)
			}
		}
	}
	if len(tab.Notes) != 1 {
		t.Fatalf("notes %q", tab.Notes)
	}
	note := tab.Notes[0]
	for _, w := range []string{"separate adf directive", "the ADF statistic", "the lags (1; 2; 4)", "the deterministic terms (constant; constant and trend)", "T = 198 to 201", "H0: log(realgdp) has a unit root.", "Stars:"} {
		if !strings.Contains(note, w) {
			t.Errorf("note lacks %q: %s", w, note)
		}
	}
	// Settings that vary must not be stated as common to every cell.
	if strings.Contains(note, "Deterministic terms: constant.") || strings.Contains(note, "fixed at 2") {
		t.Errorf("note states a varying setting as fixed: %s", note)
	}
	if tab.Caption != "ADF by lag order and case" {
		t.Errorf("caption %q", tab.Caption)
	}
}

func mustAtoi(s string) int {
	var n int
	fmt.Sscan(s, &n)
	return n
}

// TestGridOLS: an ols grid over se: one row per standard-error type,
// the estimate with stars over its standard error; the same estimate in
// every row and the single ols directives' standard errors and stars.
func TestGridOLS(t *testing.T) {
	t.Parallel()
	ses := []string{"ols", "hc1", "hac(2)"}
	body := fence("grid", "id: g\nof: ols\ny: log(realcons)\nx: [log(realdpi), infl]\nover:\n  se: [ols, hc1, hac(2)]\n")
	for i, se := range ses {
		body += "\n" + fence("ols", fmt.Sprintf("id: m%d\ny: log(realcons)\nx: [log(realdpi), infl]\nse: %s\n", i, se))
	}
	res := runDoc(t, macroProject(t, body))
	g := res["g"]
	if g.Values["show"] != "coef.log(realdpi)" {
		t.Errorf("default show %v, want coef.log(realdpi)", g.Values["show"])
	}
	tab := g.Table
	if tab.Stub != 1 || len(tab.Body) != 6 || tab.Head[0][0].Text != "Standard errors" || tab.Head[0][1].Text != "log(realdpi)" {
		t.Fatalf("layout: stub %d, body %d rows, head %+v", tab.Stub, len(tab.Body), tab.Head)
	}
	var seen []float64
	labels := []string{"conventional", "HC1", "HAC, 2 lags"}
	for i, se := range ses {
		m := res[fmt.Sprint("m", i)]
		est, sec := tab.Body[2*i].Cells[1], tab.Body[2*i+1].Cells[1]
		if tab.Body[2*i].Cells[0].Text != labels[i] {
			t.Errorf("row %d label %q, want %q", i, tab.Body[2*i].Cells[0].Text, labels[i])
		}
		// In the single table, log(realdpi) is the second term: rows 2 and 3.
		sEst, sSE := m.Table.Body[2].Cells[1], m.Table.Body[3].Cells[1]
		if est.Num != sEst.Num || est.Stars != sEst.Stars || sec.Num != sSE.Num || !sec.Paren {
			t.Errorf("se %s: grid %v%d (%v), single %v%d (%v)", se, est.Num, est.Stars, sec.Num, sEst.Num, sEst.Stars, sSE.Num)
		}
		seen = append(seen, sec.Num)
		cell := g.Values["cells"].([]map[string]any)[i]
		if !reflect.DeepEqual(cell["values"], m.Values) {
			t.Errorf("se %s: cell values differ from the single directive", se)
		}
	}
	if tab.Body[0].Cells[1].Num != tab.Body[2].Cells[1].Num || seen[0] == seen[1] || seen[1] == seen[2] {
		t.Errorf("estimates should agree and standard errors differ across se types: %v", seen)
	}
	note := tab.Notes[0]
	for _, w := range []string{"coefficient on log(realdpi)", "the standard errors (conventional; HC1; HAC, 2 lags)", "Dependent variable: log(realcons).", "* p < 10%"} {
		if !strings.Contains(note, w) {
			t.Errorf("note lacks %q: %s", w, note)
		}
	}
	if strings.Contains(note, "heteroskedasticity-robust") {
		t.Errorf("note states one cell's standard errors as common: %s", note)
	}
}

// TestGridRegressors: x varies over lists; a term absent from a
// specification leaves its cell blank; sample varies in a two-key grid.
func TestGridRegressors(t *testing.T) {
	t.Parallel()
	body := fence("grid", "id: g\nof: ols\ny: log(realcons)\nshow: coef.infl\nover:\n  sample: [1960Q1..1984Q4, 1985Q1..2009Q3]\n  x: [[log(realdpi)], [log(realdpi), infl]]\n") +
		"\n" + fence("ols", "id: m\ny: log(realcons)\nx: [log(realdpi), infl]\nsample: 1985Q1..2009Q3\n")
	res := runDoc(t, macroProject(t, body))
	tab := res["g"].Table
	if len(tab.Body) != 4 || tab.Head[1][1].Text != "log(realdpi)" || tab.Head[1][2].Text != "log(realdpi), infl" {
		t.Fatalf("layout: %d body rows, head %+v", len(tab.Body), tab.Head)
	}
	if c := tab.Body[2].Cells[1]; c.IsNum || c.Text != "" {
		t.Errorf("term absent: cell %+v, want blank", c)
	}
	if got, want := tab.Body[2].Cells[2].Num, res["m"].Table.Body[4].Cells[1].Num; got != want {
		t.Errorf("infl in 1985Q1..2009Q3: %v, single %v", got, want)
	}
	if tab.Body[0].Cells[0].Text != "1960Q1–1984Q4" {
		t.Errorf("row label %q", tab.Body[0].Cells[0].Text)
	}
	if !strings.Contains(tab.Notes[0], "A blank cell") {
		t.Errorf("note: %s", tab.Notes[0])
	}
}

// TestGridBadInput: bad grids give an error at the right manuscript line.
// macroProject puts the fence on line 6 and the id on line 7, so the
// first line of each body below is file line 8.
func TestGridBadInput(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name, body string
		want       []string
	}{
		{"unknown kind", "of: adff\nseries: infl\nover: {lags: [1]}\n",
			[]string{"paper.md:8:", `unknown directive kind "adff"`, "did you mean adf?"}},
		{"no of", "series: infl\nover: {lags: [1]}\n",
			[]string{"paper.md:6:", `"of" is required`}},
		{"over key not in kind", "of: adf\nseries: infl\nover:\n  lag: [1, 2]\n",
			[]string{"paper.md:11:", `a adf directive has no key "lag"`, "did you mean lags?"}},
		{"empty list", "of: adf\nseries: infl\nover:\n  det: [c]\n  lags: []\n",
			[]string{"paper.md:12:", "lags: the list of values is empty"}},
		{"not a list", "of: adf\nseries: infl\nover:\n  lags: 4\n",
			[]string{"paper.md:11:", "give a list of values"}},
		{"too large", "of: adf\nseries: infl\nover:\n  lags: [0, 1, 2, 3, 4, 5, 6, 7, 8, 9]\n  det: [n, c, ct]\nmax: 20\n",
			[]string{"paper.md:13:", "30 cells (10 × 3)", "more than the 20 allowed", "max: 30"}},
		{"too large by default", "of: adf\nseries: infl\nover:\n  lags: [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12]\n  det: [n, c, ct, ctt]\n",
			[]string{"paper.md:10:", "52 cells (13 × 4)", "more than the 50 allowed"}},
		{"fixed and varied", "of: adf\nseries: infl\nlags: 2\nover:\n  lags: [1, 2]\n",
			[]string{"paper.md:12:", `"lags" is also fixed on line 10`}},
		{"unknown fixed key", "of: adf\nseries: infl\nlag: 2\nover:\n  det: [c, ct]\n",
			[]string{"paper.md:10:", `unknown key "lag" in a grid of adf`, "did you mean lags?"}},
		{"bad value in one cell", "of: adf\nseries: infl\nover:\n  det: [c, cx]\n",
			[]string{"paper.md:11:", "grid cell g[1] (det: cx)", `unknown deterministic case "cx"`}},
		{"bad type in one cell", "of: adf\nseries: infl\nover:\n  lags: [1, -2]\n",
			[]string{"paper.md:11:", "grid cell g[1] (lags: -2)", "lags must be zero or more"}},
		{"unknown column in cells", "of: ols\ny: log(realcons)\nover:\n  x: [[infl], [infll]]\n",
			[]string{"paper.md:11:", "grid cell g[1] (x: infll)", `no column "infll"`}},
		{"show unknown value", "of: adf\nseries: infl\nshow: stats\nover: {lags: [1]}\n",
			[]string{"paper.md:10:", `no value "stats"`, "did you mean stat?"}},
		{"show unknown term", "of: ols\ny: log(realcons)\nshow: coef.infll\nover: {x: [[infl]]}\n",
			[]string{"paper.md:10:", `no cell has the term "infll"`, "did you mean infl?"}},
		{"nested grid", "of: grid\nover: {of: [adf]}\n",
			[]string{"paper.md:8:", "cannot repeat another grid"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p := macroProject(t, fence("grid", "id: g\n"+strings.TrimPrefix(tc.body, "id: g\n")))
			doc, err := engine.Parse(p, engine.Options{})
			if err == nil {
				err = doc.Run()
			}
			if err == nil {
				t.Fatal("no error")
			}
			inOrder(t, err.Error(), tc.want)
		})
	}
}

// TestGridCache: with the result cache, a grid is reused while the data
// its cells read are unchanged and rerun when they change (the cells'
// reads count as the grid's own).
func TestGridCache(t *testing.T) {
	t.Parallel()
	p := writeProject(t, front+"\n"+fence("grid", "id: g\nof: ols\ny: north\nover: {x: [[fuel], [south]]}\nshow: nobs\n"),
		map[string]string{"data.csv": testCSV})
	cache := &engine.Cache{Dir: t.TempDir(), Version: "test"}
	build := func() (*engine.Document, *engine.Result) {
		t.Helper()
		doc, err := engine.Parse(p, engine.Options{Cache: cache})
		if err != nil {
			t.Fatal(err)
		}
		if err := doc.Run(); err != nil {
			t.Fatal(err)
		}
		return doc, doc.Results()[0]
	}
	build()
	if doc, _ := build(); len(doc.Reused()) != 1 {
		t.Errorf("unchanged data: reused %v, want [g]", doc.Reused())
	}
	// Change only the column that the second cell reads.
	changed := strings.Replace(testCSV, "2004-08,65,74,", "2004-08,65,80,", 1)
	if err := os.WriteFile(filepath.Join(filepath.Dir(p), "data.csv"), []byte(changed), 0o644); err != nil {
		t.Fatal(err)
	}
	doc, res := build()
	if len(doc.Reused()) != 0 {
		t.Errorf("a column read by a cell changed, yet the grid was reused")
	}
	cells := res.Values["cells"].([]map[string]any)
	coef := cells[1]["values"].(map[string]any)["coef"].([]map[string]any)
	fresh := runDoc(t, p)["g"].Values["cells"].([]map[string]any)[1]["values"].(map[string]any)["coef"].([]map[string]any)
	if coef[1]["est"] != fresh[1]["est"] {
		t.Errorf("rerun grid %v, fresh build %v", coef[1]["est"], fresh[1]["est"])
	}
}

// TestGridJohansenTrace: a grid showing a Johansen trace statistic stars
// each cell by that statistic's own critical values (crit_trace.0: a
// star for each of 10%, 5%, 1% whose value the statistic exceeds); the
// headers are in words (the sample as a span of dates, the shown value
// as "trace statistic, r = 0"), and the note names the deterministic
// terms and T.
func TestGridJohansenTrace(t *testing.T) {
	t.Parallel()
	body := fence("grid", "id: g\nof: johansen\nseries: [infl, tbilrate]\nlags: 1\nshow: trace.0\nover:\n  sample: [1959Q1.., ..1999Q4]\n")
	res := runDoc(t, macroProject(t, body))
	g := res["g"]
	tab := g.Table
	if h := tab.Head[0]; h[0].Text != "Sample" || h[1].Text != "trace statistic, r = 0" {
		t.Errorf("head %+v", h)
	}
	if a, b := tab.Body[0].Cells[0].Text, tab.Body[1].Cells[0].Text; a != "from 1959Q1" || b != "to 1999Q4" {
		t.Errorf("row labels %q, %q", a, b)
	}
	starred := 0
	for i, cell := range g.Values["cells"].([]map[string]any) {
		v := cell["values"].(map[string]any)
		stat := v["trace"].([]float64)[0]
		crit := v["crit_trace"].([]map[string]any)[0]
		want := 0
		for _, l := range []string{"10%", "5%", "1%"} {
			if stat > crit[l].(float64) {
				want++
			}
		}
		got := tab.Body[i].Cells[1]
		if got.Num != stat || got.Stars != want {
			t.Errorf("cell %d: shows %v with %d stars, want %v with %d (crit %v)", i, got.Num, got.Stars, stat, want, crit)
		}
		starred += want
	}
	if starred == 0 {
		t.Errorf("no cell rejects: the check of the stars is empty")
	}
	note := tab.Notes[0]
	for _, w := range []string{"Shown: the trace statistic, r = 0 (trace.0).", "Varying by row: the sample (from 1959Q1; to 1999Q4).", "Deterministic terms: ", "; T = ", "Stars: the test rejects its null"} {
		if !strings.Contains(note, w) {
			t.Errorf("note lacks %q: %s", w, note)
		}
	}
	if strings.Contains(note, "*, **, ***") {
		t.Errorf("the cells' own star legend is repeated beside the grid's: %s", note)
	}
}
