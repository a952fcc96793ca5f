package kinds

import (
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/galley-econ/galley/internal/refdata"
)

// TestCCRManuscript runs a ccr directive in a whole manuscript and checks
// its numbers against the independent numpy implementation of Park's
// (1992) formulas (testdata/scripts/longrun_ccr.py, numpy 1.24.2, scipy
// 1.10.1; case c_qs_auto: log(realcons) on log(realdpi) and log(realinv),
// constant, quadratic-spectral kernel, Andrews bandwidth, the joint Wald
// test β₁ = 1, β₂ = 0), to 1e-8 relative; then that an ecm builds on it,
// that model-table and estimated-equation take it, and that with
// cite-methods the reference list has Park (1992), in all three formats.
func TestCCRManuscript(t *testing.T) {
	t.Parallel()
	var fx struct {
		CCR []struct {
			Name          string
			Coef, SE      []float64
			Wald          []float64
			BandwidthUsed float64 `json:"bandwidth_used"`
			Nobs          int
			Omega112      float64 `json:"omega11_2"`
		} `json:"ccr"`
	}
	refdata.JSONFile(t, filepath.Join(refdata.Root(), "fixtures", "longrun_ccr.json"), &fx)
	ref := fx.CCR[2]
	if ref.Name != "c_qs_auto" {
		t.Fatalf("fixture case %q, want c_qs_auto", ref.Name)
	}
	csv, err := os.ReadFile(filepath.Join(refdata.Root(), "data", "macrodata.csv"))
	if err != nil {
		t.Fatal(err)
	}
	body := "---\ntitle: T\ncite-methods: true\ndata:\n  macro: macro.csv\n---\n\n" +
		"The income elasticity is {{cc.coef.log(realdpi).est %.3f}}.\n\n" +
		fence("ccr", "id: cc\ny: log(realcons)\nx: [log(realdpi), log(realinv)]\nkernel: qs\nrestrict: [\"log(realdpi) = 1; log(realinv) = 0\"]\n") +
		fence("ecm", "id: m\nfrom: cc\nlags: 1\n") +
		fence("model-table", "id: mt\nmodels: [cc, m]\n") +
		fence("estimated-equation", "id: eq\nof: cc\n")
	p := writeProject(t, body, map[string]string{"macro.csv": string(csv)})
	doc, h, tex, md := renderAll(t, p)
	r := resultByID(t, doc, "cc")
	v := r.Values
	rel := func(got any, want float64) float64 {
		g, _ := got.(float64)
		if i, ok := got.(int); ok {
			g = float64(i)
		}
		return math.Abs(g-want) / math.Abs(want)
	}
	const tol = 1e-8
	coef := v["coef"].([]map[string]any)
	for j, term := range []string{"const", "log(realdpi)", "log(realinv)"} {
		if coef[j]["term"] != term || rel(coef[j]["est"], ref.Coef[j]) > tol || rel(coef[j]["se"], ref.SE[j]) > tol {
			t.Errorf("%s: %v, numpy %.12g (%.12g)", term, coef[j], ref.Coef[j], ref.SE[j])
		}
	}
	if rel(v["bandwidth"], ref.BandwidthUsed) > tol || rel(v["nobs"], float64(ref.Nobs)) > 0 || rel(v["lrvar"], ref.Omega112) > tol {
		t.Errorf("bandwidth %v nobs %v lrvar %v, numpy %v %v %v", v["bandwidth"], v["nobs"], v["lrvar"], ref.BandwidthUsed, ref.Nobs, ref.Omega112)
	}
	w := v["wald"].([]map[string]any)[0]
	if rel(w["stat"], ref.Wald[0]) > tol || rel(w["pvalue"], ref.Wald[1]) > tol || w["df"] != 2 {
		t.Errorf("wald %v, numpy %v", w, ref.Wald)
	}
	if v["kernel"] != "quadratic-spectral" || v["cov"] != "ccr" || r.Model == nil || r.Model.Method != "CCR" {
		t.Errorf("kernel %v cov %v model %v", v["kernel"], v["cov"], r.Model)
	}
	if len(r.Cites) != 1 || r.Cites[0] != "park-1992" {
		t.Errorf("cites %v", r.Cites)
	}
	// The ecm's error-correction term is the CCR relation's residual.
	m := resultByID(t, doc, "m")
	if !strings.Contains(strings.Join(m.Table.Notes, " "), "the residual of the CCR long-run relation") {
		t.Errorf("ecm notes %v", m.Table.Notes)
	}
	wantIn(t, "Markdown", md, "The income elasticity is 0.906.", "Park", "Canonical Cointegrating Regressions")
	wantIn(t, "HTML", h, "Canonical cointegrating regression of log(realcons)", "Canonical Cointegrating Regressions")
	wantIn(t, "LaTeX", tex, `\begin{equation}\label{eq:eq}`, "Canonical Cointegrating Regressions")
}

