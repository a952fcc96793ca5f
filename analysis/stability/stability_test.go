package stability

import (
	"encoding/json"
	"errors"
	"math"
	"math/rand/v2"
	"os"
	"slices"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/ols"
)

// recFixture is produced by testdata/scripts/stability_fixtures.py with
// statsmodels 0.13.5 (Debian python3-statsmodels), RecursiveLS on the
// open macrodata set: log realcons on 1, log realdpi, tbilrate.
type recFixture struct {
	Meta           map[string]string                           `json:"meta"`
	Y              []float64                                   `json:"y"`
	X              [][]float64                                 `json:"X"`
	K              int                                         `json:"k"`
	ResidRecursive []float64                                   `json:"resid_recursive"`
	CUSUM          []float64                                   `json:"cusum"`
	CUSUMSquares   []float64                                   `json:"cusum_squares"`
	Scale          float64                                     `json:"scale"`
	CoefFiltered   [][]float64                                 `json:"coef_filtered"`
	CoefVar        [][]float64                                 `json:"coef_filtered_var"`
	Points         []int                                       `json:"cusum_bounds_points"`
	Bounds05       struct{ Lower, Upper []float64 }            `json:"cusum_bounds_0.05"`
	Bounds01       struct{ Lower, Upper []float64 }            `json:"cusum_bounds_0.01"`
	SqBounds       map[string]struct{ Lower, Upper []float64 } `json:"cusum_squares_bounds"`
}

func readJSON(t *testing.T, path string, v any) {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(b, v); err != nil {
		t.Fatal(err)
	}
}

func loadRec(t *testing.T) (recFixture, *Recursive, *mat.Dense) {
	t.Helper()
	var f recFixture
	readJSON(t, "../../testdata/fixtures/stability_recursive.json", &f)
	n, k := len(f.X), len(f.X[0])
	x := mat.NewDense(n, k, nil)
	for i, row := range f.X {
		x.SetRow(i, row)
	}
	r, err := Compute(f.Y, x)
	if err != nil {
		t.Fatal(err)
	}
	if r.First != f.K || r.K != k || r.N != n {
		t.Fatalf("First=%d K=%d N=%d, want %d %d %d", r.First, r.K, r.N, f.K, k, n)
	}
	return f, r, x
}

// close reports |a−b| ≤ tol·max(1e-3, |b|): relative for values of
// ordinary size, absolute 1e-3·tol for values near zero.
func close(a, b, tol float64) bool {
	return math.Abs(a-b) <= tol*math.Max(1e-3, math.Abs(b))
}

