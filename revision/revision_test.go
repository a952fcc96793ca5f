package revision

import (
	"slices"
	"strings"
	"testing"

	"github.com/galley-econ/galley/resultsfile"
)

func file(manuscript string, recs ...resultsfile.Record) *resultsfile.File {
	return &resultsfile.File{Path: manuscript + ".results.json", Galley: "t", Manuscript: manuscript, Results: recs}
}

func TestCompareFlips(t *testing.T) {
	old := file("paper.md",
		resultsfile.Record{ID: "a", Kind: "adf", Values: map[string]any{"stat": -3.5, "reject_5": true, "nobs": 250.0}},
		resultsfile.Record{ID: "m", Kind: "ols", Values: map[string]any{"coef": []any{
			map[string]any{"term": "x", "est": 0.5, "se": 0.2, "p": 0.012},
			map[string]any{"term": "const", "est": 1.0, "se": 0.1, "p": 0.001},
		}, "r2": 0.4}},
		resultsfile.Record{ID: "e", Kind: "ecm", Values: map[string]any{"alpha": -0.2, "error_corrects": true}},
		resultsfile.Record{ID: "j", Kind: "johansen", Values: map[string]any{"rank": 2.0}},
		resultsfile.Record{ID: "u", Kind: "unitroot-table", Values: map[string]any{"series": []any{map[string]any{"name": "y", "order": "I(1)"}}}},
		resultsfile.Record{ID: "same", Kind: "ols", Values: map[string]any{"r2": 0.5}},
		resultsfile.Record{ID: "gone", Kind: "ols", Values: map[string]any{}},
	)
	new := file("paper.md",
		resultsfile.Record{ID: "a", Kind: "adf", Values: map[string]any{"stat": -2.5, "reject_5": false, "nobs": 251.0}},
		resultsfile.Record{ID: "m", Kind: "ols", Values: map[string]any{"coef": []any{
			map[string]any{"term": "x", "est": 0.5, "se": 0.2, "p": 0.07},
			map[string]any{"term": "const", "est": 1.0 + 1e-12, "se": 0.1, "p": 0.001},
		}, "r2": 0.4}},
		resultsfile.Record{ID: "e", Kind: "ecm", Values: map[string]any{"alpha": 0.05, "error_corrects": false}},
		resultsfile.Record{ID: "j", Kind: "johansen", Values: map[string]any{"rank": 1.0}},
		resultsfile.Record{ID: "u", Kind: "unitroot-table", Values: map[string]any{"series": []any{map[string]any{"name": "y", "order": "I(0)"}}}},
		resultsfile.Record{ID: "same", Kind: "ols", Values: map[string]any{"r2": 0.5}},
		resultsfile.Record{ID: "added", Kind: "ols", Values: map[string]any{}},
	)
	r := Compare(old, new, Options{})
	var got []string
	for _, it := range r.Items {
		for _, f := range it.Flips {
			got = append(got, it.ID+": "+f.What+": "+f.Old+" -> "+f.New)
		}
	}
	want := []string{
		"a: rejects its null at 5%: yes -> no",
		"m: coef x: stars: ** -> *",
		"e: alpha (adjustment) changed sign: -0.2 -> 0.05",
		"e: error_corrects: yes -> no",
		"j: rank: 2 -> 1",
		"u: series y order: I(1) -> I(0)",
	}
	for _, w := range want {
		if !slices.Contains(got, w) {
			t.Errorf("missing flip %q; got %q", w, got)
		}
	}
	if len(got) != len(want) {
		t.Errorf("got %d flips, want %d: %q", len(got), len(want), got)
	}
	if r.Unchanged != 1 || !slices.Equal(r.OnlyOld, []string{"gone"}) || !slices.Equal(r.OnlyNew, []string{"added"}) {
		t.Errorf("unchanged %d, only old %v, only new %v", r.Unchanged, r.OnlyOld, r.OnlyNew)
	}
	for _, it := range r.Items {
		if it.ID == "m" {
			for _, m := range it.Moved {
				if strings.Contains(m.What, "const") {
					t.Errorf("a change of 1e-12 counted as a move: %+v", m)
				}
			}
		}
		if it.ID == "a" && (len(it.Samples) != 1 || it.Samples[0].Old != "250" || it.Samples[0].New != "251") {
			t.Errorf("sample change of a: %+v", it.Samples)
		}
	}
	for _, out := range [][]byte{r.Markdown(), r.HTML(), r.LaTeX(), []byte(r.Summary())} {
		if !strings.Contains(string(out), "I(0)") {
			t.Errorf("a report lacks the flipped verdict:\n%s", out)
		}
	}
}

func TestDifferentManuscripts(t *testing.T) {
	r := Compare(file("a.md", resultsfile.Record{ID: "x", Values: map[string]any{"stat": 1.0}}), file("b.md", resultsfile.Record{ID: "x", Values: map[string]any{"stat": 2.0}}), Options{})
	if r.SameManuscript || !strings.Contains(r.Summary(), "different manuscripts") {
		t.Error("different manuscripts not reported")
	}
	if len(r.Items) != 1 || len(r.Items[0].Moved) != 1 {
		t.Errorf("matching ids not compared: %+v", r.Items)
	}
}

