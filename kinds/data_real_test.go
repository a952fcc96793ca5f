package kinds

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/coint"
	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/ecm"
	"github.com/galley-econ/galley/analysis/unitroot"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/internal/refdata"
)

// Tests of issue 14 on real data: the macrodata set (US quarterly
// macroeconomic series 1959Q1–2009Q3, T = 203; testdata/data).

// TestFirstUsableDate: every kind that builds lags or differences
// starts at the first observation where each of its terms exists, and
// no later. For a series starting in 1959Q1: Δy_t exists from 1959Q2,
// Δy_{t−p} from observation p + 1, a lead of j periods ends j periods
// before the data. Extra ECM regressors enter at time t, so diff(x)
// among them costs no observation that the lags of Δy do not already
// cost (before the fix, adding one cut the levels and lost a quarter).
func TestFirstUsableDate(t *testing.T) {
	t.Parallel()
	const T = 203
	cases := []struct {
		name, kind, body string
		from             string // the estimation sample's first date; "" = not reported
		nobs             int
	}{
		{"adf lags 2", "adf", "series: log(realgdp)\nlags: 2\n", "", T - 3},
		{"adf lags 0", "adf", "series: log(realgdp)\nlags: 0\n", "", T - 1},
		{"dfgls lags 2", "dfgls", "series: log(realgdp)\nlags: 2\n", "", T - 3},
		{"za lags 2", "za", "series: log(realgdp)\nlags: 2\n", "", T - 3},
		{"pp", "pp", "series: log(realgdp)\n", "", T - 1},
		{"engle-granger lags 2", "engle-granger", "y: log(realcons)\nx: [log(realdpi)]\nlags: 2\n", "", T - 3},
		{"po", "po", "y: log(realcons)\nx: [log(realdpi)]\n", "", T - 1},
		{"ecm lags 1", "ecm", "from: eg\nlags: 1\n", "1959Q3", T - 2},
		{"ecm lags 1, extra diff", "ecm", "from: eg\nlags: 1\nextra: [diff(tbilrate)]\n", "1959Q3", T - 2},
		{"ecm lags 2, extra diff", "ecm", "from: eg\nlags: 2\nextra: [diff(tbilrate)]\n", "1959Q4", T - 3},
		{"ecm lags 0, extra diff", "ecm", "from: eg\nlags: 0\nextra: [diff(tbilrate)]\n", "1959Q2", T - 1},
		{"ecm lags 1, extra lagged diff", "ecm", "from: eg\nlags: 1\nextra:\n  - lag(diff(tbilrate), 2)\n", "1959Q4", T - 3},
		{"ecm lags 1, two extras", "ecm", "from: eg\nlags: 1\nextra: [diff(tbilrate), infl]\n", "1959Q3", T - 2},
		{"dols leads 2 lags 2", "dols", "y: log(realcons)\nx: [log(realdpi)]\nleads: 2\nlags: 2\n", "1959Q4", T - 5},
		{"fmols", "fmols", "y: log(realcons)\nx: [log(realdpi)]\n", "1959Q2", T - 1},
		{"johansen lags 2", "johansen", "series: [log(realcons), log(realdpi)]\nlags: 2\n", "1959Q4", T - 3},
		{"ols with a lagged difference", "ols", "y: diff(log(realcons))\nx:\n  - lag(diff(log(realcons)), 2)\n", "1959Q4", T - 3},
	}
	body := fence("engle-granger", "id: eg\ny: log(realcons)\nx: [log(realdpi)]\nlags: 2\n")
	for i, c := range cases {
		body += fence(c.kind, fmt.Sprintf("id: c%d\n%s", i, c.body))
	}
	v := valuesOf(t, macroProject(t, body))
	for i, c := range cases {
		r := v[fmt.Sprintf("c%d", i)]
		wantNum(t, c.name+" nobs", r["nobs"], float64(c.nobs))
		if c.from != "" {
			if s, _ := r["sample"].(map[string]any); s == nil || s["from"] != c.from {
				t.Errorf("%s: sample %v, want from %s", c.name, r["sample"], c.from)
			}
		}
	}
	// The ECM with an extra regressor is ecm.Estimate on the whole
	// series, the extra's first value missing.
	_, d, _ := refdata.CSV("macrodata")
	lc, ld := logs(d["realcons"]), logs(d["realdpi"])
	eg, err := coint.EngleGranger(lc, [][]float64{ld}, critical.Const, unitroot.LagRule{Lags: 2})
	if err != nil {
		t.Fatal(err)
	}
	dtb := make([]float64, T)
	dtb[0] = math.NaN()
	for i := 1; i < T; i++ {
		dtb[i] = d["tbilrate"][i] - d["tbilrate"][i-1]
	}
	m, err := ecm.Estimate(ecm.Input{Y: lc, YName: "log(realcons)", X: [][]float64{ld}, XNames: []string{"log(realdpi)"}, ECT: eg.Resid,
		Extra: [][]float64{dtb}, ExtraNames: []string{"diff(tbilrate)"}}, ecm.Spec{YLags: 1, XLags: 1})
	if err != nil {
		t.Fatal(err)
	}
	checkECM(t, "ecm with extra", v["c8"], m)
}

