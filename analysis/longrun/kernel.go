package longrun

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/rules"
)

// Kernel is a lag window for long-run covariance estimation; it is
// rules.Kernel, whose Weight method gives k(x).
type Kernel = rules.Kernel

const (
	// Bartlett is k(x) = 1 − |x| for |x| ≤ 1, else 0 (Newey and West 1987).
	// With bandwidth b = L+1 it gives the weights 1 − j/(L+1) of ols.HAC.
	Bartlett = rules.Bartlett
	// QuadraticSpectral is k(x) = 25/(12π²x²) · (sin(6πx/5)/(6πx/5) −
	// cos(6πx/5)), k(0) = 1 (Andrews 1991); it gives weight to every lag.
	QuadraticSpectral = rules.QuadraticSpectral
)

// AndrewsBandwidth is the automatic bandwidth of Andrews (1991, Section 6)
// with AR(1) approximating models for every column of w (T×m), all given
// unit weight: b = 1.1447 (α̂(1) T)^{1/3} for the Bartlett kernel, b =
// 1.3221 (α̂(2) T)^{1/5} for the quadratic-spectral kernel, real-valued.
// It is rules.AndrewsBandwidth, whose doc comment gives α̂(1) and α̂(2).
func AndrewsBandwidth(w *mat.Dense, k Kernel) (float64, error) {
	return rules.AndrewsBandwidth(w, k)
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
