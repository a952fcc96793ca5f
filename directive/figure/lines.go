package figure

import (
	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/figures"
)

// plot: lines and panels — series expressions over their own spans, in
// one panel or stacked panels.

// dataSeries evaluates one expression as a dated series over its own
// available span (within the sample).
func (s *figureSpec) dataSeries(c *engine.Context, expr, name string) (series.Series, error) {
	d, err := c.Data(c.DataAlias(s.Data), []string{expr}, s.Sample)
	if err != nil {
		return series.Series{}, err
	}
	return series.Series{Name: name, Dates: d.Dates, Values: d.Cols[0]}, nil
}

// runLines draws series in one panel (lines) or stacked panels (panels)
// and returns the figure and what it drew.
func (s *figureSpec) runLines(c *engine.Context, p string, o *figures.Options) (*figures.Figure, drawn, error) {
	groups := s.Panels
	if len(groups) == 0 {
		if p == "panels" {
			for _, e := range s.Series {
				groups = append(groups, []string{e})
			}
		} else {
			groups = [][]string{s.Series}
		}
	}
	var dr drawn
	var panels []figures.Panel
	k := 0
	for gi, g := range groups {
		if len(g) == 0 {
			return nil, dr, c.ItemErrorf("panels", gi, "panel %d has no series", gi+1)
		}
		if len(g) > figures.MaxSeries {
			return nil, dr, c.ItemErrorf("panels", gi, "panel %d has %d series; one panel holds at most %d", gi+1, len(g), figures.MaxSeries)
		}
		var pn figures.Panel
		for _, e := range g {
			name := c.TermText(e) // the author's label for it, if the front matter gives one
			if k < len(s.Names) {
				name = s.Names[k]
			}
			k++
			ser, err := s.dataSeries(c, e, name)
			if err != nil {
				return nil, dr, err
			}
			pn.Series = append(pn.Series, ser)
			dr.names = append(dr.names, name)
			dr.panel = append(dr.panel, gi+1)
			dr.series = append(dr.series, ser)
		}
		if len(groups) == 1 {
			pn.YLabel = s.YLabel
		}
		panels = append(panels, pn)
	}
	if len(groups) > 1 && s.YLabel != "" && len(s.YLabels) == 0 {
		return nil, dr, c.Errorf("ylabel", "a figure of %d panels takes ylabels (one per panel), not ylabel", len(groups))
	}
	if len(s.YLabels) > 0 && len(s.YLabels) != len(groups) {
		return nil, dr, c.Errorf("ylabels", "%d ylabels for %d panels", len(s.YLabels), len(groups))
	}
	if err := s.shade(c, dr.series, o); err != nil {
		return nil, dr, err
	}
	fig, err := figures.Panels(panels, *o)
	if err != nil {
		return nil, dr, c.Errorf("", "%v", err)
	}
	return fig, dr, nil
}
