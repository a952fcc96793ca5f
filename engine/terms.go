package engine

import (
	"fmt"
	"strings"

	"github.com/galley-econ/galley/engine/table"
	"github.com/galley-econ/galley/internal/termname"
)

// TermLabel is how a table shows a term: its name in galley's expression
// language typeset as a paper writes it. The difference diff(v) is Δv,
// the lag lag(E,k) is E with the subscript t−k, the lead lead(E,k) E with
// t+k; a column name written in backquotes (`cost #1`) is shown without
// them. So "lag(diff(log(north)),1)" is Δlog(north) with the subscript
// t−1, and "lag(ect,1)" is ect_{t−1}. sub is "" for an undated term.
func TermLabel(term string) (text, sub string) { return termLabel(term, nil) }

// termLabel is TermLabel with the author's display labels (the front
// matter's labels:), which name a series or expression wherever it stands
// alone or inside a difference, lag or lead.
func termLabel(term string, labels map[string]string) (text, sub string) {
	if l, ok := labels[term]; ok {
		return l, ""
	}
	if inner, k, ok := call(term, "lag"); ok {
		text, _ = termLabel(inner, labels)
		return text, "t−" + k
	}
	if inner, k, ok := call(term, "lead"); ok {
		text, _ = termLabel(inner, labels)
		return text, "t+" + k
	}
	if inner, ok := strings.CutPrefix(term, "diff("); ok && strings.HasSuffix(inner, ")") && termname.Balanced(inner[:len(inner)-1]) {
		text, sub = termLabel(inner[:len(inner)-1], labels)
		return "Δ" + text, sub
	}
	return strings.ReplaceAll(term, "`", ""), ""
}

// TermCell is a stub cell for a term (TermLabel).
func TermCell(term string) table.Cell { return table.Label(TermLabel(term)) }

// TermText is TermLabel as plain text, the subscript in Unicode
// subscript characters (Δlog(north)ₜ₋₁), for notes and reports.
func TermText(term string) string { return TermCell(term).Plain() }

// TermCell is a stub or header cell for a term, with the document's
// display labels.
func (c *Context) TermCell(term string) table.Cell {
	return table.Label(termLabel(term, c.doc.Meta.Labels))
}

// TermText is Context.TermCell as plain text, for notes.
func (c *Context) TermText(term string) string { return c.TermCell(term).Plain() }

// call splits name(inner,k) with k a whole number (lag(inner) is lag 1);
// spaces around the comma are allowed.
func call(term, name string) (inner, k string, ok bool) {
	body, ok := strings.CutPrefix(term, name+"(")
	if !ok || !strings.HasSuffix(body, ")") {
		return "", "", false
	}
	body = body[:len(body)-1]
	i := strings.LastIndexByte(body, ',')
	if i < 0 || !termname.Balanced(body[:i]) {
		if termname.Balanced(body) && name == "lag" { // lag(x) is lag(x, 1)
			return strings.TrimSpace(body), "1", true
		}
		return "", "", false
	}
	k = strings.TrimSpace(body[i+1:])
	if k == "" || strings.Trim(k, "0123456789") != "" {
		return "", "", false
	}
	return strings.TrimSpace(body[:i]), k, true
}

// TermHint is a suggestion for a term written in the suffix notation
// galley used before ("ect(-1)", "d.x(-2)"): its name now, or "".
func TermHint(term string) string {
	if now, ok := termname.FromSuffix(term); ok {
		return fmt.Sprintf(" (%s is now written %s: term names are in galley's expression language)", term, now)
	}
	return ""
}
