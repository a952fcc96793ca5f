package kinds

import (
	"bytes"
	"io"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/simulate"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
)

// quietSim silences progress output for the test.
func quietSim(t *testing.T) {
	t.Helper()
	old := engine.SimProgressOut
	engine.SimProgressOut = io.Discard
	t.Cleanup(func() { engine.SimProgressOut = old })
}

// buildValues parses and runs the manuscript at p with opts and returns
// the values by id and the table notes by id.
func buildValues(t *testing.T, p string, opts engine.Options) (map[string]map[string]any, map[string][]string) {
	t.Helper()
	doc, err := engine.Parse(p, opts)
	if err != nil {
		t.Fatal(err)
	}
	if err := doc.Run(); err != nil {
		t.Fatal(err)
	}
	vals, notes := map[string]map[string]any{}, map[string][]string{}
	for _, r := range doc.Results() {
		vals[r.ID] = r.Values
		if r.Table != nil {
			notes[r.ID] = r.Table.Notes
		}
	}
	return vals, notes
}

// TestSimADFMatchesMacKinnon: the simulated critical values of the ADF τ,
// case c, with no lags at T = 202 (the macrodata series of 203 quarters)
// lie within 4 Monte Carlo standard errors of MacKinnon's (2010) response
// surface at the same T (critical.MacKinnonTau, itself checked against
// the published table); the simulated p-value is close to MacKinnon's
// (1994) approximation, which is asymptotic (so a looser 0.02).
func TestSimADFMatchesMacKinnon(t *testing.T) {
	quietSim(t) // sets the engine's progress writer: not in parallel
	p := macroProject(t, fence("adf", "id: a\nseries: log(realgdp)\ndet: c\nlags: 0\ncrit: simulate\n"))
	v, notes := buildValues(t, p, engine.Options{})
	a := v["a"]
	nobs := a["nobs"].(int)
	if nobs != 202 {
		t.Fatalf("nobs %d, want 202", nobs)
	}
	crit, mcse := a["crit"].(map[string]any), a["crit_mcse"].(map[string]any)
	for _, l := range []float64{0.01, 0.05, 0.10} {
		want, err := critical.MacKinnonTau(1, critical.Const, nobs, l)
		if err != nil {
			t.Fatal(err)
		}
		got, se := crit[contract.Pct(l)].(float64), mcse[contract.Pct(l)].(float64)
		if se <= 0 || se > 0.05 {
			t.Errorf("%s: MCSE %v is implausible for 20,000 replications", contract.Pct(l), se)
		}
		t.Logf("%s: simulated %.4f (MCSE %.4f), MacKinnon (2010) %.4f", contract.Pct(l), got, se, want)
		if math.Abs(got-want) > 4*se {
			t.Errorf("%s: simulated %.4f, MacKinnon %.4f, |diff| > 4 MCSE = %.4f", contract.Pct(l), got, want, 4*se)
		}
	}
	stat := a["stat"].(float64)
	pm, _ := critical.MacKinnonP(stat, 1, critical.Const)
	if ps := a["pvalue"].(float64); math.Abs(ps-pm) > 0.02 {
		t.Errorf("simulated p-value %v, MacKinnon (1994) %v", ps, pm)
	}
	if a["crit_source"] == nil || !strings.HasPrefix(a["crit_source"].(string), "simulated: 20,000 replications, seed 1, T=202") {
		t.Errorf("crit_source %q", a["crit_source"])
	}
	sp := simulate.Spec{Test: "adf", Case: "c", N: 1, T: 203, Lags: 0, Reps: engine.DefaultSimReps, Seed: engine.DefaultSimSeed}
	if a["sim_key"] != sp.Key() {
		t.Errorf("sim_key %v, want %v", a["sim_key"], sp.Key())
	}
	note := strings.Join(notes["a"], " ")
	for _, w := range []string{"Critical values: simulated: 20,000 replications, seed 1, T=202", "Monte Carlo standard errors", "p-value: simulated"} {
		if !strings.Contains(note, w) {
			t.Errorf("note lacks %q: %s", w, note)
		}
	}
}

