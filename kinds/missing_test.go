package kinds

import (
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
)

// TestMissingDrop: an interior gap is an error unless the directive says
// missing: drop; then the observation is left out and the note says so.
func TestMissingDrop(t *testing.T) {
	t.Parallel()
	csv := strings.Replace(testCSV, "2004-04,62,72,102,124", "2004-04,,72,102,124", 1)
	body := "id: m\ndata: grid\ny: north\nx: [fuel]\n"
	p := writeProject(t, front+"\n"+fence("ols", body), map[string]string{"data.csv": csv})
	if doc, err := engine.Parse(p, engine.Options{}); err != nil || doc.Run() == nil {
		t.Fatal("an interior gap was accepted without missing: drop")
	}
	p = writeProject(t, front+"\n"+fence("ols", body+"missing: drop\n"), map[string]string{"data.csv": csv})
	doc, err := engine.Parse(p, engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := doc.Run(); err != nil {
		t.Fatal(err)
	}
	r := doc.Results()[0]
	if r.Values["nobs"] != 7 {
		t.Errorf("nobs = %v, want 7", r.Values["nobs"])
	}
	if !strings.Contains(strings.Join(r.Table.Notes, " "), "1 observations with missing values inside the sample were left out (2004-04)") {
		t.Errorf("notes do not name the dropped date: %q", r.Table.Notes)
	}
	p = writeProject(t, front+"\n"+fence("ols", body+"missing: skip\n"), map[string]string{"data.csv": csv})
	if _, err := engine.Parse(p, engine.Options{}); err == nil || !strings.Contains(err.Error(), "paper.md:12:") {
		t.Errorf("missing: skip: %v", err)
	}
}

// TestMissingDropDownstream: a directive that builds on another's
// relation or regression reads the data with that directive's
// missing-value rule, so that an ecm on an engle-granger, or a figure of
// an ols, with missing: drop sees the observations it was estimated on
// (it used to re-read them with its own rule and fail at the gap).
func TestMissingDropDownstream(t *testing.T) {
	t.Parallel()
	csv := syntheticCSV("y", "x", gridlinkSynthetic(80, -0.5))
	lines := strings.Split(csv, "\n")
	lines[30] = strings.Split(lines[30], ",")[0] + ",," + strings.Split(lines[30], ",")[2] // y missing in 2003-06
	csv = strings.Join(lines, "\n")
	body := fence("engle-granger", "id: eg\ndata: grid\ny: y\nx: [x]\nlags: 1\nmissing: drop\n") + "\n" +
		fence("ecm", "id: e\nfrom: eg\n") + "\n" +
		fence("ols", "id: m\ndata: grid\ny: y\nx: [x]\nmissing: drop\n") + "\n" +
		fence("figure", "id: f\nplot: actual-fitted\nof: m\n")
	p := writeProject(t, front+"\n"+body, map[string]string{"data.csv": csv})
	doc, err := engine.Parse(p, engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := doc.Run(); err != nil {
		t.Fatalf("downstream of missing: drop: %v", err)
	}
	for _, r := range doc.Results() {
		if r.ID == "e" && !strings.Contains(strings.Join(r.Table.Notes, " "), "2003-06") {
			t.Errorf("the ecm's notes do not name the dropped date: %q", r.Table.Notes)
		}
	}
}
