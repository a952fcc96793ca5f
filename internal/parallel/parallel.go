// Package parallel runs a loop's iterations on a few goroutines: the one
// pool galley uses where a build's independent pieces of work (files to
// stage or check, directives to decode) are shared between the cores.
package parallel

import (
	"runtime"
	"sync"
	"sync/atomic"
)

// For calls f(i) for i = 0 … n−1 on min(workers, GOMAXPROCS, n)
// goroutines (workers ≤ 0: GOMAXPROCS), handing the indices out in
// order. Once a call returns false no further index is handed out; For
// reports whether every call made returned true. The calls may run at
// the same time, so f must touch only what belongs to its index, or
// guard what it shares.
func For(n, workers int, f func(i int) bool) bool {
	if workers <= 0 || workers > runtime.GOMAXPROCS(0) {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = min(workers, n)
	var (
		next   atomic.Int64
		failed atomic.Bool
		wg     sync.WaitGroup
	)
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := int(next.Add(1) - 1); i < n && !failed.Load(); i = int(next.Add(1) - 1) {
				if !f(i) {
					failed.Store(true)
				}
			}
		}()
	}
	wg.Wait()
	return !failed.Load()
}
