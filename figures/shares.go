package figures

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// ShareBand is one band of a stacked-share panel: its legend name and
// one share (a fraction of one) per horizon h = 1 … H.
type ShareBand struct {
	Name   string
	Values []float64
}

// SharePanel is one panel of a stacked-share figure: the label of its
// vertical axis and its bands, the bottom one first.
type SharePanel struct {
	Label string
	Bands []ShareBand
}

// MaxShareBands is the number of bands a stacked-share panel can tell
// apart by shade.
const MaxShareBands = 6

// Shares draws shares that add up to one — a forecast-error variance
// decomposition — as stacked bars at the horizons h = 1 … H, one panel per
// entry of panels, stacked with one horizon axis. Each bar is filled to
// 100%, the bands in the order given from the bottom, in shades of one
// hue from dark to light (so that they stay apart in greyscale) with a
// thin white line between bands. The vertical axis runs from 0% to 100%
// and carries the panel's label. Every panel must have the same bands
// (by name) over the same horizons; one legend, set in a row (or rows)
// above the top panel, names them, unless o.Legend is LegendNone. When
// the bars would be narrower than 4 points they are drawn without gaps.
func Shares(panels []SharePanel, o Options) (*Figure, error) {
	if len(panels) == 0 || len(panels[0].Bands) == 0 {
		return nil, fmt.Errorf("%w: no shares", ErrNoData)
	}
	bands := panels[0].Bands
	nb, nh := len(bands), len(bands[0].Values)
	if nb > MaxShareBands {
		return nil, fmt.Errorf("figures: %d bands in a panel; the house shades tell at most %d apart", nb, MaxShareBands)
	}
	if nh == 0 {
		return nil, fmt.Errorf("%w: no horizons", ErrNoData)
	}
	for i, pn := range panels {
		if len(pn.Bands) != nb {
			return nil, fmt.Errorf("figures: panel %d has %d bands, panel 1 has %d", i+1, len(pn.Bands), nb)
		}
		for j, b := range pn.Bands {
			if b.Name != bands[j].Name {
				return nil, fmt.Errorf("figures: band %d of panel %d is %q, in panel 1 %q", j+1, i+1, b.Name, bands[j].Name)
			}
			if len(b.Values) != nh {
				return nil, fmt.Errorf("figures: band %q of panel %d has %d horizons, not %d", b.Name, i+1, len(b.Values), nh)
			}
			for h, v := range b.Values {
				if math.IsNaN(v) || math.IsInf(v, 0) || v < -1e-9 || v > 1+1e-9 {
					return nil, fmt.Errorf("figures: share %g of %q at horizon %d (panel %d) is not between 0 and 1", v, b.Name, h+1, i+1)
				}
			}
		}
	}
	w, h, err := o.size(len(panels))
	if err != nil {
		return nil, err
	}
	fills := shareFills(nb)
	fig := &Figure{Width: w, Height: h}
	for i, pn := range panels {
		p := newPlot()
		sb := &stackedBars{n: nh, fills: fills}
		for _, b := range pn.Bands {
			sb.values = append(sb.values, b.Values)
		}
		p.Add(sb)
		p.X.Min, p.X.Max = 0.5, float64(nh)+0.5
		p.X.Tick.Marker = lagTicks{}
		p.Y.Min, p.Y.Max = 0, 100
		p.Y.Tick.Marker = percentTicks{}
		p.Y.Label.Text = pn.Label
		if i < len(o.PanelLabels) && o.PanelLabels[i] != "" {
			p.Y.Label.Text = o.PanelLabels[i]
		}
		if len(panels) == 1 && o.YLabel != "" {
			p.Y.Label.Text = o.YLabel
		}
		last := i == len(panels)-1
		if last {
			p.X.Label.Text = o.XLabel
		} else {
			p.X.Tick.Marker = blankLabels{lagTicks{}}
		}
		fig.panels = append(fig.panels, p)
	}
	top := fig.panels[0]
	if o.Legend != LegendNone {
		names := make([]string, nb)
		for j, b := range bands {
			names[j] = b.Name
		}
		addRowLegend(top, names, fills, w, h, len(panels), o.Title)
	} else {
		top.Title.Text = o.Title
	}
	return fig, nil
}

// shareFills returns n fills of the house slate hue, evenly spaced in
// lightness from dark (the bottom band) to light.
func shareFills(n int) []color.Color {
	dark := [3]float64{0x27, 0x30, 0x3a}
	light := [3]float64{0xe2, 0xe7, 0xec}
	out := make([]color.Color, n)
	for j := range out {
		t := 0.0
		if n > 1 {
			t = float64(j) / float64(n-1)
		}
		var c [3]uint8
		for k := range c {
			c[k] = uint8(math.Round(dark[k] + t*(light[k]-dark[k])))
		}
		out[j] = color.RGBA{c[0], c[1], c[2], 0xff}
	}
	return out
}

// stackedBars draws, at x = 1 … n, bars of the bands values[j] stacked in
// order, in percent of the whole.
type stackedBars struct {
	n      int
	values [][]float64 // [band][horizon], fractions
	fills  []color.Color
}

