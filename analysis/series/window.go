package series

import (
	"fmt"
	"sort"
	"strings"
)

// Window is a sample restriction, an inclusive range of dates with
// either end possibly open.
type Window struct {
	From, To       Date
	HasFrom, HasTo bool
}

// ParseWindow reads "FROM..TO", "FROM.." or "..TO", each end a date in
// any form ParseDate accepts, or an observation number for undated
// data. Both ends must have the same frequency and FROM must not be
// later than TO.
func ParseWindow(s string) (Window, error) {
	var w Window
	i := strings.Index(s, "..")
	if i < 0 {
		return w, fmt.Errorf("sample %q: expected FROM..TO, FROM.. or ..TO", clip(s, 40))
	}
	from, to := trimSpace(s[:i]), trimSpace(s[i+2:])
	if from == "" && to == "" {
		return w, fmt.Errorf("sample %q: give at least one end (FROM..TO, FROM.. or ..TO)", clip(s, 40))
	}
	var err error
	if from != "" {
		if w.From, err = parseEnd(from); err != nil {
			return w, fmt.Errorf("sample %q: start: %v", clip(s, 40), err)
		}
		w.HasFrom = true
	}
	if to != "" {
		if w.To, err = parseEnd(to); err != nil {
			return w, fmt.Errorf("sample %q: end: %v", clip(s, 40), err)
		}
		w.HasTo = true
	}
	if w.HasFrom && w.HasTo {
		// A four-digit number is a year, unless the other end is an
		// observation number.
		if w.From.Freq == Undated && w.To.Freq == Annual {
			w.To = Date{Freq: Undated, Sub: w.To.Year}
		}
		if w.To.Freq == Undated && w.From.Freq == Annual {
			w.From = Date{Freq: Undated, Sub: w.From.Year}
		}
		if w.From.Freq != w.To.Freq {
			return w, fmt.Errorf("sample %q: the start is %s but the end is %s", clip(s, 40), w.From.Freq, w.To.Freq)
		}
		if w.To.Before(w.From) {
			return w, fmt.Errorf("sample %q: the start is later than the end", clip(s, 40))
		}
	}
	return w, nil
}

// parseEnd reads one end of a window: a date, or a positive whole
// number for an observation of undated data.
func parseEnd(s string) (Date, error) {
	if d, ok := parseDate(s); ok {
		return d, nil
	}
	if n, ok := digits(s); ok && n >= 1 {
		return Date{Freq: Undated, Sub: n}, nil
	}
	return ParseDate(s)
}

// String writes the window back in the FROM..TO form.
func (w Window) String() string {
	var b strings.Builder
	if w.HasFrom {
		b.WriteString(w.From.String())
	}
	b.WriteString("..")
	if w.HasTo {
		b.WriteString(w.To.String())
	}
	return b.String()
}

// Bounds finds the rows dates[lo:hi] inside the window. It is an error
// if the window has another frequency than the dates (a year is taken
// as an observation number for undated data), reaches before the first
// or after the last date, or holds no date at all; the message names
// the data's range.
func (w Window) Bounds(dates []Date) (lo, hi int, err error) {
	n := len(dates)
	if n == 0 {
		return 0, 0, fmt.Errorf("sample %s: there are no data", w)
	}
	first, last := dates[0], dates[n-1]
	span := fmt.Sprintf("%s to %s", first, last)
	from, to := w.From, w.To
	for _, d := range []*Date{&from, &to} {
		if first.Freq == Undated && d.Freq == Annual {
			*d = Date{Freq: Undated, Sub: d.Year}
		}
	}
	if (w.HasFrom && from.Freq != first.Freq) || (w.HasTo && to.Freq != first.Freq) {
		f := from.Freq
		if !w.HasFrom {
			f = to.Freq
		}
		return 0, 0, fmt.Errorf("sample %s is %s but the data are %s (%s)", w, f, first.Freq, span)
	}
	lo, hi = 0, n
	if w.HasFrom {
		if from.Before(first) {
			return 0, 0, fmt.Errorf("sample %s starts before the data, which run from %s", w, span)
		}
		if last.Before(from) {
			return 0, 0, fmt.Errorf("sample %s starts after the data, which run from %s", w, span)
		}
		lo = sort.Search(n, func(i int) bool { return !dates[i].Before(from) })
	}
	if w.HasTo {
		if last.Before(to) {
			return 0, 0, fmt.Errorf("sample %s ends after the data, which run from %s", w, span)
		}
		if to.Before(first) {
			return 0, 0, fmt.Errorf("sample %s ends before the data, which run from %s", w, span)
		}
		hi = sort.Search(n, func(i int) bool { return to.Before(dates[i]) })
	}
	if lo >= hi {
		return 0, 0, fmt.Errorf("sample %s holds no observation of the data (%s)", w, span)
	}
	return lo, hi, nil
}

// Clip moves the ends of the window that reach past the dates to the
// first or the last date: a sample written for the current data, used
// on an earlier and shorter vintage of them. moved reports whether an
// end moved. A window of another frequency than the dates, or one that
// would hold no date once clipped, is returned unchanged (Bounds then
// reports it).
func (w Window) Clip(dates []Date) (c Window, moved bool) {
	n := len(dates)
	if n == 0 {
		return w, false
	}
	first, last := dates[0], dates[n-1]
	if (w.HasFrom && w.From.Freq != first.Freq) || (w.HasTo && w.To.Freq != first.Freq) {
		return w, false
	}
	if (w.HasFrom && last.Before(w.From)) || (w.HasTo && w.To.Before(first)) {
		return w, false
	}
	c = w
	if w.HasFrom && w.From.Before(first) {
		c.From, moved = first, true
	}
	if w.HasTo && last.Before(w.To) {
		c.To, moved = last, true
	}
	return c, moved
}

// Apply restricts a series to the window (see Bounds for the errors).
// The result's Values are a copy; its Dates share s.Dates.
func (w Window) Apply(s *Series) (*Series, error) {
	lo, hi, err := w.Bounds(s.Dates)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", s.Name, err)
	}
	return &Series{Name: s.Name, Dates: s.Dates[lo:hi], Values: append([]float64(nil), s.Values[lo:hi]...)}, nil
}

// ApplyAll restricts each series to the window.
func (w Window) ApplyAll(ss []*Series) ([]*Series, error) {
	out := make([]*Series, len(ss))
	for i, s := range ss {
		r, err := w.Apply(s)
		if err != nil {
			return nil, err
		}
		out[i] = r
	}
	return out, nil
}
