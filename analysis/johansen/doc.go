// Package johansen implements Johansen's reduced-rank analysis of a vector
// error-correction model (VECM)
//
//	Δy_t = α β' ỹ_{t−1} + Σ_{i=1}^{k} Γ_i Δy_{t−i} + Φ d_t + ε_t,  ε_t ~ N(0, Ω),
//
// where ỹ_{t−1} is y_{t−1} augmented with the restricted deterministic term
// (if any) and d_t holds the unrestricted deterministic terms. It provides
// the trace and maximum-eigenvalue rank tests with critical values, the
// Reinsel–Ahn small-sample factor, sequential rank choice, lag-order
// criteria, the estimated α, β, Π = αβ' and short-run coefficients with
// standard errors, likelihood-ratio tests of linear restrictions on β
// and α, wild bootstrap p-values of the trace tests, the trace statistic
// with a bootstrap Bartlett correction (bartlett.go) and the companion
// roots of a VAR.
//
// References:
//
//	Bartlett, M. S. (1937). Properties of sufficiency and statistical
//	  tests. Proceedings of the Royal Society of London A 160, 268–282.
//	Cavaliere, G., Rahbek, A. and Taylor, A. M. R. (2012). Bootstrap
//	  determination of the co-integration rank in vector autoregressive
//	  models. Econometrica 80, 1721–1740.
//	Cavaliere, G., Rahbek, A. and Taylor, A. M. R. (2014). Bootstrap
//	  determination of the co-integration rank in heteroskedastic VAR
//	  models. Econometric Reviews 33, 606–650.
//	Doornik, J. A. (1998). Approximations to the asymptotic distributions
//	  of cointegration tests. Journal of Economic Surveys 12(5), 573–593.
//	Johansen, S. (1988). Statistical analysis of cointegration vectors.
//	  Journal of Economic Dynamics and Control 12, 231–254.
//	Johansen, S. (1991). Estimation and hypothesis testing of cointegration
//	  vectors in Gaussian vector autoregressive models. Econometrica 59,
//	  1551–1580.
//	Johansen, S. (1995). Likelihood-Based Inference in Cointegrated Vector
//	  Autoregressive Models. Oxford University Press.
//	Lütkepohl, H. (2005). New Introduction to Multiple Time Series
//	  Analysis. Springer.
//	Osterwald-Lenum, M. (1992). A note with quantiles of the asymptotic
//	  distribution of the maximum likelihood cointegration rank test
//	  statistics. Oxford Bulletin of Economics and Statistics 54, 461–472.
//	Reinsel, G. C. and Ahn, S. K. (1992). Vector autoregressive models with
//	  unit roots and reduced rank structure: estimation, likelihood ratio
//	  test, and forecasting. Journal of Time Series Analysis 13, 353–375.
//	Rocke, D. M. (1989). Bootstrap Bartlett adjustment in seemingly
//	  unrelated regression. Journal of the American Statistical
//	  Association 84, 598–601 (year, volume and pages from memory).
//
// The package does no I/O and no formatting.
package johansen
