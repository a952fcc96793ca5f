// Package revision compares two results files number by number: which
// values moved beyond a tolerance, which samples changed, and above all
// which conclusions flipped — a test that rejected at 5% no longer does,
// a coefficient's star count changed, an order-of-integration verdict or
// a cointegrating rank changed, an adjustment coefficient changed sign.
package revision

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"

	"github.com/galley-econ/galley/resultsfile"
)

// Options tune a comparison.
type Options struct {
	// Tol is the relative change below which a number has not moved
	// (default 1e-9); changes smaller than Tol in absolute value are also
	// ignored for numbers near zero.
	Tol float64
	// Stars are the star thresholds (default 0.10, 0.05, 0.01).
	Stars []float64
}

// Report is the outcome of a comparison.
type Report struct {
	Old, New         *resultsfile.File
	SameManuscript   bool
	InputsChanged    []InputChange
	OnlyOld, OnlyNew []string
	Items            []Item // results present in both with any change
	Unchanged        int
}

// InputChange is a data file whose content changed, appeared or went.
type InputChange struct{ Path, Old, New string }

// Item lists the changes of one result.
type Item struct {
	ID, Kind string
	Flips    []Change // conclusions that changed
	Samples  []Change // sample and N changes
	Moved    []Change // numbers that moved
}

// Change is one value before and after.
type Change struct {
	What     string
	Old, New string
	Rel      float64 // relative change, for numbers
}

// HasFlips reports whether any conclusion changed.
func (r *Report) HasFlips() bool {
	for _, it := range r.Items {
		if len(it.Flips) > 0 {
			return true
		}
	}
	return false
}

// Flips counts the conclusions that changed.
func (r *Report) Flips() int {
	n := 0
	for _, it := range r.Items {
		n += len(it.Flips)
	}
	return n
}

// Compare compares two results files.
func Compare(old, new *resultsfile.File, o Options) *Report {
	if o.Tol == 0 {
		o.Tol = 1e-9
	}
	if len(o.Stars) == 0 {
		o.Stars = []float64{0.10, 0.05, 0.01}
	}
	r := &Report{Old: old, New: new, SameManuscript: old.Manuscript == new.Manuscript}
	oi := map[string]string{}
	for _, in := range old.Inputs {
		oi[in.Path] = in.SHA256
	}
	seen := map[string]bool{}
	for _, in := range new.Inputs {
		seen[in.Path] = true
		if h, ok := oi[in.Path]; !ok {
			r.InputsChanged = append(r.InputsChanged, InputChange{in.Path, "", in.SHA256})
		} else if h != in.SHA256 {
			r.InputsChanged = append(r.InputsChanged, InputChange{in.Path, h, in.SHA256})
		}
	}
	for _, in := range old.Inputs {
		if !seen[in.Path] {
			r.InputsChanged = append(r.InputsChanged, InputChange{in.Path, in.SHA256, ""})
		}
	}
	om := map[string]resultsfile.Record{}
	for _, rec := range old.Results {
		om[rec.ID] = rec
	}
	nm := map[string]bool{}
	for _, rec := range new.Results {
		nm[rec.ID] = true
		prev, ok := om[rec.ID]
		if !ok {
			r.OnlyNew = append(r.OnlyNew, rec.ID)
			continue
		}
		it := compareRecord(prev, rec, o)
		if len(it.Flips)+len(it.Samples)+len(it.Moved) == 0 {
			r.Unchanged++
			continue
		}
		r.Items = append(r.Items, it)
	}
	for _, rec := range old.Results {
		if !nm[rec.ID] {
			r.OnlyOld = append(r.OnlyOld, rec.ID)
		}
	}
	return r
}

func compareRecord(old, new resultsfile.Record, o Options) Item {
	it := Item{ID: new.ID, Kind: new.Kind}
	of, nf := map[string]any{}, map[string]any{}
	flatten("", old.Values, of)
	flatten("", new.Values, nf)
	keys := make([]string, 0, len(nf))
	for k := range nf {
		keys = append(keys, k)
	}
	for k := range of {
		if _, ok := nf[k]; !ok {
			keys = append(keys, k)
		}
	}
	sort.Strings(keys)
	for _, k := range keys {
		a, aok := of[k]
		b, bok := nf[k]
		leaf := k[strings.LastIndex(k, sep)+1:]
		switch {
		case !aok || !bok:
			if isInteresting(leaf) {
				it.Flips = append(it.Flips, Change{What: describe(k), Old: show(a, aok), New: show(b, bok)})
			}
			continue
		}
		if flip, ok := conclusion(k, leaf, a, b, o); ok {
			it.Flips = append(it.Flips, flip)
		}
		if isSample(k, leaf) {
			if !equal(a, b, 0) {
				it.Samples = append(it.Samples, Change{What: describe(k), Old: show(a, true), New: show(b, true)})
			}
			continue
		}
		if x, ok := a.(float64); ok {
			if y, ok := b.(float64); ok && moved(x, y, o.Tol) {
				it.Moved = append(it.Moved, Change{What: describe(k), Old: num(x), New: num(y), Rel: relChange(x, y)})
			}
		}
	}
	return it
}

