package rules

import "testing"

// TestPowerRules compares ⌊c·(T/100)^p⌋ for T = 1..1500 with the same
// rule evaluated in Python floats (int(c*(T/100)**p), numpy 1.24.2 era
// CPython, rules_bandwidth.py): exact agreement, since a flip at an
// integer would change a chosen lag.
func TestPowerRules(t *testing.T) {
	f := loadFixture(t)
	for name, r := range map[string]PowerRule{
		"schwert12": Schwert12, "schwert4": Schwert4,
		"nw94_bartlett": NeweyWest94Bartlett, "nw94_qs": NeweyWest94QS,
	} {
		want := f.Power[name]
		if len(want) != 1500 {
			t.Fatalf("%s: %d values in the fixture", name, len(want))
		}
		for i, w := range want {
			if got := r.Lag(i + 1); got != w {
				t.Errorf("%s at T=%d: %d, Python %d", name, i+1, got, w)
			}
		}
	}
	for i, w := range f.Power["schwert12"] {
		if got := SchwertMax(i + 1); got != w {
			t.Fatalf("SchwertMax(%d) = %d, want %d", i+1, got, w)
		}
	}
}

// TestPowerRuleByHand: values worked by hand; (2.02)^{1/4} = 1.19218…,
// 16^{1/4} = 2, (5)^{2/9} = 1.4299….
func TestPowerRuleByHand(t *testing.T) {
	for _, c := range []struct {
		r    PowerRule
		t    int
		want int
	}{
		{Schwert4, 202, 4}, {Schwert12, 202, 14}, {Schwert12, 100, 12}, {Schwert4, 1600, 8},
		{NeweyWest94Bartlett, 500, 5}, {Schwert12, 0, 0}, {Schwert12, -5, 0},
		{PowerRule{C: -1, P: 0.25}, 100, 0}, {PowerRule{C: 1e300, P: 1}, 1000, 1<<31 - 1},
	} {
		if got := c.r.Lag(c.t); got != c.want {
			t.Errorf("%+v at T=%d: %d, want %d", c.r, c.t, got, c.want)
		}
	}
}
