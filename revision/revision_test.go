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