// TestSimADFChosenLag: with a criterion, the simulation holds the chosen
// lag fixed, at the regression's T, and the note says so.
func TestSimADFChosenLag(t *testing.T) {
	quietSim(t) // sets the engine's progress writer: not in parallel
	p := macroProject(t, fence("adf", "id: a\nseries: log(realgdp)\ndet: ct\nlags: {select: aic, max: 8}\ncrit: simulate\nreplications: 2000\n"))
	v, notes := buildValues(t, p, engine.Options{})
	a := v["a"]
	sim := a["sim"].(map[string]any)
	if sim["lags"] != a["lags"] || sim["t"] != a["nobs"] || sim["reps"] != 2000 {
		t.Errorf("sim %v; lags %v nobs %v", sim, a["lags"], a["nobs"])
	}
	if !strings.Contains(strings.Join(notes["a"], " "), "the order the criterion chose, held fixed in every replication") {
		t.Errorf("note: %v", notes["a"])
	}
}

// TestSimSeed: the same seed gives identical values in separate builds;
// another seed gives other values.
func TestSimSeed(t *testing.T) {
	quietSim(t) // sets the engine's progress writer: not in parallel
	body := func(seed string) string {
		return fence("adf", "id: a\nseries: infl\ndet: c\nlags: 2\ncrit: simulate\nreplications: 3000\n"+seed)
	}
	v1, _ := buildValues(t, macroProject(t, body("seed: 42\n")), engine.Options{})
	v2, _ := buildValues(t, macroProject(t, body("seed: 42\n")), engine.Options{})
	v3, _ := buildValues(t, macroProject(t, body("seed: 43\n")), engine.Options{})
	if !reflect.DeepEqual(v1["a"]["crit"], v2["a"]["crit"]) || v1["a"]["pvalue"] != v2["a"]["pvalue"] {
		t.Errorf("same seed, different values: %v %v", v1["a"]["crit"], v2["a"]["crit"])
	}
	if reflect.DeepEqual(v1["a"]["crit"], v3["a"]["crit"]) {
		t.Errorf("seeds 42 and 43 gave the same critical values %v", v1["a"]["crit"])
	}
}

// TestSimStore: the simulated table is stored under the cache folder by
// its key; a later build (here with another galley version, so that the
// result cache misses) and a second directive with the same experiment
// read it instead of simulating; a corrupt file is ignored and replaced.
func TestSimStore(t *testing.T) {
	quietSim(t) // sets the engine's progress writer: not in parallel
	spec := "series: infl\ndet: c\nlags: 1\ncrit: simulate\nreplications: 2000\n"
	p := macroProject(t, fence("adf", "id: a\n"+spec)+"\n"+fence("adf", "id: b\n"+spec+"caption: again\n"))
	dir := filepath.Join(filepath.Dir(p), ".galley-cache")
	before := engine.SimRuns()
	v1, _ := buildValues(t, p, engine.Options{Cache: &engine.Cache{Dir: dir, Version: "v1"}})
	if n := engine.SimRuns() - before; n != 1 {
		t.Fatalf("first build ran %d simulations, want 1 (two directives, one experiment)", n)
	}
	if !reflect.DeepEqual(v1["a"]["crit"], v1["b"]["crit"]) {
		t.Errorf("a and b differ: %v %v", v1["a"]["crit"], v1["b"]["crit"])
	}
	key := v1["a"]["sim_key"].(string)
	file := engine.SimStore{Dir: filepath.Join(dir, "sim")}.Path(key)
	raw, err := os.ReadFile(file)
	if err != nil {
		t.Fatalf("no stored table: %v", err)
	}
	before = engine.SimRuns()
	v2, _ := buildValues(t, p, engine.Options{Cache: &engine.Cache{Dir: dir, Version: "v2"}})
	if n := engine.SimRuns() - before; n != 0 {
		t.Errorf("rebuild ran %d simulations, want 0", n)
	}
	if !reflect.DeepEqual(v1["a"], v2["a"]) {
		t.Errorf("stored table gave other values:\n%v\n%v", v1["a"], v2["a"])
	}
	for name, bad := range map[string][]byte{
		"garbage":   []byte("not a table"),
		"truncated": raw[:len(raw)/2],
		"flipped":   append(append([]byte(nil), raw[:200]...), append([]byte{raw[200] ^ 1}, raw[201:]...)...),
	} {
		if err := os.WriteFile(file, bad, 0o644); err != nil {
			t.Fatal(err)
		}
		before = engine.SimRuns()
		v3, _ := buildValues(t, p, engine.Options{Cache: &engine.Cache{Dir: dir, Version: "v3-" + name}})
		if n := engine.SimRuns() - before; n != 1 {
			t.Errorf("%s entry: %d simulations, want 1", name, n)
		}
		if !reflect.DeepEqual(v1["a"], v3["a"]) {
			t.Errorf("%s entry: values changed", name)
		}
		if now, _ := os.ReadFile(file); !bytes.Equal(now, raw) {
			t.Errorf("%s entry was not replaced by the recomputed table", name)
		}
	}
}

