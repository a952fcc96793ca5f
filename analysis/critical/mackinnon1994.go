package critical

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/stat/distuv"
)

// MaxPN is the largest number of variables N covered by MacKinnonP.
const MaxPN = 6

// pfunc is one approximate distribution function: the statistic below
// which the small-p polynomial applies (star), the range outside which
// the p-value is set to 0 or 1 (min, max), and the polynomials in τ.
type pfunc struct {
	star, min, max float64
	small          [3]float64 // γ0 + γ1 τ + γ2 τ²
	large          [4]float64 // γ0 + γ1 τ + γ2 τ² + γ3 τ³
}

// p1994 holds the coefficients of MacKinnon's (1994) approximate
// asymptotic distribution functions of the τ statistics, "Approximate
// Asymptotic Distribution Functions for Unit-Root and Cointegration
// Tests", Journal of Business and Economic Statistics 12, 167–176,
// indexed [case][N−1], N = 1..6, with the usual rescaling of the printed
// coefficients already applied (printed γ2 of the small-p fit ×10⁻²;
// γ1, γ2, γ3 of the large-p fit ×10⁻¹, 10⁻¹, 10⁻²). The switch points
// τ* and the bounds τmin, τmax are those used with these functions in
// common practice. Transcribed from a public transcription (the paper was
// not at hand) and verified against statsmodels 0.13.5 mackinnonp.
var p1994 = [4][MaxPN]pfunc{
	NoConst: {
		{-1.04, -19.04, math.Inf(1), [3]float64{0.6344, 1.2378, 3.2496e-2}, [4]float64{0.4797, 9.3557e-1, -0.6999e-1, 3.3066e-2}},
		{-1.53, -19.62, 1.51, [3]float64{1.9129, 1.3857, 3.5322e-2}, [4]float64{1.5578, 8.558e-1, -2.083e-1, -3.3549e-2}},
		{-2.68, -21.21, 0.86, [3]float64{2.7648, 1.4502, 3.4186e-2}, [4]float64{2.2268, 6.8093e-1, -3.2362e-1, -5.4448e-2}},
		{-3.09, -23.25, 0.88, [3]float64{3.4336, 1.4835, 3.19e-2}, [4]float64{2.7654, 6.4502e-1, -3.0811e-1, -4.4946e-2}},
		{-3.07, -21.63, 1.05, [3]float64{4.0999, 1.5533, 3.59e-2}, [4]float64{3.2684, 6.8051e-1, -2.6778e-1, -3.4972e-2}},
		{-3.77, -25.74, 1.24, [3]float64{4.5388, 1.5344, 2.9807e-2}, [4]float64{3.7268, 7.167e-1, -2.3648e-1, -2.8288e-2}},
	},
	Const: {
		{-1.61, -18.83, 2.74, [3]float64{2.1659, 1.4412, 3.8269e-2}, [4]float64{1.7339, 9.3202e-1, -1.2745e-1, -1.0368e-2}},
		{-2.62, -18.86, 0.92, [3]float64{2.92, 1.5012, 3.9796e-2}, [4]float64{2.1945, 6.4695e-1, -2.9198e-1, -4.2377e-2}},
		{-3.13, -23.48, 0.55, [3]float64{3.4699, 1.4856, 3.164e-2}, [4]float64{2.5893, 4.5168e-1, -3.6529e-1, -5.0074e-2}},
		{-3.47, -28.07, 0.61, [3]float64{3.9673, 1.4777, 2.6315e-2}, [4]float64{3.0387, 4.5452e-1, -3.3666e-1, -4.1921e-2}},
		{-3.78, -25.96, 0.79, [3]float64{4.5509, 1.5338, 2.9545e-2}, [4]float64{3.5049, 5.2098e-1, -2.9158e-1, -3.3468e-2}},
		{-3.93, -23.27, 1, [3]float64{5.1399, 1.6036, 3.4445e-2}, [4]float64{3.9489, 5.8933e-1, -2.5359e-1, -2.721e-2}},
	},
	ConstTrend: {
		{-2.89, -16.18, 0.7, [3]float64{3.2512, 1.6047, 4.9588e-2}, [4]float64{2.5261, 6.1654e-1, -3.7956e-1, -6.0285e-2}},
		{-3.19, -21.15, 0.63, [3]float64{3.6646, 1.5419, 3.6448e-2}, [4]float64{2.85, 5.272e-1, -3.6622e-1, -5.1695e-2}},
		{-3.50, -25.37, 0.71, [3]float64{4.0983, 1.5173, 2.9898e-2}, [4]float64{3.221, 5.255e-1, -3.2685e-1, -4.1501e-2}},
		{-3.65, -26.63, 0.93, [3]float64{4.5844, 1.5338, 2.8796e-2}, [4]float64{3.652, 5.9758e-1, -2.7483e-1, -3.2081e-2}},
		{-3.80, -26.53, 1.19, [3]float64{5.0722, 1.5634, 2.9472e-2}, [4]float64{4.0712, 6.6428e-1, -2.3464e-1, -2.546e-2}},
		{-4.36, -26.18, 1.42, [3]float64{5.53, 1.5914, 3.0392e-2}, [4]float64{4.4735, 7.1757e-1, -2.0681e-1, -2.1196e-2}},
	},
	ConstTrendSq: {
		{-3.21, -17.17, 0.54, [3]float64{4.0003, 1.658, 4.8288e-2}, [4]float64{3.0778, 4.9529e-1, -4.1477e-1, -5.9359e-2}},
		{-3.51, -21.1, 0.79, [3]float64{4.3534, 1.6016, 3.7947e-2}, [4]float64{3.4713, 5.967e-1, -3.2507e-1, -4.2286e-2}},
		{-3.81, -24.33, 1.08, [3]float64{4.7343, 1.5768, 3.2396e-2}, [4]float64{3.8637, 6.7852e-1, -2.6286e-1, -3.1381e-2}},
		{-3.83, -24.03, 1.43, [3]float64{5.214, 1.6077, 3.3449e-2}, [4]float64{4.2736, 7.6199e-1, -2.1534e-1, -2.4026e-2}},
		{-4.12, -24.33, 3.49, [3]float64{5.6481, 1.6274, 3.3455e-2}, [4]float64{4.6679, 8.2618e-1, -1.822e-1, -1.9147e-2}},
		{-4.63, -28.22, 1.92, [3]float64{5.9296, 1.5929, 2.8223e-2}, [4]float64{5.0009, 8.3735e-1, -1.6994e-1, -1.6928e-2}},
	},
}

