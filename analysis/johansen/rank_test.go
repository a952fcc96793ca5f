package johansen

import (
	"fmt"
	"testing"
)

// TestStatisticsStatsmodels compares eigenvalues and the trace and
// maximum-eigenvalue statistics with statsmodels 0.13.5 coint_johansen
// (testdata/fixtures/johansen_statsmodels.json), 1e-6 relative. Its
// det_order −1 and 0 are cases N and C exactly. Its det_order 1 detrends
// the levels on the whole sample before differencing and only demeans
// afterwards, which is not case CT (nor RT) on the estimation sample; CT is
// checked against urca instead (TestStatisticsUrca).
func TestStatisticsStatsmodels(t *testing.T) {
	f := statsmodelsFixture(t)
	for _, c := range f.CointJohansen {
		if c.DetOrder == 1 {
			continue
		}
		cs := map[int]Case{-1: N, 0: C}[c.DetOrder]
		y := denmark(t)
		if c.Data == "macrodata" {
			y = macro(t)
		}
		name := fmt.Sprintf("%s/det_order=%d/k_ar_diff=%d", c.Data, c.DetOrder, c.KArDiff)
		t.Run(name, func(t *testing.T) {
			res, err := Test(y, cs, c.KArDiff)
			if err != nil {
				t.Fatal(err)
			}
			// statsmodels 0.13.5 coint_johansen: eig, lr1, lr2.
			checkVec(t, "eigenvalues", res.Eigenvalues, c.Eig, 1e-6, 0)
			checkVec(t, "trace", res.Trace, c.Trace, 1e-6, 0)
			checkVec(t, "maxeig", res.MaxEig, c.Maxeig, 1e-6, 0)
		})
	}
}

// ecdetCase maps urca's ca.jo ecdet (and the fixture's "none+trend", ecdet
// none with an unrestricted linear trend passed as dumvar) to the case.
var ecdetCase = map[string]Case{"none": C, "const": RC, "trend": RT, "none+trend": CT}

// TestStatisticsUrca compares with urca 1.3.3 ca.jo, spec = "transitory"
// (the form Δy_t = Πy_{t−1} + ΣΓ_iΔy_{t−i}), whose K counts lags in levels
// (lagged differences = K − 1), without seasonal dummies, 1e-6 relative
// (testdata/fixtures/johansen_urca.json). Where ca.jo's critical values
// come from the same published table as ours (ecdet const and trend, that
// is cases RC and RT), they are compared to the printed two decimals.
func TestStatisticsUrca(t *testing.T) {
	f := urcaFixtureLoad(t)
	y := denmark(t)
	for _, c := range f.Cajo {
		cs := ecdetCase[c.Ecdet]
		t.Run(fmt.Sprintf("ecdet=%s/K=%d", c.Ecdet, c.K), func(t *testing.T) {
			res, err := Test(y, cs, c.K-1)
			if err != nil {
				t.Fatal(err)
			}
			// urca 1.3.3 ca.jo: lambda (it also lists the zero eigenvalue of
			// the augmented problem for const and trend), teststat.
			checkVec(t, "eigenvalues", res.Eigenvalues, c.Lambda[:res.K], 1e-6, 0)
			checkVec(t, "trace", res.Trace, c.Trace, 1e-6, 0)
			checkVec(t, "maxeig", res.MaxEig, c.Maxeig, 1e-6, 0)
			if cs != RC && cs != RT {
				return
			}
			for _, s := range []struct {
				stat Stat
				want [][]float64
			}{{TraceStat, c.CvalTrace}, {MaxEigStat, c.CvalMaxeig}} {
				cv, err := res.Critical(s.stat)
				if err != nil {
					t.Fatal(err)
				}
				for r := range cv {
					// urca 1.3.3 ca.jo cval (Osterwald-Lenum 1992), 2 decimals.
					checkVec(t, fmt.Sprintf("critical %d r=%d", s.stat, r), cv[r][:], s.want[r], 0, 0.005)
				}
			}
		})
	}
}