// Recursive residuals, CUSUM, CUSUM of squares and recursive
// coefficients against statsmodels 0.13.5 RecursiveLS. RecursiveLS runs a
// Kalman filter, which is itself accurate only to about 1e-8 here: its
// recursive residuals differ from numpy lstsq re-fits on the expanding
// samples by up to 7e-9 σ̂ and its CUSUM by up to 1.6e-7 (measured when the
// fixture was made). Tolerances: standardized residuals w/σ̂ 1e-8
// absolute, CUSUM of squares 1e-8 relative, CUSUM 3e-7 absolute,
// coefficients 1e-7 of their standard error. The 1e-8 check of all of
// these against an independent exact computation is
// TestAgainstExpandingRefits.
func TestAgainstRecursiveLS(t *testing.T) {
	f, r, _ := loadRec(t)
	sig := r.Sigma()
	for i, want := range f.ResidRecursive {
		if got := r.Resid[r.First+i]; math.Abs(got-want)/sig > 1e-8 {
			t.Errorf("w[%d]/σ̂ = %.12g, statsmodels %.12g", r.First+i, got/sig, want/sig)
		}
	}
	sq := r.CUSUMSquares()
	for i, want := range f.CUSUMSquares {
		if got := sq[r.First+i]; !close(got, want, 1e-8) {
			t.Errorf("cusumsq[%d] = %.12g, statsmodels %.12g", r.First+i, got, want)
		}
	}
	// statsmodels scales the CUSUM by the sample standard deviation of the
	// recursive residuals (ddof 1); BDE, and this package, by the
	// full-sample σ̂. Rescale ours to statsmodels' divisor.
	var mean, ss float64
	for _, w := range f.ResidRecursive {
		mean += w
	}
	mean /= float64(len(f.ResidRecursive))
	for _, w := range f.ResidRecursive {
		ss += (w - mean) * (w - mean)
	}
	sd := math.Sqrt(ss / float64(len(f.ResidRecursive)-1))
	cs := r.CUSUM()
	for i, want := range f.CUSUM {
		if got := cs[r.First+i] * sig / sd; math.Abs(got-want) > 3e-7 {
			t.Errorf("cusum[%d] rescaled = %.12g, statsmodels %.12g", r.First+i, got, want)
		}
	}
	// statsmodels' concentrated scale is the full-sample σ̂² = S_T/(T−K).
	if s2 := r.SSR / float64(r.N-r.K); !close(s2, f.Scale, 1e-8) {
		t.Errorf("σ̂² = %.12g, statsmodels scale %.12g", s2, f.Scale)
	}
	for t0 := r.First; t0 < r.N; t0++ {
		// statsmodels' filtered covariance is σ̂²_T (X_t'X_t)⁻¹; ours uses
		// the subsample s_t². Convert.
		s2t := 0.0
		for i := r.First; i <= t0; i++ {
			s2t += r.Resid[i] * r.Resid[i]
		}
		s2t /= float64(t0 + 1 - r.K)
		for j := 0; j < r.K; j++ {
			se := r.SE[t0][j]
			if got, want := r.Coef[t0][j], f.CoefFiltered[t0][j]; math.Abs(got-want)/se > 1e-7 {
				t.Errorf("b[%d][%d] = %.12g, statsmodels %.12g (se %.3g)", t0, j, got, want, se)
			}
			got := se * se / s2t * f.Scale
			if want := f.CoefVar[t0][j]; !close(got, want, 1e-7) {
				t.Errorf("var b[%d][%d] = %.12g, statsmodels %.12g", t0, j, got, want)
			}
		}
	}
}

