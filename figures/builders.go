package figures

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"github.com/galley-econ/galley/analysis/acf"
	"github.com/galley-econ/galley/analysis/series"
)

// Panel is one panel of a stacked figure: the series drawn in it and the
// label of its vertical axis.
type Panel struct {
	Series []series.Series
	YLabel string
}

// Lines draws one or more dated series in a single panel, each in its own
// house line style (SeriesStyle(i)), with a legend of the series names
// when there are two or more.
func Lines(ss []series.Series, o Options) (*Figure, error) {
	return Panels([]Panel{{Series: ss, YLabel: o.YLabel}}, o)
}

// Panels stacks panels vertically with one shared date axis (tick labels
// and XLabel on the bottom panel only), for series on different scales,
// or sets them in a grid of o.Columns columns. In a panel, each named
// series has its own house style; an unnamed one after the first is drawn
// like the series before it (the upper edge of a band after its lower).
// Every panel gets the same date range, the union of all series' dates,
// and the shaded windows of o.
func Panels(panels []Panel, o Options) (*Figure, error) {
	if len(panels) == 0 {
		return nil, fmt.Errorf("%w: no panels", ErrNoData)
	}
	cols := max(o.Columns, 1)
	if len(panels)%cols != 0 {
		return nil, fmt.Errorf("figures: %d panels do not fill a grid of %d columns", len(panels), cols)
	}
	w, h, err := o.size(len(panels))
	if err != nil {
		return nil, err
	}
	type prepared struct{ x, y [][]float64 }
	prep := make([]prepared, len(panels))
	lo, hi := math.Inf(1), math.Inf(-1)
	freq := series.Freq(-1)
	for i, pn := range panels {
		if len(pn.Series) == 0 {
			return nil, fmt.Errorf("%w: panel %d has no series", ErrNoData, i+1)
		}
		if len(pn.Series) > MaxSeries {
			return nil, fmt.Errorf("figures: panel %d has %d series; the house style distinguishes at most %d", i+1, len(pn.Series), MaxSeries)
		}
		for _, s := range pn.Series {
			x, y, f, err := xy(s)
			if err != nil {
				return nil, err
			}
			if freq < 0 {
				freq = f
			} else if f != freq {
				return nil, fmt.Errorf("figures: series %q is %v but the figure is %v", s.Name, f, freq)
			}
			lo, hi = math.Min(lo, x[0]), math.Max(hi, x[len(x)-1])
			prep[i].x = append(prep[i].x, x)
			prep[i].y = append(prep[i].y, y)
		}
	}
	if hi == lo {
		hi = lo + 1/math.Max(1, float64(freq.PerYear()))
	}
	fig := &Figure{Width: w, Height: h, cols: cols}
	for i, pn := range panels {
		p := newPlot()
		if err := addShade(p, o.Shade); err != nil {
			return nil, err
		}
		named := 0
		for _, s := range pn.Series {
			if s.Name != "" {
				named++
			}
		}
		style := -1
		for j, s := range pn.Series {
			if s.Name != "" || j == 0 {
				style++ // an unnamed series after the first continues the style before it (a band's second edge)
			}
			c := &curve{x: prep[i].x[j], y: prep[i].y[j], style: SeriesStyle(style)}
			p.Add(c)
			if named >= 2 && o.Legend != LegendNone {
				p.Legend.Add(s.Name, c)
			}
		}
		placeLegend(p, o.Legend)
		label := pn.YLabel
		if i < len(o.PanelLabels) && o.PanelLabels[i] != "" {
			label = o.PanelLabels[i]
		}
		last := i >= len(panels)-cols // on the bottom row
		dateAxis(p, freq, lo, hi, o, last)
		if last {
			p.X.Label.Text = o.XLabel
		}
		switch {
		case cols > 1: // a grid: each panel titled, the title smaller than a figure's
			p.Title.Text = label
			p.Title.TextStyle = textStyle(labelFontSize, labelColor)
			p.Title.TextStyle.XAlign = draw.XCenter
			p.Title.TextStyle.YAlign = draw.YTop
		default:
			p.Y.Label.Text = label
			if i == 0 {
				p.Title.Text = o.Title
			}
		}
		finishY(p)
		fig.panels = append(fig.panels, p)
	}
	return fig, nil
}

