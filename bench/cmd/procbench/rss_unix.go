//go:build unix

package main

import (
	"os"
	"runtime"
	"syscall"
)

// peakRSS is a finished child's maximum resident set in bytes
// (getrusage: kilobytes on Linux, bytes on macOS).
func peakRSS(ps *os.ProcessState) int64 {
	ru, ok := ps.SysUsage().(*syscall.Rusage)
	if !ok {
		return 0
	}
	if runtime.GOOS == "darwin" {
		return int64(ru.Maxrss)
	}
	return int64(ru.Maxrss) * 1024
}