// Independent computation: least-squares re-fits (package ols, QR) on the
// expanding samples 0..t give b_t, its classical SE, and the one-step
// prediction error scaled by √(1 + x'(X'X)⁻¹x), which must equal w_{t+1}.
func TestAgainstExpandingRefits(t *testing.T) {
	f, r, x := loadRec(t)
	const tol = 1e-8
	k := r.K
	full, err := ols.Regress(f.Y, x)
	if err != nil {
		t.Fatal(err)
	}
	sigma := math.Sqrt(full.Sigma2())
	cs := r.CUSUM()
	// The first recursive residual comes from the exact fit of the first K
	// rows: b = X_K⁻¹y_K, (X'X)⁻¹ = X_K⁻¹X_K⁻ᵀ.
	var xk, xkInv mat.Dense
	xk.CloneFrom(x.Slice(0, k, 0, k))
	if err := xkInv.Inverse(&xk); err != nil {
		t.Fatal(err)
	}
	b0 := mat.NewVecDense(k, nil)
	b0.MulVec(&xkInv, mat.NewVecDense(k, append([]float64(nil), f.Y[:k]...)))
	xk1 := mat.NewVecDense(k, mat.Row(nil, k, x))
	var g mat.VecDense
	g.MulVec(xkInv.T(), xk1)
	w0 := (f.Y[k] - mat.Dot(xk1, b0)) / math.Sqrt(1+mat.Dot(&g, &g))
	if math.Abs(r.Resid[k]-w0)/sigma > tol {
		t.Errorf("w[%d] = %.12g, exact fit %.12g", k, r.Resid[k], w0)
	}
	for j := 0; j < k; j++ {
		if !close(r.Coef[k-1][j], b0.AtVec(j), 1e-6) {
			t.Errorf("b[%d][%d] = %.12g, exact fit %.12g", k-1, j, r.Coef[k-1][j], b0.AtVec(j))
		}
	}
	cum := w0
	for t0 := k; t0 < r.N-1; t0++ {
		sub := x.Slice(0, t0+1, 0, k).(*mat.Dense)
		fit, err := ols.Regress(f.Y[:t0+1], mat.DenseCopyOf(sub))
		if err != nil {
			t.Fatal(err)
		}
		se := ols.SE(fit.Cov(ols.CovSpec{Kind: ols.Classical}))
		for j := 0; j < k; j++ {
			if !close(r.Coef[t0][j], fit.Coef[j], tol) {
				t.Errorf("t=%d b[%d] = %.12g, refit %.12g", t0, j, r.Coef[t0][j], fit.Coef[j])
			}
			if !close(r.SE[t0][j], se[j], tol) {
				t.Errorf("t=%d se[%d] = %.12g, refit %.12g", t0, j, r.SE[t0][j], se[j])
			}
		}
		inv := fit.XtXInv()
		xn := mat.NewVecDense(k, mat.Row(nil, t0+1, x))
		var v mat.VecDense
		v.MulVec(inv, xn)
		q := mat.Dot(xn, &v)
		w := (f.Y[t0+1] - mat.Dot(xn, mat.NewVecDense(k, fit.Coef))) / math.Sqrt(1+q)
		if math.Abs(r.Resid[t0+1]-w)/sigma > tol {
			t.Errorf("w[%d] = %.12g, refit %.12g", t0+1, r.Resid[t0+1], w)
		}
		cum += w
		if got, want := cs[t0+1], cum/sigma; math.Abs(got-want) > tol {
			t.Errorf("cusum[%d] = %.12g, from refits %.12g", t0+1, got, want)
		}
	}
	// BDE (1975) eq. 4: S_T = Σ w_t² when the recursion starts at K.
	if !close(r.SSR, full.SSR, tol) {
		t.Errorf("SSR = %.12g, full-sample OLS %.12g", r.SSR, full.SSR)
	}
}

// Band constants: BDE (1975) give a = 0.850, 0.948, 1.143 for 10%, 5%, 1%.
func TestCUSUMConst(t *testing.T) {
	for _, c := range []struct{ alpha, want float64 }{{0.10, 0.850}, {0.05, 0.948}, {0.01, 1.143}} {
		a, err := CUSUMConst(c.alpha)
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(a-c.want) > 5e-4 {
			t.Errorf("a(%v) = %.5f, BDE table %.3f", c.alpha, a, c.want)
		}
	}
	for _, bad := range []float64{0, -0.1, 0.5, math.NaN()} {
		if _, err := CUSUMConst(bad); err == nil {
			t.Errorf("alpha %v: no error", bad)
		}
	}
}

// The CUSUM lines against statsmodels' _cusum_significance_bounds, which
// use the rounded constants 0.948 and 1.143: ours at row t equals its line
// at x = t+1 up to the rounding of a.
func TestCUSUMBandAgainstStatsmodels(t *testing.T) {
	f, r, _ := loadRec(t)
	for _, c := range []struct {
		alpha, rounded float64
		upper          []float64
	}{{0.05, 0.948, f.Bounds05.Upper}, {0.01, 1.143, f.Bounds01.Upper}} {
		band, err := r.CUSUMBand(c.alpha)
		if err != nil {
			t.Fatal(err)
		}
		a, _ := CUSUMConst(c.alpha)
		for i, x := range f.Points {
			t0 := x - 1
			if t0 < r.First {
				continue
			}
			if got := band[t0] / a * c.rounded; !close(got, c.upper[i], 1e-12) {
				t.Errorf("alpha %v: band[%d] = %.12g, statsmodels %.12g", c.alpha, t0, got, c.upper[i])
			}
		}
		// the published end points: a√n at r = 0 and 3a√n at r = n.
		n := float64(r.Residuals())
		if got, want := band[r.N-1], 3*a*math.Sqrt(n); !close(got, want, 1e-12) {
			t.Errorf("end of band %v, want 3a√n = %v", got, want)
		}
	}
}

