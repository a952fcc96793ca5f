package simulate

import (
	"math"

	"gonum.org/v1/gonum/stat/distuv"
)

// quantile is the p-quantile of the ascending sample x by linear
// interpolation between order statistics at h = (n−1)p (Hyndman and Fan
// 1996, definition 7).
func quantile(x []float64, p float64) float64 {
	n := len(x)
	h := float64(n-1) * p
	lo := int(math.Floor(h))
	if lo >= n-1 {
		return x[n-1]
	}
	if lo < 0 {
		return x[0]
	}
	return x[lo] + (h-float64(lo))*(x[lo+1]-x[lo])
}

// quantileSE is the Monte Carlo standard error of quantile(x, p):
//
//	se = √(p(1−p)/n) · ŝ(p),  ŝ(p) = [Q̂(p+h) − Q̂(p−h)] / (2h),
//
// ŝ the sparsity (1/f at the quantile) by Siddiqui's (1960) difference
// quotient with the Hall and Sheather (1988) bandwidth
//
//	h = n^{−1/3} z^{2/3} [1.5 φ(Φ⁻¹(p))² / (2Φ⁻¹(p)² + 1)]^{1/3},
//
// z = Φ⁻¹(0.975) (Koenker 2005, §3.4.2), h cut so that p ± h stays
// half an observation inside (0, 1).
func quantileSE(x []float64, p float64) float64 {
	n := float64(len(x))
	h := hallSheather(len(x), p)
	h = math.Min(h, math.Min(p, 1-p)-0.5/n)
	if h <= 0 {
		return math.NaN()
	}
	s := (quantile(x, p+h) - quantile(x, p-h)) / (2 * h)
	return math.Sqrt(p*(1-p)/n) * s
}

func hallSheather(n int, p float64) float64 {
	std := distuv.UnitNormal
	z := std.Quantile(0.975)
	q := std.Quantile(p)
	f := std.Prob(q)
	return math.Pow(float64(n), -1.0/3) * math.Pow(z, 2.0/3) *
		math.Cbrt(1.5*f*f/(2*q*q+1))
}
