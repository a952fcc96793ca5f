package figures

import (
	"image/color"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg"
)

// sharePanel is a panel of n horizons whose bands split the whole in the
// proportions w (normalised), moving towards equal shares with h.
func sharePanel(label string, names []string, n int) SharePanel {
	pn := SharePanel{Label: label}
	k := float64(len(names))
	for j, name := range names {
		v := make([]float64, n)
		for h := range v {
			t := float64(h) / float64(n)
			own := 0.0
			if j == 0 {
				own = 1
			}
			v[h] = (1-t)*own + t/k
		}
		pn.Bands = append(pn.Bands, ShareBand{Name: name, Values: v})
	}
	return pn
}

func TestSharesFigure(t *testing.T) {
	names := []string{"fuel", "North price", "South price"}
	f, err := Shares([]SharePanel{sharePanel("North", names, 24), sharePanel("South", names, 24)}, Options{XLabel: "forecast horizon"})
	if err != nil {
		t.Fatal(err)
	}
	if f.Panels() != 2 || f.Width != vg.Length(DefaultWidth)*vg.Inch || f.Height != vg.Length(2*DefaultPanelHeight)*vg.Inch {
		t.Errorf("panels %d, size %v × %v", f.Panels(), f.Width, f.Height)
	}
	for _, format := range []string{"svg", "pdf", "png"} {
		b, err := f.Render(format, 72)
		if err != nil || len(b) == 0 {
			t.Fatalf("%s: %v", format, err)
		}
		if format == "svg" {
			svg := string(b)
			// the legend once, the axis from 0% to 100%, the panel labels
			for _, want := range []string{">fuel<", ">North price<", ">South price<", ">0%<", ">100%<", ">North<", ">South<", ">forecast horizon<"} {
				if !strings.Contains(svg, want) {
					t.Errorf("the SVG lacks %q", want)
				}
			}
			if c := strings.Count(svg, ">North price<"); c != 1 {
				t.Errorf("the legend is drawn %d times", c)
			}
		}
	}
	// 200 horizons: bars without gaps; one horizon: one bar; a title above the legend
	for _, n := range []int{200, 1} {
		f, err := Shares([]SharePanel{sharePanel("North", names, n)}, Options{Title: "Shares"})
		if err != nil {
			t.Fatal(err)
		}
		svg, err := f.Render("svg", 0)
		if err != nil {
			t.Fatal(err)
		}
		if !strings.Contains(string(svg), ">Shares<") || !strings.Contains(string(svg), ">South price<") {
			t.Errorf("%d horizons: the title or the legend is missing", n)
		}
	}
}

// TestSharesLegendRows: long names go on as many rows as the width needs,
// and the panel's title makes room for them.
func TestSharesLegendRows(t *testing.T) {
	long := []string{"the index of fuel costs (log)", "the price in the northern zone (log)", "the price in the southern zone (log)"}
	narrow, err := Shares([]SharePanel{sharePanel("North", long, 12)}, Options{Width: 2.5})
	if err != nil {
		t.Fatal(err)
	}
	wide, err := Shares([]SharePanel{sharePanel("North", []string{"a", "b", "c"}, 12)}, Options{Width: 2.5})
	if err != nil {
		t.Fatal(err)
	}
	// the rows the title makes room for (addRowLegend's arithmetic)
	rows := func(f *Figure) int {
		p := f.panels[0]
		if p.Title.Text == "" {
			return 0
		}
		ext := p.Title.TextStyle.FontExtents()
		rowH := ext.Ascent + ext.Descent + vg.Points(2)
		th := p.Title.TextStyle.Rectangle(p.Title.Text).Size().Y
		return int(math.Round(float64((p.Title.Padding + th - vg.Points(legendAbove)) / rowH)))
	}
	if rows(narrow) < 2 || rows(wide) != 1 {
		t.Errorf("legend rows: long names %d, short names %d", rows(narrow), rows(wide))
	}
	if narrow.panels[0].Title.Padding <= wide.panels[0].Title.Padding {
		t.Error("the title does not make more room for more legend rows")
	}
	none, err := Shares([]SharePanel{sharePanel("North", long, 12)}, Options{Legend: LegendNone})
	if err != nil {
		t.Fatal(err)
	}
	if rows(none) != 0 || none.panels[0].Title.Text != "" {
		t.Error("legend none still draws a legend")
	}
}

// TestShareFills: the shades get lighter band by band, far enough apart
// to be told apart in greyscale.
func TestShareFills(t *testing.T) {
	lum := func(c color.Color) float64 {
		r, g, b, _ := c.RGBA()
		return (0.2126*float64(r) + 0.7152*float64(g) + 0.0722*float64(b)) / 0xffff
	}
	for n := 1; n <= MaxShareBands; n++ {
		fs := shareFills(n)
		for j := 1; j < n; j++ {
			if d := lum(fs[j]) - lum(fs[j-1]); d < 0.12 {
				t.Errorf("%d bands: shades %d and %d differ by %.3f in luminance", n, j, j+1, d)
			}
		}
	}
}

func TestSharesBadInput(t *testing.T) {
	names := []string{"a", "b"}
	good := sharePanel("x", names, 5)
	seven := sharePanel("x", []string{"a", "b", "c", "d", "e", "f", "g"}, 5)
	short := sharePanel("y", names, 4)
	other := sharePanel("y", []string{"a", "c"}, 5)
	bad := sharePanel("y", names, 5)
	bad.Bands[1].Values[2] = 1.5
	for _, tc := range []struct {
		name   string
		panels []SharePanel
		want   string
	}{
		{"none", nil, "no shares"},
		{"too many bands", []SharePanel{seven}, "at most 6"},
		{"fewer horizons", []SharePanel{good, short}, "4 horizons, not 5"},
		{"other bands", []SharePanel{good, other}, `band 2 of panel 2 is "c"`},
		{"out of range", []SharePanel{good, bad}, "not between 0 and 1"},
	} {
		if _, err := Shares(tc.panels, Options{}); err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: err = %v, want %q", tc.name, err, tc.want)
		}
	}
}
