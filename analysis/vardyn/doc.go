// Package vardyn holds the dynamics of a vector autoregression (VAR) and of
// a cointegrated VAR written as one: least-squares VARs in levels or
// differences, moving-average (impulse-response) coefficients,
// orthogonalised and generalised impulse responses, forecast-error variance
// decompositions, Granger-causality Wald tests in a VAR and in a VECM, the
// Toda–Yamamoto lag-augmented test, and confidence bands for impulse
// responses: residual-bootstrap bands, and asymptotic (delta-method)
// standard errors and normal bands for a least-squares VAR and for a VECM
// in its VAR form (Lütkepohl 2005, §3.7.1).
//
// (The package is not called var, a Go keyword.)
//
// References:
//
//	Lütkepohl, H. (2005). New Introduction to Multiple Time Series
//	  Analysis. Springer.
//	Pesaran, M. H. and Shin, Y. (1998). Generalized impulse response
//	  analysis in linear multivariate models. Economics Letters 58, 17–29.
//	Toda, H. Y. and Yamamoto, T. (1995). Statistical inference in vector
//	  autoregressions with possibly integrated processes. Journal of
//	  Econometrics 66, 225–250.
//	Granger, C. W. J. (1969). Investigating causal relations by econometric
//	  models and cross-spectral methods. Econometrica 37, 424–438.
//	Hall, P. (1992). The Bootstrap and Edgeworth Expansion. Springer.
//
// The package does no I/O and no formatting.
package vardyn
