package ols

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/mat"
)

// CovKind names a covariance estimator for β̂.
type CovKind int

const (
	// Classical is s²(X'X)⁻¹.
	Classical CovKind = iota
	// HC1 is White's heteroskedasticity-consistent estimator with the
	// N/(N−K) small-sample factor (MacKinnon and White 1985):
	// N/(N−K) · (X'X)⁻¹ (Σ e_t² x_t x_t') (X'X)⁻¹.
	HC1
	// HAC is the Newey–West (1987) estimator with Bartlett weights
	// w_j = 1 − j/(L+1), j = 1..L, and the N/(N−K) small-sample factor
	// (common practice):
	// N/(N−K) · (X'X)⁻¹ [Γ₀ + Σ_j w_j (Γ_j + Γ_j')] (X'X)⁻¹,
	// Γ_j = Σ_{t>j} e_t e_{t−j} x_t x_{t−j}'.
	HAC
)

// CovSpec is a covariance estimator together with its HAC lag length.
type CovSpec struct {
	Kind CovKind
	Lags int // HAC truncation lag L (Kind == HAC only)
}

// String gives the canonical spelling: "ols", "hc1" or "hac(L)".
func (c CovSpec) String() string {
	switch c.Kind {
	case HC1:
		return "hc1"
	case HAC:
		return fmt.Sprintf("hac(%d)", c.Lags)
	default:
		return "ols"
	}
}

// Describe gives a phrase for a table note.
func (c CovSpec) Describe() string {
	switch c.Kind {
	case HC1:
		return "heteroskedasticity-robust (HC1) standard errors"
	case HAC:
		return fmt.Sprintf("Newey–West HAC standard errors (Bartlett kernel, %d lags)", c.Lags)
	default:
		return "conventional OLS standard errors"
	}
}

// ParseCov reads "ols", "hc1" or "hac(L)" (case-insensitive, spaces ignored).
func ParseCov(s string) (CovSpec, error) {
	t := strings.ToLower(strings.ReplaceAll(s, " ", ""))
	switch {
	case t == "" || t == "ols" || t == "classical":
		return CovSpec{Kind: Classical}, nil
	case t == "hc1":
		return CovSpec{Kind: HC1}, nil
	case strings.HasPrefix(t, "hac(") && strings.HasSuffix(t, ")"):
		l, err := strconv.Atoi(t[4 : len(t)-1])
		if err != nil || l < 0 {
			return CovSpec{}, fmt.Errorf("hac lag must be a non-negative whole number in %q", s)
		}
		return CovSpec{Kind: HAC, Lags: l}, nil
	}
	return CovSpec{}, fmt.Errorf("unknown standard-error type %q (want ols, hc1 or hac(L))", s)
}

// Cov returns the covariance matrix of β̂ under the given estimator.
func (f *Fit) Cov(c CovSpec) *mat.SymDense {
	inv := f.XtXInv()
	if c.Kind == Classical {
		out := mat.NewSymDense(f.K, nil)
		out.ScaleSym(f.Sigma2(), inv)
		return out
	}
	meat := f.Meat(c)
	return Sandwich(inv, meat, float64(f.N)/float64(f.N-f.K))
}

// Meat returns the middle matrix Σ_t e_t² x_t x_t' (HC) or the Bartlett
// weighted sum of autocovariances of x_t e_t (HAC), without scaling.
func (f *Fit) Meat(c CovSpec) *mat.SymDense {
	k := f.K
	n := f.N
	u := mat.NewDense(n, k, nil) // rows x_t e_t
	for t := 0; t < n; t++ {
		for j := 0; j < k; j++ {
			u.Set(t, j, f.x.At(t, j)*f.Resid[t])
		}
	}
	lags := 0
	if c.Kind == HAC {
		lags = c.Lags
	}
	return BartlettLRV(u, lags)
}

// BartlettLRV returns Γ₀ + Σ_{j=1..L} (1 − j/(L+1)) (Γ_j + Γ_j') for the
// rows u_t of u, with Γ_j = Σ_{t>j} u_t u_{t−j}' (sums, not averages).
func BartlettLRV(u *mat.Dense, lags int) *mat.SymDense {
	n, k := u.Dims()
	s := mat.NewSymDense(k, nil)
	for a := 0; a < k; a++ {
		for b := a; b < k; b++ {
			var g float64
			for t := 0; t < n; t++ {
				g += u.At(t, a) * u.At(t, b)
			}
			s.SetSym(a, b, g)
		}
	}
	for j := 1; j <= lags && j < n; j++ {
		w := 1 - float64(j)/float64(lags+1)
		for a := 0; a < k; a++ {
			for b := a; b < k; b++ {
				var g float64
				for t := j; t < n; t++ {
					g += u.At(t, a)*u.At(t-j, b) + u.At(t, b)*u.At(t-j, a)
				}
				s.SetSym(a, b, s.At(a, b)+w*g)
			}
		}
	}
	return s
}

// Sandwich returns c · A M A for symmetric A and M.
func Sandwich(a, m *mat.SymDense, c float64) *mat.SymDense {
	k := a.SymmetricDim()
	var am, ama mat.Dense
	am.Mul(a, m)
	ama.Mul(&am, a)
	out := mat.NewSymDense(k, nil)
	for i := 0; i < k; i++ {
		for j := i; j < k; j++ {
			out.SetSym(i, j, c*(ama.At(i, j)+ama.At(j, i))/2)
		}
	}
	return out
}

// LinearCov returns B V B′, symmetrised: the covariance of Bθ when θ has
// covariance V (the delta method's covariance when B is the Jacobian of a
// function of θ).
func LinearCov(b mat.Matrix, v mat.Symmetric) *mat.SymDense {
	r, _ := b.Dims()
	var bv, bvb mat.Dense
	bv.Mul(b, v)
	bvb.Mul(&bv, b.T())
	out := mat.NewSymDense(r, nil)
	for i := 0; i < r; i++ {
		for j := i; j < r; j++ {
			out.SetSym(i, j, (bvb.At(i, j)+bvb.At(j, i))/2)
		}
	}
	return out
}

// SE returns the square roots of the diagonal of a covariance matrix.
func SE(cov *mat.SymDense) []float64 {
	k := cov.SymmetricDim()
	out := make([]float64, k)
	for i := range out {
		out[i] = math.Sqrt(cov.At(i, i))
	}
	return out
}
