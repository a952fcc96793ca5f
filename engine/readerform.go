package engine

import (
	"math"
	"slices"
	"unicode/utf8"

	"github.com/galley-econ/galley/resultsfile"
)

// readerFile returns rf as resultsfile.Parse reads it back from the bytes
// appendResultsFile writes for it, without writing or parsing them (a
// comparison of two builds in memory, as the revision directive makes,
// spent a third of its time on that round trip). The rules are the round
// trip's, value by value (tested against it on random files):
//
//   - numbers become float64 (an int exactly as its decimal text parses);
//   - in values (safe), NaN is nil and ±Inf the strings "inf"/"-inf"; a
//     non-finite number in a spec cannot be written, so readerFile gives
//     up (false) as the writer does;
//   - lists become []any; a nil list or map is nil where the writer
//     writes null (specs, and lists of strings, ints or booleans) and
//     empty where it writes [] or {} (values);
//   - strings and keys lose invalid UTF-8, each bad byte becoming U+FFFD;
//   - fields the writer leaves out when empty (vintage, number, label,
//     caption, hidden, quoted, an input's alias) come back as zero values;
//   - a value of a type the writer does not know makes it give up.
func readerFile(rf *resultsfile.File) (*resultsfile.File, bool) {
	out := &resultsfile.File{Galley: validText(rf.Galley), Manuscript: validText(rf.Manuscript), Vintage: validText(rf.Vintage)}
	if rf.Inputs != nil {
		out.Inputs = make([]resultsfile.Input, len(rf.Inputs))
		for i, in := range rf.Inputs {
			out.Inputs[i] = resultsfile.Input{Path: validText(in.Path), SHA256: validText(in.SHA256), Alias: validText(in.Alias)}
		}
	}
	if rf.Results != nil {
		out.Results = make([]resultsfile.Record, len(rf.Results))
	}
	for i := range rf.Results {
		r := &rf.Results[i]
		o := resultsfile.Record{ID: validText(r.ID), Kind: validText(r.Kind), Line: r.Line, Number: r.Number,
			Label: validText(r.Label), Caption: validText(r.Caption)}
		if len(r.Hidden) > 0 {
			o.Hidden = validTexts(r.Hidden)
		}
		if len(r.Quoted) > 0 {
			o.Quoted = validTexts(r.Quoted)
		}
		spec, ok := readerValue(r.Spec, false)
		if !ok {
			return nil, false
		}
		values, ok := readerValue(r.Values, true)
		if !ok {
			return nil, false
		}
		o.Spec, _ = spec.(map[string]any)
		o.Values, _ = values.(map[string]any)
		out.Results[i] = o
	}
	return out, true
}

// readerValue is v as read back from the results file (see readerFile);
// safe applies JsonSafe's rules, as for a result's values.
func readerValue(v any, safe bool) (any, bool) {
	switch x := v.(type) {
	case nil:
		return nil, true
	case bool:
		return x, true
	case int:
		return float64(x), true
	case int64:
		return float64(x), true
	case uint64:
		return float64(x), true
	case string:
		return validText(x), true
	case float64:
		switch {
		case math.IsNaN(x):
			return nil, safe
		case math.IsInf(x, 1):
			return "inf", safe
		case math.IsInf(x, -1):
			return "-inf", safe
		}
		return x, true
	case []float64:
		return readerSlice(x, !safe, func(e float64) (any, bool) { return readerValue(e, safe) })
	case []any:
		return readerSlice(x, !safe, func(e any) (any, bool) { return readerValue(e, safe) })
	case []map[string]any:
		return readerSlice(x, !safe, func(e map[string]any) (any, bool) { return readerValue(e, safe) })
	case map[string]any:
		if x == nil && !safe {
			return nil, true
		}
		// in the writer's order (sorted keys), so that keys that become
		// equal once made valid UTF-8 keep the last, as a reader does
		keys := make([]string, 0, len(x))
		for k := range x {
			keys = append(keys, k)
		}
		slices.Sort(keys)
		out := make(map[string]any, len(x))
		for _, k := range keys {
			e, ok := readerValue(x[k], safe)
			if !ok {
				return nil, false
			}
			out[validText(k)] = e
		}
		return out, true
	case []string:
		return readerSlice(x, true, func(e string) (any, bool) { return validText(e), true })
	case []int:
		return readerSlice(x, true, func(e int) (any, bool) { return float64(e), true })
	case []bool:
		return readerSlice(x, true, func(e bool) (any, bool) { return e, true })
	}
	return nil, false
}

// readerSlice is x read back element by element (each); a nil x is nil
// where the writer writes null for it (nilIsNull), else an empty list.
func readerSlice[T any](x []T, nilIsNull bool, each func(T) (any, bool)) (any, bool) {
	if x == nil && nilIsNull {
		return nil, true
	}
	out := make([]any, len(x))
	for i, e := range x {
		v, ok := each(e)
		if !ok {
			return nil, false
		}
		out[i] = v
	}
	return out, true
}

// validText is s with each byte that is not part of valid UTF-8 replaced
// by U+FFFD, as the results writer (and encoding/json) writes it.
func validText(s string) string {
	if utf8.ValidString(s) {
		return s
	}
	b := make([]byte, 0, len(s)+8)
	for i := 0; i < len(s); {
		r, n := utf8.DecodeRuneInString(s[i:])
		if r == utf8.RuneError && n == 1 {
			b = utf8.AppendRune(b, utf8.RuneError)
		} else {
			b = append(b, s[i:i+n]...)
		}
		i += n
	}
	return string(b)
}

func validTexts(x []string) []string {
	out := make([]string, len(x))
	for i, s := range x {
		out[i] = validText(s)
	}
	return out
}
