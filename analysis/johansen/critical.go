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
// Table 1 (case C, unrestricted constant) is typed from memory of the
// published table; it is not checked against the print. The test compares it
// with the quantiles of MacKinnon, Haug and Michelis as shipped by
// statsmodels 0.13.5, which it undercuts smoothly by 0–3 % (the known bias of
// the simulation at T = 400), so a mistyped digit would show.
//
// Tables 1* (case RC) and 2* (case RT) are the published values; urca 1.3.3
// carries a copy of the same two tables, which was consulted while typing
// them and which the test checks digit for digit.
//
// Cases N and CT (Osterwald-Lenum's Tables 0 and 2) are not tabulated here:
// they could not be recalled reliably, and no printed copy was available.
var (
	olTraceC = cvTable{
		{2.69, 3.76, 6.65}, {13.33, 15.41, 20.04}, {26.79, 29.68, 35.65},
		{43.95, 47.21, 54.46}, {64.84, 68.52, 76.07}, {89.48, 94.15, 103.18},
		{118.50, 124.24, 133.57}, {150.53, 156.00, 168.36}, {186.39, 192.89, 204.95},
		{225.85, 233.13, 247.18}, {269.96, 277.71, 293.44},
	}
	olMaxC = cvTable{
		{2.69, 3.76, 6.65}, {12.07, 14.07, 18.63}, {18.60, 20.97, 25.52},
		{24.73, 27.07, 32.24}, {30.90, 33.46, 38.77}, {36.76, 39.37, 45.10},
		{42.32, 45.28, 51.57}, {48.33, 51.42, 57.95}, {53.98, 57.12, 62.80},
		{59.62, 62.81, 69.09}, {65.38, 68.83, 75.95},
	}
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
	case c == C && s == TraceStat:
		return &olTraceC
	case c == C && s == MaxEigStat:
		return &olMaxC
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
// directions, from Osterwald-Lenum (1992), Tables 1, 1* and 2*.
func CriticalValues(c Case, s Stat, dim int) ([3]float64, error) {
	if !c.valid() {
		return [3]float64{}, fmt.Errorf("johansen: invalid deterministic case %d", int(c))
	}
	t := table(c, s)
	if t == nil {
		return [3]float64{}, fmt.Errorf("johansen: no critical values are tabulated for case %s (available: c, rc, rt)", c)
	}
	if dim < 1 || dim > MaxTabulated {
		return [3]float64{}, fmt.Errorf("johansen: critical values are tabulated for K−r = 1..%d, not %d", MaxTabulated, dim)
	}
	return t[dim-1], nil
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
