//go:build !unix

package main

import "os"

// peakRSS: not measured here (no getrusage); reported as 0.
func peakRSS(*os.ProcessState) int64 { return 0 }
