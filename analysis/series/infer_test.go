package series

import (
	"errors"
	"fmt"
	"strings"
	"testing"
	"time"
)

// isoCSV writes a two-column CSV whose dates are the given calendar days.
func isoCSV(days []string) string {
	var b strings.Builder
	b.WriteString("date,y\n")
	for i, d := range days {
		fmt.Fprintf(&b, "%s,%d\n", d, i)
	}
	return b.String()
}

// calendar lists n days starting at y-m-d, stepping months at a time;
// last moves each day to the end of its month.
func calendar(y, m, d, n, months int, last bool) []string {
	out := make([]string, n)
	for i := range out {
		t := time.Date(y, time.Month(m)+time.Month(i*months), 1, 0, 0, 0, 0, time.UTC)
		if last {
			t = t.AddDate(0, 1, -1)
		} else {
			t = t.AddDate(0, 0, d-1)
		}
		out[i] = t.Format("2006-01-02")
	}
	return out
}

// TestInferFreq: calendar dates are read as the periods they date,
// from the spacing and the day each date names (issue 14, item 1).
func TestInferFreq(t *testing.T) {
	business := []string{"2020-03-02", "2020-03-03", "2020-03-04", "2020-03-05", "2020-03-06", "2020-03-09"}
	weekly := calendar(2020, 1, 6, 1, 1, false)
	for i := 1; i < 10; i++ {
		d, _ := time.Parse("2006-01-02", weekly[0])
		weekly = append(weekly, d.AddDate(0, 0, 7*i).Format("2006-01-02"))
	}
	cases := []struct {
		name        string
		days        []string
		freq        Freq
		first, last string
		basis       string
	}{
		{"first of quarter", calendar(1974, 1, 1, 56, 3, false), Quarterly, "1974Q1", "1987Q4", "on the first day of each quarter"},
		{"end of quarter", calendar(1974, 3, 0, 8, 3, true), Quarterly, "1974Q1", "1975Q4", "on the last day of each quarter"},
		{"first of month", calendar(1974, 1, 1, 30, 1, false), Monthly, "1974-01", "1976-06", "on the first day of each month"},
		{"end of month, leap February", calendar(1999, 11, 0, 6, 1, true), Monthly, "1999-11", "2000-04", "on the last day of each month"},
		{"mid-month", calendar(2001, 5, 15, 12, 1, false), Monthly, "2001-05", "2002-04", "on day 15 of each month"},
		{"mid-quarter", calendar(2001, 2, 15, 6, 3, false), Quarterly, "2001Q1", "2002Q2", "on day 15 of month 2 of each quarter"},
		{"first of year", calendar(1950, 1, 1, 20, 12, false), Annual, "1950", "1969", "on the first day of each year"},
		{"end of year", calendar(1950, 12, 0, 5, 12, true), Annual, "1950", "1954", "on the last day of each year"},
		{"mid-year", calendar(1950, 7, 1, 5, 12, false), Annual, "1950", "1954", "on day 1 of month 7 of each year"},
		{"business days", business, Daily, "2020-03-02", "2020-03-09", "read as days"},
		{"weekly", weekly, Daily, weekly[0], weekly[9], "read as days"},
		{"semiannual", calendar(1990, 1, 1, 6, 6, false), Daily, "1990-01-01", "1992-07-01", "read as days"},
		{"one date", []string{"1974-01-01"}, Daily, "1974-01-01", "1974-01-01", "a single calendar date"},
	}
	for _, c := range cases {
		f, err := ReadCSV(strings.NewReader(isoCSV(c.days)), "d.csv")
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		if f.Freq != c.freq || f.Dates[0].String() != c.first || f.Dates[f.Len()-1].String() != c.last || !strings.Contains(f.FreqBasis, c.basis) {
			t.Errorf("%s: %v %s–%s (%s); want %v %s–%s (%s)", c.name, f.Freq, f.Dates[0], f.Dates[f.Len()-1], f.FreqBasis, c.freq, c.first, c.last, c.basis)
		}
		if f.Len() != len(c.days) {
			t.Errorf("%s: %d rows, want %d", c.name, f.Len(), len(c.days))
		}
	}
	// Dates written as periods say how.
	f, _ := ReadCSV(strings.NewReader("date,y\n1990Q1,1\n1990Q2,2\n"), "q.csv")
	if f.FreqBasis != "from the form of the dates, as 1990Q1" {
		t.Errorf("basis %q", f.FreqBasis)
	}
	// A sample window in the inferred frequency applies.
	f, _ = ReadCSV(strings.NewReader(isoCSV(calendar(1974, 1, 1, 56, 3, false))), "q.csv")
	w, err := ParseWindow("1975Q1..1975Q4")
	if err != nil {
		t.Fatal(err)
	}
	s, _ := f.Series("y")
	if s, err = w.Apply(s); err != nil || s.Len() != 4 || s.Values[0] != 4 {
		t.Errorf("window on inferred quarters: %v %v", s, err)
	}
}

