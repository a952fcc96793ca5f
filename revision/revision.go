// Package revision compares two results files number by number: which
// values moved beyond a tolerance, which samples changed, and above all
// which conclusions flipped — a test that rejected at 5% no longer does,
// a coefficient's star count changed, an order-of-integration verdict or
// a cointegrating rank changed, an adjustment coefficient changed sign.
package revision

import (
	"fmt"
	"math"
	"slices"
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
	// Only limits the comparison to the results with these ids (all when
	// empty).
	Only []string
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

// InputChange is a data file whose content changed, appeared or went, or
// that an alias reads from another path than before.
type InputChange struct {
	Alias         string // the data alias, when the results file names it
	Path, OldPath string // the file now and before ("" when absent)
	Old, New      string // SHA-256 before and now ("" when absent)
}

// What describes the change in words, without file paths (for
// published reports).
func (in InputChange) What() string {
	switch {
	case in.Old == "":
		return "new"
	case in.New == "":
		return "no longer read"
	case in.OldPath != in.Path && in.Old == in.New:
		return "another file, same content"
	case in.OldPath != in.Path:
		return "another file, content changed"
	}
	return "content changed"
}

// Detail is What with the file paths, for the terminal.
func (in InputChange) Detail() string {
	switch {
	case in.Old == "":
		return "new (" + in.Path + ")"
	case in.New == "":
		return "no longer read (" + in.OldPath + ")"
	case in.OldPath != in.Path && in.Old == in.New:
		return "read from " + in.Path + " instead of " + in.OldPath + "; same content"
	case in.OldPath != in.Path:
		return "read from " + in.Path + " instead of " + in.OldPath + "; content changed"
	}
	return "content changed (" + in.Path + ")"
}

// Name is the alias ("data grid") or, without one, the path.
func (in InputChange) Name() string {
	if in.Alias != "" {
		return "data " + in.Alias
	}
	if in.Path != "" {
		return in.Path
	}
	return in.OldPath
}

// Item lists the changes of one result.
type Item struct {
	ID, Kind string
	// Name is how published reports name the result (its label and
	// caption; resultsfile.Record.Name).
	Name string
	// Short is its label alone, or the caption when it has none.
	Short    string
	Specs    []Change // keys of its spec that changed (caption and note aside)
	Flips    []Change // conclusions a reader can see that changed
	Samples  []Change // sample and N changes
	Moved    []Change // numbers a reader can see that moved
	Hidden   []Change // changes among values the paper does not show (Flip marks a conclusion)
	Presence []Change // values present in one build only (not conclusions)
}

// Change is one value before and after.
type Change struct {
	What     string
	Old, New string
	Rel      float64 // relative change, for numbers
	// Move is the change in Unit: for an estimate with a standard error,
	// (new − old)/old s.e. (Unit "s.e."); for a test statistic with a 5%
	// critical value, (new − old)/|old 5% critical value| (Unit
	// "|5% c.v.|"); otherwise Rel with Unit "%" (Move = 100·Rel).
	Move float64
	Unit string
	Flip bool // in Item.Hidden: a conclusion that changed
}

// Scaled reports whether the move is measured on the value's own scale.
func (c Change) Scaled() bool { return c.Unit != "" && c.Unit != "%" }

// MoveText is the move with its unit, "+2.31 s.e.", "−0.40 |5% c.v.|" or
// "+12.5%".
func (c Change) MoveText() string {
	switch {
	case c.Unit == "%":
		return fmt.Sprintf("%+.1f%%", c.Move)
	case c.Unit != "":
		return fmt.Sprintf("%+.2f %s", c.Move, c.Unit)
	}
	return ""
}

// HasFlips reports whether any conclusion a reader can see changed.
func (r *Report) HasFlips() bool { return r.Flips() > 0 }

// Flips counts the conclusions a reader can see that changed.
func (r *Report) Flips() int {
	n := 0
	for _, it := range r.Items {
		n += len(it.Flips)
	}
	return n
}

// Ranked is a moved number of one result.
type Ranked struct {
	Item *Item
	Change
}

// Ranked lists the numbers a reader can see that moved, p-values aside
// (their conclusions are the star changes), largest first: the numbers
// with a scale of their own (estimates in standard errors, test
// statistics relative to their 5% critical value) by the size of the move
// on that scale, then the others by relative change.
func (r *Report) Ranked() []Ranked {
	var out []Ranked
	for i := range r.Items {
		it := &r.Items[i]
		for _, ch := range it.Moved {
			leaf := ch.What[strings.LastIndex(ch.What, " ")+1:]
			if leaf == "p" || leaf == "pvalue" || strings.HasPrefix(leaf, "pvalue_") {
				continue
			}
			out = append(out, Ranked{it, ch})
		}
	}
	sort.SliceStable(out, func(i, j int) bool {
		a, b := out[i], out[j]
		if a.Scaled() != b.Scaled() {
			return a.Scaled()
		}
		return math.Abs(a.Move) > math.Abs(b.Move)
	})
	return out
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
	r.InputsChanged = compareInputs(old.Inputs, new.Inputs)
	keep := func(id string) bool { return len(o.Only) == 0 || slices.Contains(o.Only, id) }
	om := map[string]resultsfile.Record{}
	for _, rec := range old.Results {
		om[rec.ID] = rec
	}
	nm := map[string]bool{}
	for _, rec := range new.Results {
		if !keep(rec.ID) {
			continue
		}
		nm[rec.ID] = true
		prev, ok := om[rec.ID]
		if !ok || prev.Kind != rec.Kind {
			// Results are the same result only if id and kind agree.
			r.OnlyNew = append(r.OnlyNew, rec.ID)
			continue
		}
		it := compareRecord(prev, rec, o)
		if len(it.Specs)+len(it.Flips)+len(it.Samples)+len(it.Moved)+len(it.Hidden)+len(it.Presence) == 0 {
			r.Unchanged++
			continue
		}
		r.Items = append(r.Items, it)
	}
	nk := map[string]string{}
	for _, rec := range new.Results {
		nk[rec.ID] = rec.Kind
	}
	for _, rec := range old.Results {
		if k, ok := nk[rec.ID]; keep(rec.ID) && (!nm[rec.ID] || !ok || k != rec.Kind) {
			r.OnlyOld = append(r.OnlyOld, rec.ID)
		}
	}
	return r
}

// compareInputs pairs the data files of two builds: by alias when both
// results files name one (a file renamed under the same alias is the same
// input, changed), by path otherwise.
func compareInputs(old, new []resultsfile.Input) []InputChange {
	key := func(in resultsfile.Input) string {
		if in.Alias != "" {
			return "alias:" + in.Alias
		}
		return "path:" + in.Path
	}
	byAlias := map[string]bool{}
	for _, in := range old {
		if in.Alias != "" {
			byAlias[in.Alias] = true
		}
	}
	om := map[string]resultsfile.Input{}
	for _, in := range old {
		om[key(in)] = in
	}
	var out []InputChange
	seen := map[string]bool{}
	for _, in := range new {
		k := key(in)
		if in.Alias != "" && !byAlias[in.Alias] {
			k = "path:" + in.Path // the old file names no aliases
		}
		prev, ok := om[k]
		if !ok && in.Alias != "" {
			prev, ok = om["path:"+in.Path]
			k = "path:" + in.Path
		}
		seen[k] = true
		switch {
		case !ok:
			out = append(out, InputChange{Alias: in.Alias, Path: in.Path, New: in.SHA256})
		case prev.SHA256 != in.SHA256 || prev.Path != in.Path:
			out = append(out, InputChange{Alias: in.Alias, Path: in.Path, OldPath: prev.Path, Old: prev.SHA256, New: in.SHA256})
		}
	}
	for _, in := range old {
		if !seen[key(in)] {
			out = append(out, InputChange{Alias: in.Alias, OldPath: in.Path, Old: in.SHA256})
		}
	}
	return out
}

// presentational spec keys: a change in them changes no number.
var presentational = []string{"id", "caption", "note"}

func compareRecord(old, new resultsfile.Record, o Options) Item {
	it := Item{ID: new.ID, Kind: new.Kind, Name: new.Name(), Short: new.Label}
	if it.Short == "" {
		// a build still running has no table numbers yet
		it.Short = new.Name()
	}
	it.Specs = compareSpecs(old.Spec, new.Spec)
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
		seen := visible(new, k) && visible(old, k)
		if !aok || !bok {
			// A value present in one build only is not a conclusion
			// that changed.
			if isInteresting(leaf) || seen {
				it.Presence = append(it.Presence, Change{What: describe(k), Old: show(a, aok), New: show(b, bok)})
			}
			continue
		}
		if flip, ok := conclusion(k, leaf, a, b, o); ok {
			if seen {
				it.Flips = append(it.Flips, flip)
			} else {
				flip.Flip = true
				it.Hidden = append(it.Hidden, flip)
			}
		}
		if isSample(k, leaf) {
			if !equal(a, b, 0) {
				it.Samples = append(it.Samples, Change{What: describe(k), Old: show(a, true), New: show(b, true)})
			}
			continue
		}
		x, xok := a.(float64)
		y, yok := b.(float64)
		if !(xok && yok) {
			// Text, or a number turned into text: reported when it
			// differs, never silently "unchanged".
			if !equal(a, b, o.Tol) && (isInteresting(leaf) || seen) {
				it.Presence = append(it.Presence, Change{What: describe(k), Old: show(a, true), New: show(b, true)})
			}
			continue
		}
		if moved(x, y, o.Tol) {
			ch := Change{What: describe(k), Old: num(x), New: num(y), Rel: relChange(x, y)}
			ch.Move, ch.Unit = 100*ch.Rel, "%"
			if d, unit, ok := scale(of, k, leaf); ok {
				ch.Move, ch.Unit = (y-x)/d, unit
			}
			if seen {
				it.Moved = append(it.Moved, ch)
			} else {
				it.Hidden = append(it.Hidden, ch)
			}
		}
	}
	return it
}

