package longrun

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

// Kernel is a lag window for long-run covariance estimation.
type Kernel int

const (
	// Bartlett is k(x) = 1 − |x| for |x| ≤ 1, else 0 (Newey and West 1987).
	// With bandwidth b = L+1 it gives the weights 1 − j/(L+1) of ols.HAC.
	Bartlett Kernel = iota
	// QuadraticSpectral is k(x) = 25/(12π²x²) · (sin(6πx/5)/(6πx/5) −
	// cos(6πx/5)), k(0) = 1 (Andrews 1991); it gives weight to every lag.
	QuadraticSpectral
)

// String names the kernel.
func (k Kernel) String() string {
	switch k {
	case Bartlett:
		return "Bartlett"
	case QuadraticSpectral:
		return "quadratic spectral"
	}
	return fmt.Sprintf("Kernel(%d)", int(k))
}

// Weight returns k(x).
func (k Kernel) Weight(x float64) float64 {
	x = math.Abs(x)
	switch k {
	case Bartlett:
		if x >= 1 {
			return 0
		}
		return 1 - x
	case QuadraticSpectral:
		z := 6 * math.Pi * x / 5
		if z < 0.2 {
			// 3/z²·(sin z/z − cos z) by its Taylor series, avoiding the
			// cancellation of the closed form near zero.
			z2 := z * z
			return 1 + z2*(-1.0/10+z2*(1.0/280+z2*(-1.0/15120+z2/1330560)))
		}
		return 25 / (12 * math.Pi * math.Pi * x * x) * (math.Sin(z)/z - math.Cos(z))
	}
	return math.NaN()
}

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
// real-valued and not rounded.
func AndrewsBandwidth(w *mat.Dense, k Kernel) (float64, error) {
	t, m := w.Dims()
	if t < 3 {
		return 0, fmt.Errorf("bandwidth: %d observations, need at least 3", t)
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
	switch k {
	case Bartlett:
		return 1.1447 * math.Cbrt(num1/den*float64(t)), nil
	case QuadraticSpectral:
		return 1.3221 * math.Pow(num2/den*float64(t), 0.2), nil
	}
	return 0, fmt.Errorf("bandwidth: unknown kernel %v", k)
}

// LongRunCov returns the kernel estimates of the long-run covariance and
// of the one-sided long-run covariance of the rows w_t of w (T×m):
//
//	Γ̂(j) = T⁻¹ Σ_{t=j+1..T} w_t w_{t−j}',
//	Ω̂ = Γ̂(0) + Σ_{j=1..T−1} k(j/b) (Γ̂(j) + Γ̂(j)'),
//	Δ̂ = Σ_{j=0..T−1} k(j/b) Γ̂(j)',
//
// so that Ω̂ = Δ̂ + Δ̂' − Γ̂(0) and Δ̂ estimates Σ_{j≥0} E(w_0 w_j')
// (Phillips and Hansen 1990). The bandwidth b must be positive.
func LongRunCov(w *mat.Dense, k Kernel, b float64) (omega *mat.SymDense, delta *mat.Dense, err error) {
	t, m := w.Dims()
	if !(b > 0) || math.IsInf(b, 0) {
		return nil, nil, fmt.Errorf("long-run covariance: bandwidth must be positive, got %g", b)
	}
	if k != Bartlett && k != QuadraticSpectral {
		return nil, nil, fmt.Errorf("long-run covariance: unknown kernel %v", k)
	}
	delta = mat.NewDense(m, m, nil)
	for j := 0; j < t; j++ {
		kw := k.Weight(float64(j) / b)
		if kw == 0 {
			if k == Bartlett {
				break
			}
			continue
		}
		for a := 0; a < m; a++ {
			for c := 0; c < m; c++ {
				// Γ̂(j)'[a,c] = Γ̂(j)[c,a] = T⁻¹ Σ_t w_{t,c} w_{t−j,a}
				var g float64
				for i := j; i < t; i++ {
					g += w.At(i, c) * w.At(i-j, a)
				}
				delta.Set(a, c, delta.At(a, c)+kw*g/float64(t))
			}
		}
	}
	omega = mat.NewSymDense(m, nil)
	for a := 0; a < m; a++ {
		for c := a; c < m; c++ {
			var g0 float64
			for i := 0; i < t; i++ {
				g0 += w.At(i, a) * w.At(i, c)
			}
			omega.SetSym(a, c, delta.At(a, c)+delta.At(c, a)-g0/float64(t))
		}
	}
	return omega, delta, nil
}
