package simulate

import (
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"fmt"
	"math"
	"runtime"
	"strings"

	"github.com/galley-econ/galley/analysis/ardl"
	"github.com/galley-econ/galley/analysis/coint"
	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/johansen"
)

// Test names accepted in Spec.Test.
const (
	ADF            = "adf"
	EG             = "eg"
	JohansenTrace  = "johansen-trace"
	JohansenMaxEig = "johansen-maxeig"
	// The Gregory–Hansen (1996) statistics ADF*, Zt* and Zα*
	// (kernel_gh.go).
	GHADF = "gh-adf"
	GHZt  = "gh-zt"
	GHZa  = "gh-za"
)

// Limits of a Spec.
const (
	MinReps = 100
	MaxReps = 10_000_000
	MaxVars = 12        // largest N for eg and the Johansen tests
	MaxT    = 1_000_000 // longest series
	// BlockSize is the number of replications drawn from one generator
	// stream. It is part of the algorithm: changing it changes results.
	BlockSize = 128
)

// keyVersion identifies the simulation algorithm in Key; it changes
// whenever a change of the code changes the numbers for a given Spec.
const keyVersion = "sim1"

// Spec describes one Monte Carlo experiment.
type Spec struct {
	Test string // "adf", "eg", "johansen-trace", "johansen-maxeig", or an ARDL bounds statistic (ARDLF0 …)
	// Case is the deterministic case: n, c, ct or ctt for adf and eg (in
	// eg, of the static regression), n, rc, c, rt or ct for Johansen.
	Case string
	N    int // variables: 1 for adf, 2..MaxVars for eg, 1..MaxVars for Johansen; regressors k for ARDL
	T    int // length of each simulated series (observations in levels)
	Lags int // fixed number of lagged differences
	Reps int // replications, MinReps..MaxReps
	Seed uint64
	// Trim is the trimming of the Gregory–Hansen break dates (0 means
	// coint.DefaultGHTrim); the other tests ignore it.
	Trim float64
	// Workers is the number of goroutines; 0 means runtime.NumCPU(). It
	// does not affect the result.
	Workers int
	// Design holds regressors beyond the case's deterministic terms for
	// the Johansen tests (nil: none); the other tests refuse one.
	Design *Design
}

// Design is the deterministic design of an estimated VECM beyond its
// case: dummies and conditioning regressors, held fixed in every
// replication. Each column has one value per row of the simulated levels
// (Spec.T values), in the layout of johansen.Extra:
//
//   - Unrestricted columns w_t enter every short-run regression at the row
//     of Δy_t (centred seasonals, impulses, unrestricted steps, stationary
//     regressors given as data);
//   - Restricted columns x enter the relations lagged once, beside y_{t−1}
//     (step dummies whose level shift lies in the relations; Johansen,
//     Mosconi and Nielsen 2000, §2).
//
// With a design, the statistic of a replication is that of
// johansen.TestExtra on the simulated walks with these columns; under the
// null the walks carry no dummy effects, and the statistics are invariant
// to any effect that lies in the space of the regressors the model
// includes.
type Design struct {
	Unrestricted, Restricted [][]float64
}

// counts returns the numbers of unrestricted and restricted columns.
func (d *Design) counts() (nu, nr int) {
	if d == nil {
		return 0, 0
	}
	return len(d.Unrestricted), len(d.Restricted)
}

// check returns an error unless every column has t finite values.
func (d *Design) check(t int) error {
	for _, g := range []struct {
		what string
		cols [][]float64
	}{{"unrestricted", d.Unrestricted}, {"restricted", d.Restricted}} {
		for j, c := range g.cols {
			if len(c) != t {
				return fmt.Errorf("simulate: %s design column %d has %d values; the series have T = %d", g.what, j, len(c), t)
			}
			for i, v := range c {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					return fmt.Errorf("simulate: %s design column %d has a missing or infinite value at row %d", g.what, j, i)
				}
			}
		}
	}
	return nil
}

// hash identifies the design's numbers for Key: SHA-256 over the column
// counts and the IEEE bits of every value, first 16 bytes in hex.
func (d *Design) hash() string {
	h := sha256.New()
	var b [8]byte
	put := func(u uint64) {
		binary.LittleEndian.PutUint64(b[:], u)
		h.Write(b[:])
	}
	put(uint64(len(d.Unrestricted)))
	put(uint64(len(d.Restricted)))
	for _, cols := range [][][]float64{d.Unrestricted, d.Restricted} {
		for _, c := range cols {
			put(uint64(len(c)))
			for _, v := range c {
				put(math.Float64bits(v))
			}
		}
	}
	return hex.EncodeToString(h.Sum(nil)[:16])
}

// plan is a validated Spec.
type plan struct {
	test     string
	tauCase  critical.Case
	johCase  johansen.Case
	ghModel  coint.GHModel
	trim     float64
	ardlCase ardl.Case
	caseStr  string
	nobs     int // observations in the test regression
	workers  int
}

