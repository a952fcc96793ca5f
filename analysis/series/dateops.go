package series

// Index is the position of the date on its frequency's time line:
// Year·PerYear + Sub − 1 for annual, quarterly and monthly dates, the
// day number since 1970-01-01 for daily dates, and the observation
// number for undated ones. Consecutive periods have consecutive indices.
func (d Date) Index() int {
	switch d.Freq {
	case Annual, Quarterly, Monthly:
		return d.Year*d.Freq.PerYear() + d.Sub - 1
	case Daily:
		return int(d.day)
	default:
		return d.Sub
	}
}

// dateAt is the inverse of Index for frequency f.
func dateAt(f Freq, i int) Date {
	switch f {
	case Annual, Quarterly, Monthly:
		p := f.PerYear()
		y, s := i/p, i%p
		if s < 0 {
			y, s = y-1, s+p
		}
		sub := s + 1
		return Date{Freq: f, Year: y, Sub: sub}
	case Daily:
		return Date{Freq: Daily, day: int32(i)}
	default:
		return Date{Freq: Undated, Sub: i}
	}
}

// Add moves the date n periods (days for daily data, observations for
// undated data) forward, or backward when n is negative.
func (d Date) Add(n int) Date { return dateAt(d.Freq, d.Index()+n) }

// Compare orders two dates of the same frequency: −1 if d is earlier
// than e, 0 if they are the same date, +1 if d is later. Dates of
// different frequencies are ordered by frequency first.
func (d Date) Compare(e Date) int {
	if d.Freq != e.Freq {
		if d.Freq < e.Freq {
			return -1
		}
		return 1
	}
	a, b := d.Index(), e.Index()
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}

// Equal reports whether d and e are the same date of the same frequency.
func (d Date) Equal(e Date) bool { return d.Compare(e) == 0 }

// Before reports whether d is earlier than e (same frequency).
func (d Date) Before(e Date) bool { return d.Compare(e) < 0 }