// single builds a one-panel dated figure from prepared plotters.
func single(freq series.Freq, x []float64, o Options, add func(p *plot.Plot)) (*Figure, error) {
	w, h, err := o.size(1)
	if err != nil {
		return nil, err
	}
	p := newPlot()
	if err := addShade(p, o.Shade); err != nil {
		return nil, err
	}
	add(p)
	placeLegend(p, o.Legend)
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, v := range x {
		lo, hi = math.Min(lo, v), math.Max(hi, v)
	}
	if hi == lo {
		hi = lo + 1
	}
	dateAxis(p, freq, lo, hi, o, true)
	p.X.Label.Text = o.XLabel
	p.Y.Label.Text = o.YLabel
	p.Title.Text = o.Title
	finishY(p)
	return &Figure{Width: w, Height: h, panels: []*plot.Plot{p}}, nil
}

func refLine() draw.LineStyle {
	return draw.LineStyle{Color: refColor, Width: vg.Points(refWidth)}
}

func bandStyle() draw.LineStyle {
	return draw.LineStyle{Color: bandLine, Width: vg.Points(0.7), Dashes: []vg.Length{vg.Points(2.6), vg.Points(1.6)}}
}

// Residuals draws an equilibrium error (or any residual series) with a
// zero line.
func Residuals(e series.Series, o Options) (*Figure, error) {
	x, y, freq, err := xy(e)
	if err != nil {
		return nil, err
	}
	return single(freq, x, o, func(p *plot.Plot) {
		p.Add(&hline{y: 0, style: refLine()})
		p.Add(&curve{x: x, y: y, style: SeriesStyle(0)})
	})
}

// ActualFitted draws the dependent variable and its fitted values as two
// lines (styles 0 and 1) with a legend; unnamed series are called
// "actual" and "fitted".
func ActualFitted(actual, fitted series.Series, o Options) (*Figure, error) {
	if actual.Name == "" {
		actual.Name = "actual"
	}
	if fitted.Name == "" {
		fitted.Name = "fitted"
	}
	return Lines([]series.Series{actual, fitted}, o)
}

// RecursiveCoef draws a recursive coefficient estimate with its band
// (e.g. stability.Recursive.CoefBand) as a shaded area; NaN entries (the
// start of the recursion) are left blank.
func RecursiveCoef(dates []series.Date, est, lo, hi []float64, o Options) (*Figure, error) {
	x, y, freq, err := datedXY(dates, "estimate", est)
	if err != nil {
		return nil, err
	}
	if len(lo) != len(x) || len(hi) != len(x) {
		return nil, fmt.Errorf("figures: band has %d/%d points for %d dates", len(lo), len(hi), len(x))
	}
	return single(freq, x, o, func(p *plot.Plot) {
		p.Add(&area{x: x, lo: lo, hi: hi, fill: bandFill})
		p.Add(&curve{x: x, y: y, style: SeriesStyle(0)})
	})
}

// CUSUM draws the CUSUM statistic with the significance lines ±band
// (stability.Recursive.CUSUM and CUSUMBand) and a zero line.
func CUSUM(dates []series.Date, stat, band []float64, o Options) (*Figure, error) {
	x, y, freq, err := datedXY(dates, "CUSUM", stat)
	if err != nil {
		return nil, err
	}
	if len(band) != len(x) {
		return nil, fmt.Errorf("figures: band has %d points for %d dates", len(band), len(x))
	}
	neg := make([]float64, len(band))
	for i, b := range band {
		neg[i] = -b
	}
	return single(freq, x, o, func(p *plot.Plot) {
		p.Add(&hline{y: 0, style: refLine()})
		p.Add(&curve{x: x, y: band, style: bandStyle()})
		p.Add(&curve{x: x, y: neg, style: bandStyle()})
		p.Add(&curve{x: x, y: y, style: SeriesStyle(0)})
	})
}

