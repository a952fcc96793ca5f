package kinds

import (
	"encoding/json"
	"strconv"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/write/markdown"
)

// TestJohansenDummiesUrca: the seasonal, impulse, shift and extra keys of a
// manuscript reproduce R urca 1.3-3 ca.jo(season = 4, dumvar = ...) and a
// base-R reduced-rank regression with a restricted step
// (testdata/fixtures/johansen_dummies_urca.json, written by
// testdata/scripts/johansen_dummies_urca.R) to 1e-6 relative.
func TestJohansenDummiesUrca(t *testing.T) {
	t.Parallel()
	var fx struct {
		Runs []struct {
			Name                        string
			Lambda, Trace, Maxeig, Beta []float64
		}
	}
	if err := json.Unmarshal([]byte(sysRead(t, "../testdata/fixtures/johansen_dummies_urca.json")), &fx); err != nil {
		t.Fatal(err)
	}
	base := "series: [LRM, LRY, IBO, IDE]\nlags: 1\nrank: 1\nnormalize: LRM\nseasonal: true\n"
	docs := map[string]string{
		"season4_const":   base + "det: restricted constant\n",
		"season4_none":    base + "det: constant\n",
		"dummies_none":    base + "det: constant\nimpulse: [1983Q1]\nshift: [1983Q1]\nextra: [diff(LPY)]\n",
		"restricted_step": base + "det: restricted constant\nshift: 1983Q1\n",
	}
	doc := sysDKFront
	for name, body := range docs {
		doc += "\n" + fence("johansen", "id: "+strings.ReplaceAll(name, "_", "")+"\ndata: dk\n"+body)
	}
	all := sysBuild(t, doc, map[string]string{"data.csv": sysRead(t, "../testdata/data/denmark.csv")})
	for _, run := range fx.Runs {
		vals := all[strings.ReplaceAll(run.Name, "_", "")]
		if vals == nil {
			t.Fatalf("no result for %s", run.Name)
		}
		for r := 0; r < 4; r++ {
			for _, f := range []struct {
				key  string
				want float64
			}{{"eig", run.Lambda[r]}, {"trace", run.Trace[r]}, {"maxeig", run.Maxeig[r]}} {
				if got := sysAt(t, vals, f.key, r); !sysNear(got, f.want, 1e-6) {
					t.Errorf("%s: %s[%d] = %.10g, reference %.10g", run.Name, f.key, r, got, f.want)
				}
			}
		}
		coefs := []string{"LRM", "LRY", "IBO", "IDE"}
		switch run.Name {
		case "season4_const":
			coefs = append(coefs, "const")
		case "restricted_step":
			coefs = append(coefs, "const", "shift(1983Q1)")
		}
		for i, n := range coefs {
			if got := sysAt(t, vals, "beta", 0, n); !sysNear(got, run.Beta[i], 1e-6) {
				t.Errorf("%s: beta[%s] = %.10g, reference %.10g", run.Name, n, got, run.Beta[i])
			}
		}
	}
}

// The step's notes, the short-run labels of the dummies, and the errors.
func TestJohansenDummiesNotesAndErrors(t *testing.T) {
	t.Parallel()
	dk := map[string]string{"data.csv": sysRead(t, "../testdata/data/denmark.csv")}
	jo := func(body string) string {
		return sysDKFront + "\n" + fence("johansen", "id: j\ndata: dk\n"+body)
	}
	doc, err := engine.Parse(writeProject(t, jo("series: [LRM, LRY, IBO, IDE]\ndet: restricted constant\nlags: 1\nrank: 1\nseasonal: true\nshift: 1983Q1\n")+"\n"+fence("vecm", "id: v\nfrom: j\nshow: short-run\n"), dk), engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := doc.Run(); err != nil {
		t.Fatal(err)
	}
	md, err := markdown.Write(doc, markdown.Options{})
	if err != nil {
		t.Fatal(err)
	}
	for _, w := range []string{"step dummies inside the relations", "Johansen, Mosconi and Nielsen 2000", "Impulse 1983Q2 (shift)", "Season Q1 (centred)", "Impulse 1983Q1 (shift)"} {
		if !strings.Contains(string(md), w) {
			t.Errorf("output lacks %q", w)
		}
	}
	cases := []struct {
		name, body string
		want       []string
	}{
		{"old exogenous key", "series: [LRM, LRY]\nlags: 1\nexogenous: [LRY]\n", []string{"paper.md:12:", "exogeneity_tests"}},
		{"shift in case n", "series: [LRM, LRY]\ndet: none\nlags: 1\nshift: 1983Q1\n", []string{"paper.md:13:", "case n"}},
		{"shift outside the sample", "series: [LRM, LRY]\nlags: 1\nshift: 1990Q1\n", []string{"paper.md:12:", "1990Q1", "not a date of the sample"}},
		{"impulse in the lag rows", "series: [LRM, LRY]\nlags: 1\nimpulse: [1983Q1, 1974Q2]\n", []string{"paper.md:12:", "1974Q2", "only supply lags"}},
		{"impulse not a date", "series: [LRM, LRY]\nlags: 1\nimpulse: [soon]\n", []string{"paper.md:12:", "not a date"}},
		{"impulse twice via shift", "series: [LRM, LRY]\ndet: restricted constant\nlags: 1\nshift: 1983Q1\nimpulse: 1983Q2\n", []string{"1983Q2 twice"}},
		{"extra is a series", "series: [LRM, LRY]\nlags: 1\nextra: [LRY]\n", []string{"paper.md:12:", "one of the series"}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			doc, err := engine.Parse(writeProject(t, jo(tc.body), dk), engine.Options{})
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
	annual := "date,a,b\n" + func() string {
		var b strings.Builder
		for i := 0; i < 40; i++ {
			b.WriteString(strings.Join([]string{strconv.Itoa(1950 + i), strconv.Itoa(i*i%17 + i), strconv.Itoa(i*7%11 + 2*i)}, ","))
			b.WriteString("\n")
		}
		return b.String()
	}()
	doc, err = engine.Parse(writeProject(t, jo("series: [a, b]\nlags: 1\nseasonal: true\n"), map[string]string{"data.csv": annual}), engine.Options{})
	if err == nil {
		err = doc.Run()
	}
	if err == nil || !strings.Contains(err.Error(), "quarterly or monthly") {
		t.Errorf("seasonal on annual data: err = %v", err)
	}
}
