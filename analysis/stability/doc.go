// Package stability computes the recursive-residual diagnostics of
// parameter constancy for a linear regression y = Xβ + u: recursive
// residuals, recursive coefficient estimates with their standard errors,
// the CUSUM and CUSUM-of-squares statistics and their significance
// bands (Brown, Durbin and Evans 1975, "Techniques for testing the
// constancy of regression relationships over time", JRSS B 37, 149–192).
//
// All per-observation outputs are aligned with the rows of X: entry t
// belongs to observation t (zero-based), and entries for which the
// statistic is not defined (the first observations, used to start the
// recursion) are NaN, so they can be paired with the data's dates.
package stability
