package kinds

import (
	"bytes"
	"encoding/xml"
	"fmt"
	"image/color"
	"io"
	"math"
	"math/rand/v2"
	"os"
	"slices"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/figures"
	"github.com/galley-econ/galley/write/html"
	"github.com/galley-econ/galley/write/latex"
	"github.com/galley-econ/galley/write/markdown"
)

// figCSV is 72 months (2004-01..2009-12) of a seeded random walk pair
// and a noisy trend, enough for recursive residuals and a correlogram.
func figCSV() string {
	r := rand.New(rand.NewPCG(7, 11))
	var b strings.Builder
	b.WriteString("date,north,south,fuel\n")
	f, s := 100.0, 0.0
	for i := 0; i < 72; i++ {
		f += r.NormFloat64()
		s += 0.3 * r.NormFloat64()
		north := 20 + 0.5*f + r.NormFloat64()
		fmt.Fprintf(&b, "%d-%02d,%.4f,%.4f,%.4f\n", 2004+i/12, i%12+1, north, 60+s+0.1*float64(i), f)
	}
	return b.String()
}

// buildFig parses and runs a manuscript made of front matter and body.
func buildFig(t *testing.T, body string) (*engine.Document, error) {
	t.Helper()
	p := writeProject(t, front+"\n"+body, map[string]string{"data.csv": figCSV()})
	doc, err := engine.Parse(p, engine.Options{})
	if err != nil {
		return nil, err
	}
	return doc, doc.Run()
}

func mustBuild(t *testing.T, body string) *engine.Document {
	t.Helper()
	doc, err := buildFig(t, body)
	if err != nil {
		t.Fatal(err)
	}
	return doc
}

func result(t *testing.T, doc *engine.Document, id string) *engine.Result {
	t.Helper()
	for _, r := range doc.Results() {
		if r.ID == id {
			return r
		}
	}
	t.Fatalf("no result %q", id)
	return nil
}

// svgPaths parses an SVG with encoding/xml and returns, for each path,
// its style attribute and number of vertices (M and L commands).
func svgPaths(t *testing.T, b []byte) (styles []string, vertices []int) {
	t.Helper()
	dec := xml.NewDecoder(bytes.NewReader(b))
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("SVG does not parse: %v", err)
		}
		if e, ok := tok.(xml.StartElement); ok && e.Name.Local == "path" {
			var st, d string
			for _, a := range e.Attr {
				switch a.Name.Local {
				case "style":
					st = a.Value
				case "d":
					d = a.Value
				}
			}
			styles = append(styles, st)
			vertices = append(vertices, strings.Count(d, "M")+strings.Count(d, "L"))
		}
	}
	return styles, vertices
}

func hexColor(c color.Color) string {
	r, g, b, _ := c.RGBA()
	return fmt.Sprintf("#%02X%02X%02X", r>>8, g>>8, b>>8)
}

// drawnSeries counts the data lines of an SVG figure: paths stroked in a
// house series colour with at least minVertices vertices (legend
// thumbnails have two, grid lines are grey).
func drawnSeries(t *testing.T, svg []byte, minVertices int) int {
	t.Helper()
	var inks []string
	for i := 0; i < figures.MaxSeries; i++ {
		inks = append(inks, "stroke:"+hexColor(figures.SeriesStyle(i).Color))
	}
	styles, verts := svgPaths(t, svg)
	n := 0
	for i, st := range styles {
		if verts[i] < minVertices {
			continue
		}
		if slices.ContainsFunc(inks, func(ink string) bool { return strings.Contains(st, ink+";") || strings.HasSuffix(st, ink) }) {
			n++
		}
	}
	return n
}

func checkPDF(t *testing.T, pdf []byte) {
	t.Helper()
	if !bytes.HasPrefix(pdf, []byte("%PDF-")) || !bytes.Contains(pdf[max(0, len(pdf)-64):], []byte("%%EOF")) {
		t.Errorf("PDF lacks its header or trailer (%d bytes)", len(pdf))
	}
}

