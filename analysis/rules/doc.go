// Package rules holds galley's one implementation of the small rules that
// the estimators share: the power rule ⌊c·(T/100)^p⌋ for lag maxima and
// truncation lags, the information criteria AIC, BIC and HQ, the kernels
// of long-run covariance estimation and their automatic bandwidths
// (Andrews 1991; Newey and West 1994; Hobijn, Franses and Ooms 1998).
//
// Every function is pure and takes explicit arguments. Other analysis
// packages call these instead of writing the formulas out again.
package rules
