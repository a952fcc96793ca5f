package series

import (
	"fmt"
	"math"
)

// Aligned holds series on their common dates, ready for an analysis:
// Values[j][i] is series Names[j] on Dates[i], and no value is NaN.
type Aligned struct {
	Names   []string
	Dates   []Date
	Values  [][]float64
	Dropped []Date // interior dates left out (only with DropMissing)
}

// Len is the number of common observations.
func (a Aligned) Len() int { return len(a.Dates) }

// AlignOptions adjusts Align.
type AlignOptions struct {
	// DropMissing leaves out interior dates where a series is missing
	// instead of failing; the dates are listed in Aligned.Dropped. The
	// remaining dates are then not consecutive.
	DropMissing bool
	// Frame, if set, is where the series came from; errors then name
	// its file and the source line of the offending date.
	Frame *Frame
	// Owned says the series are the caller's to give away: when they
	// share one date axis, the result's values may be windows of theirs
	// instead of copies (a million-row series is 8 MB a copy).
	Owned bool
}

// Align puts series on common dates with the default options: see
// AlignWith.
func Align(ss []*Series) (Aligned, error) { return AlignWith(ss, AlignOptions{}) }

// AlignWith puts series on common dates. Series evaluated on one frame
// share its dates; otherwise the dates present in every series are
// kept (the series must have one frequency). Leading and trailing dates
// on which any series is missing are then trimmed jointly. A missing
// value between the first and the last complete date is an error naming
// the series and the date, unless opts.DropMissing is set.
func AlignWith(ss []*Series, opts AlignOptions) (Aligned, error) {
	if len(ss) == 0 {
		return Aligned{}, fmt.Errorf("series: nothing to align")
	}
	for _, s := range ss {
		if s == nil || len(s.Values) != len(s.Dates) {
			return Aligned{}, fmt.Errorf("series: malformed series (values and dates differ in number)")
		}
		if len(s.Dates) > 0 && len(ss[0].Dates) > 0 && s.Dates[0].Freq != ss[0].Dates[0].Freq {
			return Aligned{}, fmt.Errorf("series %s is %s but %s is %s", s.Name, s.Dates[0].Freq, ss[0].Name, ss[0].Dates[0].Freq)
		}
	}
	names := make([]string, len(ss))
	for j, s := range ss {
		names[j] = s.Name
	}
	if out, ok := alignShared(ss, names, opts.Owned); ok {
		return out, nil
	}
	dates, rows := commonDates(ss)
	complete := func(i int) bool {
		for j, s := range ss {
			if math.IsNaN(s.Values[rows[j][i]]) {
				return false
			}
		}
		return true
	}
	lo, hi := 0, len(dates)
	for lo < hi && !complete(lo) {
		lo++
	}
	for hi > lo && !complete(hi-1) {
		hi--
	}
	if lo == hi {
		return Aligned{}, fmt.Errorf("no date on which all of %s have a value", listNames(names))
	}
	out := Aligned{Names: names, Values: make([][]float64, len(ss))}
	keep := make([]int, 0, hi-lo)
	for i := lo; i < hi; i++ {
		if complete(i) {
			keep = append(keep, i)
			continue
		}
		if !opts.DropMissing {
			for j, s := range ss {
				if math.IsNaN(s.Values[rows[j][i]]) {
					return Aligned{}, missingError(opts.Frame, s.Name, dates[i], dates[lo], dates[hi-1])
				}
			}
		}
		out.Dropped = append(out.Dropped, dates[i])
	}
	out.Dates = make([]Date, len(keep))
	for k, i := range keep {
		out.Dates[k] = dates[i]
	}
	for j, s := range ss {
		v := make([]float64, len(keep))
		for k, i := range keep {
			v[k] = s.Values[rows[j][i]]
		}
		out.Values[j] = v
	}
	return out, nil
}

// alignShared is AlignWith for the common case of series on one date
// axis with no missing value between the first and the last complete
// date: the result is a window of the axis, found without index lists,
// and its Dates share the series' (read-only) date slice; its values are
// windows of the series' own when owned, else copies. ok is false in
// every other case, which AlignWith's general path then handles.
func alignShared(ss []*Series, names []string, owned bool) (Aligned, bool) {
	if !sameDates(ss) {
		return Aligned{}, false
	}
	n := len(ss[0].Dates)
	complete := func(i int) bool {
		for _, s := range ss {
			if math.IsNaN(s.Values[i]) {
				return false
			}
		}
		return true
	}
	lo, hi := 0, n
	for lo < hi && !complete(lo) {
		lo++
	}
	for hi > lo && !complete(hi-1) {
		hi--
	}
	if lo == hi {
		return Aligned{}, false
	}
	for _, s := range ss {
		for _, v := range s.Values[lo:hi] {
			if math.IsNaN(v) {
				return Aligned{}, false
			}
		}
	}
	out := Aligned{Names: names, Dates: ss[0].Dates[lo:hi:hi], Values: make([][]float64, len(ss))}
	for j, s := range ss {
		if owned {
			out.Values[j] = s.Values[lo:hi:hi]
		} else {
			out.Values[j] = append([]float64(nil), s.Values[lo:hi]...)
		}
	}
	return out, true
}

// Contiguous returns the values and dates of one series after the
// rules of Align: leading and trailing missing values trimmed, an
// interior one an error.
func Contiguous(s *Series) ([]float64, []Date, error) {
	a, err := Align([]*Series{s})
	if err != nil {
		return nil, nil, err
	}
	return a.Values[0], a.Dates, nil
}

func missingError(f *Frame, name string, d, first, last Date) error {
	e := &DataError{Msg: fmt.Sprintf("%s has no value on %s, inside the common sample %s to %s (fill the gap, or shorten the sample)", name, d, first, last)}
	if f != nil {
		e.Source, e.Line = f.Source, f.LineOf(d)
	}
	return e
}

// commonDates returns the dates shared by all series and, for each
// series, the row of each shared date.
func commonDates(ss []*Series) ([]Date, [][]int) {
	rows := make([][]int, len(ss))
	if sameDates(ss) {
		idx := make([]int, len(ss[0].Dates))
		for i := range idx {
			idx[i] = i
		}
		for j := range rows {
			rows[j] = idx
		}
		return ss[0].Dates, rows
	}
	// intersection of increasing date lists: walk the first series'
	// dates and advance a cursor in each other series
	pos := make([]int, len(ss))
	var dates []Date
outer:
	for i, d := range ss[0].Dates {
		for j := 1; j < len(ss); j++ {
			dj := ss[j].Dates
			for pos[j] < len(dj) && dj[pos[j]].Before(d) {
				pos[j]++
			}
			if pos[j] == len(dj) {
				break outer
			}
			if !dj[pos[j]].Equal(d) {
				continue outer
			}
		}
		dates = append(dates, d)
		rows[0] = append(rows[0], i)
		for j := 1; j < len(ss); j++ {
			rows[j] = append(rows[j], pos[j])
		}
	}
	return dates, rows
}

// sameDates reports whether all series have identical dates.
func sameDates(ss []*Series) bool {
	d0 := ss[0].Dates
	for _, s := range ss[1:] {
		d := s.Dates
		if len(d) != len(d0) {
			return false
		}
		if len(d) > 0 && &d[0] == &d0[0] {
			continue
		}
		for i := range d {
			if !d[i].Equal(d0[i]) {
				return false
			}
		}
	}
	return true
}

func listNames(names []string) string {
	s := ""
	for i, n := range names {
		if i > 0 {
			s += ", "
		}
		s += n
	}
	return s
}
