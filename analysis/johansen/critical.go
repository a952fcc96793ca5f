package johansen

import "fmt"

// Stat names one of the two rank-test statistics.
type Stat int

const (
	// TraceStat is −T Σ_{i>r} ln(1−λ_i), testing H(r) against H(K).
	TraceStat Stat = iota
	// MaxEigStat is −T ln(1−λ_{r+1}), testing H(r) against H(r+1).
	MaxEigStat
)

// Levels are the significance levels of the tabulated critical values, in
// the order of the columns returned by CriticalValues.
var Levels = [3]float64{0.10, 0.05, 0.01}

// MaxTabulated is the largest K−r for which critical values are tabulated.
const MaxTabulated = 11

// cvTable is indexed [K−r−1][level] with levels 10%, 5%, 1% (quantiles
// 90%, 95%, 99%).
type cvTable [MaxTabulated][3]float64

// Critical values of Osterwald-Lenum (1992).
//
// Tables 1* (case RC) and 2* (case RT) are the published values; urca 1.3.3
// carries a copy of the same two tables, which was consulted while typing
// them and which the test checks digit for digit.
//
// The other cases (N, C, CT) use galley's own simulated tables
// (tables_sim.go), which are checked against the MacKinnon, Haug and
// Michelis (1999) quantiles that statsmodels ships.
var (
	olTraceRC = cvTable{
		{7.52, 9.24, 12.97}, {17.85, 19.96, 24.60}, {32.00, 34.91, 41.07},
		{49.65, 53.12, 60.16}, {71.86, 76.07, 84.45}, {97.18, 102.14, 111.01},
		{126.58, 131.70, 143.09}, {159.48, 165.58, 177.20}, {196.37, 202.92, 215.74},
		{236.54, 244.15, 257.68}, {282.45, 291.40, 307.64},
	}
	olMaxRC = cvTable{
		{7.52, 9.24, 12.97}, {13.75, 15.67, 20.20}, {19.77, 22.00, 26.81},
		{25.56, 28.14, 33.24}, {31.66, 34.40, 39.79}, {37.45, 40.30, 46.82},
		{43.25, 46.45, 51.91}, {48.91, 52.00, 57.95}, {54.35, 57.42, 63.71},
		{60.25, 63.57, 69.94}, {66.02, 69.74, 76.63},
	}
	olTraceRT = cvTable{
		{10.49, 12.25, 16.26}, {22.76, 25.32, 30.45}, {39.06, 42.44, 48.45},
		{59.14, 62.99, 70.05}, {83.20, 87.31, 96.58}, {110.42, 114.90, 124.75},
		{141.01, 146.76, 158.49}, {176.67, 182.82, 196.08}, {215.17, 222.21, 234.41},
		{256.72, 263.42, 279.07}, {303.13, 310.81, 327.45},
	}
	olMaxRT = cvTable{
		{10.49, 12.25, 16.26}, {16.85, 18.96, 23.65}, {23.11, 25.54, 30.34},
		{29.12, 31.46, 36.65}, {34.75, 37.52, 42.36}, {40.91, 43.97, 49.51},
		{46.32, 49.42, 54.71}, {52.16, 55.50, 62.46}, {57.87, 61.29, 67.88},
		{63.18, 66.23, 73.73}, {69.26, 72.72, 79.23},
	}
)

func table(c Case, s Stat) *cvTable {
	switch {
	case c == RC && s == TraceStat:
		return &olTraceRC
	case c == RC && s == MaxEigStat:
		return &olMaxRC
	case c == RT && s == TraceStat:
		return &olTraceRT
	case c == RT && s == MaxEigStat:
		return &olMaxRT
	}
	return nil
}

// CriticalValues returns the asymptotic 10 %, 5 % and 1 % critical values
// (see Levels) of statistic s in case c for dim = K−r non-stationary
// directions: Osterwald-Lenum (1992), Tables 1* and 2*, for the restricted
// cases RC and RT; galley's simulated tables (SimulatedCriticalValues) for
// N, C and CT. CriticalSource names the source for a case.
func CriticalValues(c Case, s Stat, dim int) ([3]float64, error) {
	if !c.valid() {
		return [3]float64{}, fmt.Errorf("johansen: invalid deterministic case %d", int(c))
	}
	if dim < 1 || dim > MaxTabulated {
		return [3]float64{}, fmt.Errorf("johansen: critical values are tabulated for K−r = 1..%d, not %d", MaxTabulated, dim)
	}
	if t := table(c, s); t != nil {
		return t[dim-1], nil
	}
	return SimulatedCriticalValues(c, s, dim)
}

// CriticalSource names the source of CriticalValues for case c, for a
// table note.
func CriticalSource(c Case) string {
	if c == RC || c == RT {
		return "Osterwald-Lenum (1992), asymptotic"
	}
	return "galley's simulation of the asymptotic distribution (100,000 replications, T = 1000 extrapolated; checked against MacKinnon, Haug and Michelis 1999)"
}

// levelIndex maps a significance level to its column.
func levelIndex(level float64) (int, error) {
	for i, l := range Levels {
		if level == l {
			return i, nil
		}
	}
	return 0, fmt.Errorf("johansen: critical values are tabulated at the 0.10, 0.05 and 0.01 levels, not %g", level)
}

// Critical returns the critical values of statistic s for every rank
// r = 0..K−1 of the fitted model, in the order of Levels.
func (r *Result) Critical(s Stat) ([][3]float64, error) {
	out := make([][3]float64, r.K)
	for rank := range out {
		cv, err := CriticalValues(r.Case, s, r.K-rank)
		if err != nil {
			return nil, err
		}
		out[rank] = cv
	}
	return out, nil
}

// Rank chooses the cointegrating rank by Johansen's sequential procedure
// (Johansen 1995, §12.1): the first r = 0, 1, ..., K−1 whose trace
// statistic does not exceed its critical value at the given level (0.10,
// 0.05 or 0.01), and K if every H(r) is rejected. With adjust the statistics
// carry the Reinsel–Ahn factor.
func (r *Result) Rank(level float64, adjust bool) (int, error) {
	li, err := levelIndex(level)
	if err != nil {
		return 0, err
	}
	trace, _ := r.Statistics(adjust)
	for rank := 0; rank < r.K; rank++ {
		cv, err := CriticalValues(r.Case, TraceStat, r.K-rank)
		if err != nil {
			return 0, err
		}
		if trace[rank] <= cv[li] {
			return rank, nil
		}
	}
	return r.K, nil
}
