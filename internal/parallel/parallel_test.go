package parallel

import (
	"runtime"
	"sync/atomic"
	"testing"
)

// TestFor: every index is visited exactly once; a false stops the
// handing out of indices and is reported; no work, no call.
func TestFor(t *testing.T) {
	for _, workers := range []int{0, 1, 2, 8} {
		seen := make([]int32, 1000)
		if !For(len(seen), workers, func(i int) bool { atomic.AddInt32(&seen[i], 1); return true }) {
			t.Fatalf("workers %d: reported a failure", workers)
		}
		for i, n := range seen {
			if n != 1 {
				t.Fatalf("workers %d: index %d visited %d times", workers, i, n)
			}
		}
		var calls atomic.Int32
		if For(1000, workers, func(i int) bool { calls.Add(1); return i != 10 }) {
			t.Errorf("workers %d: a false went unreported", workers)
		}
		// after index 10, each goroutine finishes at most the call it is in
		if c := calls.Load(); int(c) > 11+runtime.GOMAXPROCS(0) {
			t.Errorf("workers %d: %d calls after a false at index 10", workers, c)
		}
	}
	if !For(0, 2, func(int) bool { t.Error("called with no work"); return true }) {
		t.Error("no work reported as a failure")
	}
}
