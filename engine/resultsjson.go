package engine

import (
	"math"
	"runtime"
	"slices"
	"strconv"
	"sync"
	"unicode/utf8"

	"github.com/galley-econ/galley/resultsfile"
)

// The results file written directly in its indented form, the bytes
// json.MarshalIndent(rf, "", " ") writes for it (tested against it),
// without encoding/json's reflection, its boxing of every number in a
// list, and a second pass to indent. Values are written as JsonSafe
// makes them (a NaN as null, ±Inf as "inf"/"-inf", a nil list or map of
// the kinds it copies as an empty one). A value of a type the writer
// does not know makes it give up (ok false), and the caller then takes
// the encoding/json path.

type resultsWriter struct {
	b  []byte
	ok bool
}

func appendResultsFile(dst []byte, rf *resultsfile.File) ([]byte, bool) {
	w := &resultsWriter{b: dst, ok: true}
	w.b = append(w.b, '{')
	w.key(1, "galley", true)
	w.str(rf.Galley)
	w.key(1, "manuscript", false)
	w.str(rf.Manuscript)
	if rf.Vintage != "" {
		w.key(1, "vintage", false)
		w.str(rf.Vintage)
	}
	w.key(1, "inputs", false)
	if rf.Inputs == nil {
		w.b = append(w.b, "null"...)
	} else if len(rf.Inputs) == 0 {
		w.b = append(w.b, "[]"...)
	} else {
		w.b = append(w.b, '[')
		for i, in := range rf.Inputs {
			w.item(2, i == 0)
			w.b = append(w.b, '{')
			w.key(3, "path", true)
			w.str(in.Path)
			w.key(3, "sha256", false)
			w.str(in.SHA256)
			if in.Alias != "" {
				w.key(3, "alias", false)
				w.str(in.Alias)
			}
			w.end(2, '}')
		}
		w.end(1, ']')
	}
	w.key(1, "results", false)
	if rf.Results == nil {
		w.b = append(w.b, "null"...)
	} else if len(rf.Results) == 0 {
		w.b = append(w.b, "[]"...)
	} else {
		w.b = append(w.b, '[')
		for i := range rf.Results {
			r := &rf.Results[i]
			w.item(2, i == 0)
			w.b = append(w.b, '{')
			w.key(3, "id", true)
			w.str(r.ID)
			w.key(3, "kind", false)
			w.str(r.Kind)
			w.key(3, "line", false)
			w.b = strconv.AppendInt(w.b, int64(r.Line), 10)
			if r.Number != 0 {
				w.key(3, "number", false)
				w.b = strconv.AppendInt(w.b, int64(r.Number), 10)
			}
			if r.Label != "" {
				w.key(3, "label", false)
				w.str(r.Label)
			}
			if r.Caption != "" {
				w.key(3, "caption", false)
				w.str(r.Caption)
			}
			if len(r.Hidden) > 0 {
				w.key(3, "hidden", false)
				w.value(3, r.Hidden, false)
			}
			if len(r.Quoted) > 0 {
				w.key(3, "quoted", false)
				w.value(3, r.Quoted, false)
			}
			w.key(3, "spec", false)
			w.value(3, r.Spec, false)
			w.key(3, "values", false)
			w.value(3, r.Values, true)
			w.end(2, '}')
		}
		w.end(1, ']')
	}
	w.end(0, '}')
	return w.b, w.ok
}

// newline starts a line indented to depth.
func (w *resultsWriter) newline(depth int) {
	if depth < len(indentSpaces) {
		w.b = append(w.b, indentSpaces[:1+depth]...)
		return
	}
	w.b = append(w.b, '\n')
	for i := 0; i < depth; i++ {
		w.b = append(w.b, ' ')
	}
}

// item starts an element of a list or object at depth.
func (w *resultsWriter) item(depth int, first bool) {
	if !first {
		w.b = append(w.b, ',')
	}
	w.newline(depth)
}