func logs(x []float64) []float64 {
	out := make([]float64, len(x))
	for i, v := range x {
		out[i] = math.Log(v)
	}
	return out
}

// isoMacro rewrites macrodata's dates as calendar dates: the first day
// of each quarter (1959-01-01, 1959-04-01, …) or, with end, the last
// (1959-03-31, 1959-06-30, …), as statistical offices publish them.
func isoMacro(t *testing.T, end bool) string {
	t.Helper()
	raw, err := os.ReadFile(filepath.Join(refdata.Root(), "data", "macrodata.csv"))
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimRight(string(raw), "\n"), "\n")
	for i := 1; i < len(lines); i++ {
		var y, q int
		fmt.Sscanf(lines[i], "%4dQ%1d", &y, &q)
		date := fmt.Sprintf("%d-%02d-01", y, 3*q-2)
		if end {
			date = fmt.Sprintf("%d-%02d-%02d", y, 3*q, []int{31, 30, 30, 31}[q-1])
		}
		lines[i] = date + lines[i][6:]
	}
	return strings.Join(lines, "\n") + "\n"
}

// TestCalendarDatedQuarters: the same analyses on quarterly data dated
// 1959Q1, 1959-01-01 or 1959-03-31 give the same numbers, the same
// quarterly defaults, dates and samples; a quarterly sample window
// applies, and the half-life is in quarters (issue 14, item 1).
func TestCalendarDatedQuarters(t *testing.T) {
	t.Parallel()
	body := fence("adf", "id: a\nseries: log(realgdp)\nlags: {select: aic}\nsample: 1975Q1..\n") +
		fence("engle-granger", "id: eg\ny: log(realcons)\nx: [log(realdpi)]\n") +
		fence("ecm", "id: e\nfrom: eg\n") +
		fence("kpss", "id: k\nseries: infl\n")
	raw, _ := os.ReadFile(filepath.Join(refdata.Root(), "data", "macrodata.csv"))
	run := func(csv, alias string) (map[string]*engine.Result, string) {
		p := writeProject(t, "---\ndata:\n  macro: "+alias+"\n---\n\n"+body, map[string]string{"macro.csv": csv})
		r := runDoc(t, p)
		return r, strings.Join(r["e"].Table.Notes, " ")
	}
	want, _ := run(string(raw), "macro.csv")
	for _, c := range []struct{ name, csv, alias string }{
		{"first day", isoMacro(t, false), "macro.csv"},
		{"last day", isoMacro(t, true), "macro.csv"},
		{"declared", isoMacro(t, false), "{path: macro.csv, frequency: quarterly}"},
	} {
		got, notes := run(c.csv, c.alias)
		for id, w := range want {
			if fmt.Sprint(got[id].Values) != fmt.Sprint(w.Values) {
				t.Errorf("%s: %s differs:\n got %v\nwant %v", c.name, id, got[id].Values, w.Values)
			}
		}
		if !strings.Contains(notes, "in quarters") || !strings.Contains(notes, "Sample 1959Q3–2009Q3") {
			t.Errorf("%s: ecm notes %q", c.name, notes)
		}
		if s := got["a"].Values["sample"].(map[string]any); s["from"] != "1975Q1" {
			t.Errorf("%s: adf sample %v", c.name, s)
		}
	}
	// Declared daily: the calendar dates stay days, and a quarterly
	// window is refused.
	p := writeProject(t, "---\ndata:\n  macro: {path: macro.csv, frequency: daily}\n---\n\n"+fence("adf", "id: a\nseries: log(realgdp)\nlags: 1\nsample: 1975Q1..\n"),
		map[string]string{"macro.csv": isoMacro(t, false)})
	d, err := engine.Parse(p, engine.Options{})
	if err == nil {
		err = d.Run()
	}
	if err == nil || !strings.Contains(err.Error(), "paper.md:10:") || !strings.Contains(err.Error(), "the data are daily") {
		t.Errorf("declared daily with a quarterly window: %v", err)
	}
}

// vintageProject: the current data run 2004-01 to 2025-12; the earlier
// vintage "old" ends in 2013-12.
func vintageProject(t *testing.T, body string) string {
	t.Helper()
	raw, err := os.ReadFile(filepath.Join("..", "examples", "gridlink", "data", "gridlink.csv"))
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.SplitAfter(string(raw), "\n")
	old := strings.Join(lines[:121], "")
	return writeProject(t, "---\ndata:\n  grid:\n    path: new.csv\n    vintage:\n      old: old.csv\n---\n\n"+body,
		map[string]string{"new.csv": string(raw), "old.csv": old})
}

