package longrun

import (
	"fmt"

	"github.com/galley-econ/galley/analysis/critical"
)

// lcTable holds the upper 1%, 5% and 10% quantiles of Hansen's (1992)
// Lc under the null, by deterministic case (c, ct) and number of I(1)
// regressors m = 1..4.
//
// Source: a Monte Carlo of the statistic as HansenLc computes it
// (testdata/scripts/longrun_lc.py, mode crit: T = 500, 20,000
// replications per entry, y_t = x_t'ι + u_t with x a Gaussian random
// walk and u iid N(0, 1), Bartlett kernel with Andrews' bandwidth; Monte
// Carlo standard errors at most 0.019), rounded to three decimals and
// stored with the script's output in testdata/fixtures/longrun_lc_crit.json.
// Hansen's (1992) Table 1 itself could not be consulted; from memory its
// 5% value for m = 1 with a constant is 0.575, against 0.572 here.
var lcTable = []struct {
	det  string
	m    int
	crit [3]float64
}{
	{"c", 1, [3]float64{0.879, 0.572, 0.447}},
	{"c", 2, [3]float64{1.026, 0.694, 0.556}},
	{"c", 3, [3]float64{1.201, 0.828, 0.675}},
	{"c", 4, [3]float64{1.316, 0.934, 0.776}},
	{"ct", 1, [3]float64{0.956, 0.616, 0.492}},
	{"ct", 2, [3]float64{1.100, 0.768, 0.625}},
	{"ct", 3, [3]float64{1.279, 0.911, 0.751}},
	{"ct", 4, [3]float64{1.406, 1.030, 0.871}},
}

// LcLevels are the levels of LcCritical.
var LcLevels = []float64{0.01, 0.05, 0.10}

// LcCritical returns the 1%, 5% and 10% critical values of Lc for m
// regressors and case det (c or ct; see lcTable), with their source, or
// nil and the reason.
func LcCritical(m int, det critical.Case) ([]critical.Value, string) {
	for _, e := range lcTable {
		if e.m == m && e.det == det.String() {
			out := make([]critical.Value, 3)
			for i, l := range LcLevels {
				out[i] = critical.Value{Level: l, Value: e.crit[i]}
			}
			return out, fmt.Sprintf("simulated null distribution of Lc (T=500, 20,000 replications; m=%d, case %s), in place of Hansen (1992) Table 1", m, det)
		}
	}
	return nil, fmt.Sprintf("none: tabulated for cases c and ct with 1 to 4 regressors, not case %s with %d", det, m)
}
