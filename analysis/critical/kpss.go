package critical

import "fmt"

// KPSSLevels are the upper-tail levels of KPSS (1992) Table 1, in the
// order of the table: 10%, 5%, 2.5%, 1%.
var KPSSLevels = []float64{0.10, 0.05, 0.025, 0.01}

// kpssTable is Kwiatkowski, Phillips, Schmidt and Shin (1992), "Testing
// the null hypothesis of stationarity against the alternative of a unit
// root", Journal of Econometrics 54, 159–178, Table 1: upper-tail
// asymptotic critical values of η_μ (level) and η_τ (trend).
var kpssTable = map[Case][4]float64{
	Const:      {0.347, 0.463, 0.574, 0.739},
	ConstTrend: {0.119, 0.146, 0.176, 0.216},
}

// KPSS returns the critical values of the KPSS statistic for level
// stationarity (Const, η_μ) or trend stationarity (ConstTrend, η_τ),
// levels 10%, 5%, 2.5%, 1% (KPSS 1992, Table 1). The null is rejected
// for large values.
func KPSS(c Case) ([]Value, error) {
	tab, ok := kpssTable[c]
	if !ok {
		return nil, fmt.Errorf("critical: KPSS (1992) tabulates the level (c) and trend (ct) cases, not %v", c)
	}
	out := make([]Value, 4)
	for i, l := range KPSSLevels {
		out[i] = Value{Level: l, Value: tab[i]}
	}
	return out, nil
}

// KPSSP returns the p-value of a KPSS statistic by linear interpolation
// of the level in the statistic between the points of KPSS (1992)
// Table 1. Outside the table the p-value is clipped to its ends (0.10
// below the 10% value, 0.01 above the 1% value) and clipped is true: the
// true p-value is then larger than 0.10 or smaller than 0.01.
func KPSSP(stat float64, c Case) (p float64, clipped bool, err error) {
	tab, ok := kpssTable[c]
	if !ok {
		return 0, false, fmt.Errorf("critical: KPSS (1992) tabulates the level (c) and trend (ct) cases, not %v", c)
	}
	if stat != stat {
		return 0, false, fmt.Errorf("critical: KPSS statistic is NaN")
	}
	switch {
	case stat < tab[0]:
		return KPSSLevels[0], true, nil
	case stat > tab[3]:
		return KPSSLevels[3], true, nil
	}
	for i := 0; i < 3; i++ {
		if stat <= tab[i+1] {
			w := (stat - tab[i]) / (tab[i+1] - tab[i])
			return KPSSLevels[i] + w*(KPSSLevels[i+1]-KPSSLevels[i]), false, nil
		}
	}
	return KPSSLevels[3], false, nil
}
