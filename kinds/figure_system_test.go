package kinds

import (
	"encoding/json"
	"testing"

	"github.com/galley-econ/galley/engine"
)

// The system figures (plot: roots and plot: recursive-rank) through whole
// manuscripts: the recursive eigenvalues and trace statistics against
// statsmodels 0.13.5 coint_johansen run on every subsample (X-form) and the
// numpy 1.24.2 / scipy 1.10.1 implementation of the published equations
// (R-form), both in testdata/fixtures/johansen_recursive.json (script:
// testdata/scripts/johansen_recursive.py), to 1e-6 relative; the roots
// against the johansen result they are drawn from.

type recFixture struct {
	Statsmodels []struct {
		Data     string
		DetOrder int `json:"det_order"`
		KArDiff  int `json:"k_ar_diff"`
		First    int
		Eig      [][]float64
		Trace    [][]float64
	}
	NumpyRecursive []struct {
		Data, Case, Form string
		Lags, First      int
		ImpulseRow       *int `json:"impulse_row"`
		StepRow          *int `json:"step_row"`
		Eig, Trace       [][]float64
	} `json:"numpy_recursive"`
}

func TestSystemFigures(t *testing.T) {
	t.Parallel()
	var fx recFixture
	if err := json.Unmarshal([]byte(sysRead(t, "../testdata/fixtures/johansen_recursive.json")), &fx); err != nil {
		t.Fatal(err)
	}
	// denmark.csv starts 1974Q1; with one lagged difference the estimation
	// sample starts 1974Q3, and its first 20 observations end 1979Q2.
	doc := "---\ntitle: T\ndata:\n  dk: dk.csv\n---\n\n" +
		"The largest other root has modulus {{rt.largest_other %.3f}}; {{rx.label}} ends at {{rx.sample.to}}, " +
		"the first eigenvalue there is {{rx.recursion.eigenvalues.0.values.33 %.3f}} and the trace ratio for rank 1 {{rx.recursion.trace.1.ratio.33 %.2f}}.\n\n" +
		fence("johansen", "id: sys\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: constant\nlags: 1\nrank: 1\n") +
		"\n" + fence("figure", "id: rt\nplot: roots\nof: sys\ncaption: Roots\n") +
		"\n" + fence("figure", "id: rx\nplot: recursive-rank\nof: sys\nfirst: 1979Q2\ncaption: X-form\n") +
		"\n" + fence("figure", "id: rr\nplot: recursive-rank\nof: sys\nfirst: 1979Q2\nform: r\neigenvalues: all\ncaption: R-form\n") +
		"\n" + fence("figure", "id: rd\nplot: recursive-rank\nof: sys\ncaption: default window\n")
	p := writeProject(t, doc, map[string]string{"dk.csv": sysRead(t, "../testdata/data/denmark.csv")})
	d, err := engine.Parse(p, engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := d.Run(); err != nil {
		t.Fatal(err)
	}
	vals := map[string]map[string]any{}
	for _, r := range d.Results() {
		if r.Kind == "figure" && r.Figure == nil {
			t.Errorf("%s: no figure", r.ID)
		}
		b, err := json.Marshal(r.Values)
		if err != nil {
			t.Fatal(err)
		}
		var v map[string]any
		if err := json.Unmarshal(b, &v); err != nil {
			t.Fatal(err)
		}
		vals[r.ID] = v
	}
	for _, id := range []string{"rt", "rx", "rr", "rd"} {
		if files, _ := vals[id]["files"].(map[string]any); files["svg"] != "figures/"+id+".svg" {
			t.Errorf("%s: files = %v", id, vals[id]["files"])
		}
	}

	// The roots drawn are the johansen result's, with K − r = 3 unit roots.
	sysRoots := vals["sys"]["roots"].([]any)
	figRoots := vals["rt"]["roots"].([]any)
	if len(figRoots) != 8 || len(sysRoots) != 8 || vals["rt"]["unit_roots"].(float64) != 3 {
		t.Fatalf("roots: %d drawn, %d estimated, unit roots %v", len(figRoots), len(sysRoots), vals["rt"]["unit_roots"])
	}
	largest := 0.0
	for i := range figRoots {
		a, b := figRoots[i].(map[string]any), sysRoots[i].(map[string]any)
		for _, k := range []string{"re", "im", "modulus"} {
			if a[k] != b[k] {
				t.Errorf("root %d %s: figure %v, johansen %v", i, k, a[k], b[k])
			}
		}
		if i >= 3 {
			largest = max(largest, a["modulus"].(float64))
		}
	}
	if vals["rt"]["largest_other"].(float64) != largest || largest >= 1 {
		t.Errorf("largest_other = %v, want %v (< 1)", vals["rt"]["largest_other"], largest)
	}

	n := 0
	compare := func(id string, eig, trace [][]float64, nEig int) {
		t.Helper()
		rec := vals[id]["recursion"].(map[string]any)
		dates := rec["dates"].([]any)
		if len(dates) != len(eig) || dates[0] != "1979Q2" || dates[len(dates)-1] != "1987Q3" {
			t.Fatalf("%s: %d dates from %v, want %d from 1979Q2 to 1987Q3", id, len(dates), dates[0], len(eig))
		}
		ge, gt := rec["eigenvalues"].([]any), rec["trace"].([]any)
		if len(ge) != nEig || len(gt) != 4 {
			t.Fatalf("%s: %d eigenvalue paths and %d trace paths, want %d and 4", id, len(ge), len(gt), nEig)
		}
		for i := range eig {
			for j := 0; j < nEig; j++ {
				n++
				e := ge[j].(map[string]any)
				if v := e["values"].([]any)[i].(float64); v < e["min"].(float64) || v > e["max"].(float64) {
					t.Errorf("%s: eigenvalue %v at %v = %v lies outside its min and max", id, e["number"], dates[i], v)
				}
				if got := e["values"].([]any)[i].(float64); !sysNear(got, eig[i][j], 1e-6) || e["number"] != float64(j+1) {
					t.Errorf("%s: eigenvalue %v at %v = %.12g, reference %.12g", id, e["number"], dates[i], got, eig[i][j])
				}
			}
			for r := 0; r < 4; r++ {
				n++
				e := gt[r].(map[string]any)
				got := e["values"].([]any)[i].(float64)
				if !sysNear(got, trace[i][r], 1e-6) || e["rank"] != float64(r) {
					t.Errorf("%s: trace r=%v at %v = %.12g, reference %.12g", id, e["rank"], dates[i], got, trace[i][r])
				}
				if ratio := e["ratio"].([]any)[i].(float64); ratio != got/e["crit"].(float64) {
					t.Errorf("%s: ratio r=%d at %v = %v, want trace / %v", id, r, dates[i], ratio, e["crit"])
				}
			}
		}
	}
	for _, c := range fx.Statsmodels {
		if c.Data == "denmark" && c.DetOrder == 0 && c.KArDiff == 1 && c.First == 20 {
			// statsmodels 0.13.5 coint_johansen, each subsample.
			compare("rx", c.Eig, c.Trace, 1)
		}
	}
	for _, c := range fx.NumpyRecursive {
		if c.Data == "denmark" && c.Case == "c" && c.Lags == 1 && c.First == 20 && c.Form == "R" && c.ImpulseRow == nil && c.StepRow == nil {
			// numpy/scipy, the published R-form equations.
			compare("rr", c.Eig, c.Trace, 4)
		}
	}
	if n != 34*5+34*8 {
		t.Errorf("%d values compared, want %d", n, 34*5+34*8)
	}
	if f := vals["rr"]["recursion"].(map[string]any)["form"]; f != "r" {
		t.Errorf("form = %v, want r", f)
	}
	// rejects_from: the first date from which every later sample rejects.
	rec := vals["rx"]["recursion"].(map[string]any)
	dates := rec["dates"].([]any)
	for r, e := range rec["trace"].([]any) {
		e := e.(map[string]any)
		path := e["ratio"].([]any)
		var rejects, accepts any
		for i := len(path) - 1; i >= 0 && path[i].(float64) > 1; i-- {
			rejects = dates[i]
		}
		for i := len(path) - 1; i >= 0 && path[i].(float64) <= 1; i-- {
			accepts = dates[i]
		}
		if e["rejects_from"] != rejects || e["accepts_from"] != accepts {
			t.Errorf("rank %d: rejects_from %v, accepts_from %v; want %v, %v", r, e["rejects_from"], e["accepts_from"], rejects, accepts)
		}
	}
	// The divisors are the 5% critical values of the johansen table.
	for r, e := range rec["trace"].([]any) {
		want := vals["sys"]["crit_trace"].([]any)[r].(map[string]any)["5%"]
		if got := e.(map[string]any)["crit"]; got != want {
			t.Errorf("crit %d = %v, the johansen table's 5%% value is %v", r, got, want)
		}
	}
	// The default first window is a third of the T = 53 observations.
	if got := vals["rd"]["recursion"].(map[string]any)["nobs"].([]any)[0]; got != 18.0 {
		t.Errorf("default first window: %v observations, want 18", got)
	}
}

// TestSystemFigureErrors: mistakes in the system plots are reported at
// their key's line.
func TestSystemFigureErrors(t *testing.T) {
	t.Parallel()
	head := "---\ntitle: T\ndata:\n  dk: dk.csv\n---\n\n" +
		fence("johansen", "id: sys\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: constant\nlags: 1\nrank: 1\n") + "\n" +
		fence("johansen", "id: full\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: constant\nlags: 1\nlevel: 0.01\n") + "\n" +
		fence("ols", "id: m\ndata: dk\ny: LRM\nx: [LRY]\n") + "\n"
	// the figure's fence opens at line 32; its first key is on line 33
	cases := []struct {
		name, body string
		want       []string
	}{
		{"no of", "id: f\nplot: roots\n", []string{"paper.md:32:", "plot roots needs of"}},
		{"of an ols", "id: f\nplot: roots\nof: m\n", []string{"paper.md:35:", `"m"`}},
		{"foreign key", "id: f\nplot: roots\nof: sys\nform: x\n", []string{"paper.md:36:", "does not take form"}},
		{"form elsewhere", "id: f\nplot: lines\ndata: dk\nseries: [LRM]\nfirst: 1980Q1\n", []string{"paper.md:37:", "first belongs to plot recursive-rank"}},
		{"bad form", "id: f\nplot: recursive-rank\nof: sys\nform: z\n", []string{"paper.md:36:", "form: write x"}},
		{"bad eigenvalues", "id: f\nplot: recursive-rank\nof: sys\neigenvalues: 3\n", []string{"paper.md:36:", "eigenvalues: write rank"}},
		{"first too early", "id: f\nplot: recursive-rank\nof: sys\nfirst: 1977Q1\n", []string{"paper.md:36:", "first 1977Q1 leaves 11 observations", "1977Q4 or later"}},
		{"first outside", "id: f\nplot: recursive-rank\nof: sys\nfirst: 1999Q1\n", []string{"paper.md:36:", "not a date of the sample"}},
		{"first unreadable", "id: f\nplot: recursive-rank\nof: sys\nfirst: soon\n", []string{"paper.md:36:", `first "soon"`}},
		{"no vecm roots", "id: f\nplot: roots\nof: full\n", []string{"paper.md:35:", "no companion roots"}},
		{"no vecm recursion", "id: f\nplot: recursive-rank\nof: full\n", []string{"paper.md:35:", "no VECM"}},
		{"three names", "id: f\nplot: roots\nof: sys\nnames: [a, b, c]\n", []string{"paper.md:36:", "two kinds of root"}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			p := writeProject(t, head+fence("figure", tc.body), map[string]string{"dk.csv": sysRead(t, "../testdata/data/denmark.csv")})
			doc, err := engine.Parse(p, engine.Options{})
			if err == nil {
				err = doc.Run()
			}
			if err == nil {
				t.Fatal("no error")
			}
			inOrder(t, err.Error(), tc.want)
		})
	}
}
