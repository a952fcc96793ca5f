package figures

import (
	"fmt"
	"math"
	"math/cmplx"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// CompanionRoots draws the eigenvalues of a companion matrix in the
// complex plane (real part across, imaginary part up) with the unit
// circle, on axes of equal scale so that the circle is round. The first
// unit roots (those a cointegrating rank imposes, all equal to one) are
// drawn as one open square at 1 + 0i; the others as filled dots. The
// legend names the two kinds (names, in that order; defaults "unit roots
// imposed by the rank (N)" and "other roots").
//
// Without o.Height the figure is as high as it is wide.
func CompanionRoots(roots []complex128, unit int, names []string, o Options) (*Figure, error) {
	if len(roots) == 0 {
		return nil, fmt.Errorf("%w: no roots", ErrNoData)
	}
	if unit < 0 || unit > len(roots) {
		return nil, fmt.Errorf("figures: %d unit roots among %d roots", unit, len(roots))
	}
	if o.Height == 0 {
		o.Height = o.Width
		if o.Height == 0 {
			o.Height = DefaultWidth
		}
	}
	w, h, err := o.size(1)
	if err != nil {
		return nil, err
	}
	lab := []string{fmt.Sprintf("unit roots imposed by the rank (%d)", unit), "other roots"}
	for i := range lab {
		if i < len(names) && names[i] != "" {
			lab[i] = names[i]
		}
	}
	reach := 1.0
	var ux, uy, ox, oy []float64
	for i, z := range roots {
		if cmplx.IsNaN(z) || cmplx.IsInf(z) {
			return nil, fmt.Errorf("figures: root %d is not finite", i+1)
		}
		reach = math.Max(reach, cmplx.Abs(z))
		if i < unit {
			ux, uy = append(ux, real(z)), append(uy, imag(z))
		} else {
			ox, oy = append(ox, real(z)), append(oy, imag(z))
		}
	}
	p := newPlot()
	axisLine := draw.LineStyle{Color: gridColor, Width: vg.Points(0.6)}
	p.Add(&hline{y: 0, style: axisLine}, &vline{x: 0, style: axisLine})
	const steps = 360
	cx, cy := make([]float64, steps+1), make([]float64, steps+1)
	for i := range cx {
		a := 2 * math.Pi * float64(i) / steps
		cx[i], cy[i] = math.Cos(a), math.Sin(a)
	}
	p.Add(&curve{x: cx, y: cy, style: draw.LineStyle{Color: bandLine, Width: vg.Points(0.7)}})
	// The unit roots coincide (at 1 + 0i up to rounding): one marker,
	// drawn over the others and named first.
	var others, units *points
	if len(ox) > 0 {
		others = &points{x: ox, y: oy, glyph: draw.GlyphStyle{Color: inkColor, Radius: vg.Points(2.1), Shape: draw.CircleGlyph{}}}
		p.Add(others)
	}
	if unit > 0 {
		units = &points{x: ux[:1], y: uy[:1], glyph: draw.GlyphStyle{Color: inkColor, Radius: vg.Points(3.4), Shape: openSquare{width: vg.Points(1)}}}
		p.Add(units)
	}
	if o.Legend != LegendNone {
		if units != nil {
			p.Legend.Add(lab[0], units)
		}
		if others != nil {
			p.Legend.Add(lab[1], others)
		}
	}
	placeLegend(p, o.Legend)
	p.X.Label.Text, p.Y.Label.Text = o.XLabel, o.YLabel
	if p.X.Label.Text == "" {
		p.X.Label.Text = "real part"
	}
	if p.Y.Label.Text == "" {
		p.Y.Label.Text = "imaginary part"
	}
	p.Title.Text = o.Title
	p.X.Tick.Marker = valueTicks{}
	lim := 1.12 * reach
	if o.Legend != LegendNone {
		lim = 1.45 * reach // room for the legend above the circle
	}
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = -lim, lim, -lim, lim
	fig := &Figure{Width: w, Height: h, panels: []*plot.Plot{p}}
	equalScale(p, w, h)
	return fig, nil
}

// equalScale widens the x or the y range of the one-panel plot p, drawn on
// a page w × h, until a unit of x and a unit of y have the same length on
// the page. The data area depends on the tick labels, which depend on the
// ranges, so the adjustment is repeated until it settles.
func equalScale(p *plot.Plot, w, h vg.Length) {
	margin := vg.Points(4) // as Figure.draw crops a one-panel figure
	page := draw.Canvas{Rectangle: vg.Rectangle{Min: vg.Point{X: margin, Y: margin}, Max: vg.Point{X: w - margin, Y: h - margin}}}
	cx, cy := (p.X.Min+p.X.Max)/2, (p.Y.Min+p.Y.Max)/2
	hx, hy := (p.X.Max-p.X.Min)/2, (p.Y.Max-p.Y.Min)/2
	for i := 0; i < 6; i++ {
		da := p.DataCanvas(page)
		dw, dh := float64(da.Max.X-da.Min.X), float64(da.Max.Y-da.Min.Y)
		if dw <= 0 || dh <= 0 {
			return
		}
		// units per point must agree: widen the axis that has fewer
		if hx/dw < hy/dh {
			hx = hy * dw / dh
		} else {
			hy = hx * dh / dw
		}
		p.X.Min, p.X.Max = cx-hx, cx+hx
		p.Y.Min, p.Y.Max = cy-hy, cy+hy
	}
}

// AspectRatio returns, for the one-panel figure f, the length on the page
// of one unit of x over that of one unit of y (1 when the scales are
// equal), as drawn.
func (f *Figure) AspectRatio() float64 {
	if len(f.panels) != 1 {
		return math.NaN()
	}
	p := f.panels[0]
	margin := vg.Points(4)
	page := draw.Canvas{Rectangle: vg.Rectangle{Min: vg.Point{X: margin, Y: margin}, Max: vg.Point{X: f.Width - margin, Y: f.Height - margin}}}
	da := p.DataCanvas(page)
	return (float64(da.Max.X-da.Min.X) / (p.X.Max - p.X.Min)) / (float64(da.Max.Y-da.Min.Y) / (p.Y.Max - p.Y.Min))
}

// vline is a vertical reference line across the data area.
type vline struct {
	x     float64
	style draw.LineStyle
}

func (v *vline) Plot(dc draw.Canvas, p *plot.Plot) {
	trX, _ := p.Transforms(&dc)
	x := trX(v.x)
	if x < dc.Min.X || x > dc.Max.X {
		return
	}
	dc.StrokeLine2(v.style, x, dc.Min.Y, x, dc.Max.Y)
}

// DataRange keeps the reference value inside the x range.
func (v *vline) DataRange() (xmin, xmax, ymin, ymax float64) {
	return v.x, v.x, math.Inf(1), math.Inf(-1)
}

// points marks each (x, y) with a glyph.
type points struct {
	x, y  []float64
	glyph draw.GlyphStyle
}

func (s *points) Plot(dc draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&dc)
	for i := range s.x {
		dc.DrawGlyph(s.glyph, vg.Point{X: trX(s.x[i]), Y: trY(s.y[i])})
	}
}

func (s *points) DataRange() (xmin, xmax, ymin, ymax float64) {
	return finiteRange(s.x, s.y)
}

func (s *points) Thumbnail(dc *draw.Canvas) {
	dc.DrawGlyph(s.glyph, dc.Center())
}

// openSquare is a square outline of side 2·Radius and the given stroke
// width.
type openSquare struct{ width vg.Length }

func (q openSquare) DrawGlyph(c *draw.Canvas, sty draw.GlyphStyle, pt vg.Point) {
	r := sty.Radius
	c.SetLineStyle(draw.LineStyle{Color: sty.Color, Width: q.width})
	var path vg.Path
	path.Move(vg.Point{X: pt.X - r, Y: pt.Y - r})
	path.Line(vg.Point{X: pt.X + r, Y: pt.Y - r})
	path.Line(vg.Point{X: pt.X + r, Y: pt.Y + r})
	path.Line(vg.Point{X: pt.X - r, Y: pt.Y + r})
	path.Close()
	c.Stroke(path)
}
