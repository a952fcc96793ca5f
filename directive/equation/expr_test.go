package equation

import "testing"

// TestExprTeX: series expressions and galley's term names become the
// math an applied paper writes.
func TestExprTeX(t *testing.T) {
	cases := map[string]string{
		"log(north)":        `\ln \mathit{north}_{t}`,
		"lag(log(fuel))":    `\ln \mathit{fuel}_{t-1}`,
		"lag(log(fuel), 2)": `\ln \mathit{fuel}_{t-2}`,
		"diff(log(fuel))":   `\Delta \ln \mathit{fuel}_{t}`,
		"d.log(north)":      `\Delta \ln \mathit{north}_{t}`,
		"d.log(north)(-1)":  `\Delta \ln \mathit{north}_{t-1}`,
		"ect(-1)":           `\mathit{ect}_{t-1}`,
		"y":                 `y_{t}`,
		"dlog(gdp)":         `\Delta\ln \mathit{gdp}_{t}`,
		"sdiff(x, 12)":      `\Delta_{12} x_{t}`,
		"trend":             `t`,
		"log(a)/log(b)":     `\text{log(a)/log(b)}`,
		"north_price":       `\mathit{north\_price}_{t}`,
		"x{\\input{a}}":     `\text{xinputa}`,
	}
	for in, want := range cases {
		if got := ExprTeX(in); got != want {
			t.Errorf("ExprTeX(%q) = %q, want %q", in, got, want)
		}
	}
}
