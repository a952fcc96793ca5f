package series

import (
	"bytes"
	"strings"
)

// ReadCSVBytes is ReadCSV on a file already in memory.
func ReadCSVBytes(raw []byte, source string) (*Frame, error) {
	return ReadCSVBytesAs(raw, source, Undated)
}

// ReadCSVBytesAs is ReadCSVAs on a file already in memory: the same
// rules, the same frame and the same errors. A file without quotes and
// without a carriage return other than before a line feed — what
// numbers-only data files are — is split in place: the rows are counted
// first so that every column, the dates and the line numbers are
// allocated once, and the fields are substrings of one copy of the
// file. Any other file goes through ReadCSVAs (encoding/csv).
func ReadCSVBytesAs(raw []byte, source string, freq Freq) (*Frame, error) {
	if f, err, ok := readPlainCSV(raw, source, freq); ok {
		return f, err
	}
	return ReadCSVAs(bytes.NewReader(raw), source, freq)
}

// plainCSV reports whether raw can be split without encoding/csv's
// quoting rules: no quote at all, and every carriage return directly
// before a line feed (encoding/csv drops those; any other one is data).
func plainCSV(raw []byte) bool {
	if bytes.IndexByte(raw, '"') >= 0 {
		return false
	}
	for i := bytes.IndexByte(raw, '\r'); i >= 0; {
		if i+1 >= len(raw) || raw[i+1] != '\n' {
			return false
		}
		j := bytes.IndexByte(raw[i+1:], '\r')
		if j < 0 {
			break
		}
		i += 1 + j
	}
	return true
}

// readPlainCSV reads a plain file (see plainCSV) as ReadCSVAs would; ok
// is false when the file is not plain or has no header row, and the
// caller must use the general reader.
func readPlainCSV(raw []byte, source string, freq Freq) (f *Frame, err error, ok bool) {
	if bytes.HasPrefix(raw, []byte("\xEF\xBB\xBF")) {
		raw = raw[3:]
	}
	if !plainCSV(raw) {
		return nil, nil, false
	}
	head := raw
	if len(head) > 64<<10 { // the general reader looks at this much
		head = head[:64<<10]
	}
	comma := byte(detectDelimiter(head))
	s := string(raw) // one copy; every field is a substring of it
	t := newTable(source, freq)
	t.rowsHint = strings.Count(s, "\n") + 1
	var fields []string
	line, header := 0, false
	for len(s) > 0 {
		line++
		var l string
		if i := strings.IndexByte(s, '\n'); i >= 0 {
			l, s = s[:i], s[i+1:]
		} else {
			l, s = s, ""
		}
		if n := len(l); n > 0 && l[n-1] == '\r' {
			l = l[:n-1]
		}
		if l == "" { // encoding/csv skips empty lines
			continue
		}
		fields = fields[:0]
		for {
			i := strings.IndexByte(l, comma)
			if i < 0 {
				fields = append(fields, l)
				break
			}
			fields = append(fields, l[:i])
			l = l[i+1:]
		}
		if !header {
			if err := t.setHeader(fields, line); err != nil {
				return nil, err, true
			}
			header = true
			continue
		}
		if err := t.addRow(fields, line); err != nil {
			return nil, err, true
		}
	}
	if !header {
		return nil, nil, false
	}
	f, err = t.finish()
	return f, err, true
}
