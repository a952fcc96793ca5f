package engine

import (
	"encoding/json"
	"math"
	"path/filepath"
)

// ResultsFile is the machine-readable record of a build: every result's
// values at full precision, with the inputs' hashes, so that two builds
// can be compared number by number.
type ResultsFile struct {
	Galley     string          `json:"galley"`
	Manuscript string          `json:"manuscript"`
	Vintage    string          `json:"vintage,omitempty"`
	Inputs     []Input         `json:"inputs"`
	Results    []ResultsRecord `json:"results"`
}

// ResultsRecord is one result in the results file.
type ResultsRecord struct {
	ID     string         `json:"id"`
	Kind   string         `json:"kind"`
	Line   int            `json:"line"`
	Number int            `json:"number,omitempty"`
	Spec   map[string]any `json:"spec"`
	Values map[string]any `json:"values"`
}

// ResultsJSON renders the results file.
func (d *Document) ResultsJSON(version string) ([]byte, error) {
	rf := ResultsFile{Galley: version, Manuscript: filepath.Base(d.File), Vintage: d.opts.Vintage, Inputs: d.Inputs()}
	if rf.Inputs == nil {
		rf.Inputs = []Input{}
	}
	for _, r := range d.Results() {
		spec := r.Spec
		if spec == nil {
			spec = map[string]any{}
		}
		rf.Results = append(rf.Results, ResultsRecord{ID: r.ID, Kind: r.Kind, Line: r.Line, Number: r.Number, Spec: spec, Values: JsonSafe(r.Values).(map[string]any)})
	}
	if rf.Results == nil {
		rf.Results = []ResultsRecord{}
	}
	b, err := json.MarshalIndent(rf, "", " ")
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}

// JsonSafe replaces NaN and ±Inf (which JSON cannot hold) by null and the
// strings "inf"/"-inf".
func JsonSafe(v any) any {
	switch x := v.(type) {
	case float64:
		switch {
		case math.IsNaN(x):
			return nil
		case math.IsInf(x, 1):
			return "inf"
		case math.IsInf(x, -1):
			return "-inf"
		}
		return x
	case []float64:
		out := make([]any, len(x))
		for i, e := range x {
			out[i] = JsonSafe(e)
		}
		return out
	case map[string]any:
		out := make(map[string]any, len(x))
		for k, e := range x {
			out[k] = JsonSafe(e)
		}
		return out
	case []map[string]any:
		out := make([]any, len(x))
		for i, e := range x {
			out[i] = JsonSafe(e)
		}
		return out
	case []any:
		out := make([]any, len(x))
		for i, e := range x {
			out[i] = JsonSafe(e)
		}
		return out
	}
	return v
}
