package johansen

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// unitMul multiplies LRM by 1e8 and IBO by 1e-6 and leaves LRY and IDE as
// they are (the columns of denmark()).
var unitMul = []float64{1e8, 1, 1e-6, 1}

// rescaled returns y with column j multiplied by m[j].
func rescaled(y *mat.Dense, m []float64) *mat.Dense {
	rows, k := y.Dims()
	out := mat.NewDense(rows, k, nil)
	for i := 0; i < rows; i++ {
		for j := 0; j < k; j++ {
			out.Set(i, j, y.At(i, j)*m[j])
		}
	}
	return out
}

// TestUnitInvariance checks the equivariance of every result under a change
// of the units of the series: with y' = yM, M = diag(m), the statistics are
// invariant, and β' = M₁⁻¹βC, α' = MαC⁻¹ (C = diag(m_norm), M₁ = diag(M, 1)),
// Γ'_i = MΓ_iM⁻¹, Φ' = MΦ and Ω' = MΩM, standard errors alike; the
// restriction β = Hφ becomes β' = (M₁⁻¹H)φ and α = Aψ becomes α' = (MA)ψ.
// These are exact algebraic identities of the Johansen estimator (Johansen
// 1995, ch. 6), so the Danish data with LRM in units 1e8 times larger and
// IBO 1e-6 times smaller must reproduce the results on the original units
// to 1e-8 relative. (Before the internal scaling, Test failed on such data
// with a singular S00.)
func TestUnitInvariance(t *testing.T) {
	y := denmark(t)
	ys := rescaled(y, unitMul)
	m := unitMul
	f := urcaFixtureLoad(t)
	const tol = 1e-8
	restrictions := 0
	// An estimate is compared relative to the larger of its size and its
	// standard error (floor): an estimate that happens to be 1e-5 of its
	// standard error is not determined to 8 significant digits by any
	// computation, in either units.
	nearFloor := func(what string, got, want, floor float64) {
		t.Helper()
		if !closeRel(got, want, tol, floor) {
			t.Errorf("%s: %.15g, want %.15g", what, got, want)
		}
	}
	near := func(what string, got, want float64) {
		t.Helper()
		nearFloor(what, got, want, 0)
	}
	for _, c := range []Case{N, RC, C, RT, CT} {
		for _, lags := range []int{0, 1, 2, 3} {
			t.Run(fmt.Sprintf("%s/lags=%d", c, lags), func(t *testing.T) {
				a, err := Test(y, c, lags)
				if err != nil {
					t.Fatal(err)
				}
				b, err := Test(ys, c, lags)
				if err != nil {
					t.Fatal(err)
				}
				for i := range a.Eigenvalues {
					near(fmt.Sprintf("eigenvalue %d", i), b.Eigenvalues[i], a.Eigenvalues[i])
					near(fmt.Sprintf("trace %d", i), b.Trace[i], a.Trace[i])
					near(fmt.Sprintf("maxeig %d", i), b.MaxEig[i], a.MaxEig[i])
				}
				m1 := append(append([]float64(nil), m...), 1) // M₁ (the extra 1 unused without a restricted term)
				for _, norm := range [][]int{{0}, {2}, {0, 1}, {3, 2}} {
					va, err := a.Estimate(len(norm), norm)
					if err != nil {
						t.Fatal(err)
					}
					vb, err := b.Estimate(len(norm), norm)
					if err != nil {
						t.Fatal(err)
					}
					for j, n := range norm {
						for i := 0; i < a.P1(); i++ {
							f := m1[i] / m[n] // β = M₁β'C⁻¹
							nearFloor(fmt.Sprintf("norm %v beta[%d,%d]", norm, i, j), vb.Beta.At(i, j)*f, va.Beta.At(i, j), va.BetaSE.At(i, j))
							near(fmt.Sprintf("norm %v se(beta[%d,%d])", norm, i, j), vb.BetaSE.At(i, j)*f, va.BetaSE.At(i, j))
						}
						for i := 0; i < a.K; i++ {
							f := m[n] / m[i] // α = M⁻¹α'C
							nearFloor(fmt.Sprintf("norm %v alpha[%d,%d]", norm, i, j), vb.Alpha.At(i, j)*f, va.Alpha.At(i, j), va.AlphaSE.At(i, j))
							near(fmt.Sprintf("norm %v se(alpha[%d,%d])", norm, i, j), vb.AlphaSE.At(i, j)*f, va.AlphaSE.At(i, j))
						}
					}
					for i := 0; i < a.K; i++ {
						for j := 0; j < a.K; j++ {
							// Covariances relative to √(Ω_ii Ω_jj).
							nearFloor(fmt.Sprintf("norm %v omega[%d,%d]", norm, i, j), vb.Omega.At(i, j)/(m[i]*m[j]), va.Omega.At(i, j),
								math.Sqrt(va.Omega.At(i, i)*va.Omega.At(j, j)))
						}
						for j := 0; j < a.P1(); j++ {
							// Π_ij = Σ_r α_ir β_jr relative to Σ_r |α_ir β_jr|.
							var abs float64
							for r := range norm {
								abs += math.Abs(va.Alpha.At(i, r) * va.Beta.At(j, r))
							}
							nearFloor(fmt.Sprintf("norm %v pi[%d,%d]", norm, i, j), vb.Pi.At(i, j)*m1[j]/m[i], va.Pi.At(i, j), abs)
						}
						for j, tm := range va.Terms {
							f := 1 / m[i] // Φ = M⁻¹Φ'
							if tm.Kind == LagDiff {
								f = m[tm.Series] / m[i] // Γ = M⁻¹Γ'M
							}
							nearFloor(fmt.Sprintf("norm %v short[%d,%d]", norm, i, j), vb.Short.At(i, j)*f, va.Short.At(i, j), va.ShortSE.At(i, j))
							near(fmt.Sprintf("norm %v se(short[%d,%d])", norm, i, j), vb.ShortSE.At(i, j)*f, va.ShortSE.At(i, j))
						}
					}
				}
				// The restrictions of the urca fixture, with the same
				// deterministic case and lags, in both units.
				for _, tc := range f.Tests {
					if ecdetCase[tc.Ecdet] != c || tc.K-1 != lags {
						continue
					}
					h := mat.NewDense(len(tc.Matrix), len(tc.Matrix[0]), nil)
					for i, row := range tc.Matrix {
						h.SetRow(i, row)
					}
					hs := mat.DenseCopyOf(h)
					var la, lb *LR
					if tc.Kind == "beta" {
						for i := 0; i < a.K; i++ { // H' = M₁⁻¹H
							for j := range tc.Matrix[0] {
								hs.Set(i, j, h.At(i, j)/m[i])
							}
						}
						la, err = a.TestBeta(tc.R, h)
						if err == nil {
							lb, err = b.TestBeta(tc.R, hs)
						}
					} else {
						for i := 0; i < a.K; i++ { // A' = MA
							for j := range tc.Matrix[0] {
								hs.Set(i, j, h.At(i, j)*m[i])
							}
						}
						la, err = a.TestAlpha(tc.R, h)
						if err == nil {
							lb, err = b.TestAlpha(tc.R, hs)
						}
					}
					if err != nil {
						t.Fatalf("%s: %v", tc.Name, err)
					}
					restrictions++
					near(tc.Name+" LR", lb.Stat, la.Stat)
					near(tc.Name+" p", lb.P, la.P)
					for i := 0; i < tc.R; i++ {
						near(fmt.Sprintf("%s restricted eigenvalue %d", tc.Name, i), lb.Eigenvalues[i], la.Eigenvalues[i])
					}
				}
				wa, err := a.WeakExogeneity(1, 1, 3)
				if err != nil {
					t.Fatal(err)
				}
				wb, err := b.WeakExogeneity(1, 1, 3)
				if err != nil {
					t.Fatal(err)
				}
				near("weak exogeneity LR", wb.Stat, wa.Stat)
			})
		}
	}
	if restrictions != len(f.Tests) {
		t.Errorf("compared %d of the %d fixture restrictions", restrictions, len(f.Tests))
	}
}

