package stability

import (
	"fmt"
	"math"
)

// MaxExactUniforms is the largest number of uniform order statistics for
// which CUSUMSquaresConst computes the critical value exactly; beyond it
// the cost (cubic in the count) is too high and an error is returned.
// It corresponds to about 2000 recursive residuals (about a second).
const MaxExactUniforms = 1000

// CUSUMSquaresConst returns c₀, the half-width of the CUSUM-of-squares
// band for a two-sided test at level alpha with m recursive residuals.
//
// Under constancy the squared recursive residuals are σ²χ²₁; summed in
// pairs they are exponential, so the cumulated sums at every second
// residual are distributed as the order statistics U₍₁₎ < … < U₍ₙ₎ of
// n = m/2 − 1 independent uniforms, with means j/(n+1) (BDE 1975,
// section 2.4, after Durbin 1969, Biometrika 56, 1–15, whose table of
// this "modified Kolmogorov–Smirnov" critical value BDE use). c₀ is the
// one-sided α/2 point
//
//	P( max_j [U₍ⱼ₎ − j/(n+1)] > c₀ ) = α/2
//
// (the lower side has the same law by symmetry). Rather than a table or
// an approximating formula, the probability is computed exactly: the
// event {U₍ⱼ₎ ≤ b_j for all j} is evaluated by a recursion over the cells
// between consecutive bounds b_j, with binomial transitions for the
// number of points in each cell given those already placed, and c₀ is
// found by bisection. For odd m, n is not whole and c₀ is interpolated
// linearly between the neighbouring whole n (BDE suggest interpolation
// in Durbin's table). Requires m ≥ 4 and n ≤ MaxExactUniforms.
//
// The definition of Durbin's statistic here is reconstructed, not copied
// from his paper; the tests compare the result with the approximating
// formula of Edgerton and Wells (1994) as implemented in statsmodels.
func CUSUMSquaresConst(m int, alpha float64) (float64, error) {
	if !(alpha > 0 && alpha < 1) {
		return 0, fmt.Errorf("stability: CUSUM-of-squares significance level %v outside (0, 1)", alpha)
	}
	if m < 4 {
		return 0, fmt.Errorf("stability: CUSUM-of-squares band needs at least 4 recursive residuals, have %d", m)
	}
	if m%2 == 0 {
		return ksUpper(m/2-1, alpha/2)
	}
	n0 := (m-1)/2 - 1
	c0, err := ksUpper(n0, alpha/2)
	if err != nil {
		return 0, err
	}
	c1, err := ksUpper(n0+1, alpha/2)
	if err != nil {
		return 0, err
	}
	return (c0 + c1) / 2, nil
}

// ksUpper returns c with P(max_j [U₍ⱼ₎ − j/(n+1)] > c) = p for n uniforms.
func ksUpper(n int, p float64) (float64, error) {
	if n < 1 {
		return 0, fmt.Errorf("stability: %d uniforms", n)
	}
	if n > MaxExactUniforms {
		return 0, fmt.Errorf("stability: CUSUM-of-squares constant for %d order statistics exceeds the exact limit %d (about %d recursive residuals)",
			n, MaxExactUniforms, 2*MaxExactUniforms+2)
	}
	lf := logFactorials(n)
	g := func(c float64) float64 { return 1 - orderBelow(n, c, lf) - p } // decreasing in c
	// Bracket around the Brownian-bridge value √(ln(1/p)/2)/√n.
	guess := math.Sqrt(math.Log(1/p)/2) / math.Sqrt(float64(n))
	lo, hi := math.Max(0, 0.5*guess-1/float64(n)), math.Min(1, 1.5*guess+1/float64(n))
	glo, ghi := g(lo), g(hi)
	if glo < 0 {
		lo, glo = 0, g(0)
	}
	if ghi > 0 {
		hi, ghi = 1, g(1)
	}
	if glo < 0 || ghi > 0 {
		return 0, fmt.Errorf("stability: no CUSUM-of-squares constant for n=%d, p=%v", n, p)
	}
	// Illinois variant of regula falsi: superlinear, keeps the bracket.
	side := 0
	for i := 0; i < 100 && hi-lo > 1e-12; i++ {
		c := (lo*ghi - hi*glo) / (ghi - glo)
		if !(c > lo && c < hi) {
			c = (lo + hi) / 2
		}
		gc := g(c)
		switch {
		case gc == 0:
			return c, nil
		case gc > 0:
			lo, glo = c, gc
			if side == -1 {
				ghi /= 2
			}
			side = -1
		default:
			hi, ghi = c, gc
			if side == 1 {
				glo /= 2
			}
			side = 1
		}
		if math.Abs(gc) < 1e-15 {
			return c, nil
		}
	}
	return (lo + hi) / 2, nil
}

// orderBelow is P(U₍ⱼ₎ ≤ min(1, j/(n+1)+c) for j = 1..n).
func orderBelow(n int, c float64, lf []float64) float64 {
	// dp[m] = P(exactly m points in [0, b_i] and the constraints so far hold)
	dp := make([]float64, n+1)
	next := make([]float64, n+1)
	dp[0] = 1
	prev := 0.0
	for i := 1; i <= n; i++ {
		b := math.Min(1, float64(i)/float64(n+1)+c)
		for m := range next {
			next[m] = 0
		}
		var q float64
		if prev < 1 {
			q = (b - prev) / (1 - prev)
		} else {
			q = 1
		}
		for m := 0; m <= n; m++ {
			pm := dp[m]
			if pm == 0 {
				continue
			}
			rest := n - m
			switch {
			case q >= 1:
				next[n] += pm
				continue
			case q <= 0:
				next[m] += pm
				continue
			}
			// Binomial(rest, q) probabilities for d ≥ need, by the ratio
			// recursion from the first term, truncated once past the mean
			// and below 1e-20 of the carried mass (the dropped tail is
			// geometrically smaller still).
			lq, l1q := math.Log(q), math.Log1p(-q)
			need := max(0, i-m)
			ratio := q / (1 - q)
			mean := float64(rest) * q
			lp := lf[rest] - lf[need] - lf[rest-need] + float64(need)*lq + float64(rest-need)*l1q
			d := need
			// In log space while the terms would underflow …
			for ; d <= rest && lp < -700; d++ {
				if float64(d) > mean {
					d = rest + 1
					break
				}
				lp += math.Log(float64(rest-d) / float64(d+1) * ratio)
			}
			// … then by multiplication.
			if d <= rest {
				v := math.Exp(lp)
				for ; d <= rest; d++ {
					next[m+d] += pm * v
					if float64(d) > mean && v < 1e-20 {
						break
					}
					v *= float64(rest-d) / float64(d+1) * ratio
				}
			}
		}
		dp, next = next, dp
		for m := 0; m < i; m++ {
			dp[m] = 0
		}
		prev = b
	}
	var s float64
	for _, v := range dp {
		s += v
	}
	return s
}

func logFactorials(n int) []float64 {
	lf := make([]float64, n+1)
	for i := 1; i <= n; i++ {
		lf[i] = lf[i-1] + math.Log(float64(i))
	}
	return lf
}
