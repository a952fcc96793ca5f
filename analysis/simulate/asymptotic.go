package simulate

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"slices"

	"github.com/galley-econ/galley/analysis/johansen"
)

// AsymptoticSpec describes a simulation of the asymptotic distributions of
// Johansen's trace and maximum-eigenvalue statistics for K − r =
// 1..MaxDim in all five cases, as used to build critical-value tables.
//
// Each replication draws MaxDim independent Gaussian random walks of
// length T and, for every case and every dim, computes the statistics for
// H(0) of the VECM without lagged differences on the first dim walks. The
// dimensions and cases of one replication thus share their walks: each
// table entry is an ordinary Monte Carlo estimate, but entries are not
// independent of one another.
//
// With Extrapolate, the statistics are also computed on the walk observed
// at every second point (length ⌊T/2⌋, the same Brownian path at half the
// resolution), and each quantile is extrapolated to T = ∞ as
// 2·q(T) − q(T/2), removing the O(1/T) term of the finite-sample bias
// (Richardson extrapolation; the bias of such statistics expands in powers
// of 1/T, as in the response surfaces of MacKinnon 2010).
type AsymptoticSpec struct {
	T           int
	MaxDim      int // 1..MaxVars
	Reps        int
	Seed        uint64
	Workers     int
	Extrapolate bool
}

// TableLevels are the significance levels of the asymptotic tables, in
// the order of johansen.Levels (upper-tail quantiles 0.90, 0.95, 0.99).
var TableLevels = [3]float64{0.10, 0.05, 0.01}

// TableEntry is one row of a simulated table.
type TableEntry struct {
	Values [3]float64 // critical values at TableLevels
	MCSE   [3]float64 // their Monte Carlo standard errors
	// Finite holds the quantiles at T itself, before extrapolation (equal
	// to Values without Extrapolate); Finite − Values estimates the
	// finite-sample bias at T.
	Finite [3]float64
}

// AsymptoticTables holds, for case c, statistic s (johansen.TraceStat or
// MaxEigStat) and dim = K−r, Entries[c][s][dim−1].
type AsymptoticTables struct {
	Spec    AsymptoticSpec
	Entries [5][2][]TableEntry
}

// MCSE method of the tables: batch means over this many batches of
// consecutive replications (each batch's quantile, extrapolated if asked;
// se = sd of the batch estimates / √batches). It does not need a density
// estimate and covers the correlation of q(T) and q(T/2).
const tableBatches = 20

// asymWorker is one worker's buffers for the table simulation.
type asymWorker struct {
	spec  AsymptoticSpec
	full  *johKernel
	half  *johKernel
	hy    [][]float64
	width int // statistics per replication
}

func newAsymWorker(s AsymptoticSpec) *asymWorker {
	w := &asymWorker{spec: s, full: newJohKernel(s.MaxDim, 0, s.T, nil)}
	w.width = 5 * 2 * s.MaxDim
	if s.Extrapolate {
		w.half = newJohKernel(s.MaxDim, 0, s.T/2, nil)
		w.hy = columns(s.MaxDim, s.T/2)
		w.width *= 2
	}
	return w
}

// column is the position in a replication's output of case c, stat st,
// dimension dim, at full (half = false) or half resolution.
func (w *asymWorker) column(c johansen.Case, st johansen.Stat, dim int, half bool) int {
	i := (int(c)*2+int(st))*w.spec.MaxDim + dim - 1
	if half {
		i += 5 * 2 * w.spec.MaxDim
	}
	return i
}

// rep draws one replication into out (length width); ok is false for a
// singular moment matrix.
func (w *asymWorker) rep(r *rand.Rand, out []float64) bool {
	w.full.draw(r)
	if !w.fill(w.full, w.full.y, w.spec.T, out, false) {
		return false
	}
	if w.half == nil {
		return true
	}
	for j, y := range w.full.y {
		h := w.hy[j]
		for i := range h {
			h[i] = y[2*i+1]
		}
	}
	return w.fill(w.half, w.hy, w.spec.T/2, out, true)
}

func (w *asymWorker) fill(k *johKernel, y [][]float64, rows int, out []float64, half bool) bool {
	nobs := k.moments(y, rows)
	for c := johansen.N; c <= johansen.CT; c++ {
		for dim := 1; dim <= w.spec.MaxDim; dim++ {
			tr, mx, ok := k.stats(c, dim, nobs)
			if !ok {
				return false
			}
			out[w.column(c, johansen.TraceStat, dim, half)] = tr
			out[w.column(c, johansen.MaxEigStat, dim, half)] = mx
		}
	}
	return true
}

