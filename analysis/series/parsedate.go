package series

import (
	"fmt"
	"time"
)

// dateForms lists the accepted date forms for error messages.
const dateForms = "1990, 1990Q1, 1990-Q1, 1990-01, 1990M01 or 1990-01-31"

// ParseDate reads a date in one of the accepted forms and detects its
// frequency from the form:
//
//	annual     1990
//	quarterly  1990Q1, 1990q1, 1990-Q1
//	monthly    1990-01, 1990M01, 1990m1
//	daily      1990-01-31 (ISO 8601 calendar date)
//
// Years have four digits, 1000–9999. Surrounding spaces are ignored.
func ParseDate(s string) (Date, error) {
	d, ok := parseDate(s)
	if !ok {
		return Date{}, fmt.Errorf("invalid date %q: expected a form such as %s", clip(s, 40), dateForms)
	}
	return d, nil
}

// DetectFreq finds the common frequency of a list of date texts. It
// returns the frequency, or the index of the first entry that is not a
// date or whose frequency differs from the first entry's, with an error.
func DetectFreq(dates []string) (Freq, int, error) {
	if len(dates) == 0 {
		return Undated, -1, fmt.Errorf("no dates")
	}
	var f Freq
	for i, s := range dates {
		d, err := ParseDate(s)
		if err != nil {
			return Undated, i, err
		}
		if i == 0 {
			f = d.Freq
		} else if d.Freq != f {
			return Undated, i, fmt.Errorf("date %q is %s but %q is %s", clip(s, 40), d.Freq, clip(dates[0], 40), f)
		}
	}
	return f, -1, nil
}

// parseDate is ParseDate without the error value; it does not allocate.
func parseDate(s string) (Date, bool) {
	s = trimSpace(s)
	if len(s) < 4 {
		return Date{}, false
	}
	year, ok := digits(s[:4])
	if !ok || year < 1000 { // four digits, as Date.String writes them
		return Date{}, false
	}
	rest := s[4:]
	if rest == "" {
		return Date{Freq: Annual, Year: year, Sub: 1}, true
	}
	dash := rest[0] == '-'
	if dash {
		rest = rest[1:]
	}
	if rest == "" {
		return Date{}, false
	}
	switch rest[0] {
	case 'Q', 'q':
		q, ok := digits(rest[1:])
		if !ok || len(rest) != 2 || q < 1 || q > 4 {
			return Date{}, false
		}
		return Date{Freq: Quarterly, Year: year, Sub: q}, true
	case 'M', 'm':
		if dash {
			return Date{}, false
		}
		m, ok := digits(rest[1:])
		if !ok || len(rest) > 3 || m < 1 || m > 12 {
			return Date{}, false
		}
		return Date{Freq: Monthly, Year: year, Sub: m}, true
	}
	if !dash {
		return Date{}, false
	}
	if len(rest) == 2 { // 1990-01
		m, ok := digits(rest)
		if !ok || m < 1 || m > 12 {
			return Date{}, false
		}
		return Date{Freq: Monthly, Year: year, Sub: m}, true
	}
	if len(rest) != 5 || rest[2] != '-' { // 1990-01-31
		return Date{}, false
	}
	m, ok1 := digits(rest[:2])
	day, ok2 := digits(rest[3:])
	if !ok1 || !ok2 || m < 1 || m > 12 || day < 1 {
		return Date{}, false
	}
	t := time.Date(year, time.Month(m), day, 0, 0, 0, 0, time.UTC)
	if t.Day() != day || int(t.Month()) != m {
		return Date{}, false // 1990-02-30
	}
	return DailyDate(t), true
}

// digits parses a non-empty string of ASCII digits (at most 9).
func digits(s string) (int, bool) {
	if s == "" || len(s) > 9 {
		return 0, false
	}
	n := 0
	for i := 0; i < len(s); i++ {
		c := s[i]
		if c < '0' || c > '9' {
			return 0, false
		}
		n = n*10 + int(c-'0')
	}
	return n, true
}

// trimSpace removes ASCII spaces and tabs at both ends without allocating.
func trimSpace(s string) string {
	i, j := 0, len(s)
	for i < j && (s[i] == ' ' || s[i] == '\t') {
		i++
	}
	for j > i && (s[j-1] == ' ' || s[j-1] == '\t') {
		j--
	}
	return s[i:j]
}

// clip shortens s to at most n bytes for an error message.
func clip(s string, n int) string {
	if len(s) <= n {
		return s
	}
	for n > 0 && s[n]&0xC0 == 0x80 { // do not cut a UTF-8 sequence
		n--
	}
	return s[:n] + "…"
}
