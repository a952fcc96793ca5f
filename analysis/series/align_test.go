package series

import (
	"math"
	"strings"
	"testing"
)

func mkSeries(t *testing.T, name, spec string, vals ...float64) *Series {
	t.Helper()
	// spec is the first date; dates are consecutive periods
	d, err := ParseDate(spec)
	if err != nil {
		t.Fatal(err)
	}
	s := &Series{Name: name}
	for i, v := range vals {
		s.Dates = append(s.Dates, d.Add(i))
		s.Values = append(s.Values, v)
	}
	return s
}

func TestAlignSameFrame(t *testing.T) {
	f, err := ReadCSV(stringsReader(evalCSV), "e.csv")
	if err != nil {
		t.Fatal(err)
	}
	var ss []*Series
	for _, src := range []string{"dlog(x)", "lag(x, -1)"} {
		e, _ := ParseExpr(src)
		s, err := Eval(e, f)
		if err != nil {
			t.Fatal(err)
		}
		ss = append(ss, s)
	}
	// dlog(x) is missing in 2000Q1, lag(x, -1) in 2001Q1: both trimmed
	a, err := Align(ss)
	if err != nil {
		t.Fatal(err)
	}
	if a.Len() != 3 || a.Dates[0].String() != "2000Q2" || a.Dates[2].String() != "2000Q4" {
		t.Errorf("dates %v", a.Dates)
	}
	if !equalFloats(a.Values[1], []float64{4, 8, 16}) || a.Names[0] != "dlog(x)" {
		t.Errorf("values %v names %v", a.Values, a.Names)
	}
	// y is missing in 2000Q3, inside the sample
	y, _ := f.Series("y")
	_, err = AlignWith([]*Series{ss[0], y}, AlignOptions{Frame: f})
	want := "e.csv:4: y has no value on 2000Q3, inside the common sample 2000Q2 to 2001Q1 (fill the gap, or shorten the sample)"
	if err == nil || err.Error() != want {
		t.Errorf("got %v\nwant %s", err, want)
	}
	_, err = Align([]*Series{y})
	want = "y has no value on 2000Q3, inside the common sample 2000Q1 to 2001Q1 (fill the gap, or shorten the sample)"
	if err == nil || err.Error() != want {
		t.Errorf("got %v\nwant %s", err, want)
	}
	a, err = AlignWith([]*Series{ss[0], y}, AlignOptions{DropMissing: true})
	if err != nil || a.Len() != 3 || len(a.Dropped) != 1 || a.Dropped[0].String() != "2000Q3" || a.Dates[1].String() != "2000Q4" {
		t.Errorf("DropMissing: %+v %v", a, err)
	}
}

func TestAlignIntersect(t *testing.T) {
	a := mkSeries(t, "a", "1990Q1", 1, 2, 3, 4, 5, 6)
	b := mkSeries(t, "b", "1990Q3", 30, 40, 50, 60, 70, 80)
	c := mkSeries(t, "c", "1990Q2", nan, 300, 400, 500, nan)
	al, err := Align([]*Series{a, b, c})
	if err != nil {
		t.Fatal(err)
	}
	// common dates 1990Q3–1991Q2; c is missing in 1991Q2 → trimmed
	if al.Len() != 3 || al.Dates[0].String() != "1990Q3" || al.Dates[2].String() != "1991Q1" {
		t.Fatalf("dates %v", al.Dates)
	}
	if !equalFloats(al.Values[0], []float64{3, 4, 5}) || !equalFloats(al.Values[1], []float64{30, 40, 50}) || !equalFloats(al.Values[2], []float64{300, 400, 500}) {
		t.Errorf("values %v", al.Values)
	}
	bad := []struct {
		ss   []*Series
		want string
	}{
		{nil, "series: nothing to align"},
		{[]*Series{a, mkSeries(t, "m", "1990-01", 1, 2)}, "series m is monthly but a is quarterly"},
		{[]*Series{a, mkSeries(t, "late", "2000Q1", 1, 2)}, "no date on which all of a, late have a value"},
		{[]*Series{mkSeries(t, "e", "1990", nan, nan)}, "no date on which all of e have a value"},
		{[]*Series{{Name: "broken", Values: []float64{1}}}, "series: malformed series (values and dates differ in number)"},
	}
	for _, tc := range bad {
		_, err := Align(tc.ss)
		if err == nil || err.Error() != tc.want {
			t.Errorf("got %v\nwant %s", err, tc.want)
		}
	}
}