// TestVisibleAndScaled: a star change under a hidden key is reported
// apart unless the prose quotes it; an estimate moves in standard errors
// and a statistic relative to its 5% critical value.
func TestVisibleAndScaled(t *testing.T) {
	vals := func(p, est, stat float64) map[string]any {
		return map[string]any{
			"coef":     []any{map[string]any{"term": "x", "est": est, "se": 0.5, "p": 0.2}},
			"dynamics": []any{map[string]any{"term": "dx", "est": 0.1, "se": 0.1, "p": p}},
			"stat":     stat, "crit": map[string]any{"1%": -4.0, "5%": -2.0, "10%": -1.5},
		}
	}
	rec := func(v map[string]any, quoted ...string) resultsfile.Record {
		return resultsfile.Record{ID: "d", Kind: "dols", Label: "Table 4", Caption: "DOLS", Hidden: []string{"dynamics"}, Quoted: quoted, Values: v}
	}
	old, new := file("p.md", rec(vals(0.2, 1.0, -3.0))), file("p.md", rec(vals(0.001, 2.0, -2.0)))
	r := Compare(old, new, Options{})
	if r.HasFlips() || len(r.Items[0].Hidden) == 0 || !r.Items[0].Hidden[0].Flip {
		t.Fatalf("hidden star change: flips %d, hidden %+v", r.Flips(), r.Items[0].Hidden)
	}
	got := map[string]string{}
	for _, m := range r.Ranked() {
		got[m.What] = m.MoveText()
	}
	if got["coef x est"] != "+2.00 s.e." || got["stat"] != "+0.50 |5% c.v.|" {
		t.Errorf("moves %v", got)
	}
	if r.Items[0].Name != "Table 4: DOLS" {
		t.Errorf("name %q", r.Items[0].Name)
	}
	// Quoted in the prose: seen, so its star change is a conclusion.
	old, new = file("p.md", rec(vals(0.2, 1.0, -3.0), "dynamics.dx.est")), file("p.md", rec(vals(0.001, 1.0, -3.0), "dynamics.dx.est"))
	if r := Compare(old, new, Options{}); r.Flips() != 1 {
		t.Errorf("a quoted value's star change: %d flips", r.Flips())
	}
}

// TestSpecAndInputChanges: spec keys that changed (caption aside), and a
// file renamed under one alias as one changed input.
func TestSpecAndInputChanges(t *testing.T) {
	old := file("p.md", resultsfile.Record{ID: "a", Kind: "adf", Spec: map[string]any{"lags": 2.0, "det": "c", "caption": "A"}, Values: map[string]any{}})
	new := file("p.md", resultsfile.Record{ID: "a", Kind: "adf", Spec: map[string]any{"lags": 4.0, "det": "c", "caption": "B", "sample": "2001.."}, Values: map[string]any{}})
	old.Inputs = []resultsfile.Input{{Path: "a.csv", SHA256: "1", Alias: "g"}}
	new.Inputs = []resultsfile.Input{{Path: "b.csv", SHA256: "1", Alias: "g"}}
	r := Compare(old, new, Options{})
	var specs []string
	for _, s := range r.Items[0].Specs {
		specs = append(specs, s.What+": "+s.Old+" -> "+s.New)
	}
	if !slices.Equal(specs, []string{"lags: 2 -> 4", "sample: (not set) -> 2001.."}) {
		t.Errorf("spec changes %q", specs)
	}
	if len(r.InputsChanged) != 1 || r.InputsChanged[0].What() != "another file, same content" {
		t.Errorf("inputs %+v", r.InputsChanged)
	}
}

// TestCompareTypeAndKind: a number replaced by text is a change, not
// "unchanged"; results of two different kinds that share an id are not
// the same result.
func TestCompareTypeAndKind(t *testing.T) {
	old := file("paper.md",
		resultsfile.Record{ID: "a", Kind: "adf", Values: map[string]any{"stat": -3.5, "test": "ADF"}},
		resultsfile.Record{ID: "m", Kind: "ols", Values: map[string]any{"r2": 0.5}},
	)
	new := file("paper.md",
		resultsfile.Record{ID: "a", Kind: "adf", Values: map[string]any{"stat": "n/a", "test": "ADF"}},
		resultsfile.Record{ID: "m", Kind: "kpss", Values: map[string]any{"r2": 0.5}},
	)
	r := Compare(old, new, Options{})
	if r.Unchanged != 0 {
		t.Errorf("%d results reported unchanged", r.Unchanged)
	}
	if len(r.Items) != 1 || len(r.Items[0].Presence) != 1 || r.Items[0].Presence[0].New != "n/a" {
		t.Errorf("the number turned into text is not reported: %+v", r.Items)
	}
	if !slices.Contains(r.OnlyOld, "m") || !slices.Contains(r.OnlyNew, "m") {
		t.Errorf("an ols and a kpss result with one id were paired: only old %v, only new %v", r.OnlyOld, r.OnlyNew)
	}
}
