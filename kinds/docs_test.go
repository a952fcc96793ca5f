package kinds

import (
	"os"
	"path/filepath"
	"regexp"
	"testing"

	"github.com/galley-econ/galley/engine"
)

// TestEveryKindDocumented: each registered directive kind has a section in
// docs/directives.md (or docs/figures.md), so the reference and the code
// cannot drift apart.
func TestEveryKindDocumented(t *testing.T) {
	t.Parallel()
	var docs []byte
	for _, f := range []string{"directives.md", "figures.md"} {
		b, err := os.ReadFile(filepath.Join("..", "docs", f))
		if err != nil {
			t.Fatal(err)
		}
		docs = append(docs, b...)
	}
	for _, k := range engine.Kinds() {
		re := regexp.MustCompile(`(?m)^#{2,3} .*\b` + regexp.QuoteMeta(k.Name) + `\b`)
		if !re.Match(docs) {
			t.Errorf("directive kind %q has no section in docs/", k.Name)
		}
	}
}
