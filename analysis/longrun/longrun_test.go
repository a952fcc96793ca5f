package longrun

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/ols"

	"github.com/galley-econ/galley/internal/refdata"
)

type lrCase struct {
	Name        string
	Y           string
	X           []string
	Det         string
	Select      string
	Lags, Leads int
	Maxlags     int
	Maxleads    int
	HAC         int
	Kernel      string
	Bandwidth   float64
	R           [][]float64
	RHS         []float64 `json:"r"`

	ChosenLags    int     `json:"chosen_lags"`
	ChosenLeads   int     `json:"chosen_leads"`
	BandwidthUsed float64 `json:"bandwidth_used"`
	Nobs          int
	Coef, SE      []float64
	Omega, Delta  [][]float64
	Omega112      float64 `json:"omega11_2"`
	Wald          []float64
}

type lrFixture struct {
	Library, Version string
	DOLS             []lrCase `json:"dols"`
	FMOLS            []lrCase `json:"fmols"`
}

func relErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}

func macroVars(t *testing.T) map[string][]float64 {
	d := refdata.CSVFile(t, "../../testdata/data/macrodata.csv")
	out := map[string][]float64{}
	for name, col := range map[string]string{"lc": "realcons", "ly": "realdpi", "li": "realinv"} {
		v := make([]float64, len(d[col]))
		for i, x := range d[col] {
			v[i] = math.Log(x)
		}
		out[name] = v
	}
	return out
}

func restr(c lrCase) *mat.Dense {
	if c.R == nil {
		return nil
	}
	r := mat.NewDense(len(c.R), len(c.R[0]), nil)
	for i, row := range c.R {
		r.SetRow(i, row)
	}
	return r
}

func checkWald(t *testing.T, name string, lr Coefs, c lrCase, tol float64) {
	t.Helper()
	if c.R == nil {
		return
	}
	w, err := Wald(lr, restr(c), c.RHS)
	if err != nil {
		t.Fatalf("%s: wald: %v", name, err)
	}
	if relErr(w.Stat, c.Wald[0]) > tol || relErr(w.PValue, c.Wald[1]) > tol || w.DF != int(c.Wald[2]) {
		t.Errorf("%s: wald %.12g p %.12g df %d, reference %v", name, w.Stat, w.PValue, w.DF, c.Wald)
	}
}

var selectors = map[string]Selector{"fixed": Fixed, "aic": AIC, "bic": BIC}

// TestDOLSStatsmodels compares DOLS coefficients, HAC standard errors,
// the chosen leads and lags and Wald statistics with statsmodels 0.13.5
// OLS on leads and lags built with pandas (fixture
// testdata/fixtures/longrun_macro.json, script
// testdata/scripts/longrun_macro.py), to 1e-8 relative.
func TestDOLSStatsmodels(t *testing.T) {
	var fx lrFixture
	refdata.JSONFile(t, "../../testdata/fixtures/longrun_macro.json", &fx)
	if len(fx.DOLS) == 0 {
		t.Fatal("empty fixture")
	}
	v := macroVars(t)
	const tol = 1e-8
	for _, c := range fx.DOLS {
		det, err := critical.ParseCase(c.Det)
		if err != nil {
			t.Fatal(err)
		}
		var xs [][]float64
		for _, x := range c.X {
			xs = append(xs, v[x])
		}
		s := DOLSSpec{Det: det, Lags: c.Lags, Leads: c.Leads, Select: selectors[c.Select],
			MaxLags: c.Maxlags, MaxLeads: c.Maxleads, Cov: ols.CovSpec{Kind: ols.HAC, Lags: c.HAC}}
		r, err := DOLS(v[c.Y], xs, c.X, s)
		if err != nil {
			t.Fatalf("%s: %v", c.Name, err)
		}
		if r.Lags != c.ChosenLags || r.Leads != c.ChosenLeads || r.Fit.N != c.Nobs {
			t.Fatalf("%s: lags %d leads %d N %d, statsmodels %d %d %d", c.Name, r.Lags, r.Leads, r.Fit.N, c.ChosenLags, c.ChosenLeads, c.Nobs)
		}
		for j := range c.Coef {
			if relErr(r.Table[j].Est, c.Coef[j]) > tol || relErr(r.Table[j].SE, c.SE[j]) > tol {
				t.Errorf("%s %s: %.12g (%.12g), statsmodels %.12g (%.12g)", c.Name, r.Names[j], r.Table[j].Est, r.Table[j].SE, c.Coef[j], c.SE[j])
			}
		}
		nd := det.Deterministics()
		se := r.LongRun.SE()
		for j := range c.X {
			if r.LongRun.Coef[j] != r.Table[nd+j].Est || se[j] != r.Table[nd+j].SE {
				t.Errorf("%s: long-run block %d does not match the table", c.Name, j)
			}
		}
		checkWald(t, "dols "+c.Name, r.LongRun, c, tol)
	}
}

