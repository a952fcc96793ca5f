package johansen

import (
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/ols"
)

// shortRunFull is the short-run step as a least-squares fit of
// ols.RegressEach on a copy of [ỹ_{t−1}'β, zs] (as shortRun computed it
// before it fitted the equations from the design's R); it returns α̂, the short-run coefficients, their
// standard errors, the covariances and the residuals (scaled units, the
// residuals times the scales).
func shortRunFull(t *testing.T, r *Result, beta *mat.Dense) (coef, se [][]float64, cov []*mat.SymDense, resid *mat.Dense) {
	d := r.dz.rows()
	n, k, ns, p1 := r.T, r.K, r.dz.ns, r.dz.p1
	z0, z1 := d.Slice(0, n, ns+p1, ns+p1+k), d.Slice(0, n, ns, ns+p1)
	_, rank := beta.Dims()
	x := mat.NewDense(n, rank+ns, nil)
	x.Slice(0, n, 0, rank).(*mat.Dense).Mul(z1, beta)
	if ns > 0 {
		x.Slice(0, n, rank, rank+ns).(*mat.Dense).Copy(d.Slice(0, n, 0, ns))
	}
	ys := make([][]float64, k)
	for i := range ys {
		ys[i] = mat.Col(nil, i, z0)
	}
	fits, err := ols.RegressEach(ys, x)
	if err != nil {
		t.Fatal(err)
	}
	resid = mat.NewDense(n, k, nil)
	for i, f := range fits {
		c := f.Cov(ols.CovSpec{Kind: ols.Classical})
		coef, se, cov = append(coef, f.Coef), append(se, ols.SE(c)), append(cov, c)
		for h, e := range f.Resid {
			resid.Set(h, i, e*r.scale[i])
		}
	}
	return coef, se, cov, resid
}

// TestShortRunMatchesFullFit: the short-run equations fitted from the
// design's triangular factor (shortRun) agree with ols.RegressEach on a
// copy of the whole design [ỹ_{t−1}'β, zs] — coefficients within 1e-11
// of their standard errors, standard errors within 1e-11 relative,
// covariances within 1e-11 of √(c_hh c_jj), residuals within 1e-11 of
// their standard deviation — on the Danish data and on 20,000 rows of six random walks, in cases with and without
// unrestricted terms and lags. The two are the same least-squares problem
// (equal cross-products), so they differ by rounding alone (about 1e-13
// here, reported with -v).
func TestShortRunMatchesFullFit(t *testing.T) {
	type tc struct {
		name       string
		y          *mat.Dense
		c          Case
		lags, rank int
	}
	for _, c := range []tc{
		{"denmark C", denmark(t), C, 1, 1},
		{"denmark RC lags 0", denmark(t), RC, 0, 2},
		{"walks CT", walks(20_000, 6, 5), CT, 2, 2},
		{"walks N", walks(20_000, 6, 6), N, 3, 3},
	} {
		t.Run(c.name, func(t *testing.T) {
			res, err := Test(c.y, c.c, c.lags)
			if err != nil {
				t.Fatal(err)
			}
			p1 := res.P1()
			beta := mat.DenseCopyOf(res.vs.Slice(0, p1, 0, c.rank))
			coef, se, cov, resid := shortRunFull(t, res, beta)
			v := &VECM{Rank: c.rank}
			if err := res.shortRun(v, beta); err != nil {
				t.Fatal(err)
			}
			worst := 0.0
			near := func(what string, got, want, scale float64) {
				t.Helper()
				d := math.Abs(got-want) / scale
				worst = max(worst, d)
				if !(d <= 1e-11) {
					t.Fatalf("%s = %.17g, RegressEach %.17g (scale %g)", what, got, want, scale)
				}
			}
			rel := func(what string, got, want float64) { t.Helper(); near(what, got, want, math.Abs(want)) }
			defer func() { t.Logf("largest difference %.2g", worst) }()
			k := res.K
			for i := 0; i < k; i++ {
				for j := range coef[i] {
					var g, s float64
					if j < c.rank {
						g, s = v.Alpha.At(i, j), v.AlphaSE.At(i, j)
					} else {
						g, s = v.Short.At(i, j-c.rank), v.ShortSE.At(i, j-c.rank)
					}
					near("coefficient", g, coef[i][j], se[i][j])
					rel("standard error", s, se[i][j])
					for h := 0; h <= j; h++ {
						near("covariance", v.eqCov[i].At(h, j), cov[i].At(h, j), math.Sqrt(cov[i].At(h, h)*cov[i].At(j, j)))
					}
				}
				sd := math.Sqrt(mat.Dot(resid.ColView(i), resid.ColView(i)) / float64(res.T))
				for h := 0; h < res.T; h++ {
					near("residual", v.Resid.At(h, i), resid.At(h, i), sd)
				}
			}
		})
	}
}

// TestCheckSeriesOrder: checkSeries reports what a pass down each column
// in turn finds first — a non-finite value (its first row) or a constant
// series in the lowest column, then identical series.
func TestCheckSeriesOrder(t *testing.T) {
	y := walks(50, 5, 3)
	at := func(edit func(*mat.Dense)) string {
		c := mat.DenseCopyOf(y)
		edit(c)
		if err := checkSeries(c); err != nil {
			return err.Error()
		}
		return ""
	}
	for _, c := range []struct {
		edit func(*mat.Dense)
		want string
	}{
		{func(*mat.Dense) {}, ""},
		{func(m *mat.Dense) { m.Set(9, 2, math.NaN()); m.Set(5, 2, math.Inf(1)); m.Set(3, 4, math.NaN()) }, "series 2 has a missing or infinite value at row 5"},
		{func(m *mat.Dense) { m.Set(7, 3, math.Inf(-1)); m.SetCol(1, make([]float64, 50)) }, "series 1 is constant"},
		{func(m *mat.Dense) { m.SetCol(1, make([]float64, 50)); m.Set(0, 0, math.NaN()) }, "series 0 has a missing or infinite value at row 0"},
		{func(m *mat.Dense) { m.SetCol(4, mat.Col(nil, 2, m)) }, "series 2 and 4 are identical"},
	} {
		if got := at(c.edit); (c.want == "") != (got == "") || !strings.Contains(got, c.want) {
			t.Errorf("got %q, want %q", got, c.want)
		}
	}
}
