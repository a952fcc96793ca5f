package kinds

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/internal/refdata"
)

// TestARDLWiring: an ardl directive reports the numbers of ardl.Estimate
// on the same data, and its bounds F statistic and long-run coefficients
// are statsmodels 0.13.5's (fixture testdata/fixtures/ardl_statsmodels.json,
// case macro_c) to 1e-6 relative.
func TestARDLWiring(t *testing.T) {
	t.Parallel()
	p := macroProject(t, fence("ardl", "id: b\ny: log(realcons)\nx: [log(realdpi), tbilrate]\nlags: [3, 2, 1]\n")+
		fence("ardl", "id: s\ny: log(realcons)\nx: [log(realdpi), tbilrate]\nsplit: [tbilrate]\nlags: [2, 1, 2]\nhorizon: 12\n")+
		fence("figure", "id: f\nplot: multipliers\nof: s\n"))
	res := runDoc(t, p)
	var fx struct {
		Fixed []struct {
			Name     string
			F        float64
			CINames  []string  `json:"ci_names"`
			CIParams []float64 `json:"ci_params"`
		}
	}
	refdata.JSONFile(t, "../testdata/fixtures/ardl_statsmodels.json", &fx)
	b := res["b"].Values
	bounds := b["bounds"].(map[string]any)
	f := bounds["f"].(map[string]any)
	for _, c := range fx.Fixed {
		if c.Name != "macro_c" {
			continue
		}
		if got := f["stat"].(float64); math.Abs(got-c.F) > 1e-6*c.F {
			t.Errorf("bounds F %.10g, statsmodels %.10g", got, c.F)
		}
		lr := b["longrun"].([]map[string]any)
		for i, n := range c.CINames {
			for _, e := range lr {
				name := map[string]string{"log(realdpi)": "ly", "tbilrate": "r"}[e["term"].(string)]
				if name == n {
					if got, want := e["est"].(float64), -c.CIParams[i]; math.Abs(got-want) > 1e-6*math.Abs(want) {
						t.Errorf("long run %s %.10g, statsmodels %.10g", n, got, want)
					}
				}
			}
		}
	}
	if f["verdict"] == "" || bounds["k"] != 2 || bounds["case"] != "III" {
		t.Errorf("bounds values %v", bounds)
	}
	crit := f["crit"].(map[string]any)["5%"].(map[string]any)
	if crit["i0"] != 3.79 || crit["i1"] != 4.85 {
		t.Errorf("5%% bounds %v, want PSS Table CI(iii) k=2: 3.79, 4.85", crit)
	}
	if !strings.Contains(strings.Join(res["b"].Table.Notes, " "), "Table CI(iii), case III, k = 2") {
		t.Errorf("notes do not name the source: %q", res["b"].Table.Notes)
	}
	if res["b"].Test == nil || res["b"].Test.Stat != f["stat"] {
		t.Error("no test outcome")
	}
	s := res["s"].Values
	if _, ok := s["multipliers"]; !ok || s["symmetry"] == nil {
		t.Fatalf("split result lacks multipliers or symmetry: %v", s["split"])
	}
	fig := res["f"]
	if fig.Figure == nil || len(fig.Figure.SVG) == 0 || fig.Values["coef"] != "tbilrate" || fig.Values["horizon"] != 12 {
		t.Errorf("multiplier figure: %v", fig.Values)
	}
}

// TestARDLBadInput: bad input gives an error at the manuscript line.
func TestARDLBadInput(t *testing.T) {
	t.Parallel()
	var b strings.Builder
	b.WriteString("date,y,x,z\n")
	for i := 0; i < 40; i++ {
		fmt.Fprintf(&b, "%d-%02d,%g,%g,%g\n", 2004+i/12, i%12+1, math.Sin(float64(i))+float64(i)*0.1, float64(i*i), math.Cos(float64(i)*1.3))
	}
	data := map[string]string{"data.csv": b.String()}
	cases := []struct {
		name, body string
		want       []string
	}{
		{"grid too large", "id: a\ny: y\nx: [x, z]\nlags: {select: aic, max: 12}\n", []string{"paper.md:11:", "too few observations for the lag grid"}},
		{"lags beyond sample", "id: a\ny: y\nx: [z]\nlags: [45, 1]\n", []string{"paper.md:11:", "beyond the sample"}},
		{"no falls", "id: a\ny: y\nx: [x, z]\nsplit: [x]\n", []string{"paper.md:11:", "negative partial sum"}},
		{"split not in x", "id: a\ny: y\nx: [z]\nsplit: [x]\n", []string{"paper.md:11:", "not one of the regressors"}},
		{"orders count", "id: a\ny: y\nx: [z]\nlags: [1, 1, 1]\n", []string{"paper.md:11:", "3 orders given"}},
		{"bad det", "id: a\ny: y\nx: [z]\ndet: cc\n", []string{"paper.md:11:", "is not a case"}},
	}
	for _, c := range cases {
		p := writeProject(t, front+"\n"+fence("ardl", c.body), data)
		doc, err := engine.Parse(p, engine.Options{})
		if err == nil {
			err = doc.Run()
		}
		if err == nil {
			t.Errorf("%s: no error", c.name)
			continue
		}
		msg := err.Error()
		for _, w := range c.want {
			if !strings.Contains(msg, w) {
				t.Errorf("%s: error %q lacks %q", c.name, msg, w)
			}
		}
	}
}
