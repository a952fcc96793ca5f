package engine

// Helpers the directive families share: reading common keys and writing
// the results-file form of dates, samples and residuals.

import (
	"fmt"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/series"
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

// ResidValues is the results-file form of a residual series.
func ResidValues(d *Data, first int, e []float64) map[string]any {
	dates := make([]string, len(e))
	for i := range e {
		dates[i] = d.Dates[first+i].String()
	}
	return map[string]any{"dates": dates, "values": append([]float64(nil), e...)}
}

// DatedValues is the results-file form of a dated series:
// {"dates": [...], "values": [...]}, the shape figure directives read
// back (see residualSeries in figure_data.go).
func DatedValues(dates []series.Date, v []float64) map[string]any {
	ds := make([]string, len(dates))
	for i, d := range dates {
		ds[i] = d.String()
	}
	return map[string]any{"dates": ds, "values": append([]float64(nil), v...)}
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

// ResidSeries reads the long-run residuals a result stores in
// Values["resid"] as {dates, values}.
func ResidSeries(r *Result) ([]string, map[string]float64, error) {
	m, ok := r.Values["resid"].(map[string]any)
	if !ok {
		return nil, nil, fmt.Errorf("the %s result has no residual series", r.Kind)
	}
	dates, ok1 := m["dates"].([]string)
	vals, ok2 := m["values"].([]float64)
	if !ok1 || !ok2 || len(dates) != len(vals) {
		return nil, nil, fmt.Errorf("the %s result's residual series is malformed", r.Kind)
	}
	out := make(map[string]float64, len(dates))
	for i, d := range dates {
		out[d] = vals[i]
	}
	return dates, out, nil
}
