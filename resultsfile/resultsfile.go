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

// Input is a data file a build read, its hash, and the data alias of the
// front matter that named it (so that a file renamed under the same alias
// is the same input, changed).
type Input struct {
	Path   string `json:"path"`
	SHA256 string `json:"sha256"`
	Alias  string `json:"alias,omitempty"`
}

// Record is one directive's result: its id, kind, manuscript line, table
// or figure number and label ("Table 3"), caption, spec as written and
// values.
//
// Which values a reader sees: when Label is set the result is a table or
// figure in the paper, and every value is shown there except those under
// the top-level keys in Hidden (numbers estimated but not shown, such as
// the coefficients of DOLS's leads and lags, and the dated series a result
// carries for others); Quoted lists the value paths (dot-separated, as
// written in {{id.path}}) the prose quotes, which are seen whatever
// Hidden says.
type Record struct {
	ID      string         `json:"id"`
	Kind    string         `json:"kind"`
	Line    int            `json:"line"`
	Number  int            `json:"number,omitempty"`
	Label   string         `json:"label,omitempty"`
	Caption string         `json:"caption,omitempty"`
	Hidden  []string       `json:"hidden,omitempty"`
	Quoted  []string       `json:"quoted,omitempty"`
	Spec    map[string]any `json:"spec"`
	Values  map[string]any `json:"values"`
}

// Name is how a published report names the record: "Table 3: caption",
// the label or the caption alone, or (for a result the paper does not
// show) "id (kind)".
func (r Record) Name() string {
	switch {
	case r.Label != "" && r.Caption != "":
		return r.Label + ": " + r.Caption
	case r.Label != "":
		return r.Label
	case r.Caption != "":
		return r.Caption
	}
	return r.ID + " (" + r.Kind + ")"
}

// Parse reads a results file from b; name labels it in errors and
// becomes its Path.
func Parse(b []byte, name string) (*File, error) {
	var f File
	if err := json.Unmarshal(b, &f); err != nil {
		return nil, fmt.Errorf("%s: not a galley results file: %v", name, err)
	}
	if err := Check(&f, name); err != nil {
		return nil, err
	}
	f.Path = name
	return &f, nil
}

// Check refuses a file that is not a galley results file: no version or
// no results, a result without an id, kind or values, two results with
// one id. name labels it in errors.
func Check(f *File, name string) error {
	if f.Galley == "" || f.Results == nil {
		return fmt.Errorf("%s: not a galley results file (no \"galley\" version or \"results\")", name)
	}
	seen := map[string]bool{}
	for i, r := range f.Results {
		switch {
		case r.ID == "" || r.Kind == "":
			return fmt.Errorf("%s: result %d has no id or no kind; not a galley results file", name, i+1)
		case r.Values == nil:
			return fmt.Errorf("%s: result %q has no values; not a galley results file", name, r.ID)
		case seen[r.ID]:
			return fmt.Errorf("%s: two results have the id %q; not a galley results file", name, r.ID)
		}
		seen[r.ID] = true
	}
	return nil
}

// Load reads the results file at path.
func Load(path string) (*File, error) {
	b, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	return Parse(b, path)
}
