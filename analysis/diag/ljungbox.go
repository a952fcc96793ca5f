package diag

import "fmt"

// LjungBox is the Ljung and Box (1978) portmanteau statistic
//
//	Q(r) = N(N+2) Σ_{k=1..r} ρ̂_k² / (N − k),
//	ρ̂_k = Σ_{t>k} (e_t − ē)(e_{t−k} − ē) / Σ_t (e_t − ē)²,
//
// asymptotically χ²(r − m) under no autocorrelation, where m = modelDF is
// the number of estimated ARMA parameters (zero for regression residuals,
// as is common practice). It needs r > m.
func LjungBox(e []float64, r, modelDF int) (Test, error) {
	n := len(e)
	if r < 1 || r >= n {
		return Test{}, fmt.Errorf("diag: Ljung–Box order must be in 1..%d, got %d", n-1, r)
	}
	if modelDF < 0 || modelDF >= r {
		return Test{}, fmt.Errorf("diag: Ljung–Box model degrees of freedom %d must be in 0..%d", modelDF, r-1)
	}
	mean, err := finiteMean("residual", e)
	if err != nil {
		return Test{}, err
	}
	var c0 float64
	for _, v := range e {
		c0 += (v - mean) * (v - mean)
	}
	if c0 == 0 {
		return Test{}, fmt.Errorf("diag: Ljung–Box: the series is constant")
	}
	var q float64
	for k := 1; k <= r; k++ {
		var ck float64
		for t := k; t < n; t++ {
			ck += (e[t] - mean) * (e[t-k] - mean)
		}
		rho := ck / c0
		q += rho * rho / float64(n-k)
	}
	q *= float64(n) * float64(n+2)
	return chi2Test(fmt.Sprintf("Ljung–Box Q(%d)", r), q, r-modelDF), nil
}
