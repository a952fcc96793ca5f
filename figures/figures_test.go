package figures

import (
	"bytes"
	"fmt"
	"image/png"
	"math"
	"regexp"
	"slices"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/acf"
	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/analysis/stability"
)

func TestLinesSVG(t *testing.T) {
	ss := macro(t, "realgdp", "realcons", "realinv")
	fig, err := Lines(ss, Options{YLabel: "level"})
	if err != nil {
		t.Fatal(err)
	}
	out := save(t, fig, "lines_macro")
	doc := parseSVG(t, out["svg"])
	n := len(ss[0].Values)
	for i := range ss {
		// one data path per series (the legend thumbnail has 2 vertices)
		if got := doc.strokes(SeriesStyle(i), n); got != 1 {
			t.Errorf("series %d: %d data paths in its style, want 1", i, got)
		}
		if got := doc.strokes(SeriesStyle(i), 2); got != 2 {
			t.Errorf("series %d: %d paths incl. legend, want 2", i, got)
		}
	}
	// 1959Q1–2009Q3: decades.
	if got, want := doc.xLabels(), []string{"1960", "1970", "1980", "1990", "2000"}; !slices.Equal(got, want) {
		t.Errorf("x tick labels %v, want %v", got, want)
	}
	// y ticks cover the data: realinv min ≈ 259.8, realgdp max ≈ 13415.3.
	var ys []float64
	for _, tx := range doc.texts {
		if slices.Contains(doc.xLabels(), tx.text) {
			continue
		}
		if v := numbers([]string{tx.text}); len(v) == 1 {
			ys = append(ys, v[0])
		}
	}
	lo, hi := slices.Min(ys), slices.Max(ys)
	if lo > 259.8 || lo < 259.8-2500 || hi < 13415.3-2500 || hi > 13415.3 {
		t.Errorf("y tick labels run %v..%v, want a span just inside the padded data range 259.8..13415.3", lo, hi)
	}
	for _, name := range []string{"realgdp", "realcons", "realinv", "level"} {
		if !slices.ContainsFunc(doc.texts, func(x svgText) bool { return x.text == name }) {
			t.Errorf("no text %q in the SVG", name)
		}
	}
}

