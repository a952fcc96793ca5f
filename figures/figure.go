package figures

import (
	"bytes"
	"fmt"
	"io"
	"strings"
	"sync"
	"time"

	"codeberg.org/go-pdf/fpdf"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgpdf"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Figure is a finished figure: one or more panels stacked vertically on a
// page of the given size.
type Figure struct {
	Width, Height vg.Length
	panels        []*plot.Plot
	cols          int // panels per row (0 or 1: one column)
}

// Panels returns the number of panels.
func (f *Figure) Panels() int { return len(f.panels) }

// draw renders the panels onto a canvas.
func (f *Figure) draw(c vg.CanvasSizer) {
	dc := draw.New(c)
	margin := vg.Points(4)
	if len(f.panels) == 1 {
		f.panels[0].Draw(draw.Crop(dc, margin, -margin, margin, -margin))
		return
	}
	cols := max(f.cols, 1)
	rows := make([][]*plot.Plot, (len(f.panels)+cols-1)/cols)
	for i, p := range f.panels {
		rows[i/cols] = append(rows[i/cols], p)
	}
	tiles := draw.Tiles{Rows: len(rows), Cols: cols,
		PadTop: margin, PadBottom: margin, PadLeft: margin, PadRight: margin, PadX: vg.Points(8), PadY: vg.Points(6)}
	cs := plot.Align(rows, tiles, dc)
	for i, p := range f.panels {
		p.Draw(cs[i/cols][i%cols])
	}
}

// WriteSVG writes the figure as SVG.
//
// The text names its font with fallbacks of the same metrics (Arimo,
// Arial, Helvetica), so that a viewer without Liberation Sans sets the
// labels in the widths the layout was computed for.
func (f *Figure) WriteSVG(w io.Writer) error {
	c := vgsvg.New(f.Width, f.Height)
	f.draw(c)
	var b bytes.Buffer
	if _, err := c.WriteTo(&b); err != nil {
		return wrap("svg", err)
	}
	_, err := w.Write(bytes.ReplaceAll(b.Bytes(), []byte("font-family:Liberation Sans;"), []byte(svgFonts)))
	return wrap("svg", err)
}

// svgFonts is the font of SVG text: Liberation Sans, or a face with its
// metrics.
const svgFonts = "font-family:'Liberation Sans',Arimo,Arial,Helvetica,sans-serif;"

// pdfDate is the creation and modification date written into every
// figure PDF. The PDF library writes the time of the build unless told
// otherwise, so the same figure gave different bytes at every build;
// with a fixed date the same inputs give the same file (common practice
// for reproducible builds; the date itself means nothing).
var pdfDate = time.Date(2000, 1, 1, 0, 0, 0, 0, time.UTC)

var pdfDefaults sync.Once

// WritePDF writes the figure as a one-page PDF with its fonts embedded.
func (f *Figure) WritePDF(w io.Writer) error {
	pdfDefaults.Do(func() {
		// vgpdf makes its document without a way to set these, so they
		// are set as the PDF library's defaults for every document.
		fpdf.SetDefaultCreationDate(pdfDate)
		fpdf.SetDefaultModificationDate(pdfDate)
		fpdf.SetDefaultCatalogSort(true)
	})
	c := vgpdf.New(f.Width, f.Height)
	c.EmbedFonts(true)
	f.draw(cp1252Canvas{c})
	_, err := c.WriteTo(w)
	return wrap("pdf", err)
}

// WritePNG writes the figure as PNG at dpi dots per inch (DefaultDPI when
// dpi ≤ 0). The image is round(width·dpi) × round(height·dpi) pixels.
func (f *Figure) WritePNG(w io.Writer, dpi int) error {
	if dpi <= 0 {
		dpi = DefaultDPI
	}
	if dpi > 2400 {
		return fmt.Errorf("figures: PNG resolution %d dpi is above the limit of 2400", dpi)
	}
	c := vgimg.NewWith(vgimg.UseWH(f.Width, f.Height), vgimg.UseDPI(dpi))
	f.draw(c)
	_, err := vgimg.PngCanvas{Canvas: c}.WriteTo(w)
	return wrap("png", err)
}

// Render returns the figure in the named format: "svg", "pdf" or "png"
// (dpi is used for PNG only).
func (f *Figure) Render(format string, dpi int) ([]byte, error) {
	var b bytes.Buffer
	var err error
	switch strings.ToLower(format) {
	case "svg":
		err = f.WriteSVG(&b)
	case "pdf":
		err = f.WritePDF(&b)
	case "png":
		err = f.WritePNG(&b, dpi)
	default:
		return nil, fmt.Errorf("figures: unknown output format %q (want svg, pdf or png)", format)
	}
	if err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}

func wrap(kind string, err error) error {
	if err != nil {
		return fmt.Errorf("figures: writing %s: %w", kind, err)
	}
	return nil
}

// cp1252Canvas writes text through a PDF canvas whose fonts are encoded
// in cp1252, which has no U+2212 and no Greek: the typographic minus
// becomes the hyphen-minus there (SVG and PNG keep the true minus), and
// the difference sign Δ of a typeset term (Δlog(north)) is drawn as an
// outlined triangle in the glyph's place and width.
//
// It also sets every string in one size, pdfFontSize, scaled by the
// canvas to the size asked for: vgpdf converts a TrueType font for PDF
// (parsing and compressing the whole font file) once per process for
// each font face *and size*, and embeds it in a document once per size,
// so text in three sizes cost three conversions and three copies of
// the font in every PDF. Drawn in one size, a face is converted once
// per process and embedded once per file; the page looks the same.
type cp1252Canvas struct{ vg.CanvasSizer }

// pdfFontSize is the one size cp1252Canvas sets text in.
const pdfFontSize = vg.Length(10)

// delta is the difference sign of typeset terms.
const delta = "Δ"

func (c cp1252Canvas) FillString(f font.Face, pt vg.Point, s string) {
	s = strings.ReplaceAll(s, minus, "-")
	for i, part := range strings.Split(s, delta) {
		if i > 0 {
			w := f.Width(delta)
			c.drawDelta(f.Font.Size, pt, w)
			pt.X += w
		}
		if part != "" {
			c.fill(f, pt, part)
			pt.X += f.Width(part)
		}
	}
}

// fill draws s at pdfFontSize, scaled to f's size.
func (c cp1252Canvas) fill(f font.Face, pt vg.Point, s string) {
	if f.Font.Size <= 0 || f.Font.Size == pdfFontSize {
		c.CanvasSizer.FillString(f, pt, s)
		return
	}
	k := f.Font.Size / pdfFontSize
	f.Font.Size = pdfFontSize
	c.Push()
	c.Translate(pt)
	c.Scale(float64(k), float64(k))
	c.CanvasSizer.FillString(f, vg.Point{}, s)
	c.Pop()
}

// drawDelta strokes an upright triangle, the shape of a sans-serif Δ, on
// the baseline at pt in an advance of w for type of size em: the height
// of a capital (0.70 em) and a stem of 0.07 em, in the current colour.
func (c cp1252Canvas) drawDelta(em vg.Length, pt vg.Point, w vg.Length) {
	lw := 0.07 * em
	side := 0.04*em + lw/2
	var p vg.Path
	p.Move(vg.Point{X: pt.X + side, Y: pt.Y + lw/2})
	p.Line(vg.Point{X: pt.X + w/2, Y: pt.Y + 0.70*em - lw/2})
	p.Line(vg.Point{X: pt.X + w - side, Y: pt.Y + lw/2})
	p.Close()
	c.Push()
	c.SetLineWidth(lw)
	c.SetLineDash(nil, 0)
	c.Stroke(p)
	c.Pop()
}
