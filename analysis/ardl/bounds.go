package ardl

import (
	"fmt"
	"math"
)

// Bound is a pair of critical values at one significance level: the
// I(0) bound (every regressor stationary) and the I(1) bound (every
// regressor integrated of order one).
type Bound struct {
	Level  float64
	I0, I1 float64
}

// Source names where a set of bounds came from.
type Source int

const (
	SourcePSS     Source = iota // PSS (2001) asymptotic tables
	SourceNarayan               // Narayan (2005) finite-sample tables
)

// PSSLevels and NarayanLevels are the levels the tables give.
var (
	PSSLevels     = []float64{0.10, 0.05, 0.025, 0.01}
	NarayanLevels = []float64{0.10, 0.05, 0.01}
)

// PSSMaxK and NarayanMaxK are the largest k the tables give.
const (
	PSSMaxK     = 10
	NarayanMaxK = 7
)

var nanBlock = func() (b [8][6]float64) {
	for i := range b {
		for j := range b[i] {
			b[i][j] = math.NaN()
		}
	}
	return b
}()

// PSSF returns the asymptotic bounds of the F statistic for k regressors
// (0…10) in case c, from Pesaran, Shin and Smith (2001) Table CI(i)–(v),
// at 10%, 5%, 2.5% and 1%. The test rejects the null of no level
// relationship when F exceeds the I(1) bound.
func PSSF(c Case, k int) ([]Bound, error) {
	if c < NoDet || c > ConstTrend {
		return nil, fmt.Errorf("ardl: unknown case %d", int(c))
	}
	if k < 0 || k > PSSMaxK {
		return nil, fmt.Errorf("ardl: the PSS (2001) tables cover k = 0…%d regressors, not %d", PSSMaxK, k)
	}
	return bounds(pssF[c][k][:], PSSLevels), nil
}

// PSST returns the asymptotic bounds of the t statistic of the lagged
// level of y for k regressors (0…10) in case c (I, III or V only), from
// PSS (2001) Table CII(i), (iii), (v). The test rejects when t falls
// below the I(1) bound.
func PSST(c Case, k int) ([]Bound, error) {
	if !c.HasT() {
		return nil, fmt.Errorf("ardl: PSS (2001) give the bounds t test in cases n, c and ct (I, III, V), not in case %s (%s)", c, c.Roman())
	}
	if k < 0 || k > PSSMaxK {
		return nil, fmt.Errorf("ardl: the PSS (2001) tables cover k = 0…%d regressors, not %d", PSSMaxK, k)
	}
	i := map[Case]int{NoDet: 0, Const: 1, ConstTrend: 2}[c]
	return bounds(pssT[i][k][:], PSSLevels), nil
}

// NarayanF returns the finite-sample bounds of the F statistic of
// Narayan (2005) for k regressors (0…7), case c (II…V) and the sample
// size t, at 10%, 5% and 1%, from the table of the tabulated sample size
// (30, 35, …, 80; 30…75 in case IV) nearest to t (ties to the smaller);
// tab is the sample size used. t must lie in 30…80 (30…77 in case IV).
func NarayanF(c Case, k, t int) (b []Bound, tab int, err error) {
	if c == NoDet || c < NoDet || c > ConstTrend {
		return nil, 0, fmt.Errorf("ardl: Narayan (2005) tabulates cases rc, c, rt and ct (II–V), not %s", c)
	}
	if k < 0 || k > NarayanMaxK {
		return nil, 0, fmt.Errorf("ardl: Narayan (2005) tabulates k = 0…%d regressors, not %d", NarayanMaxK, k)
	}
	hi := 80
	if c == RestTrend {
		hi = 77
	}
	if t < 30 || t > hi {
		return nil, 0, fmt.Errorf("ardl: Narayan (2005) tabulates T = 30…80 (case rt: 30…75), not T = %d", t)
	}
	i := (t - 30 + 2) / 5 // nearest, ties (…+2.5) to the smaller
	if i > 10 {
		i = 10
	}
	row := narayanF[c-1][i][k]
	if math.IsNaN(row[0]) {
		i--
		row = narayanF[c-1][i][k]
	}
	return bounds(row[:], NarayanLevels), narayanT[i], nil
}

func bounds(row []float64, levels []float64) []Bound {
	out := make([]Bound, len(levels))
	for i, l := range levels {
		out[i] = Bound{Level: l, I0: row[2*i], I1: row[2*i+1]}
	}
	return out
}

// Verdict is the outcome of a bounds test at one level.
type Verdict int

const (
	NoLevelRelation Verdict = iota // the statistic is on the near side of the I(0) bound
	Inconclusive                   // between the bounds
	LevelRelation                  // beyond the I(1) bound
)

// String is the verdict in words: "no level relation", "inconclusive",
// "level relation".
func (v Verdict) String() string {
	switch v {
	case NoLevelRelation:
		return "no level relation"
	case Inconclusive:
		return "inconclusive"
	case LevelRelation:
		return "level relation"
	}
	return "?"
}

// VerdictF classifies an F statistic against a bound (PSS 2001, §4):
// below the I(0) bound the null of no level relationship is not
// rejected whatever the order of integration of the regressors; above
// the I(1) bound it is rejected; in between the test is inconclusive.
func VerdictF(f float64, b Bound) Verdict {
	switch {
	case f > b.I1:
		return LevelRelation
	case f < b.I0:
		return NoLevelRelation
	}
	return Inconclusive
}

// VerdictT classifies a t statistic (lower tail): above the I(0) bound
// no rejection, below the I(1) bound rejection, inconclusive between.
func VerdictT(t float64, b Bound) Verdict {
	switch {
	case t < b.I1:
		return LevelRelation
	case t > b.I0:
		return NoLevelRelation
	}
	return Inconclusive
}
