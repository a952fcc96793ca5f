package resultsfile

import (
	"strings"
	"testing"
)

// TestParseValidates: a results file whose records lack an id, a kind or
// values, or repeat an id, is refused with a message naming it.
func TestParseValidates(t *testing.T) {
	for _, c := range []struct{ json, want string }{
		{`{"galley": "1", "results": [{"kind": "adf", "values": {}}]}`, "no id or no kind"},
		{`{"galley": "1", "results": [{"id": "a", "values": {}}]}`, "no id or no kind"},
		{`{"galley": "1", "results": [{"id": "a", "kind": "adf"}]}`, `"a" has no values`},
		{`{"galley": "1", "results": [{"id": "a", "kind": "adf", "values": {}}, {"id": "a", "kind": "ols", "values": {}}]}`, `two results have the id "a"`},
		{`{"galley": "1", "results": [{"id": "a", "kind": "adf", "values": {"stat": 1}}]}`, ""},
	} {
		_, err := Parse([]byte(c.json), "r.json")
		switch {
		case c.want == "" && err != nil:
			t.Errorf("%s: %v", c.json, err)
		case c.want != "" && (err == nil || !strings.Contains(err.Error(), c.want) || !strings.Contains(err.Error(), "r.json")):
			t.Errorf("%s: %v, want %q", c.json, err, c.want)
		}
	}
}
