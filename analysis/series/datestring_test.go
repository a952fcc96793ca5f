package series

import (
	"fmt"
	"testing"
	"time"
)

// TestDateStringFormats: String writes what the fmt and time layouts
// of the canonical forms write (%d, %dQ%d, %d-%02d, 2006-01-02, the
// observation number), over every day from 1600 to 2400, years, months
// and quarters far from the usual ones, and negative numbers.
func TestDateStringFormats(t *testing.T) {
	for y := -20; y <= 12000; y += 7 {
		for sub := -3; sub <= 14; sub++ {
			if got, want := (Date{Freq: Annual, Year: y}).String(), fmt.Sprintf("%d", y); got != want {
				t.Fatalf("annual %d: %q, want %q", y, got, want)
			}
			if got, want := (Date{Freq: Quarterly, Year: y, Sub: sub}).String(), fmt.Sprintf("%dQ%d", y, sub); got != want {
				t.Fatalf("quarter %d %d: %q, want %q", y, sub, got, want)
			}
			if got, want := (Date{Freq: Monthly, Year: y, Sub: sub}).String(), fmt.Sprintf("%d-%02d", y, sub); got != want {
				t.Fatalf("month %d %d: %q, want %q", y, sub, got, want)
			}
			if got, want := (Date{Freq: Undated, Sub: y*20 + sub}).String(), fmt.Sprintf("%d", y*20+sub); got != want {
				t.Fatalf("undated %d: %q, want %q", y*20+sub, got, want)
			}
		}
	}
	for day := time.Date(1600, 1, 1, 0, 0, 0, 0, time.UTC); day.Year() < 2400; day = day.AddDate(0, 0, 1) {
		d := DailyDate(day)
		if got, want := d.String(), day.Format("2006-01-02"); got != want {
			t.Fatalf("day %v: %q, want %q", day, got, want)
		}
	}
	for _, day := range []time.Time{time.Date(-5, 3, 1, 0, 0, 0, 0, time.UTC), time.Date(12000, 3, 1, 0, 0, 0, 0, time.UTC), time.Date(9999, 12, 31, 0, 0, 0, 0, time.UTC), time.Date(0, 1, 1, 0, 0, 0, 0, time.UTC)} {
		if got, want := DailyDate(day).String(), day.Format("2006-01-02"); got != want {
			t.Errorf("day %v: %q, want %q", day, got, want)
		}
	}
}
