package kinds

import (
	"fmt"
	"regexp"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/write/markdown"
)

// emptyClause matches a clause left without its content: a word that
// needs one followed at once by punctuation ("at;", "with ."), two
// separators in a row, empty brackets, doubled or stray spaces.
var emptyClause = regexp.MustCompile(`\b(at|in|of|from|by|with|and|or|to|for|the|a|an)[;,.:]|[;,]\s*[;,.]|\(\s*\)|\[\s*\]|  |\s[;,.:](\s|$)`)

// noteDefects lists what is wrong with one note: a sentence given twice,
// an empty clause, blank text.
func noteDefects(note string) []string {
	var out []string
	if strings.TrimSpace(note) == "" {
		return []string{"an empty note"}
	}
	if note != strings.TrimSpace(note) {
		out = append(out, "leading or trailing space")
	}
	if m := emptyClause.FindString(note); m != "" {
		out = append(out, fmt.Sprintf("an empty clause %q", m))
	}
	seen := map[string]bool{}
	for _, sen := range noteSentences(note) {
		if seen[sen] {
			out = append(out, fmt.Sprintf("the sentence %q twice", sen))
		}
		seen[sen] = true
	}
	return out
}

// noteSentences splits a note at ". " (the end of a sentence followed by
// another).
func noteSentences(note string) []string {
	var out []string
	for _, s := range strings.Split(note, ". ") {
		if s = strings.TrimSpace(strings.TrimSuffix(s, ".")); s != "" {
			out = append(out, s)
		}
	}
	return out
}

// checkNotes reports every defective note of a document's tables and
// figures, and a sentence repeated across the notes of one table.
func checkNotes(t *testing.T, results []*engine.Result) {
	t.Helper()
	for _, r := range results {
		var notes []string
		switch {
		case r.Table != nil:
			notes = r.Table.Notes
		case r.Figure != nil:
			notes = r.Figure.Notes
		}
		seen := map[string]int{}
		for i, n := range notes {
			for _, d := range noteDefects(n) {
				t.Errorf("%s (%s), note %d: %s\n%s", r.ID, r.Kind, i+1, d, n)
			}
			for _, sen := range noteSentences(n) {
				if j, ok := seen[sen]; ok && j != i {
					t.Errorf("%s (%s): the sentence %q is in notes %d and %d", r.ID, r.Kind, sen, j+1, i+1)
				}
				seen[sen] = i
			}
		}
	}
}

// TestNoteDefects: the checker finds what it is meant to find.
func TestNoteDefects(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		note string
		bad  bool
	}{
		{"Critical values from ERS (1996) Table 1, interpolated in 1/T; ZA: Zivot and Andrews (1992).", false},
		{"Critical values from ERS (1996) Table 1, interpolated in 1/T at; ZA: Zivot and Andrews (1992).", true},
		{"Lags: 2. Sample 2004-01–2025-12, N = 264. Lags: 2.", true},
		{"Deterministic terms: constant;; T = 5.", true},
		{"Bandwidth ().", true},
		{"Two  spaces.", true},
		{"Sample 1959Q1–2009Q3, N = 203.", false},
	} {
		if got := len(noteDefects(c.note)) > 0; got != c.bad {
			t.Errorf("%q: defects %v, want defective %v", c.note, noteDefects(c.note), c.bad)
		}
	}
}

// bareLabel is a table or figure label with no caption after it in the
// Markdown output: "**Table 1.**" at the end of its line.
var bareLabel = regexp.MustCompile(`(?m)^\*\*(Table|Figure) [A-Z0-9.]+\.\*\*\s*$`)

// TestDemoNotes: every note of the demo paper's tables and figures is
// free of repeated sentences and empty clauses, and every table and figure
// of its Markdown has a caption after its label.
func TestDemoNotes(t *testing.T) {
	t.Parallel()
	withDemo(t, func(doc *engine.Document) {
		checkNotes(t, doc.Results())
		md, err := markdown.Write(doc, markdown.Options{})
		if err != nil {
			t.Fatal(err)
		}
		if m := bareLabel.FindAllString(string(md), -1); len(m) > 0 {
			t.Errorf("labels without a caption: %q", m)
		}
	})
}

