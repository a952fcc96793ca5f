package figure

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"strings"

	"gonum.org/v1/plot/vg"

	"github.com/galley-econ/galley/analysis/acf"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/analysis/stability"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/figures"
	"github.com/galley-econ/galley/manuscript"
)

// figure: a chart in the house style of package figures. What it draws
// is chosen by plot; see docs/figures.md.
type figureSpec struct {
	engine.Common `yaml:",inline"`
	Plot          string      `yaml:"plot"`
	Data          string      `yaml:"data"`
	Series        []string    `yaml:"series"`
	Panels        [][]string  `yaml:"panels"`
	Names         []string    `yaml:"names"`
	Residuals     string      `yaml:"residuals"`
	Relation      *int        `yaml:"relation"`
	Of            string      `yaml:"of"`
	Y             string      `yaml:"y"`
	X             []string    `yaml:"x"`
	Const         *bool       `yaml:"const"`
	Coef          string      `yaml:"coef"`
	Sample        string      `yaml:"sample"`
	Shade         []shadeSpec `yaml:"shade"`
	YLabel        string      `yaml:"ylabel"`
	YLabels       []string    `yaml:"ylabels"`
	XLabel        string      `yaml:"xlabel"`
	Legend        string      `yaml:"legend"`
	Width         float64     `yaml:"width"`
	Height        float64     `yaml:"height"`
	Lags          int         `yaml:"lags"`
	Alpha         float64     `yaml:"alpha"`

	notes []string // about shaded windows cut to the data
}

type shadeSpec struct {
	From string `yaml:"from"`
	To   string `yaml:"to"`
}

// The plot kinds, in the order the documentation gives them.
var plotKinds = []string{"lines", "panels", "residuals", "actual-fitted", "acf", "cusum", "cusumsq", "recursive", "multipliers"}

var legendPlaces = map[string]figures.LegendPos{
	"top-left": figures.LegendTopLeft, "top-right": figures.LegendTopRight,
	"bottom-left": figures.LegendBottomLeft, "bottom-right": figures.LegendBottomRight,
	"none": figures.LegendNone,
}

func init() {
	engine.Register(engine.Kind{
		Name:    "figure",
		Summary: "a chart: series, panels, residuals, actual and fitted, correlogram, CUSUM, CUSUM of squares, recursive coefficient",
		New:     func() engine.Directive { return &figureSpec{} },
		Fields:  []string{"plot", "files", "sample", "series", "width", "height", "alpha", "a", "c0", "cusum", "cusumsq", "recursive", "outside", "first_outside", "lags", "acf", "pacf", "band", "relation", "of", "coef", "horizon"},
	})
}

// plotKind is the plot asked for, or the one the keys imply.
func (s *figureSpec) plotKind() string {
	switch {
	case s.Plot != "":
		return s.Plot
	case s.Residuals != "":
		return "residuals"
	case len(s.Panels) > 0:
		return "panels"
	case s.Of != "" || s.Y != "":
		return "actual-fitted"
	}
	return "lines"
}

func isRegressionPlot(p string) bool {
	return p == "actual-fitted" || p == "cusum" || p == "cusumsq" || p == "recursive"
}

// exprs lists the series expressions of a lines/panels/acf/residuals figure.
func (s *figureSpec) exprs() []string {
	out := slices.Clone(s.Series)
	for _, p := range s.Panels {
		out = append(out, p...)
	}
	return out
}