// flatten turns nested values into dotted paths; lists of named entries
// are keyed by their "term" or "name"; long numeric lists (residual
// series) are summarised as their length and a hash-like checksum.
func flatten(prefix string, v any, out map[string]any) {
	join := func(k string) string {
		if prefix == "" {
			return k
		}
		return prefix + sep + k
	}
	switch x := v.(type) {
	case map[string]any:
		for k, e := range x {
			flatten(join(k), e, out)
		}
	case []any:
		named := len(x) > 0
		for _, e := range x {
			m, ok := e.(map[string]any)
			if !ok || (m["term"] == nil && m["name"] == nil) {
				named = false
				break
			}
		}
		if named {
			for _, e := range x {
				m := e.(map[string]any)
				name, _ := m["term"].(string)
				if name == "" {
					name, _ = m["name"].(string)
				}
				flatten(join(name), m, out)
			}
			return
		}
		if len(x) > 12 {
			var sum float64
			for _, e := range x {
				if f, ok := e.(float64); ok {
					sum += f
				}
			}
			out[join("n")] = float64(len(x))
			out[join("sum")] = sum
			return
		}
		for i, e := range x {
			flatten(join(strconv.Itoa(i)), e, out)
		}
	default:
		out[prefix] = v
	}
}

func isInteresting(leaf string) bool {
	switch leaf {
	case "reject_5", "order", "rank", "error_corrects", "verdict":
		return true
	}
	return false
}

func isSample(path, leaf string) bool {
	return leaf == "nobs" || strings.Contains(path, "sample"+sep) || strings.HasPrefix(path, "sample")
}

// conclusion reports a flipped conclusion between two values at path.
func conclusion(path, leaf string, a, b any, o Options) (Change, bool) {
	what := describe(path)
	parent := ""
	if i := strings.LastIndex(path, sep); i >= 0 {
		parent = describe(path[:i]) + ": "
	}
	switch leaf {
	case "reject_5":
		if a != b {
			return Change{What: parent + "rejects its null at 5%", Old: yesNo(a), New: yesNo(b)}, true
		}
	case "order", "rank", "verdict":
		if !equal(a, b, 0) {
			return Change{What: what, Old: show(a, true), New: show(b, true)}, true
		}
	case "error_corrects":
		if a != b {
			return Change{What: what, Old: yesNo(a), New: yesNo(b)}, true
		}
	case "alpha":
		x, xok := a.(float64)
		y, yok := b.(float64)
		if xok && yok && (x < 0) != (y < 0) {
			return Change{What: what + " (adjustment) changed sign", Old: num(x), New: num(y)}, true
		}
	case "p":
		// a coefficient's p-value: did its star count change?
		x, xok := a.(float64)
		y, yok := b.(float64)
		if xok && yok {
			sa, sb := stars(x, o.Stars), stars(y, o.Stars)
			if sa != sb {
				return Change{What: parent + "stars", Old: starText(sa), New: starText(sb)}, true
			}
		}
	}
	return Change{}, false
}

func stars(p float64, th []float64) int {
	n := 0
	for _, t := range th {
		if p < t {
			n++
		}
	}
	return n
}

func starText(n int) string {
	if n == 0 {
		return "none"
	}
	return strings.Repeat("*", n)
}

func moved(x, y, tol float64) bool {
	if math.IsNaN(x) || math.IsNaN(y) {
		return math.IsNaN(x) != math.IsNaN(y)
	}
	d := math.Abs(y - x)
	return d > tol*math.Max(math.Abs(x), math.Abs(y)) && d > tol
}

func relChange(x, y float64) float64 {
	if x == 0 {
		return math.Inf(1)
	}
	return (y - x) / math.Abs(x)
}

func equal(a, b any, tol float64) bool {
	x, xok := a.(float64)
	y, yok := b.(float64)
	if xok && yok {
		return !moved(x, y, math.Max(tol, 1e-12))
	}
	return fmt.Sprint(a) == fmt.Sprint(b)
}

// sep joins the parts of a value's path; names may hold dots and spaces.
const sep = "\x1f"

func describe(path string) string { return strings.ReplaceAll(path, sep, " ") }

func show(v any, ok bool) string {
	if !ok {
		return "(absent)"
	}
	if f, isF := v.(float64); isF {
		if f == math.Trunc(f) && math.Abs(f) < 1e15 {
			return strconv.FormatFloat(f, 'f', 0, 64)
		}
		return num(f)
	}
	if v == nil {
		return "n/a"
	}
	return fmt.Sprint(v)
}

func yesNo(v any) string {
	switch v {
	case true:
		return "yes"
	case false:
		return "no"
	}
	return show(v, v != nil)
}

// num formats a number with six significant digits.
func num(f float64) string {
	return strconv.FormatFloat(f, 'g', 6, 64)
}
