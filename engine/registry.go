package engine

import (
	"fmt"
	"sort"

	"github.com/galley-econ/galley/manuscript"
)

// Directive is one decoded analysis block. Each kind is a struct whose
// YAML fields are its keys; it embeds Common for the keys every kind has.
type Directive interface {
	Base() *Common
	// Check validates the spec against the document and its data without
	// running the analysis.
	Check(c *Context) error
	// Run performs the analysis and returns its result.
	Run(c *Context) (*Result, error)
}

// Common holds the keys every directive accepts.
type Common struct {
	ID      string `yaml:"id"`
	Caption string `yaml:"caption"`
	Note    string `yaml:"note"`
	// Missing says what to do with a missing value inside the sample:
	// "error" (the default) or "drop" (the observation is left out, and the
	// table note lists the dates).
	Missing string `yaml:"missing"`
}

// Base returns the common keys.
func (c *Common) Base() *Common { return c }

// Kind describes a directive kind.
type Kind struct {
	Name    string
	Summary string
	New     func() Directive
	// Fields are the top-level value names its results carry, for checking
	// inline references before anything runs. Nil means any.
	Fields []string
	// Simulate: the kind accepts crit: simulate (SimKeys).
	Simulate bool
	// Model: its results are one estimated equation (Result.Model is
	// set), so model tables and estimated equations can show them.
	Model bool
}

var kinds = map[string]*Kind{}

// Register adds a directive kind; each kind's file calls it from init.
func Register(k Kind) {
	if _, dup := kinds[k.Name]; dup {
		panic("engine: directive kind registered twice: " + k.Name)
	}
	kk := k
	kinds[k.Name] = &kk
}

// Kinds lists the registered kinds by name.
func Kinds() []*Kind {
	out := make([]*Kind, 0, len(kinds))
	for _, k := range kinds {
		out = append(out, k)
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Name < out[j].Name })
	return out
}

func kindNames() []string {
	var names []string
	for _, k := range Kinds() {
		names = append(names, k.Name)
	}
	return names
}

func LookupKind(name string) (*Kind, error) {
	k, ok := kinds[name]
	if !ok {
		return nil, fmt.Errorf("unknown directive kind %q%s", name, manuscript.DidYouMean(name, kindNames()))
	}
	return k, nil
}
