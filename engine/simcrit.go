package engine

// crit: simulate — Monte Carlo critical values at the directive's own
// sample size, number of variables, deterministic case and lags.
//
// The adf, engle-granger, johansen, vecm and ardl directives accept
//
//	crit: simulate        # or table (the default: published response surfaces/tables)
//	replications: 20000   # simulate.MinReps..simulate.MaxReps
//	seed: 1               # generator seed, 0..2^63−1
//
// The simulation is analysis/simulate.Run on every core; the engine only
// resolves the keys (sim_keys.go), keeps simulated tables on disk beside
// the result cache (sim_store.go, keyed by simulate.Spec.Key, so a rebuild
// or another directive with the same experiment reads them back), reports
// progress for long runs (progress.go), and formats notes and values
// (sim_notes.go). This file runs one experiment: SimCrit.

import (
	"context"
	"fmt"
	"io"
	"os"
	"strings"
	"sync/atomic"

	"github.com/galley-econ/galley/analysis/simulate"
)

// simRuns counts the simulations actually run (not read from the store),
// for tests.
var simRuns atomic.Int64

// SimRuns is the number of simulations run (not read from the store) by
// this process, for tests.
func SimRuns() int64 { return simRuns.Load() }

// SimProgressOut is where progress goes when Options.Progress is not set.
var SimProgressOut io.Writer = os.Stderr

// SimCrit returns the simulated null distribution for sp: from the store
// beside the result cache when a valid entry exists, else by running the
// simulation (and storing it). key names the manuscript key an error is
// reported at.
func SimCrit(c *Context, key string, sp simulate.Spec) (*simulate.Result, error) {
	if err := sp.Validate(); err != nil {
		return nil, c.Errorf(key, "crit: simulate: %v", strings.TrimPrefix(err.Error(), "simulate: "))
	}
	st := simStoreFor(c.doc)
	if r, ok := st.load(sp); ok {
		return r, nil
	}
	label := fmt.Sprintf("galley: %s %s (line %d): simulating %s critical values, N=%d, T=%d, %s replications",
		c.b.kind.Name, c.b.id, c.b.line, sp.Test, sp.N, sp.T, Group(sp.Reps))
	short := fmt.Sprintf("galley: %s: %s N=%d T=%d", c.b.id, sp.Test, sp.N, sp.T)
	pr := newSimProgress(label, c.doc.opts.Progress, SimProgressOut)
	pr.short = short
	simRuns.Add(1)
	r, err := simulate.Run(context.Background(), sp, pr.update)
	pr.finish(err)
	if err != nil {
		return nil, c.Errorf(key, "crit: simulate: %v", strings.TrimPrefix(err.Error(), "simulate: "))
	}
	st.save(r)
	return r, nil
}
