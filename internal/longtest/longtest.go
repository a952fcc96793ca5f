// Package longtest guards the test suite's long checks — Monte Carlo
// reproductions of published critical-value tables, million-row files —
// so that `go test ./...` stays fast on a developer's machine: they run
// only when the environment sets GALLEY_LONG_TESTS=1 (CI does, see
// .ci/run) and never under -short.
package longtest

import (
	"os"
	"testing"
)

// Enabled reports whether long checks run in this test binary.
func Enabled() bool {
	return !testing.Short() && os.Getenv("GALLEY_LONG_TESTS") == "1"
}

// Skip skips t unless long checks are enabled; what names the check.
func Skip(t testing.TB, what string) {
	t.Helper()
	if !Enabled() {
		t.Skipf("%s: a long check, run with GALLEY_LONG_TESTS=1", what)
	}
}
