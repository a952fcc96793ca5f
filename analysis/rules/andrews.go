package rules

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

// AndrewsBandwidth is the automatic bandwidth of Andrews (1991, Section 6)
// with AR(1) approximating models for every column w_a of w (T×m), all
// given unit weight:
//
//	ρ̂_a = Σ_{t≥2} w_{a,t} w_{a,t−1} / Σ_{t≥2} w²_{a,t−1},
//	σ̂²_a = (T−1)⁻¹ Σ_{t≥2} (w_{a,t} − ρ̂_a w_{a,t−1})²,
//	α̂(1) = Σ_a 4ρ̂²σ̂⁴/((1−ρ̂)⁶(1+ρ̂)²) / Σ_a σ̂⁴/(1−ρ̂)⁴,
//	α̂(2) = Σ_a 4ρ̂²σ̂⁴/(1−ρ̂)⁸ / Σ_a σ̂⁴/(1−ρ̂)⁴,
//
// and b = 1.1447 (α̂(1) T)^{1/3} for the Bartlett kernel, b = 1.3221
// (α̂(2) T)^{1/5} for the quadratic-spectral kernel. The bandwidth is
// real-valued and not rounded; it enters the estimate as k(j/b).
func AndrewsBandwidth(w *mat.Dense, k Kernel) (float64, error) {
	if w == nil {
		return 0, fmt.Errorf("bandwidth: no data")
	}
	t, m := w.Dims()
	if t < 3 {
		return 0, fmt.Errorf("bandwidth: %d observations, need at least 3", t)
	}
	if m < 1 {
		return 0, fmt.Errorf("bandwidth: no series")
	}
	if k != Bartlett && k != QuadraticSpectral {
		return 0, fmt.Errorf("bandwidth: unknown kernel %v", k)
	}
	var num1, num2, den float64
	for a := 0; a < m; a++ {
		var sxy, sxx float64
		for i := 1; i < t; i++ {
			sxy += w.At(i, a) * w.At(i-1, a)
			sxx += w.At(i-1, a) * w.At(i-1, a)
		}
		if sxx == 0 {
			return 0, fmt.Errorf("bandwidth: series %d is zero", a)
		}
		rho := sxy / sxx
		if math.Abs(rho) >= 1 {
			return 0, fmt.Errorf("bandwidth: AR(1) coefficient %.4g of series %d is not below one in absolute value", rho, a)
		}
		var s2 float64
		for i := 1; i < t; i++ {
			e := w.At(i, a) - rho*w.At(i-1, a)
			s2 += e * e
		}
		s2 /= float64(t - 1)
		s4 := s2 * s2
		num1 += 4 * rho * rho * s4 / (math.Pow(1-rho, 6) * (1 + rho) * (1 + rho))
		num2 += 4 * rho * rho * s4 / math.Pow(1-rho, 8)
		den += s4 / math.Pow(1-rho, 4)
	}
	var b float64
	if k == Bartlett {
		b = 1.1447 * math.Cbrt(num1/den*float64(t))
	} else {
		b = 1.3221 * math.Pow(num2/den*float64(t), 0.2)
	}
	if math.IsNaN(b) || math.IsInf(b, 0) {
		return 0, fmt.Errorf("bandwidth: the AR(1) fits leave no usable bandwidth (%g); a series without noise?", b)
	}
	return b, nil
}