// Asymptotic runs the table simulation of s. progress is as for Run.
func Asymptotic(ctx context.Context, s AsymptoticSpec, progress func(done, total int)) (*AsymptoticTables, error) {
	if s.MaxDim < 1 || s.MaxDim > MaxVars {
		return nil, fmt.Errorf("simulate: table dimensions 1..%d requested; need 1..%d", s.MaxDim, MaxVars)
	}
	if min := 4 * s.MaxDim; s.T < min {
		return nil, fmt.Errorf("simulate: T = %d is too short for tables up to dimension %d (need at least %d)", s.T, s.MaxDim, min)
	}
	if s.T > MaxT {
		return nil, fmt.Errorf("simulate: series length %d exceeds %d", s.T, MaxT)
	}
	if s.Reps < tableBatches*MinReps || s.Reps > MaxReps {
		return nil, fmt.Errorf("simulate: %d replications; tables need %d..%d", s.Reps, tableBatches*MinReps, MaxReps)
	}
	if s.Workers < 0 {
		return nil, fmt.Errorf("simulate: %d workers is negative (0 uses every core)", s.Workers)
	}
	workers := s.Workers
	if workers == 0 {
		workers = runtime.NumCPU()
	}
	width := newAsymWorker(AsymptoticSpec{T: 4, MaxDim: s.MaxDim, Extrapolate: s.Extrapolate}).width
	// cols[i][rep]: statistic i of replication rep, kept in float32 (a
	// relative rounding of 6e-8, far below the Monte Carlo error) to halve
	// the memory of large runs.
	buf32 := make([]float32, width*s.Reps)
	cols := make([][]float32, width)
	for j := range cols {
		cols[j] = buf32[j*s.Reps : (j+1)*s.Reps : (j+1)*s.Reps]
	}
	var bad error
	err := runBlocks(ctx, s.Reps, workers, s.Seed, func() blockFunc {
		w := newAsymWorker(s)
		buf := make([]float64, w.width)
		return func(r *rand.Rand, lo, hi int) {
			for i := lo; i < hi; i++ {
				if !w.rep(r, buf) {
					for j := range buf {
						buf[j] = math.NaN()
					}
				}
				for j, v := range buf {
					cols[j][i] = float32(v)
				}
			}
		}
	}, progress)
	if err != nil {
		return nil, err
	}
	out := &AsymptoticTables{Spec: s}
	ref := newAsymWorker(AsymptoticSpec{T: 4, MaxDim: s.MaxDim, Extrapolate: s.Extrapolate})
	for c := johansen.N; c <= johansen.CT; c++ {
		for st := johansen.TraceStat; st <= johansen.MaxEigStat; st++ {
			out.Entries[c][st] = make([]TableEntry, s.MaxDim)
			for dim := 1; dim <= s.MaxDim; dim++ {
				full := cols[ref.column(c, st, dim, false)]
				var half []float32
				if s.Extrapolate {
					half = cols[ref.column(c, st, dim, true)]
				}
				e, err := tableEntry(full, half)
				if err != nil {
					bad = fmt.Errorf("simulate: case %s dim %d: %w", c, dim, err)
				}
				out.Entries[c][st][dim-1] = e
			}
		}
	}
	if bad != nil {
		return nil, bad
	}
	return out, nil
}

// tableEntry returns the upper-tail quantiles of full (extrapolated with
// half when given) and their batch-means standard errors.
func tableEntry(full, half []float32) (TableEntry, error) {
	var e TableEntry
	for _, v := range full {
		if math.IsNaN(float64(v)) || math.IsInf(float64(v), 0) {
			return e, errors.New("a replication had a singular moment matrix")
		}
	}
	sorted := func(x []float32) []float64 {
		out := make([]float64, len(x))
		for i, v := range x {
			out[i] = float64(v)
		}
		slices.Sort(out)
		return out
	}
	est := func(f, h []float32, out *[3]float64) {
		fs := sorted(f)
		var hs []float64
		if h != nil {
			hs = sorted(h)
		}
		for i, l := range TableLevels {
			q := quantile(fs, 1-l)
			if hs != nil {
				q = 2*q - quantile(hs, 1-l)
			}
			out[i] = q
		}
	}
	est(full, half, &e.Values)
	est(full, nil, &e.Finite)
	n := len(full)
	m := n / tableBatches
	var sum, sum2 [3]float64
	for b := 0; b < tableBatches; b++ {
		var h []float32
		if half != nil {
			h = half[b*m : (b+1)*m]
		}
		var v [3]float64
		est(full[b*m:(b+1)*m], h, &v)
		for i := range v {
			sum[i] += v[i]
			sum2[i] += v[i] * v[i]
		}
	}
	nb := float64(tableBatches)
	for i := range e.MCSE {
		mean := sum[i] / nb
		v := (sum2[i] - nb*mean*mean) / (nb - 1)
		// The batch estimates have variance ≈ tableBatches times that of
		// the full-sample estimate.
		e.MCSE[i] = math.Sqrt(math.Max(v, 0) / nb)
	}
	return e, nil
}
