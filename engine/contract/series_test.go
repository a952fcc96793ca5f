package contract

import (
	"bytes"
	"encoding/gob"
	"math"
	"reflect"
	"testing"
	"time"

	"github.com/galley-econ/galley/analysis/series"
)

// TestDatedGob: a dated series comes back from gob (the result cache)
// with its dates — daily ones included, whose day number gob could not
// see in series.Date — its values bit for bit, and nil and empty apart.
func TestDatedGob(t *testing.T) {
	day := func(y, m, d int) series.Date {
		return series.DailyDate(time.Date(y, time.Month(m), d, 0, 0, 0, 0, time.UTC))
	}
	nan := math.Float64frombits(0x7ff8000000000042)
	type holder struct {
		Series    map[string]Dated
		Relations []Dated
	}
	in := holder{
		Series: map[string]Dated{
			"daily":   {Dates: []series.Date{day(1969, 12, 31), day(2020, 2, 29), day(1600, 1, 1)}, Values: []float64{1.5, math.Copysign(0, -1), nan}},
			"monthly": {Dates: []series.Date{{Freq: series.Monthly, Year: 1990, Sub: 12}, {Freq: series.Quarterly, Year: -3, Sub: 4}, {Freq: series.Undated, Sub: 77}}, Values: []float64{math.Inf(-1), 1e-300, 3}},
			"empty":   {Dates: []series.Date{}, Values: []float64{}},
			"nil":     {},
		},
		Relations: []Dated{{Dates: []series.Date{{Freq: series.Annual, Year: 2001}}, Values: []float64{2}}},
	}
	var buf bytes.Buffer
	if err := gob.NewEncoder(&buf).Encode(in); err != nil {
		t.Fatal(err)
	}
	var out holder
	if err := gob.NewDecoder(&buf).Decode(&out); err != nil {
		t.Fatal(err)
	}
	for k, want := range in.Series {
		got := out.Series[k]
		if !reflect.DeepEqual(got.Dates, want.Dates) || (got.Dates == nil) != (want.Dates == nil) || (got.Values == nil) != (want.Values == nil) || len(got.Values) != len(want.Values) {
			t.Errorf("%s: %v %v, want %v %v", k, got.Dates, got.Values, want.Dates, want.Values)
			continue
		}
		for i := range want.Values {
			if math.Float64bits(got.Values[i]) != math.Float64bits(want.Values[i]) {
				t.Errorf("%s[%d]: %v, want %v", k, i, got.Values[i], want.Values[i])
			}
		}
	}
	if got := out.Series["daily"].Dates[1].String(); got != "2020-02-29" {
		t.Errorf("daily date %q", got)
	}
	if !reflect.DeepEqual(out.Relations, in.Relations) {
		t.Errorf("relations %v", out.Relations)
	}
	b, _ := in.Series["daily"].GobEncode()
	for cut := 0; cut < len(b); cut++ {
		var d Dated
		if d.GobDecode(b[:cut]) == nil {
			t.Fatalf("a truncation at %d of %d bytes decoded", cut, len(b))
		}
	}
}

// TestResultsForms: each series comes out as ResultsForm writes it, the
// date text shared by series on one date axis and not by others.
func TestResultsForms(t *testing.T) {
	a := []series.Date{{Freq: series.Monthly, Year: 2001, Sub: 1}, {Freq: series.Monthly, Year: 2001, Sub: 2}}
	b := []series.Date{{Freq: series.Monthly, Year: 2001, Sub: 1}, {Freq: series.Monthly, Year: 2001, Sub: 2}}
	ds := []Dated{{Dates: a, Values: []float64{1, 2}}, {Dates: a, Values: []float64{3, 4}}, {Dates: b, Values: []float64{5, 6}}, {}}
	got := ResultsForms(ds)
	for i, d := range ds {
		if !reflect.DeepEqual(got[i], d.ResultsForm()) {
			t.Errorf("series %d: %v, want %v", i, got[i], d.ResultsForm())
		}
	}
	t0, t1, t2 := got[0]["dates"].([]string), got[1]["dates"].([]string), got[2]["dates"].([]string)
	if &t0[0] != &t1[0] || &t0[0] == &t2[0] {
		t.Error("the date text is not shared exactly by the series on one axis")
	}
	if n := len(ResultsForms(nil)); n != 0 {
		t.Errorf("%d forms of no series", n)
	}
}

// TestViewDated: a view holds the slices themselves, capped, so an
// append to it copies instead of writing past them.
func TestViewDated(t *testing.T) {
	dates := make([]series.Date, 3, 10)
	vals := make([]float64, 3, 10)
	v := ViewDated(dates, vals)
	if &v.Dates[0] != &dates[0] || &v.Values[0] != &vals[0] || cap(v.Dates) != 3 || cap(v.Values) != 3 {
		t.Fatal("not a capped view")
	}
	_ = append(v.Values, 9)
	if vals[:4][3] != 0 {
		t.Error("an append wrote past the view")
	}
}
