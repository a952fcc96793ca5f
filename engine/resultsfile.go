package engine

import (
	"encoding/json"
	"math"
	"path/filepath"
	"slices"
	"sort"
	"strings"

	"github.com/galley-econ/galley/resultsfile"
)

// ResultsFile is the results file of this build as a reader sees it
// once read back (numbers as float64, lists as []any): the one form
// comparisons take, whether the file comes from disk or from a build in
// memory. label becomes its Path. It is made from the results directly
// (readerFile) when every value is of a type the results writer knows,
// else by writing the file and reading it back.
func (d *Document) ResultsFile(version, label string) (*resultsfile.File, error) {
	rf := d.resultsRecords(version)
	if f, ok := readerFile(&rf); ok {
		f.Path = label
		if err := resultsfile.Check(f, label); err != nil {
			return nil, err
		}
		return f, nil
	}
	b, err := d.ResultsJSON(version)
	if err != nil {
		return nil, err
	}
	return resultsfile.Parse(b, label)
}

// ResultsJSON renders the results file (or takes it from the cache when
// the same results were rendered before: see cachedResults).
func (d *Document) ResultsJSON(version string) ([]byte, error) {
	return d.cachedResults(version, func(headroom int) ([]byte, error) { return d.resultsJSON(version, headroom) })
}

// resultsJSON renders the results file after headroom bytes left for
// the caller.
func (d *Document) resultsJSON(version string, headroom int) ([]byte, error) {
	rf := d.resultsRecords(version)
	size := 4 << 10
	for _, r := range rf.Results {
		size += 512 + sizeHint(r.Values) + sizeHint(r.Spec)
	}
	if b, ok := appendResultsFile(make([]byte, headroom, headroom+size), &rf); ok {
		return append(b, '\n'), nil
	}
	for i := range rf.Results {
		rf.Results[i].Values = JsonSafe(rf.Results[i].Values).(map[string]any)
	}
	b, err := json.Marshal(rf)
	if err != nil {
		return nil, err
	}
	return append(indentJSON(make([]byte, headroom, headroom+len(b)+len(b)/2), b), '\n'), nil
}

// resultsRecords is the results file of this build before it is written.
func (d *Document) resultsRecords(version string) resultsfile.File {
	rf := resultsfile.File{Galley: version, Manuscript: filepath.Base(d.File), Vintage: d.opts.Vintage, Inputs: d.Inputs()}
	if rf.Inputs == nil {
		rf.Inputs = []resultsfile.Input{}
	}
	quoted := d.quotedPaths()
	for _, r := range d.Results() {
		label := ""
		if r.Number > 0 {
			label = r.Label() // numbered once the whole document has run
		}
		spec := r.Spec
		if spec == nil {
			spec = map[string]any{}
		}
		rf.Results = append(rf.Results, resultsfile.Record{ID: r.ID, Kind: r.Kind, Line: r.Line, Number: r.Number,
			Label: label, Caption: r.Caption(), Hidden: r.HiddenKeys(), Quoted: quoted[r.ID],
			Spec: spec, Values: r.Values})
	}
	if rf.Results == nil {
		rf.Results = []resultsfile.Record{}
	}
	return rf
}

// JsonSafe replaces NaN and ±Inf (which JSON cannot hold) by null and the
// strings "inf"/"-inf".
func JsonSafe(v any) any {
	switch x := v.(type) {
	case float64:
		switch {
		case math.IsNaN(x):
			return nil
		case math.IsInf(x, 1):
			return "inf"
		case math.IsInf(x, -1):
			return "-inf"
		}
		return x
	case []float64:
		out := make([]any, len(x))
		for i, e := range x {
			out[i] = JsonSafe(e)
		}
		return out
	case map[string]any:
		out := make(map[string]any, len(x))
		for k, e := range x {
			out[k] = JsonSafe(e)
		}
		return out
	case []map[string]any:
		out := make([]any, len(x))
		for i, e := range x {
			out[i] = JsonSafe(e)
		}
		return out
	case []any:
		out := make([]any, len(x))
		for i, e := range x {
			out[i] = JsonSafe(e)
		}
		return out
	}
	return v
}

// quotedPaths lists, by directive id, the value paths the prose quotes
// ({{id.path}}, dot-separated), sorted, without the fields every result
// has (label, number, id, kind).
func (d *Document) quotedPaths() map[string][]string {
	out := map[string][]string{}
	for _, n := range d.refs {
		r, err := parseRef(n.Ref)
		if err != nil || slices.Contains(CommonFields, r.path[0]) {
			continue
		}
		p := strings.Join(r.path, ".")
		if !slices.Contains(out[r.id], p) {
			out[r.id] = append(out[r.id], p)
		}
	}
	for _, ps := range out {
		sort.Strings(ps)
	}
	return out
}

// indentJSON appends to dst the compact JSON src (as json.Marshal writes
// it: no space outside strings) indented as json.MarshalIndent(v, "",
// " ") indents it: a line feed and one space per level after each '{',
// '[' and ',', a space after each ':', and empty objects and arrays
// kept as {} and []. It is the same bytes as json.Indent's (tested),
// without its validating scanner, which took half the time of writing
// a large results file.
func indentJSON(dst, src []byte) []byte {
	depth := 0
	newline := func() {
		if depth < len(indentSpaces) {
			dst = append(dst, indentSpaces[:1+depth]...)
			return
		}
		dst = append(dst, '\n')
		for i := 0; i < depth; i++ {
			dst = append(dst, ' ')
		}
	}
	for i := 0; i < len(src); i++ {
		c := src[i]
		switch c {
		case '"':
			// copy the string through its closing quote
			j := i + 1
			for j < len(src) && src[j] != '"' {
				if src[j] == '\\' {
					j++
				}
				j++
			}
			j = min(j, len(src)-1)
			dst = append(dst, src[i:j+1]...)
			i = j
		case '{', '[':
			dst = append(dst, c)
			if i+1 < len(src) && (src[i+1] == '}' || src[i+1] == ']') {
				dst = append(dst, src[i+1])
				i++
				continue
			}
			depth++
			newline()
		case '}', ']':
			depth--
			newline()
			dst = append(dst, c)
		case ',':
			dst = append(dst, c)
			newline()
		case ':':
			dst = append(dst, c, ' ')
		default:
			// a number or a literal: copy up to the next punctuation
			j := i + 1
			for j < len(src) && !jsonPunct[src[j]] {
				j++
			}
			dst = append(dst, src[i:j]...)
			i = j - 1
		}
	}
	return dst
}

// indentSpaces is a line feed and the indentation of the first 127
// levels.
var indentSpaces = "\n" + strings.Repeat(" ", 127)

// jsonPunct marks the bytes indentJSON acts on.
var jsonPunct = [256]bool{'"': true, '{': true, '}': true, '[': true, ']': true, ',': true, ':': true}

// sizeHint is a rough size of v in the indented results file (for the
// writer's buffer): 32 bytes a number, a string's length and quotes.
func sizeHint(v any) int {
	switch x := v.(type) {
	case map[string]any:
		n := 2
		for k, e := range x {
			n += len(k) + 8 + sizeHint(e)
		}
		return n
	case []any:
		n := 2
		for _, e := range x {
			n += sizeHint(e)
		}
		return n
	case []map[string]any:
		n := 2
		for _, e := range x {
			n += sizeHint(e)
		}
		return n
	case []float64:
		return 2 + 32*len(x)
	case []string:
		n := 2
		for _, s := range x {
			n += len(s) + 16
		}
		return n
	case string:
		return len(x) + 16
	}
	return 32
}
