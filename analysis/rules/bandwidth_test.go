package rules

import (
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// TestHobijnBandwidth: the truncation lag ⌊b⌋ equals statsmodels 0.13.5
// tsa.stattools._kpss_autolag (the lag of kpss(nlags="auto")) exactly,
// and the real bandwidth b, which statsmodels does not return, equals the
// formula written out in numpy 1.24.2 to 1e-10 relative.
func TestHobijnBandwidth(t *testing.T) {
	f := loadFixture(t)
	for _, s := range f.Series {
		if got := HobijnPrelim(len(s.E)); got != s.HFOPrelim {
			t.Errorf("%s: prelim %d, numpy %d", s.Name, got, s.HFOPrelim)
		}
		b, err := HobijnBandwidth(s.E)
		if err != nil {
			t.Fatalf("%s: %v", s.Name, err)
		}
		if int(math.Floor(b)) != s.HFOLag {
			t.Errorf("%s: lag ⌊%.6g⌋, statsmodels %d", s.Name, b, s.HFOLag)
		}
		if e := relErr(b, s.HFOB); e > 1e-10 {
			t.Errorf("%s: b = %.15g, numpy %.15g (rel %.2g)", s.Name, b, s.HFOB, e)
		}
	}
}

// TestNeweyWestBandwidth compares Newey and West (1994) with the
// preliminary lags of the paper, Bartlett and quadratic-spectral, with
// the hand computation in numpy 1.24.2 (rules_bandwidth.py; statsmodels
// 0.13.5 has no such function) to 1e-10 relative.
func TestNeweyWestBandwidth(t *testing.T) {
	f := loadFixture(t)
	for _, s := range f.Series {
		for _, c := range []struct {
			k      Kernel
			prelim int
			want   float64
		}{{Bartlett, s.NWBartlettPrelim, s.NWBartlett}, {QuadraticSpectral, s.NWQSPrelim, s.NWQS}} {
			n, err := NeweyWestPrelim(c.k, len(s.E))
			if err != nil || n != c.prelim {
				t.Errorf("%s %v: prelim %d, %v; numpy %d", s.Name, c.k, n, err, c.prelim)
			}
			b, err := NeweyWestBandwidth(s.E, c.k, n)
			if err != nil {
				t.Fatalf("%s %v: %v", s.Name, c.k, err)
			}
			if e := relErr(b, c.want); e > 1e-10 {
				t.Errorf("%s %v: b = %.15g, numpy %.15g (rel %.2g)", s.Name, c.k, b, c.want, e)
			}
		}
	}
}

// TestAndrewsBandwidth compares Andrews (1991) AR(1) bandwidths with the
// formulas written out in numpy 1.24.2 (rules_bandwidth.py) to 1e-10
// relative, one column at a time and for two columns with unit weights.
func TestAndrewsBandwidth(t *testing.T) {
	f := loadFixture(t)
	check := func(name string, w *mat.Dense, k Kernel, want float64) {
		b, err := AndrewsBandwidth(w, k)
		if err != nil {
			t.Errorf("%s %v: %v", name, k, err)
			return
		}
		if e := relErr(b, want); e > 1e-10 {
			t.Errorf("%s %v: %.15g, numpy %.15g (rel %.2g)", name, k, b, want, e)
		}
	}
	for _, s := range f.Series {
		w := mat.NewDense(len(s.E), 1, append([]float64(nil), s.E...))
		check(s.Name, w, Bartlett, s.AndrewsBartlett)
		check(s.Name, w, QuadraticSpectral, s.AndrewsQS)
	}
	m := f.AndrewsMulti
	w := mat.NewDense(len(m.W), len(m.W[0]), nil)
	for i, r := range m.W {
		w.SetRow(i, r)
	}
	check("two columns", w, Bartlett, m.Bartlett)
	check("two columns", w, QuadraticSpectral, m.QS)
}

// TestBandwidthBadInput: every bad input gives an error value, no panic.
func TestBandwidthBadInput(t *testing.T) {
	e := []float64{1, -2, 0.5, 0.3, -1, 2, 0.1}
	for _, c := range []struct {
		name string
		err  func() error
		want string
	}{
		{"short", func() error { _, err := NeweyWestBandwidth([]float64{1}, Bartlett, 0); return err }, "observations"},
		{"kernel", func() error { _, err := NeweyWestBandwidth(e, Kernel(7), 1); return err }, "unknown kernel"},
		{"prelim", func() error { _, err := NeweyWestBandwidth(e, Bartlett, len(e)); return err }, "preliminary lag"},
		{"negative prelim", func() error { _, err := NeweyWestBandwidth(e, Bartlett, -1); return err }, "preliminary lag"},
		{"nan", func() error { _, err := NeweyWestBandwidth([]float64{1, math.NaN(), 2}, Bartlett, 1); return err }, "observation 2"},
		{"zero", func() error { _, err := HobijnBandwidth(make([]float64, 20)); return err }, "zero"},
		{"prelim kernel", func() error { _, err := NeweyWestPrelim(Kernel(7), 100); return err }, "unknown kernel"},
		{"andrews nil", func() error { _, err := AndrewsBandwidth(nil, Bartlett); return err }, "no data"},
		{"andrews short", func() error { _, err := AndrewsBandwidth(mat.NewDense(2, 1, []float64{1, 2}), Bartlett); return err }, "at least 3"},
		{"andrews kernel", func() error {
			_, err := AndrewsBandwidth(mat.NewDense(3, 1, []float64{1, 2, 1}), Kernel(9))
			return err
		}, "unknown kernel"},
		{"andrews zero", func() error { _, err := AndrewsBandwidth(mat.NewDense(3, 1, nil), Bartlett); return err }, "is zero"},
		{"andrews unit root", func() error {
			_, err := AndrewsBandwidth(mat.NewDense(4, 1, []float64{1, 2, 4, 8}), Bartlett)
			return err
		}, "not below one"},
		{"andrews noiseless", func() error {
			_, err := AndrewsBandwidth(mat.NewDense(4, 1, []float64{8, 4, 2, 1}), Bartlett)
			return err
		}, "no usable bandwidth"},
	} {
		err := c.err()
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want one naming %q", c.name, err, c.want)
		}
	}
}

