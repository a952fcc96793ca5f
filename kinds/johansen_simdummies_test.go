package kinds

import (
	"context"
	"math"
	"path/filepath"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/simulate"
	"github.com/galley-econ/galley/engine"
)

// TestJohansenSimulateWithDummies: crit: simulate on the Danish
// money-demand system (testdata/data/denmark.csv, 1974Q1–1987Q3) with
// centred seasonals, an impulse and a step at 1983Q1 inside the relations
// (case rc, one lagged difference). The simulated critical values must be
// those of analysis/simulate run directly on a design the test builds from
// the dates itself — three centred quarterly seasonals, an impulse at
// 1980Q1, impulses at 1983Q1 and 1983Q2 and the step from 1983Q1
// restricted — to 1e-9 relative (the directive orders the columns its own
// way; the statistics do not depend on the order); the note must say that
// they are simulated for this design; with the step the 5 % trace value
// of rank 0 must exceed the one simulated without dummies; and a second
// build must read every table from the simulation store.
func TestJohansenSimulateWithDummies(t *testing.T) {
	quietSim(t) // sets the engine's progress writer: not in parallel
	const reps = 400
	body := "id: j\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\nseasonal: true\nimpulse: 1980Q1\nshift: 1983Q1\ncrit: simulate\nreplications: 400\nseed: 9\n"
	plain := "id: p\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\ncrit: simulate\nreplications: 400\nseed: 9\n"
	p := writeProject(t, sysDKFront+"\n"+fence("johansen", body)+"\n"+fence("johansen", plain), map[string]string{"data.csv": sysRead(t, "../testdata/data/denmark.csv")})
	dir := filepath.Join(t.TempDir(), "cache")
	before := engine.SimRuns()
	vals, notes := buildValues(t, p, engine.Options{Cache: &engine.Cache{Dir: dir, Version: "v1"}})
	if n := engine.SimRuns() - before; n != 16 {
		t.Errorf("%d simulations run, want 16 (two statistics, four ranks, two designs)", n)
	}
	j := vals["j"]

	// The design, from the dates: 1974Q1 is row 0, so 1980Q1 is row 24,
	// 1983Q1 row 36; 55 rows in all.
	const rows = 55
	col := func(f func(i int) float64) []float64 {
		v := make([]float64, rows)
		for i := range v {
			v[i] = f(i)
		}
		return v
	}
	d := &simulate.Design{}
	for q := 1; q < 4; q++ {
		d.Unrestricted = append(d.Unrestricted, col(func(i int) float64 {
			if i%4 == q {
				return 0.75
			}
			return -0.25
		}))
	}
	for _, r := range []int{24, 36, 37} {
		d.Unrestricted = append(d.Unrestricted, col(func(i int) float64 { return dummyAt(i == r) }))
	}
	d.Restricted = [][]float64{col(func(i int) float64 { return dummyAt(i >= 36) })}
	crit := j["crit_trace"].([]map[string]any)
	for r := 0; r < 4; r++ {
		sp := simulate.Spec{Test: simulate.JohansenTrace, Case: "rc", N: 4 - r, T: rows, Lags: 1, Reps: reps, Seed: 9, Design: d}
		res, err := simulate.Run(context.Background(), sp, nil)
		if err != nil {
			t.Fatal(err)
		}
		for i, l := range []string{"10%", "5%", "1%"} {
			want := res.Values[levelIndex(res.Levels, []float64{0.10, 0.05, 0.01}[i])]
			if got := crit[r][l].(float64); math.Abs(got-want) > 1e-9*math.Abs(want) {
				t.Errorf("rank %d %s: directive %.12g, simulate.Run on the test's design %.12g", r, l, got, want)
			}
		}
	}
	pc := vals["p"]["crit_trace"].([]map[string]any)
	if a, b := crit[0]["5%"].(float64), pc[0]["5%"].(float64); a <= b {
		t.Errorf("rank 0: 5%% trace critical value %.3f with the step, %.3f without", a, b)
	}
	sim := j["sim"].(map[string]any)
	if !strings.Contains(sim["design"].(string), "step dummies inside the relations") {
		t.Errorf("sim.design = %q", sim["design"])
	}
	if _, ok := vals["p"]["sim"].(map[string]any)["design"]; ok {
		t.Errorf("the system without dummies reports a design")
	}
	all := strings.Join(notes["j"], " ")
	for _, w := range []string{"with the model's dummies at the same observations", "The critical values are simulated for this design", "Johansen, Mosconi and Nielsen 2000"} {
		if !strings.Contains(all, w) {
			t.Errorf("notes lack %q:\n%s", w, all)
		}
	}
	before = engine.SimRuns()
	buildValues(t, p, engine.Options{Cache: &engine.Cache{Dir: dir, Version: "v2"}}) // a new version: results rerun, tables come from the store
	if n := engine.SimRuns() - before; n != 0 {
		t.Errorf("second build ran %d simulations, want 0 (the store keys include the design)", n)
	}
}

func dummyAt(b bool) float64 {
	if b {
		return 1
	}
	return 0
}

func levelIndex(xs []float64, x float64) int {
	for i, v := range xs {
		if v == x {
			return i
		}
	}
	return -1
}