func (w *resultsWriter) key(depth int, k string, first bool) {
	w.item(depth, first)
	w.str(k)
	w.b = append(w.b, ':', ' ')
}

// end closes a non-empty list or object whose elements are at depth+1.
func (w *resultsWriter) end(depth int, c byte) {
	w.newline(depth)
	w.b = append(w.b, c)
}

// value writes v at depth (its elements at depth+1); safe applies
// JsonSafe's rules.
func (w *resultsWriter) value(depth int, v any, safe bool) {
	if !w.ok {
		return
	}
	switch x := v.(type) {
	case nil:
		w.b = append(w.b, "null"...)
	case bool:
		w.b = strconv.AppendBool(w.b, x)
	case int:
		w.b = strconv.AppendInt(w.b, int64(x), 10)
	case int64:
		w.b = strconv.AppendInt(w.b, x, 10)
	case uint64: // a bootstrap's seed
		w.b = strconv.AppendUint(w.b, x, 10)
	case string:
		w.str(x)
	case float64:
		w.float(x, safe)
	case []float64:
		writeLeaves(w, depth, x, !safe, func(w *resultsWriter, f float64) { w.float(f, safe) })
	case []any:
		writeList(w, depth, x, !safe, func(e any) { w.value(depth+1, e, safe) })
	case []map[string]any:
		writeList(w, depth, x, !safe, func(e map[string]any) { w.value(depth+1, e, safe) })
	case map[string]any:
		if x == nil && !safe {
			w.b = append(w.b, "null"...)
			return
		}
		if len(x) == 0 {
			w.b = append(w.b, "{}"...)
			return
		}
		keys := make([]string, 0, len(x))
		for k := range x {
			keys = append(keys, k)
		}
		slices.Sort(keys)
		w.b = append(w.b, '{')
		for i, k := range keys {
			w.key(depth+1, k, i == 0)
			w.value(depth+1, x[k], safe)
		}
		w.end(depth, '}')
	case []string:
		writeLeaves(w, depth, x, true, (*resultsWriter).str)
	case []int:
		writeList(w, depth, x, true, func(n int) { w.b = strconv.AppendInt(w.b, int64(n), 10) })
	case []bool:
		writeList(w, depth, x, true, func(v bool) { w.b = strconv.AppendBool(w.b, v) })
	default:
		w.ok = false // encoding/json writes it
	}
}

// writeList writes x as a list at depth, each element by each (at
// depth+1); a nil x is null when nilIsNull, as encoding/json writes it.
func writeList[T any](w *resultsWriter, depth int, x []T, nilIsNull bool, each func(T)) {
	if x == nil && nilIsNull {
		w.b = append(w.b, "null"...)
		return
	}
	if len(x) == 0 {
		w.b = append(w.b, "[]"...)
		return
	}
	w.b = append(w.b, '[')
	for i, e := range x {
		w.item(depth+1, i == 0)
		each(e)
	}
	w.end(depth, ']')
}

// longList is the length from which writeLeaves writes a list on every
// core: a Johansen relation or a residual series of ten thousand rows
// costs about a millisecond to format on one.
const longList = 4096

// leafRuns is the number of runs a long list is cut into (a test sets it).
var leafRuns = func() int { return runtime.GOMAXPROCS(0) }

