package kinds

import (
	"fmt"
	"os"
	"strings"
	"testing"
)

// TestEstimatedEquation: an ecm result typeset as an estimated equation
// shows each coefficient of the model with its standard error beneath,
// as the ecm's own values give them, and is numbered with the display
// equations around it.
func TestEstimatedEquation(t *testing.T) {
	t.Parallel()
	csv, err := os.ReadFile("../examples/gridlink/data/gridlink.csv")
	if err != nil {
		t.Fatal(err)
	}
	body := "---\ndata:\n  grid: data.csv\n---\n\n$$ a = b \\label{first} $$\n\n" +
		fence("engle-granger", "id: eg\ndata: grid\ny: log(north)\nx: [log(fuel)]\n") +
		fence("ecm", "id: m\nfrom: eg\nlags: 1\n") +
		"{{fit.label}} is the fitted model.\n\n" +
		fence("estimated-equation", "id: fit\nof: m\nsymbols:\n  lag(ect,1): '\\hat{u}_{t-1}'\nstats: [nobs, r2]\n")
	p := writeProject(t, body, map[string]string{"data.csv": string(csv)})
	doc, h, tex, md := renderAll(t, p)
	var coefs []map[string]any
	for _, r := range doc.Results() {
		if r.ID == "m" {
			coefs = r.Values["coef"].([]map[string]any)
		}
	}
	if len(coefs) < 3 {
		t.Fatalf("ecm coefficients: %v", coefs)
	}
	for _, c := range coefs {
		est, se := c["est"].(float64), c["se"].(float64)
		under := fmt.Sprintf(`\underset{(%.3f)}{%.3f}`, se, abs(est))
		wantIn(t, "LaTeX", tex, under)
		wantIn(t, "Markdown", md, under)
	}
	wantIn(t, "LaTeX", tex, `\begin{equation}\label{eq:fit}`, `\hat{u}_{t-1}`, `\Delta \ln \mathit{north}_{t} = `, `N = `, `R^2 = `, `\eqref{eq:fit}`)
	wantIn(t, "HTML", h, `<div class="equation" id="eq-fit"><math`, `<span class="eqno">(2)</span>`, `<munder>`, `href="#eq-fit">(2)</a> is the fitted model`)
	wantIn(t, "Markdown", md, `\tag{2}`, "(2) is the fitted model")
	if strings.Contains(tex, `\mathit{ect}`) {
		t.Error("the symbol given for lag(ect,1) was not used")
	}
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

// TestEstimatedEquationBadInput: errors name the line and the key.
func TestEstimatedEquationBadInput(t *testing.T) {
	t.Parallel()
	base := fence("summary-stats", "id: d\ndata: grid\nseries: [north]\n") + fence("ols", "id: o\ndata: grid\ny: north\nx: [fuel]\n")
	cases := []struct{ body, want string }{
		{fence("estimated-equation", "id: e\nof: d\n"), `paper.md:20: "d" is a summary-stats result`},
		{fence("estimated-equation", "id: e\nof: o\nstats: [r3]\n"), `paper.md:21: "r3" is not a statistic an estimated equation shows (did you mean r2?)`},
		{fence("estimated-equation", "id: e\nof: o\nsymbols: {fuell: f}\n"), `"fuell" is neither the dependent variable nor a term of o (did you mean fuel?)`},
		{fence("estimated-equation", "id: e\nof: o\nsymbols: {fuel: '\\input{x}'}\n"), `paper.md:21: the symbol of fuel: \input is not allowed in math`},
		{fence("estimated-equation", "id: e\nof: o\nbeneath: p\n"), `paper.md:21: "p" is not a choice`},
	}
	for _, c := range cases {
		runBad(t, front+"\n"+base+c.body, map[string]string{"data.csv": testCSV}, c.want)
	}
}