func TestFigureLinesPanels(t *testing.T) {
	t.Parallel()
	body := "See {{lv.label}} and {{pn.label}}.\n\n" +
		fence("ols", "id: m\ndata: grid\ny: north\nx: [fuel]\n") + "\n" +
		fence("figure", "id: lv\ndata: grid\nseries: [log(north), log(south), log(fuel)]\ncaption: Levels\nshade: [{from: 2008-09, to: 2009-06}]\n") + "\n" +
		fence("figure", "id: pn\ndata: grid\npanels:\n  - [north, south]\n  - [fuel]\nylabels: [Price, Index]\nsample: 2005-01..2008-12\nwidth: 5\n")
	doc := mustBuild(t, body)
	lv, pn := result(t, doc, "lv"), result(t, doc, "pn")
	if lv.Number != 1 || pn.Number != 2 || lv.Label() != "Figure 1" {
		t.Errorf("numbers %d, %d (label %q), want 1, 2", lv.Number, pn.Number, lv.Label())
	}
	if got := drawnSeries(t, lv.Figure.SVG, 72); got != 3 {
		t.Errorf("levels figure draws %d series of 72 points, want 3", got)
	}
	if got := drawnSeries(t, pn.Figure.SVG, 48); got != 3 {
		t.Errorf("panel figure draws %d series of 48 points, want 3", got)
	}
	checkPDF(t, lv.Figure.PDF)
	checkPDF(t, pn.Figure.PDF)
	if pn.Figure.Width != 5 || pn.Figure.Height != 2*figures.DefaultPanelHeight {
		t.Errorf("panel figure is %g × %g in, want 5 × %g", pn.Figure.Width, pn.Figure.Height, 2*figures.DefaultPanelHeight)
	}
	png, err := lv.Figure.RenderPNG(72)
	if err != nil || !bytes.HasPrefix(png, []byte("\x89PNG")) {
		t.Errorf("PNG: %v (%d bytes)", err, len(png))
	}
	smp := pn.Values["sample"].(map[string]any)
	if smp["from"] != "2005-01" || smp["to"] != "2008-12" || smp["n"] != 48 {
		t.Errorf("panel sample values %v, want 2005-01..2008-12, n 48", smp)
	}
	names := []string{}
	for _, s := range lv.Values["series"].([]map[string]any) {
		names = append(names, s["name"].(string))
	}
	if !slices.Equal(names, []string{"log(north)", "log(south)", "log(fuel)"}) {
		t.Errorf("series names %v", names)
	}
	if f := lv.Values["files"].(map[string]any); f["svg"] != "figures/lv.svg" || f["pdf"] != "figures/lv.pdf" {
		t.Errorf("files %v", f)
	}
	// writers: inline SVG with a numbered caption, a PDF include, an SVG link
	h, err := html.Write(doc, html.Options{})
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{`<a class="xref" href="#fig-lv">Figure 1</a>`, `href="#fig-pn">Figure 2</a>`, `<figure class="result" id="fig-lv" style="--figure-width: 52.3%">`, `<span class="label">Figure 1.</span> Levels`, "<svg"} {
		if !bytes.Contains(h, []byte(want)) {
			t.Errorf("HTML lacks %q", want)
		}
	}
	if bytes.Contains(h, []byte("http://")) || bytes.Contains(h, []byte("<?xml")) {
		t.Errorf("inline SVG keeps its XML declaration or namespace addresses")
	}
	tex, err := latex.Write(doc, latex.Options{FigureDir: engine.FigureFolder})
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{`\includegraphics[width=3.40in]{figures/lv.pdf}`, `\includegraphics[width=5.00in]{figures/pn.pdf}`, `\label{fig:lv}`, `Figure~\ref{fig:pn}`} {
		if !bytes.Contains(tex, []byte(want)) {
			t.Errorf("LaTeX lacks %q", want)
		}
	}
	md, err := markdown.Write(doc, markdown.Options{FigureDir: engine.FigureFolder})
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Contains(md, []byte("(figures/lv.svg)")) {
		t.Errorf("Markdown does not link figures/lv.svg")
	}
}

