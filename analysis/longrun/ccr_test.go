package longrun

import (
	"math"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/internal/refdata"
)

type ccrCase struct {
	lrCase
	Sigma, Pi [][]float64
	YStarSum  float64   `json:"ystar_sum"`
	YStarLast float64   `json:"ystar_last"`
	XStarSum  []float64 `json:"xstar_sum"`
	XStarLast []float64 `json:"xstar_last"`
	SSR       float64
}

// TestCCRNumpy compares CCR with an independent numpy implementation of
// Park's (1992) transformations in testdata/scripts/longrun_ccr.py (numpy
// 1.24.2, scipy 1.10.1 for the χ² p-values; fixture
// testdata/fixtures/longrun_ccr.json), which builds Γ̂₂ from its
// definition Σ_j k(j/b) N⁻¹Σ_t ŵ_{t+j}v̂_t' rather than from Δ̂: the
// bandwidth, Σ̂, Π̂, ω̂₁·₂, the transformed data, the coefficients, standard
// errors, the SSR of the transformed regression and the Wald tests, to
// 1e-8 relative.
func TestCCRNumpy(t *testing.T) {
	var fx struct {
		Library, Version string
		CCR              []ccrCase `json:"ccr"`
	}
	refdata.JSONFile(t, "../../testdata/fixtures/longrun_ccr.json", &fx)
	if len(fx.CCR) == 0 {
		t.Fatal("empty fixture")
	}
	v := macroVars(t)
	const tol = 1e-8
	for _, c := range fx.CCR {
		det, err := critical.ParseCase(c.Det)
		if err != nil {
			t.Fatal(err)
		}
		var xs [][]float64
		for _, x := range c.X {
			xs = append(xs, v[x])
		}
		r, err := CCR(v[c.Y], xs, c.X, CCRSpec{Det: det, Kernel: kernels[c.Kernel], Bandwidth: c.Bandwidth})
		if err != nil {
			t.Fatalf("%s: %v", c.Name, err)
		}
		if r.N != c.Nobs || relErr(r.Bandwidth, c.BandwidthUsed) > tol {
			t.Errorf("%s: N %d bandwidth %.12g, numpy %d %.12g", c.Name, r.N, r.Bandwidth, c.Nobs, c.BandwidthUsed)
		}
		m := len(c.X) + 1
		for a := 0; a < m; a++ {
			for b := 0; b < m; b++ {
				scale := math.Sqrt(c.Sigma[a][a] * c.Sigma[b][b])
				if math.Abs(r.Sigma.At(a, b)-c.Sigma[a][b]) > tol*scale {
					t.Errorf("%s: Σ[%d,%d] %.12g, numpy %.12g", c.Name, a, b, r.Sigma.At(a, b), c.Sigma[a][b])
				}
			}
			for b := 0; b < m-1; b++ {
				if relErr(r.Pi.At(a, b), c.Pi[a][b]) > tol {
					t.Errorf("%s: Π[%d,%d] %.12g, numpy %.12g", c.Name, a, b, r.Pi.At(a, b), c.Pi[a][b])
				}
			}
		}
		if relErr(r.Omega11_2, c.Omega112) > tol {
			t.Errorf("%s: ω₁·₂ %.12g, numpy %.12g", c.Name, r.Omega11_2, c.Omega112)
		}
		var ysum float64
		for _, y := range r.YStar {
			ysum += y
		}
		if relErr(ysum, c.YStarSum) > tol || relErr(r.YStar[r.N-1], c.YStarLast) > tol {
			t.Errorf("%s: Σy* %.12g last %.12g, numpy %.12g %.12g", c.Name, ysum, r.YStar[r.N-1], c.YStarSum, c.YStarLast)
		}
		for j, col := range r.XStar {
			var s float64
			for _, x := range col {
				s += x
			}
			if relErr(s, c.XStarSum[j]) > tol || relErr(col[r.N-1], c.XStarLast[j]) > tol {
				t.Errorf("%s: Σx*%d %.12g last %.12g, numpy %.12g %.12g", c.Name, j, s, col[r.N-1], c.XStarSum[j], c.XStarLast[j])
			}
		}
		if relErr(r.Fit.SSR, c.SSR) > tol {
			t.Errorf("%s: SSR %.12g, numpy %.12g", c.Name, r.Fit.SSR, c.SSR)
		}
		for j := range c.Coef {
			if relErr(r.Coef[j], c.Coef[j]) > tol || relErr(r.Table[j].SE, c.SE[j]) > tol {
				t.Errorf("%s %s: %.12g (%.12g), numpy %.12g (%.12g)", c.Name, r.Names[j], r.Coef[j], r.Table[j].SE, c.Coef[j], c.SE[j])
			}
		}
		nd := det.Deterministics()
		se := r.LongRun.SE()
		for j := range c.X {
			if r.LongRun.Coef[j] != r.Table[nd+j].Est || se[j] != r.Table[nd+j].SE {
				t.Errorf("%s: long-run block %d does not match the table", c.Name, j)
			}
		}
		checkWald(t, "ccr "+c.Name, r.LongRun, c.lrCase, tol)
	}
}

// TestCCRBadInput: too few observations, a constant regressor, a regressor
// that duplicates another, a bad bandwidth and non-finite data are errors.
func TestCCRBadInput(t *testing.T) {
	v := macroVars(t)
	y, x := v["lc"], v["ly"]
	sp := CCRSpec{Det: critical.Const, Kernel: Bartlett}
	if _, err := CCR(y[:3], [][]float64{x[:3]}, nil, sp); err == nil {
		t.Error("three observations: no error")
	}
	flat := make([]float64, len(y))
	for i := range flat {
		flat[i] = 2
	}
	if _, err := CCR(y, [][]float64{flat}, []string{"k"}, CCRSpec{Det: critical.NoConst}); err == nil || !strings.Contains(err.Error(), `"k" is constant`) {
		t.Errorf("constant regressor: %v", err)
	}
	if _, err := CCR(y, [][]float64{x, x}, nil, sp); err == nil {
		t.Error("collinear: no error")
	}
	if _, err := CCR(y, [][]float64{x}, nil, CCRSpec{Det: critical.Const, Bandwidth: math.NaN()}); err == nil {
		t.Error("NaN bandwidth: no error")
	}
	inf := append([]float64(nil), x...)
	inf[4] = math.Inf(1)
	if _, err := CCR(y, [][]float64{inf}, nil, sp); err == nil {
		t.Error("infinite x: no error")
	}
}
