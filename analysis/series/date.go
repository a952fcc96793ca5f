// Package series holds dated time series: their dates and frequencies,
// loading from delimited text and spreadsheets, series expressions
// (log, diff, lag, …) and sample windows.
package series

import (
	"strconv"
	"time"
)

// Freq is the sampling frequency of a series.
type Freq int

const (
	Undated   Freq = iota // observations numbered 1, 2, …
	Annual                // 1990
	Quarterly             // 1990Q1
	Monthly               // 1990-01
	Daily                 // 1990-01-31 (may skip days, e.g. business days)
)

func (f Freq) String() string {
	switch f {
	case Annual:
		return "annual"
	case Quarterly:
		return "quarterly"
	case Monthly:
		return "monthly"
	case Daily:
		return "daily"
	default:
		return "undated"
	}
}

// PerYear is the number of periods in a year (0 for Daily and Undated).
func (f Freq) PerYear() int {
	switch f {
	case Annual:
		return 1
	case Quarterly:
		return 4
	case Monthly:
		return 12
	}
	return 0
}

// Date is one observation date. For Annual, Quarterly and Monthly data,
// Year and Sub (quarter 1–4, month 1–12; 1 for annual) identify it; a
// Daily date (made by DailyDate) is its calendar day, Day; for Undated
// data Sub is the observation number. A Date holds no pointer and is
// compared with ==: a frame's dates cost 32 bytes a row and are not
// scanned by the garbage collector.
type Date struct {
	Freq Freq
	Year int
	Sub  int
	day  int32 // Daily: days since 1970-01-01
}

// DailyDate is the Daily date of t's calendar day (in t's location).
func DailyDate(t time.Time) Date {
	u := time.Date(t.Year(), t.Month(), t.Day(), 0, 0, 0, 0, time.UTC)
	return Date{Freq: Daily, day: int32(u.Unix() / 86400)}
}

// Day is a Daily date's day at midnight UTC (the zero time for other
// frequencies).
func (d Date) Day() time.Time {
	if d.Freq != Daily {
		return time.Time{}
	}
	return time.Unix(int64(d.day)*86400, 0).UTC()
}

// String formats the date in the canonical form for its frequency:
// 1990, 1990Q1, 1990-01, 1990-01-31, or the observation number.
func (d Date) String() string {
	// strconv rather than fmt: a results file writes one per observation
	switch d.Freq {
	case Annual:
		return strconv.Itoa(d.Year)
	case Quarterly:
		return strconv.Itoa(d.Year) + "Q" + strconv.Itoa(d.Sub)
	case Monthly:
		if d.Sub >= 0 && d.Sub < 10 {
			return strconv.Itoa(d.Year) + "-0" + strconv.Itoa(d.Sub)
		}
		return strconv.Itoa(d.Year) + "-" + strconv.Itoa(d.Sub)
	case Daily:
		day := d.Day()
		y, m, dd := day.Date()
		if y < 0 || y > 9999 {
			return day.Format("2006-01-02")
		}
		b := make([]byte, 10)
		b[0], b[1], b[2], b[3] = byte('0'+y/1000), byte('0'+y/100%10), byte('0'+y/10%10), byte('0'+y%10)
		b[4], b[5], b[6] = '-', byte('0'+int(m)/10), byte('0'+int(m)%10)
		b[7], b[8], b[9] = '-', byte('0'+dd/10), byte('0'+dd%10)
		return string(b)
	default:
		return strconv.Itoa(d.Sub)
	}
}

// Decimal is the date as a fractional year (period start), for plotting:
// 1990Q2 → 1990.25, 1990-03 → 1990.1667. Undated: the observation number.
func (d Date) Decimal() float64 {
	switch d.Freq {
	case Annual:
		return float64(d.Year)
	case Quarterly:
		return float64(d.Year) + float64(d.Sub-1)/4
	case Monthly:
		return float64(d.Year) + float64(d.Sub-1)/12
	case Daily:
		day := d.Day()
		start := time.Date(day.Year(), 1, 1, 0, 0, 0, 0, time.UTC)
		end := time.Date(day.Year()+1, 1, 1, 0, 0, 0, 0, time.UTC)
		return float64(day.Year()) + float64(day.Sub(start))/float64(end.Sub(start))
	default:
		return float64(d.Sub)
	}
}

// Series is a named, dated sequence of values. Missing values are NaN.
type Series struct {
	Name   string
	Dates  []Date
	Values []float64
}

// Len is the number of observations.
func (s *Series) Len() int { return len(s.Values) }