// TestUnitInvarianceRestrictedBeta checks that the restricted β of TestBeta
// maps back to the units of the data: with y' = yM the restricted
// relations satisfy β' ∝ M₁⁻¹β column by column (each column is normalised
// v'S11v = 1, which is unit-free, up to sign), 1e-8 relative.
func TestUnitInvarianceRestrictedBeta(t *testing.T) {
	y := denmark(t)
	a, err := Test(y, RC, 1)
	if err != nil {
		t.Fatal(err)
	}
	b, err := Test(rescaled(y, unitMul), RC, 1)
	if err != nil {
		t.Fatal(err)
	}
	// LRM = −LRY and IBO = −IDE (the homogeneity restrictions), constant free.
	h := mat.NewDense(5, 3, []float64{1, 0, 0, -1, 0, 0, 0, 1, 0, 0, -1, 0, 0, 0, 1})
	hs := mat.DenseCopyOf(h)
	m1 := append(append([]float64(nil), unitMul...), 1)
	for i := 0; i < 5; i++ {
		for j := 0; j < 3; j++ {
			hs.Set(i, j, h.At(i, j)/m1[i])
		}
	}
	la, err := a.TestBeta(1, h)
	if err != nil {
		t.Fatal(err)
	}
	lb, err := b.TestBeta(1, hs)
	if err != nil {
		t.Fatal(err)
	}
	if !closeRel(lb.Stat, la.Stat, 1e-8, 0) {
		t.Errorf("LR %.15g, want %.15g", lb.Stat, la.Stat)
	}
	sign := math.Copysign(1, lb.Beta.At(4, 0)*la.Beta.At(4, 0))
	for i := 0; i < 5; i++ {
		if got, want := sign*lb.Beta.At(i, 0)*m1[i], la.Beta.At(i, 0); !closeRel(got, want, 1e-8, 0) {
			t.Errorf("restricted beta[%d] = %.15g, want %.15g", i, got, want)
		}
	}
}