// Exact c₀ against the Edgerton–Wells (1994) approximation as computed
// by statsmodels 0.13.5 (fixture stability_cusumsq_crit.json). Their
// formula is a three-term expansion in n^(−1/2); the differences observed
// fall like 1.9·n^(−5/2) (0.007 at n ≈ 10, 1e-4 at n ≈ 50, 1e-5 at
// n ≈ 100), the size of the next, omitted term, so the tolerance is
// 2.5·n^(−5/2) + 2e-5. A different definition of the statistic (e.g.
// centring on j/n) would shift c₀ by O(1/n) and fail this.
func TestCUSUMSquaresConstAgainstApproximation(t *testing.T) {
	var f struct {
		Rows []map[string]float64 `json:"rows"`
	}
	readJSON(t, "../../testdata/fixtures/stability_cusumsq_crit.json", &f)
	for _, row := range f.Rows {
		m := int(row["m"])
		for _, a := range []string{"0.1", "0.05", "0.01"} {
			alpha := map[string]float64{"0.1": 0.10, "0.05": 0.05, "0.01": 0.01}[a]
			c0, err := CUSUMSquaresConst(m, alpha)
			if err != nil {
				t.Fatal(err)
			}
			n := float64(m)/2 - 1
			if d := math.Abs(c0 - row[a]); d > 2.5*math.Pow(n, -2.5)+2e-5 {
				t.Errorf("m=%d alpha=%s: c0 = %.5f, Edgerton–Wells %.5f (diff %.4f)", m, a, c0, row[a], d)
			} else {
				t.Logf("m=%d alpha=%s: c0 = %.5f, Edgerton–Wells %.5f", m, a, c0, row[a])
			}
		}
	}
}

// Closed forms for tiny n: with one uniform, P(U − 1/2 > c) = 1/2 − c; with
// two and c ≥ 1/3 the second bound 2/3+c is ≥ 1, so
// P(no crossing) = P(U₍₁₎ ≤ 1/3+c) = 1 − (2/3−c)², and c = 2/3 − √p.
func TestKSUpperClosedForms(t *testing.T) {
	c, err := ksUpper(1, 0.025)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(c-0.475) > 1e-10 {
		t.Errorf("n=1: c = %.12f, want 0.475", c)
	}
	// n=2, p = 0.05.
	c, err = ksUpper(2, 0.05)
	if err != nil {
		t.Fatal(err)
	}
	if want := 2.0/3 - math.Sqrt(0.05); math.Abs(c-want) > 1e-10 {
		t.Errorf("n=2: c = %.12f, want %.12f", c, want)
	}
}

// The CUSUM-of-squares lines: mean r/n ± c₀ (BDE 1975), checked against
// statsmodels' lines with its Edgerton–Wells c₀ replaced by ours.
func TestCUSUMSquaresBand(t *testing.T) {
	f, r, _ := loadRec(t)
	lo, hi, err := r.CUSUMSquaresBand(0.05)
	if err != nil {
		t.Fatal(err)
	}
	c0, _ := CUSUMSquaresConst(r.Residuals(), 0.05)
	sm := f.SqBounds["0.05"]
	smc := sm.Upper[0] // line value 0 at x = k
	for i, x := range f.Points {
		t0 := x - 1
		if t0 < r.First {
			continue
		}
		if got, want := hi[t0], sm.Upper[i]-smc+c0; !close(got, want, 1e-12) {
			t.Errorf("upper[%d] = %.12g, want %.12g", t0, got, want)
		}
		if got, want := lo[t0], sm.Lower[i]+smc-c0; !close(got, want, 1e-12) {
			t.Errorf("lower[%d] = %.12g, want %.12g", t0, got, want)
		}
	}
}

