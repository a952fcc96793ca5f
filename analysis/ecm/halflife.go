package ecm

import "math"

// Adjustment summarises the speed of adjustment α of an error-correction
// model and the implied half-life of a deviation from equilibrium.
type Adjustment struct {
	Alpha, SE float64
	// HasHalfLife is false when α ≥ 0 or α ≤ −2: deviations then do not
	// die out and there is no half-life (HalfLife and HalfLifeSE are NaN).
	HasHalfLife bool
	HalfLife    float64 // in periods of the data
	HalfLifeSE  float64 // delta-method standard error
}

// NewAdjustment computes the half-life of a deviation from equilibrium,
// the number of periods after which half of it remains,
//
//	h = ln(0.5) / ln|1 + α|,
//
// and its delta-method standard error |dh/dα|·se(α) with
//
//	dh/dα = −ln(0.5) / ((1 + α) · ln²|1 + α|).
//
// For −1 < α < 0 the deviation decays monotonically; for −2 < α < −1 it
// overshoots and h is the half-life of its amplitude. At α = −1 the
// adjustment is complete in one period: h = 0 and the standard error is
// +Inf, the limit of the formula. Outside −2 < α < 0 there is no
// half-life.
func NewAdjustment(alpha, se float64) Adjustment {
	a := Adjustment{Alpha: alpha, SE: se, HalfLife: math.NaN(), HalfLifeSE: math.NaN()}
	if !(alpha < 0 && alpha > -2) {
		return a
	}
	a.HasHalfLife = true
	b := 1 + alpha
	if b == 0 {
		a.HalfLife, a.HalfLifeSE = 0, math.Inf(1)
		return a
	}
	l := math.Log(math.Abs(b))
	a.HalfLife = math.Log(0.5) / l
	a.HalfLifeSE = math.Abs(-math.Log(0.5)/(b*l*l)) * se
	return a
}