func TestPDFStructure(t *testing.T) {
	ss := macro(t, "unemp", "infl")
	fig, err := Panels([]Panel{{Series: ss[:1]}, {Series: ss[1:]}}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	b, err := fig.Render("pdf", 0)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.HasPrefix(b, []byte("%PDF-1.")) {
		t.Errorf("no PDF header: %q", b[:min(10, len(b))])
	}
	for _, key := range []string{"xref", "trailer", "startxref", "%%EOF"} {
		if !bytes.Contains(b, []byte(key)) {
			t.Errorf("PDF lacks %q", key)
		}
	}
	pages := regexp.MustCompile(`/Type\s*/Page[^s]`).FindAll(b, -1)
	if len(pages) != 1 {
		t.Errorf("%d page objects, want 1", len(pages))
	}
	if m := regexp.MustCompile(`/Count\s+(\d+)`).FindSubmatch(b); m == nil || string(m[1]) != "1" {
		t.Errorf("page tree count %q, want 1", m)
	}
	// No clock in the file: the same figure is the same bytes at any time.
	for _, key := range []string{"/CreationDate (D:20000101000000)", "/ModDate (D:20000101000000)"} {
		if !bytes.Contains(b, []byte(key)) {
			t.Errorf("PDF lacks %q (the build's time would make every build's file differ)", key)
		}
	}
	if again, _ := fig.Render("pdf", 0); !bytes.Equal(again, b) {
		t.Error("the same figure rendered twice gave different PDF bytes")
	}
	// MediaBox in points: 3.4 in × (2 × 1.5 in).
	if !bytes.Contains(b, []byte("/MediaBox [0 0 244.80 216.00]")) {
		t.Errorf("unexpected MediaBox: %q", regexp.MustCompile(`/MediaBox \[[^\]]*\]`).Find(b))
	}
}

func TestPNGSize(t *testing.T) {
	ss := macro(t, "realgdp")
	for _, c := range []struct {
		w, h float64
		dpi  int
	}{{0, 0, 96}, {0, 0, 300}, {6.5, 3, 150}} {
		fig, err := Lines(ss, Options{Width: c.w, Height: c.h})
		if err != nil {
			t.Fatal(err)
		}
		var buf bytes.Buffer
		if err := fig.WritePNG(&buf, c.dpi); err != nil {
			t.Fatal(err)
		}
		img, err := png.Decode(&buf)
		if err != nil {
			t.Fatal(err)
		}
		w, h := c.w, c.h
		if w == 0 {
			w, h = DefaultWidth, DefaultHeight
		}
		wantW, wantH := int(math.Round(w*float64(c.dpi))), int(math.Round(h*float64(c.dpi)))
		if b := img.Bounds(); b.Dx() != wantW || b.Dy() != wantH {
			t.Errorf("%v in at %d dpi: %dx%d px, want %dx%d", w, c.dpi, b.Dx(), b.Dy(), wantW, wantH)
		}
	}
}

func labelsOf(d DateTicks, lo, hi float64) []string {
	var out []string
	for _, tk := range d.Ticks(lo, hi) {
		if tk.Label != "" {
			out = append(out, tk.Label)
		}
	}
	return out
}

// A monthly series 2004-01..2025-12 spans 21.9 years: yearly labels are
// too many for the default 6, every 2 years gives 11, every 4 years six:
// 2004, 2008, …, 2024.
func TestMonthlyDateTicks(t *testing.T) {
	s := monthly("m", 2004, 2025, wave)
	lo, hi := s.Dates[0].Decimal(), s.Dates[len(s.Dates)-1].Decimal()
	want := []string{"2004", "2008", "2012", "2016", "2020", "2024"}
	if got := labelsOf(DateTicks{Freq: series.Monthly}, lo, hi); !slices.Equal(got, want) {
		t.Errorf("labels %v, want %v", got, want)
	}
	fig, err := Lines([]series.Series{s}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	b, err := fig.Render("svg", 0)
	if err != nil {
		t.Fatal(err)
	}
	if got := parseSVG(t, b).xLabels(); !slices.Equal(got, want) {
		t.Errorf("SVG x labels %v, want %v", got, want)
	}
}

func TestDateTickRules(t *testing.T) {
	cases := []struct {
		name   string
		d      DateTicks
		lo, hi float64
		want   []string
	}{
		// 18 months: quarterly steps give 6 labels.
		{"monthly 2019-01..2020-06", DateTicks{Freq: series.Monthly}, 2019, 2020 + 5.0/12,
			[]string{"2019-01", "2019-04", "2019-07", "2019-10", "2020-01", "2020-04"}},
		// 3 years of months: every 6 months.
		{"monthly 2018-01..2020-12", DateTicks{Freq: series.Monthly}, 2018, 2020 + 11.0/12,
			[]string{"2018-01", "2018-07", "2019-01", "2019-07", "2020-01", "2020-07"}},
		{"quarterly 2019Q1..2020Q2", DateTicks{Freq: series.Quarterly}, 2019, 2020.25,
			[]string{"2019Q1", "2019Q2", "2019Q3", "2019Q4", "2020Q1", "2020Q2"}},
		{"quarterly 1959Q1..2009Q3", DateTicks{Freq: series.Quarterly}, 1959, 2009.5,
			[]string{"1960", "1970", "1980", "1990", "2000"}},
		{"annual 1870..2020", DateTicks{Freq: series.Annual}, 1870, 2020,
			[]string{"1875", "1900", "1925", "1950", "1975", "2000"}},
		{"annual 1990..1995", DateTicks{Freq: series.Annual}, 1990, 1995,
			[]string{"1990", "1991", "1992", "1993", "1994", "1995"}},
		{"more labels allowed", DateTicks{Freq: series.Monthly, MaxLabels: 12}, 2004, 2025 + 11.0/12,
			[]string{"2004", "2006", "2008", "2010", "2012", "2014", "2016", "2018", "2020", "2022", "2024"}},
		{"undated 1..120", DateTicks{Freq: series.Undated}, 1, 120,
			[]string{"20", "40", "60", "80", "100", "120"}},
	}
	for _, c := range cases {
		if got := labelsOf(c.d, c.lo, c.hi); !slices.Equal(got, c.want) {
			t.Errorf("%s: labels %v, want %v", c.name, got, c.want)
		}
	}
}

func TestResidualsAndFitted(t *testing.T) {
	ss := macro(t, "realcons", "realdpi")
	// a stand-in "fitted" series: 0.9·income; the residual is their gap
	fitted := series.Series{Name: "", Dates: ss[1].Dates}
	resid := series.Series{Name: "gap", Dates: ss[0].Dates}
	for i, v := range ss[1].Values {
		fitted.Values = append(fitted.Values, 0.9*v)
		resid.Values = append(resid.Values, ss[0].Values[i]-0.9*v)
	}
	fig, err := Residuals(resid, Options{})
	if err != nil {
		t.Fatal(err)
	}
	doc := parseSVG(t, save(t, fig, "residuals")["svg"])
	if got := doc.strokes(SeriesStyle(0), len(resid.Values)); got != 1 {
		t.Errorf("%d residual paths, want 1", got)
	}
	if got := doc.strokes(refLine(), 2); got != 1 {
		t.Errorf("%d zero lines, want 1", got)
	}
	fig, err = ActualFitted(ss[0], fitted, Options{})
	if err != nil {
		t.Fatal(err)
	}
	doc = parseSVG(t, save(t, fig, "actual_fitted")["svg"])
	for i := 0; i < 2; i++ {
		if got := doc.strokes(SeriesStyle(i), len(fitted.Values)); got != 1 {
			t.Errorf("line %d: %d paths, want 1", i, got)
		}
	}
	if !slices.ContainsFunc(doc.texts, func(x svgText) bool { return x.text == "fitted" }) {
		t.Error("no legend entry for the unnamed fitted series")
	}
}

func TestCorrelogramFigure(t *testing.T) {
	x := macro(t, "infl")[0].Values
	c, err := acf.Compute(x, 16)
	if err != nil {
		t.Fatal(err)
	}
	fig, err := Correlogram(c, Options{XLabel: "lag"})
	if err != nil {
		t.Fatal(err)
	}
	if fig.Panels() != 2 {
		t.Fatalf("%d panels, want 2", fig.Panels())
	}
	doc := parseSVG(t, save(t, fig, "correlogram")["svg"])
	if got := doc.fills(barFill); got != 32 {
		t.Errorf("%d bars, want 2 × 16", got)
	}
	if got := doc.strokes(bandStyle(), 2); got != 4 {
		t.Errorf("%d band lines, want 4", got)
	}
	if got, want := doc.xLabels(), []string{"2", "4", "6", "8", "10", "12", "14", "16"}; !slices.Equal(got, want) {
		t.Errorf("lag labels %v, want %v", got, want)
	}
	for _, l := range []string{"ACF", "PACF", "lag"} {
		if !slices.ContainsFunc(doc.texts, func(x svgText) bool { return x.text == l }) {
			t.Errorf("no text %q", l)
		}
	}
}

func TestStabilityFigures(t *testing.T) {
	ss := macro(t, "realcons", "realdpi", "tbilrate")
	n := len(ss[0].Values)
	y := make([]float64, n)
	X := mat.NewDense(n, 3, nil)
	for i := 0; i < n; i++ {
		y[i] = math.Log(ss[0].Values[i])
		X.Set(i, 0, 1)
		X.Set(i, 1, math.Log(ss[1].Values[i]))
		X.Set(i, 2, ss[2].Values[i])
	}
	r, err := stability.Compute(y, X)
	if err != nil {
		t.Fatal(err)
	}
	dates := ss[0].Dates
	est, lo, hi, err := r.CoefBand(1)
	if err != nil {
		t.Fatal(err)
	}
	// drop the first few wildly uncertain estimates, as a caller would
	for i := 0; i < 12; i++ {
		est[i], lo[i], hi[i] = math.NaN(), math.NaN(), math.NaN()
	}
	fig, err := RecursiveCoef(dates, est, lo, hi, Options{})
	if err != nil {
		t.Fatal(err)
	}
	doc := parseSVG(t, save(t, fig, "recursive_coef")["svg"])
	if got := doc.fills(bandFill); got != 1 {
		t.Errorf("%d band areas, want 1", got)
	}
	if got := doc.strokes(SeriesStyle(0), n-12); got != 1 {
		t.Errorf("%d estimate paths, want 1", got)
	}

	band, err := r.CUSUMBand(0.05)
	if err != nil {
		t.Fatal(err)
	}
	fig, err = CUSUM(dates, r.CUSUM(), band, Options{})
	if err != nil {
		t.Fatal(err)
	}
	doc = parseSVG(t, save(t, fig, "cusum")["svg"])
	if got := doc.strokes(bandStyle(), n-r.First); got != 2 {
		t.Errorf("%d CUSUM band lines, want 2", got)
	}
	if got := doc.strokes(SeriesStyle(0), n-r.First); got != 1 {
		t.Errorf("%d CUSUM paths, want 1", got)
	}
	// the vertical axis must hold the band's ends ±3a√n: the labelled
	// ticks reach to within one tick step of them
	end := band[n-1]
	ys := numbers(labelsNotOn(doc))
	slices.Sort(ys)
	step := ys[1] - ys[0]
	if ys[len(ys)-1]+step < end || ys[0]-step > -end {
		t.Errorf("y ticks %v do not reach the band ±%.1f", ys, end)
	}

	sqlo, sqhi, err := r.CUSUMSquaresBand(0.05)
	if err != nil {
		t.Fatal(err)
	}
	fig, err = CUSUMSquares(dates, r.CUSUMSquares(), sqlo, sqhi, Options{})
	if err != nil {
		t.Fatal(err)
	}
	doc = parseSVG(t, save(t, fig, "cusum_squares")["svg"])
	if got := doc.strokes(bandStyle(), n-r.First); got != 2 {
		t.Errorf("%d CUSUM-of-squares band lines, want 2", got)
	}
}

// labelsNotOn returns the texts that are not x tick labels.
func labelsNotOn(d svgDoc) []string {
	xs := d.xLabels()
	var out []string
	for _, t := range d.texts {
		if !slices.Contains(xs, t.text) {
			out = append(out, t.text)
		}
	}
	return out
}

func TestBadInput(t *testing.T) {
	q := func(y, s int) series.Date { return series.Date{Freq: series.Quarterly, Year: y, Sub: s} }
	m := func(y, s int) series.Date { return series.Date{Freq: series.Monthly, Year: y, Sub: s} }
	good := series.Series{Name: "a", Dates: []series.Date{q(2000, 1), q(2000, 2)}, Values: []float64{1, 2}}
	cases := []struct {
		name string
		f    func() (*Figure, error)
	}{
		{"no series", func() (*Figure, error) { return Lines(nil, Options{}) }},
		{"length mismatch", func() (*Figure, error) {
			return Lines([]series.Series{{Dates: good.Dates, Values: []float64{1}}}, Options{})
		}},
		{"all missing", func() (*Figure, error) {
			return Lines([]series.Series{{Dates: good.Dates, Values: []float64{math.NaN(), math.NaN()}}}, Options{})
		}},
		{"mixed frequencies", func() (*Figure, error) {
			return Lines([]series.Series{good, {Dates: []series.Date{m(2000, 1)}, Values: []float64{1}}}, Options{})
		}},
		{"dates not increasing", func() (*Figure, error) {
			return Lines([]series.Series{{Dates: []series.Date{q(2000, 2), q(2000, 1)}, Values: []float64{1, 2}}}, Options{})
		}},
		{"too many series", func() (*Figure, error) {
			return Lines(slices.Repeat([]series.Series{good}, MaxSeries+1), Options{})
		}},
		{"bad size", func() (*Figure, error) { return Lines([]series.Series{good}, Options{Width: -1}) }},
		{"backwards window", func() (*Figure, error) {
			return Lines([]series.Series{good}, Options{Shade: []Window{{From: q(2000, 2), To: q(1999, 1)}}})
		}},
		{"band length", func() (*Figure, error) { return CUSUM(good.Dates, good.Values, []float64{1}, Options{}) }},
		{"nil correlogram", func() (*Figure, error) { return Correlogram(nil, Options{}) }},
	}
	for _, c := range cases {
		if _, err := c.f(); err == nil {
			t.Errorf("%s: no error", c.name)
		}
	}
	fig, err := Lines([]series.Series{good}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if _, err := fig.Render("gif", 0); err == nil {
		t.Error("unknown format: no error")
	}
	if err := fig.WritePNG(&bytes.Buffer{}, 100000); err == nil {
		t.Error("absurd dpi: no error")
	}
}

// TestPanelGrid: Columns sets panels in a grid, each titled by its label,
// with date labels only under the bottom row; a band's unnamed second edge
// is drawn in its first edge's style; panels that do not fill the grid are
// an error.
func TestPanelGrid(t *testing.T) {
	ss := macro(t, "realgdp", "realcons", "realinv")
	n := len(ss[0].Values)
	band := func(s series.Series, k float64) []series.Series {
		lo, hi := s, s
		lo.Name, lo.Values, hi.Name, hi.Values = "band", make([]float64, n), "", make([]float64, n)
		for i, v := range s.Values {
			lo.Values[i], hi.Values[i] = v*(1-k), v*(1+k)
		}
		return []series.Series{s, lo, hi}
	}
	var panels []Panel
	var labels []string
	for i := 0; i < 4; i++ {
		panels = append(panels, Panel{Series: band(ss[i%3], 0.1)})
		labels = append(labels, fmt.Sprintf("panel %d", i+1))
	}
	fig, err := Panels(panels, Options{Columns: 2, PanelLabels: labels, XLabel: "quarter"})
	if err != nil {
		t.Fatal(err)
	}
	doc := parseSVG(t, save(t, fig, "grid")["svg"])
	for _, l := range labels {
		if !slices.ContainsFunc(doc.texts, func(x svgText) bool { return x.text == l }) {
			t.Errorf("no title %q", l)
		}
	}
	if got := len(doc.xLabels()); got == 0 || got%2 != 0 {
		t.Errorf("%d date labels: want those of the two bottom panels", got)
	}
	if got := doc.strokes(SeriesStyle(1), n); got != 8 {
		t.Errorf("%d band edges in the band's style, want 8 (2 in each of 4 panels)", got)
	}
	if got := doc.strokes(SeriesStyle(2), n); got != 0 {
		t.Errorf("%d paths in a third style, want 0", got)
	}
	if _, err := Panels(panels[:3], Options{Columns: 2}); err == nil {
		t.Error("3 panels in 2 columns accepted")
	}
}
