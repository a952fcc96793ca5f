package engine

// Helpers the directive families share: reading common keys and writing
// the results-file form of dates, samples and residuals.

import (
	"errors"
	"fmt"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/restrict"
	"github.com/galley-econ/galley/manuscript"
)

// ParseDet reads a det: key (default c).
func ParseDet(c *Context, det string) (critical.Case, error) {
	if det == "" {
		return critical.Const, nil
	}
	d, err := critical.ParseCase(det)
	if err != nil {
		return d, c.Errorf("det", "%v", err)
	}
	return d, nil
}

// SampleValues is the results-file form of a sample.
func SampleValues(d *Data) map[string]any {
	return map[string]any{"from": d.Dates[0].String(), "to": d.Dates[len(d.Dates)-1].String(), "n": d.N()}
}

func DecimalsOr(c *Context, d *int) int {
	if d != nil {
		return *d
	}
	return c.Decimals()
}

// ParseRestriction reads a linear restriction in galley's one grammar
// (analysis/restrict) on the named coefficients; an unknown term is
// answered with the closest name.
func ParseRestriction(text string, names []string, opt restrict.Options) (*restrict.Linear, error) {
	lin, err := restrict.Parse(text, names, opt)
	var re *restrict.Error
	if errors.As(err, &re) && errors.Is(err, restrict.ErrUnknownTerm) {
		return nil, fmt.Errorf("%w%s", err, manuscript.DidYouMean(re.Term, names))
	}
	return lin, err
}
