package figures

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Multipliers draws cumulative dynamic multipliers against the horizon
// h = 0 … H: the response to a unit rise (style 0) and to a unit fall
// (style 1), the asymmetry, their sum, as a dashed line, a zero line, and,
// when finite, the two long-run values as dotted horizontal lines. The
// legend names the three curves (names, in that order; defaults "rise",
// "fall", "asymmetry").
func Multipliers(pos, neg, asym []float64, longPos, longNeg float64, names []string, o Options) (*Figure, error) {
	n := len(pos)
	if n == 0 || len(neg) != n || len(asym) != n {
		return nil, fmt.Errorf("%w: multiplier paths of lengths %d, %d, %d", ErrNoData, len(pos), len(neg), len(asym))
	}
	w, h, err := o.size(1)
	if err != nil {
		return nil, err
	}
	lab := []string{"rise", "fall", "asymmetry"}
	for i := range lab {
		if i < len(names) && names[i] != "" {
			lab[i] = names[i]
		}
	}
	x := make([]float64, n)
	for i := range x {
		x[i] = float64(i)
	}
	p := newPlot()
	p.Add(&hline{y: 0, style: refLine()})
	dotted := draw.LineStyle{Color: refColor, Width: vg.Points(0.6), Dashes: []vg.Length{vg.Points(1), vg.Points(1.5)}}
	for _, v := range []float64{longPos, longNeg} {
		if !math.IsNaN(v) && !math.IsInf(v, 0) {
			p.Add(&hline{y: v, style: dotted})
		}
	}
	asymStyle := SeriesStyle(2)
	asymStyle.Dashes = []vg.Length{vg.Points(3), vg.Points(2)}
	for i, c := range []*curve{
		{x: x, y: pos, style: SeriesStyle(0)},
		{x: x, y: neg, style: SeriesStyle(1)},
		{x: x, y: asym, style: asymStyle},
	} {
		p.Add(c)
		if o.Legend != LegendNone {
			p.Legend.Add(lab[i], c)
		}
	}
	placeLegend(p, o.Legend)
	p.X.Min, p.X.Max = 0, math.Max(1, float64(n-1))
	var t plot.Ticker = lagTicks{}
	p.X.Tick.Marker = t
	p.X.Label.Text = o.XLabel
	p.Y.Label.Text = o.YLabel
	p.Title.Text = o.Title
	finishY(p)
	return &Figure{Width: w, Height: h, panels: []*plot.Plot{p}}, nil
}
