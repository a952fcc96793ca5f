package figure

import (
	"slices"

	"github.com/galley-econ/galley/analysis/acf"
	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/figures"
)

// plot: acf — the correlogram of one series.

// acfLags is two years of lags for monthly or quarterly data, ten
// otherwise, and never more than a quarter of the observations.
func acfLags(s series.Series, n int) int {
	l := 10
	if len(s.Dates) > 0 {
		if py := s.Dates[0].Freq.PerYear(); py == 4 || py == 12 {
			l = 2 * py
		}
	}
	return max(1, min(l, n/4))
}

// correlogram draws the autocorrelations and partial autocorrelations of
// ser (lags: or acfLags) with their band, puts them in vals, and returns
// the figure.
func (s *figureSpec) correlogram(c *engine.Context, ser series.Series, o *figures.Options, vals map[string]any) (*figures.Figure, error) {
	if len(s.Shade) > 0 {
		return nil, c.Errorf("shade", "a correlogram has no date axis to shade")
	}
	x, _, err := series.Contiguous(&ser)
	if err != nil {
		return nil, c.Errorf("", "%v", err)
	}
	lags := s.Lags
	if lags == 0 {
		lags = acfLags(ser, len(x))
	}
	if lags >= len(x) {
		return nil, c.Errorf("lags", "%d lags need more than %d observations", lags, len(x))
	}
	cg, err := acf.Compute(x, lags)
	if err != nil {
		return nil, c.Errorf("", "%v", err)
	}
	if o.XLabel == "" {
		o.XLabel = "lag"
	}
	fig, err := figures.Correlogram(cg, *o)
	if err != nil {
		return nil, c.Errorf("", "%v", err)
	}
	vals["lags"] = lags
	vals["acf"] = slices.Clone(cg.ACF[1:])
	vals["pacf"] = slices.Clone(cg.PACF[1:])
	vals["band"] = cg.Band
	return fig, nil
}
