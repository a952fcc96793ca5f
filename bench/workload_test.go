package bench

import (
	"math"
	"testing"
)

// TestWorkloads: each benchmarked computation runs on its data and gives
// the answer the data-generating process implies (a unit root is not
// rejected for the random walk; Engle–Granger rejects for the
// cointegrated triple; the Johansen trace test chooses rank 3; the ECM's
// adjustment speed is near −0.3 = 0.7 − 1). Loose, sanity-level checks:
// the statistics themselves are checked against references in analysis/.
func TestWorkloads(t *testing.T) {
	if testing.Short() {
		t.Skip("generates 100,000-observation series")
	}
	a, err := ADF(data)
	if err != nil || a.PValue < 0.05 || a.NObs+a.Lags > ADFT {
		t.Errorf("ADF: %v, p %v", err, a)
	}
	e, err := EngleGranger(data)
	if err != nil || e.PValue > 0.01 {
		t.Errorf("Engle–Granger: %v, p %v", err, e.PValue)
	}
	j, err := Johansen(data.JohMatrix())
	if err != nil {
		t.Fatal(err)
	}
	if r, err := j.Rank(0.05, false); err != nil || r != 3 {
		t.Errorf("Johansen rank %d (%v), want 3", r, err)
	}
	m, err := ECM(data)
	if err != nil {
		t.Fatal(err)
	}
	if alpha := m.Adjust; math.Abs(alpha.Alpha+0.3) > 0.1 {
		t.Errorf("ECM adjustment %v, want about −0.3", alpha.Alpha)
	}
}

// TestDemoBuildsWarm: a second build of a copy of the demo takes every
// result from the cache.
func TestDemoBuildsWarm(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the demo twice")
	}
	p := demoCopy(t)
	d1, _, err := Build(p, true)
	if err != nil {
		t.Fatal(err)
	}
	if d1.Directives() < 15 {
		t.Errorf("the demo has %d directives, the benchmark assumes at least 15", d1.Directives())
	}
	d2, _, err := Build(p, true)
	if err != nil {
		t.Fatal(err)
	}
	if len(d2.Ran()) != 0 || len(d2.Reused()) != d2.Directives() {
		t.Errorf("warm build ran %v (reused %d of %d)", d2.Ran(), len(d2.Reused()), d2.Directives())
	}
}