var kernels = map[string]Kernel{"bartlett": Bartlett, "qs": QuadraticSpectral}

// TestFMOLSNumpy compares FMOLS with an independent vectorised numpy
// implementation of Phillips and Hansen (1990) and Andrews (1991) in
// testdata/scripts/longrun_macro.py (fixture
// testdata/fixtures/longrun_macro.json; numpy and statsmodels 0.13.5 OLS
// for the first stage): bandwidth, Ω̂, Δ̂, ω̂₁·₂, coefficients, standard
// errors and Wald statistics, to 1e-8 relative.
func TestFMOLSNumpy(t *testing.T) {
	var fx lrFixture
	refdata.JSONFile(t, "../../testdata/fixtures/longrun_macro.json", &fx)
	if len(fx.FMOLS) == 0 {
		t.Fatal("empty fixture")
	}
	v := macroVars(t)
	const tol = 1e-8
	for _, c := range fx.FMOLS {
		det, err := critical.ParseCase(c.Det)
		if err != nil {
			t.Fatal(err)
		}
		var xs [][]float64
		for _, x := range c.X {
			xs = append(xs, v[x])
		}
		r, err := FMOLS(v[c.Y], xs, c.X, FMOLSSpec{Det: det, Kernel: kernels[c.Kernel], Bandwidth: c.Bandwidth})
		if err != nil {
			t.Fatalf("%s: %v", c.Name, err)
		}
		if r.N != c.Nobs || relErr(r.Bandwidth, c.BandwidthUsed) > tol {
			t.Errorf("%s: N %d bandwidth %.12g, numpy %d %.12g", c.Name, r.N, r.Bandwidth, c.Nobs, c.BandwidthUsed)
		}
		m := len(c.X) + 1
		for a := 0; a < m; a++ {
			for b := 0; b < m; b++ {
				// Relative to the scale sqrt(ω_aa ω_bb) of the entry: with the
				// quadratic trend the design is ill-conditioned and small
				// cross terms carry absolute rounding of that scale.
				scale := math.Sqrt(c.Omega[a][a] * c.Omega[b][b])
				if math.Abs(r.Omega.At(a, b)-c.Omega[a][b]) > tol*scale || math.Abs(r.Delta.At(a, b)-c.Delta[a][b]) > tol*scale {
					t.Errorf("%s: Ω[%d,%d] %.12g Δ %.12g, numpy %.12g %.12g", c.Name, a, b, r.Omega.At(a, b), r.Delta.At(a, b), c.Omega[a][b], c.Delta[a][b])
				}
			}
		}
		if relErr(r.Omega11_2, c.Omega112) > tol {
			t.Errorf("%s: ω₁·₂ %.12g, numpy %.12g", c.Name, r.Omega11_2, c.Omega112)
		}
		for j := range c.Coef {
			if relErr(r.Coef[j], c.Coef[j]) > tol || relErr(r.Table[j].SE, c.SE[j]) > tol {
				t.Errorf("%s %s: %.12g (%.12g), numpy %.12g (%.12g)", c.Name, r.Names[j], r.Coef[j], r.Table[j].SE, c.Coef[j], c.SE[j])
			}
		}
		checkWald(t, "fmols "+c.Name, r.LongRun, c, tol)
	}
}

func qsClosed(x float64) float64 {
	z := 6 * math.Pi * x / 5
	return 25 / (12 * math.Pi * math.Pi * x * x) * (math.Sin(z)/z - math.Cos(z))
}

