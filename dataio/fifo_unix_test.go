//go:build unix

package dataio

import (
	"path/filepath"
	"syscall"
	"testing"
)

func makeFIFO(t *testing.T, dir string) string {
	p := filepath.Join(dir, "pipe.csv")
	if err := syscall.Mkfifo(p, 0o644); err != nil {
		t.Fatalf("mkfifo: %v", err)
	}
	return p
}
