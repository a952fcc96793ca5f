package critical

import (
	"encoding/json"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
)

type ngPerronSimFixture struct {
	Library    string `json:"library"`
	Simulation struct {
		T, Reps int
		Levels  []float64
		Cases   map[string]map[string]struct {
			Q, Lo, Hi []float64
		}
	} `json:"simulation"`
}

// ngPerronGaps lists the entries of the table (as given from memory, see
// ngPerronTable) that lie outside the 99.9% band of the simulation below,
// with the relative gap to the simulated quantile in the comment. In the
// trend case the 5% and 10% values are all more extreme than the
// simulated asymptotic quantiles (so tests using them are conservative);
// ERS (1996) report for P_T, which MPT shares asymptotically, values close
// to the simulation (3.96, 5.62, 6.89 from memory). The table is kept as
// published practice has it; the gaps are recorded here and checked to
// stay below 10%.
var ngPerronGaps = map[string]bool{
	"c MSB 0.01":  true,                     // 0.174 vs 0.185 (6%)
	"c MPT 0.01":  true,                     // 1.78 vs 1.95 (9%)
	"ct MZa 0.05": true, "ct MZa 0.1": true, // −17.3, −14.2 vs −16.6, −13.6 (4%)
	"ct MZt 0.05": true, "ct MZt 0.1": true, // −2.91, −2.62 vs −2.85, −2.57 (2%)
	"ct MSB 0.05": true, "ct MSB 0.1": true, // 0.168, 0.185 vs 0.171, 0.188 (2%)
	"ct MPT 0.05": true, "ct MPT 0.1": true, // 5.48, 6.67 vs 5.71, 6.95 (4%)
}

// Reference: a simulation of the asymptotic distributions (fixture
// unitroot_ngperron.json, script testdata/scripts/unitroot_ngperron.py,
// numpy 1.24.2): 50000 Gaussian random walks of length 2000,
// GLS-detrended with c̄ = −7 or −13.5, statistics with the known
// s² = 1; 99.9% distribution-free bands for the 1%, 5%, 10% quantiles
// from the binomial order statistics. Every table entry must lie in its
// band widened by half a unit of its last printed digit, except the
// entries of ngPerronGaps, which must lie outside it (so that the list
// stays true) and within 10% of the simulated quantile.
func TestNgPerronTableSimulation(t *testing.T) {
	b, err := os.ReadFile("../../testdata/fixtures/unitroot_ngperron.json")
	if err != nil {
		t.Fatal(err)
	}
	var f ngPerronSimFixture
	if err := json.Unmarshal(b, &f); err != nil {
		t.Fatal(err)
	}
	half := map[NgPerronStat]float64{MZa: 0.05, MZt: 0.005, MSB: 0.0005, MPT: 0.005}
	n := 0
	for cs, c := range map[string]Case{"c": Const, "ct": ConstTrend} {
		for _, s := range []NgPerronStat{MZa, MZt, MSB, MPT} {
			sim, ok := f.Simulation.Cases[cs][s.String()]
			if !ok || len(sim.Q) != 3 {
				t.Fatalf("no simulation for %s %s", cs, s)
			}
			tab, err := NgPerron(s, c)
			if err != nil {
				t.Fatal(err)
			}
			for i, v := range tab {
				n++
				key := cs + " " + s.String() + " " + strconv.FormatFloat(v.Level, 'g', -1, 64)
				in := v.Value >= sim.Lo[i]-half[s] && v.Value <= sim.Hi[i]+half[s]
				switch {
				case ngPerronGaps[key] && in:
					t.Errorf("%s: %g is inside the simulated band [%.4f, %.4f]; drop it from ngPerronGaps", key, v.Value, sim.Lo[i], sim.Hi[i])
				case ngPerronGaps[key] && math.Abs(v.Value-sim.Q[i]) > 0.10*math.Abs(sim.Q[i]):
					t.Errorf("%s: %g is more than 10%% from the simulated quantile %.4f (%s)", key, v.Value, sim.Q[i], f.Library)
				case !ngPerronGaps[key] && !in:
					t.Errorf("%s: %g outside the simulated 99.9%% band [%.4f, %.4f] (quantile %.4f, %s, T=%d, %d reps)",
						key, v.Value, sim.Lo[i], sim.Hi[i], sim.Q[i], f.Library, f.Simulation.T, f.Simulation.Reps)
				}
			}
		}
	}
	if n != 24 {
		t.Fatalf("compared %d entries, want 24", n)
	}
}

// In the constant case GLS demeaning does not change the limit
// distributions (Elliott, Rothenberg and Stock 1996), so MZα shares that
// of the no-constant Dickey–Fuller coefficient statistic and MZt that of
// the no-constant τ. MZα must equal Fuller's (1976) asymptotic
// no-constant values (FullerRho, both printed to one decimal), and MZt
// must agree with MacKinnon's (2010) asymptotic no-constant τ to 0.05
// (the largest gap is at 5%: −1.98 against −1.94).
func TestNgPerronConstantCaseLimits(t *testing.T) {
	mza, _ := NgPerron(MZa, Const)
	mzt, _ := NgPerron(MZt, Const)
	fr, _ := FullerRho(NoConst)
	for i, v := range mza {
		j, err := levelIndex(v.Level, FullerLevels)
		if err != nil {
			t.Fatal(err)
		}
		if v.Value != fr[j].Value {
			t.Errorf("MZα %g: %g, Fuller (1976) no-constant %g", v.Level, v.Value, fr[j].Value)
		}
		tau, _ := MacKinnonTau(1, NoConst, 0, mzt[i].Level)
		if math.Abs(mzt[i].Value-tau) > 0.05 {
			t.Errorf("MZt %g: %g, MacKinnon (2010) asymptotic no-constant τ %.4f", mzt[i].Level, mzt[i].Value, tau)
		}
	}
}

// All four statistics reject for small values, so each row must increase
// with the level; MSB and MPT are positive, MZα and MZt negative.
func TestNgPerronTableShape(t *testing.T) {
	for _, c := range []Case{Const, ConstTrend} {
		for _, s := range []NgPerronStat{MZa, MZt, MSB, MPT} {
			tab, err := NgPerron(s, c)
			if err != nil || len(tab) != 3 {
				t.Fatalf("%s %s: %v %v", c, s, tab, err)
			}
			for i, v := range tab {
				if v.Level != NgPerronLevels[i] || (i > 0 && !(v.Value > tab[i-1].Value)) {
					t.Errorf("%s %s: %v not increasing with the level", c, s, tab)
				}
				if pos := s == MSB || s == MPT; pos != (v.Value > 0) {
					t.Errorf("%s %s: %g has the wrong sign", c, s, v.Value)
				}
			}
		}
	}
	if _, err := NgPerron(MZa, NoConst); err == nil || !strings.Contains(err.Error(), "constant (c) and trend (ct)") {
		t.Errorf("NgPerron(MZa, n): %v", err)
	}
	if _, err := NgPerron(NgPerronStat(4), Const); err == nil || !strings.Contains(err.Error(), "MZa, MZt, MSB or MPT") {
		t.Errorf("NgPerron(4, c): %v", err)
	}
	if MZa.String() != "MZa" || MPT.String() != "MPT" || NgPerronStat(9).String() != "NgPerronStat(9)" {
		t.Error("NgPerronStat.String")
	}
}