// check validates s and resolves its names.
func (s Spec) check() (plan, error) {
	var p plan
	p.test = strings.ToLower(strings.TrimSpace(s.Test))
	if s.Lags < 0 {
		return p, fmt.Errorf("simulate: lag order %d is negative", s.Lags)
	}
	if s.Reps < MinReps || s.Reps > MaxReps {
		return p, fmt.Errorf("simulate: %d replications; need %d..%d", s.Reps, MinReps, MaxReps)
	}
	if s.Workers < 0 {
		return p, fmt.Errorf("simulate: %d workers is negative (0 uses every core)", s.Workers)
	}
	if s.T > MaxT {
		return p, fmt.Errorf("simulate: series length %d exceeds %d", s.T, MaxT)
	}
	if nu, nr := s.Design.counts(); nu+nr > 0 && p.test != JohansenTrace && p.test != JohansenMaxEig {
		return p, fmt.Errorf("simulate: %s takes no design of dummies (only the Johansen tests do)", p.test)
	}
	p.workers = s.Workers
	if p.workers == 0 {
		p.workers = runtime.NumCPU()
	}
	switch p.test {
	case ADF, EG:
		c, err := critical.ParseCase(s.Case)
		if err != nil {
			return p, fmt.Errorf("simulate: %s: %w", p.test, err)
		}
		p.tauCase, p.caseStr = c, c.String()
		if p.test == ADF && s.N != 1 {
			return p, fmt.Errorf("simulate: adf has one variable, not N = %d", s.N)
		}
		if p.test == EG && (s.N < 2 || s.N > MaxVars) {
			return p, fmt.Errorf("simulate: eg needs N = 2..%d variables, not %d", MaxVars, s.N)
		}
		// DF regression: n = T−1−p observations, k regressors; need
		// n − k ≥ 1 and, for eg, a static regression with T > d + N − 1 + 1.
		d := c.Deterministics()
		k := d + s.Lags + 1
		if p.test == EG {
			k = s.Lags + 1
			if sk := d + s.N - 1; s.T <= sk+1 {
				return p, fmt.Errorf("simulate: T = %d is too short for a static regression on %d terms", s.T, sk)
			}
		}
		p.nobs = s.T - 1 - s.Lags
		if p.nobs-k < 1 {
			return p, fmt.Errorf("simulate: T = %d is too short for %d lagged differences: the Dickey–Fuller regression would have %d observations for %d regressors", s.T, s.Lags, max(p.nobs, 0), k)
		}
	case JohansenTrace, JohansenMaxEig:
		c, err := johansen.ParseCase(s.Case)
		if err != nil {
			return p, fmt.Errorf("simulate: %s: %w", p.test, err)
		}
		p.johCase, p.caseStr = c, c.String()
		if s.N < 1 || s.N > MaxVars {
			return p, fmt.Errorf("simulate: %s needs N = 1..%d variables, not %d", p.test, MaxVars, s.N)
		}
		// As johansen.Test: T−L−1 observations must exceed the number of
		// regressors of all three blocks.
		dnu, dnr := s.Design.counts()
		if dnu+dnr > 0 {
			if err := s.Design.check(s.T); err != nil {
				return p, err
			}
		}
		nu := map[johansen.Case]int{johansen.C: 1, johansen.RT: 1, johansen.CT: 2}[c] + s.N*s.Lags + dnu
		p1 := s.N + map[johansen.Case]int{johansen.RC: 1, johansen.RT: 1}[c] + dnr
		p.nobs = s.T - s.Lags - 1
		if need := nu + p1 + s.N; p.nobs <= need {
			return p, fmt.Errorf("simulate: T = %d is too short for %d lagged differences: %d observations for %d regressors in case %s with %d series", s.T, s.Lags, max(p.nobs, 0), need, c, s.N)
		}
	case GHADF, GHZt, GHZa:
		if err := s.checkGH(&p); err != nil {
			return p, err
		}
	case ARDLF0, ARDLF1, ARDLT0, ARDLT1:
		c, err := ardl.ParseCase(s.Case)
		if err != nil {
			return p, fmt.Errorf("simulate: %s: %w", p.test, err)
		}
		p.ardlCase, p.caseStr = c, c.String()
		if (p.test == ARDLT0 || p.test == ARDLT1) && !c.HasT() {
			return p, fmt.Errorf("simulate: the bounds t test is defined in cases n, c and ct, not %s", c)
		}
		if s.N < 1 || s.N > MaxVars {
			return p, fmt.Errorf("simulate: %s needs k = 1..%d regressors, not %d", p.test, MaxVars, s.N)
		}
		p.nobs = nobsARDL(s.T, s.Lags)
		k := newARDLKernelSize(c, s.N, s.Lags)
		if p.nobs-k < 1 {
			return p, fmt.Errorf("simulate: T = %d is too short for %d lagged differences: the bounds regression would have %d observations for %d regressors", s.T, s.Lags, max(p.nobs, 0), k)
		}
	default:
		return p, fmt.Errorf("simulate: unknown test %q (want adf, eg, johansen-trace, johansen-maxeig, gh-adf, gh-zt, gh-za, ardl-f-i0, ardl-f-i1, ardl-t-i0 or ardl-t-i1)", s.Test)
	}
	return p, nil
}

// Key is a stable string identifying the numbers Run returns for s: the
// algorithm version, the test, the canonical case, N, T, lags,
// replications and seed (not Workers, which does not change them), and
// with a design of dummies its column counts and the hash of its values
// (a Spec without one keeps the key it had before designs existed). It
// returns "" for an invalid Spec.
func (s Spec) Key() string {
	p, err := s.check()
	if err != nil {
		return ""
	}
	k := fmt.Sprintf("%s|test=%s|case=%s|n=%d|t=%d|lags=%d|reps=%d|seed=%d",
		keyVersion, p.test, p.caseStr, s.N, s.T, s.Lags, s.Reps, s.Seed)
	if p.trim > 0 {
		k += fmt.Sprintf("|trim=%g", p.trim)
	}
	if nu, nr := s.Design.counts(); nu+nr > 0 {
		k += fmt.Sprintf("|design=u%d,r%d,%s", nu, nr, s.Design.hash())
	}
	return k
}

// Validate reports whether s is a valid Spec, with the reason if not.
func (s Spec) Validate() error {
	_, err := s.check()
	return err
}
