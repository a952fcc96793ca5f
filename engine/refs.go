package engine

import (
	"fmt"
	"math"
	"regexp"
	"slices"
	"strconv"
	"strings"

	"github.com/galley-econ/galley/engine/table"
	"github.com/galley-econ/galley/manuscript"
)

// An inline reference is {{id.path [verb]}}: id names a directive, path
// walks its values (map keys; for lists of terms, the term name; or an
// index), verb is an optional printf verb such as %.2f.
type ref struct {
	id   string
	path []string
	verb string
}

func parseRef(s string) (ref, error) {
	var r ref
	f := strings.Fields(s)
	if len(f) == 0 || len(f) > 2 {
		return r, fmt.Errorf("inline value {{%s}}: write {{id.field}} or {{id.field %%.3f}}", s)
	}
	if len(f) == 2 {
		r.verb = f[1]
		if !verbRE.MatchString(r.verb) {
			return r, fmt.Errorf("inline value {{%s}}: %q is not a format such as %%.3f, %%e or %%d (flags + - # 0 and space, a width and a precision of at most two digits)", s, r.verb)
		}
	}
	parts := strings.Split(f[0], ".")
	r.id = parts[0]
	r.path = parts[1:]
	if r.id == "" || len(r.path) == 0 || slices.Contains(r.path, "") {
		return r, fmt.Errorf("inline value {{%s}}: write id.field, e.g. {{north.stat}}", s)
	}
	return r, nil
}

// CommonFields are the fields every result has, whatever its kind.
var CommonFields = []string{"label", "number", "id", "kind"}

func (d *Document) checkRef(n *manuscript.RefNode) (ref, error) {
	line := d.LineOf(n.Offset)
	r, err := parseRef(n.Ref)
	if err != nil {
		return r, manuscript.ErrAt(d.File, line, "%v", err)
	}
	b, ok := d.byID[r.id]
	if a, isAnchor := d.anchors[r.id]; !ok && isAnchor {
		if len(r.path) != 1 || r.path[0] != "label" && r.path[0] != "number" {
			return r, manuscript.ErrAt(d.File, line, "inline value {{%s}}: %q is %s; refer to it with {{%s.label}} or {{%s.number}}", n.Ref, r.id, article(a.Kind), r.id, r.id)
		}
		if a.Kind == "section" && a.Number == "" {
			return r, manuscript.ErrAt(d.File, line, "inline value {{%s}}: the section %q is below the numbered levels (galley numbers %d levels of headings), so it has no number to refer to", n.Ref, r.id, manuscript.MaxNumberedLevel)
		}
		return r, nil
	}
	if !ok {
		return r, manuscript.ErrAt(d.File, line, "inline value {{%s}}: no directive has id %q, nor any equation or section%s", n.Ref, r.id, manuscript.DidYouMean(r.id, d.refIDs()))
	}
	if f := b.kind.Fields; f != nil && !slices.Contains(f, r.path[0]) && !slices.Contains(CommonFields, r.path[0]) {
		all := append(slices.Clone(f), CommonFields...)
		return r, manuscript.ErrAt(d.File, line, "inline value {{%s}}: a %s result has no field %q%s; fields: %s", n.Ref, b.kind.Name, r.path[0], manuscript.DidYouMean(r.path[0], all), strings.Join(all, ", "))
	}
	return r, nil
}

// InlineValue is an inline value as text, with Numeric true when it is a
// number (so that writers can typeset its sign), and Target set for a
// cross-reference ({{id.label}}) to the result it names.
type InlineValue struct {
	Text    string
	Numeric bool
	Target  *Result
	// XRef is set for every cross-reference ({{id.label}}): to a table,
	// figure or equation result, or to a display equation or section of
	// the manuscript.
	XRef *XRef
}

func article(kind string) string {
	if kind == "equation" {
		return "an equation"
	}
	return "a section"
}

// Inline is the text of the inline value n.
func (d *Document) Inline(n *manuscript.RefNode) (InlineValue, error) {
	line := d.LineOf(n.Offset)
	r, err := d.checkRef(n)
	if err != nil {
		return InlineValue{}, err
	}
	if a, ok := d.anchors[r.id]; ok && d.byID[r.id] == nil {
		if r.path[0] == "number" {
			return InlineValue{Text: a.Number}, nil
		}
		return InlineValue{Text: a.Label(), XRef: a.XRef()}, nil
	}
	res := d.byID[r.id].result
	if res == nil {
		return InlineValue{}, manuscript.ErrAt(d.File, line, "inline value {{%s}}: %q has no result", n.Ref, r.id)
	}
	var v any
	switch r.path[0] {
	case "label":
		return InlineValue{Text: res.Label(), Target: res, XRef: res.XRef()}, nil
	case "number":
		v = res.Number
		if strings.Contains(res.Tag, ".") {
			v = res.Tag
		}
	case "id":
		v = res.ID
	case "kind":
		v = res.Kind
	default:
		v, err = Lookup(res.Values, r.path)
		if err != nil {
			return InlineValue{}, manuscript.ErrAt(d.File, line, "inline value {{%s}}: %v", n.Ref, err)
		}
	}
	s, num, err := formatValue(v, r.verb, d.defaultDecimals())
	if err != nil {
		return InlineValue{}, manuscript.ErrAt(d.File, line, "inline value {{%s}}: %v", n.Ref, err)
	}
	return InlineValue{Text: s, Numeric: num}, nil
}