// TestSimEngleGranger: the simulated critical values of the Engle–Granger
// τ (N = 2, case c) lie within 4 MCSE of MacKinnon's (2010) response
// surface at the row's T; the values and the note say they are simulated.
func TestSimEngleGranger(t *testing.T) {
	quietSim(t) // sets the engine's progress writer: not in parallel
	files := map[string]string{"data.csv": syntheticCSV("y", "x", gridlinkSynthetic(200, -0.5))}
	p := writeProject(t, front+"\n"+fence("engle-granger", "id: e\ny: y\nx: [x]\nlags: 1\ncrit: simulate\nreplications: 10000\n"), files)
	v, notes := buildValues(t, p, engine.Options{})
	e := v["e"]
	nobs := e["nobs"].(int)
	crit, mcse := e["crit"].(map[string]any), e["crit_mcse"].(map[string]any)
	for _, l := range []float64{0.01, 0.05, 0.10} {
		want, _ := critical.MacKinnonTau(2, critical.Const, nobs, l)
		got, se := crit[contract.Pct(l)].(float64), mcse[contract.Pct(l)].(float64)
		t.Logf("%s: simulated %.4f (MCSE %.4f), MacKinnon (2010) %.4f", contract.Pct(l), got, se, want)
		if math.Abs(got-want) > 4*se {
			t.Errorf("%s: simulated %.4f, MacKinnon %.4f, 4 MCSE = %.4f", contract.Pct(l), got, want, 4*se)
		}
	}
	if !strings.HasPrefix(e["crit_source"].(string), "simulated: 10,000 replications") || !strings.HasPrefix(e["pvalue_source"].(string), "simulated") {
		t.Errorf("sources %q %q", e["crit_source"], e["pvalue_source"])
	}
	if n := strings.Join(notes["e"], " "); !strings.Contains(n, "Critical values: simulated, 10,000 replications") || strings.Contains(n, "MacKinnon (2010) response surfaces") {
		t.Errorf("note: %s", n)
	}
}

// TestSimJohansen: with crit: simulate the rank test uses simulated
// critical values for each K − r (case rc, checked loosely against the
// asymptotic Osterwald-Lenum table that johansen.CriticalValues carries:
// within 8% at T ≈ 200, where the finite-sample values are known to be
// somewhat larger); the chosen rank follows from them; a vecm from: it
// uses the same rank, also when the johansen result came from the cache.
func TestSimJohansen(t *testing.T) {
	quietSim(t) // sets the engine's progress writer: not in parallel
	p := copyDemo(t)
	src, _ := os.ReadFile(p)
	doc := string(src) + "\n" + fence("johansen", "id: simsys\ndata: grid\nseries: [log(north), log(south), log(fuel)]\ndet: restricted constant\nlags: 1\ncrit: simulate\nreplications: 2000\n") +
		"\n" + fence("vecm", "id: simrel\nfrom: simsys\n")
	if err := os.WriteFile(p, []byte(doc), 0o644); err != nil {
		t.Fatal(err)
	}
	dir := filepath.Join(filepath.Dir(p), ".galley-cache")
	v, notes := buildValues(t, p, engine.Options{Cache: &engine.Cache{Dir: dir, Version: "v1"}})
	s := v["simsys"]
	ct := s["crit_trace"].([]map[string]any)
	for i := range ct {
		tab, _ := johansen.CriticalValues(johansen.RC, johansen.TraceStat, 3-i)
		got := ct[i]["5%"].(float64)
		t.Logf("r=%d: simulated 5%% trace %.3f, tabulated %.3f", i, got, tab[1])
		if rel := got/tab[1] - 1; math.Abs(rel) > 0.08 {
			t.Errorf("r=%d: simulated 5%% trace value %.3f vs %.3f tabulated", i, got, tab[1])
		}
	}
	trace := s["trace"].([]float64)
	want := 3
	for i := range trace {
		if trace[i] <= ct[i]["5%"].(float64) {
			want = i
			break
		}
	}
	if s["rank_chosen"] != want {
		t.Errorf("rank_chosen %v, want %d from the simulated values", s["rank_chosen"], want)
	}
	if len(s["pvalue_trace"].([]float64)) != 3 || !strings.Contains(strings.Join(notes["simsys"], " "), "Monte Carlo standard errors of the simulated critical values") {
		t.Errorf("values or note lack the simulation: %v", notes["simsys"])
	}
	if want > 0 && want < 3 && v["simrel"]["rank"] != want {
		t.Errorf("vecm rank %v, johansen chose %d", v["simrel"]["rank"], want)
	}
	// Rebuild with the result cache: the vecm redoes the analysis and must
	// agree.
	v2, _ := buildValues(t, p, engine.Options{Cache: &engine.Cache{Dir: dir, Version: "v1"}})
	if v2["simrel"]["rank"] != v["simrel"]["rank"] || v2["simsys"]["rank_chosen"] != s["rank_chosen"] {
		t.Errorf("cached rebuild: rank %v / %v", v2["simrel"]["rank"], v2["simsys"]["rank_chosen"])
	}
}

