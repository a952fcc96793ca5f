// Package sysdiag computes residual diagnostics of a system of K
// equations fitted by least squares on common regressors (a VAR, or a
// VECM given its cointegrating relations): the multivariate
// Breusch–Godfrey LM test of residual autocorrelation with the
// Edgerton–Shukur F form, the system Jarque–Bera test of normality on
// Cholesky-standardised residuals, the Doornik–Hansen omnibus test of
// normality, and the multivariate ARCH-LM test.
//
// Residuals are a T×K matrix U (rows are time); regressors a T×n matrix X
// (the regressors of every equation of the original system). Every test
// returns a Test: its statistic, degrees of freedom, and p-value from the
// asymptotic (χ²) or approximating (F) null distribution.
//
// References:
//
//	Doornik, J. A. and Hansen, H. (2008). An omnibus test for univariate
//	  and multivariate normality. Oxford Bulletin of Economics and
//	  Statistics 70, 927–939 (working paper 1994).
//	D'Agostino, R. B. (1970). Transformation to normality of the null
//	  distribution of g1. Biometrika 57, 679–681.
//	Edgerton, D. and Shukur, G. (1999). Testing autocorrelation in a
//	  system perspective. Econometric Reviews 18, 343–386.
//	Johansen, S. (1995). Likelihood-Based Inference in Cointegrated Vector
//	  Autoregressive Models. Oxford University Press.
//	Lütkepohl, H. (2005). New Introduction to Multiple Time Series
//	  Analysis. Springer. §4.4.4 (LM test for residual autocorrelation and
//	  its F form), §4.5 (tests for nonnormality), §8.4 (the same tests for
//	  a VECM), ch. 16 (multivariate ARCH-LM test).
//	Rao, C. R. (1951). An asymptotic expansion of the distribution of
//	  Wilks' criterion. Bulletin of the International Statistical Institute
//	  33, 177–180.
//
// The reference list and the equation numbers are written from memory;
// each formula is checked against statsmodels 0.13.5 and independent numpy
// code (testdata/scripts/sysdiag_reference.py).
package sysdiag
