package grid

import (
	"fmt"
	"slices"
	"strings"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
)

// note explains the table in one paragraph: what each cell is and shows,
// what varies, what is common to every cell (the sentences of the kind's
// own notes that every cell shares), cell-specific warnings, and stars.
func (s *gridSpec) note(c *engine.Context, sh gridShow, shown []gridShown, results []*engine.Result) string {
	var b strings.Builder
	where := "its row and column"
	if len(s.over) == 1 {
		where = "its row"
	}
	fmt.Fprintf(&b, "Each cell is a separate %s directive with the settings of %s.", s.kind.Name, where)
	b.WriteString(sh.shownNote(shown))
	b.WriteString(s.varyingNote())
	per := cellSentences(results, c.StarNote())
	common := commonSentences(per)
	b.WriteString(s.settingsNote(results, common))
	if len(common) > 0 {
		b.WriteString(" In every cell: " + strings.Join(common, " "))
	}
	b.WriteString(s.warningsNote(per, common))
	b.WriteString(sh.starsNote(c, shown))
	return b.String()
}

// shownNote returns the sentences that say what each cell shows, and what
// a blank cell means; each begins with a space.
func (sh gridShow) shownNote(shown []gridShown) string {
	var b strings.Builder
	switch {
	case sh.test:
		name := "the test statistic"
		if len(shown) > 0 && shown[0].testRef != "" {
			name = "the " + shown[0].testRef + " statistic"
		}
		fmt.Fprintf(&b, " Shown: %s.", name)
	case sh.coef && sh.field == "":
		fmt.Fprintf(&b, " Shown: the coefficient on %s, with its standard error in parentheses below.", engine.TermText(sh.term))
	case sh.coef:
		fmt.Fprintf(&b, " Shown: the %s of the coefficient on %s.", map[string]string{"est": "estimate", "se": "standard error", "t": "t-ratio", "p": "p-value"}[sh.field], engine.TermText(sh.term))
	default:
		fmt.Fprintf(&b, " Shown: the %s (%s).", showWords(sh.parts), sh.path)
	}
	if slices.ContainsFunc(shown, func(v gridShown) bool { return v.missing }) {
		fmt.Fprintf(&b, " A blank cell: that regression has no term %s.", engine.TermText(sh.term))
	}
	return b.String()
}

// varyingNote returns the sentence that lists the varied keys and their
// values, by row and by column, beginning with a space.
func (s *gridSpec) varyingNote() string {
	axis := func(a gridAxis) string {
		l := make([]string, len(a.labels))
		for i := range l {
			l[i] = a.label(i)
		}
		return keyPhrase(a.key.Value) + " (" + strings.Join(l, "; ") + ")"
	}
	if len(s.over) == 1 {
		return fmt.Sprintf(" Varying by row: %s.", axis(s.over[0]))
	}
	var rowAxes []string
	for _, a := range s.over[:len(s.over)-1] {
		rowAxes = append(rowAxes, axis(a))
	}
	return fmt.Sprintf(" Varying by row: %s; by column: %s.", strings.Join(rowAxes, " and "), axis(s.over[len(s.over)-1]))
}

// settingsNote returns the sentence that names the deterministic terms
// (when no axis varies them) and T, the observations of each cell's
// regression (the results' det and nobs), beginning with a space; "" when
// the cells report neither. A fact the cells' common sentences already
// state in the same words is not repeated.
func (s *gridSpec) settingsNote(results []*engine.Result, common []string) string {
	var parts []string
	if !s.varies("det") {
		var dets []string
		for _, r := range results {
			d, _ := r.Values["det"].(string)
			if w, ok := detWords(d); ok {
				d = w
			}
			dets = append(dets, d)
		}
		if d := dets[0]; d != "" && allSame(dets) {
			parts = append(parts, "deterministic terms: "+d)
		}
	}
	var ts []int
	for _, r := range results {
		if t, ok := toFloat(r.Values["nobs"]); ok && isInt(r.Values["nobs"]) {
			ts = append(ts, int(t))
		}
	}
	if len(ts) == len(results) && len(ts) > 0 {
		lo, hi := slices.Min(ts), slices.Max(ts)
		said := slices.ContainsFunc(common, func(c string) bool { return statesCount(c, "N", lo) || statesCount(c, "T", lo) })
		switch {
		case lo == hi && said: // the common sample sentence gives it already
		case lo == hi:
			parts = append(parts, fmt.Sprintf("T = %d", lo))
		default:
			parts = append(parts, fmt.Sprintf("T = %d to %d (each cell's own)", lo, hi))
		}
	}
	if len(parts) == 0 {
		return ""
	}
	sen := strings.ToUpper(parts[0][:1]) + parts[0][1:]
	if len(parts) > 1 {
		sen += "; " + parts[1]
	}
	sen += "."
	for _, c := range common {
		if c == sen {
			return ""
		}
	}
	return " " + sen
}

