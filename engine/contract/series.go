package contract

import "github.com/galley-econ/galley/analysis/series"

// Dated is a dated series a result carries for other directives and for
// figures: a regression's residuals, actual and fitted values, or an
// estimated cointegrating relation β'ỹ_t.
type Dated struct {
	Dates  []series.Date
	Values []float64
}

// NewDated copies dates and values (which must have the same length).
func NewDated(dates []series.Date, values []float64) Dated {
	return Dated{Dates: append([]series.Date(nil), dates...), Values: append([]float64(nil), values...)}
}

// ResultsForm is the series as the results file holds it:
// {"dates": ["2004-01", …], "values": […]}, dates in the canonical text
// of series.Date.String.
func (d Dated) ResultsForm() map[string]any {
	ds := make([]string, len(d.Dates))
	for i, dt := range d.Dates {
		ds[i] = dt.String()
	}
	return map[string]any{"dates": ds, "values": append([]float64(nil), d.Values...)}
}

// At maps each date's canonical text to its value.
func (d Dated) At() map[string]float64 {
	m := make(map[string]float64, len(d.Dates))
	for i, dt := range d.Dates {
		m[dt.String()] = d.Values[i]
	}
	return m
}