// TestInferFreqGap: a skipped period of inferred quarterly data is an
// error naming the line and the missing quarter, and saying how to
// read the dates as days instead.
func TestInferFreqGap(t *testing.T) {
	days := calendar(1974, 1, 1, 8, 3, false)
	days = append(days[:3], days[4:]...) // 1974-10-01 left out
	_, err := ReadCSV(strings.NewReader(isoCSV(days)), "q.csv")
	var de *DataError
	if !errors.As(err, &de) || de.Line != 5 || !strings.Contains(err.Error(), "1974Q4 is missing") || !strings.Contains(err.Error(), "declare the frequency") {
		t.Errorf("got %v", err)
	}
}

// TestDeclaredFreq: a declared frequency reads calendar dates as the
// periods that contain them, whatever day they name; the dates must
// date one period each, with none skipped.
func TestDeclaredFreq(t *testing.T) {
	irregular := []string{"2001-02-14", "2001-05-16", "2001-08-15", "2001-11-13", "2002-02-14"}
	f, err := ReadCSVAs(strings.NewReader(isoCSV(irregular)), "q.csv", Quarterly)
	if err != nil || f.Freq != Quarterly || f.Dates[0].String() != "2001Q1" || f.Dates[4].String() != "2002Q1" || !strings.Contains(f.FreqBasis, "declared quarterly") {
		t.Errorf("irregular days declared quarterly: %v %v", f, err)
	}
	// Inferred as quarterly, but declared daily: kept as days.
	f, err = ReadCSVAs(strings.NewReader(isoCSV(calendar(1974, 1, 1, 8, 3, false))), "q.csv", Daily)
	if err != nil || f.Freq != Daily || f.Dates[1].String() != "1974-04-01" {
		t.Errorf("declared daily: %v %v", f, err)
	}
	bad := []struct {
		name, csv string
		freq      Freq
		line      int
		want      string
	}{
		{"two in a quarter", isoCSV([]string{"2001-01-15", "2001-03-15", "2001-05-15"}), Quarterly, 3, "2001-01-15 (line 2) and 2001-03-15 both fall in 2001Q1"},
		{"skipped month", isoCSV([]string{"2001-01-31", "2001-02-28", "2001-04-30"}), Monthly, 4, "2001-03 is missing"},
		{"periods of another frequency", "date,y\n2001-01,1\n2001-02,2\n", Quarterly, 0, "declared quarterly but the dates are monthly (2001-01 on line 2)"},
		{"no dates", "y\n1\n2\n", Monthly, 0, "declared monthly but the data have no date column"},
	}
	for _, c := range bad {
		_, err := ReadCSVAs(strings.NewReader(c.csv), "q.csv", c.freq)
		var de *DataError
		if !errors.As(err, &de) || de.Line != c.line || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: got %v, want line %d and %q", c.name, err, c.line, c.want)
		}
	}
	if _, err := ParseFreq("fortnightly"); err == nil {
		t.Error("ParseFreq accepted fortnightly")
	}
	if f, err := ParseFreq(" Quarterly"); err != nil || f != Quarterly {
		t.Errorf("ParseFreq: %v %v", f, err)
	}
}