func (s *figureSpec) Check(c *engine.Context) error {
	p := s.plotKind()
	if !slices.Contains(plotKinds, p) {
		return c.Errorf("plot", "unknown plot %q%s; plots: %s", p, manuscript.DidYouMean(p, plotKinds), strings.Join(plotKinds, ", "))
	}
	if s.Legend != "" {
		if _, ok := legendPlaces[s.Legend]; !ok {
			return c.Errorf("legend", "unknown legend place %q; use top-left, top-right, bottom-left, bottom-right or none", s.Legend)
		}
	}
	for _, k := range []struct {
		key string
		v   float64
	}{{"width", s.Width}, {"height", s.Height}} {
		if c.Has(k.key) && !(k.v > 0.5 && k.v <= 40) {
			return c.Errorf(k.key, "%s %g in: give a size in inches between 0.5 and 40", k.key, k.v)
		}
	}
	if c.Has("lags") && s.Lags < 1 {
		return c.Errorf("lags", "lags must be at least 1")
	}
	if c.Has("alpha") && !(s.Alpha > 0 && s.Alpha < 0.5) {
		return c.Errorf("alpha", "alpha %g: give the significance level of the bands, between 0 and 0.5 (e.g. 0.05)", s.Alpha)
	}
	for i, w := range s.Shade {
		if _, _, err := parseShade(w); err != nil {
			return c.ItemErrorf("shade", i, "%v", err)
		}
	}
	if s.Sample != "" {
		if _, err := series.ParseWindow(s.Sample); err != nil {
			return c.Errorf("sample", "sample %q: %v", s.Sample, err)
		}
	}
	if p == "multipliers" {
		return s.checkMultipliers(c) // multipliers.go
	}
	ex := s.exprs()
	switch {
	case isRegressionPlot(p):
		if len(ex) > 0 || s.Residuals != "" || c.Has("relation") {
			return c.Errorf(firstSet(c, "series", "panels", "residuals", "relation"), "plot %s draws a regression: give of (an ols id) or y and x, not series, panels, residuals or relation", p)
		}
		if s.Of != "" {
			if k := firstSet(c, "y", "x", "const", "data", "sample"); k != "" {
				return c.Errorf(k, "with of, the regression (its data, y, x, const and sample) comes from %q; drop %s", s.Of, k)
			}
			if p == "actual-fitted" {
				return c.CheckRef("of", s.Of, "ols", "ecm")
			}
			if c.RefKind(s.Of) == "ecm" {
				return c.Errorf("of", "plot %s needs the regression itself: name an ols result, or give y and x (an ecm result can be drawn as actual-fitted)", p)
			}
			return c.CheckRef("of", s.Of, "ols")
		}
		if s.Y == "" {
			return c.Errorf("", "plot %s has nothing to draw: give of (the id of an ols result) or y and x", p)
		}
		if len(s.X) == 0 && s.Const != nil && !*s.Const {
			return c.Errorf("x", "a regression needs at least one regressor: give x, or keep the constant")
		}
		return c.CheckData(c.DataAlias(s.Data), append([]string{s.Y}, s.X...), s.Sample)
	default:
		if k := firstSet(c, "of", "y", "x", "const", "coef"); k != "" {
			return c.Errorf(k, "%s belongs to the regression plots (actual-fitted, cusum, cusumsq, recursive), not to plot %s", k, p)
		}
		if s.Residuals != "" {
			if len(ex) > 0 {
				return c.Errorf(firstSet(c, "series", "panels"), "give either residuals or series, not both")
			}
			if p != "residuals" && p != "acf" {
				return c.Errorf("residuals", "residuals can be drawn with plot residuals or acf, not %s", p)
			}
			if err := c.CheckRef("residuals", s.Residuals); err != nil {
				return err
			}
			if k := c.RefKind(s.Residuals); c.Has("relation") && k != "johansen" && k != "vecm" {
				return c.Errorf("relation", "relation picks one cointegrating relation of a johansen or vecm result; %q (kind %s) has none: drop relation", s.Residuals, k)
			}
			if s.Relation != nil && *s.Relation < 1 {
				return c.Errorf("relation", "relation %d: relations are numbered from 1", *s.Relation)
			}
			return nil
		}
		if c.Has("relation") {
			return c.Errorf("relation", "relation picks a cointegrating relation of the johansen or vecm result named by residuals; give residuals: ID")
		}
		if len(ex) == 0 {
			return c.Errorf("", "this figure has nothing to draw: give series (expressions), panels, residuals (an id), of (an ols id) or y and x")
		}
		if len(s.Series) > 0 && len(s.Panels) > 0 {
			return c.Errorf("panels", "give either series or panels, not both")
		}
		if (p == "residuals" || p == "acf") && len(ex) != 1 {
			return c.Errorf(firstSet(c, "series", "panels"), "plot %s draws one series; %d are given", p, len(ex))
		}
		if p == "lines" && len(s.Panels) > 0 {
			return c.Errorf("panels", "plot lines draws one panel; use plot panels (or leave plot out) to stack panels")
		}
		if len(s.Names) > 0 && len(s.Names) != len(ex) {
			return c.Errorf("names", "%d names for %d series", len(s.Names), len(ex))
		}
		return c.CheckData(c.DataAlias(s.Data), ex, s.Sample)
	}
}

// firstSet is the first of keys the directive's YAML sets ("" if none).
func firstSet(c *engine.Context, keys ...string) string {
	for _, k := range keys {
		if c.Has(k) {
			return k
		}
	}
	return ""
}

