package manuscript

import (
	"reflect"
	"testing"

	"gopkg.in/yaml.v3"
)

// TestRejoinFlowLists: commas inside an expression's parentheses do not
// split a flow list; block lists, quoted items and balanced items are
// left as written; an item that never balances is left for the
// expression parser to report.
func TestRejoinFlowLists(t *testing.T) {
	for _, c := range []struct {
		in   string
		want []string
	}{
		{"x: [dlog(y), lag(dlog(c), 1)]", []string{"dlog(y)", "lag(dlog(c), 1)"}},
		{"x: [lag(x, 2), sdiff(y, 4), z]", []string{"lag(x, 2)", "sdiff(y, 4)", "z"}},
		{"x: [lag(lag(x, 1), 2)]", []string{"lag(lag(x, 1), 2)"}},
		{"x: [a, b]", []string{"a", "b"}},
		{"x: ['lag(x', '1)']", []string{"lag(x", "1)"}},
		{"x: [lag(x, 1]", []string{"lag(x", "1"}},
		{"x:\n  - lag(x, 1)\n  - y", []string{"lag(x, 1)", "y"}},
	} {
		var doc yaml.Node
		if err := yaml.Unmarshal([]byte(c.in), &doc); err != nil {
			t.Fatal(err)
		}
		RejoinFlowLists(&doc)
		var got struct{ X []string }
		if err := doc.Decode(&got); err != nil {
			t.Fatal(err)
		}
		if !reflect.DeepEqual(got.X, c.want) {
			t.Errorf("%s: %q, want %q", c.in, got.X, c.want)
		}
	}
}