// TestKernelWeights checks k(x) at points known in closed form.
func TestKernelWeights(t *testing.T) {
	// QS at x = 5/6: z = π, so k = 25/(12π²·25/36)·(0 − (−1)) = 3/π².
	for _, c := range []struct {
		k    Kernel
		x, w float64
	}{
		{Bartlett, 0, 1}, {Bartlett, 0.25, 0.75}, {Bartlett, -0.5, 0.5}, {Bartlett, 1, 0}, {Bartlett, 3, 0},
		{QuadraticSpectral, 0, 1}, {QuadraticSpectral, 5.0 / 6, 3 / (math.Pi * math.Pi)},
		{QuadraticSpectral, 1e-6, 1 - math.Pow(6*math.Pi*1e-6/5, 2)/10},
		// Either side of the switch to the series, against the closed form.
		{QuadraticSpectral, 0.2 * 5 / (6 * math.Pi) * 0.999, qsClosed(0.2 * 5 / (6 * math.Pi) * 0.999)},
		{QuadraticSpectral, 0.2 * 5 / (6 * math.Pi) * 1.001, qsClosed(0.2 * 5 / (6 * math.Pi) * 1.001)},
		{QuadraticSpectral, 0.7, qsClosed(0.7)}, {QuadraticSpectral, 2.3, qsClosed(2.3)},
	} {
		if got := c.k.Weight(c.x); math.Abs(got-c.w) > 1e-13 {
			t.Errorf("%v(%g) = %.15g, want %.15g", c.k, c.x, got, c.w)
		}
	}
}

// TestBartlettMatchesOLS: LongRunCov with the Bartlett kernel and b = L+1
// equals ols.BartlettLRV(w, L)/T.
func TestBartlettMatchesOLS(t *testing.T) {
	v := macroVars(t)
	n := len(v["lc"]) - 1
	w := mat.NewDense(n, 2, nil)
	for i := 0; i < n; i++ {
		w.Set(i, 0, v["lc"][i+1]-v["lc"][i])
		w.Set(i, 1, v["ly"][i+1]-v["ly"][i])
	}
	om, _, err := LongRunCov(w, Bartlett, 5)
	if err != nil {
		t.Fatal(err)
	}
	ref := ols.BartlettLRV(w, 4)
	for a := 0; a < 2; a++ {
		for b := 0; b < 2; b++ {
			if relErr(om.At(a, b), ref.At(a, b)/float64(n)) > 1e-12 {
				t.Errorf("Ω[%d,%d] %.15g, ols %.15g", a, b, om.At(a, b), ref.At(a, b)/float64(n))
			}
		}
	}
}

func TestBadInput(t *testing.T) {
	v := macroVars(t)
	y, x := v["lc"], [][]float64{v["ly"]}
	hac := ols.CovSpec{Kind: ols.HAC, Lags: 4}
	if _, err := DOLS(y, nil, nil, DOLSSpec{Det: critical.Const, Cov: hac}); err == nil {
		t.Error("dols no regressors: no error")
	}
	if _, err := DOLS(y, [][]float64{v["ly"][:10]}, nil, DOLSSpec{Det: critical.Const}); err == nil {
		t.Error("dols length: no error")
	}
	if _, err := DOLS(y, x, nil, DOLSSpec{Det: critical.Const, Lags: -1}); err == nil {
		t.Error("dols negative lags: no error")
	}
	if _, err := DOLS(y[:8], [][]float64{x[0][:8]}, nil, DOLSSpec{Det: critical.Const, Lags: 3, Leads: 3}); err == nil {
		t.Error("dols too short: no error")
	}
	if _, err := DOLS(y, [][]float64{v["ly"], v["ly"]}, nil, DOLSSpec{Det: critical.Const}); err == nil {
		t.Error("dols collinear: no error")
	}
	nan := append([]float64(nil), y...)
	nan[7] = math.NaN()
	if _, err := FMOLS(nan, x, nil, FMOLSSpec{Det: critical.Const}); err == nil {
		t.Error("fmols NaN: no error")
	}
	if _, err := FMOLS(y, x, nil, FMOLSSpec{Det: critical.Const, Bandwidth: -1}); err == nil {
		t.Error("fmols negative bandwidth: no error")
	}
	if _, err := FMOLS(y, x, []string{"a", "b"}, FMOLSSpec{Det: critical.Const}); err == nil {
		t.Error("fmols names: no error")
	}
	r, err := FMOLS(y, x, nil, FMOLSSpec{Det: critical.Const, Bandwidth: 4})
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Wald(r.LongRun, mat.NewDense(1, 2, []float64{1, 0}), nil); err == nil {
		t.Error("wald shape: no error")
	}
	if _, err := Wald(r.LongRun, mat.NewDense(2, 1, []float64{1, 1}), nil); err == nil {
		t.Error("wald dependent rows: no error")
	}
}
