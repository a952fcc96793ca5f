// Package resultsfile is the schema of the results file every build
// writes beside its outputs (NAME.results.json): which galley wrote it,
// the manuscript, the data vintage, the data files read with their
// SHA-256, and every directive's spec and values at full precision. The
// engine writes it; comparisons (package revision, `galley compare`, the
// revision directive) read it back. Keys are lower case.
package resultsfile

import (
	"encoding/json"
	"fmt"
	"os"
)

// File is a results file.
type File struct {
	Path       string   `json:"-"` // where it was read from, or a label
	Galley     string   `json:"galley"`
	Manuscript string   `json:"manuscript"`
	Vintage    string   `json:"vintage,omitempty"`
	Inputs     []Input  `json:"inputs"`
	Results    []Record `json:"results"`
}

// Input is a data file a build read, and its hash.
type Input struct {
	Path   string `json:"path"`
	SHA256 string `json:"sha256"`
}

// Record is one directive's result: its id, kind, manuscript line, table
// or figure number, spec as written and values.
type Record struct {
	ID     string         `json:"id"`
	Kind   string         `json:"kind"`
	Line   int            `json:"line"`
	Number int            `json:"number,omitempty"`
	Spec   map[string]any `json:"spec"`
	Values map[string]any `json:"values"`
}

// Parse reads a results file from b; name labels it in errors and
// becomes its Path.
func Parse(b []byte, name string) (*File, error) {
	var f File
	if err := json.Unmarshal(b, &f); err != nil {
		return nil, fmt.Errorf("%s: not a galley results file: %v", name, err)
	}
	if f.Galley == "" || f.Results == nil {
		return nil, fmt.Errorf("%s: not a galley results file (no \"galley\" version or \"results\")", name)
	}
	f.Path = name
	return &f, nil
}

// Load reads the results file at path.
func Load(path string) (*File, error) {
	b, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	return Parse(b, path)
}