// scale is the yardstick of the number at path k in the old values: an
// estimate's standard error, or a test statistic's 5% critical value.
func scale(of map[string]any, k, leaf string) (float64, string, bool) {
	parent := ""
	if i := strings.LastIndex(k, sep); i >= 0 {
		parent = k[:i] + sep
	}
	switch leaf {
	case "est":
		if se, ok := of[parent+"se"].(float64); ok && se > 0 && !math.IsInf(se, 0) {
			return se, "s.e.", true
		}
	case "stat":
		if cv, ok := of[parent+"crit"+sep+"5%"].(float64); ok && cv != 0 && !math.IsInf(cv, 0) {
			return math.Abs(cv), "|5% c.v.|", true
		}
	}
	return 0, "", false
}

// visible reports whether a reader can see or quote the value at path k
// of rec: it is quoted in the prose (it, an enclosing value or a sibling),
// or it is not under a key the result's table does not show, and not the
// checksum of a long list.
func visible(rec resultsfile.Record, k string) bool {
	dk := strings.ReplaceAll(k, sep, ".")
	parent := ""
	if i := strings.LastIndex(dk, "."); i >= 0 {
		parent = dk[:i]
	}
	for _, q := range rec.Quoted {
		if q == dk || strings.HasPrefix(dk, q+".") || (parent != "" && strings.HasPrefix(q, parent+".")) {
			return true
		}
	}
	if strings.HasSuffix(k, sep+listSum) || strings.HasSuffix(k, sep+listLen) {
		return false
	}
	top, _, _ := strings.Cut(k, sep)
	return !slices.Contains(rec.Hidden, top)
}

