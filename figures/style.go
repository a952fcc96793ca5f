package figures

import (
	"image/color"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Default sizes, in inches.
const (
	DefaultWidth       = 3.4  // one column of a two-column page
	DefaultHeight      = 2.25 // single-panel figure
	DefaultPanelHeight = 1.5  // each panel of a stacked figure
	DefaultDPI         = 300  // PNG resolution when none is given
)

// The house style. Shades are chosen so that the series remain apart
// in greyscale (luminance roughly 12%, 40%, 55%, 30%, 65%), and each
// series also has its own dash pattern.
var (
	inkColor   = color.RGBA{0x1f, 0x1f, 0x1f, 0xff}
	axisColor  = color.RGBA{0x44, 0x44, 0x44, 0xff}
	gridColor  = color.RGBA{0xe4, 0xe4, 0xe4, 0xff}
	labelColor = color.RGBA{0x2e, 0x2e, 0x2e, 0xff}
	refColor   = color.RGBA{0x80, 0x80, 0x80, 0xff} // zero lines
	bandLine   = color.RGBA{0x6a, 0x6a, 0x6a, 0xff} // significance lines
	bandFill   = color.RGBA{0xd5, 0xdb, 0xe1, 0xff} // confidence areas
	shadeFill  = color.RGBA{0xee, 0xee, 0xee, 0xff} // marked date windows
	barFill    = color.RGBA{0x4b, 0x55, 0x60, 0xff} // correlogram bars

	fontSans = font.Font{Typeface: "Liberation", Variant: "Sans"}
)

const (
	tickFontSize   = 7.5 // points
	labelFontSize  = 8
	legendFontSize = 7.5
	titleFontSize  = 9
	axisWidth      = 0.45
	gridWidth      = 0.35
	seriesWidth    = 1.0
	refWidth       = 0.5
)

// seriesStyles is the sequence of line styles for the series of one panel.
var seriesStyles = []draw.LineStyle{
	{Color: inkColor, Width: vg.Points(seriesWidth)},
	{Color: color.RGBA{0x4e, 0x66, 0x7d, 0xff}, Width: vg.Points(seriesWidth), Dashes: []vg.Length{vg.Points(3.6), vg.Points(1.8)}},
	{Color: color.RGBA{0x9c, 0x7a, 0x48, 0xff}, Width: vg.Points(1.25), Dashes: []vg.Length{vg.Points(1), vg.Points(1.6)}},
	{Color: color.RGBA{0x5c, 0x5c, 0x5c, 0xff}, Width: vg.Points(seriesWidth), Dashes: []vg.Length{vg.Points(5), vg.Points(1.5), vg.Points(1), vg.Points(1.5)}},
	{Color: color.RGBA{0xa0, 0xa0, 0xa0, 0xff}, Width: vg.Points(1.4), Dashes: []vg.Length{vg.Points(7), vg.Points(2.5)}},
}

// MaxSeries is the number of distinct series styles, the most lines one
// panel may hold.
var MaxSeries = len(seriesStyles)

// SeriesStyle returns the line style of the i-th series of a panel.
func SeriesStyle(i int) draw.LineStyle {
	s := seriesStyles[i%len(seriesStyles)]
	s.Dashes = append([]vg.Length(nil), s.Dashes...)
	return s
}

func textStyle(size float64, c color.Color) text.Style {
	return text.Style{
		Color:   c,
		Font:    font.From(fontSans, vg.Points(size)),
		Handler: plot.DefaultTextHandler,
	}
}

// newPlot returns an empty panel in the house style.
func newPlot() *plot.Plot {
	p := plot.New()
	p.BackgroundColor = color.White
	p.Title.TextStyle = textStyle(titleFontSize, labelColor)
	p.Title.TextStyle.XAlign = draw.XCenter
	p.Title.TextStyle.YAlign = draw.YTop
	p.Title.Padding = vg.Points(4)
	for _, a := range []*plot.Axis{&p.X, &p.Y} {
		a.LineStyle = draw.LineStyle{Color: axisColor, Width: vg.Points(axisWidth)}
		a.Tick.LineStyle = draw.LineStyle{Color: axisColor, Width: vg.Points(axisWidth)}
		a.Tick.Length = vg.Points(3)
		a.Padding = 0
		a.Label.TextStyle = textStyle(labelFontSize, labelColor)
		a.Label.Padding = vg.Points(3)
	}
	p.X.Tick.Label = textStyle(tickFontSize, labelColor)
	p.X.Tick.Label.XAlign = draw.XCenter
	p.X.Tick.Label.YAlign = draw.YTop
	p.Y.Tick.Label = textStyle(tickFontSize, labelColor)
	p.Y.Tick.Label.XAlign = draw.XRight
	p.Y.Tick.Label.YAlign = draw.YCenter
	p.X.Label.TextStyle.XAlign = draw.XCenter
	p.X.Label.TextStyle.YAlign = draw.YBottom
	p.Y.Label.TextStyle.XAlign = draw.XCenter
	p.Y.Label.TextStyle.YAlign = draw.YBottom
	p.Y.Tick.Marker = valueTicks{}

	p.Legend.TextStyle = textStyle(legendFontSize, labelColor)
	p.Legend.ThumbnailWidth = vg.Points(18)
	p.Legend.Padding = vg.Points(1.5)

	g := plotter.NewGrid()
	g.Vertical.Color = nil
	g.Horizontal = draw.LineStyle{Color: gridColor, Width: vg.Points(gridWidth)}
	p.Add(g)
	return p
}

// LegendPos places the legend inside the data area.
type LegendPos int

const (
	LegendTopLeft LegendPos = iota // default
	LegendTopRight
	LegendBottomLeft
	LegendBottomRight
	LegendNone
)

func placeLegend(p *plot.Plot, pos LegendPos) {
	p.Legend.Top = pos == LegendTopLeft || pos == LegendTopRight
	p.Legend.Left = pos == LegendTopLeft || pos == LegendBottomLeft
	const inset = 5
	if p.Legend.Left {
		p.Legend.XOffs = vg.Points(inset)
	} else {
		p.Legend.XOffs = -vg.Points(inset)
	}
	if p.Legend.Top {
		p.Legend.YOffs = -vg.Points(inset - 2)
	} else {
		p.Legend.YOffs = vg.Points(inset)
	}
}
