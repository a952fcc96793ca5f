package vardyn

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/ols"
)

// Det is the deterministic part of a VAR.
type Det int

const (
	NoDet      Det = iota // none
	Const                 // a constant
	ConstTrend            // a constant and a linear trend
)

func (d Det) count() int {
	switch d {
	case Const:
		return 1
	case ConstTrend:
		return 2
	}
	return 0
}

// VAR is a vector autoregression fitted by least squares.
type VAR struct {
	K, P, T int // series, lags, observations used
	Det     Det
	// A holds A_1..A_P (K×K); C the deterministic coefficients (K×d:
	// constant, then trend).
	A []*mat.Dense
	C *mat.Dense
	// Sigma is the residual covariance U'U/(T − KP − d) (degrees of freedom
	// adjusted, as the Wald tests and impulse responses use it).
	Sigma *mat.SymDense
	// XtXInv is (X'X)⁻¹ of the common regressors [d_t, y_{t−1}', …, y_{t−P}'].
	XtXInv *mat.SymDense
	// Resid holds the residuals (T×K), row t for observation P + t of y.
	Resid *mat.Dense
}

// DFResid is T − KP − d, the residual degrees of freedom per equation.
func (v *VAR) DFResid() int { return v.T - v.K*v.P - v.Det.count() }

// Fit estimates the VAR(p) y_t = C d_t + Σ_{i=1}^{p} A_i y_{t−i} + u_t on the
// rows of y (T₀×K, rows are time) by least squares, one equation at a time
// on the common regressors (Lütkepohl 2005, §3.2: equation-by-equation OLS
// is the multivariate LS estimator). The trend takes the value of the row
// number of y_t (0-based), as in the rest of galley. Σ̂ = Û'Û/(T − Kp − d).
func Fit(y *mat.Dense, p int, det Det) (*VAR, error) {
	if y == nil {
		return nil, errors.New("vardyn: no data")
	}
	rows, k := y.Dims()
	if k < 1 {
		return nil, errors.New("vardyn: no series")
	}
	if p < 1 {
		return nil, fmt.Errorf("vardyn: a VAR needs at least one lag, got %d", p)
	}
	for i := 0; i < rows; i++ {
		for j := 0; j < k; j++ {
			if v := y.At(i, j); math.IsNaN(v) || math.IsInf(v, 0) {
				return nil, fmt.Errorf("vardyn: series %d has a missing or infinite value at row %d", j, i)
			}
		}
	}
	nd := det.count()
	t := rows - p
	m := nd + k*p
	if t <= m {
		return nil, fmt.Errorf("vardyn: too few observations: %d rows with %d lags leave %d, and each equation has %d coefficients", rows, p, max(t, 0), m)
	}
	x := mat.NewDense(t, m, nil)
	for i := 0; i < t; i++ {
		johansen.LevelsRow(x, i, i+p, nd, p, y)
	}
	v := &VAR{K: k, P: p, T: t, Det: det, Resid: mat.NewDense(t, k, nil)}
	for l := 0; l < p; l++ {
		v.A = append(v.A, mat.NewDense(k, k, nil))
	}
	if nd > 0 {
		v.C = mat.NewDense(k, nd, nil)
	}
	yi := make([]float64, t)
	for i := 0; i < k; i++ {
		for r := 0; r < t; r++ {
			yi[r] = y.At(r+p, i)
		}
		f, err := ols.Regress(yi, x)
		if err != nil {
			var ce *ols.CollinearError
			if errors.As(err, &ce) {
				return nil, fmt.Errorf("vardyn: collinear regressors in the VAR (%s)", v.regressorName(ce.Col))
			}
			return nil, fmt.Errorf("vardyn: equation %d: %v", i, err)
		}
		for c := 0; c < nd; c++ {
			v.C.Set(i, c, f.Coef[c])
		}
		for l := 0; l < p; l++ {
			for j := 0; j < k; j++ {
				v.A[l].Set(i, j, f.Coef[nd+l*k+j])
			}
		}
		v.Resid.SetCol(i, f.Resid)
		if i == 0 {
			v.XtXInv = f.XtXInv()
		}
	}
	df := float64(v.DFResid())
	v.Sigma = mat.NewSymDense(k, nil)
	for a := 0; a < k; a++ {
		for b := a; b < k; b++ {
			var s float64
			for r := 0; r < t; r++ {
				s += v.Resid.At(r, a) * v.Resid.At(r, b)
			}
			v.Sigma.SetSym(a, b, s/df)
		}
	}
	return v, nil
}

func (v *VAR) regressorName(c int) string {
	nd := v.Det.count()
	switch {
	case c < nd && c == 0:
		return "the constant"
	case c < nd:
		return "the trend"
	}
	c -= nd
	return fmt.Sprintf("lag %d of series %d", c/v.K+1, c%v.K)
}