// writeLeaves is writeList for lists of numbers or strings, whose
// elements each writes without looking at the rest of the file: a long
// one is cut into as many runs as there are cores (GOMAXPROCS), each run
// but the first written into a buffer of its own on its own goroutine,
// and the runs joined in order — the same bytes as one pass (tested).
func writeLeaves[T any](w *resultsWriter, depth int, x []T, nilIsNull bool, each func(*resultsWriter, T)) {
	runs := min(leafRuns(), len(x)/longList)
	if runs < 2 {
		writeList(w, depth, x, nilIsNull, func(e T) { each(w, e) })
		return
	}
	// at least 2·longList elements: neither nil nor empty
	w.b = append(w.b, '[')
	cut := func(r int) int { return r * len(x) / runs }
	rest := make([]resultsWriter, runs)
	var wg sync.WaitGroup
	for r := 1; r < runs; r++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			lo, hi := cut(r), cut(r+1)
			s := &rest[r]
			s.ok, s.b = true, make([]byte, 0, (hi-lo)*(depth+28))
			for _, e := range x[lo:hi] {
				s.item(depth+1, false)
				each(s, e)
			}
		}()
	}
	for i, e := range x[:cut(1)] {
		w.item(depth+1, i == 0)
		each(w, e)
	}
	wg.Wait()
	for _, s := range rest[1:] {
		w.b = append(w.b, s.b...)
		w.ok = w.ok && s.ok
	}
	w.end(depth, ']')
}

// float writes f as encoding/json does; with safe, NaN is null and ±Inf
// "inf"/"-inf" (JsonSafe), else a non-finite number is not writable.
func (w *resultsWriter) float(f float64, safe bool) {
	switch {
	case math.IsNaN(f):
		if !safe {
			w.ok = false
			return
		}
		w.b = append(w.b, "null"...)
		return
	case math.IsInf(f, 0):
		if !safe {
			w.ok = false
			return
		}
		if f > 0 {
			w.b = append(w.b, `"inf"`...)
		} else {
			w.b = append(w.b, `"-inf"`...)
		}
		return
	}
	// encoding/json's floatEncoder: %f-like between 1e-6 and 1e21, else
	// exponent form with a one-digit negative exponent unpadded
	abs := math.Abs(f)
	fmt := byte('f')
	if abs != 0 && (abs < 1e-6 || abs >= 1e21) {
		fmt = 'e'
	}
	w.b = strconv.AppendFloat(w.b, f, fmt, -1, 64)
	if fmt == 'e' {
		n := len(w.b)
		if n >= 4 && w.b[n-4] == 'e' && w.b[n-3] == '-' && w.b[n-2] == '0' {
			w.b[n-2] = w.b[n-1]
			w.b = w.b[:n-1]
		}
	}
}

// str writes s as a JSON string the way encoding/json does with HTML
// escaping on: <, > and & as \u003c, \u003e, \u0026; U+2028 and U+2029
// escaped; invalid UTF-8 as U+FFFD.
func (w *resultsWriter) str(s string) {
	const hex = "0123456789abcdef"
	b := append(w.b, '"')
	start := 0
	for i := 0; i < len(s); {
		if c := s[i]; c < utf8.RuneSelf {
			if c >= 0x20 && c != '"' && c != '\\' && c != '<' && c != '>' && c != '&' {
				i++
				continue
			}
			b = append(b, s[start:i]...)
			switch c {
			case '\\', '"':
				b = append(b, '\\', c)
			case '\b':
				b = append(b, '\\', 'b')
			case '\f':
				b = append(b, '\\', 'f')
			case '\n':
				b = append(b, '\\', 'n')
			case '\r':
				b = append(b, '\\', 'r')
			case '\t':
				b = append(b, '\\', 't')
			default:
				b = append(b, '\\', 'u', '0', '0', hex[c>>4], hex[c&0xF])
			}
			i++
			start = i
			continue
		}
		r, size := utf8.DecodeRuneInString(s[i:])
		if r == utf8.RuneError && size == 1 {
			b = append(b, s[start:i]...)
			b = append(b, `\ufffd`...)
			i += size
			start = i
			continue
		}
		if r == '\u2028' || r == '\u2029' {
			b = append(b, s[start:i]...)
			b = append(b, '\\', 'u', '2', '0', '2', hex[r&0xF])
			i += size
			start = i
			continue
		}
		i += size
	}
	b = append(b, s[start:]...)
	w.b = append(b, '"')
}
