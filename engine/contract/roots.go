package contract

import (
	"fmt"
	"math"
)

// ReadRoots reads the companion roots of an estimated VECM from a
// result's values, in the form the johansen and vecm directives write
// them (docs/directives.md, johansen): "roots", a list of {re, im,
// modulus} largest modulus first, and "unit_roots", the number K − r of
// leading roots that the rank sets to one. It accepts the values as built
// and after a round trip through the result cache's JSON.
func ReadRoots(values map[string]any) ([]complex128, int, error) {
	raw, ok := values["roots"]
	if !ok || raw == nil {
		return nil, 0, fmt.Errorf("the result carries no companion roots (its rank must be 1 … K−1)")
	}
	list, err := mapList("roots", raw)
	if err != nil {
		return nil, 0, err
	}
	out := make([]complex128, len(list))
	for i, m := range list {
		re, ok1 := m["re"].(float64)
		im, ok2 := m["im"].(float64)
		if !ok1 || !ok2 || math.IsNaN(re) || math.IsNaN(im) {
			return nil, 0, fmt.Errorf("roots: entry %d has no numeric re and im", i+1)
		}
		out[i] = complex(re, im)
	}
	var unit int
	switch u := values["unit_roots"].(type) {
	case int:
		unit = u
	case float64:
		unit = int(u)
		if float64(unit) != u {
			return nil, 0, fmt.Errorf("unit_roots: %g is not a whole number", u)
		}
	default:
		return nil, 0, fmt.Errorf("the result does not say how many unit roots its rank imposes")
	}
	if len(out) == 0 || unit < 0 || unit > len(out) {
		return nil, 0, fmt.Errorf("roots: %d unit roots among %d roots", unit, len(out))
	}
	return out, unit, nil
}