// statesCount says whether sentence s gives "name = n" (n not followed by
// another digit).
func statesCount(s, name string, n int) bool {
	w := fmt.Sprintf("%s = %d", name, n)
	for {
		i := strings.Index(s, w)
		if i < 0 {
			return false
		}
		s = s[i+len(w):]
		if s == "" || s[0] < '0' || s[0] > '9' {
			return true
		}
	}
}

// varies says whether key is one of the grid's varied keys.
func (s *gridSpec) varies(key string) bool {
	return slices.ContainsFunc(s.over, func(a gridAxis) bool { return a.key.Value == key })
}

// allSame says whether every string of a non-empty list is the first.
func allSame(v []string) bool {
	for _, x := range v[1:] {
		if x != v[0] {
			return false
		}
	}
	return true
}

// cellSentences returns, for each cell's result, the sentences of its
// table's or figure's notes, without the document's star note or a
// kind's own star legend.
func cellSentences(results []*engine.Result, starNote string) [][]string {
	per := make([][]string, len(results))
	for i, r := range results {
		var notes []string
		switch {
		case r.Table != nil:
			notes = r.Table.Notes
		case r.Figure != nil:
			notes = r.Figure.Notes
		}
		for _, n := range notes {
			for _, sen := range sentences(n) {
				// The grid says what its stars mean itself (starsNote):
				// the document's star note and a kind's own star legend
				// ("*, **, ***: …") are left out.
				if sen != starNote && !strings.HasPrefix(sen, "*") {
					per[i] = append(per[i], sen)
				}
			}
		}
	}
	return per
}

// commonSentences returns the sentences every cell has, once each, in the
// first cell's order.
func commonSentences(per [][]string) []string {
	var common []string
	for _, sen := range per[0] {
		if slices.Contains(common, sen) {
			continue
		}
		all := true
		for _, p := range per[1:] {
			all = all && slices.Contains(p, sen)
		}
		if all {
			common = append(common, sen)
		}
	}
	return common
}

// warningsNote returns the warnings that only some cells have, each after
// the cell's id and settings and a space.
func (s *gridSpec) warningsNote(per [][]string, common []string) string {
	var b strings.Builder
	for i, p := range per {
		for _, sen := range p {
			if strings.HasPrefix(sen, "Warning:") && !slices.Contains(common, sen) {
				fmt.Fprintf(&b, " Cell %s (%s): %s", s.cells[i].id, s.cells[i].label, sen)
			}
		}
	}
	return b.String()
}

// starsNote returns the sentence that says what the stars mean (a test's
// own rule, or the document's star note), beginning with a space, or ""
// when the table can carry no stars.
func (sh gridShow) starsNote(c *engine.Context, shown []gridShown) string {
	byTest := slices.ContainsFunc(shown, func(v gridShown) bool { return v.byTest })
	if !slices.ContainsFunc(shown, func(v gridShown) bool { return v.stars > 0 }) && !byTest && !(sh.coef && sh.field == "") {
		return ""
	}
	if sh.test || byTest {
		var lv []string
		for i, l := range c.Stars() {
			lv = append(lv, contract.Pct(l)+" ("+strings.Repeat("*", i+1)+")")
		}
		return fmt.Sprintf(" Stars: the test rejects its null at %s, by the critical values where tabulated, else by the p-value.", strings.Join(lv, ", "))
	}
	return " " + c.StarNote()
}

// sentences splits a note at sentence ends (". " followed by more text).
func sentences(s string) []string {
	var out []string
	for {
		i := strings.Index(s, ". ")
		if i < 0 {
			if t := strings.TrimSpace(s); t != "" {
				out = append(out, t)
			}
			return out
		}
		out = append(out, strings.TrimSpace(s[:i+1]))
		s = s[i+2:]
	}
}
