// Package ardl estimates autoregressive distributed-lag models and their
// conditional error-correction form, and carries out the bounds tests of
// a level relationship of Pesaran, Shin and Smith (2001), with the
// asymmetric (nonlinear) extension of Shin, Yu and Greenwood-Nimmo (2014).
//
// The ARDL(p, q₁, …, q_k) model in levels is
//
//	y_t = d_t'μ + Σ_{i=1..p} φ_i y_{t−i} + Σ_j Σ_{l=0..q_j} β_{jl} x_{j,t−l} + w_t'δ + ε_t,
//
// and its conditional (unrestricted) error-correction form, PSS (2001)
// eq. (6), is
//
//	Δy_t = d_t'μ + π_y y_{t−1} + Σ_j π_j x_{j,t−1}
//	       + Σ_{i=1..p−1} γ_i Δy_{t−i} + Σ_j Σ_{l=0..q*_j−1} δ_{jl} Δx_{j,t−l} + w_t'δ + ε_t,
//
// with q*_j = max(q_j, 1): the conditional model always holds Δx_{j,t}
// (PSS condition on it), so a regressor with q_j = 0 enters the
// error-correction form as it would with q_j = 1. For q_j ≥ 1 the two
// forms are the same regression (π_y = Σφ_i − 1, π_j = Σ_l β_{jl}).
// d_t are the deterministic terms of one of PSS's five cases (Case).
//
// The bounds F test is the Wald test, in its F form, of π_y = π_1 = … =
// π_k = 0 (and of the restricted intercept or trend in cases II and IV);
// the bounds t test is the t-ratio of π_y (cases I, III and V). Under
// the null of no level relationship their distributions depend on
// whether the x_j are I(0) or I(1); PSS tabulate both bounds, and the
// test is inconclusive between them.
//
// The long-run coefficients are θ_j = −π_j/π_y (and −μ/π_y for a
// restricted deterministic term), with delta-method standard errors. The
// restricted error-correction model replaces the levels by the
// error-correction term ect_{t−1} = y_{t−1} − θ'x_{t−1} (− the restricted
// term) with coefficient α, which equals π_y.
//
// References:
//
//	Narayan, P. K. (2005). The saving and investment nexus for China:
//	  evidence from cointegration tests. Applied Economics 37, 1979–1990.
//	Pesaran, M. H., Shin, Y. and Smith, R. J. (2001). Bounds testing
//	  approaches to the analysis of level relationships. Journal of
//	  Applied Econometrics 16, 289–326.
//	Shin, Y., Yu, B. and Greenwood-Nimmo, M. (2014). Modelling asymmetric
//	  cointegration and dynamic multipliers in a nonlinear ARDL framework.
//	  In Sickles, R. C. and Horrace, W. C. (eds.), Festschrift in Honor of
//	  Peter Schmidt, 281–314. Springer.
//
// The package does no I/O.
package ardl