func TestContiguous(t *testing.T) {
	s := mkSeries(t, "s", "2000-01", nan, nan, 1, 2, 3, nan)
	v, d, err := Contiguous(s)
	if err != nil || !equalFloats(v, []float64{1, 2, 3}) || d[0].String() != "2000-03" || len(d) != 3 {
		t.Errorf("got %v %v %v", v, d, err)
	}
	s = mkSeries(t, "s", "2000-01", 1, nan, 3)
	if _, _, err := Contiguous(s); err == nil || err.Error() != "s has no value on 2000-02, inside the common sample 2000-01 to 2000-03 (fill the gap, or shorten the sample)" {
		t.Errorf("got %v", err)
	}
}

// TestAlignSharedWindow: series on one date axis with missing values
// only at the ends come back as the window of complete dates (the
// shared-axis path), and with an interior gap as before (an error, or
// the date dropped).
func TestAlignSharedWindow(t *testing.T) {
	nan := math.NaN()
	dates := make([]Date, 6)
	for i := range dates {
		dates[i] = Date{Freq: Annual, Year: 2000 + i, Sub: 1}
	}
	other := append([]Date(nil), dates...) // equal, not the same slice
	a := &Series{Name: "a", Dates: dates, Values: []float64{nan, 1, 2, 3, 4, nan}}
	b := &Series{Name: "b", Dates: other, Values: []float64{0, nan, 5, 6, 7, 8}}
	al, err := Align([]*Series{a, b})
	if err != nil {
		t.Fatal(err)
	}
	if len(al.Dates) != 3 || al.Dates[0].Year != 2002 || al.Dates[2].Year != 2004 ||
		!equalFloats(al.Values[0], []float64{2, 3, 4}) || !equalFloats(al.Values[1], []float64{5, 6, 7}) || al.Dropped != nil {
		t.Fatalf("got %+v", al)
	}
	al.Values[0][0] = 99
	if a.Values[2] != 2 {
		t.Error("the aligned values share the series' storage")
	}
	b.Values[3] = nan
	if _, err := Align([]*Series{a, b}); err == nil || !strings.Contains(err.Error(), "2003") {
		t.Errorf("interior gap: err = %v", err)
	}
	al, err = AlignWith([]*Series{a, b}, AlignOptions{DropMissing: true})
	if err != nil || len(al.Dates) != 2 || len(al.Dropped) != 1 || al.Dropped[0].Year != 2003 {
		t.Errorf("dropped: %+v, %v", al, err)
	}
}

// TestAlignOwned: series on one date axis come back as windows of their
// own values when the caller gives them away, and as copies otherwise.
func TestAlignOwned(t *testing.T) {
	dates := []Date{{Freq: Monthly, Year: 2001, Sub: 1}, {Freq: Monthly, Year: 2001, Sub: 2}, {Freq: Monthly, Year: 2001, Sub: 3}}
	a := &Series{Name: "a", Dates: dates, Values: []float64{math.NaN(), 2, 3}}
	b := &Series{Name: "b", Dates: dates, Values: []float64{4, 5, 6}}
	for _, owned := range []bool{false, true} {
		al, err := AlignWith([]*Series{a, b}, AlignOptions{Owned: owned})
		if err != nil {
			t.Fatal(err)
		}
		if len(al.Values[0]) != 2 || al.Values[0][0] != 2 || al.Values[1][1] != 6 {
			t.Fatalf("owned %v: %v", owned, al.Values)
		}
		if shared := &al.Values[0][0] == &a.Values[1]; shared != owned {
			t.Errorf("owned %v: values shared with the input: %v", owned, shared)
		}
		if owned && cap(al.Values[1]) != len(al.Values[1]) {
			t.Error("a window's capacity reaches past it")
		}
	}
}