// TestCCRBadInput: errors of a ccr directive name the line of the key at
// fault.
func TestCCRBadInput(t *testing.T) {
	t.Parallel()
	files := map[string]string{"data.csv": syntheticCSV("y", "x", gridlinkSynthetic(80, -0.5))}
	flat := strings.Builder{}
	flat.WriteString("date,y,x,k\n")
	s := gridlinkSynthetic(40, -0.5)
	for i := range s.y {
		flat.WriteString(strings.Join([]string{"20" + pad2(i/12+1) + "-" + pad2(i%12+1), strconv.FormatFloat(s.y[i], 'g', 17, 64), strconv.FormatFloat(s.x[i], 'g', 17, 64), "3"}, ",") + "\n")
	}
	cc := func(body string) string { return front + "\n" + fence("ccr", body) }
	t.Run("too few observations", func(t *testing.T) {
		runBad(t, cc("id: d\ny: y\nx: [x]\nsample: 2001-01..2001-03\n"), files, "paper.md:11:", "CCR of y on x", "2 observations after differencing for 2 terms")
		runBad(t, cc("id: d\ny: y\nx: [x]\ndet: ctt\nsample: 2001-01..2001-05\n"), files, "paper.md:12:", "4 observations after differencing for 4 terms")
	})
	t.Run("constant regressor", func(t *testing.T) {
		runBad(t, cc("id: d\ny: y\nx:\n  - x\n  - k\ndet: n\n"), map[string]string{"data.csv": flat.String()}, "paper.md:12:", `regressor "k" is constant over the sample`)
		runBad(t, cc("id: d\ny: y\nx: [k]\n"), map[string]string{"data.csv": flat.String()}, "paper.md:10:", `regressor "k" is constant`)
	})
	t.Run("collinear", func(t *testing.T) {
		runBad(t, cc("id: d\ny: y\nx: [x, 2*x]\n"), files, "paper.md:10:", "CCR of y on x, 2*x: term", "collinear")
	})
	t.Run("bad kernel", func(t *testing.T) {
		runBad(t, cc("id: d\ny: y\nx: [x]\nkernel: parzen\n"), files, "paper.md:11:", "bartlett or qs")
	})
	t.Run("bad bandwidth", func(t *testing.T) {
		runBad(t, cc("id: d\ny: y\nx: [x]\nbandwidth: 0\n"), files, "paper.md:11:", "positive number")
	})
	t.Run("bad restriction", func(t *testing.T) {
		runBad(t, cc("id: d\ny: y\nx: [x]\nrestrict:\n  - z = 1\n"), files, "paper.md:12:", `restriction "z = 1"`, "did you mean x?")
	})
	t.Run("unknown key", func(t *testing.T) {
		runBad(t, cc("id: d\ny: y\nx: [x]\nlags: 2\n"), files, "paper.md:11:", `unknown key "lags"`)
	})
}
