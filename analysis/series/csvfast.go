package series

import (
	"bytes"
	"runtime"
	"strings"
	"sync"
	"unsafe"
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
// allocated once, the fields are substrings of one copy of the file,
// and the values of a long file are parsed on every core. Any other file goes through ReadCSVAs (encoding/csv).
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
	// Every field is a substring of s, which is raw itself, not a copy
	// (copying a large file into new memory cost ~1 ms a megabyte, most
	// of it in page faults): no substring outlives this call, since the
	// header's names are copied when the header is read (setHeader) and
	// every other field becomes a number or a date.
	s := unsafe.String(unsafe.SliceData(raw), len(raw))
	t := newTable(source, freq)
	t.rowsHint = strings.Count(s, "\n") + 1
	parallel := false // decided from the header's width
	var spans []int32 // parallel: start and end of each data row in s
	var fields []string
	line, header, pos := 0, false, 0
	var headErr error // the first width or date error (parallel)
	for pos < len(s) {
		line++
		start := pos
		end := len(s)
		if i := strings.IndexByte(s[pos:], '\n'); i >= 0 {
			end = pos + i
			pos = end + 1
		} else {
			pos = end
		}
		if end > start && s[end-1] == '\r' {
			end--
		}
		if end == start { // encoding/csv skips empty lines
			continue
		}
		fields = splitFields(fields[:0], s[start:end], comma)
		if !header {
			if err := t.setHeader(fields, line); err != nil {
				return nil, err, true
			}
			header = true
			parallel = t.rowsHint*len(fields) >= parallelCells && runtime.GOMAXPROCS(0) > 1
			if parallel {
				spans = make([]int32, 0, 2*t.rowsHint)
			}
			continue
		}
		if !parallel {
			if err := t.addRow(fields, line); err != nil {
				return nil, err, true
			}
			continue
		}
		if err := t.addRowHead(fields, line); err != nil {
			headErr = err
			break
		}
		spans = append(spans, int32(start), int32(end))
	}
	if !header {
		return nil, nil, false
	}
	if parallel {
		if err := t.parseValuesParallel(s, comma, spans); err != nil {
			return nil, err, true
		}
		if headErr != nil {
			return nil, headErr, true
		}
	}
	f, err = t.finish()
	return f, err, true
}

// parallelCells is the number of cells (rows times columns) from which
// readPlainCSV parses the values on every core: the rows are split and
// dated in order first (those checks read the rows before), then the
// values, independent of each other, are parsed in contiguous blocks at
// the same time.
const parallelCells = 32768

// splitFields appends the fields of one line to fields.
func splitFields(fields []string, l string, comma byte) []string {
	for {
		i := strings.IndexByte(l, comma)
		if i < 0 {
			return append(fields, l)
		}
		fields = append(fields, l[:i])
		l = l[i+1:]
	}
}

// parseValuesParallel parses the values of the rows whose spans in s
// are given (two offsets a row) into the columns, in contiguous blocks
// on every core, and returns the error of the earliest row with a bad
// value, as a reading in order would.
func (t *table) parseValuesParallel(s string, comma byte, spans []int32) error {
	n := len(spans) / 2
	for k := range t.f.cols {
		t.f.cols[k] = t.f.cols[k][:n] // rowsHint ≥ n: no new array
	}
	workers := min(runtime.GOMAXPROCS(0), 8, max(n*max(len(t.f.cols), 1)/(parallelCells/2), 1))
	errs := make([]error, workers)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		lo, hi := n*w/workers, n*(w+1)/workers
		wg.Add(1)
		go func() {
			defer wg.Done()
			var fields []string
			for i := lo; i < hi; i++ {
				fields = splitFields(fields[:0], s[spans[2*i]:spans[2*i+1]], comma)
				if err := t.parseValuesAt(fields, t.f.Lines[i], i); err != nil {
					errs[w] = err // the first in this block; blocks are in order
					return
				}
			}
		}()
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return err
		}
	}
	return nil
}
