package figures

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"

	"github.com/galley-econ/galley/analysis/series"
)

// Options are the caller's choices for a figure. The zero value gives
// the house defaults: DefaultWidth wide, DefaultHeight (or
// DefaultPanelHeight per panel) high, no title, no axis labels, legend
// top left when a panel has two or more named series.
type Options struct {
	Width, Height float64 // inches; 0 for the default
	Title         string  // drawn above the (top) panel; empty for none
	XLabel        string  // below the (bottom) horizontal axis
	YLabel        string  // vertical axis of a one-panel figure
	PanelLabels   []string
	Shade         []Window  // date windows shaded in every panel
	Legend        LegendPos // where the legend goes
	MaxDateLabels int       // labelled date ticks at most; 0 for 6
	// Columns sets Panels out as a grid of this many columns, filled row
	// by row, each panel titled by its PanelLabels entry (the horizontal
	// axis labelled on the bottom row only); 0 or 1 stacks them in one
	// column. The number of panels must be a multiple of Columns.
	Columns int
}

// Window is a span of dates to shade, From and To inclusive (the shading
// runs to the end of the To period).
type Window struct{ From, To series.Date }

// ErrNoData is returned when a figure would have nothing to draw.
var ErrNoData = errors.New("figures: no finite data to draw")

func (o Options) size(panels int) (w, h vg.Length, err error) {
	if o.Columns > 1 {
		panels = (panels + o.Columns - 1) / o.Columns // rows of the grid
	}
	wi, hi := o.Width, o.Height
	if wi == 0 {
		wi = DefaultWidth
	}
	if hi == 0 {
		if panels == 1 {
			hi = DefaultHeight
		} else {
			hi = DefaultPanelHeight * float64(panels)
		}
	}
	if !(wi > 0.5 && wi <= 40) || !(hi > 0.5 && hi <= 40) {
		return 0, 0, fmt.Errorf("figures: size %.3g × %.3g in outside 0.5–40 in", wi, hi)
	}
	return vg.Length(wi) * vg.Inch, vg.Length(hi) * vg.Inch, nil
}

// periodEnd is the decimal date at which the period d ends.
func periodEnd(d series.Date) float64 {
	switch d.Freq {
	case series.Annual, series.Quarterly, series.Monthly:
		return d.Decimal() + 1/float64(d.Freq.PerYear())
	case series.Daily:
		return d.Decimal() + 1.0/365
	default:
		return d.Decimal() + 1
	}
}

// xy converts a series to plot coordinates, checking it.
func xy(s series.Series) (x, y []float64, freq series.Freq, err error) {
	if len(s.Dates) != len(s.Values) {
		return nil, nil, 0, fmt.Errorf("figures: series %q has %d dates for %d values", s.Name, len(s.Dates), len(s.Values))
	}
	if len(s.Values) == 0 {
		return nil, nil, 0, fmt.Errorf("figures: series %q is empty", s.Name)
	}
	freq = s.Dates[0].Freq
	x = make([]float64, len(s.Dates))
	y = make([]float64, len(s.Values))
	finite := 0
	for i, d := range s.Dates {
		if d.Freq != freq {
			return nil, nil, 0, fmt.Errorf("figures: series %q mixes %v and %v dates", s.Name, freq, d.Freq)
		}
		x[i] = d.Decimal()
		if i > 0 && x[i] <= x[i-1] {
			return nil, nil, 0, fmt.Errorf("figures: series %q dates are not increasing at %s", s.Name, d)
		}
		v := s.Values[i]
		if math.IsInf(v, 0) {
			v = math.NaN()
		}
		if !math.IsNaN(v) {
			finite++
		}
		y[i] = v
	}
	if finite == 0 {
		return nil, nil, 0, fmt.Errorf("%w: series %q has only missing values", ErrNoData, s.Name)
	}
	return x, y, freq, nil
}

// datedXY pairs dates with a statistic, as for the stability figures.
func datedXY(dates []series.Date, name string, v []float64) ([]float64, []float64, series.Freq, error) {
	return xy(series.Series{Name: name, Dates: dates, Values: v})
}

// finishY pads the vertical range by 5% on each side (a flat series gets
// ±1, or ±5% of its level).
func finishY(p *plot.Plot) {
	lo, hi := p.Y.Min, p.Y.Max
	if math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		lo, hi = -1, 1
	}
	if hi == lo {
		d := math.Max(math.Abs(lo)*0.05, 1)
		lo, hi = lo-d, hi+d
	}
	pad := 0.05 * (hi - lo)
	p.Y.Min, p.Y.Max = lo-pad, hi+pad
}

// dateAxis sets up a date x axis over [lo, hi].
func dateAxis(p *plot.Plot, freq series.Freq, lo, hi float64, o Options, labels bool) {
	p.X.Min, p.X.Max = lo, hi
	var t plot.Ticker = DateTicks{Freq: freq, MaxLabels: o.MaxDateLabels}
	if !labels {
		t = blankLabels{t}
	}
	p.X.Tick.Marker = t
}

func addShade(p *plot.Plot, ws []Window) error {
	if len(ws) == 0 {
		return nil
	}
	w := &windows{fill: shadeFill}
	for _, win := range ws {
		a, b := win.From.Decimal(), periodEnd(win.To)
		if b <= a {
			return fmt.Errorf("figures: shaded window %s–%s ends before it starts", win.From, win.To)
		}
		w.from = append(w.from, a)
		w.to = append(w.to, b)
	}
	p.Add(w)
	return nil
}