func parseShade(w shadeSpec) (series.Date, series.Date, error) {
	if w.From == "" || w.To == "" {
		return series.Date{}, series.Date{}, fmt.Errorf("a shaded window needs from and to, e.g. {from: 2008-09, to: 2009-06}")
	}
	a, err := series.ParseDate(w.From)
	if err != nil {
		return a, a, fmt.Errorf("shade from: %v", err)
	}
	b, err := series.ParseDate(w.To)
	if err != nil {
		return a, b, fmt.Errorf("shade to: %v", err)
	}
	if a.Freq != b.Freq {
		return a, b, fmt.Errorf("shade %s to %s: the ends have different frequencies (%s, %s)", a, b, a.Freq, b.Freq)
	}
	if b.Before(a) {
		return a, b, fmt.Errorf("shade %s to %s ends before it starts", a, b)
	}
	return a, b, nil
}

// drawn collects what a figure shows, for its values.
type drawn struct {
	names  []string
	panel  []int
	series []series.Series
}

func (s *figureSpec) Run(c *engine.Context) (*engine.Result, error) {
	p := s.plotKind()
	o := figures.Options{YLabel: s.YLabel, XLabel: s.XLabel, PanelLabels: s.YLabels, Width: s.Width, Height: s.Height}
	if s.Legend != "" {
		o.Legend = legendPlaces[s.Legend]
	}
	vals := map[string]any{"plot": p}
	if p == "multipliers" {
		return s.runMultipliers(c, &o, vals) // multipliers.go
	}
	var fig *figures.Figure
	var dr drawn
	var err error
	switch p {
	case "lines", "panels":
		fig, dr, err = s.runLines(c, p, &o)
	case "residuals", "acf":
		fig, dr, err = s.runOneSeries(c, p, &o, vals)
	default:
		fig, dr, err = s.runRegression(c, p, &o, vals)
	}
	if err != nil {
		return nil, err
	}
	if fig == nil {
		return nil, errors.New("internal error: no figure was built")
	}
	from, to, n := span(dr.series)
	vals["sample"] = map[string]any{"from": from.String(), "to": to.String(), "n": n}
	var list []map[string]any
	for i, name := range dr.names {
		f, l, k := span(dr.series[i : i+1])
		list = append(list, map[string]any{"name": name, "panel": dr.panel[i], "from": f.String(), "to": l.String(), "n": k})
	}
	vals["series"] = list
	return s.finish(c, fig, vals)
}

// finish renders the figure and fills in its size and files.
func (s *figureSpec) finish(c *engine.Context, fig *figures.Figure, vals map[string]any) (*engine.Result, error) {
	w, h := float64(fig.Width/vg.Inch), float64(fig.Height/vg.Inch)
	if c.Nested() {
		// Inside a revision report's build of another vintage only the
		// values are compared; the drawing is skipped.
		vals["width"], vals["height"] = w, h
		return &engine.Result{Values: vals, Figure: &engine.Figure{Width: w, Height: h, Notes: s.notes}}, nil
	}
	svg, err := fig.Render("svg", 0)
	if err != nil {
		return nil, c.Errorf("", "%v", err)
	}
	pdf, err := fig.Render("pdf", 0)
	if err != nil {
		return nil, c.Errorf("", "%v", err)
	}
	vals["width"], vals["height"] = w, h
	id := c.ID()
	vals["files"] = map[string]any{"svg": engine.FigureFolder + "/" + id + ".svg", "pdf": engine.FigureFolder + "/" + id + ".pdf"}
	res := &engine.Result{Values: vals, Figure: &engine.Figure{
		SVG: svg, PDF: pdf, Width: w, Height: h, Notes: s.notes,
		PNGAt: func(dpi int) ([]byte, error) { return fig.Render("png", dpi) },
	}}
	return res, nil
}

// span is the first and last date over the series and the number of
// distinct dates with a finite value.
func span(ss []series.Series) (from, to series.Date, n int) {
	seen := map[int]bool{}
	first := true
	for _, s := range ss {
		for i, d := range s.Dates {
			if math.IsNaN(s.Values[i]) || math.IsInf(s.Values[i], 0) {
				continue
			}
			if first || d.Before(from) {
				from = d
			}
			if first || to.Before(d) {
				to = d
			}
			first = false
			seen[d.Index()] = true
		}
	}
	return from, to, len(seen)
}

