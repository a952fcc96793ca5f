package engine

// crit: simulate — Monte Carlo critical values at the directive's own
// sample size, number of variables, deterministic case and lags.
//
// The adf, engle-granger, johansen, vecm and ardl directives accept
//
//	crit: simulate   # or table (the default: published response surfaces/tables)
//	reps: 20000      # replications, simulate.MinReps..simulate.MaxReps
//	seed: 1          # generator seed, 0..2^63−1
//
// The simulation is analysis/simulate.Run on every core; this file only
// resolves the keys, keeps simulated tables on disk beside the result cache
// (keyed by simulate.Spec.Key, so a rebuild or another directive with the
// same experiment reads them back), reports progress for long runs, and
// formats notes and values.

import (
	"bytes"
	"context"
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"sync/atomic"
	"time"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/simulate"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/internal/atomicfile"
)

// Defaults of crit: simulate.
//
// DefaultSimReps = 20,000: the Monte Carlo standard error of a quantile
// falls as 1/√R; at 20,000 replications the 5% critical value of the ADF
// τ (case c, T = 200) has an MCSE of about 0.01, below the two decimals
// a table prints, and the 1% value about 0.02, while one such run takes
// well under a second on two cores. Larger systems cost more per
// replication (Johansen with 6 series at T = 10,000 takes minutes), and
// their authors can lower reps: or accept the one-off cost, since the
// table is stored.
//
// DefaultSimSeed = 1: a fixed seed, so that a build is reproducible and
// two directives with the same experiment share one stored table.
const (
	DefaultSimReps = 20_000
	DefaultSimSeed = 1
)

// SimKeys are the crit:, reps: and seed: keys (exported only so that the
// YAML decoder sees the embedded fields).
type SimKeys struct {
	Crit string `yaml:"crit"`
	Reps *int   `yaml:"reps"`
	Seed *int64 `yaml:"seed"`
}

// SimSettings is a validated crit: simulate.
type SimSettings struct {
	Reps int
	Seed uint64
}

// simulated reports whether the keys ask for simulated critical values
// (only meaningful after settings accepted them).
func (k *SimKeys) simulated() bool { return strings.EqualFold(strings.TrimSpace(k.Crit), "simulate") }

// Settings validates the keys for a directive of kind; it returns nil
// (and no error) when the critical values come from the tables.
func (k *SimKeys) Settings(c *Context) (*SimSettings, error) {
	switch strings.ToLower(strings.TrimSpace(k.Crit)) {
	case "", "table":
		if c.Has("reps") {
			return nil, c.Errorf("reps", "reps applies only with crit: simulate")
		}
		if c.Has("seed") {
			return nil, c.Errorf("seed", "seed applies only with crit: simulate")
		}
		return nil, nil
	case "simulate":
	default:
		return nil, c.Errorf("crit", "crit: write simulate (Monte Carlo critical values at this sample size) or table (the published tables, the default), not %q", k.Crit)
	}
	if !c.b.kind.Simulate {
		var can []string
		for _, k := range Kinds() {
			if k.Simulate {
				can = append(can, k.Name)
			}
		}
		return nil, c.Errorf("crit", "crit: simulate is available for %s, not for %s", strings.Join(can, ", "), c.b.kind.Name)
	}
	s := &SimSettings{Reps: DefaultSimReps, Seed: DefaultSimSeed}
	if k.Reps != nil {
		if *k.Reps < simulate.MinReps || *k.Reps > simulate.MaxReps {
			return nil, c.Errorf("reps", "reps must be %d..%d replications, not %d", simulate.MinReps, simulate.MaxReps, *k.Reps)
		}
		s.Reps = *k.Reps
	}
	if k.Seed != nil {
		if *k.Seed < 0 {
			return nil, c.Errorf("seed", "seed must be zero or more, not %d", *k.Seed)
		}
		s.Seed = uint64(*k.Seed)
	}
	return s, nil
}

// Spec is the experiment for one statistic.
func (s *SimSettings) Spec(test, cs string, n, t, lags int) simulate.Spec {
	return simulate.Spec{Test: test, Case: cs, N: n, T: t, Lags: lags, Reps: s.Reps, Seed: s.Seed}
}

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

// ---------------------------------------------------------------- store

// SimStore keeps simulated tables in <cache>/sim/, one file per
// simulate.Spec.Key. It exists only when the document has a result cache
// (with --no-cache nothing is read or written). A table depends only on
// its key, which names the simulation algorithm's version, so the store
// is not cleared when galley itself changes, nor by Cache.Fresh.
type SimStore struct{ Dir string }

func simStoreFor(d *Document) SimStore {
	if d.opts.Cache == nil || d.opts.Cache.Dir == "" {
		return SimStore{}
	}
	return SimStore{Dir: filepath.Join(d.opts.Cache.Dir, "sim")}
}

func (s SimStore) Path(key string) string {
	h := sha256.Sum256([]byte(key))
	return filepath.Join(s.Dir, hex.EncodeToString(h[:])+".sim")
}

const simMagic = "galley-sim-table-1\n"

