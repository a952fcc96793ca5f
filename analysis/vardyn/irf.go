package vardyn

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

// MA returns the moving-average coefficients Φ_0..Φ_h of the VAR with
// coefficient matrices a (A_1..A_p, K×K each):
//
//	Φ_0 = I_K,  Φ_s = Σ_{j=1}^{min(s,p)} Φ_{s−j} A_j
//
// (Lütkepohl 2005, eq. 2.1.22). Φ_s[i, j] is the response of series i, s
// periods on, to a unit shock in the innovation of series j.
func MA(a []*mat.Dense, h int) ([]*mat.Dense, error) {
	if len(a) == 0 {
		return nil, errors.New("vardyn: no coefficient matrices")
	}
	k, c := a[0].Dims()
	if k != c {
		return nil, fmt.Errorf("vardyn: coefficient matrix is %d×%d, not square", k, c)
	}
	if h < 0 {
		return nil, fmt.Errorf("vardyn: horizon %d is negative", h)
	}
	phi := make([]*mat.Dense, h+1)
	phi[0] = mat.NewDense(k, k, nil)
	for i := 0; i < k; i++ {
		phi[0].Set(i, i, 1)
	}
	var tmp mat.Dense
	for s := 1; s <= h; s++ {
		phi[s] = mat.NewDense(k, k, nil)
		for j := 1; j <= min(s, len(a)); j++ {
			tmp.Mul(phi[s-j], a[j-1])
			phi[s].Add(phi[s], &tmp)
		}
	}
	return phi, nil
}

// CholeskyFactor returns the K×K matrix Q with QQ' = Σ that is lower
// triangular when rows and columns are taken in the order given (order[0]
// first; nil for the series' own order): with Σ_o[a, b] = Σ[o_a, o_b] and
// L L' = Σ_o its Cholesky factor, Q[o_a, o_b] = L[a, b]. Column j of Q is
// the orthogonalised shock of series j; a series earlier in the order is
// not moved on impact by the shocks of later ones.
func CholeskyFactor(sigma mat.Symmetric, order []int) (*mat.Dense, error) {
	k := sigma.SymmetricDim()
	o, err := checkOrder(order, k)
	if err != nil {
		return nil, err
	}
	so := mat.NewSymDense(k, nil)
	for a := 0; a < k; a++ {
		for b := a; b < k; b++ {
			so.SetSym(a, b, sigma.At(o[a], o[b]))
		}
	}
	var ch mat.Cholesky
	if !ch.Factorize(so) {
		return nil, errors.New("vardyn: the residual covariance is not positive definite")
	}
	var l mat.TriDense
	ch.LTo(&l)
	q := mat.NewDense(k, k, nil)
	for a := 0; a < k; a++ {
		for b := 0; b <= a; b++ {
			q.Set(o[a], o[b], l.At(a, b))
		}
	}
	return q, nil
}

func checkOrder(order []int, k int) ([]int, error) {
	if order == nil {
		o := make([]int, k)
		for i := range o {
			o[i] = i
		}
		return o, nil
	}
	if len(order) != k {
		return nil, fmt.Errorf("vardyn: the ordering lists %d series; the system has %d", len(order), k)
	}
	seen := make([]bool, k)
	for _, i := range order {
		if i < 0 || i >= k || seen[i] {
			return nil, fmt.Errorf("vardyn: the ordering %v is not a permutation of 0..%d", order, k-1)
		}
		seen[i] = true
	}
	return order, nil
}

// Orthogonalised returns Θ_s = Φ_s Q, s = 0..h, the responses to
// orthogonalised (Cholesky) shocks of one standard deviation, Q the factor
// of CholeskyFactor for the ordering (Lütkepohl 2005, §2.3.2).
func Orthogonalised(phi []*mat.Dense, sigma mat.Symmetric, order []int) ([]*mat.Dense, error) {
	q, err := CholeskyFactor(sigma, order)
	if err != nil {
		return nil, err
	}
	out := make([]*mat.Dense, len(phi))
	for s, p := range phi {
		out[s] = mat.NewDense(q.RawMatrix().Rows, q.RawMatrix().Cols, nil)
		out[s].Mul(p, q)
	}
	return out, nil
}

// Generalised returns the generalised impulse responses of Pesaran and
// Shin (1998, eq. 10), which do not depend on an ordering:
//
//	ψ_s(j) = σ_jj^{−1/2} Φ_s Σ e_j,
//
// column j of the result at s: the responses to a shock of one standard
// deviation in the innovation of series j, the other innovations moving
// with it by their conditional expectations. For j first in a Cholesky
// ordering, ψ_s(j) equals the orthogonalised response.
func Generalised(phi []*mat.Dense, sigma mat.Symmetric) ([]*mat.Dense, error) {
	k := sigma.SymmetricDim()
	sd, err := innovationSD(sigma)
	if err != nil {
		return nil, err
	}
	out := make([]*mat.Dense, len(phi))
	for s, p := range phi {
		var ps mat.Dense
		ps.Mul(p, sigma)
		for j := 0; j < k; j++ {
			for i := 0; i < k; i++ {
				ps.Set(i, j, ps.At(i, j)/sd[j])
			}
		}
		out[s] = &ps
	}
	return out, nil
}

// FEVD returns the forecast-error variance decomposition from the
// orthogonalised responses theta (Θ_0..Θ_{H−1} at least) for horizons
// h = 1..H: out[h−1][i][j] is the share of the h-step forecast-error
// variance of series i due to shock j,
//
//	ω_ij(h) = Σ_{s=0}^{h−1} Θ_s[i, j]² / Σ_{s=0}^{h−1} Σ_l Θ_s[i, l]²
//
// (Lütkepohl 2005, §2.3.3; the denominator is the MSE (Φ_s Σ Φ_s')_ii
// summed, since ΘΘ' = ΦΣΦ'). Each row sums to one.
func FEVD(theta []*mat.Dense, h int) ([][][]float64, error) {
	if h < 1 || h > len(theta) {
		return nil, fmt.Errorf("vardyn: horizon %d outside 1..%d", h, len(theta))
	}
	k, _ := theta[0].Dims()
	num := make([][]float64, k)
	for i := range num {
		num[i] = make([]float64, k)
	}
	out := make([][][]float64, h)
	for s := 0; s < h; s++ {
		for i := 0; i < k; i++ {
			for j := 0; j < k; j++ {
				v := theta[s].At(i, j)
				num[i][j] += v * v
			}
		}
		out[s] = make([][]float64, k)
		for i := 0; i < k; i++ {
			var tot float64
			for _, v := range num[i] {
				tot += v
			}
			row := make([]float64, k)
			for j := range row {
				row[j] = num[i][j] / tot
			}
			out[s][i] = row
		}
	}
	return out, nil
}

// innovationSD is √σ_jj for each series j of the innovation covariance;
// a variance that is not positive is an error.
func innovationSD(sigma mat.Symmetric) ([]float64, error) {
	sd := make([]float64, sigma.SymmetricDim())
	for j := range sd {
		s := sigma.At(j, j)
		if !(s > 0) {
			return nil, fmt.Errorf("vardyn: the innovation variance of series %d is not positive", j)
		}
		sd[j] = math.Sqrt(s)
	}
	return sd, nil
}