// shade converts the shaded windows. A window that runs past the
// plotted dates is cut to them, with a note. One that lies wholly
// outside them is an error naming the data's span; in a build on an
// earlier vintage of the data (shorter than the current data the
// manuscript was written for) it is left out, with a note.
func (s *figureSpec) shade(c *engine.Context, ss []series.Series, o *figures.Options) error {
	s.notes = nil
	if len(s.Shade) == 0 {
		return nil
	}
	from, to, _ := span(ss)
	vintage := c.Document().Vintage()
	if vintage == "default" {
		vintage = ""
	}
	for i, w := range s.Shade {
		a, b, err := parseShade(w)
		if err != nil {
			return c.ItemErrorf("shade", i, "%v", err)
		}
		if a.Freq != from.Freq {
			return c.ItemErrorf("shade", i, "shaded window %s to %s is %s but the figure's data are %s", a, b, a.Freq, from.Freq)
		}
		if b.Before(from) || to.Before(a) {
			if vintage == "" {
				return c.ItemErrorf("shade", i, "shaded window %s to %s lies outside the plotted data, which run from %s to %s", a, b, from, to)
			}
			s.notes = append(s.notes, fmt.Sprintf("The shaded window %s to %s lies outside the data of vintage %q (%s to %s) and is not shown.", a, b, vintage, from, to))
			continue
		}
		ca, cb := a, b
		if ca.Before(from) {
			ca = from
		}
		if to.Before(cb) {
			cb = to
		}
		if !ca.Equal(a) || !cb.Equal(b) {
			of := "the plotted data"
			if vintage != "" {
				of = fmt.Sprintf("the data of vintage %q", vintage)
			}
			s.notes = append(s.notes, fmt.Sprintf("The shaded window %s to %s runs past %s (%s to %s); it is shaded from %s to %s.", a, b, of, from, to, ca, cb))
		}
		o.Shade = append(o.Shade, figures.Window{From: ca, To: cb})
	}
	return nil
}

// dataSeries evaluates one expression as a dated series over its own
// available span (within the sample).
func (s *figureSpec) dataSeries(c *engine.Context, expr, name string) (series.Series, error) {
	d, err := c.Data(c.DataAlias(s.Data), []string{expr}, s.Sample)
	if err != nil {
		return series.Series{}, err
	}
	return series.Series{Name: name, Dates: d.Dates, Values: d.Cols[0]}, nil
}

func (s *figureSpec) runLines(c *engine.Context, p string, o *figures.Options) (*figures.Figure, drawn, error) {
	groups := s.Panels
	if len(groups) == 0 {
		if p == "panels" {
			for _, e := range s.Series {
				groups = append(groups, []string{e})
			}
		} else {
			groups = [][]string{s.Series}
		}
	}
	var dr drawn
	var panels []figures.Panel
	k := 0
	for gi, g := range groups {
		if len(g) == 0 {
			return nil, dr, c.ItemErrorf("panels", gi, "panel %d has no series", gi+1)
		}
		if len(g) > figures.MaxSeries {
			return nil, dr, c.ItemErrorf("panels", gi, "panel %d has %d series; one panel holds at most %d", gi+1, len(g), figures.MaxSeries)
		}
		var pn figures.Panel
		for _, e := range g {
			name := e
			if k < len(s.Names) {
				name = s.Names[k]
			}
			k++
			ser, err := s.dataSeries(c, e, name)
			if err != nil {
				return nil, dr, err
			}
			pn.Series = append(pn.Series, ser)
			dr.names = append(dr.names, name)
			dr.panel = append(dr.panel, gi+1)
			dr.series = append(dr.series, ser)
		}
		if len(groups) == 1 {
			pn.YLabel = s.YLabel
		}
		panels = append(panels, pn)
	}
	if len(groups) > 1 && s.YLabel != "" && len(s.YLabels) == 0 {
		return nil, dr, c.Errorf("ylabel", "a figure of %d panels takes ylabels (one per panel), not ylabel", len(groups))
	}
	if len(s.YLabels) > 0 && len(s.YLabels) != len(groups) {
		return nil, dr, c.Errorf("ylabels", "%d ylabels for %d panels", len(s.YLabels), len(groups))
	}
	if err := s.shade(c, dr.series, o); err != nil {
		return nil, dr, err
	}
	fig, err := figures.Panels(panels, *o)
	if err != nil {
		return nil, dr, c.Errorf("", "%v", err)
	}
	return fig, dr, nil
}

