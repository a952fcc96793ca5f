package series

import (
	"testing"
	"time"
)

func TestParseDate(t *testing.T) {
	day := func(s string) time.Time { d, _ := time.Parse("2006-01-02", s); return d }
	good := []struct {
		in   string
		want Date
	}{
		{"1990", Date{Freq: Annual, Year: 1990, Sub: 1}},
		{" 2001 ", Date{Freq: Annual, Year: 2001, Sub: 1}},
		{"1990Q1", Date{Freq: Quarterly, Year: 1990, Sub: 1}},
		{"1990q4", Date{Freq: Quarterly, Year: 1990, Sub: 4}},
		{"1990-Q2", Date{Freq: Quarterly, Year: 1990, Sub: 2}},
		{"1990-q3", Date{Freq: Quarterly, Year: 1990, Sub: 3}},
		{"1990-01", Date{Freq: Monthly, Year: 1990, Sub: 1}},
		{"1990-12", Date{Freq: Monthly, Year: 1990, Sub: 12}},
		{"1990M01", Date{Freq: Monthly, Year: 1990, Sub: 1}},
		{"1990m1", Date{Freq: Monthly, Year: 1990, Sub: 1}},
		{"1990M12", Date{Freq: Monthly, Year: 1990, Sub: 12}},
		{"1990-01-31", DailyDate(day("1990-01-31"))},
		{"2000-02-29", DailyDate(day("2000-02-29"))},
	}
	for _, tc := range good {
		got, err := ParseDate(tc.in)
		if err != nil || !got.Equal(tc.want) || got.Freq != tc.want.Freq {
			t.Errorf("ParseDate(%q) = %v (%v), %v", tc.in, got, got.Freq, err)
		}
	}
	bad := []string{"", "90", "199", "19900", "1990Q0", "1990Q5", "1990Q", "1990Q11", "1990-Q",
		"1990-00", "1990-13", "1990-1", "1990M0", "1990M13", "1990M001", "1990-M01",
		"1990-01-32", "1900-02-29", "1990-1-31", "1990/01/31", "0000", "1990.5", "Q11990", "1990-01-31T00:00", "0999", "0010Q1", "0001-01-01"}
	for _, in := range bad {
		if d, err := ParseDate(in); err == nil {
			t.Errorf("ParseDate(%q) = %v, want an error", in, d)
		}
	}
	_, err := ParseDate("1990Q5")
	if want := `invalid date "1990Q5": expected a form such as 1990, 1990Q1, 1990-Q1, 1990-01, 1990M01 or 1990-01-31`; err == nil || err.Error() != want {
		t.Errorf("got %v", err)
	}
}

func TestDetectFreq(t *testing.T) {
	f, i, err := DetectFreq([]string{"1990Q1", "1990-Q2", "1991q1"})
	if err != nil || f != Quarterly || i != -1 {
		t.Errorf("got %v %d %v", f, i, err)
	}
	_, i, err = DetectFreq([]string{"1990Q1", "1990-02"})
	if err == nil || i != 1 || err.Error() != `date "1990-02" is monthly but "1990Q1" is quarterly` {
		t.Errorf("got %d %v", i, err)
	}
	if _, i, err = DetectFreq([]string{"1990", "x"}); err == nil || i != 1 {
		t.Errorf("got %d %v", i, err)
	}
	if _, _, err = DetectFreq(nil); err == nil {
		t.Error("no dates: want an error")
	}
}

func TestDateArithmetic(t *testing.T) {
	tests := []struct {
		in   string
		n    int
		want string
	}{
		{"1990Q4", 1, "1991Q1"},
		{"1990Q1", -1, "1989Q4"},
		{"1990Q1", -5, "1988Q4"},
		{"1990-12", 1, "1991-01"},
		{"1990-01", -13, "1988-12"},
		{"1990", 10, "2000"},
		{"2000-02-28", 1, "2000-02-29"},
		{"2000-03-01", -1, "2000-02-29"},
		{"1969-12-31", 1, "1970-01-01"},
		{"1000-01-01", -1, "0999-12-31"},
		{"9999-12-30", 1, "9999-12-31"},
	}
	for _, tc := range tests {
		d, _ := ParseDate(tc.in)
		if got := d.Add(tc.n).String(); got != tc.want {
			t.Errorf("%s + %d = %s, want %s", tc.in, tc.n, got, tc.want)
		}
		e := d.Add(tc.n)
		if e.Index()-d.Index() != tc.n {
			t.Errorf("%s: index difference %d", tc.in, e.Index()-d.Index())
		}
	}
	a, _ := ParseDate("1990Q1")
	b, _ := ParseDate("1990Q2")
	if !a.Before(b) || b.Before(a) || a.Compare(b) != -1 || b.Compare(a) != 1 || a.Compare(a) != 0 {
		t.Error("Compare")
	}
	u := Date{Freq: Undated, Sub: 3}
	if u.Add(2).Sub != 5 {
		t.Error("undated Add")
	}
}

// TestDailyDateDay: a daily date keeps its calendar day whatever the
// time of day or location it was made from, and Day gives it back at
// midnight UTC; equal days give equal (==) dates.
func TestDailyDateDay(t *testing.T) {
	loc := time.FixedZone("x", -11*3600)
	a := DailyDate(time.Date(1700, 3, 1, 23, 30, 0, 0, loc))
	b := DailyDate(time.Date(1700, 3, 1, 0, 0, 0, 0, time.UTC))
	if a != b || !a.Day().Equal(time.Date(1700, 3, 1, 0, 0, 0, 0, time.UTC)) || a.String() != "1700-03-01" {
		t.Errorf("DailyDate: %v %v, Day %v", a, b, a.Day())
	}
	if d := b.Add(365); d.String() != "1701-03-01" || d.Index()-b.Index() != 365 {
		t.Errorf("Add: %v", d)
	}
	if !(Date{Freq: Monthly, Year: 1990, Sub: 1}).Day().IsZero() {
		t.Error("a monthly date has a day")
	}
}
