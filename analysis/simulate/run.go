package simulate

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"sync"
	"sync/atomic"
)

// Levels are the significance levels of Result.Values, in order.
var Levels = []float64{0.01, 0.025, 0.05, 0.10}

// Result holds the simulated null distribution of a statistic.
type Result struct {
	Spec Spec
	Key  string
	// Lower is true for the τ statistics (reject below the critical
	// value) and false for the Johansen statistics (reject above).
	Lower bool
	// NObs is the number of observations in the test regression: T−1−p
	// for adf and eg (the T of MacKinnon's response surfaces), T−L−1 for
	// Johansen.
	NObs   int
	Levels []float64
	// Values[i] is the critical value at Levels[i]: the Levels[i]
	// quantile of the simulated statistics (Lower) or the 1−Levels[i]
	// quantile (upper tail).
	Values []float64
	// MCSE[i] is the Monte Carlo standard error of Values[i] (the
	// order-statistic formula with a Siddiqui–Hall–Sheather density
	// estimate; see the package comment).
	MCSE []float64
	Reps int
	Seed uint64
	// Sample holds the Reps simulated statistics in ascending order.
	Sample []float64
}

// PValue is the simulated p-value of stat: the share of replications at
// or beyond it in the rejection direction.
func (r *Result) PValue(stat float64) float64 {
	n := len(r.Sample)
	i, _ := slices.BinarySearch(r.Sample, stat) // first ≥ stat
	if r.Lower {
		j := i
		for j < n && r.Sample[j] == stat {
			j++
		}
		return float64(j) / float64(n)
	}
	return float64(n-i) / float64(n)
}

// statFunc draws one replication with r.
type statFunc func(r *rand.Rand) float64

// newStat returns a fresh per-worker statistic for the plan.
func (s Spec) newStat(p plan) statFunc {
	switch p.test {
	case ADF:
		k := newADFKernel(s.T, s.Lags, p.tauCase.Deterministics())
		return k.adf
	case EG:
		k := newEGKernel(s.T, s.Lags, p.tauCase.Deterministics(), s.N)
		return k.eg
	case GHADF, GHZt, GHZa:
		return newGHKernel(s, p).stat
	}
	if isARDL(p.test) {
		return newARDLKernel(p.test, p.ardlCase, s.N, s.T, s.Lags).stat
	}
	k := newJohKernel(s.N, s.Lags, s.T, s.Design)
	maxeig := p.test == JohansenMaxEig
	return func(r *rand.Rand) float64 {
		k.draw(r)
		nobs := k.moments(k.y, s.T)
		tr, mx, ok := k.stats(p.johCase, s.N, nobs)
		if !ok {
			return math.NaN()
		}
		if maxeig {
			return mx
		}
		return tr
	}
}

// Run simulates s.Reps replications of the statistic of s under the null
// with s.Workers goroutines (0: every core) and returns its critical
// values. progress, if not nil, is called from one goroutine at a time
// with the replications done so far (non-decreasing, ending at total).
// Cancelling ctx stops the workers after their current block and returns
// ctx's error.
func Run(ctx context.Context, s Spec, progress func(done, total int)) (*Result, error) {
	p, err := s.check()
	if err != nil {
		return nil, err
	}
	stats := make([]float64, s.Reps)
	err = runBlocks(ctx, s.Reps, p.workers, s.Seed, func() blockFunc {
		f := s.newStat(p)
		return func(r *rand.Rand, lo, hi int) {
			for i := lo; i < hi; i++ {
				stats[i] = f(r)
			}
		}
	}, progress)
	if err != nil {
		return nil, err
	}
	for i, v := range stats {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("simulate: replication %d gave a non-finite statistic (singular regression)", i)
		}
	}
	slices.Sort(stats)
	res := &Result{
		Spec: s, Key: s.Key(), Lower: p.test != JohansenTrace && p.test != JohansenMaxEig && p.test != ARDLF0 && p.test != ARDLF1, NObs: p.nobs,
		Levels: append([]float64(nil), Levels...), Reps: s.Reps, Seed: s.Seed, Sample: stats,
	}
	for _, l := range Levels {
		q := l
		if !res.Lower {
			q = 1 - l
		}
		res.Values = append(res.Values, quantile(stats, q))
		res.MCSE = append(res.MCSE, quantileSE(stats, q))
	}
	return res, nil
}

// blockFunc computes replications lo..hi−1, drawing from r, and stores
// them by replication index.
type blockFunc func(r *rand.Rand, lo, hi int)

// runBlocks runs reps replications in blocks of BlockSize over workers
// goroutines, each with its own blockFunc from newWorker, block b drawing
// from the stream streamSeed(seed, b).
func runBlocks(ctx context.Context, reps, workers int, seed uint64, newWorker func() blockFunc, progress func(done, total int)) error {
	nb := (reps + BlockSize - 1) / BlockSize
	workers = min(workers, nb)
	var next atomic.Int64
	var done atomic.Int64
	var mu sync.Mutex
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			f := newWorker()
			pcg := rand.NewPCG(0, 0)
			r := rand.New(pcg)
			for ctx.Err() == nil {
				b := int(next.Add(1) - 1)
				if b >= nb {
					return
				}
				lo := b * BlockSize
				hi := min(lo+BlockSize, reps)
				f(blockRand(pcg, r, seed, b), lo, hi)
				done.Add(int64(hi - lo))
				if progress != nil {
					mu.Lock()
					// Report the latest total under the lock, so calls are
					// serial and non-decreasing.
					progress(int(done.Load()), reps)
					mu.Unlock()
				}
			}
		}()
	}
	wg.Wait()
	if err := ctx.Err(); err != nil {
		return fmt.Errorf("simulate: stopped after %d of %d replications: %w", done.Load(), reps, err)
	}
	return nil
}
