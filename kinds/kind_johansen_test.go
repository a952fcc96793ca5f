package kinds

import (
	"encoding/json"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/resultsfile"
)

// sysRead returns a repository file's text.
func sysRead(t *testing.T, path string) string {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

// sysBuild builds a manuscript and returns each result's values as the
// results file holds them (after a JSON round trip).
func sysBuild(t *testing.T, doc string, files map[string]string) map[string]map[string]any {
	t.Helper()
	d, err := engine.Parse(writeProject(t, doc, files), engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := d.Run(); err != nil {
		t.Fatal(err)
	}
	raw, err := d.ResultsJSON("test")
	if err != nil {
		t.Fatal(err)
	}
	var rf resultsfile.File
	if err := json.Unmarshal(raw, &rf); err != nil {
		t.Fatal(err)
	}
	out := map[string]map[string]any{}
	for _, r := range rf.Results {
		out[r.ID] = r.Values
	}
	return out
}

// at walks a results-file value: map keys or list indices.
func sysAt(t *testing.T, v any, path ...any) float64 {
	t.Helper()
	for _, p := range path {
		switch k := p.(type) {
		case string:
			m, ok := v.(map[string]any)
			if !ok {
				t.Fatalf("%v: not a map at %q", path, k)
			}
			v = m[k]
		case int:
			l, ok := v.([]any)
			if !ok || k >= len(l) {
				t.Fatalf("%v: not a list long enough at %d", path, k)
			}
			v = l[k]
		}
	}
	f, ok := v.(float64)
	if !ok {
		t.Fatalf("%v: %v is not a number", path, v)
	}
	return f
}

func sysNear(got, want, tol float64) bool {
	return math.Abs(got-want) <= tol*math.Max(1, math.Abs(want))
}

// sysDenmark reads LRM, LRY, IBO, IDE from testdata/data/denmark.csv.
func sysDenmark(t *testing.T) *mat.Dense {
	t.Helper()
	f, err := series.ReadCSV(strings.NewReader(sysRead(t, "../testdata/data/denmark.csv")), "denmark.csv")
	if err != nil {
		t.Fatal(err)
	}
	names := []string{"LRM", "LRY", "IBO", "IDE"}
	var cols [][]float64
	for _, n := range names {
		e, _ := series.ParseExpr(n)
		s, err := series.Eval(e, f)
		if err != nil {
			t.Fatal(err)
		}
		cols = append(cols, s.Values)
	}
	y := mat.NewDense(len(cols[0]), len(cols), nil)
	for j, c := range cols {
		for i, v := range c {
			y.Set(i, j, v)
		}
	}
	return y
}

const sysDKFront = "---\ntitle: T\ndata:\n  dk: data.csv\n---\n"

// The Danish money-demand system, case rc (urca's ecdet = "const"), one
// lagged difference (urca K = 2), with the restriction tests that
// testdata/scripts/johansen_urca.R runs.
const sysDKDoc = sysDKFront + "\n```galley johansen\nid: dk\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\nrank: 1\nnormalize: LRM\n" +
	"restrict:\n  homog: \"LRM = -LRY\"\n  homog2: [\"LRM = -LRY\", \"IBO = -IDE\"]\nexogeneity_tests: [LRY, [LRY, IBO]]\n```\n\n" +
	"```galley vecm\nid: dkv\nfrom: dk\nshow: short-run\n```\n"

// TestJohansenDenmarkUrca checks the values a manuscript reports against
// R's urca 1.3.3 (testdata/fixtures/johansen_urca.json, written by
// testdata/scripts/johansen_urca.R): ca.jo eigenvalues and statistics,
// cajorls β normalised on LRM, blrtest and alrtest. Tolerance 1e-6 relative.
func TestJohansenDenmarkUrca(t *testing.T) {
	t.Parallel()
	var fx struct {
		Cajo []struct {
			Ecdet                 string
			K                     int
			Lambda, Trace, Maxeig []float64
		}
		Cajorls []struct {
			Ecdet string
			K     int
			Beta  []float64
		}
		Tests []struct {
			Kind, Name, Ecdet string
			K                 int
			Stat, P           float64
			DF                int
		}
	}
	if err := json.Unmarshal([]byte(sysRead(t, "../testdata/fixtures/johansen_urca.json")), &fx); err != nil {
		t.Fatal(err)
	}
	vals := sysBuild(t, sysDKDoc, map[string]string{"data.csv": sysRead(t, "../testdata/data/denmark.csv")})["dk"]
	checked := 0
	for _, c := range fx.Cajo {
		if c.Ecdet != "const" || c.K != 2 {
			continue
		}
		for r := 0; r < 4; r++ {
			for _, f := range []struct {
				key  string
				want float64
			}{{"eig", c.Lambda[r]}, {"trace", c.Trace[r]}, {"maxeig", c.Maxeig[r]}} {
				if got := sysAt(t, vals, f.key, r); !sysNear(got, f.want, 1e-6) {
					t.Errorf("%s[%d] = %.10g, urca %.10g", f.key, r, got, f.want)
				}
				checked++
			}
		}
	}
	coefs := []string{"LRM", "LRY", "IBO", "IDE", "const"}
	for _, c := range fx.Cajorls {
		if c.Ecdet != "const" || c.K != 2 {
			continue
		}
		for i, n := range coefs {
			if got := sysAt(t, vals, "beta", 0, n); !sysNear(got, c.Beta[i], 1e-6) {
				t.Errorf("beta[%s] = %.10g, urca %.10g", n, got, c.Beta[i])
			}
			checked++
		}
	}
	names := map[string]string{"LRM = -LRY": "homog", "LRM = -LRY, IBO = -IDE": "homog2", "LRY weakly exogenous": "exog(LRY)", "LRY and IBO weakly exogenous": "exog(LRY,IBO)"}
	tests := vals["tests"].([]any)
	for _, ft := range fx.Tests {
		if ft.Ecdet != "const" || ft.K != 2 {
			continue
		}
		found := false
		for i, e := range tests {
			if e.(map[string]any)["name"] != names[ft.Name] {
				continue
			}
			found = true
			if got := sysAt(t, tests, i, "stat"); !sysNear(got, ft.Stat, 1e-6) {
				t.Errorf("%s: LR = %.10g, urca %.10g", ft.Name, got, ft.Stat)
			}
			if got := sysAt(t, tests, i, "p"); !sysNear(got, ft.P, 1e-6) {
				t.Errorf("%s: p = %.10g, urca %.10g", ft.Name, got, ft.P)
			}
			if got := sysAt(t, tests, i, "df"); int(got) != ft.DF {
				t.Errorf("%s: df = %v, urca %d", ft.Name, got, ft.DF)
			}
			checked += 3
		}
		if !found {
			t.Errorf("no test for urca's %q", ft.Name)
		}
	}
	if checked != 12+5+12 {
		t.Fatalf("checked %d values; the fixture lacks the rc, one-lag runs", checked)
	}
}

// TestJohansenDenmarkWiring: every value in the results file equals what
// the analysis package returns for the same system (names, orders and
// normalisation carried through unchanged).
func TestJohansenDenmarkWiring(t *testing.T) {
	t.Parallel()
	all := sysBuild(t, sysDKDoc, map[string]string{"data.csv": sysRead(t, "../testdata/data/denmark.csv")})
	vals, sv := all["dk"], all["dkv"]
	res, err := johansen.Test(sysDenmark(t), johansen.RC, 1)
	if err != nil {
		t.Fatal(err)
	}
	const tol = 1e-12
	check := func(what string, got, want float64) {
		t.Helper()
		if !sysNear(got, want, tol) {
			t.Errorf("%s = %.15g, analysis %.15g", what, got, want)
		}
	}
	ct, _ := res.Critical(johansen.TraceStat)
	cm, _ := res.Critical(johansen.MaxEigStat)
	for r := 0; r < 4; r++ {
		check(fmt.Sprint("eig ", r), sysAt(t, vals, "eig", r), res.Eigenvalues[r])
		check(fmt.Sprint("trace ", r), sysAt(t, vals, "trace", r), res.Trace[r])
		check(fmt.Sprint("maxeig ", r), sysAt(t, vals, "maxeig", r), res.MaxEig[r])
		for i, l := range []string{"10%", "5%", "1%"} {
			check("crit_trace "+l, sysAt(t, vals, "crit_trace", r, l), ct[r][i])
			check("crit_maxeig "+l, sysAt(t, vals, "crit_maxeig", r, l), cm[r][i])
		}
	}
	chosen, _ := res.Rank(0.05, false)
	check("rank_chosen", sysAt(t, vals, "rank_chosen"), float64(chosen))
	check("rank", sysAt(t, vals, "rank"), 1)
	check("nobs", sysAt(t, vals, "nobs"), float64(res.T))
	check("lags", sysAt(t, vals, "lags"), 1)
	v, err := res.Estimate(1, []int{0})
	if err != nil {
		t.Fatal(err)
	}
	names := []string{"LRM", "LRY", "IBO", "IDE"}
	for i, n := range append(names, "const") {
		check("beta "+n, sysAt(t, vals, "beta", 0, n), v.Beta.At(i, 0))
		check("beta_se "+n, sysAt(t, vals, "beta_se", 0, n), v.BetaSE.At(i, 0))
	}
	for i, n := range names {
		check("alpha "+n, sysAt(t, vals, "alpha", 0, n), v.Alpha.At(i, 0))
		check("alpha_se "+n, sysAt(t, vals, "alpha_se", 0, n), v.AlphaSE.At(i, 0))
	}
	we, _ := res.WeakExogeneity(1, 1, 2)
	check("exog(LRY,IBO)", sysAt(t, vals, "tests", 3, "stat"), we.Stat)
	// vecm from: the same system; short-run terms Δy_{t−1} in series order.
	for k, tm := range v.Terms {
		for eq, n := range names {
			got := sysAt(t, sv, "short", k, n, "est")
			check(fmt.Sprintf("short %d %s", k, n), got, v.Short.At(eq, k))
			check(fmt.Sprintf("short se %d %s", k, n), sysAt(t, sv, "short", k, n, "se"), v.ShortSE.At(eq, k))
		}
		if term := sv["short"].([]any)[k].(map[string]any)["term"]; term != fmt.Sprintf("lag%d:%s", tm.Lag, names[tm.Series]) {
			t.Errorf("short-run term %d is %v", k, term)
		}
	}
	if sv["det"] != "restricted constant" || vals["det"] != "restricted constant" {
		t.Errorf("det = %v / %v", vals["det"], sv["det"])
	}
}

// TestJohansenSmallSampleAndLagChoice: small_sample multiplies the
// statistics by (T − K(k+1))/T; lags: {select: …} uses LagOrder's choice.
func TestJohansenSmallSampleAndLagChoice(t *testing.T) {
	t.Parallel()
	doc := sysDKFront + "\n```galley johansen\nid: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: {select: hq, max: 3}\nsmall_sample: true\n```\n\n" +
		"```galley var-lags\nid: vl\nseries: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nmax: 3\n```\n"
	all := sysBuild(t, doc, map[string]string{"data.csv": sysRead(t, "../testdata/data/denmark.csv")})
	y := sysDenmark(t)
	lt, err := johansen.LagOrder(y, johansen.RC, 3)
	if err != nil {
		t.Fatal(err)
	}
	vals := all["dk"]
	if got := sysAt(t, vals, "lags"); int(got) != lt.HQ {
		t.Fatalf("lags = %v, LagOrder's HQ choice %d", got, lt.HQ)
	}
	res, _ := johansen.Test(y, johansen.RC, lt.HQ)
	f := float64(res.T-4*(lt.HQ+1)) / float64(res.T)
	for r := 0; r < 4; r++ {
		if got := sysAt(t, vals, "trace", r); !sysNear(got, f*res.Trace[r], 1e-12) {
			t.Errorf("trace[%d] = %g, want %g", r, got, f*res.Trace[r])
		}
	}
	vl := all["vl"]
	for _, c := range []struct {
		key  string
		want int
	}{{"aic", lt.AIC}, {"bic", lt.BIC}, {"hq", lt.HQ}, {"nobs", lt.T}} {
		if got := sysAt(t, vl, c.key); int(got) != c.want {
			t.Errorf("var-lags %s = %v, want %d", c.key, got, c.want)
		}
	}
	for i, r := range lt.Rows {
		if got := sysAt(t, vl, "rows", i, "aic"); !sysNear(got, r.AIC, 1e-12) {
			t.Errorf("var-lags row %d AIC = %g, want %g", i, got, r.AIC)
		}
	}
}

// TestJohansenDemoRank: on the gridlink demo data (generated with two
// cointegrating relations among log north, log south and log fuel, see
// examples/gridlink/gen/main.go) the sequential trace tests at 5% in the
// demo's specification (case c, lags by BIC up to 12) choose rank 2.
func TestJohansenDemoRank(t *testing.T) {
	t.Parallel()
	doc := "---\ntitle: T\ndata:\n  grid: data.csv\n---\n\n```galley johansen\nid: sys\nseries: [log(north), log(south), log(fuel)]\ndet: constant\nlags: {select: bic, max: 12}\nnormalize: [log(north), log(south)]\nexogeneity_tests: [log(fuel)]\n```\n"
	vals := sysBuild(t, doc, map[string]string{"data.csv": sysRead(t, "../examples/gridlink/data/gridlink.csv")})["sys"]
	if r := sysAt(t, vals, "rank_chosen"); r != 2 {
		t.Fatalf("sequential rank = %v, want 2 (trace %v, 5%% critical values %v)", r, vals["trace"], vals["crit_trace"])
	}
	// Both relations' fuel coefficient is −0.80 in the generating process.
	for j := 0; j < 2; j++ {
		if b := sysAt(t, vals, "beta", j, "log(fuel)"); math.Abs(b+0.8) > 0.2 {
			t.Errorf("relation %d: β on log(fuel) = %.3f, generating value −0.80", j+1, b)
		}
	}
}

// sysWalks is a CSV of k independent seeded random walks.
func sysWalks(k, n int) string {
	r := rand.New(rand.NewPCG(7, 11))
	var b strings.Builder
	b.WriteString("date")
	for j := 0; j < k; j++ {
		fmt.Fprintf(&b, ",s%d", j)
	}
	b.WriteString("\n")
	lv := make([]float64, k)
	for i := 0; i < n; i++ {
		fmt.Fprintf(&b, "%d-%02d", 2000+i/12, i%12+1)
		for j := range lv {
			lv[j] += r.NormFloat64()
			fmt.Fprintf(&b, ",%.6f", lv[j])
		}
		b.WriteString("\n")
	}
	return b.String()
}

// TestJohansenBadInput: each bad input gives an error at the line of the
// key responsible.
func TestJohansenBadInput(t *testing.T) {
	t.Parallel()
	dk := map[string]string{"data.csv": sysRead(t, "../testdata/data/denmark.csv")}
	jo := func(body string) string { return sysDKFront + "\n" + fence("johansen", "id: j\n"+body) }
	// Line numbers: the front matter is lines 1–5, the fence line 7, id 8.
	twelve := make([]string, 12)
	for i := range twelve {
		twelve[i] = fmt.Sprintf("s%d", i)
	}
	walks := sysWalks(12, 150)
	sing := "date,a,b,c,d\n"
	for i := 0; i < 60; i++ {
		x := math.Sin(float64(i)) + float64(i)/10
		sing += fmt.Sprintf("2000-%02d-01,%g,%g,%g,%g\n", 0, x, 5.0, x*x/7+math.Cos(float64(i)), x)
	}
	sing = strings.ReplaceAll(sing, "2000-00-01,", "")
	// Build a monthly index for the singular-data file.
	var sb strings.Builder
	for i, line := range strings.Split(strings.TrimSpace(sing), "\n") {
		if i == 0 {
			sb.WriteString(line + "\n")
			continue
		}
		fmt.Fprintf(&sb, "%d-%02d,%s\n", 2000+(i-1)/12, (i-1)%12+1, line)
	}
	sing = sb.String()

	cases := []struct {
		name  string
		doc   string
		files map[string]string
		want  []string
	}{
		{"more series than tabulated", sysDKFront + "\n" + fence("johansen", "id: j\nseries: ["+strings.Join(twelve, ", ")+"]\ndet: restricted constant\nlags: 0\n"),
			map[string]string{"data.csv": walks}, []string{"paper.md:9:", "12 series", "1..11"}},
		{"rank beyond K−1", jo("series: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\nrank: 4\n"), dk,
			[]string{"paper.md:12:", "rank 4", "1..3"}},
		{"too few observations for the lags", jo("series: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 12\n"), dk,
			[]string{"paper.md:11:", "too few observations"}},
		{"too few observations for the lag search", jo("series: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: {select: aic, max: 14}\n"), dk,
			[]string{"paper.md:11:", "too few observations"}},
		{"constant series", jo("series: [a, b, c]\ndet: restricted constant\nlags: 1\n"), map[string]string{"data.csv": sing},
			[]string{"paper.md:9:", `series "b" is constant`, "singular"}},
		{"duplicated series", jo("series: [a, c, d]\ndet: restricted constant\nlags: 1\n"), map[string]string{"data.csv": sing},
			[]string{"paper.md:9:", `series "a" and "d" are identical`, "singular"}},
		{"series listed twice", jo("series: [LRM, LRY, LRM]\nlags: 1\n"), dk,
			[]string{"paper.md:9:", `"LRM" is listed twice`}},
		{"one series", jo("series: [LRM]\nlags: 1\n"), dk,
			[]string{"paper.md:9:", "at least two series"}},
		{"no lags", jo("series: [LRM, LRY]\n"), dk,
			[]string{"paper.md:7:", `"lags" is required`}},
		{"bad lags", jo("series: [LRM, LRY]\nlags: tstat\n"), dk,
			[]string{"paper.md:10:", "aic, bic, hq"}},
		{"bad case", jo("series: [LRM, LRY]\ndet: ctt\nlags: 1\n"), dk,
			[]string{"paper.md:10:", `"ctt" is not a case`}},
		{"bad level", jo("series: [LRM, LRY]\nlags: 1\nlevel: 0.2\n"), dk,
			[]string{"paper.md:11:", "0.10, 0.05 or 0.01"}},
		{"normalize not a series", jo("series: [LRM, LRY, IBO]\nlags: 1\nrank: 1\nnormalize: LRX\n"), dk,
			[]string{"paper.md:12:", `"LRX" is not one of the series`, "did you mean LRM?"}},
		{"restrict unknown coefficient", jo("series: [LRM, LRY, IBO]\nlags: 1\nrank: 1\nrestrict:\n  h: \"LRM = -LRZ\"\n"), dk,
			[]string{"paper.md:12:", `"LRZ" is not one of the terms (LRM, LRY, IBO) (did you mean LRM?)`}},
		{"restrict const outside rc", jo("series: [LRM, LRY, IBO]\ndet: constant\nlags: 1\nrank: 1\nrestrict:\n  h: \"const = 0\"\n"), dk,
			[]string{"paper.md:13:", "const row only in the restricted constant case"}},
		{"restrict without equals", jo("series: [LRM, LRY, IBO]\nlags: 1\nrank: 1\nrestrict:\n  h: \"LRM + LRY\"\n"), dk,
			[]string{"paper.md:12:", `write one "=" per equation`}},
		{"restrict dependent equations", jo("series: [LRM, LRY, IBO]\nlags: 1\nrank: 1\nrestrict:\n  h: [\"LRM = -LRY\", \"2 LRM + 2*LRY = 0\"]\n"), dk,
			[]string{"paper.md:12:", "not independent"}},
		{"exogenous leaves too few", jo("series: [LRM, LRY, IBO]\nlags: 1\nrank: 2\nexogeneity_tests: [[LRM, LRY]]\n"), dk,
			[]string{"paper.md:12:", "exogeneity_tests at rank 2"}},
		{"tests but rank 0 or K", jo("series: [LRM, LRY]\ndet: restricted constant\nlags: 1\nexogeneity_tests: [LRY]\n"), dk,
			[]string{"paper.md:7:", "choose rank", "set rank:"}},
		{"vecm with neither", sysDKFront + "\n" + fence("vecm", "id: v\n"), dk,
			[]string{"paper.md:7:", "give from:"}},
		{"vecm from and keys", sysDKFront + "\n" + fence("johansen", "id: j\nseries: [LRM, LRY]\nlags: 1\n") + "\n" + fence("vecm", "id: v\nfrom: j\nlags: 2\n"), dk,
			[]string{"paper.md:16:", "lags cannot be set here"}},
		{"vecm from wrong kind", sysDKFront + "\n" + fence("var-lags", "id: j\nseries: [LRM, LRY]\n") + "\n" + fence("vecm", "id: v\nfrom: j\n"), dk,
			[]string{"paper.md:14:", "var-lags result", "johansen"}},
		{"vecm bad show", sysDKFront + "\n" + fence("vecm", "id: v\nseries: [LRM, LRY]\nlags: 1\nshow: gamma\n"), dk,
			[]string{"paper.md:11:", "relations", "short-run"}},
	}
	// A case without a critical-value table errors at det; once the table
	// exists, the same manuscript must build.
	noTable := jo("series: [LRM, LRY, IBO, IDE]\ndet: none\nlags: 1\n")
	if _, err := johansen.CriticalValues(johansen.N, johansen.TraceStat, 1); err != nil {
		cases = append(cases, struct {
			name  string
			doc   string
			files map[string]string
			want  []string
		}{"case without a table", noTable, dk, []string{"paper.md:10:", "case n"}})
	} else {
		sysBuild(t, noTable, dk)
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			p := writeProject(t, tc.doc, tc.files)
			doc, err := engine.Parse(p, engine.Options{})
			if err == nil {
				err = doc.Check()
			}
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

// TestJohansenVecmAfterCache: a vecm whose johansen result is reused from
// the cache (so that directive did not run) still reports the same model.
func TestJohansenVecmAfterCache(t *testing.T) {
	t.Parallel()
	files := map[string]string{"data.csv": sysRead(t, "../testdata/data/denmark.csv")}
	p := writeProject(t, sysDKDoc, files)
	opts := engine.Options{Cache: &engine.Cache{Dir: t.TempDir(), Version: "test"}}
	run := func() map[string]any {
		d, err := engine.Parse(p, opts)
		if err != nil {
			t.Fatal(err)
		}
		if err := d.Run(); err != nil {
			t.Fatal(err)
		}
		for _, r := range d.Results() {
			if r.ID == "dkv" {
				return r.Values
			}
		}
		t.Fatal("no dkv result")
		return nil
	}
	first := run()
	// A new caption on the vecm only: dk comes from the cache, dkv runs.
	src := strings.Replace(sysDKDoc, "show: short-run\n", "show: short-run\ncaption: Short run\n", 1)
	if err := os.WriteFile(p, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	second := run()
	for k := 0; k < 4; k++ {
		a := first["short"].([]map[string]any)[k]["LRM"].(map[string]any)["est"]
		b := second["short"].([]map[string]any)[k]["LRM"].(map[string]any)["est"]
		if a != b {
			t.Errorf("short-run term %d: %v before, %v after the cache", k, a, b)
		}
	}
}

// TestJohansenRelationFigure: a figure of a johansen (or vecm) relation
// draws β_j'ỹ_t for every observation of the levels, with ỹ_t = (y_t, 1)
// in case rc and (y_t, t+1) in case rt, less its sample mean in the cases
// with an unrestricted constant (c, rt). Expected values: β from
// analysis/johansen Estimate on the Danish data (testdata/data/denmark.csv),
// the relation formed here (tolerance 1e-10). A check of the series'
// timing: regressing Δy_it by least squares (analysis/ols) on the
// unrestricted deterministic terms, the plotted relations at t−1 and
// Δy_{t−1} must reproduce the loadings α_i that the johansen result reports
// (α̂ = S01β(β'S11β)⁻¹ is that regression's coefficient by Frisch–Waugh;
// tolerance 1e-8 relative), which fails if a relation is shifted by a
// period, or in case rc if its restricted constant is left out.
func TestJohansenRelationFigure(t *testing.T) {
	t.Parallel()
	y := sysDenmark(t)
	n, k := y.Dims()
	files := map[string]string{"data.csv": sysRead(t, "../testdata/data/denmark.csv")}
	for _, tc := range []struct {
		det  string
		cs   johansen.Case
		rank int
		from string // "vecm": the figure names a vecm built from the johansen
	}{
		{"rc", johansen.RC, 1, ""},
		{"rt", johansen.RT, 2, "vecm"},
		{"c", johansen.C, 2, ""},
		{"n", johansen.N, 1, "vecm"},
	} {
		t.Run(tc.det, func(t *testing.T) {
			res, err := johansen.Test(y, tc.cs, 1)
			if err != nil {
				t.Fatal(err)
			}
			norm := []int{0, 1}[:tc.rank]
			m, err := res.Estimate(tc.rank, norm)
			if err != nil {
				t.Fatal(err)
			}
			target := "dk"
			doc := sysDKFront + "\n" + fence("johansen", fmt.Sprintf("id: dk\ndata: dk\nseries: [LRM, LRY, IBO, IDE]\ndet: %s\nlags: 1\nrank: %d\nnormalize: [%s]\n", engine.SystemCaseWords[tc.cs], tc.rank, strings.Join([]string{"LRM", "LRY"}[:tc.rank], ", ")))
			if tc.from == "vecm" {
				doc += "\n" + fence("vecm", "id: dkv\nfrom: dk\n")
				target = "dkv"
			}
			for j := 1; j <= tc.rank; j++ {
				doc += "\n" + fence("figure", fmt.Sprintf("id: z%d\nresiduals: %s\nrelation: %d\n", j, target, j))
			}
			d, err := engine.Parse(writeProject(t, doc, files), engine.Options{})
			if err != nil {
				t.Fatal(err)
			}
			if err := d.Run(); err != nil {
				t.Fatal(err)
			}
			byID := map[string]*engine.Result{}
			for _, r := range d.Results() {
				byID[r.ID] = r
			}
			plotted := make([][]float64, tc.rank)
			for j := 0; j < tc.rank; j++ {
				want := make([]float64, n)
				var mean float64
				for r := 0; r < n; r++ {
					for i := 0; i < k; i++ {
						want[r] += m.Beta.At(i, j) * y.At(r, i)
					}
					switch tc.cs {
					case johansen.RC:
						want[r] += m.Beta.At(k, j)
					case johansen.RT:
						want[r] += m.Beta.At(k, j) * float64(r+1)
					}
					mean += want[r] / float64(n)
				}
				if tc.cs != johansen.C && tc.cs != johansen.RT {
					mean = 0
				}
				rel := byID[fmt.Sprintf("z%d", j+1)].Values["relation"].(map[string]any)
				got := rel["values"].([]float64)
				if len(got) != n {
					t.Fatalf("relation %d: %d values plotted, want %d (every observation)", j+1, len(got), n)
				}
				if dates := rel["dates"].([]string); dates[0] != "1974Q1" || dates[n-1] != "1987Q3" {
					t.Errorf("relation %d runs %s–%s, want 1974Q1–1987Q3", j+1, dates[0], dates[n-1])
				}
				if mr := rel["mean_removed"].(float64); math.Abs(mr-mean) > 1e-10*math.Max(1, math.Abs(mean)) {
					t.Errorf("relation %d: mean removed %.12g, want %.12g", j+1, mr, mean)
				}
				for r := range got {
					if !sysNear(got[r], want[r]-mean, 1e-10) {
						t.Fatalf("relation %d at row %d: plotted %.14g, β'ỹ from Estimate %.14g", j+1, r, got[r], want[r]-mean)
					}
				}
				plotted[j] = got
			}
			// Δy_it on [unrestricted terms, plotted relations at t−1, Δy_{t−1}], t = 2 … n−1
			du := map[johansen.Case]int{johansen.N: 0, johansen.RC: 0, johansen.C: 1, johansen.RT: 1, johansen.CT: 2}[tc.cs]
			rows := n - 2
			x := mat.NewDense(rows, du+tc.rank+k, nil)
			for r := 0; r < rows; r++ {
				s := r + 2
				if du >= 1 {
					x.Set(r, 0, 1)
				}
				for j := 0; j < tc.rank; j++ {
					x.Set(r, du+j, plotted[j][s-1])
				}
				for i := 0; i < k; i++ {
					x.Set(r, du+tc.rank+i, y.At(s-1, i)-y.At(s-2, i))
				}
			}
			names := []string{"LRM", "LRY", "IBO", "IDE"}
			for i := 0; i < k; i++ {
				dy := make([]float64, rows)
				for r := range dy {
					dy[r] = y.At(r+2, i) - y.At(r+1, i)
				}
				fit, err := ols.Regress(dy, x)
				if err != nil {
					t.Fatal(err)
				}
				for j := 0; j < tc.rank; j++ {
					alpha := byID["dk"].Values["alpha"].([]map[string]any)[j][names[i]].(float64)
					if !sysNear(fit.Coef[du+j], alpha, 1e-8) {
						t.Errorf("Δ%s on relation %d at t−1: least squares %.12g, the result's α %.12g", names[i], j+1, fit.Coef[du+j], alpha)
					}
				}
			}
		})
	}
}
