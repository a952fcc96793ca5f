package figures

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"github.com/galley-econ/galley/analysis/series"
)

// Path is one line of a dated figure built from a statistic: its legend
// name and one value per date.
type Path struct {
	Name   string
	Values []float64
}

// RecursiveRank draws recursive estimates of a cointegrated system against
// the last date of each subsample in two panels with one date axis: the
// eigenvalues (upper panel) and the trace statistics divided by their
// critical value (lower panel), with a grey line at one, above which the
// statistic rejects. Both vertical axes start at zero. Each panel holds at most MaxSeries paths, told apart
// by the house line styles, with a legend of their names. The panels'
// vertical labels default to "eigenvalues" and "trace / 5% critical value"
// (o.PanelLabels overrides them).
func RecursiveRank(dates []series.Date, eig, ratio []Path, o Options) (*Figure, error) {
	if len(eig) == 0 || len(ratio) == 0 {
		return nil, fmt.Errorf("%w: no recursive paths", ErrNoData)
	}
	for _, ps := range [][]Path{eig, ratio} {
		if len(ps) > MaxSeries {
			return nil, fmt.Errorf("figures: a panel of %d paths; the house style distinguishes at most %d", len(ps), MaxSeries)
		}
	}
	w, h, err := o.size(2)
	if err != nil {
		return nil, err
	}
	labels := []string{"eigenvalues", "trace / 5% critical value"}
	for i := range labels {
		if i < len(o.PanelLabels) && o.PanelLabels[i] != "" {
			labels[i] = o.PanelLabels[i]
		}
	}
	fig := &Figure{Width: w, Height: h}
	var lo, hi float64
	for i, ps := range [][]Path{eig, ratio} {
		p := newPlot()
		if err := addShade(p, o.Shade); err != nil {
			return nil, err
		}
		if i == 1 {
			p.Add(&hline{y: 1, style: draw.LineStyle{Color: refColor, Width: vg.Points(0.9)}})
		}
		for j, pa := range ps {
			x, y, freq, err := datedXY(dates, pa.Name, pa.Values)
			if err != nil {
				return nil, err
			}
			lo, hi = x[0], x[len(x)-1]
			if hi == lo {
				hi = lo + 1/math.Max(1, float64(freq.PerYear()))
			}
			c := &curve{x: x, y: y, style: SeriesStyle(j)}
			p.Add(c)
			if len(ps) >= 2 && o.Legend != LegendNone {
				p.Legend.Add(pa.Name, c)
			}
			if j == 0 {
				dateAxis(p, freq, lo, hi, o, i == 1)
			}
		}
		placeLegend(p, o.Legend)
		p.Y.Label.Text = labels[i]
		if i == 0 {
			p.Title.Text = o.Title
		} else {
			p.X.Label.Text = o.XLabel
		}
		finishY(p)
		if p.Y.Min > 0 {
			p.Y.Min = 0 // eigenvalues and ratios are measured from zero
		}
		if len(ps) >= 2 && p.Legend.Top && o.Legend != LegendNone {
			legendRoom(p, len(ps), h/2)
		}
		fig.panels = append(fig.panels, p)
	}
	return fig, nil
}

// legendRoom raises the top of panel p, about panelHeight high, so that a
// legend of n entries at its top sits above the data rather than over it.
func legendRoom(p *plot.Plot, n int, panelHeight vg.Length) {
	data := float64(panelHeight) - float64(vg.Points(24)) // less the axis and padding
	need := float64(n)*float64(vg.Points(legendFontSize+1.5)) + float64(vg.Points(4))
	if data <= 2*need {
		return
	}
	f := need / data
	p.Y.Max += f / (1 - f) * (p.Y.Max - p.Y.Min)
}
