// Package critical holds published critical values and approximate
// p-values for unit-root and cointegration tests: MacKinnon's response
// surfaces (2010) and approximate distribution functions (1994), the
// Kwiatkowski–Phillips–Schmidt–Shin (1992) table, the Elliott–Rothenberg–
// Stock (1996) DF-GLS table, the Zivot–Andrews (1992) tables, the
// Dickey–Fuller coefficient-test table of Fuller (1976) and the Ng–Perron
// (2001) table of the M tests on GLS-detrended data.
//
// Every function is a pure lookup or evaluation of a published formula;
// the doc comment of each table names where its numbers come from.
package critical
