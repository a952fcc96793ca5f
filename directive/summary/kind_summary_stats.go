package summary

import (
	"math"

	"gonum.org/v1/gonum/stat"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/table"
)

// summary-stats: per-series summary statistics.
type summarySpec struct {
	engine.Common `yaml:",inline"`
	Data          string   `yaml:"data"`
	Series        []string `yaml:"series"`
	Sample        string   `yaml:"sample"`
	Decimals      *int     `yaml:"decimals"`
}

func init() {
	engine.Register(engine.Kind{
		Name:     "summary-stats",
		Formerly: []string{"descriptives"},
		Summary:  "N, mean, standard deviation, minimum, maximum and date range of each series",
		New:      func() engine.Directive { return &summarySpec{} },
		Fields:   []string{"series"},
	})
}

func (s *summarySpec) Check(c *engine.Context) error {
	if err := c.Require("series", len(s.Series) == 0); err != nil {
		return err
	}
	return c.CheckData(c.DataAlias(s.Data), s.Series, s.Sample)
}

func (s *summarySpec) Run(c *engine.Context) (*engine.Result, error) {
	dec := c.Decimals()
	if s.Decimals != nil {
		dec = *s.Decimals
	}
	t := &table.Table{Stub: 1, Head: [][]table.Cell{{table.T("Series"), table.T("N"), table.T("Mean"), table.T("Std. dev."), table.T("Min"), table.T("Max"), table.T("First"), table.T("Last")}}}
	var vals []map[string]any
	for _, name := range s.Series {
		d, err := c.Data(c.DataAlias(s.Data), []string{name}, s.Sample)
		if err != nil {
			return nil, err
		}
		x := d.Cols[0]
		mean, sd := stat.MeanStdDev(x, nil)
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, v := range x {
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
		first, last := d.Dates[0].String(), d.Dates[len(d.Dates)-1].String()
		t.Body = append(t.Body, table.Row{Cells: []table.Cell{c.TermCell(name), table.I(len(x)), table.N(mean, dec), table.N(sd, dec), table.N(lo, dec), table.N(hi, dec), table.T(first), table.T(last)}})
		vals = append(vals, map[string]any{"name": name, "n": len(x), "mean": mean, "sd": sd, "min": lo, "max": hi, "first": first, "last": last})
	}
	t.Notes = []string{"Std. dev. is the sample standard deviation (divisor N − 1). First and Last are the first and last dates with data" + sampleClause(s.Sample) + "."}
	return &engine.Result{Table: t, Values: map[string]any{"series": vals}}, nil
}

func sampleClause(sample string) string {
	if sample == "" {
		return ""
	}
	return " within the sample " + sample
}
