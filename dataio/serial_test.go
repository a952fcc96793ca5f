package dataio

import (
	"math"
	"testing"
	"time"
)

func TestSerialDay(t *testing.T) {
	// Common practice (the spreadsheet date systems, from memory): in
	// the 1900 system serial 1 is 1900-01-01, serial 60 the nonexistent
	// 1900-02-29, and from 61 on serial n is n days after 1899-12-30;
	// in the 1904 system serial n is n days after 1904-01-01. The
	// expected days are counted with the time package, not excelize.
	from := func(y, m, d, n int) time.Time {
		return time.Date(y, time.Month(m), d, 0, 0, 0, 0, time.UTC).AddDate(0, 0, n)
	}
	tests := []struct {
		v        float64
		date1904 bool
		want     time.Time // zero: refused
	}{
		{1, false, from(1900, 1, 1, 0)},
		{59, false, from(1900, 2, 28, 0)},
		{60, false, time.Time{}},
		{61, false, from(1899, 12, 30, 61)},
		{36526, false, from(1899, 12, 30, 36526)}, // 2000-01-01
		{36526.999, false, from(1899, 12, 30, 36526)},
		{2958465, false, from(1899, 12, 30, 2958465)}, // 9999-12-31
		{2958466, false, time.Time{}},
		{0.5, false, time.Time{}},
		{-3, false, time.Time{}},
		{math.NaN(), false, time.Time{}},
		{math.Inf(1), false, time.Time{}},
		{1, true, from(1904, 1, 1, 1)},
		{60, true, from(1904, 1, 1, 60)},
		{36526, true, from(1904, 1, 1, 36526)}, // 2004-01-02
	}
	for _, tc := range tests {
		got, ok := serialDay(tc.v, tc.date1904)
		if ok != !tc.want.IsZero() || !got.Equal(tc.want) {
			t.Errorf("serialDay(%v, %v) = %v, %v; want %v", tc.v, tc.date1904, got, ok, tc.want)
		}
	}
	if d := from(1899, 12, 30, 36526); d.Format("2006-01-02") != "2000-01-01" {
		t.Errorf("36526 is %v", d)
	}
}