// encodeSim writes r as: magic, key, lower, nobs, reps, seed, levels,
// values, MCSE, the sorted sample (little-endian), then the SHA-256 of
// all that.
func encodeSim(r *simulate.Result) []byte {
	var b bytes.Buffer
	b.WriteString(simMagic)
	u32 := func(v int) { binary.Write(&b, binary.LittleEndian, uint32(v)) }
	u64 := func(v uint64) { binary.Write(&b, binary.LittleEndian, v) }
	fs := func(x []float64) {
		u32(len(x))
		binary.Write(&b, binary.LittleEndian, x)
	}
	u32(len(r.Key))
	b.WriteString(r.Key)
	lower := uint64(0)
	if r.Lower {
		lower = 1
	}
	u64(lower)
	u64(uint64(r.NObs))
	u64(uint64(r.Reps))
	u64(r.Seed)
	fs(r.Levels)
	fs(r.Values)
	fs(r.MCSE)
	fs(r.Sample)
	sum := sha256.Sum256(b.Bytes())
	b.Write(sum[:])
	return b.Bytes()
}

var errSimCorrupt = errors.New("corrupt simulated table")

// decodeSim reads what encodeSim wrote and checks it is the table of sp.
func decodeSim(raw []byte, sp simulate.Spec) (*simulate.Result, error) {
	if len(raw) < len(simMagic)+sha256.Size || string(raw[:len(simMagic)]) != simMagic {
		return nil, errSimCorrupt
	}
	body, sum := raw[:len(raw)-sha256.Size], raw[len(raw)-sha256.Size:]
	if h := sha256.Sum256(body); !bytes.Equal(h[:], sum) {
		return nil, errSimCorrupt
	}
	rd := bytes.NewReader(body[len(simMagic):])
	var n32 uint32
	var err error
	u32 := func() int {
		if err == nil {
			err = binary.Read(rd, binary.LittleEndian, &n32)
		}
		return int(n32)
	}
	u64 := func() uint64 {
		var v uint64
		if err == nil {
			err = binary.Read(rd, binary.LittleEndian, &v)
		}
		return v
	}
	fs := func(max int) []float64 {
		n := u32()
		if err != nil || n > max || n*8 > rd.Len() {
			err = errSimCorrupt
			return nil
		}
		x := make([]float64, n)
		err = binary.Read(rd, binary.LittleEndian, x)
		return x
	}
	kl := u32()
	if err != nil || kl > rd.Len() {
		return nil, errSimCorrupt
	}
	kb := make([]byte, kl)
	rd.Read(kb)
	r := &simulate.Result{Spec: sp, Key: string(kb)}
	r.Lower = u64() == 1
	r.NObs = int(u64())
	r.Reps = int(u64())
	r.Seed = u64()
	r.Levels = fs(16)
	r.Values = fs(16)
	r.MCSE = fs(16)
	r.Sample = fs(simulate.MaxReps)
	if err != nil || rd.Len() != 0 {
		return nil, errSimCorrupt
	}
	if r.Key != sp.Key() || r.Reps != sp.Reps || r.Seed != sp.Seed || len(r.Sample) != r.Reps ||
		!slices.Equal(r.Levels, simulate.Levels) || len(r.Values) != len(r.Levels) || len(r.MCSE) != len(r.Levels) ||
		!slices.IsSorted(r.Sample) {
		return nil, errSimCorrupt
	}
	for _, x := range r.Sample {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return nil, errSimCorrupt
		}
	}
	return r, nil
}

// load returns the stored table of sp; a missing, corrupt or foreign
// file is ignored (the simulation runs again and replaces it).
func (s SimStore) load(sp simulate.Spec) (*simulate.Result, bool) {
	if s.Dir == "" {
		return nil, false
	}
	raw, err := os.ReadFile(s.Path(sp.Key()))
	if err != nil {
		return nil, false
	}
	r, err := decodeSim(raw, sp)
	if err != nil {
		return nil, false
	}
	return r, true
}

// save stores r; a failure only costs a rerun next time.
func (s SimStore) save(r *simulate.Result) {
	if s.Dir == "" {
		return
	}
	_ = atomicfile.Write(s.Path(r.Key), encodeSim(r), 0o644)
}

// ---------------------------------------------------------------- progress

// simProgress reports a long simulation: nothing for runs shorter than
// simQuiet; after that a redrawn bar when out is a terminal, otherwise
// (or through Options.Progress) a plain line at each quarter.
type simProgress struct {
	label    string
	short    string // the label beside a terminal's bar ("" = label)
	sink     func(string)
	out      io.Writer
	tty      bool
	start    time.Time
	shown    bool
	lastDraw time.Time
	nextQ    int // next quarter to print, plain mode
	lastDone int
}

const simQuiet = time.Second

func newSimProgress(label string, sink func(string), out io.Writer) *simProgress {
	p := &simProgress{label: label, sink: sink, out: out, start: time.Now()}
	if sink == nil {
		if f, ok := out.(*os.File); ok {
			if fi, err := f.Stat(); err == nil && fi.Mode()&os.ModeCharDevice != 0 {
				p.tty = true
			}
		}
	}
	return p
}