// MacKinnonP returns the approximate asymptotic p-value P(τ < stat) of
// a Dickey–Fuller τ statistic (n = 1) or an Engle–Granger τ with n
// variables (n = 2..6), for cases n, c, ct and ctt, from MacKinnon's
// (1994) approximate distribution functions:
//
//	p = Φ(γ0 + γ1 τ + γ2 τ²)            for τ ≤ τ*,
//	p = Φ(γ0 + γ1 τ + γ2 τ² + γ3 τ³)    for τ > τ*,
//
// with p = 0 below τmin and p = 1 above τmax. The p-value is asymptotic;
// it does not depend on the sample size.
func MacKinnonP(stat float64, n int, c Case) (float64, error) {
	if !c.valid() {
		return 0, fmt.Errorf("critical: unsupported deterministic case %d (want n, c, ct or ctt)", int(c))
	}
	if n < 1 || n > MaxPN {
		return 0, fmt.Errorf("critical: MacKinnon (1994) p-values cover N = 1..%d variables, not %d", MaxPN, n)
	}
	if math.IsNaN(stat) {
		return 0, errors.New("critical: statistic is NaN")
	}
	f := p1994[c][n-1]
	switch {
	case stat > f.max:
		return 1, nil
	case stat < f.min:
		return 0, nil
	}
	var z float64
	if stat <= f.star {
		z = f.small[0] + stat*(f.small[1]+stat*f.small[2])
	} else {
		z = f.large[0] + stat*(f.large[1]+stat*(f.large[2]+stat*f.large[3]))
	}
	return distuv.UnitNormal.CDF(z), nil
}