func TestFigureResidualsAndACF(t *testing.T) {
	t.Parallel()
	body := fence("ols", "id: m\ndata: grid\ny: north\nx: [fuel]\nsample: 2004-03..\n") + "\n" +
		fence("figure", "id: e\nresiduals: m\n") + "\n" +
		fence("figure", "id: ex\ndata: grid\nseries: [north - 0.5*fuel]\nplot: residuals\n") + "\n" +
		fence("figure", "id: c\nplot: acf\nresiduals: m\nlags: 6\n")
	doc := mustBuild(t, body)
	m, e, c := result(t, doc, "m"), result(t, doc, "e"), result(t, doc, "c")
	n := m.Values["nobs"].(int)
	if n != 70 {
		t.Fatalf("ols nobs %d, want 70", n)
	}
	if got := drawnSeries(t, e.Figure.SVG, n); got != 1 {
		t.Errorf("residual figure draws %d series of %d points, want 1", got, n)
	}
	if got := drawnSeries(t, result(t, doc, "ex").Figure.SVG, 72); got != 1 {
		t.Errorf("expression residual figure draws %d series, want 1", got)
	}
	if s := e.Values["sample"].(map[string]any); s["from"] != "2004-03" || s["n"] != n {
		t.Errorf("residual sample %v", s)
	}
	if a := c.Values["acf"].([]float64); len(a) != 6 || c.Values["lags"] != 6 {
		t.Errorf("acf values %v", a)
	}
	if b := c.Values["band"].(float64); math.Abs(b-1.96/math.Sqrt(float64(n))) > 1e-12 {
		t.Errorf("acf band %g, want 1.96/√%d", b, n)
	}
	checkPDF(t, c.Figure.PDF)
	if got := drawnSeries(t, c.Figure.SVG, 2); got != 0 {
		t.Errorf("correlogram draws %d lines in series ink, want none (bars only)", got)
	}
}

// TestFigureCUSUMBand: the band in a built CUSUM figure's values is the
// line of Brown, Durbin and Evans (1975, section 2.3),
// a(√(T−k) + 2(t−k)/√(T−k)) for t = k+1..T, with a = 0.948 for a 5% test
// (their published constant, given to three decimals; hence the
// tolerance of half a unit in the third decimal of a).
func TestFigureCUSUMBand(t *testing.T) {
	t.Parallel()
	body := fence("ols", "id: m\ndata: grid\ny: north\nx: [fuel, south]\n") + "\n" +
		fence("figure", "id: cs\nplot: cusum\ndata: grid\ny: north\nx: [fuel, south]\n") + "\n" +
		fence("figure", "id: cs2\nplot: cusum\nof: m\n") + "\n" +
		fence("figure", "id: sq\nplot: cusumsq\nof: m\n") + "\n" +
		fence("figure", "id: rc\nplot: recursive\nof: m\ncoef: fuel\n") + "\n" +
		fence("figure", "id: af\nof: m\n")
	doc := mustBuild(t, body)
	const T, k, a = 72, 3, 0.948
	cs := result(t, doc, "cs")
	cu := cs.Values["cusum"].(map[string]any)
	band, dates := cu["band"].([]float64), cu["dates"].([]string)
	if len(band) != T-k || dates[0] != "2004-04" || dates[len(dates)-1] != "2009-12" {
		t.Fatalf("band has %d points from %s to %s, want %d from 2004-04 to 2009-12", len(band), dates[0], dates[len(dates)-1], T-k)
	}
	for i, got := range band {
		tt := float64(k + 1 + i)
		want := a * (math.Sqrt(T-k) + 2*(tt-k)/math.Sqrt(T-k))
		if math.Abs(got-want) > 0.0005/a*want {
			t.Fatalf("band at t = %g: %g, want %g", tt, got, want)
		}
	}
	vs, out := cu["values"].([]float64), 0
	for i, v := range vs {
		if math.Abs(v) > band[i] {
			out++
		}
	}
	if cs.Values["outside"] != out {
		t.Errorf("outside = %v, want %d points beyond the band", cs.Values["outside"], out)
	}
	if got := drawnSeries(t, cs.Figure.SVG, T-k); got != 1 {
		t.Errorf("CUSUM figure draws %d series, want 1", got)
	}
	// of: m gives the same regression
	cu2 := result(t, doc, "cs2").Values["cusum"].(map[string]any)
	if !slices.Equal(cu2["values"].([]float64), cu["values"].([]float64)) {
		t.Errorf("CUSUM from of: m differs from the one from y and x")
	}
	sq := result(t, doc, "sq").Values["cusumsq"].(map[string]any)
	if v := sq["values"].([]float64); math.Abs(v[len(v)-1]-1) > 1e-12 {
		t.Errorf("CUSUM of squares ends at %g, want 1", v[len(v)-1])
	}
	rc := result(t, doc, "rc")
	if r := rc.Values["recursive"].(map[string]any); r["term"] != "fuel" {
		t.Errorf("recursive term %v", r["term"])
	}
	if got := drawnSeries(t, result(t, doc, "af").Figure.SVG, T); got != 2 {
		t.Errorf("actual-fitted draws %d series, want 2", got)
	}
	for _, id := range []string{"sq", "rc", "af"} {
		checkPDF(t, result(t, doc, id).Figure.PDF)
	}
}

