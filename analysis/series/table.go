package series

import (
	"fmt"
	"sort"
	"strings"
	"unicode/utf8"
)

// dateNames are the header names that mark the date column, in any case.
var dateNames = []string{"date", "period", "time"}

// table builds a Frame row by row from text cells; the CSV and
// spreadsheet readers share it so that both apply the same rules.
type table struct {
	f        *Frame
	header   []string // all header names, including the date column
	dateCol  int      // index in header of the date column, −1 = undated
	decided  bool     // dateCol has been chosen (at the first data row)
	headLine int
	want     Freq // the declared frequency; Undated: infer it
	rowsHint int  // rows expected (0: unknown): the columns are allocated once
}

func newTable(source string, want Freq) *table {
	return &table{f: &Frame{Source: source}, dateCol: -1, want: want}
}

func (t *table) errf(line int, col, format string, args ...any) *DataError {
	return &DataError{Source: t.f.Source, Line: line, Column: col, Msg: fmt.Sprintf(format, args...)}
}

// setHeader checks the header row: valid UTF-8, every column named,
// no name twice.
func (t *table) setHeader(fields []string, line int) error {
	t.headLine = line
	t.header = make([]string, len(fields))
	seen := make(map[string]int, len(fields))
	for j, s := range fields {
		if !utf8.ValidString(s) {
			return t.errf(line, "", "header: column %d: name is not valid UTF-8 text (save the file as UTF-8)", j+1)
		}
		s = strings.Clone(strings.TrimSpace(s)) // not a view of the file's bytes (readPlainCSV)
		t.header[j] = s
		if s == "" {
			if j == 0 {
				continue // an unnamed first column holds the dates
			}
			return t.errf(line, "", "header: column %d has no name", j+1)
		}
		if k, dup := seen[s]; dup {
			return t.errf(line, "", "header: name %q is used by columns %d and %d", s, k+1, j+1)
		}
		seen[s] = j
	}
	return nil
}

// chooseDateColumn picks the date column: the first column named date,
// period or time (any case); otherwise the first column if it is
// unnamed or its first value is a quarterly, monthly or daily date;
// otherwise none (the data are undated).
func chooseDateColumn(header, first []string) int {
	for j, h := range header {
		for _, n := range dateNames {
			if strings.EqualFold(h, n) {
				return j
			}
		}
	}
	if len(header) == 0 {
		return -1
	}
	if header[0] == "" {
		return 0
	}
	if len(first) > 0 {
		if d, ok := parseDate(first[0]); ok && d.Freq != Annual {
			return 0
		}
	}
	return -1
}

func (t *table) decide(first []string) {
	t.dateCol = chooseDateColumn(t.header, first)
	t.decided = true
	f := t.f
	for j, h := range t.header {
		if j != t.dateCol {
			f.Names = append(f.Names, h)
		}
	}
	f.cols = make([][]float64, len(f.Names))
	if n := t.rowsHint; n > 0 {
		for j := range f.cols {
			f.cols[j] = make([]float64, 0, n)
		}
		f.Dates = make([]Date, 0, n)
		f.Lines = make([]int, 0, n)
	}
	if t.dateCol < 0 {
		f.Freq = Undated
	}
}

func (t *table) dateName() string {
	if t.header[t.dateCol] == "" {
		return "1 (dates)"
	}
	return t.header[t.dateCol]
}

// addRow appends one data row read from line.
func (t *table) addRow(fields []string, line int) error {
	if err := t.addRowHead(fields, line); err != nil {
		return err
	}
	for k := range t.f.cols {
		t.f.cols[k] = append(t.f.cols[k], 0)
	}
	return t.parseValuesAt(fields, line, len(t.f.Dates)-1)
}

// addRowHead checks the width and the date of a data row read from line
// and appends its date and line; the values are left to the caller
// (addRow, or parseValuesAt). An error here comes before any error in
// the row's values, as addRow reports them.
func (t *table) addRowHead(fields []string, line int) error {
	if !t.decided {
		t.decide(fields)
	}
	f := t.f
	if len(fields) != len(t.header) {
		return t.errf(line, "", "row has %d fields but the header (line %d) has %d", len(fields), t.headLine, len(t.header))
	}
	var d Date
	if t.dateCol >= 0 {
		var err error
		if d, err = t.rowDate(fields[t.dateCol], line); err != nil {
			return err
		}
	} else {
		d = Date{Freq: Undated, Sub: len(f.Dates) + 1}
	}
	f.Dates = append(f.Dates, d)
	f.Lines = append(f.Lines, line)
	return nil
}

// parseValuesAt parses the values of data row i (read from line) into
// the columns, which must already hold that row.
func (t *table) parseValuesAt(fields []string, line, i int) error {
	f := t.f
	k := 0
	for j, s := range fields {
		if j == t.dateCol {
			continue
		}
		v, err := parseValue(s)
		if err != nil {
			return t.errf(line, f.Names[k], "%v", err)
		}
		f.cols[k][i] = v
		k++
	}
	return nil
}

// rowDate parses and checks the date of the row on line: same frequency
// as the first row, later than the previous row, and for annual,
// quarterly and monthly data the very next period.
func (t *table) rowDate(s string, line int) (Date, error) {
	f := t.f
	d, ok := parseDate(s)
	if !ok {
		if trimSpace(s) == "" {
			return d, t.errf(line, t.dateName(), "date is missing")
		}
		return d, t.errf(line, t.dateName(), "invalid date %q: expected a form such as %s", clip(s, 40), dateForms)
	}
	n := len(f.Dates)
	if n == 0 {
		f.Freq = d.Freq
		return d, nil
	}
	if d.Freq != f.Freq {
		return d, t.errf(line, t.dateName(), "date %s is %s but the dates above are %s (first on line %d)", d, d.Freq, f.Freq, f.Lines[0])
	}
	prev := f.Dates[n-1]
	switch c := d.Compare(prev); {
	case c == 0:
		return d, t.errf(line, t.dateName(), "date %s appears twice, on lines %d and %d", d, f.Lines[n-1], line)
	case c < 0:
		i := sort.Search(n, func(i int) bool { return !f.Dates[i].Before(d) })
		if i < n && f.Dates[i].Equal(d) {
			return d, t.errf(line, t.dateName(), "date %s appears twice, on lines %d and %d", d, f.Lines[i], line)
		}
		return d, t.errf(line, t.dateName(), "date %s comes after %s (line %d): dates must increase", d, prev, f.Lines[n-1])
	}
	if f.Freq != Daily {
		if gap := d.Index() - prev.Index(); gap > 1 {
			missing := prev.Add(1).String()
			if gap > 2 {
				missing = fmt.Sprintf("%s to %s (%d periods)", missing, d.Add(-1), gap-1)
			}
			return d, t.errf(line, t.dateName(), "date %s follows %s (line %d): %s is missing", d, prev, f.Lines[n-1], missing)
		}
	}
	return d, nil
}

// finish settles the frequency (declared, or inferred from calendar
// dates) and returns the frame, or an error if there were no data rows.
func (t *table) finish() (*Frame, error) {
	if len(t.f.Dates) == 0 {
		return nil, t.errf(0, "", "no data rows below the header")
	}
	col := ""
	if t.dateCol >= 0 {
		col = t.dateName()
	}
	var err error
	if t.want != Undated {
		err = t.f.declare(t.want, col)
	} else {
		err = t.f.infer(col)
	}
	if err != nil {
		return nil, err
	}
	return t.f, nil
}