// TestSimBadKeys: bad crit:, replications: and seed: values are errors at
// their line; the former spelling reps: is an error that names
// replications:, in a directive and in a grid (fixed or varied).
func TestSimBadKeys(t *testing.T) {
	quietSim(t) // sets the engine's progress writer: not in parallel
	// Lines: 1–4 front matter, 5 blank, 6 the fence, 7 id, 8 series, 9…
	for _, c := range []struct {
		name, kind, body string
		want             []string
	}{
		{"few replications", "adf", "crit: simulate\nreplications: 50\n", []string{"paper.md:10:", "replications must be 100..10000000, not 50"}},
		{"former reps", "adf", "crit: simulate\nreps: 5000\n", []string{"paper.md:10:", `the key "reps" is now called "replications"`}},
		{"former reps in a grid", "grid", "of: adf\ncrit: simulate\nreps: 5000\nover: {lags: [1, 2]}\n", []string{"paper.md:11:", `the key "reps" of adf is now called "replications"`}},
		{"former reps varied", "grid", "of: adf\ncrit: simulate\nover: {reps: [500, 1000]}\n", []string{"paper.md:11:", `over: the key "reps" of adf is now called "replications"`}},
		{"bogus crit", "adf", "crit: bogus\n", []string{"paper.md:9:", `crit: write simulate`, `not "bogus"`}},
		{"kpss", "kpss", "crit: simulate\n", []string{"paper.md:9:", "crit: simulate is available for adf, ardl, engle-granger, gregory-hansen, johansen, vecm, not for kpss"}},
		{"replications alone", "adf", "replications: 5000\n", []string{"paper.md:9:", "replications applies only with crit: simulate"}},
		{"negative seed", "adf", "crit: simulate\nseed: -3\n", []string{"paper.md:10:", "seed must be zero or more"}},
	} {
		t.Run(c.name, func(t *testing.T) {
			p := macroProject(t, fence(c.kind, "id: a\nseries: infl\n"+c.body))
			d, err := engine.Parse(p, engine.Options{})
			if err == nil {
				err = d.Run()
			}
			if err == nil {
				t.Fatal("no error")
			}
			msg, at := err.Error(), 0
			for _, w := range c.want {
				i := strings.Index(msg[at:], w)
				if i < 0 {
					t.Fatalf("error %q lacks %q", msg, w)
				}
				at += i + len(w)
			}
		})
	}
	t.Run("ols has no crit", func(t *testing.T) {
		p := macroProject(t, fence("ols", "id: m\ny: infl\nx: [realgdp]\ncrit: simulate\n"))
		_, err := engine.Parse(p, engine.Options{})
		if err == nil || !strings.Contains(err.Error(), "paper.md:10:") || !strings.Contains(err.Error(), `unknown key "crit"`) {
			t.Errorf("error %v", err)
		}
	})
	t.Run("small sample", func(t *testing.T) {
		files := map[string]string{"data.csv": syntheticCSV("y", "x", gridlinkSynthetic(120, -0.5))}
		runBad(t, front+"\n"+fence("johansen", "id: j\nseries: [y, x]\nlags: 1\nsmall_sample: true\ncrit: simulate\n"), files, "paper.md:12:", "drop small_sample")
	})
	t.Run("vecm from with crit", func(t *testing.T) {
		files := map[string]string{"data.csv": syntheticCSV("y", "x", gridlinkSynthetic(120, -0.5))}
		runBad(t, front+"\n"+fence("johansen", "id: j\nseries: [y, x]\nlags: 1\n")+fence("vecm", "id: v\nfrom: j\ncrit: simulate\n"),
			files, "paper.md:", "crit cannot be set here")
	})
}
