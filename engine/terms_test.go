package engine

import "testing"

// TestTermLabel: term names in galley's expression language are
// typeset with Δ and time subscripts; other expressions are shown as
// written, without backquotes.
func TestTermLabel(t *testing.T) {
	for _, c := range []struct{ term, text, sub, plain string }{
		{"lag(diff(log(north)),1)", "Δlog(north)", "t−1", "Δlog(north)ₜ₋₁"},
		{"diff(log(fuel))", "Δlog(fuel)", "", "Δlog(fuel)"},
		{"lead(diff(x),2)", "Δx", "t+2", "Δxₜ₊₂"},
		{"lag(ect,1)", "ect", "t−1", "ectₜ₋₁"},
		{"lag(log(north), 12)", "log(north)", "t−12", "log(north)ₜ₋₁₂"},
		{"log(fuel)", "log(fuel)", "", "log(fuel)"},
		{"`cost #1`", "cost #1", "", "cost #1"},
		{"lag(x, k)", "lag(x, k)", "", "lag(x, k)"},
		{"diff(a)+diff(b)", "diff(a)+diff(b)", "", "diff(a)+diff(b)"},
		{"const", "const", "", "const"},
		{"lag(log(north))", "log(north)", "t−1", "log(north)ₜ₋₁"},
	} {
		text, sub := TermLabel(c.term)
		if text != c.text || sub != c.sub || TermText(c.term) != c.plain {
			t.Errorf("%s: %q, %q, %q; want %q, %q, %q", c.term, text, sub, TermText(c.term), c.text, c.sub, c.plain)
		}
	}
}