// TestFigureBadInput: each bad figure gives an error at the right line.
func TestFigureBadInput(t *testing.T) {
	t.Parallel()
	ols := fence("ols", "id: m\ndata: grid\ny: north\nx: [fuel]\n") + "\n" // lines 7–12
	desc := fence("summary-stats", "id: d\ndata: grid\nseries: [north]\n") + "\n"
	cases := []struct {
		name, body string
		want       []string
	}{
		{"unknown id", ols + fence("figure", "id: f\nresiduals: mm\n"), []string{"paper.md:16:", `no directive has id "mm"`, "did you mean m?"}},
		{"unknown of", ols + fence("figure", "id: f\nplot: cusum\nof: q\n"), []string{"paper.md:17:", `no directive has id "q"`}},
		{"of wrong kind", desc + fence("figure", "id: f\nplot: cusum\nof: d\n"), []string{"paper.md:16:", `"d" is a summary-stats result`}},
		{"no residuals", desc + fence("figure", "id: f\nresiduals: d\n"), []string{"paper.md:15:", `"d" (a summary-stats result, line 7) has no residual series`}},
		{"nothing to draw", ols + fence("figure", "id: f\ncaption: Empty\n"), []string{"paper.md:14:", "nothing to draw"}},
		{"cusum without regression", ols + fence("figure", "id: f\nplot: cusum\n"), []string{"paper.md:14:", "nothing to draw"}},
		{"window outside data", ols + fence("figure", "id: f\ndata: grid\nseries: [north]\nshade:\n  - {from: 2005-01, to: 2005-06}\n  - {from: 2001-03, to: 2001-11}\n"), []string{"paper.md:20:", "2001-03 to 2001-11 lies outside the plotted data", "2004-01 to 2009-12"}},
		{"window frequency", ols + fence("figure", "id: f\ndata: grid\nseries: [north]\nshade: [{from: 2005Q1, to: 2005Q2}]\n"), []string{"paper.md:18:", "quarterly"}},
		{"window reversed", ols + fence("figure", "id: f\ndata: grid\nseries: [north]\nshade: [{from: 2006-01, to: 2005-06}]\n"), []string{"paper.md:18:", "ends before it starts"}},
		{"unknown plot", ols + fence("figure", "id: f\ndata: grid\nseries: [north]\nplot: cusm\n"), []string{"paper.md:18:", `unknown plot "cusm"`, "did you mean cusum?"}},
		{"unknown column", ols + fence("figure", "id: f\ndata: grid\nseries: [nort]\n"), []string{"paper.md:17:", `no column "nort"`}},
		{"sample outside", ols + fence("figure", "id: f\ndata: grid\nseries: [north]\nsample: 1990-01..1995-12\n"), []string{"paper.md:18:", "starts before the data"}},
		{"too many lags", ols + fence("figure", "id: f\nplot: acf\nresiduals: m\nlags: 80\n"), []string{"paper.md:18:", "80 lags"}},
		{"of with y", ols + fence("figure", "id: f\nplot: cusum\nof: m\ny: north\n"), []string{"paper.md:18:", "drop y"}},
		{"acf of two", ols + fence("figure", "id: f\nplot: acf\ndata: grid\nseries: [north, fuel]\n"), []string{"paper.md:18:", "draws one series; 2 are given"}},
		{"bad width", ols + fence("figure", "id: f\ndata: grid\nseries: [north]\nwidth: 100\n"), []string{"paper.md:18:", "between 0.5 and 40"}},
		{"unknown coef", ols + fence("figure", "id: f\nplot: recursive\nof: m\ncoef: fual\n"), []string{"paper.md:18:", `no coefficient "fual"`, "did you mean fuel?"}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := buildFig(t, tc.body)
			if err == nil {
				t.Fatal("no error")
			}
			inOrder(t, err.Error(), tc.want)
		})
	}
}