// TestUnitInvarianceLagOrder checks that the lag table chooses the same
// orders in any units and that its log-determinants and criteria shift by
// the constant 2 Σ ln m_j (|Σ̂'| = |MΣ̂M|), 1e-8 relative to the value (and
// absolutely to 1e-8 times the shift).
func TestUnitInvarianceLagOrder(t *testing.T) {
	y := denmark(t)
	var shift float64
	for _, v := range unitMul {
		shift += 2 * math.Log(v)
	}
	for _, c := range []Case{N, RC, C, RT, CT} {
		a, err := LagOrder(y, c, 4)
		if err != nil {
			t.Fatal(err)
		}
		b, err := LagOrder(rescaled(y, unitMul), c, 4)
		if err != nil {
			t.Fatal(err)
		}
		if a.AIC != b.AIC || a.BIC != b.BIC || a.HQ != b.HQ {
			t.Errorf("%s: choices %d/%d/%d, in other units %d/%d/%d", c, a.AIC, a.BIC, a.HQ, b.AIC, b.BIC, b.HQ)
		}
		for i, ra := range a.Rows {
			rb := b.Rows[i]
			for _, p := range []struct {
				what      string
				got, want float64
			}{{"logdet", rb.LogDet, ra.LogDet}, {"aic", rb.AIC, ra.AIC}, {"bic", rb.BIC, ra.BIC}, {"hq", rb.HQ, ra.HQ}} {
				if d := p.got - shift - p.want; math.Abs(d) > 1e-8*math.Max(math.Abs(p.want), math.Abs(shift)) {
					t.Errorf("%s lags %d %s: %.15g − shift %.15g ≠ %.15g", c, ra.Lags, p.what, p.got, shift, p.want)
				}
			}
		}
	}
}

// TestSingularInAnyUnits checks that constant, duplicated and collinear
// series are still reported when the series are in very different units,
// and that the check is judged on the scaled problem.
func TestSingularInAnyUnits(t *testing.T) {
	y := rescaled(walks(100, 3, 7), []float64{1e8, 1, 1e-6})
	constant := mat.DenseCopyOf(y)
	dup := mat.DenseCopyOf(y)
	collinear := mat.DenseCopyOf(y)
	for i := 0; i < 100; i++ {
		constant.Set(i, 0, 5e8)
		dup.Set(i, 2, y.At(i, 0))
		// 1e8·w0 + 2·w1, in units of 1e-6: exactly collinear in the levels.
		collinear.Set(i, 2, (y.At(i, 0)+2*y.At(i, 1))*1e-6)
	}
	if _, err := Test(y, C, 1); err != nil {
		t.Fatalf("well-posed data in mixed units: %v", err)
	}
	for _, c := range []struct {
		name string
		y    *mat.Dense
		want string
	}{
		{"constant", constant, "series 0 is constant"},
		{"duplicated", dup, "series 0 and 2 are identical"},
		{"collinear", collinear, "singular moment matrix"},
	} {
		_, err := Test(c.y, RC, 1)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want one mentioning %q", c.name, err, c.want)
		}
		_, err = LagOrder(c.y, C, 2)
		if err == nil {
			t.Errorf("%s: LagOrder gave no error", c.name)
		}
	}
}
