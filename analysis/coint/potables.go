package coint

import (
	"fmt"

	"github.com/galley-econ/galley/analysis/critical"
)

// POLevels are the upper-tail levels of the Phillips–Ouliaris tables
// used here, in the order of critical.MacKinnonLevels.
var POLevels = []float64{0.01, 0.05, 0.10}

// POMaxRegressors is the largest number of regressors k covered by the
// Phillips–Ouliaris tables.
const POMaxRegressors = 5

// poPu and poPz are the asymptotic upper-tail quantiles of P̂u and P̂z
// from Phillips and Ouliaris (1990): Tables Ia, Ib, Ic (P̂u) and IIa,
// IIb, IIc (P̂z) for no deterministic terms, demeaned and detrended
// data, indexed [case][k−1][level 1%, 5%, 10%]. The numbers were
// transcribed from the copy of these tables in r-cran-urca 1.3.3 (not
// re-read from the printed paper); the transcription is checked against
// that package by a fixture test.
var poPu = [3][POMaxRegressors][3]float64{
	{ // Table Ia: no deterministic terms
		{38.3413, 25.9711, 20.3933},
		{46.4097, 32.9392, 26.7022},
		{55.7341, 40.122, 33.5359},
		{63.2149, 46.2691, 39.2826},
		{69.4939, 51.8614, 44.3725},
	},
	{ // Table Ib: demeaned
		{48.0021, 33.713, 27.8536},
		{53.8731, 40.5252, 33.6955},
		{63.4128, 46.7281, 39.6949},
		{71.5214, 53.2502, 45.3308},
		{76.7705, 57.7855, 50.3537},
	},
	{ // Table Ic: demeaned and detrended
		{65.1714, 48.8439, 41.2488},
		{69.2629, 53.83, 46.1061},
		{78.347, 60.2384, 52.0015},
		{84.548, 65.8706, 57.3667},
		{91.0392, 70.7416, 61.6155},
	},
}

var poPz = [3][POMaxRegressors][3]float64{
	{ // Table IIa: no deterministic terms
		{55.1911, 40.8217, 33.9267},
		{89.6679, 71.2751, 62.1436},
		{131.5716, 109.7426, 99.2664},
		{180.4845, 155.8019, 143.0775},
		{237.7723, 210.291, 195.6202},
	},
	{ // Table IIb: demeaned
		{71.9273, 55.2202, 47.5877},
		{109.4525, 89.7619, 80.2034},
		{153.4504, 132.2207, 120.3035},
		{209.8054, 182.0749, 168.8572},
		{270.5018, 241.3316, 225.2303},
	},
	{ // Table IIc: demeaned and detrended
		{102.0167, 81.3812, 71.9586},
		{145.8644, 124.3933, 113.4929},
		{201.0905, 175.9902, 163.105},
		{264.4988, 234.2865, 219.5098},
		{335.9054, 301.0949, 284.01},
	},
}

// POCritical returns the 1%, 5% and 10% asymptotic critical values of
// P̂u (trace false) or P̂z (trace true) for k regressors and case det
// (n, c or ct), from Phillips and Ouliaris (1990) Tables I and II. The
// null of no cointegration is rejected for values above them.
func POCritical(k int, det critical.Case, trace bool) ([]critical.Value, error) {
	if det < critical.NoConst || det > critical.ConstTrend {
		return nil, fmt.Errorf("coint: Phillips–Ouliaris tables cover cases n, c and ct, not %v", det)
	}
	if k < 1 || k > POMaxRegressors {
		return nil, fmt.Errorf("coint: Phillips–Ouliaris tables cover 1..%d regressors, not %d; simulate critical values for this case", POMaxRegressors, k)
	}
	row := poPu[det][k-1]
	if trace {
		row = poPz[det][k-1]
	}
	out := make([]critical.Value, 3)
	for i, l := range POLevels {
		out[i] = critical.Value{Level: l, Value: row[i]}
	}
	return out, nil
}