// TestFigureJohansenRelation: residuals naming a johansen or vecm result
// draw one cointegrating relation (relation: N, default 1) as a single
// series about the zero line. (The values themselves are checked against
// analysis/johansen in TestJohansenRelationFigure.)
func TestFigureJohansenRelation(t *testing.T) {
	t.Parallel()
	body := fence("johansen", "id: sys\ndata: grid\nseries: [north, fuel, south]\ndet: constant\nlags: 1\nrank: 2\n") + "\n" +
		fence("vecm", "id: v\nfrom: sys\n") + "\n" +
		fence("figure", "id: z1\nresiduals: sys\ncaption: First relation\n") + "\n" +
		fence("figure", "id: z2\nresiduals: v\nrelation: 2\nsample: 2005-01..\n") + "\n" +
		fence("figure", "id: za\nplot: acf\nresiduals: sys\nlags: 4\n")
	doc := mustBuild(t, body)
	for _, tc := range []struct {
		id      string
		n       int
		from    string
		number  int
		nameFor string
	}{{"z1", 72, "2004-01", 1, "relation 1 of sys"}, {"z2", 60, "2005-01", 2, "relation 2 of v"}} {
		r := result(t, doc, tc.id)
		if got := drawnSeries(t, r.Figure.SVG, tc.n); got != 1 {
			t.Errorf("%s draws %d series of %d points, want 1", tc.id, got, tc.n)
		}
		// the zero line: refColor of figures/style.go (#808080), two vertices
		styles, verts := svgPaths(t, r.Figure.SVG)
		zero := 0
		for i, st := range styles {
			if strings.Contains(st, "stroke:#808080") && verts[i] == 2 {
				zero++
			}
		}
		if zero != 1 {
			t.Errorf("%s has %d zero lines, want 1", tc.id, zero)
		}
		rel := r.Values["relation"].(map[string]any)
		if rel["number"] != tc.number || len(rel["values"].([]float64)) != tc.n || rel["dates"].([]string)[0] != tc.from {
			t.Errorf("%s: relation number %v, %d values from %v; want %d, %d from %s", tc.id, rel["number"], len(rel["values"].([]float64)), rel["dates"].([]string)[0], tc.number, tc.n, tc.from)
		}
		// case c: drawn less its sample mean, so it averages zero
		var sum float64
		for _, v := range rel["values"].([]float64) {
			sum += v
		}
		if math.Abs(sum/float64(tc.n)) > 1e-12 {
			t.Errorf("%s: drawn relation has mean %g, want 0 (demeaned in case c)", tc.id, sum/float64(tc.n))
		}
		if s := r.Values["series"].([]map[string]any); len(s) != 1 || s[0]["name"] != tc.nameFor {
			t.Errorf("%s: series %v, want one named %q", tc.id, s, tc.nameFor)
		}
	}
	if a := result(t, doc, "za").Values["acf"].([]float64); len(a) != 4 {
		t.Errorf("correlogram of relation 1 has %d lags, want 4", len(a))
	}
}

