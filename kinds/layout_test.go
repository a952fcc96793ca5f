package kinds

import (
	"go/parser"
	"go/token"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

const module = "github.com/galley-econ/galley/"

// TestDirectivePackagesStandAlone: no directive family imports another
// (they read each other's results through engine/contract), the engine
// and the writers import no directive family, the manuscript reader
// knows nothing of the engine or of any estimator (only of dates,
// frequencies and samples, from analysis/series), and analysis imports
// nothing of galley's but analysis.
func TestDirectivePackagesStandAlone(t *testing.T) {
	t.Parallel()
	root := ".."
	rules := []struct {
		dir    string
		banned []string
	}{
		{"directive", []string{"directive/", "kinds", "cmd/"}},
		{"engine", []string{"directive/", "kinds", "cmd/", "write/"}},
		{"write", []string{"directive/", "kinds", "cmd/"}},
		{"manuscript", []string{"engine", "directive/", "kinds", "cmd/", "write/", "analysis/coint", "analysis/ecm", "analysis/johansen", "analysis/longrun", "analysis/ols", "analysis/unitroot", "analysis/simulate"}},
		{"analysis", []string{"engine", "directive/", "kinds", "cmd/", "figures", "dataio", "revision"}},
	}
	for _, r := range rules {
		err := filepath.WalkDir(filepath.Join(root, r.dir), func(path string, d os.DirEntry, err error) error {
			if err != nil || d.IsDir() || !strings.HasSuffix(path, ".go") || strings.HasSuffix(path, "_test.go") {
				return err
			}
			f, err := parser.ParseFile(token.NewFileSet(), path, nil, parser.ImportsOnly)
			if err != nil {
				return err
			}
			own := filepath.ToSlash(filepath.Dir(strings.TrimPrefix(path, root+string(filepath.Separator))))
			for _, imp := range f.Imports {
				p, _ := strconv.Unquote(imp.Path.Value)
				rel, ok := strings.CutPrefix(p, module)
				if !ok || rel == own {
					continue
				}
				for _, b := range r.banned {
					if strings.HasPrefix(rel+"/", b) || rel == strings.TrimSuffix(b, "/") {
						t.Errorf("%s imports %s", path, p)
					}
				}
			}
			return nil
		})
		if err != nil {
			t.Fatal(err)
		}
	}
}
