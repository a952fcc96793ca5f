package critical

import (
	"encoding/json"
	"math"
	"os"
	"testing"
)

type urcaCritFixture struct {
	Library   string `json:"library"`
	Quantiles []struct {
		Trend, Statistic string
		N, Levels, Q     []float64
	} `json:"quantiles"`
	PValues []struct {
		Trend   string
		Stat, P []float64
	} `json:"pvalues"`
}

func loadURCACrit(t *testing.T) urcaCritFixture {
	b, err := os.ReadFile("../../testdata/fixtures/critical_urca.json")
	if err != nil {
		t.Fatal(err)
	}
	var f urcaCritFixture
	if err := json.Unmarshal(b, &f); err != nil {
		t.Fatal(err)
	}
	if len(f.Quantiles) == 0 || len(f.PValues) == 0 {
		t.Fatal("empty fixture")
	}
	return f
}

var urcaTrend = map[string]Case{"nc": NoConst, "c": Const, "ct": ConstTrend, "ctt": ConstTrendSq}

// Reference: urca 1.3.3 qunitroot (fixture critical_urca.json, script
// testdata/scripts/unitroot_urca.R), MacKinnon's (1996) numerical
// distribution functions, an independent simulation from the 2010
// response surfaces. τ quantiles for one variable, all cases, T = ∞, 100,
// 250: agreement to 0.005 asymptotically and 0.01 at finite T (the two
// studies' simulation error is of the order 0.001–0.003).
func TestMacKinnonTauAgainst1996(t *testing.T) {
	f := loadURCACrit(t)
	n := 0
	for _, q := range f.Quantiles {
		if q.Statistic != "t" {
			continue
		}
		c := urcaTrend[q.Trend]
		tol := 0.005
		if q.N[0] != 0 {
			tol = 0.01
		}
		for i, l := range q.Levels {
			if l == 0.025 {
				continue
			}
			got, err := MacKinnonTau(1, c, int(q.N[0]), l)
			if err != nil {
				t.Fatal(err)
			}
			n++
			if math.Abs(got-q.Q[i]) > tol {
				t.Errorf("%s T=%g level %g: MacKinnon (2010) %.4f, urca 1.3.3 qunitroot (MacKinnon 1996) %.4f", c, q.N[0], l, got, q.Q[i])
			}
		}
	}
	if n == 0 {
		t.Fatal("no τ quantiles compared")
	}
}

// Reference: urca 1.3.3 qunitroot, statistic "n" (the normalised bias
// T(ρ̂−1)), T = ∞: Fuller's (1976) asymptotic values are printed to one
// decimal and come from a much smaller simulation; they must agree to
// 0.2 (the largest gaps are in the 1% tail: −13.8 vs −13.68 and −29.5 vs
// −29.35).
func TestFullerRhoAgainst1996(t *testing.T) {
	f := loadURCACrit(t)
	n := 0
	for _, q := range f.Quantiles {
		if q.Statistic != "n" || q.N[0] != 0 || q.Trend == "ctt" {
			continue
		}
		tab, err := FullerRho(urcaTrend[q.Trend])
		if err != nil {
			t.Fatal(err)
		}
		for i, v := range tab {
			n++
			if v.Level != q.Levels[i] || math.Abs(v.Value-q.Q[i]) > 0.2 {
				t.Errorf("%s level %g: Fuller (1976) %.1f, urca 1.3.3 qunitroot %.3f", q.Trend, v.Level, v.Value, q.Q[i])
			}
		}
	}
	if n != 12 {
		t.Fatalf("compared %d Fuller values, want 12", n)
	}
	if _, err := FullerRho(ConstTrendSq); err == nil {
		t.Error("FullerRho(ctt) gave no error")
	}
}

// Reference: urca 1.3.3 punitroot (MacKinnon 1996, asymptotic): the 1994
// approximate distribution functions must agree to 0.01 in probability.
func TestMacKinnonPAgainst1996(t *testing.T) {
	f := loadURCACrit(t)
	for _, r := range f.PValues {
		c := urcaTrend[r.Trend]
		for i, s := range r.Stat {
			got, err := MacKinnonP(s, 1, c)
			if err != nil {
				t.Fatal(err)
			}
			if math.Abs(got-r.P[i]) > 0.01 {
				t.Errorf("%s τ=%g: MacKinnon (1994) p %.4f, urca 1.3.3 punitroot (1996) %.4f", c, s, got, r.P[i])
			}
		}
	}
}

// table1 is MacKinnon (2010) Table 1, the original 1990 response surfaces
// (β∞, β1, β2) for N = 1, reproduced from memory; the same numbers appear
// in urca 1.3.3's ur.pp (c, ct) and ur.ers (n) critical values, which the
// fixture unitroot_urca.json records (checked in package unitroot). The
// 2010 surfaces (Table 2) are a new, larger simulation, so the two agree
// to the simulation error, not to the printed digits: 0.01 for T ≥ 100 and
// T = ∞ (the largest gap, 0.005, is ct at 1%) and 0.02 at T = 50 (where
// the 1990 surfaces have no β3 term).
var table1 = map[Case][3][3]float64{
	NoConst:    {{-2.5658, -1.960, -10.04}, {-1.9393, -0.398, 0}, {-1.6156, -0.181, 0}},
	Const:      {{-3.4336, -5.999, -29.25}, {-2.8621, -2.738, -8.36}, {-2.5671, -1.438, -4.48}},
	ConstTrend: {{-3.9638, -8.353, -47.44}, {-3.4126, -4.039, -17.83}, {-3.1279, -2.418, -7.58}},
}