// compareSpecs lists the spec keys whose values differ (presentational
// keys aside), in key order.
func compareSpecs(old, new map[string]any) []Change {
	keys := map[string]bool{}
	for k := range old {
		keys[k] = true
	}
	for k := range new {
		keys[k] = true
	}
	var ks []string
	for k := range keys {
		if !slices.Contains(presentational, k) {
			ks = append(ks, k)
		}
	}
	sort.Strings(ks)
	var out []Change
	for _, k := range ks {
		a, aok := old[k]
		b, bok := new[k]
		if aok && bok && specText(a) == specText(b) {
			continue
		}
		out = append(out, Change{What: k, Old: specShow(a, aok), New: specShow(b, bok)})
	}
	return out
}

func specShow(v any, ok bool) string {
	if !ok {
		return "(not set)"
	}
	return specText(v)
}

// specText writes a spec value as compact YAML flow text: 4, c,
// [a, b], {max: 12, select: aic}.
func specText(v any) string {
	switch x := v.(type) {
	case []any:
		parts := make([]string, len(x))
		for i, e := range x {
			parts[i] = specText(e)
		}
		return "[" + strings.Join(parts, ", ") + "]"
	case map[string]any:
		ks := make([]string, 0, len(x))
		for k := range x {
			ks = append(ks, k)
		}
		sort.Strings(ks)
		parts := make([]string, len(ks))
		for i, k := range ks {
			parts[i] = k + ": " + specText(x[k])
		}
		return "{" + strings.Join(parts, ", ") + "}"
	}
	return show(v, true)
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
			out[join(listLen)] = float64(len(x))
			out[join(listSum)] = sum
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

// listLen and listSum key a long list's length and checksum.
const (
	listLen = "(length)"
	listSum = "(sum)"
)

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