func (d *Document) defaultDecimals() int {
	if d.Meta.Decimals != nil {
		return *d.Meta.Decimals
	}
	return 3
}

// Lookup walks path through nested maps and lists.
func Lookup(v any, path []string) (any, error) {
	for i, p := range path {
		switch x := v.(type) {
		case map[string]any:
			next, ok := x[p]
			if !ok {
				return nil, fmt.Errorf("no field %q%s; there are: %s", strings.Join(path[:i+1], "."), manuscript.DidYouMean(p, Keys(x)), strings.Join(Keys(x), ", "))
			}
			v = next
		case []map[string]any:
			found := false
			for _, e := range x {
				if name, _ := e["term"].(string); name == p {
					v, found = e, true
					break
				}
				if name, _ := e["name"].(string); name == p {
					v, found = e, true
					break
				}
			}
			if !found {
				if k, err := strconv.Atoi(p); err == nil && k >= 0 && k < len(x) {
					v, found = x[k], true
				}
			}
			if !found {
				var names []string
				for _, e := range x {
					if name, ok := e["term"].(string); ok {
						names = append(names, name)
					} else if name, ok := e["name"].(string); ok {
						names = append(names, name)
					}
				}
				hint := TermHint(p)
				if hint == "" {
					hint = manuscript.DidYouMean(p, names)
				}
				return nil, fmt.Errorf("%q is not among %s%s", p, strings.Join(path[:i], "."), hint)
			}
		case []float64:
			k, err := strconv.Atoi(p)
			if err != nil || k < 0 || k >= len(x) {
				return nil, fmt.Errorf("%s is a list of %d numbers; use an index 0..%d", strings.Join(path[:i], "."), len(x), len(x)-1)
			}
			v = x[k]
		default:
			return nil, fmt.Errorf("%s is a single value; it has no field %q", strings.Join(path[:i], "."), p)
		}
	}
	return v, nil
}

func Keys(m map[string]any) []string {
	var out []string
	for k := range m {
		out = append(out, k)
	}
	slices.Sort(out)
	return out
}

// formatValue formats a scalar value for prose.
// verbRE is the printf verbs an inline value accepts: flags, a width and a
// precision of at most two digits each, and one of f F e E g G d s v.
var verbRE = regexp.MustCompile(`^%[-+# 0]*[0-9]{0,2}(\.[0-9]{1,2})?[fFeEgGdsv]$`)

// formatValue writes v with verb (or dec decimals for a number when verb
// is ""), refusing a verb that does not fit the value: %d for a number
// with a fraction (which would print it rounded without a word), %s or %v
// for a number, a number's verb for text.
func formatValue(v any, verb string, dec int) (string, bool, error) {
	last := ""
	if verb != "" {
		last = verb[len(verb)-1:]
	}
	switch x := v.(type) {
	case float64:
		if math.IsNaN(x) {
			return "n/a", false, nil
		}
		if verb == "" {
			verb = "%." + strconv.Itoa(dec) + "f"
		}
		switch last {
		case "d":
			if x != math.Trunc(x) || math.IsInf(x, 0) {
				return "", false, fmt.Errorf("%s shows whole numbers, and the value is %g; write %%.3f or %%g", verb, x)
			}
			return fmt.Sprintf(verb, int64(x)), true, nil
		case "s", "v":
			return "", false, fmt.Errorf("the value is a number (%g); %s is for text: write %%.3f, %%e or %%g", x, verb)
		}
		return table.FixNegZero(fmt.Sprintf(verb, x)), true, nil
	case int:
		switch last {
		case "", "d":
			if verb == "" {
				verb = "%d"
			}
			return fmt.Sprintf(verb, x), true, nil
		case "s", "v":
			return "", false, fmt.Errorf("the value is a number (%d); %s is for text: write %%d", x, verb)
		}
		return fmt.Sprintf(verb, float64(x)), true, nil
	case string:
		if verb != "" && verb != "%s" && verb != "%v" {
			return "", false, fmt.Errorf("the value is text (%q); %s does not apply", x, verb)
		}
		return x, false, nil
	case bool:
		if x {
			return "yes", false, nil
		}
		return "no", false, nil
	case nil:
		return "n/a", false, nil
	}
	return "", false, fmt.Errorf("the value is a group (%s), not a single number; name one of its fields", describe(v))
}

func describe(v any) string {
	switch x := v.(type) {
	case map[string]any:
		return "fields " + strings.Join(Keys(x), ", ")
	case []map[string]any:
		return fmt.Sprintf("a list of %d entries", len(x))
	}
	return fmt.Sprintf("%T", v)
}