func TestMacKinnonTauAgainstTable1(t *testing.T) {
	for c, rows := range table1 {
		for _, tt := range []int{0, 50, 100, 250, 500} {
			tol := 0.01
			if tt != 0 && tt < 100 {
				tol = 0.02
			}
			for i, l := range MacKinnonLevels {
				b := rows[i]
				want := b[0]
				if tt > 0 {
					x := 1 / float64(tt)
					want += b[1]*x + b[2]*x*x
				}
				got, _ := MacKinnonTau(1, c, tt, l)
				if math.Abs(got-want) > tol {
					t.Errorf("%s T=%d level %g: Table 2 %.4f, Table 1 %.4f", c, tt, l, got, want)
				}
			}
		}
	}
}

// KPSS (1992) Table 1 as printed (10%, 5%, 2.5%, 1%), and the p-value
// interpolation at and between the table points and outside it.
func TestKPSSTable(t *testing.T) {
	want := map[Case][]float64{Const: {0.347, 0.463, 0.574, 0.739}, ConstTrend: {0.119, 0.146, 0.176, 0.216}}
	for c, w := range want {
		tab, err := KPSS(c)
		if err != nil {
			t.Fatal(err)
		}
		for i, v := range tab {
			if v.Value != w[i] || v.Level != KPSSLevels[i] {
				t.Errorf("%s: %v, want level %g value %g", c, v, KPSSLevels[i], w[i])
			}
			p, clipped, _ := KPSSP(v.Value, c)
			if math.Abs(p-v.Level) > 1e-15 || clipped {
				t.Errorf("%s: p at the %g value = %g (clipped %v)", c, v.Level, p, clipped)
			}
		}
	}
	// Midway between 5% (0.463) and 2.5% (0.574): 0.0375.
	if p, _, _ := KPSSP((0.463+0.574)/2, Const); math.Abs(p-0.0375) > 1e-12 {
		t.Errorf("midpoint p = %g, want 0.0375", p)
	}
	if p, cl, _ := KPSSP(0.1, ConstTrend); p != 0.10 || !cl {
		t.Errorf("below the table: p %g clipped %v", p, cl)
	}
	if p, cl, _ := KPSSP(2, Const); p != 0.01 || !cl {
		t.Errorf("above the table: p %g clipped %v", p, cl)
	}
	if _, err := KPSS(NoConst); err == nil {
		t.Error("KPSS(n) gave no error")
	}
}

// ERS (1996) Table 1 trend rows are returned exactly at T = 50, 100, 200,
// ∞; in between the values are linear in 1/T; below 50 the T = 50 row.
func TestERSTau(t *testing.T) {
	rows := map[int][3]float64{50: {-3.77, -3.19, -2.89}, 100: {-3.58, -3.03, -2.74}, 200: {-3.46, -2.93, -2.64}, 0: {-3.48, -2.89, -2.57}}
	for tt, w := range rows {
		got, _, err := ERSTau(tt)
		if err != nil {
			t.Fatal(err)
		}
		for i := range w {
			if math.Abs(got[i].Value-w[i]) > 1e-12 {
				t.Errorf("T=%d: %v, want %v", tt, got, w)
			}
		}
	}
	// T = 400: 1/400 is halfway between 1/200 and 0.
	got, _, _ := ERSTau(400)
	if math.Abs(got[1].Value-(-2.93-2.89)/2) > 1e-12 {
		t.Errorf("T=400 5%%: %g", got[1].Value)
	}
	// T = 2/(1/50+1/100) ≈ 66.7: halfway in 1/T; use T = 75 → w = (1/50−1/75)/(1/50−1/100) = 2/3.
	got, _, _ = ERSTau(75)
	if math.Abs(got[0].Value-(-3.77+2.0/3*(-3.58+3.77))) > 1e-12 {
		t.Errorf("T=75 1%%: %g", got[0].Value)
	}
	got, src, _ := ERSTau(30)
	if got[2].Value != -2.89 || src == "" {
		t.Errorf("T=30: %v %q", got, src)
	}
	if _, _, err := ERSTau(-1); err == nil {
		t.Error("ERSTau(-1) gave no error")
	}
}

func TestZivotAndrewsTable(t *testing.T) {
	for _, s := range []string{"intercept", "trend", "both"} {
		m, err := ParseBreakModel(s)
		if err != nil || m.String() != s {
			t.Fatalf("ParseBreakModel(%q) = %v, %v", s, m, err)
		}
		tab, err := ZivotAndrews(m)
		if err != nil {
			t.Fatal(err)
		}
		for i := 1; i < len(tab); i++ {
			if !(tab[i].Value > tab[i-1].Value) {
				t.Errorf("%s: critical values not increasing with the level: %v", s, tab)
			}
		}
	}
	if _, err := ParseBreakModel("shift"); err == nil {
		t.Error("ParseBreakModel(shift) gave no error")
	}
}
