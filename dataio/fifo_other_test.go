//go:build !unix

package dataio

import "testing"

// makeFIFO: no named pipes here; the FIFO checks are skipped.
func makeFIFO(t *testing.T, dir string) string { return "" }
