package critical

import "fmt"

// FullerLevels are the levels of FullerRho.
var FullerLevels = []float64{0.01, 0.025, 0.05, 0.10}

// fullerRho holds the asymptotic (T = ∞) row of Fuller (1976),
// Introduction to Statistical Time Series, Table 8.5.1, for the
// normalised-bias statistic T(ρ̂ − 1), levels 1%, 2.5%, 5%, 10%.
// Values from memory (as reprinted in many textbooks); they are checked
// against MacKinnon's (1996) numerical distribution functions (urca
// 1.3.3 qunitroot) in tables_test.go: they agree to 0.16, the 1% tail
// being the least accurate part of Fuller's small simulation.
var fullerRho = [3][4]float64{
	NoConst:    {-13.8, -10.5, -8.1, -5.7},
	Const:      {-20.7, -16.9, -14.1, -11.3},
	ConstTrend: {-29.5, -25.1, -21.8, -18.3},
}

// FullerRho returns the asymptotic lower-tail critical values of the
// Dickey–Fuller coefficient statistic T(ρ̂ − 1), which the
// Phillips–Perron Z(α) statistic shares, for cases n, c and ct
// (Fuller 1976, Table 8.5.1, T = ∞ row).
func FullerRho(c Case) ([]Value, error) {
	if c < NoConst || c > ConstTrend {
		return nil, fmt.Errorf("critical: Fuller (1976) tabulates cases n, c and ct, not %v", c)
	}
	out := make([]Value, len(FullerLevels))
	for i, l := range FullerLevels {
		out[i] = Value{Level: l, Value: fullerRho[c][i]}
	}
	return out, nil
}