func (p *simProgress) line(s string) {
	if p.sink != nil {
		p.sink(s)
	} else if p.out != nil {
		fmt.Fprintln(p.out, s)
	}
}

func (p *simProgress) update(done, total int) {
	p.lastDone = done
	now := time.Now()
	el := now.Sub(p.start)
	if el < simQuiet || done >= total {
		return // finish reports the end
	}
	if p.tty {
		if p.shown && now.Sub(p.lastDraw) < 100*time.Millisecond {
			return
		}
		p.shown, p.lastDraw = true, now
		const width = 30
		fill := width * done / total
		eta := time.Duration(float64(el) / float64(done) * float64(total-done))
		lab := p.short
		if lab == "" {
			lab = p.label
		}
		fmt.Fprintf(p.out, "\r%s [%s%s] %3d%% %s left ", lab, strings.Repeat("#", fill), strings.Repeat(".", width-fill),
			100*done/total, eta.Round(time.Second))
		return
	}
	q := 4 * done / total // quarters done
	if !p.shown || q >= p.nextQ {
		p.shown = true
		p.nextQ = q + 1
		p.line(fmt.Sprintf("%s: %d%% after %s", p.label, 100*done/total, el.Round(100*time.Millisecond)))
	}
}

// finish ends the report: quiet for a short successful run.
func (p *simProgress) finish(err error) {
	el := time.Since(p.start).Round(100 * time.Millisecond)
	if p.tty && p.shown {
		fmt.Fprintln(p.out)
	}
	if err == nil && !p.shown && el < simQuiet {
		return
	}
	if err != nil {
		p.line(fmt.Sprintf("%s: stopped after %s", p.label, el))
		return
	}
	p.line(fmt.Sprintf("%s: done in %s", p.label, el))
}

// ---------------------------------------------------------------- values and notes

// Group writes n with thousands separators: 20,000.
func Group(n int) string {
	s := strconv.Itoa(n)
	var b strings.Builder
	for i, ch := range s {
		if i > 0 && (len(s)-i)%3 == 0 {
			b.WriteByte(',')
		}
		b.WriteRune(ch)
	}
	return b.String()
}

// SimLevelMap keys a simulated quantity by level: {"1%": …, "2.5%": …}.
func SimLevelMap(r *simulate.Result, x []float64) map[string]any {
	m := map[string]any{}
	for i, l := range r.Levels {
		m[contract.Pct(l)] = x[i]
	}
	return m
}

// SimCritValues are the simulated critical values in the form of the
// tables' (critical.Value by level).
func SimCritValues(r *simulate.Result) []critical.Value {
	out := make([]critical.Value, len(r.Levels))
	for i, l := range r.Levels {
		out[i] = critical.Value{Level: l, Value: r.Values[i]}
	}
	return out
}

// SimAt is the simulated critical value at level.
func SimAt(r *simulate.Result, level float64) float64 {
	for i, l := range r.Levels {
		if math.Abs(l-level) < 1e-9 {
			return r.Values[i]
		}
	}
	return math.NaN()
}

// SimMCSEText lists the Monte Carlo standard errors: "0.021 (1%), …".
func SimMCSEText(r *simulate.Result) string {
	var parts []string
	for i, l := range r.Levels {
		parts = append(parts, strconv.FormatFloat(r.MCSE[i], 'g', 2, 64)+" ("+contract.Pct(l)+")")
	}
	return strings.Join(parts, ", ")
}

// SimSource is the crit_source text of a τ test: "simulated: R
// replications, seed S, T=… …".
func SimSource(r *simulate.Result, what string, chosen bool) string {
	lag := fmt.Sprintf("%d lagged differences", r.Spec.Lags)
	if r.Spec.Lags == 1 {
		lag = "1 lagged difference"
	}
	if chosen {
		lag += " (the order the criterion chose, held fixed in every replication)"
	}
	return fmt.Sprintf("simulated: %s replications, seed %d, T=%d observations in the test regression, %s, %s; Monte Carlo standard errors %s",
		Group(r.Reps), r.Seed, r.NObs, what, lag, SimMCSEText(r))
}

// SimURValues adds the simulated fields to a τ test's values.
func SimURValues(v map[string]any, r *simulate.Result, stat float64) {
	v["crit"] = SimLevelMap(r, r.Values)
	v["crit_mcse"] = SimLevelMap(r, r.MCSE)
	v["pvalue"] = r.PValue(stat)
	v["pvalue_source"] = PSimSource(r)
	v["sim_key"] = r.Key
	v["sim"] = map[string]any{"reps": r.Reps, "seed": int(r.Seed), "t": r.NObs, "lags": r.Spec.Lags, "n": r.Spec.N}
}

func PSimSource(r *simulate.Result) string {
	if r.Lower {
		return fmt.Sprintf("simulated, the share of the %s replications at or below the statistic", Group(r.Reps))
	}
	return fmt.Sprintf("simulated, the share of the %s replications at or above the statistic", Group(r.Reps))
}
