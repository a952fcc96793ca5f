// Package dataio reads data files other than CSV: Office Open XML
// workbooks (.xlsx), with its own reader of the parts a data table
// needs (ooxml.go, on archive/zip and encoding/xml). It extracts the
// cells and leaves every rule about columns, dates and values to
// analysis/series, so a workbook is read exactly as the same table saved
// as CSV would be.
package dataio
