package kinds

import (
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/resultsfile"
	"github.com/galley-econ/galley/revision"
)

// refereeRound is a manuscript before and after a designed referee round:
// the Engle–Granger test's lags go from 2 to 4, the static regression gets
// a shorter sample, and the data are revised (a new file under the same
// alias; the revision weakens the equilibrium correction so that the
// test's rejection flips). DOLS estimates leads and lags of Δx that its
// table does not show.
func refereeRound(t *testing.T) (old, new *resultsfile.File) {
	t.Helper()
	doc := func(file, lags, sample string) string {
		return "---\ntitle: T\ndata:\n  grid: " + file + "\n---\n\n" +
			"The test statistic is {{egtest.stat %.2f}}.\n\n" +
			fence("engle-granger", "id: egtest\ny: y\nx: [x]\nlags: "+lags+"\ncaption: Engle–Granger test of y on x\n") + "\n" +
			fence("ols", "id: statreg\ny: y\nx: [x]\n"+sample+"caption: Static regression\n") + "\n" +
			fence("dols", "id: dolsfit\ny: y\nx: [x]\nleads: 2\nlags: 2\ncaption: Dynamic OLS\n")
	}
	build := func(dir, manuscript string) *resultsfile.File {
		p := filepath.Join(dir, "paper.md")
		if err := os.WriteFile(p, []byte(manuscript), 0o644); err != nil {
			t.Fatal(err)
		}
		d, err := engine.Parse(p, engine.Options{})
		if err != nil {
			t.Fatal(err)
		}
		if err := d.Run(); err != nil {
			t.Fatal(err)
		}
		f, err := d.ResultsFile("test", "paper.results.json")
		if err != nil {
			t.Fatal(err)
		}
		return f
	}
	dir := t.TempDir()
	for name, alpha := range map[string]float64{"grid-2024.csv": -0.6, "grid-2025.csv": -0.01} {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(syntheticCSV("y", "x", gridlinkSynthetic(160, alpha))), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	old = build(dir, doc("grid-2024.csv", "2", ""))
	new = build(dir, doc("grid-2025.csv", "4", "sample: 2003-01..\n"))
	return old, new
}

// TestRefereeRound: the compare report of a designed referee round opens
// with the spec changes and then the conclusions a reader can see that
// flipped, with none of DOLS's hidden lead and lag coefficients among
// them; the renamed data file is a changed input of its alias; the
// published reports name results by label and caption, not by id or path.
func TestRefereeRound(t *testing.T) {
	t.Parallel()
	old, new := refereeRound(t)
	rep := revision.Compare(old, new, revision.Options{})
	lines := strings.Split(strings.TrimSpace(rep.Summary()), "\n")
	var specs, flips int
	for specs < len(lines) && strings.HasPrefix(lines[specs], "spec  ") {
		specs++
	}
	for specs+flips < len(lines) && strings.HasPrefix(lines[specs+flips], "FLIP  ") {
		flips++
	}
	head := strings.Join(lines[:specs+flips], "\n")
	for _, want := range []string{
		"spec  egtest [Table 1]: lags: 2 -> 4",
		"spec  statreg [Table 2]: sample: (not set) -> 2003-01..",
		"FLIP  egtest [Table 1]: rejects its null at 5%: yes -> no",
	} {
		if !strings.Contains(head, want) {
			t.Errorf("the report's first lines lack %q:\n%s", want, rep.Summary())
		}
	}
	if specs != 2 || flips == 0 {
		t.Errorf("%d spec lines and %d flips open the report:\n%s", specs, flips, rep.Summary())
	}
	if strings.Contains(head, "dynamics") {
		t.Errorf("hidden lead and lag coefficients among the flipped conclusions:\n%s", head)
	}
	// The hidden values did change (else the check above proves nothing),
	// and they are reported apart.
	hiddenDyn := false
	for _, it := range rep.Items {
		for _, h := range it.Hidden {
			if it.ID == "dolsfit" && strings.HasPrefix(h.What, "dynamics ") {
				hiddenDyn = true
			}
		}
		for _, f := range it.Flips {
			if strings.Contains(f.What, "dynamics") {
				t.Errorf("a hidden value counted as a conclusion: %+v", f)
			}
		}
	}
	if !hiddenDyn {
		t.Error("no change among DOLS's lead and lag coefficients was reported apart")
	}
	if !strings.Contains(rep.Summary(), "not shown in the paper:") {
		t.Errorf("the summary does not report the hidden changes apart:\n%s", rep.Summary())
	}
	// The data file renamed under the same alias is one changed input.
	if len(rep.InputsChanged) != 1 || rep.InputsChanged[0].Alias != "grid" || rep.InputsChanged[0].What() != "another file, content changed" {
		t.Errorf("inputs: %+v", rep.InputsChanged)
	}
	// Moves carry their unit; an estimate's is its standard error.
	ranked := rep.Ranked()
	if len(ranked) == 0 || !ranked[0].Scaled() {
		t.Fatalf("ranking: %+v", ranked)
	}
	for _, m := range ranked {
		if strings.HasSuffix(m.What, " est") && m.Unit != "s.e." {
			t.Errorf("%s moved in %q, not in standard errors", m.What, m.Unit)
		}
		if m.Item.ID == "dolsfit" && strings.HasPrefix(m.What, "dynamics") {
			t.Errorf("a hidden value ranked among the moved numbers: %+v", m)
		}
	}
	// Published reports: labels and captions, no ids, no paths.
	for name, out := range map[string]string{"markdown": string(rep.Markdown()), "html": string(rep.HTML()), "latex": string(rep.LaTeX())} {
		for _, bad := range []string{"egtest", "statreg", "dolsfit", "grid-2024.csv", "grid-2025.csv", "paper.results.json"} {
			if strings.Contains(out, bad) {
				t.Errorf("%s report shows %q", name, bad)
			}
		}
		if !strings.Contains(out, "Table 1: Engle") || !strings.Contains(out, "Granger test of y on x") {
			t.Errorf("%s report does not name the test by label and caption", name)
		}
	}
	md := string(rep.Markdown())
	if s, c := strings.Index(md, "Specification changes"), strings.Index(md, "Conclusions that changed"); s < 0 || c < s || strings.Index(md, "This report compares") < c {
		t.Errorf("the Markdown report does not open with the spec changes and the conclusions:\n%s", md)
	}
}

// TestNewValueIsNoFlip: a value present in one build only is listed, not
// counted as a flipped conclusion.
func TestNewValueIsNoFlip(t *testing.T) {
	t.Parallel()
	rec := func(v map[string]any) resultsfile.Record {
		return resultsfile.Record{ID: "a", Kind: "adf", Label: "Table 1", Values: v}
	}
	old := &resultsfile.File{Galley: "t", Manuscript: "p.md", Results: []resultsfile.Record{rec(map[string]any{"stat": -3.0})}}
	new := &resultsfile.File{Galley: "t", Manuscript: "p.md", Results: []resultsfile.Record{rec(map[string]any{"stat": -3.0, "reject_5": true})}}
	rep := revision.Compare(old, new, revision.Options{})
	if rep.HasFlips() || len(rep.Items) != 1 || len(rep.Items[0].Presence) != 1 {
		t.Errorf("flips %d, items %+v", rep.Flips(), rep.Items)
	}
}

// TestRevisionOnly: the revision directive's only: limits the report to
// the chosen results; an unknown id is an error at its list item.
func TestRevisionOnly(t *testing.T) {
	t.Parallel()
	csvOld := syntheticCSV("y", "x", gridlinkSynthetic(120, -0.5))
	csvNew := syntheticCSV("y", "x", gridlinkSynthetic(126, -0.5))
	fm := "---\ntitle: T\ndata:\n  grid:\n    path: new.csv\n    vintage:\n      first: old.csv\n---\n\n"
	body := fence("ols", "id: m1\ny: y\nx: [x]\ncaption: First\n") + "\n" + fence("ols", "id: m2\ny: x\nx: [y]\ncaption: Second\n") + "\n"
	files := map[string]string{"old.csv": csvOld, "new.csv": csvNew}
	res := runDoc(t, writeProject(t, fm+body+fence("revision", "id: rev\nagainst: first\nonly: [m2]\n"), files))
	tab := res["rev"].Table
	var stubs []string
	for _, r := range tab.Body {
		stubs = append(stubs, r.Cells[0].Text)
	}
	if !slices.Contains(stubs, "Second") || slices.Contains(stubs, "First") {
		t.Errorf("only: [m2] shows %q", stubs)
	}
	runBad(t, fm+body+fence("revision", "id: rev\nagainst: first\nonly: [m2, m3]\n"), files, "paper.md:", `no other directive has id "m3"`, "did you mean")
}
