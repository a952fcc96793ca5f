package coint

import "github.com/galley-econ/galley/analysis/critical"

// MaxGHRegressors is the largest number of regressors m that Gregory
// and Hansen (1996) tabulate.
const MaxGHRegressors = 4

// ghTable[m−1][model] holds {1%, 5%, 10%} for ADF* and Zt* (which share
// them) and for Zα*.
//
// Source: Gregory and Hansen (1996), Journal of Econometrics 70,
// Table 1 ("approximate asymptotic critical values", trimming 0.15),
// written down from memory and compared entry by entry with a copy of
// the table in a public code repository, with which every entry agrees.
// The table's 2.5% column is left out: it could not be checked. The
// values are also reproduced within Monte Carlo error by this package's
// simulation (analysis/simulate, TestGHTable).
var ghTable = [MaxGHRegressors][3]struct{ tz, za [3]float64 }{
	{ // m = 1
		{[3]float64{-5.13, -4.61, -4.34}, [3]float64{-50.07, -40.48, -36.19}}, // C
		{[3]float64{-5.45, -4.99, -4.72}, [3]float64{-57.28, -47.96, -43.22}}, // C/T
		{[3]float64{-5.47, -4.95, -4.68}, [3]float64{-57.17, -47.04, -41.85}}, // C/S
	},
	{ // m = 2
		{[3]float64{-5.44, -4.92, -4.69}, [3]float64{-57.01, -46.98, -42.49}},
		{[3]float64{-5.80, -5.29, -5.03}, [3]float64{-64.77, -53.92, -48.94}},
		{[3]float64{-5.97, -5.50, -5.23}, [3]float64{-68.21, -58.33, -52.85}},
	},
	{ // m = 3
		{[3]float64{-5.77, -5.28, -5.02}, [3]float64{-63.64, -53.58, -48.65}},
		{[3]float64{-6.05, -5.57, -5.33}, [3]float64{-70.27, -59.76, -54.94}},
		{[3]float64{-6.51, -6.00, -5.75}, [3]float64{-80.15, -68.94, -63.42}},
	},
	{ // m = 4
		{[3]float64{-6.05, -5.56, -5.31}, [3]float64{-70.18, -59.40, -54.38}},
		{[3]float64{-6.36, -5.83, -5.59}, [3]float64{-76.95, -65.44, -60.12}},
		{[3]float64{-6.92, -6.41, -6.17}, [3]float64{-90.35, -78.52, -72.56}},
	},
}

// GHLevels are the levels of GHCritical, in order.
var GHLevels = []float64{0.01, 0.05, 0.10}

// GHCritical returns the 1%, 5% and 10% critical values of ADF* and Zt*
// (tz, shared) and of Zα* (za) for m regressors and model md, from
// Gregory and Hansen (1996) Table 1 (see ghTable); ok is false for m
// outside 1..MaxGHRegressors.
func GHCritical(m int, md GHModel) (tz, za []critical.Value, ok bool) {
	if m < 1 || m > MaxGHRegressors || md < GHLevel || md > GHRegime {
		return nil, nil, false
	}
	e := ghTable[m-1][md]
	for i, l := range GHLevels {
		tz = append(tz, critical.Value{Level: l, Value: e.tz[i]})
		za = append(za, critical.Value{Level: l, Value: e.za[i]})
	}
	return tz, za, true
}
