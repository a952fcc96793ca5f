package diag

import (
	"math"

	"github.com/galley-econ/galley/analysis/ols"
)

// DurbinWatson is the Durbin and Watson (1950) statistic
//
//	d = Σ_{t=2..N} (e_t − e_{t−1})² / Σ_{t=1..N} e_t².
//
// Its null distribution depends on X, so no p-value is given (PValue is
// NaN) and DF is zero; d near 2 indicates no first-order autocorrelation.
func DurbinWatson(f *ols.Fit) (Test, error) {
	if f == nil {
		return Test{}, ErrNoFit
	}
	return Test{Name: "Durbin–Watson", Stat: f.DW(), PValue: math.NaN()}, nil
}
