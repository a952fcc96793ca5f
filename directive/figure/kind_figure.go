package figure

import (
	"errors"
	"math"
	"slices"

	"gonum.org/v1/plot/vg"

	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/figures"
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
	Form          string      `yaml:"form"`        // recursive-rank (system.go)
	First         string      `yaml:"first"`       // recursive-rank
	Eigenvalues   string      `yaml:"eigenvalues"` // recursive-rank
	Horizon       *int        `yaml:"horizon"`     // variance-shares (shares.go)

	notes []string // about shaded windows cut to the data
}

type shadeSpec struct {
	From string `yaml:"from"`
	To   string `yaml:"to"`
}

// The plot kinds, in the order the documentation gives them.
var plotKinds = []string{"lines", "panels", "residuals", "actual-fitted", "acf", "cusum", "cusumsq", "recursive", "multipliers", "roots", "recursive-rank", "variance-shares"}

var legendPlaces = map[string]figures.LegendPos{
	"top-left": figures.LegendTopLeft, "top-right": figures.LegendTopRight,
	"bottom-left": figures.LegendBottomLeft, "bottom-right": figures.LegendBottomRight,
	"none": figures.LegendNone,
}

func init() {
	engine.Register(engine.Kind{
		Name:    "figure",
		Summary: "a chart: series, panels, residuals, actual and fitted, correlogram, CUSUM, CUSUM of squares, recursive coefficient, multipliers, a system's companion roots and recursive rank statistics, variance shares",
		New:     func() engine.Directive { return &figureSpec{} },
		Fields: []string{"plot", "files", "sample", "series", "width", "height", "alpha", "a", "c0", "cusum", "cusumsq", "recursive", "outside", "first_outside", "lags", "acf", "pacf", "band", "relation", "of", "coef", "horizon",
			"roots", "unit_roots", "largest_other", "recursion", // these four: system.go
			"shares"}, // shares.go
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

// isRegressionPlot returns whether plot p draws a regression (of: or y
// and x) rather than series.
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

// drawn collects what a figure shows, for its values.
type drawn struct {
	names  []string
	panel  []int
	series []series.Series
}

// Run draws the plot asked for and returns the figure with its values:
// the plot, the sample and each drawn series' span, the size and files.
func (s *figureSpec) Run(c *engine.Context) (*engine.Result, error) {
	p := s.plotKind()
	o := figures.Options{YLabel: s.YLabel, XLabel: s.XLabel, PanelLabels: s.YLabels, Width: s.Width, Height: s.Height}
	if s.Legend != "" {
		o.Legend = legendPlaces[s.Legend]
	}
	vals := map[string]any{"plot": p}
	switch p {
	case "multipliers":
		return s.runMultipliers(c, &o, vals) // multipliers.go
	case "roots":
		return s.runRoots(c, &o, vals) // system.go
	case "recursive-rank":
		return s.runRecursiveRank(c, &o, vals) // system.go
	case "variance-shares":
		return s.runShares(c, &o, vals) // shares.go
	}
	var fig *figures.Figure
	var dr drawn
	var err error
	switch p {
	case "lines", "panels":
		fig, dr, err = s.runLines(c, p, &o) // lines.go
	case "residuals", "acf":
		fig, dr, err = s.runOneSeries(c, p, &o, vals) // residuals.go, acf.go
	case "actual-fitted":
		fig, dr, err = s.runActualFitted(c, &o) // fit.go
	default:
		fig, dr, err = s.runStability(c, p, &o, vals) // stability.go
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
	return engine.DrawnFigure(c, fig, float64(fig.Width/vg.Inch), float64(fig.Height/vg.Inch), vals, s.notes)
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