// runOneSeries draws a residual series (or one expression) as a line
// about zero, or its correlogram.
func (s *figureSpec) runOneSeries(c *engine.Context, p string, o *figures.Options, vals map[string]any) (*figures.Figure, drawn, error) {
	var ser series.Series
	var err error
	if s.Residuals != "" {
		r, err := c.Result("residuals", s.Residuals)
		if err != nil {
			return nil, drawn{}, err
		}
		if r.Kind == "johansen" || r.Kind == "vecm" {
			if ser, err = s.relation(c, r, vals); err != nil {
				return nil, drawn{}, err
			}
		} else {
			if ser, err = residualSeries(c, "residuals", r); err != nil {
				return nil, drawn{}, err
			}
			ser.Name = "residual of " + s.Residuals
			if ser, err = restrict(c, ser, s.Sample); err != nil {
				return nil, drawn{}, err
			}
		}
	} else {
		e := s.exprs()[0]
		if ser, err = s.dataSeries(c, e, e); err != nil {
			return nil, drawn{}, err
		}
	}
	if len(s.Names) > 0 {
		ser.Name = s.Names[0]
	}
	dr := drawn{names: []string{ser.Name}, panel: []int{1}, series: []series.Series{ser}}
	if p == "residuals" {
		if err := s.shade(c, dr.series, o); err != nil {
			return nil, dr, err
		}
		fig, err := figures.Residuals(ser, *o)
		if err != nil {
			return nil, dr, c.Errorf("", "%v", err)
		}
		return fig, dr, nil
	}
	if len(s.Shade) > 0 {
		return nil, dr, c.Errorf("shade", "a correlogram has no date axis to shade")
	}
	x, _, err := series.Contiguous(&ser)
	if err != nil {
		return nil, dr, c.Errorf("", "%v", err)
	}
	lags := s.Lags
	if lags == 0 {
		lags = acfLags(ser, len(x))
	}
	if lags >= len(x) {
		return nil, dr, c.Errorf("lags", "%d lags need more than %d observations", lags, len(x))
	}
	cg, err := acf.Compute(x, lags)
	if err != nil {
		return nil, dr, c.Errorf("", "%v", err)
	}
	if o.XLabel == "" {
		o.XLabel = "lag"
	}
	fig, err := figures.Correlogram(cg, *o)
	if err != nil {
		return nil, dr, c.Errorf("", "%v", err)
	}
	vals["lags"] = lags
	vals["acf"] = slices.Clone(cg.ACF[1:])
	vals["pacf"] = slices.Clone(cg.PACF[1:])
	vals["band"] = cg.Band
	return fig, dr, nil
}

// relation is the cointegrating relation of a johansen or vecm result
// that the figure draws (relation: N, default 1), within sample. In the
// cases with an unrestricted constant (c, rt, ct) any shift of the
// relation's level is absorbed by that constant, so the level is not
// identified: the sample mean over the plotted dates is subtracted and the
// zero line is the relation's average. In cases n and rc the level is
// estimated (zero, or the restricted constant) and β'ỹ_t is drawn as it
// is. What was drawn goes into vals["relation"].
func (s *figureSpec) relation(c *engine.Context, r *engine.Result, vals map[string]any) (series.Series, error) {
	n := 1
	if s.Relation != nil {
		n = *s.Relation
	}
	ser, err := relationSeries(c, "residuals", "relation", r, n)
	if err != nil {
		return ser, err
	}
	ser.Name = fmt.Sprintf("relation %d of %s", n, s.Residuals)
	if ser, err = restrict(c, ser, s.Sample); err != nil {
		return ser, err
	}
	ser.Values = slices.Clone(ser.Values)
	var mean float64
	if det, _ := r.Values["det"].(string); det == "c" || det == "rt" || det == "ct" {
		k := 0
		for _, v := range ser.Values {
			if !math.IsNaN(v) {
				mean += v
				k++
			}
		}
		mean /= float64(max(k, 1))
		for i := range ser.Values {
			ser.Values[i] -= mean
		}
	}
	texts := make([]string, len(ser.Dates))
	for i, d := range ser.Dates {
		texts[i] = d.String()
	}
	vals["relation"] = map[string]any{"number": n, "mean_removed": mean, "dates": texts, "values": slices.Clone(ser.Values)}
	return ser, nil
}

