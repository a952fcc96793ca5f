package contract

import (
	"encoding/json"
	"testing"
)

// TestReadRoots: the roots as a directive writes them and after a JSON
// round trip, and malformed values as errors.
func TestReadRoots(t *testing.T) {
	v := map[string]any{"roots": []map[string]any{{"re": 1.0, "im": 0.0, "modulus": 1.0}, {"re": 0.5, "im": -0.25, "modulus": 0.559}}, "unit_roots": 1}
	b, err := json.Marshal(v)
	if err != nil {
		t.Fatal(err)
	}
	var back map[string]any
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	for _, vals := range []map[string]any{v, back} {
		z, u, err := ReadRoots(vals)
		if err != nil {
			t.Fatal(err)
		}
		if len(z) != 2 || z[1] != complex(0.5, -0.25) || u != 1 {
			t.Errorf("got %v, %d", z, u)
		}
	}
	for _, bad := range []map[string]any{
		{},
		{"roots": "x", "unit_roots": 1},
		{"roots": []any{1.0}, "unit_roots": 1},
		{"roots": []any{map[string]any{"re": 1.0}}, "unit_roots": 1},
		{"roots": v["roots"]},
		{"roots": v["roots"], "unit_roots": 1.5},
		{"roots": v["roots"], "unit_roots": 3},
	} {
		if _, _, err := ReadRoots(bad); err == nil {
			t.Errorf("%v: no error", bad)
		}
	}
}
