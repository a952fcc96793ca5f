// Package dataio reads data files whose format needs a library outside
// the standard one. It extracts the cells and leaves every rule about
// columns, dates and values to analysis/series, so a workbook is read
// exactly as the same table saved as CSV would be.
package dataio