// acfLags is two years of lags for monthly or quarterly data, ten
// otherwise, and never more than a quarter of the observations.
func acfLags(s series.Series, n int) int {
	l := 10
	if len(s.Dates) > 0 {
		if py := s.Dates[0].Freq.PerYear(); py == 4 || py == 12 {
			l = 2 * py
		}
	}
	return max(1, min(l, n/4))
}

// runRegression draws actual and fitted values or a stability
// diagnostic of a regression.
func (s *figureSpec) runRegression(c *engine.Context, p string, o *figures.Options, vals map[string]any) (*figures.Figure, drawn, error) {
	if p == "actual-fitted" && s.Of != "" && c.RefKind(s.Of) == "ecm" {
		return s.ecmActualFitted(c, o)
	}
	rs, err := s.regressionOf(c)
	if err != nil {
		return nil, drawn{}, err
	}
	ds, err := buildDesign(c, rs)
	if err != nil {
		return nil, drawn{}, err
	}
	alpha := s.Alpha
	if alpha == 0 {
		alpha = 0.05
	}
	vals["alpha"] = alpha
	line := func(name string, v []float64) series.Series {
		return series.Series{Name: name, Dates: ds.dates, Values: v}
	}
	var fig *figures.Figure
	var dr drawn
	if p == "actual-fitted" {
		fit, err := ols.Regress(ds.y, ds.x)
		if err != nil {
			return nil, dr, engine.CollinearError(c, "x", err, ds.terms)
		}
		delete(vals, "alpha")
		a, f := line("actual", ds.y), line("fitted", fit.Fitted)
		if len(s.Names) == 2 {
			a.Name, f.Name = s.Names[0], s.Names[1]
		} else if len(s.Names) != 0 {
			return nil, dr, c.Errorf("names", "actual-fitted takes two names (actual, fitted); %d are given", len(s.Names))
		}
		dr = drawn{names: []string{a.Name, f.Name}, panel: []int{1, 1}, series: []series.Series{a, f}}
		if o.YLabel == "" {
			o.YLabel = ds.yName
		}
		if err := s.shade(c, dr.series, o); err != nil {
			return nil, dr, err
		}
		if fig, err = figures.ActualFitted(a, f, *o); err != nil {
			return nil, dr, c.Errorf("", "%v", err)
		}
		return fig, dr, nil
	}
	rec, err := stability.Compute(ds.y, ds.x)
	if err != nil {
		return nil, dr, c.Errorf(firstSet(c, "of", "x"), "recursive residuals: %v", err)
	}
	if rec.Residuals() < 3 {
		return nil, dr, c.Errorf("", "only %d recursive residuals in %s: too few to draw", rec.Residuals(), ds.d.Range())
	}
	from := rec.First
	dates := ds.dates[from:]
	texts := make([]string, len(dates))
	for i, d := range dates {
		texts[i] = d.String()
	}
	switch p {
	case "cusum":
		stat := rec.CUSUM()
		band, err := rec.CUSUMBand(alpha)
		if err != nil {
			return nil, dr, c.Errorf("alpha", "%v", err)
		}
		a, _ := stability.CUSUMConst(alpha)
		vals["a"] = a
		vals["cusum"] = map[string]any{"dates": texts, "values": slices.Clone(stat[from:]), "band": slices.Clone(band[from:])}
		k, out := outside(texts, stat[from:], func(i int, v float64) bool { return math.Abs(v) > band[from+i] })
		vals["outside"], vals["first_outside"] = k, out
		dr = drawn{names: []string{"CUSUM"}, panel: []int{1}, series: []series.Series{line("CUSUM", stat)}}
		if err := s.shade(c, dr.series, o); err != nil {
			return nil, dr, err
		}
		fig, err = figures.CUSUM(ds.dates, stat, band, *o)
		if err != nil {
			return nil, dr, c.Errorf("", "%v", err)
		}
	case "cusumsq":
		stat := rec.CUSUMSquares()
		lo, hi, err := rec.CUSUMSquaresBand(alpha)
		if err != nil {
			return nil, dr, c.Errorf("", "CUSUM of squares band: %v", err)
		}
		c0, err := stability.CUSUMSquaresConst(rec.Residuals(), alpha)
		if err != nil {
			return nil, dr, c.Errorf("", "CUSUM of squares band: %v", err)
		}
		vals["c0"] = c0
		vals["cusumsq"] = map[string]any{"dates": texts, "values": slices.Clone(stat[from:]), "lower": slices.Clone(lo[from:]), "upper": slices.Clone(hi[from:])}
		k, out := outside(texts, stat[from:], func(i int, v float64) bool { return v < lo[from+i] || v > hi[from+i] })
		vals["outside"], vals["first_outside"] = k, out
		dr = drawn{names: []string{"CUSUM of squares"}, panel: []int{1}, series: []series.Series{line("CUSUM of squares", stat)}}
		if err := s.shade(c, dr.series, o); err != nil {
			return nil, dr, err
		}
		fig, err = figures.CUSUMSquares(ds.dates, stat, lo, hi, *o)
		if err != nil {
			return nil, dr, c.Errorf("", "%v", err)
		}
	case "recursive":
		term := s.Coef
		if term == "" {
			term = ds.terms[0]
			if len(ds.terms) > 1 && term == "const" {
				term = ds.terms[1]
			}
		}
		j := slices.Index(ds.terms, term)
		if j < 0 {
			return nil, dr, c.Errorf("coef", "the regression has no coefficient %q%s; it has: %s", term, manuscript.DidYouMean(term, ds.terms), strings.Join(ds.terms, ", "))
		}
		est, lo, hi, err := rec.CoefBand(j)
		if err != nil {
			return nil, dr, c.Errorf("coef", "%v", err)
		}
		// the band is drawn where the estimate has a standard error
		start := slices.IndexFunc(lo, func(v float64) bool { return !math.IsNaN(v) })
		if start < 0 {
			return nil, dr, c.Errorf("", "the recursive estimate of %s never has a standard error in %s", term, ds.d.Range())
		}
		rtexts := make([]string, 0, len(ds.dates)-start)
		for _, d := range ds.dates[start:] {
			rtexts = append(rtexts, d.String())
		}
		vals["recursive"] = map[string]any{"term": term, "dates": rtexts, "estimate": slices.Clone(est[start:]), "lower": slices.Clone(lo[start:]), "upper": slices.Clone(hi[start:])}
		name := "recursive estimate of " + term
		dr = drawn{names: []string{name}, panel: []int{1}, series: []series.Series{{Name: name, Dates: ds.dates[start:], Values: est[start:]}}}
		if o.YLabel == "" {
			o.YLabel = term
		}
		if err := s.shade(c, dr.series, o); err != nil {
			return nil, dr, err
		}
		fig, err = figures.RecursiveCoef(ds.dates[start:], est[start:], lo[start:], hi[start:], *o)
		if err != nil {
			return nil, dr, c.Errorf("", "%v", err)
		}
	}
	return fig, dr, nil
}