// TestKernelWeights checks k(x) at points known in closed form: the
// Bartlett line and the quadratic-spectral kernel at 0 and where
// 6πx/5 = π (k = 25/(12π²x²)·1 with x = 5/6), and its series branch
// against the closed form just above the switch.
func TestKernelWeights(t *testing.T) {
	for _, c := range []struct {
		k    Kernel
		x, w float64
	}{
		{Bartlett, 0, 1}, {Bartlett, 0.25, 0.75}, {Bartlett, -0.5, 0.5}, {Bartlett, 1, 0}, {Bartlett, 3, 0},
		{QuadraticSpectral, 0, 1}, {QuadraticSpectral, 5.0 / 6, 25 / (12 * math.Pi * math.Pi * 25 / 36)},
	} {
		if got := c.k.Weight(c.x); math.Abs(got-c.w) > 1e-13 {
			t.Errorf("%v at %g: %.16g, want %.16g", c.k, c.x, got, c.w)
		}
	}
	// Just below the switch at z = 6πx/5 = 0.2 the series is used; the
	// closed form there loses about ε/z² ≈ 6e-15, so they agree to 1e-13.
	z := 0.2 * (1 - 1e-9)
	x := z * 5 / (6 * math.Pi)
	z = 6 * math.Pi * x / 5
	closed := 3 / (z * z) * (math.Sin(z)/z - math.Cos(z))
	if got := QuadraticSpectral.Weight(x); math.Abs(got-closed) > 1e-13 {
		t.Errorf("series branch %.16g, closed form %.16g", got, closed)
	}
	if !math.IsNaN(Kernel(5).Weight(0)) {
		t.Error("unknown kernel: weight not NaN")
	}
	if Bartlett.String() != "Bartlett" || QuadraticSpectral.String() != "quadratic spectral" || Kernel(5).String() != "Kernel(5)" {
		t.Error("kernel names")
	}
}
