package contract

import (
	"fmt"
	"math"
)

// Multiplier is the cumulative dynamic multiplier path of one decomposed
// regressor of an asymmetric model, as a figure draws it: the response
// of the dependent variable after h = 0…H periods to a unit rise (Pos)
// and to a unit fall (Neg) of the regressor, their sum Asym (zero under
// symmetry), and the long-run limits of the first two.
type Multiplier struct {
	Name             string
	Pos, Neg, Asym   []float64
	LongPos, LongNeg float64
}

// MultiplierSource is implemented by the directives whose result carries
// multiplier paths (an ARDL with decomposed regressors). HasMultipliers
// says whether this directive, as written, decomposes any regressor.
type MultiplierSource interface {
	HasMultipliers() bool
}

// MultiplierValues is the results-file form of multiplier paths, the
// form ReadMultipliers reads back: a list of {name, horizon, pos, neg,
// asym, longrun_pos, longrun_neg}.
func MultiplierValues(ms []Multiplier) []map[string]any {
	out := make([]map[string]any, len(ms))
	for i, m := range ms {
		h := make([]int, len(m.Pos))
		for j := range h {
			h[j] = j
		}
		out[i] = map[string]any{"name": m.Name, "horizon": h, "pos": m.Pos, "neg": m.Neg, "asym": m.Asym,
			"longrun_pos": m.LongPos, "longrun_neg": m.LongNeg}
	}
	return out
}

// ReadMultipliers reads the multiplier paths from a result's values (as
// written by MultiplierValues, or after a round trip through the result
// cache's JSON).
func ReadMultipliers(values map[string]any) ([]Multiplier, error) {
	raw, ok := values["multipliers"]
	if !ok || raw == nil {
		return nil, fmt.Errorf("the result carries no multipliers")
	}
	list, err := mapList("multipliers", raw)
	if err != nil {
		return nil, err
	}
	var out []Multiplier
	for _, m := range list {
		var e Multiplier
		e.Name, _ = m["name"].(string)
		if e.Pos, err = floats(m["pos"]); err != nil {
			return nil, err
		}
		if e.Neg, err = floats(m["neg"]); err != nil {
			return nil, err
		}
		if e.Asym, err = floats(m["asym"]); err != nil {
			return nil, err
		}
		e.LongPos, _ = m["longrun_pos"].(float64)
		e.LongNeg, _ = m["longrun_neg"].(float64)
		if len(e.Pos) == 0 || len(e.Neg) != len(e.Pos) || len(e.Asym) != len(e.Pos) {
			return nil, fmt.Errorf("multipliers of %s: paths of unequal length", e.Name)
		}
		out = append(out, e)
	}
	if len(out) == 0 {
		return nil, fmt.Errorf("the result carries no multipliers")
	}
	return out, nil
}

func floats(v any) ([]float64, error) {
	switch x := v.(type) {
	case []float64:
		return x, nil
	case []any:
		out := make([]float64, len(x))
		for i, e := range x {
			f, ok := e.(float64)
			if !ok {
				if e == nil {
					f = math.NaN()
				} else {
					return nil, fmt.Errorf("multipliers: a value is not a number")
				}
			}
			out[i] = f
		}
		return out, nil
	}
	return nil, fmt.Errorf("multipliers: malformed path")
}

// mapList reads a list of mappings from values as built ([]map[string]any)
// or after a round trip through JSON ([]any of map[string]any); what names
// the value in errors.
func mapList(what string, raw any) ([]map[string]any, error) {
	switch x := raw.(type) {
	case []map[string]any:
		return x, nil
	case []any:
		list := make([]map[string]any, 0, len(x))
		for _, e := range x {
			m, ok := e.(map[string]any)
			if !ok {
				return nil, fmt.Errorf("%s: malformed entry", what)
			}
			list = append(list, m)
		}
		return list, nil
	}
	return nil, fmt.Errorf("%s: malformed value", what)
}