// TestUnitRootTableNotes: a unit-root table with every test, a trend in
// levels and a constant in differences (so DF-GLS takes its critical
// values from two sources) has notes without empty clauses or repeats;
// the sources name each test once per source, DF-GLS by block.
func TestUnitRootTableNotes(t *testing.T) {
	t.Parallel()
	body := fence("unitroot-table", "id: u\nseries: [log(realgdp), infl]\ndet: ct\ntests: [adf, pp, kpss, dfgls, za, ngperron]\n")
	res := runDoc(t, macroProject(t, body))
	u := res["u"]
	checkNotes(t, []*engine.Result{u})
	notes := strings.Join(u.Table.Notes, " ")
	for _, w := range []string{"DF-GLS levels: Elliott, Rothenberg and Stock (1996) Table 1, interpolated in 1/T;", "DF-GLS differences: MacKinnon (2010) response surface, no-constant case"} {
		if !strings.Contains(notes, w) {
			t.Errorf("notes lack %q: %s", w, notes)
		}
	}
	if strings.Count(notes, "DF-GLS:") > 0 {
		t.Errorf("DF-GLS named without its block although its sources differ: %s", notes)
	}
}

// TestKindsNotes: one directive of most kinds on the macro data (DF-GLS
// with a trend, a model table with HAC lags and bandwidths, a grid of
// Johansen statistics), every note free of repeats and empty clauses.
func TestKindsNotes(t *testing.T) {
	t.Parallel()
	body := fence("adf", "id: a\nseries: log(realgdp)\n") + fence("pp", "id: p\nseries: log(realgdp)\n") +
		fence("kpss", "id: k\nseries: infl\n") + fence("dfgls", "id: g\nseries: log(realgdp)\ndet: ct\n") +
		fence("za", "id: z\nseries: log(realgdp)\nlags: 1\n") + fence("ngperron", "id: n\nseries: log(realgdp)\n") +
		fence("po", "id: po\ny: log(realcons)\nx: [log(realdpi)]\n") +
		fence("gregory-hansen", "id: gh\ny: log(realcons)\nx: [log(realdpi)]\n") +
		fence("engle-granger", "id: eg\ny: log(realcons)\nx: [log(realdpi)]\n") +
		fence("ecm", "id: ec\nfrom: eg\nlags: 1\n") +
		fence("dols", "id: d\ny: log(realcons)\nx: [log(realdpi)]\n") +
		fence("fmols", "id: f\ny: log(realcons)\nx: [log(realdpi)]\n") +
		fence("ols", "id: o\ny: log(realcons)\nx: [log(realdpi)]\nse: hac(4)\n") +
		fence("model-table", "id: mt\nmodels: [o, ec, d, f]\nstats: [nobs, hac_lags, bandwidth]\n") +
		fence("ardl", "id: ar\ny: log(realcons)\nx: [log(realdpi)]\n") +
		fence("johansen", "id: j\nseries: [log(realcons), log(realdpi)]\nlags: 2\n") +
		fence("vecm", "id: v\nfrom: j\n") +
		fence("var-lags", "id: vl\nseries: [log(realcons), log(realdpi)]\nmax: 4\n") +
		fence("summary-stats", "id: ss\nseries: [infl, tbilrate]\n") +
		fence("unitroot-table", "id: ut\nseries: [infl, tbilrate]\n") +
		fence("grid", "id: gr\nof: johansen\nseries: [infl, tbilrate]\nlags: 1\nshow: maxeig.0\nover: {sample: [1959Q1.., 1970Q1..]}\n")
	var rs []*engine.Result
	for _, r := range runDoc(t, macroProject(t, body)) {
		rs = append(rs, r)
	}
	checkNotes(t, rs)
}