// outside counts the points at which out(i, v) holds and gives the
// first of their dates (nil if there is none).
func outside(dates []string, v []float64, out func(int, float64) bool) (int, any) {
	n := 0
	var first any
	for i, x := range v {
		if out(i, x) {
			if n == 0 {
				first = dates[i]
			}
			n++
		}
	}
	return n, first
}

func nan() float64 { return math.NaN() }

// ecmActualFitted draws an error-correction model's dependent variable
// (the first difference) and its fitted values, from the ecm result.
func (s *figureSpec) ecmActualFitted(c *engine.Context, o *figures.Options) (*figures.Figure, drawn, error) {
	res, err := c.Result("of", s.Of, "ecm")
	if err != nil {
		return nil, drawn{}, err
	}
	var ss [2]series.Series
	for i, key := range []string{"actual", "fitted"} {
		if ss[i], err = datedField(c, "of", res, key, key); err != nil {
			return nil, drawn{}, err
		}
	}
	a, f := ss[0], ss[1]
	if len(s.Names) == 2 {
		a.Name, f.Name = s.Names[0], s.Names[1]
	} else if len(s.Names) != 0 {
		return nil, drawn{}, c.Errorf("names", "actual-fitted takes two names (actual, fitted); %d are given", len(s.Names))
	}
	dr := drawn{names: []string{a.Name, f.Name}, panel: []int{1, 1}, series: []series.Series{a, f}}
	if o.YLabel == "" {
		o.YLabel, _ = res.Values["y"].(string)
	}
	if err := s.shade(c, dr.series, o); err != nil {
		return nil, dr, err
	}
	fig, err := figures.ActualFitted(a, f, *o)
	if err != nil {
		return nil, dr, c.Errorf("", "%v", err)
	}
	return fig, dr, nil
}
