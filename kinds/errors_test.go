package kinds

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
)

const testCSV = "date,north,south,fuel,twice\n" +
	"2004-01,60,70,100,120\n2004-02,61,69,101,122\n2004-03,59,71,99,118\n2004-04,62,72,102,124\n" +
	"2004-05,63,70,103,126\n2004-06,60,69,100,120\n2004-07,64,73,104,128\n2004-08,65,74,106,130\n"

// writeProject lays out a manuscript and its data in a temporary folder.
func writeProject(t *testing.T, manuscript string, files map[string]string) string {
	t.Helper()
	dir := t.TempDir()
	for name, body := range files {
		p := filepath.Join(dir, name)
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(p, []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	p := filepath.Join(dir, "paper.md")
	if err := os.WriteFile(p, []byte(manuscript), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

const front = "---\ntitle: T\ndata:\n  grid: data.csv\n---\n"

func fence(kind, body string) string { return "```galley " + kind + "\n" + body + "```\n" }

// TestBadInput: every bad input gives an error naming the file and line.
func TestBadInput(t *testing.T) {
	t.Parallel()
	olsBlock := fence("ols", "id: m\ndata: grid\ny: north\nx: [fuel]\n")
	cases := []struct {
		name  string
		doc   string
		files map[string]string
		want  []string // substrings of the error, in order
	}{
		{"missing data file", front + "\n" + olsBlock, map[string]string{},
			[]string{"paper.md:9:", `data alias "grid"`, "does not exist"}},
		{"malformed CSV row", front + "\n" + olsBlock, map[string]string{"data.csv": "date,north,fuel\n2004-01,1,2\n2004-02,abc,3\n"},
			[]string{"data.csv:3", "north"}},
		{"unknown column", front + "\n" + fence("ols", "id: m\ndata: grid\ny: nort\nx: [fuel]\n"), map[string]string{"data.csv": testCSV},
			[]string{"paper.md:10:", `no column "nort"`, "did you mean north?"}},
		{"unknown kind", front + "\n" + fence("olss", "id: m\n"), nil,
			[]string{"paper.md:7:", `unknown directive kind "olss"`, "did you mean ols?"}},
		{"duplicate id", front + "\n" + olsBlock + "\n" + olsBlock, map[string]string{"data.csv": testCSV},
			[]string{"paper.md:14:", `duplicate id "m"`, "line 7"}},
		{"bad yaml", front + "\n" + fence("ols", "id: m\ny: [north\n"), nil,
			[]string{"paper.md:"}},
		{"unknown key", front + "\n" + fence("ols", "id: m\ndata: grid\ny: north\nregresors: [fuel]\n"), nil,
			[]string{"paper.md:11:", `unknown key "regresors"`}},
		{"sample outside data", front + "\n" + fence("ols", "id: m\ndata: grid\ny: north\nx: [fuel]\nsample: 1990-01..1995-12\n"), map[string]string{"data.csv": testCSV},
			[]string{"paper.md:12:", "sample", "starts before the data"}},
		{"too few observations", front + "\n" + fence("ols", "id: m\ndata: grid\ny: north\nx: [fuel, south]\nsample: 2004-01..2004-03\n"), map[string]string{"data.csv": testCSV},
			[]string{"paper.md:7:", "too few observations"}},
		{"collinear", front + "\n" + fence("ols", "id: m\ndata: grid\ny: north\nx: [fuel, twice]\n"), map[string]string{"data.csv": "date,north,fuel,twice\n2004-01,60,100,200\n2004-02,61,101,202\n2004-03,59,99,198\n2004-04,62,102,204\n2004-05,63,103,206\n"},
			[]string{"paper.md:11:", `"twice"`, "collinear", "fuel"}},
		{"inline unknown id", front + "\nThe slope is {{mm.coef.fuel.est}}.\n\n" + olsBlock, map[string]string{"data.csv": testCSV},
			[]string{"paper.md:7:", `no directive has id "mm"`, "did you mean m?"}},
		{"inline unknown field", front + "\nThe fit is {{m.r3}}.\n\n" + olsBlock, map[string]string{"data.csv": testCSV},
			[]string{"paper.md:7:", `no field "r3"`, "did you mean r2?"}},
		{"inline unknown term", front + "\nThe slope is {{m.coef.fuels.est}}.\n\n" + olsBlock, map[string]string{"data.csv": testCSV},
			[]string{"paper.md:7:", `"fuels"`, "did you mean fuel?"}},
		{"unknown alias", front + "\n" + fence("ols", "id: m\ndata: gird\ny: north\n"), map[string]string{"data.csv": testCSV},
			[]string{"paper.md:9:", `unknown data alias "gird"`, "did you mean grid?"}},
		{"bad se", front + "\n" + fence("ols", "id: m\ndata: grid\ny: north\nse: hc3\n"), map[string]string{"data.csv": testCSV},
			[]string{"paper.md:11:", `unknown standard-error type "hc3"`}},
		{"outside folder", "---\ndata:\n  grid: ../data.csv\n---\n\n" + olsBlock, nil,
			[]string{"paper.md:8:", "outside the manuscript's folder"}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			p := writeProject(t, tc.doc, tc.files)
			doc, err := engine.Parse(p, engine.Options{})
			if err == nil {
				err = doc.Run()
			}
			if err == nil {
				t.Fatal("no error")
			}
			inOrder(t, err.Error(), tc.want)
		})
	}
}

// inOrder fails the test unless msg contains each of want, in order.
func inOrder(t *testing.T, msg string, want []string) {
	t.Helper()
	at := 0
	for _, w := range want {
		i := strings.Index(msg[at:], w)
		if i < 0 {
			t.Fatalf("error %q lacks %q (in order)", msg, w)
		}
		at += i + len(w)
	}
}
