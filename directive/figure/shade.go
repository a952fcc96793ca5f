package figure

import (
	"fmt"

	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/figures"
)

// Shaded date windows (shade:), shared by every plot with a date axis.

// parseShade returns the first and last date of a shaded window, or an
// error when either is missing or unreadable, their frequencies differ,
// or the window ends before it starts.
func parseShade(w shadeSpec) (series.Date, series.Date, error) {
	if w.From == "" || w.To == "" {
		return series.Date{}, series.Date{}, fmt.Errorf("a shaded window needs from and to, e.g. {from: 2008-09, to: 2009-06}")
	}
	a, err := series.ParseDate(w.From)
	if err != nil {
		return a, a, fmt.Errorf("shade from: %v", err)
	}
	b, err := series.ParseDate(w.To)
	if err != nil {
		return a, b, fmt.Errorf("shade to: %v", err)
	}
	if a.Freq != b.Freq {
		return a, b, fmt.Errorf("shade %s to %s: the ends have different frequencies (%s, %s)", a, b, a.Freq, b.Freq)
	}
	if b.Before(a) {
		return a, b, fmt.Errorf("shade %s to %s ends before it starts", a, b)
	}
	return a, b, nil
}

// shade converts the shaded windows. A window that runs past the
// plotted dates is cut to them, with a note. One that lies wholly
// outside them is an error naming the data's span; in a build on an
// earlier vintage of the data (shorter than the current data the
// manuscript was written for) it is left out, with a note.
func (s *figureSpec) shade(c *engine.Context, ss []series.Series, o *figures.Options) error {
	s.notes = nil
	if len(s.Shade) == 0 {
		return nil
	}
	from, to, _ := span(ss)
	vintage := c.Document().Vintage()
	if vintage == "default" {
		vintage = ""
	}
	for i, w := range s.Shade {
		a, b, err := parseShade(w)
		if err != nil {
			return c.ItemErrorf("shade", i, "%v", err)
		}
		if a.Freq != from.Freq {
			return c.ItemErrorf("shade", i, "shaded window %s to %s is %s but the figure's data are %s", a, b, a.Freq, from.Freq)
		}
		if b.Before(from) || to.Before(a) {
			if vintage == "" {
				return c.ItemErrorf("shade", i, "shaded window %s to %s lies outside the plotted data, which run from %s to %s", a, b, from, to)
			}
			s.notes = append(s.notes, fmt.Sprintf("The shaded window %s to %s lies outside the data of vintage %q (%s to %s) and is not shown.", a, b, vintage, from, to))
			continue
		}
		ca, cb := a, b
		if ca.Before(from) {
			ca = from
		}
		if to.Before(cb) {
			cb = to
		}
		if !ca.Equal(a) || !cb.Equal(b) {
			of := "the plotted data"
			if vintage != "" {
				of = fmt.Sprintf("the data of vintage %q", vintage)
			}
			s.notes = append(s.notes, fmt.Sprintf("The shaded window %s to %s runs past %s (%s to %s); it is shaded from %s to %s.", a, b, of, from, to, ca, cb))
		}
		o.Shade = append(o.Shade, figures.Window{From: ca, To: cb})
	}
	return nil
}