// CUSUMSquares draws the CUSUM-of-squares statistic between its lower and
// upper significance lines (stability.Recursive.CUSUMSquares and
// CUSUMSquaresBand).
func CUSUMSquares(dates []series.Date, stat, lo, hi []float64, o Options) (*Figure, error) {
	x, y, freq, err := datedXY(dates, "CUSUM of squares", stat)
	if err != nil {
		return nil, err
	}
	if len(lo) != len(x) || len(hi) != len(x) {
		return nil, fmt.Errorf("figures: band has %d/%d points for %d dates", len(lo), len(hi), len(x))
	}
	return single(freq, x, o, func(p *plot.Plot) {
		p.Add(&curve{x: x, y: lo, style: bandStyle()})
		p.Add(&curve{x: x, y: hi, style: bandStyle()})
		p.Add(&curve{x: x, y: y, style: SeriesStyle(0)})
	})
}

// Correlogram draws the autocorrelations (upper panel) and partial
// autocorrelations (lower panel) at lags 1..p as bars, with the band
// ±1.96/√T as dashed lines and a zero line. The panels' vertical labels
// default to "ACF" and "PACF" (o.PanelLabels overrides them); XLabel
// labels the lag axis.
func Correlogram(c *acf.Correlogram, o Options) (*Figure, error) {
	if c == nil || len(c.ACF) < 2 || len(c.PACF) != len(c.ACF) {
		return nil, errors.New("figures: correlogram needs at least one lag of ACF and PACF")
	}
	w, h, err := o.size(2)
	if err != nil {
		return nil, err
	}
	p := len(c.ACF) - 1
	lags := make([]float64, p)
	for i := range lags {
		lags[i] = float64(i + 1)
	}
	labels := []string{"ACF", "PACF"}
	for i := range labels {
		if i < len(o.PanelLabels) && o.PanelLabels[i] != "" {
			labels[i] = o.PanelLabels[i]
		}
	}
	fig := &Figure{Width: w, Height: h}
	bandX := []float64{0.5, float64(p) + 0.5}
	for i, v := range [][]float64{c.ACF[1:], c.PACF[1:]} {
		pl := newPlot()
		pl.Add(&hline{y: 0, style: refLine()})
		pl.Add(&bars{x: lags, v: v, width: math.Min(0.55, 0.55*float64(p)/12+0.25), fill: barFill})
		pl.Add(&curve{x: bandX, y: []float64{c.Band, c.Band}, style: bandStyle()})
		pl.Add(&curve{x: bandX, y: []float64{-c.Band, -c.Band}, style: bandStyle()})
		pl.X.Min, pl.X.Max = 0.5, float64(p)+0.5
		var t plot.Ticker = lagTicks{}
		if i == 0 {
			t = blankLabels{t}
			pl.Title.Text = o.Title
		} else {
			pl.X.Label.Text = o.XLabel
		}
		pl.X.Tick.Marker = t
		pl.Y.Label.Text = labels[i]
		finishY(pl)
		fig.panels = append(fig.panels, pl)
	}
	// same vertical scale in both panels
	lo := math.Min(fig.panels[0].Y.Min, fig.panels[1].Y.Min)
	hi := math.Max(fig.panels[0].Y.Max, fig.panels[1].Y.Max)
	for _, pl := range fig.panels {
		pl.Y.Min, pl.Y.Max = lo, hi
	}
	return fig, nil
}

// lagTicks labels whole lags at a step of 1, 2, 4, 5, 10, … with at most
// 8 labels, and marks every lag when there are at most 40.
type lagTicks struct{}

func (lagTicks) Ticks(min, max float64) []plot.Tick {
	first, last := int(math.Ceil(min)), int(math.Floor(max))
	step := 1
	for _, s := range []int{1, 2, 4, 5, 10, 20, 25, 50, 100} {
		step = s
		if countMultiples(first, last, s) <= 8 {
			break
		}
	}
	var t []plot.Tick
	for k := first; k <= last; k++ {
		switch {
		case k%step == 0:
			t = append(t, plot.Tick{Value: float64(k), Label: fmt.Sprint(k)})
		case last-first <= 40:
			t = append(t, plot.Tick{Value: float64(k)})
		}
	}
	return t
}