func (s *stackedBars) Plot(dc draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&dc)
	slot := trX(2) - trX(1)
	half := slot / 2 // bars without gaps
	gaps := slot >= vg.Points(4)
	if gaps {
		half = 0.36 * slot
	}
	sep := draw.LineStyle{Color: color.White, Width: vg.Points(0.5)}
	lo := make([]float64, s.n)
	hi := make([]float64, s.n)
	for j, v := range s.values {
		for h := range lo {
			lo[h] = hi[h]
			hi[h] = math.Min(100, lo[h]+100*math.Max(v[h], 0))
			if j == len(s.values)-1 {
				hi[h] = 100 // the last band closes the bar (rounding)
			}
		}
		if gaps {
			for h := range lo {
				x := trX(float64(h + 1))
				dc.FillPolygon(s.fills[j], []vg.Point{{X: x - half, Y: trY(lo[h])}, {X: x + half, Y: trY(lo[h])},
					{X: x + half, Y: trY(hi[h])}, {X: x - half, Y: trY(hi[h])}})
			}
		} else {
			// one polygon per band: steps along the top, back along the bottom
			var pts []vg.Point
			for h := range hi {
				x := trX(float64(h + 1))
				pts = append(pts, vg.Point{X: x - half, Y: trY(hi[h])}, vg.Point{X: x + half, Y: trY(hi[h])})
			}
			for h := s.n - 1; h >= 0; h-- {
				x := trX(float64(h + 1))
				pts = append(pts, vg.Point{X: x + half, Y: trY(lo[h])}, vg.Point{X: x - half, Y: trY(lo[h])})
			}
			dc.FillPolygon(s.fills[j], pts)
		}
	}
	// the white lines between bands, drawn last so no fill covers them
	cum := make([]float64, s.n)
	for _, v := range s.values[:len(s.values)-1] {
		for h := range cum {
			cum[h] = math.Min(100, cum[h]+100*math.Max(v[h], 0))
			if cum[h] <= 0 || cum[h] >= 100 {
				continue
			}
			x, y := trX(float64(h+1)), trY(cum[h])
			dc.StrokeLine2(sep, x-half, y, x+half, y)
		}
	}
}

// percentTicks labels 0 … 100 at steps of 25 as percentages.
type percentTicks struct{}

func (percentTicks) Ticks(min, max float64) []plot.Tick {
	var t []plot.Tick
	for v := 0.0; v <= 100; v += 25 {
		if v >= min-1e-9 && v <= max+1e-9 {
			t = append(t, plot.Tick{Value: v, Label: fmt.Sprintf("%g%%", v)})
		}
	}
	return t
}

// rowLegend sets legend entries (a filled swatch and a name) side by side
// in rows above the data area of its plot, in the room the plot's title
// reserves; rows[r] lists the entries of row r, top row first.
type rowLegend struct {
	names []string
	fills []color.Color
	rows  [][]int
	style text.Style
	rowH  vg.Length
}

const (
	legendSwatch = 6.5 // points, the side of a swatch
	legendSpace  = 3   // points between a swatch and its name
	legendGap    = 10  // points between entries
	legendAbove  = 3   // points between the data area and the lowest row
)

// width is the page width entry j takes, swatch and name.
func (l *rowLegend) width(j int) vg.Length {
	return vg.Points(legendSwatch+legendSpace) + l.style.Rectangle(l.names[j]).Size().X
}

func (l *rowLegend) Plot(dc draw.Canvas, _ *plot.Plot) {
	ext := l.style.FontExtents()
	outline := draw.LineStyle{Color: axisColor, Width: vg.Points(0.3)}
	for r, row := range l.rows {
		// baseline of row r, counted from the lowest row up
		base := dc.Max.Y + vg.Points(legendAbove) + vg.Length(len(l.rows)-1-r)*l.rowH + ext.Descent
		x := dc.Min.X
		for _, j := range row {
			s := vg.Points(legendSwatch)
			y0 := base + (ext.Ascent-ext.Descent)/2 - s/2
			sq := []vg.Point{{X: x, Y: y0}, {X: x + s, Y: y0}, {X: x + s, Y: y0 + s}, {X: x, Y: y0 + s}}
			dc.FillPolygon(l.fills[j], sq)
			dc.StrokeLines(outline, append(sq, sq[0]))
			dc.FillText(l.style, vg.Point{X: x + s + vg.Points(legendSpace), Y: base}, l.names[j])
			x += l.width(j) + vg.Points(legendGap)
		}
	}
}

// addRowLegend puts a row legend of names above the data area of the top
// panel p of a figure w × h with the given number of panels, in as many
// rows as the width of the data area needs, and makes room for it with
// the panel's title (title, if any, above the legend).
func addRowLegend(p *plot.Plot, names []string, fills []color.Color, w, h vg.Length, panels int, title string) {
	l := &rowLegend{names: names, fills: fills, style: textStyle(legendFontSize, labelColor)}
	l.style.XAlign, l.style.YAlign = draw.XLeft, draw.YBottom
	ext := l.style.FontExtents()
	l.rowH = ext.Ascent + ext.Descent + vg.Points(2)
	// the width of the data area, as Figure.draw lays out a panel
	margin := vg.Points(4)
	page := draw.Canvas{Rectangle: vg.Rectangle{Min: vg.Point{X: margin, Y: margin}, Max: vg.Point{X: w - margin, Y: margin + h/vg.Length(panels)}}}
	da := p.DataCanvas(page)
	avail := da.Max.X - da.Min.X
	var row []int
	var used vg.Length
	for j := range names {
		wj := l.width(j)
		if len(row) > 0 && used+vg.Points(legendGap)+wj > avail {
			l.rows = append(l.rows, row)
			row, used = nil, 0
		}
		if len(row) > 0 {
			used += vg.Points(legendGap)
		}
		row = append(row, j)
		used += wj
	}
	l.rows = append(l.rows, row)
	p.Add(l)
	need := vg.Length(len(l.rows))*l.rowH + vg.Points(legendAbove)
	if title != "" {
		// the title above, its padding the room for the rows
		p.Title.Text = title
		p.Title.Padding += need
		return
	}
	// The title (a space) and its padding reserve the rows.
	p.Title.Text = " "
	p.Title.TextStyle = l.style
	th := l.style.Rectangle(p.Title.Text).Size().Y
	p.Title.Padding = max(need-th, 0)
}
