package series

import (
	"sort"
	"strings"
)

// Frame is a table of aligned columns sharing one date axis, as loaded
// from a file. The slices are owned by the frame; callers must not
// modify them.
type Frame struct {
	Source string // file name, for messages
	Sheet  string // spreadsheet sheet read; "" for delimited text
	Freq   Freq   // frequency of Dates
	// FreqBasis says how Freq was decided: from the form of the dates,
	// from calendar dates that fall one to a period on one rule, or
	// declared by the caller.
	FreqBasis string
	Dates     []Date   // one per data row, strictly increasing
	Names     []string // column names, without the date column
	Lines     []int    // source line (spreadsheet row) of each data row

	cols [][]float64 // cols[j][i]: column Names[j], row i; NaN = missing
}

// Len is the number of data rows.
func (f *Frame) Len() int { return len(f.Dates) }

// index is the position of the column called name, or −1.
func (f *Frame) index(name string) int {
	for j, n := range f.Names {
		if n == name {
			return j
		}
	}
	return -1
}

// Has reports whether the frame has a column called exactly name.
func (f *Frame) Has(name string) bool { return f.index(name) >= 0 }

// Column returns a copy of the values of the column called exactly
// name, NaN where missing, and whether it exists.
func (f *Frame) Column(name string) ([]float64, bool) {
	j := f.index(name)
	if j < 0 {
		return nil, false
	}
	return append([]float64(nil), f.cols[j]...), true
}

// Series returns the column called name as a Series over the frame's
// dates (Values is a copy; Dates is shared and read-only).
func (f *Frame) Series(name string) (*Series, bool) {
	v, ok := f.Column(name)
	if !ok {
		return nil, false
	}
	return &Series{Name: name, Dates: f.Dates, Values: v}, true
}

// Closest suggests the column name nearest to name, ignoring case, by
// edit distance (Levenshtein: insertions, deletions, substitutions),
// or "" when no name is close enough to be a plausible typo (distance
// more than a third of the longer name, and more than 2). Ties go to
// the earlier column.
func (f *Frame) Closest(name string) string {
	return closest(name, f.Names)
}

func closest(name string, names []string) string {
	a := []rune(strings.ToLower(name))
	best, bestD := "", -1
	for _, n := range names {
		b := []rune(strings.ToLower(n))
		d := editDistance(a, b)
		limit := max(len(a), len(b)) / 3
		if limit < 2 {
			limit = 2
		}
		if d > limit {
			continue
		}
		if bestD < 0 || d < bestD {
			best, bestD = n, d
		}
	}
	return best
}

// editDistance is the Levenshtein distance between a and b.
func editDistance(a, b []rune) int {
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			c := prev[j-1]
			if a[i-1] != b[j-1] {
				c++
			}
			c = min(c, prev[j]+1, cur[j-1]+1)
			cur[j] = c
		}
		prev, cur = cur, prev
	}
	return prev[len(b)]
}

// LineOf is the source line of the row dated d, or 0 if there is none.
func (f *Frame) LineOf(d Date) int {
	i := sort.Search(len(f.Dates), func(i int) bool { return !f.Dates[i].Before(d) })
	if i < len(f.Dates) && f.Dates[i].Equal(d) && i < len(f.Lines) {
		return f.Lines[i]
	}
	return 0
}
