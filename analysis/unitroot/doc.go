// Package unitroot implements unit-root and stationarity tests: the
// augmented Dickey–Fuller regression and test, Phillips–Perron, KPSS,
// the DF-GLS test of Elliott, Rothenberg and Stock, the M tests of Ng and
// Perron on GLS-detrended data (with their MAIC lag selector), and the
// Zivot–Andrews test with one endogenous break.
//
// Every function is pure: it takes the series and explicit options and
// returns a result struct or an error value; critical values and
// p-values come from package critical, whose tables name their sources.
package unitroot
