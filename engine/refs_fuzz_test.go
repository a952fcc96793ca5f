package engine

import "testing"

// FuzzInlineRef: parsing and resolving any inline reference never panics.
func FuzzInlineRef(f *testing.F) {
	for _, s := range []string{"m.r2", "m.coef.x.est %.3f", "a.crit.5%", "m.coef.0.p %d", "m", "m..x", "m.r2 %s %d"} {
		f.Add(s)
	}
	vals := map[string]any{
		"r2":   0.5,
		"nobs": 10,
		"coef": []map[string]any{{"term": "x", "est": 1.5, "p": 0.01}},
		"crit": map[string]any{"5%": -2.9},
		"list": []float64{1, 2},
		"name": "text",
	}
	f.Fuzz(func(t *testing.T, s string) {
		r, err := parseRef(s)
		if err != nil {
			return
		}
		v, err := Lookup(vals, r.path)
		if err != nil {
			return
		}
		formatValue(v, r.verb, 3)
	})
}
