package series

import (
	"fmt"
	"strings"
	"time"
)

// Calendar dates (1974-01-01) carry no frequency in their form. Many
// statistical offices and central banks date a quarterly or monthly
// series by a day of each period — its first day (1974-01-01,
// 1974-04-01, …), its last day (1974-03-31, 1974-06-30, …) or the same
// day inside each period — so the frequency is read from the dates
// themselves (inferFreq), unless the reader is told it (declare).

// ParseFreq reads a frequency name: annual, quarterly, monthly or daily
// (any case).
func ParseFreq(s string) (Freq, error) {
	for _, f := range []Freq{Annual, Quarterly, Monthly, Daily} {
		if strings.EqualFold(strings.TrimSpace(s), f.String()) {
			return f, nil
		}
	}
	return Undated, fmt.Errorf("frequency %q: expected annual, quarterly, monthly or daily", clip(s, 40))
}

// periodOf is the period of frequency f (Annual, Quarterly or Monthly)
// that contains the calendar day t.
func periodOf(t time.Time, f Freq) Date {
	step := 12 / f.PerYear()
	return Date{Freq: f, Year: t.Year(), Sub: (int(t.Month())-1)/step + 1}
}

// position is where the day t lies inside its period of frequency f:
// the month within the period (0-based) and the day of the month, and
// whether t is the period's last day.
func position(t time.Time, f Freq) (month, day int, last bool) {
	step := 12 / f.PerYear()
	m := int(t.Month()) - 1
	return m % step, t.Day(), m%step == step-1 && t.AddDate(0, 0, 1).Day() == 1
}

// convention finds the rule by which the days date periods of f: the
// first day of each period, the last day, or the same day inside each
// period. ok is false when the days follow none of them.
func convention(days []Date, f Freq) (string, bool) {
	m0, d0, _ := position(days[0].Day(), f)
	same, last := true, true
	for _, d := range days {
		m, dd, l := position(d.Day(), f)
		same = same && m == m0 && dd == d0
		last = last && l
		if !same && !last {
			return "", false
		}
	}
	unit := map[Freq]string{Annual: "year", Quarterly: "quarter", Monthly: "month"}[f]
	switch {
	case same && m0 == 0 && d0 == 1:
		return "the first day of each " + unit, true
	case last:
		return "the last day of each " + unit, true
	case f == Monthly:
		return fmt.Sprintf("day %d of each month", d0), true
	default:
		return fmt.Sprintf("day %d of month %d of each %s", d0, m0+1, unit), true
	}
}

// inferFreq reads calendar dates at the coarsest frequency whose
// periods they date one by one: every date on the same convention (the
// first day of its year, quarter or month; the last day; or the same
// day inside each period), and at least two dates in consecutive
// periods (so that a semiannual or irregular series is not read as
// quarterly). It returns Daily and "" when no frequency fits, and
// needs two dates or more.
func inferFreq(days []Date) (Freq, string) {
	if len(days) < 2 {
		return Daily, ""
	}
	for _, f := range []Freq{Annual, Quarterly, Monthly} {
		conv, ok := convention(days, f)
		if !ok {
			continue
		}
		consecutive := false
		for i := 1; i < len(days); i++ {
			if periodOf(days[i].Day(), f).Index()-periodOf(days[i-1].Day(), f).Index() == 1 {
				consecutive = true
				break
			}
		}
		if consecutive {
			return f, conv
		}
	}
	return Daily, ""
}

// toPeriods rewrites calendar dates as the periods of f that contain
// them. Two dates in one period, and a period skipped, are errors
// naming both dates and their lines.
func toPeriods(days []Date, lines []int, f Freq, source, col, hint string) ([]Date, error) {
	out := make([]Date, len(days))
	for i, d := range days {
		out[i] = periodOf(d.Day(), f)
		if i == 0 {
			continue
		}
		line := 0
		if i < len(lines) {
			line = lines[i]
		}
		switch gap := out[i].Index() - out[i-1].Index(); {
		case gap == 0:
			return nil, &DataError{Source: source, Line: line, Column: col, Msg: fmt.Sprintf(
				"dates %s (line %d) and %s both fall in %s: read as %s data, each period needs one date%s",
				days[i-1], lines[i-1], days[i], out[i], f, hint)}
		case gap > 1:
			missing := out[i-1].Add(1).String()
			if gap > 2 {
				missing = fmt.Sprintf("%s to %s (%d periods)", missing, out[i].Add(-1), gap-1)
			}
			return nil, &DataError{Source: source, Line: line, Column: col, Msg: fmt.Sprintf(
				"date %s (%s) follows %s (%s, line %d): %s is missing%s",
				days[i], out[i], days[i-1], out[i-1], lines[i-1], missing, hint)}
		}
	}
	return out, nil
}

// declare reads the frame's dates at the declared frequency want.
// Calendar dates are read as the periods that contain them (1974-02-15
// is 1974Q1 of quarterly data), whatever day of the period they name;
// each period needs one date and none may be skipped. Declaring daily
// keeps calendar dates as days. Dates written as periods (1974Q1,
// 1974-01, 1974) must already have the declared frequency.
func (f *Frame) declare(want Freq, dateCol string) error {
	declared := fmt.Sprintf("declared %s", want)
	if f.Freq != Daily {
		if f.Freq != want {
			what := "the data have no date column"
			if f.Freq != Undated {
				what = fmt.Sprintf("the dates are %s (%s on line %d)", f.Freq, f.Dates[0], f.Lines[0])
			}
			return &DataError{Source: f.Source, Msg: fmt.Sprintf("the data are declared %s but %s", want, what)}
		}
		f.FreqBasis = declared + "; the form of the dates agrees"
		return nil
	}
	if want == Daily {
		f.FreqBasis = declared + ": calendar dates read as days"
		return nil
	}
	dates, err := toPeriods(f.Dates, f.Lines, want, f.Source, dateCol, "")
	if err != nil {
		return err
	}
	f.Freq, f.Dates = want, dates
	f.FreqBasis = fmt.Sprintf("%s: calendar dates read as the %s periods that contain them", declared, want)
	return nil
}

// infer reads calendar dates at the frequency they date (inferFreq),
// and says how the frequency was decided in f.FreqBasis.
func (f *Frame) infer(dateCol string) error {
	switch f.Freq {
	case Undated:
		f.FreqBasis = "no date column: the observations are numbered 1, 2, …"
		return nil
	case Daily:
	default:
		f.FreqBasis = fmt.Sprintf("from the form of the dates, as %s", f.Dates[0])
		return nil
	}
	fr, conv := inferFreq(f.Dates)
	if fr == Daily {
		f.FreqBasis = "calendar dates that do not fall one to a month, quarter or year on one rule, read as days"
		if len(f.Dates) < 2 {
			f.FreqBasis = "a single calendar date, read as a day"
		}
		return nil
	}
	dates, err := toPeriods(f.Dates, f.Lines, fr, f.Source, dateCol,
		fmt.Sprintf(" (the dates are read as %s: each is on %s; if the data are daily, declare the frequency)", fr, conv))
	if err != nil {
		return err
	}
	f.Freq, f.Dates = fr, dates
	f.FreqBasis = "inferred from calendar dates on " + conv
	return nil
}