func buildErr(t *testing.T, p string, opts engine.Options) (*engine.Document, error) {
	t.Helper()
	d, err := engine.Parse(p, opts)
	if err == nil {
		err = d.Run()
	}
	return d, err
}

// TestVintageWindows: windows written for the current data that run
// past the end of an earlier, shorter vintage are cut to its data, with
// a note naming the vintage, in every kind of vintage build (a revision
// directive's, and --vintage); a window with nothing left is an error
// naming the vintage (issue 14, item 4).
func TestVintageWindows(t *testing.T) {
	t.Parallel()
	body := fence("figure", "id: f\nplot: lines\nseries: [log(north)]\nshade:\n  - {from: 2008-09, to: 2009-06}\n  - {from: 2013-06, to: 2014-06}\n  - {from: 2020-03, to: 2020-12}\n") +
		fence("grid", "id: g\nof: adf\nseries: log(north)\nlags: 1\nover: {sample: [2004-01..2012-12, 2010-01..2019-12]}\n") +
		fence("ols", "id: m\ny: log(north)\nx: [log(fuel)]\nsample: 2005-01..2016-12\n")
	p := vintageProject(t, body+fence("revision", "id: r\nagainst: old\n"))
	if _, err := buildErr(t, p, engine.Options{}); err != nil {
		t.Fatalf("the build with a revision against the shorter vintage failed: %v", err)
	}
	d, err := buildErr(t, vintageProject(t, body), engine.Options{Vintage: "old"})
	if err != nil {
		t.Fatalf("--vintage old: %v", err)
	}
	notes := map[string]string{}
	for _, r := range d.Results() {
		switch {
		case r.Table != nil:
			notes[r.ID] = strings.Join(r.Table.Notes, " ")
		case r.Figure != nil:
			notes[r.ID] = strings.Join(r.Figure.Notes, " ")
		}
		if r.ID == "m" {
			if s := r.Values["sample"].(map[string]any); s["from"] != "2005-01" || s["to"] != "2013-12" {
				t.Errorf("ols sample on vintage old: %v", s)
			}
		}
	}
	for id, want := range map[string][]string{
		"f": {`2013-06 to 2014-06 runs past the data of vintage "old" (2004-01 to 2013-12); it is shaded from 2013-06 to 2013-12`,
			`2020-03 to 2020-12 lies outside the data of vintage "old"`},
		"g": {`Cell g[1] (sample: 2010-01..2019-12): Warning: the sample 2010-01..2019-12 reaches past the data of vintage "old" (2004-01 to 2013-12) and was cut to 2010-01..2013-12.`},
		"m": {`the sample 2005-01..2016-12 reaches past the data of vintage "old"`},
	} {
		for _, w := range want {
			if !strings.Contains(notes[id], w) {
				t.Errorf("%s: notes lack %q:\n%s", id, w, notes[id])
			}
		}
	}
	// Nothing of the window left in the vintage: an error naming it.
	_, err = buildErr(t, vintageProject(t, fence("adf", "id: a\nseries: log(north)\nlags: 1\nsample: 2015-01..2019-12\n")), engine.Options{Vintage: "old"})
	if err == nil || !strings.Contains(err.Error(), "paper.md:13:") || !strings.Contains(err.Error(), `in the build on vintage "old" of data alias "grid"`) {
		t.Errorf("a window past the vintage's end: %v", err)
	}
	// On the current data, a shaded window wholly outside is still an
	// error (a mistyped year), and one that runs past the end is cut.
	_, err = buildErr(t, vintageProject(t, fence("figure", "id: f\nplot: lines\nseries: [log(north)]\nshade:\n  - {from: 2030-01, to: 2030-06}\n")), engine.Options{})
	if err == nil || !strings.Contains(err.Error(), "paper.md:14:") || !strings.Contains(err.Error(), "lies outside the plotted data") {
		t.Errorf("shade outside the current data: %v", err)
	}
	d, err = buildErr(t, vintageProject(t, fence("figure", "id: f\nplot: lines\nseries: [log(north)]\nshade:\n  - {from: 2025-06, to: 2026-06}\n")), engine.Options{})
	if err != nil || !strings.Contains(strings.Join(d.Results()[0].Figure.Notes, " "), "runs past the plotted data (2004-01 to 2025-12); it is shaded from 2025-06 to 2025-12") {
		t.Errorf("shade past the end of the current data: %v", err)
	}
	// ... but a sample past the end of the current data stays an error.
	_, err = buildErr(t, vintageProject(t, fence("adf", "id: a\nseries: log(north)\nlags: 1\nsample: 2020-01..2026-12\n")), engine.Options{})
	if err == nil || !strings.Contains(err.Error(), "ends after the data") {
		t.Errorf("a sample past the current data: %v", err)
	}
}
