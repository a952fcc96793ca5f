package series

import (
	"bufio"
	"bytes"
	"encoding/csv"
	"errors"
	"io"
)

// ReadCSV reads a table of delimited text: a header row naming the
// columns, then one row per observation. The delimiter (comma,
// semicolon or tab) is the one that occurs most often in the header
// line; a UTF-8 byte-order mark and CRLF line ends are accepted.
//
// The date column is the first one named date, period or time (any
// case), else the first column if it is unnamed or its first value is a
// quarterly, monthly or daily date; without one the data are Undated
// and numbered 1…n. All dates must be of one form and strictly
// increasing; annual, quarterly and monthly dates must also be
// consecutive (daily dates may skip days).
//
// Calendar dates (1974-01-01) are read as annual, quarterly or monthly
// periods when they date one period each on one rule: every date the
// first day of its year, quarter or month (1974-01-01, 1974-04-01, …),
// every date the last day (1974-03-31, 1974-06-30, …), or every date
// the same day inside its period; and at least two of them in
// consecutive periods. The coarsest such frequency is chosen; then, as
// for dates written as periods, no period may be skipped. Otherwise
// they stay days. Frame.FreqBasis says which rule decided.
//
// Values are plain decimal numbers; an empty cell, NA, . or NaN (any
// case) is a missing value, kept as NaN. Infinite or overflowing
// values, text, and rows with the wrong number of fields are errors.
// Every error is a *DataError naming source, line and column.
//
// The rows are streamed: memory grows with the columns only.
func ReadCSV(r io.Reader, source string) (*Frame, error) {
	return ReadCSVAs(r, source, Undated)
}

// ReadCSVAs is ReadCSV with the frequency declared by the caller
// instead of inferred (Undated: infer it). Calendar dates are then read
// as the periods of freq that contain them, whatever day of the period
// they name, each period with one date and none skipped; dates written
// as periods must have the declared frequency.
func ReadCSVAs(r io.Reader, source string, freq Freq) (*Frame, error) {
	t := newTable(source, freq)
	br := bufio.NewReaderSize(r, 64<<10)
	if b, err := br.Peek(3); err == nil && bytes.Equal(b, []byte("\xEF\xBB\xBF")) {
		br.Discard(3)
	}
	head, err := br.Peek(br.Size())
	if err != nil && err != io.EOF && err != bufio.ErrBufferFull {
		return nil, t.errf(0, "", "%v", err)
	}
	cr := csv.NewReader(br)
	cr.Comma = detectDelimiter(head)
	cr.FieldsPerRecord = -1
	cr.ReuseRecord = true

	header, err := cr.Read()
	if err == io.EOF {
		return nil, t.errf(0, "", "empty file: expected a header row naming the columns")
	}
	if err != nil {
		return nil, csvError(t, err)
	}
	line, _ := cr.FieldPos(0)
	if err := t.setHeader(header, line); err != nil {
		return nil, err
	}
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, csvError(t, err)
		}
		line, _ := cr.FieldPos(0)
		if err := t.addRow(rec, line); err != nil {
			return nil, err
		}
	}
	return t.finish()
}

// detectDelimiter counts commas, semicolons and tabs outside quotes in
// the first line of head and returns the most frequent (comma on ties
// or when there is none).
func detectDelimiter(head []byte) rune {
	var comma, semi, tab int
	quoted := false
	for _, c := range head {
		if c == '"' {
			quoted = !quoted
			continue
		}
		if quoted {
			continue
		}
		if c == '\n' || c == '\r' {
			break
		}
		switch c {
		case ',':
			comma++
		case ';':
			semi++
		case '\t':
			tab++
		}
	}
	switch {
	case semi > comma && semi >= tab:
		return ';'
	case tab > comma && tab > semi:
		return '\t'
	}
	return ','
}

// csvError turns an error of encoding/csv into a *DataError.
func csvError(t *table, err error) error {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		if pe.Line != pe.StartLine {
			return t.errf(pe.StartLine, "", "malformed row (the problem is on line %d): %v", pe.Line, pe.Err)
		}
		return t.errf(pe.Line, "", "malformed row: %v", pe.Err)
	}
	return t.errf(0, "", "reading: %v", err)
}
