//go:build !unix

package engine

import "os"

// mapFile reads the file at path (mapping is used on Unix only).
func mapFile(path string) ([]byte, error) { return os.ReadFile(path) }