// A level shift dummy that is zero for the first ten rows delays the start
// of the recursion until the dummy is identified.
func TestDelayedRank(t *testing.T) {
	n := 30
	x := mat.NewDense(n, 2, nil)
	y := make([]float64, n)
	for i := 0; i < n; i++ {
		x.Set(i, 0, 1)
		if i >= 10 {
			x.Set(i, 1, 1)
		}
		y[i] = math.Sin(float64(i)) + x.At(i, 1)
	}
	r, err := Compute(y, x)
	if err != nil {
		t.Fatal(err)
	}
	if r.First != 11 {
		t.Fatalf("First = %d, want 11", r.First)
	}
	fit, err := ols.Regress(y, x)
	if err != nil {
		t.Fatal(err)
	}
	if !close(r.SSR, fit.SSR, 1e-10) {
		t.Errorf("SSR %v, OLS %v", r.SSR, fit.SSR)
	}
	for j := 0; j < 2; j++ {
		if !close(r.Coef[n-1][j], fit.Coef[j], 1e-10) {
			t.Errorf("b[%d] = %v, OLS %v", j, r.Coef[n-1][j], fit.Coef[j])
		}
	}
}

// Monte Carlo check of the exact recursion: the simulated frequency of
// max_j [U₍ⱼ₎ − j/(n+1)] > c₀ for n uniforms is α/2 within 4 standard
// errors (fixed seed).
func TestKSUpperMonteCarlo(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	const reps = 100000
	for _, n := range []int{9, 14} {
		c0, err := ksUpper(n, 0.025)
		if err != nil {
			t.Fatal(err)
		}
		u := make([]float64, n)
		hits := 0
		for r := 0; r < reps; r++ {
			for i := range u {
				u[i] = rng.Float64()
			}
			slices.Sort(u)
			for j, v := range u {
				if v-float64(j+1)/float64(n+1) > c0 {
					hits++
					break
				}
			}
		}
		p := float64(hits) / reps
		se := math.Sqrt(0.025 * 0.975 / reps)
		if math.Abs(p-0.025) > 4*se {
			t.Errorf("n=%d: simulated exceedance %.4f, want 0.025 ± %.4f", n, p, 4*se)
		}
	}
}

func TestBadInput(t *testing.T) {
	x := mat.NewDense(4, 2, []float64{1, 0, 1, 0, 1, 0, 1, 0})
	if _, err := Compute([]float64{1, 2, 3, 4}, x); !errors.Is(err, ErrNoFullRank) {
		t.Errorf("collinear: %v", err)
	}
	if _, err := Compute([]float64{1, 2, 3}, x); err == nil {
		t.Error("length mismatch: no error")
	}
	x2 := mat.NewDense(3, 1, []float64{1, 1, 1})
	if _, err := Compute([]float64{1, math.NaN(), 3}, x2); err == nil {
		t.Error("NaN: no error")
	}
	if _, err := Compute([]float64{1}, mat.NewDense(1, 1, []float64{1})); err == nil {
		t.Error("too short: no error")
	}
	if _, err := CUSUMSquaresConst(3, 0.05); err == nil {
		t.Error("m=3: no error")
	}
	if _, err := CUSUMSquaresConst(2100, 0.05); err == nil {
		t.Error("m=2100: no error")
	}
}

func BenchmarkCUSUMSquaresConst(b *testing.B) {
	for _, m := range []int{100, 400, 1000} {
		b.Run("m="+itoa(m), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := CUSUMSquaresConst(m, 0.05); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

func itoa(n int) string {
	if n == 0 {
		return "0"
	}
	var s []byte
	for ; n > 0; n /= 10 {
		s = append([]byte{byte('0' + n%10)}, s...)
	}
	return string(s)
}
