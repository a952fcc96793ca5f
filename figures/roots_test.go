package figures

import (
	"bytes"
	"math"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/series"
)

// TestCompanionRootsRound: the unit circle is drawn round (equal scales)
// whatever the page's shape, and the figure renders.
func TestCompanionRootsRound(t *testing.T) {
	roots := []complex128{1, 1, complex(0.62, 0.31), complex(0.62, -0.31), -0.2, 0.05}
	for _, o := range []Options{{}, {Width: 6, Height: 3}, {Width: 2.5, Height: 4}, {Legend: LegendNone}} {
		fig, err := CompanionRoots(roots, 2, nil, o)
		if err != nil {
			t.Fatal(err)
		}
		if a := fig.AspectRatio(); math.Abs(a-1) > 1e-3 {
			t.Errorf("%v: a unit of x is %.4f units of y long on the page", o, a)
		}
		var b bytes.Buffer
		if err := fig.WriteSVG(&b); err != nil {
			t.Fatal(err)
		}
		if o.Legend != LegendNone && !strings.Contains(b.String(), "unit roots imposed by the rank (2)") {
			t.Error("the legend does not name the unit roots")
		}
	}
	if _, err := CompanionRoots(nil, 0, nil, Options{}); err == nil {
		t.Error("no roots: no error")
	}
	if _, err := CompanionRoots(roots, 7, nil, Options{}); err == nil {
		t.Error("more unit roots than roots: no error")
	}
	if _, err := CompanionRoots([]complex128{complex(math.NaN(), 0)}, 0, nil, Options{}); err == nil {
		t.Error("a NaN root: no error")
	}
}

func TestRecursiveRankFigure(t *testing.T) {
	var dates []series.Date
	d := series.Date{Freq: series.Quarterly, Year: 2000, Sub: 1}
	for i := 0; i < 20; i++ {
		dates = append(dates, d)
		d = d.Add(1)
	}
	path := func(name string, f float64) Path {
		v := make([]float64, len(dates))
		for i := range v {
			v[i] = f * float64(i+1) / 20
		}
		return Path{Name: name, Values: v}
	}
	fig, err := RecursiveRank(dates, []Path{path("λ1", 0.5)}, []Path{path("r = 0", 2), path("r = 1", 0.5)}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if fig.Panels() != 2 {
		t.Errorf("%d panels, want 2", fig.Panels())
	}
	if _, err := fig.Render("svg", 0); err != nil {
		t.Fatal(err)
	}
	six := make([]Path, 6)
	for i := range six {
		six[i] = path("x", 1)
	}
	if _, err := RecursiveRank(dates, six, six[:1], Options{}); err == nil {
		t.Error("six paths in a panel: no error")
	}
	if _, err := RecursiveRank(dates, nil, six[:1], Options{}); err == nil {
		t.Error("no eigenvalue paths: no error")
	}
	if _, err := RecursiveRank(dates, []Path{{Name: "short", Values: []float64{1}}}, six[:1], Options{}); err == nil {
		t.Error("a path shorter than the dates: no error")
	}
}
