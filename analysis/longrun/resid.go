package longrun

import (
	"math"

	"github.com/galley-econ/galley/analysis/critical"
)

// RelationResid is the equilibrium error of an estimated long-run
// relation over the whole sample,
//
//	û_t = y_t − d_t'δ̂ − x_t'β̂,  t = 1 … T,
//
// with the deterministic terms d_t = (1, t, t², …) of case det counted
// t = 1, 2, … from the first observation (as DOLS and FMOLS count them)
// and coef holding δ̂ then β̂, one β̂ per column of x. It is the series an
// error-correction model lags (Engle and Granger 1987; with DOLS or FMOLS
// estimates of β, Stock and Watson 1993, Phillips and Hansen 1990).
func RelationResid(y []float64, x [][]float64, det critical.Case, coef []float64) []float64 {
	nd := det.Deterministics()
	out := make([]float64, len(y))
	for t := range out {
		s := float64(t + 1)
		v := y[t]
		for j := 0; j < nd; j++ {
			v -= coef[j] * math.Pow(s, float64(j))
		}
		for j := nd; j < len(coef); j++ {
			v -= coef[j] * x[j-nd][t]
		}
		out[t] = v
	}
	return out
}
