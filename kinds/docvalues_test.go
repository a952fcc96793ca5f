package kinds

import (
	"os"
	"regexp"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
)

// TestFieldsDocumented: every value a kind accepts in {{id.field}} (its
// Fields) is named, in backquotes, in that kind's section of
// docs/directives.md or docs/figures.md. With
// TestProducedValuesAreAccepted (every value produced is accepted) this
// keeps the reference, the check before a build and the results in step.
func TestFieldsDocumented(t *testing.T) {
	t.Parallel()
	heading := regexp.MustCompile(`(?m)^#{2,3} (.*)$`)
	sections := map[string]string{} // kind → its section's text
	for _, f := range []string{"../docs/directives.md", "../docs/figures.md"} {
		b, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		text := string(b)
		idx := heading.FindAllStringSubmatchIndex(text, -1)
		for i, m := range idx {
			end := len(text)
			if i+1 < len(idx) {
				end = idx[i+1][0]
			}
			for _, w := range strings.FieldsFunc(text[m[2]:m[3]], func(r rune) bool { return r == ',' || r == ' ' }) {
				sections[w] += text[m[0]:end]
			}
		}
	}
	sections["figure"] += sections["Values"] // figures.md lists the figure's values under its own heading
	// "those of the `adf` result": a section may take another's values.
	inherit := regexp.MustCompile("those of the `([a-z-]+)` result")
	for k, sec := range sections {
		for _, m := range inherit.FindAllStringSubmatch(sec, -1) {
			sections[k] += sections[m[1]]
		}
	}
	for _, k := range engine.Kinds() {
		sec, ok := sections[k.Name]
		if !ok {
			continue // TestEveryKindDocumented reports it
		}
		for _, f := range k.Fields {
			if !strings.Contains(sec, "`"+f+"`") && !strings.Contains(sec, "`"+f+" ") && !strings.Contains(sec, "`"+f+"(") {
				t.Errorf("kind %s accepts the value %q, which its section of the docs does not name", k.Name, f)
			}
		}
	}
}
