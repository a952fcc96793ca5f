package kinds

import (
	"encoding/csv"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/coint"
	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/unitroot"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/write/html"
	"github.com/galley-econ/galley/write/latex"
	"github.com/galley-econ/galley/write/markdown"
)

// The wiring tests run testdata/render/coint/gridlink.md (the demo's
// generated data, see examples/gridlink/gen) and compare what reaches the
// results with direct calls of the analysis packages on the same series.
// The analysis packages themselves are checked against statsmodels and
// urca in their own tests; here only the wiring is at stake, so the
// numbers must agree exactly.

const cointManuscript = "../testdata/render/coint/gridlink.md"

// gridlink holds the demo data in logs, with its dates.
type gridlink struct {
	dates              []string
	north, south, fuel []float64
}

func readGridlink(t *testing.T) gridlink {
	t.Helper()
	f, err := os.Open("../examples/gridlink/data/gridlink.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	var g gridlink
	for _, r := range recs[1:] {
		g.dates = append(g.dates, r[0])
		for i, dst := range []*[]float64{&g.north, &g.south, &g.fuel} {
			v, err := strconv.ParseFloat(r[1+i], 64)
			if err != nil {
				t.Fatal(err)
			}
			*dst = append(*dst, math.Log(v))
		}
	}
	return g
}

// window cuts the series to the dates from..to (inclusive).
func (g gridlink) window(from, to string) gridlink {
	i, j := 0, len(g.dates)-1
	for g.dates[i] != from {
		i++
	}
	for g.dates[j] != to {
		j--
	}
	return gridlink{g.dates[i : j+1], g.north[i : j+1], g.south[i : j+1], g.fuel[i : j+1]}
}

var cointDoc *engine.Document

// cointResults runs the wiring manuscript once per test binary.
func cointResults(t *testing.T) *engine.Document {
	t.Helper()
	if cointDoc != nil {
		return cointDoc
	}
	doc, err := engine.Parse(cointManuscript, engine.Options{AllowOutside: true})
	if err != nil {
		t.Fatal(err)
	}
	if err := doc.Run(); err != nil {
		t.Fatal(err)
	}
	cointDoc = doc
	return doc
}

func resultByID(t *testing.T, d *engine.Document, id string) *engine.Result {
	t.Helper()
	for _, r := range d.Results() {
		if r.ID == id {
			return r
		}
	}
	t.Fatalf("no result %q", id)
	return nil
}

func near(a, b float64) bool {
	if math.IsNaN(a) || math.IsNaN(b) {
		return math.IsNaN(a) && math.IsNaN(b)
	}
	return math.Abs(a-b) <= 1e-12*math.Max(1, math.Abs(b))
}

func wantNum(t *testing.T, what string, got any, want float64) {
	t.Helper()
	var g float64
	switch x := got.(type) {
	case float64:
		g = x
	case int:
		g = float64(x)
	default:
		t.Fatalf("%s: got %T %v, want a number", what, got, got)
	}
	if !near(g, want) {
		t.Errorf("%s = %.15g, want %.15g", what, g, want)
	}
}

// runBad builds a manuscript expected to fail and checks the error text
// contains each of want in order.
func runBad(t *testing.T, doc string, files map[string]string, want ...string) {
	t.Helper()
	p := writeProject(t, doc, files)
	d, err := engine.Parse(p, engine.Options{})
	if err == nil {
		err = d.Run()
	}
	if err == nil {
		t.Fatal("no error")
	}
	inOrder(t, err.Error(), want)
}

// checkEG compares an engle-granger result (or one of its rows) with
// the analysis result.
func checkEG(t *testing.T, what string, v map[string]any, r *coint.EGResult, names []string) {
	t.Helper()
	wantNum(t, what+".stat", v["stat"], r.Stat)
	wantNum(t, what+".pvalue", v["pvalue"], r.PValue)
	wantNum(t, what+".lags", v["lags"], float64(r.Lags))
	wantNum(t, what+".nobs", v["nobs"], float64(r.NObs))
	crit := v["crit"].(map[string]any)
	for _, cv := range r.Crit {
		wantNum(t, what+".crit."+contract.Pct(cv.Level), crit[contract.Pct(cv.Level)], cv.Value)
	}
	if v["crit_source"] != r.CritSource {
		t.Errorf("%s.crit_source = %v, want %v", what, v["crit_source"], r.CritSource)
	}
	static := v["static"].(map[string]any)
	if len(static) != len(names) {
		t.Errorf("%s.static has %d terms, want %v", what, len(static), names)
	}
	for i, n := range names {
		wantNum(t, what+".static."+n, static[n], r.Coef[i])
	}
	cv5, _ := contract.CritAt(r.Crit, 0.05)
	if v["reject_5"] != (r.Stat < cv5) {
		t.Errorf("%s.reject_5 = %v", what, v["reject_5"])
	}
	res := v["resid"].(map[string]any)
	vals := res["values"].([]float64)
	if len(vals) != len(r.Resid) || len(res["dates"].([]string)) != len(vals) {
		t.Fatalf("%s.resid has %d values, want %d", what, len(vals), len(r.Resid))
	}
	for i := range vals {
		if !near(vals[i], r.Resid[i]) {
			t.Fatalf("%s.resid[%d] = %g, want %g", what, i, vals[i], r.Resid[i])
		}
	}
}

func TestEngleGrangerWiring(t *testing.T) {
	t.Parallel()
	doc := cointResults(t)
	g := readGridlink(t)

	// Default: det c, AIC with the default maximum, full sample.
	r, err := coint.EngleGranger(g.north, [][]float64{g.fuel}, critical.Const, unitroot.LagRule{Select: unitroot.AIC, Max: -1})
	if err != nil {
		t.Fatal(err)
	}
	v := resultByID(t, doc, "eg").Values
	checkEG(t, "eg", v, r, []string{"const", "log(fuel)"})
	if d := v["resid"].(map[string]any)["dates"].([]string); d[0] != "2004-01" || d[len(d)-1] != "2025-12" {
		t.Errorf("eg resid dates %s..%s", d[0], d[len(d)-1])
	}
	if v["det"] != "c" || v["vars"] != 2 {
		t.Errorf("eg det %v vars %v", v["det"], v["vars"])
	}

	// normalize: all with det ct, fixed lags and a sample: one row per
	// dependent, in the order y, x...
	w := g.window("2005-01", "2024-12")
	lr := unitroot.LagRule{Select: unitroot.Fixed, Lags: 2}
	vars := [][]float64{w.south, w.north, w.fuel}
	names := []string{"log(south)", "log(north)", "log(fuel)"}
	all := resultByID(t, doc, "eg_all")
	each := all.Values["each"].([]map[string]any)
	if len(each) != 3 {
		t.Fatalf("eg_all has %d rows", len(each))
	}
	for i := range vars {
		var x [][]float64
		terms := []string{"const", "trend"}
		for j := range vars {
			if j != i {
				x = append(x, vars[j])
				terms = append(terms, names[j])
			}
		}
		r, err := coint.EngleGranger(vars[i], x, critical.ConstTrend, lr)
		if err != nil {
			t.Fatal(err)
		}
		if each[i]["name"] != names[i] {
			t.Errorf("row %d is %v, want %s", i, each[i]["name"], names[i])
		}
		checkEG(t, "eg_all."+names[i], each[i], r, terms)
		if i == 0 {
			checkEG(t, "eg_all (top level)", all.Values, r, terms)
		}
	}
	if len(all.Table.Body) != 3 {
		t.Errorf("eg_all table has %d rows, want one per normalisation", len(all.Table.Body))
	}
	if s := all.Values["sample"].(map[string]any); s["from"] != "2005-01" || s["n"] != 240 {
		t.Errorf("eg_all sample %v", s)
	}

	// BIC with a maximum.
	r, err = coint.EngleGranger(g.south, [][]float64{g.north}, critical.Const, unitroot.LagRule{Select: unitroot.BIC, Max: 6})
	if err != nil {
		t.Fatal(err)
	}
	checkEG(t, "eg_south", resultByID(t, doc, "eg_south").Values, r, []string{"const", "log(north)"})
}

// TestEngleGrangerTable: the static block has no stars and no standard
// errors, the statistic has stars by the critical values, and the notes
// name the source with N, the case and T.
func TestEngleGrangerTable(t *testing.T) {
	t.Parallel()
	res := resultByID(t, cointResults(t), "eg")
	tab := res.Table
	row := tab.Body[0].Cells
	if len(tab.Body) != 1 || len(row) != 10 {
		t.Fatalf("table shape %d×%d", len(tab.Body), len(row))
	}
	stat := res.Values["stat"].(float64)
	if row[1].Num != stat || row[1].Stars != 3 {
		t.Errorf("statistic cell %+v (stat %g should have three stars)", row[1], stat)
	}
	for _, c := range row[8:] {
		if c.Stars != 0 || c.Paren {
			t.Errorf("static cell %+v has stars or parentheses", c)
		}
	}
	notes := strings.Join(tab.Notes, " ")
	for _, w := range []string{"MacKinnon (2010)", "N = 2 variables", "case c", "T = 263", "not valid for inference", "p < 10%", "N = 264"} {
		if !strings.Contains(notes, w) {
			t.Errorf("notes lack %q: %s", w, notes)
		}
	}
}

// TestEngleGrangerOddNames: series names with characters special to
// Markdown, HTML and LaTeX are escaped in every output.
func TestEngleGrangerOddNames(t *testing.T) {
	t.Parallel()
	csvText := syntheticCSV("price_a&b", "cost #1 <x>", gridlinkSynthetic(60, -0.5))
	doc := front + "\n" + fence("engle-granger", "id: odd\ny: \"`price_a&b`\"\nx: [\"`cost #1 <x>`\"]\nlags: 0\n")
	p := writeProject(t, doc, map[string]string{"data.csv": csvText})
	d, err := engine.Parse(p, engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := d.Run(); err != nil {
		t.Fatal(err)
	}
	html, err := html.Write(d, html.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(html), "cost #1 &lt;x&gt;") || strings.Contains(string(html), "<x>") {
		t.Errorf("HTML does not escape the odd name")
	}
	tex, err := latex.Write(d, latex.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(tex), `price\_a\&b`) || !strings.Contains(string(tex), `cost \#1 \textless{}x\textgreater{}`) {
		t.Errorf("LaTeX does not escape the odd names")
	}
	md, err := markdown.Write(d, markdown.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(md), `price\_a\&b`) || !strings.Contains(string(md), `\<x\>`) {
		t.Errorf("Markdown does not escape the odd names:\n%s", md)
	}
	st := resultByID(t, d, "odd").Values["static"].(map[string]any)
	if _, ok := st["`cost #1 <x>`"]; !ok {
		t.Errorf("static terms %v", st)
	}
}

func pad2(i int) string {
	if i < 10 {
		return "0" + strconv.Itoa(i)
	}
	return strconv.Itoa(i)
}

// synthetic is a small cointegrated pair: x a random walk and
// y_t = 1 + 2x_t + u_t with u_t = (1+α)u_{t−1} + e_t (deterministic
// pseudo-random draws, so the test data are fixed).
type synthetic struct{ y, x []float64 }

func gridlinkSynthetic(n int, alpha float64) synthetic {
	var s synthetic
	state := uint64(12345)
	draw := func() float64 {
		// xorshift; uniform on (−0.5, 0.5)
		state ^= state << 13
		state ^= state >> 7
		state ^= state << 17
		return float64(state%1000000)/1e6 - 0.5
	}
	x, u := 0.0, 0.0
	for i := 0; i < n; i++ {
		x += draw()
		u = (1+alpha)*u + 0.3*draw()
		s.x = append(s.x, x)
		s.y = append(s.y, 1+2*x+u)
	}
	return s
}

// syntheticCSV writes a synthetic pair as monthly data from 2001-01.
func syntheticCSV(yname, xname string, s synthetic) string {
	var b strings.Builder
	b.WriteString("date," + yname + "," + xname + "\n")
	for i := range s.y {
		b.WriteString(strconv.Itoa(2001+i/12) + "-" + pad2(i%12+1) + "," + strconv.FormatFloat(s.y[i], 'g', 17, 64) + "," + strconv.FormatFloat(s.x[i], 'g', 17, 64) + "\n")
	}
	return b.String()
}

func TestEngleGrangerBadInput(t *testing.T) {
	t.Parallel()
	csvText := syntheticCSV("y", "x", gridlinkSynthetic(80, -0.5))
	files := map[string]string{"data.csv": csvText}
	eg := func(body string) string { return front + "\n" + fence("engle-granger", body) }
	t.Run("no x", func(t *testing.T) {
		runBad(t, eg("id: e\ny: y\n"), files, "paper.md:7:", `"x" is required`)
	})
	t.Run("bad det", func(t *testing.T) {
		runBad(t, eg("id: e\ny: y\nx: [x]\ndet: cc\n"), files, "paper.md:11:", `unknown deterministic case "cc"`)
	})
	t.Run("bad normalize", func(t *testing.T) {
		runBad(t, eg("id: e\ny: y\nx: [x]\nnormalize: each\n"), files, "paper.md:11:", "normalize: write all")
	})
	t.Run("bad lags", func(t *testing.T) {
		runBad(t, eg("id: e\ny: y\nx: [x]\nlags: often\n"), files, "paper.md:11:", "lags: write a number")
	})
	t.Run("unknown key", func(t *testing.T) {
		runBad(t, eg("id: e\ny: y\nx: [x]\nnormalise: all\n"), files, "paper.md:11:", `unknown key "normalise"`, "did you mean normalize?")
	})
	t.Run("collinear", func(t *testing.T) {
		runBad(t, eg("id: e\ny: y\nx: [x, 2*x]\n"), files, "paper.md:10:", `"2*x" is perfectly collinear`)
	})
	t.Run("beyond the tables", func(t *testing.T) {
		xs := strings.Repeat("x, ", 11) + "x"
		runBad(t, eg("id: e\ny: y\nx: ["+xs+"]\n"), files, "paper.md:10:", "beyond the MacKinnon (2010)", "crit: simulate")
	})
}
