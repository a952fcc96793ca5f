package series

import (
	"testing"
)

func TestParseWindow(t *testing.T) {
	good := []struct{ in, want string }{
		{"1990Q1..2000Q4", "1990Q1..2000Q4"},
		{"1990-Q1..2000q4", "1990Q1..2000Q4"},
		{"1990..", "1990.."},
		{"..2000-06", "..2000-06"},
		{" 1990M1 .. 1990M12 ", "1990-01..1990-12"},
		{"2020-01-01..2020-06-30", "2020-01-01..2020-06-30"},
		{"5..40", "5..40"},
		{"5..1000", "5..1000"},
		{"1990Q1..1990Q1", "1990Q1..1990Q1"},
	}
	for _, tc := range good {
		w, err := ParseWindow(tc.in)
		if err != nil || w.String() != tc.want {
			t.Errorf("ParseWindow(%q) = %v, %v; want %s", tc.in, w, err, tc.want)
		}
	}
	bad := []struct{ in, want string }{
		{"1990", `sample "1990": expected FROM..TO, FROM.. or ..TO`},
		{"..", `sample "..": give at least one end (FROM..TO, FROM.. or ..TO)`},
		{"1990Q1..2000", `sample "1990Q1..2000": the start is quarterly but the end is annual`},
		{"2000..1990", `sample "2000..1990": the start is later than the end`},
		{"1990Q5..", `sample "1990Q5..": start: invalid date "1990Q5": expected a form such as 1990, 1990Q1, 1990-Q1, 1990-01, 1990M01 or 1990-01-31`},
		{"..x", `sample "..x": end: invalid date "x": expected a form such as 1990, 1990Q1, 1990-Q1, 1990-01, 1990M01 or 1990-01-31`},
		{"0..5", `sample "0..5": start: invalid date "0": expected a form such as 1990, 1990Q1, 1990-Q1, 1990-01, 1990M01 or 1990-01-31`},
	}
	for _, tc := range bad {
		_, err := ParseWindow(tc.in)
		if err == nil || err.Error() != tc.want {
			t.Errorf("ParseWindow(%q):\n got %v\nwant %s", tc.in, err, tc.want)
		}
	}
}

func TestWindowApply(t *testing.T) {
	q, _ := ReadCSV(stringsReader("date,x\n1990Q1,1\n1990Q2,2\n1990Q3,3\n1990Q4,4\n1991Q1,5\n"), "q.csv")
	d, _ := ReadCSV(stringsReader("date,x\n2020-01-03,1\n2020-01-06,2\n2020-01-07,3\n2020-01-10,4\n"), "d.csv")
	u, _ := ReadCSV(stringsReader("x\n1\n2\n3\n4\n"), "u.csv")
	qs, _ := q.Series("x")
	ds, _ := d.Series("x")
	us, _ := u.Series("x")
	good := []struct {
		s           *Series
		win         string
		first, last string
		n           int
	}{
		{qs, "1990Q2..1990Q4", "1990Q2", "1990Q4", 3},
		{qs, "1990Q2..", "1990Q2", "1991Q1", 4},
		{qs, "..1990Q1", "1990Q1", "1990Q1", 1},
		{qs, "1990Q1..1991Q1", "1990Q1", "1991Q1", 5},
		{ds, "2020-01-04..2020-01-09", "2020-01-06", "2020-01-07", 2},
		{ds, "2020-01-03..2020-01-10", "2020-01-03", "2020-01-10", 4},
		{us, "2..3", "2", "3", 2},
		{us, "3..", "3", "4", 2},
	}
	for _, tc := range good {
		w, err := ParseWindow(tc.win)
		if err != nil {
			t.Fatal(err)
		}
		r, err := w.Apply(tc.s)
		if err != nil {
			t.Errorf("%s: %v", tc.win, err)
			continue
		}
		if r.Len() != tc.n || r.Dates[0].String() != tc.first || r.Dates[r.Len()-1].String() != tc.last || r.Values[0] != tc.s.Values[indexOf(tc.s, r.Dates[0])] {
			t.Errorf("%s: got %d obs %v…%v", tc.win, r.Len(), r.Dates[0], r.Dates[r.Len()-1])
		}
	}
	bad := []struct {
		s         *Series
		win, want string
	}{
		{qs, "1989Q4..", "x: sample 1989Q4.. starts before the data, which run from 1990Q1 to 1991Q1"},
		{qs, "1991Q2..", "x: sample 1991Q2.. starts after the data, which run from 1990Q1 to 1991Q1"},
		{qs, "..1991Q2", "x: sample ..1991Q2 ends after the data, which run from 1990Q1 to 1991Q1"},
		{qs, "..1989Q4", "x: sample ..1989Q4 ends before the data, which run from 1990Q1 to 1991Q1"},
		{qs, "1990..1991", "x: sample 1990..1991 is annual but the data are quarterly (1990Q1 to 1991Q1)"},
		{qs, "..1990-06", "x: sample ..1990-06 is monthly but the data are quarterly (1990Q1 to 1991Q1)"},
		{ds, "2020-01-08..2020-01-09", "x: sample 2020-01-08..2020-01-09 holds no observation of the data (2020-01-03 to 2020-01-10)"},
		{us, "2..9", "x: sample 2..9 ends after the data, which run from 1 to 4"},
		{us, "1990Q1..", "x: sample 1990Q1.. is quarterly but the data are undated (1 to 4)"},
	}
	for _, tc := range bad {
		w, err := ParseWindow(tc.win)
		if err != nil {
			t.Fatal(err)
		}
		_, err = w.Apply(tc.s)
		if err == nil || err.Error() != tc.want {
			t.Errorf("%s:\n got %v\nwant %s", tc.win, err, tc.want)
		}
	}
	w, _ := ParseWindow("1990Q2..1990Q3")
	out, err := w.ApplyAll([]*Series{qs, qs})
	if err != nil || len(out) != 2 || out[1].Values[0] != 2 || out[1].Values[1] != 3 {
		t.Errorf("ApplyAll: %v %v", out, err)
	}
}

func indexOf(s *Series, d Date) int {
	for i, e := range s.Dates {
		if e.Equal(d) {
			return i
		}
	}
	return -1
}
