package figures

import (
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// curve is a polyline through (x, y) that breaks where y is NaN.
type curve struct {
	x, y  []float64
	style draw.LineStyle
}

func (c *curve) Plot(dc draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&dc)
	var seg []vg.Point
	flush := func() {
		if len(seg) > 1 {
			dc.StrokeLines(c.style, dc.ClipLinesXY(seg)...)
		}
		seg = seg[:0]
	}
	for i := range c.x {
		if math.IsNaN(c.y[i]) || math.IsNaN(c.x[i]) {
			flush()
			continue
		}
		seg = append(seg, vg.Point{X: trX(c.x[i]), Y: trY(c.y[i])})
	}
	flush()
}

func (c *curve) DataRange() (xmin, xmax, ymin, ymax float64) {
	return finiteRange(c.x, c.y)
}

func (c *curve) Thumbnail(dc *draw.Canvas) {
	y := dc.Center().Y
	dc.StrokeLine2(c.style, dc.Min.X, y, dc.Max.X, y)
}

// area fills the region between lo and hi (both NaN-broken).
type area struct {
	x, lo, hi []float64
	fill      color.Color
}

func (a *area) Plot(dc draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&dc)
	start := -1
	emit := func(end int) {
		if start < 0 || end-start < 2 {
			return
		}
		var pts []vg.Point
		for i := start; i < end; i++ {
			pts = append(pts, vg.Point{X: trX(a.x[i]), Y: trY(a.hi[i])})
		}
		for i := end - 1; i >= start; i-- {
			pts = append(pts, vg.Point{X: trX(a.x[i]), Y: trY(a.lo[i])})
		}
		dc.FillPolygon(a.fill, dc.ClipPolygonXY(pts))
	}
	for i := range a.x {
		ok := !math.IsNaN(a.lo[i]) && !math.IsNaN(a.hi[i])
		switch {
		case ok && start < 0:
			start = i
		case !ok && start >= 0:
			emit(i)
			start = -1
		}
	}
	emit(len(a.x))
}

func (a *area) DataRange() (xmin, xmax, ymin, ymax float64) {
	x0, x1, y0, y1 := finiteRange(a.x, a.lo)
	_, _, z0, z1 := finiteRange(a.x, a.hi)
	return x0, x1, math.Min(y0, z0), math.Max(y1, z1)
}

func (a *area) Thumbnail(dc *draw.Canvas) {
	dc.FillPolygon(a.fill, []vg.Point{
		{X: dc.Min.X, Y: dc.Min.Y}, {X: dc.Max.X, Y: dc.Min.Y},
		{X: dc.Max.X, Y: dc.Max.Y}, {X: dc.Min.X, Y: dc.Max.Y}})
}

// hline is a horizontal reference line across the data area.
type hline struct {
	y     float64
	style draw.LineStyle
}

func (h *hline) Plot(dc draw.Canvas, p *plot.Plot) {
	_, trY := p.Transforms(&dc)
	y := trY(h.y)
	if y < dc.Min.Y || y > dc.Max.Y {
		return
	}
	dc.StrokeLine2(h.style, dc.Min.X, y, dc.Max.X, y)
}

// DataRange keeps the reference value inside the y range.
func (h *hline) DataRange() (xmin, xmax, ymin, ymax float64) {
	return math.Inf(1), math.Inf(-1), h.y, h.y
}

// windows shades vertical bands [from, to] across the data area.
type windows struct {
	from, to []float64
	fill     color.Color
}

func (w *windows) Plot(dc draw.Canvas, p *plot.Plot) {
	trX, _ := p.Transforms(&dc)
	for i := range w.from {
		x0 := max(trX(w.from[i]), dc.Min.X)
		x1 := min(trX(w.to[i]), dc.Max.X)
		if x1 <= x0 {
			continue
		}
		dc.FillPolygon(w.fill, []vg.Point{
			{X: x0, Y: dc.Min.Y}, {X: x1, Y: dc.Min.Y},
			{X: x1, Y: dc.Max.Y}, {X: x0, Y: dc.Max.Y}})
	}
}

// bars draws one vertical bar from 0 to v[i] centred on x[i].
type bars struct {
	x, v  []float64
	width float64 // in data units
	fill  color.Color
}

func (b *bars) Plot(dc draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&dc)
	for i := range b.x {
		if math.IsNaN(b.v[i]) {
			continue
		}
		x0, x1 := trX(b.x[i]-b.width/2), trX(b.x[i]+b.width/2)
		y0, y1 := trY(0), trY(b.v[i])
		if y1 < y0 {
			y0, y1 = y1, y0
		}
		if y1-y0 < vg.Points(0.3) { // keep a zero bar visible as a hairline
			y1 = y0 + vg.Points(0.3)
		}
		dc.FillPolygon(b.fill, dc.ClipPolygonXY([]vg.Point{
			{X: x0, Y: y0}, {X: x1, Y: y0}, {X: x1, Y: y1}, {X: x0, Y: y1}}))
	}
}

func (b *bars) DataRange() (xmin, xmax, ymin, ymax float64) {
	x0, x1, y0, y1 := finiteRange(b.x, b.v)
	return x0 - b.width/2, x1 + b.width/2, math.Min(0, y0), math.Max(0, y1)
}

func finiteRange(x, y []float64) (xmin, xmax, ymin, ymax float64) {
	xmin, ymin = math.Inf(1), math.Inf(1)
	xmax, ymax = math.Inf(-1), math.Inf(-1)
	for i := range x {
		if math.IsNaN(x[i]) || math.IsNaN(y[i]) || math.IsInf(y[i], 0) {
			continue
		}
		xmin, xmax = math.Min(xmin, x[i]), math.Max(xmax, x[i])
		ymin, ymax = math.Min(ymin, y[i]), math.Max(ymax, y[i])
	}
	return
}