// TestFigureJohansenRelationErrors: a relation out of range, a johansen
// without relations, and relation where it does not belong are errors at
// the line of the key at fault.
func TestFigureJohansenRelationErrors(t *testing.T) {
	t.Parallel()
	// front matter lines 1–5; the johansen fence is line 7, its id 8, and
	// its closing fence line 14; the figure fence is line 16, id 17,
	// residuals 18, relation 19.
	jo := fence("johansen", "id: sys\ndata: grid\nseries: [north, fuel]\ndet: constant\nlags: 1\nrank: 1\n") + "\n"
	jo0 := fence("johansen", "id: sys\ndata: grid\nseries: [south, fuel]\ndet: constant\nlags: 1\nlevel: 0.01\n") + "\n"
	ols := fence("ols", "id: sys\ndata: grid\ny: north\nx: [fuel]\nsample: 2004-01..\nconst: true\n") + "\n"
	cases := []struct {
		name, body string
		want       []string
	}{
		{"out of range", jo + fence("figure", "id: f\nresiduals: sys\nrelation: 2\n"), []string{"paper.md:19:", `relation 2: "sys" (a johansen result, line 7) has 1 cointegrating relation (rank 1); give relation: 1`}},
		{"zero", jo + fence("figure", "id: f\nresiduals: sys\nrelation: 0\n"), []string{"paper.md:19:", "numbered from 1"}},
		{"rank 0", jo0 + fence("figure", "id: f\nresiduals: sys\n"), []string{"paper.md:18:", `"sys" (a johansen result, line 7) estimates no cointegrating relation: its rank is 0`, "set rank:"}},
		{"not a system", ols + fence("figure", "id: f\nresiduals: sys\nrelation: 1\n"), []string{"paper.md:19:", `"sys" (kind ols) has none: drop relation`}},
		{"without residuals", jo + fence("figure", "id: f\ndata: grid\nseries: [north]\nrelation: 1\n"), []string{"paper.md:20:", "give residuals: ID"}},
		{"regression plot", jo + fence("figure", "id: f\nplot: cusum\ny: north\nx: [fuel]\nrelation: 1\n"), []string{"paper.md:21:", "plot cusum draws a regression"}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := buildFig(t, tc.body)
			if err == nil {
				t.Fatal("no error")
			}
			inOrder(t, err.Error(), tc.want)
		})
	}
}

// TestFigureJohansenRelationFromCache: the relation drawn from a johansen
// result reused from the cache (its values decoded from the cache file)
// equals the one drawn when the johansen ran.
func TestFigureJohansenRelationFromCache(t *testing.T) {
	t.Parallel()
	src := front + "\n" + fence("johansen", "id: sys\ndata: grid\nseries: [north, fuel]\ndet: restricted constant\nlags: 1\nrank: 1\n") + "\n" +
		fence("figure", "id: z\nresiduals: sys\n")
	p := writeProject(t, src, map[string]string{"data.csv": figCSV()})
	opts := engine.Options{Cache: &engine.Cache{Dir: t.TempDir(), Version: "test"}}
	run := func() ([]float64, *engine.Document) {
		d, err := engine.Parse(p, opts)
		if err != nil {
			t.Fatal(err)
		}
		if err := d.Run(); err != nil {
			t.Fatal(err)
		}
		return result(t, d, "z").Values["relation"].(map[string]any)["values"].([]float64), d
	}
	first, _ := run()
	if err := os.WriteFile(p, []byte(strings.Replace(src, "residuals: sys\n", "residuals: sys\ncaption: Again\n", 1)), 0o644); err != nil {
		t.Fatal(err)
	}
	second, d := run()
	if fmt.Sprint(d.Reused()) != "[sys]" {
		t.Fatalf("second build reused %v, want [sys] (the johansen from the cache)", d.Reused())
	}
	if !slices.Equal(first, second) || len(first) != 72 {
		t.Errorf("relation from the cache differs (%d and %d values)", len(first), len(second))
	}
}
