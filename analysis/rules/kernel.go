package rules

import (
	"fmt"
	"math"
)

// Kernel is a lag window for long-run covariance estimation.
type Kernel int

const (
	// Bartlett is k(x) = 1 − |x| for |x| ≤ 1, else 0 (Newey and West 1987).
	// With bandwidth b = L+1 it gives the weights 1 − j/(L+1) of a
	// Bartlett estimate with truncation lag L.
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

// Weight returns k(x) (see the constants for the formulas), NaN for an
// unknown kernel.
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
