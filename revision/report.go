package revision

import (
	"fmt"
	"html"
	"strings"

	"github.com/galley-econ/galley/resultsfile"
)

// Summary is the terminal summary of a comparison. Its first lines are
// the spec changes and the conclusions a reader can see that flipped;
// then data files, samples, numbers that moved, changes among values the
// paper does not show, and the totals.
func (r *Report) Summary() string {
	var b strings.Builder
	for _, it := range r.Items {
		for _, s := range it.Specs {
			fmt.Fprintf(&b, "spec  %s: %s: %s -> %s\n", termName(it), s.What, s.Old, s.New)
		}
	}
	for _, it := range r.Items {
		for _, f := range it.Flips {
			fmt.Fprintf(&b, "FLIP  %s: %s: %s -> %s\n", termName(it), f.What, f.Old, f.New)
		}
	}
	for _, in := range r.InputsChanged {
		fmt.Fprintf(&b, "input %s: %s\n", in.Name(), in.Detail())
	}
	for _, it := range r.Items {
		for _, s := range it.Samples {
			fmt.Fprintf(&b, "sample %s: %s: %s -> %s\n", termName(it), s.What, s.Old, s.New)
		}
	}
	ranked := r.Ranked()
	for i, m := range ranked {
		if i == 10 {
			fmt.Fprintf(&b, "moved (%d more)\n", len(ranked)-10)
			break
		}
		fmt.Fprintf(&b, "moved %s: %s: %s -> %s (%s)\n", termName(*m.Item), m.What, m.Old, m.New, m.MoveText())
	}
	hidden, hiddenFlips := 0, 0
	var where []string
	for _, it := range r.Items {
		for _, h := range it.Hidden {
			hidden++
			if h.Flip {
				hiddenFlips++
			}
		}
		if len(it.Hidden) > 0 {
			where = append(where, it.ID)
		}
	}
	if hidden > 0 {
		fmt.Fprintf(&b, "not shown in the paper: %d changes (%d of them star or test changes) among values no table shows, in %s\n", hidden, hiddenFlips, strings.Join(where, ", "))
	}
	for _, it := range r.Items {
		for _, p := range it.Presence {
			fmt.Fprintf(&b, "value %s: %s: %s -> %s\n", termName(it), p.What, p.Old, p.New)
		}
	}
	if len(r.OnlyOld) > 0 {
		fmt.Fprintf(&b, "only in the old build: %s\n", strings.Join(r.OnlyOld, ", "))
	}
	if len(r.OnlyNew) > 0 {
		fmt.Fprintf(&b, "only in the new build: %s\n", strings.Join(r.OnlyNew, ", "))
	}
	if !r.SameManuscript {
		fmt.Fprintf(&b, "note: the files come from different manuscripts (%s and %s); comparing the ids they share\n", r.Old.Manuscript, r.New.Manuscript)
	}
	moved := 0
	for _, it := range r.Items {
		moved += len(it.Moved)
	}
	fmt.Fprintf(&b, "compared %s (galley %s) with %s (galley %s): %d results unchanged, %d changed; %d spec changes; %d numbers moved; %d conclusions flipped\n",
		r.Old.Path, r.Old.Galley, r.New.Path, r.New.Galley, r.Unchanged, len(r.Items), r.specChanges(), moved, r.Flips())
	return b.String()
}

func (r *Report) specChanges() int {
	n := 0
	for _, it := range r.Items {
		n += len(it.Specs)
	}
	return n
}

// termName is a result's id with its label, for the terminal.
func termName(it Item) string {
	if it.Short != "" && it.Short != it.ID+" ("+it.Kind+")" {
		return it.ID + " [" + it.Short + "]"
	}
	return it.ID
}

// Section is one part of a report: a title, a header and rows of cells.
type Section struct {
	Title string
	Head  []string
	Rows  [][]string
}

// Sections returns the report's introduction and its non-empty sections:
// specification changes, conclusions that changed, data that changed,
// samples that changed, numbers that moved (largest first, with their
// unit), and changes among values the paper does not show.
func (r *Report) Sections() (intro string, ss []Section) { return r.tables() }

// buildName names a build for a published report: its manuscript and
// data vintage, not a file path.
func buildName(f *resultsfile.File) string {
	name := f.Manuscript
	if f.Vintage != "" {
		name += ", data vintage " + f.Vintage
	}
	return name
}

func (r *Report) tables() (intro string, ts []Section) {
	intro = fmt.Sprintf("This report compares two builds: the earlier (%s) and the later (%s). %d results are unchanged and %d changed; %d specifications changed; %d conclusions a reader can see changed.",
		buildName(r.Old), buildName(r.New), r.Unchanged, len(r.Items), r.specChanges(), r.Flips())
	if !r.SameManuscript {
		intro += " The builds come from different manuscripts; only the results they share are compared."
	}
	specs := Section{Title: "Specification changes", Head: []string{"Result", "Setting", "Old", "New"}}
	flips := Section{Title: "Conclusions that changed", Head: []string{"Result", "What", "Old", "New"}}
	samples := Section{Title: "Samples that changed", Head: []string{"Result", "What", "Old", "New"}}
	moved := Section{Title: "Numbers that moved most", Head: []string{"Result", "Value", "Old", "New", "Move"}}
	hidden := Section{Title: "Changes among values no table shows", Head: []string{"Result", "Value", "Old", "New", "Move"}}
	for _, it := range r.Items {
		for _, s := range it.Specs {
			specs.Rows = append(specs.Rows, []string{it.Name, s.What, s.Old, s.New})
		}
		for _, f := range it.Flips {
			flips.Rows = append(flips.Rows, []string{it.Name, f.What, f.Old, f.New})
		}
		for _, s := range it.Samples {
			samples.Rows = append(samples.Rows, []string{it.Name, s.What, s.Old, s.New})
		}
		for _, h := range it.Hidden {
			hidden.Rows = append(hidden.Rows, []string{it.Name, h.What, h.Old, h.New, h.MoveText()})
		}
	}
	for _, m := range r.Ranked() {
		moved.Rows = append(moved.Rows, []string{m.Item.Name, m.What, m.Old, m.New, m.MoveText()})
	}
	inputs := Section{Title: "Data that changed", Head: []string{"Data", "Change"}}
	for _, in := range r.InputsChanged {
		inputs.Rows = append(inputs.Rows, []string{in.Name(), in.What()})
	}
	for _, t := range []Section{specs, flips, inputs, samples, moved, hidden} {
		if len(t.Rows) > 0 {
			ts = append(ts, t)
		}
	}
	return intro, ts
}

// MovedNote explains the Move column.
const MovedNote = "Move: an estimate's change in units of its earlier standard error (s.e.), a test statistic's change relative to its earlier 5% critical value (|5% c.v.|), otherwise the relative change (%); numbers with a scale of their own are ranked first, p-values aside."

// Markdown renders the report as CommonMark.
func (r *Report) Markdown() []byte {
	intro, ts := r.tables()
	esc := strings.NewReplacer("|", `\|`, "*", `\*`, "_", `\_`, "<", `\<`)
	var b strings.Builder
	b.WriteString("## Revision report\n")
	for k, t := range ts {
		if k == introAfter(ts) {
			b.WriteString("\n" + esc.Replace(intro) + "\n")
		}
		b.WriteString("\n### " + t.Title + "\n\n| " + strings.Join(t.Head, " | ") + " |\n|" + strings.Repeat("---|", len(t.Head)) + "\n")
		for _, row := range t.Rows {
			cells := make([]string, len(row))
			for i, c := range row {
				cells[i] = esc.Replace(c)
			}
			b.WriteString("| " + strings.Join(cells, " | ") + " |\n")
		}
		if t.Title == "Numbers that moved most" {
			b.WriteString("\n" + esc.Replace(MovedNote) + "\n")
		}
	}
	if introAfter(ts) == len(ts) {
		b.WriteString("\n" + esc.Replace(intro) + "\n")
	}
	return []byte(b.String())
}

// HTML renders the report as a self-contained HTML page.
func (r *Report) HTML() []byte {
	intro, ts := r.tables()
	var b strings.Builder
	b.WriteString(`<!DOCTYPE html><html lang="en"><head><meta charset="utf-8"><title>Revision report</title><style>
body{font-family:Georgia,"DejaVu Serif",serif;max-width:52rem;margin:2rem auto;padding:0 1rem;color:#1d1d1f}
table{border-collapse:collapse;margin:.6rem 0 1.4rem;font-size:.9rem}th,td{padding:.2rem .7rem;text-align:left}
thead th{border-top:1.5px solid #1d1d1f;border-bottom:1px solid #1d1d1f}tbody tr:last-child td{border-bottom:1.5px solid #1d1d1f}
</style></head><body><h2>Revision report</h2>` + "\n")
	for k, t := range ts {
		if k == introAfter(ts) {
			b.WriteString("<p>" + html.EscapeString(intro) + "</p>\n")
		}
		b.WriteString("<h3>" + html.EscapeString(t.Title) + "</h3><table><thead><tr>")
		for _, h := range t.Head {
			b.WriteString("<th>" + html.EscapeString(h) + "</th>")
		}
		b.WriteString("</tr></thead><tbody>")
		for _, row := range t.Rows {
			b.WriteString("<tr>")
			for _, c := range row {
				b.WriteString("<td>" + html.EscapeString(c) + "</td>")
			}
			b.WriteString("</tr>")
		}
		b.WriteString("</tbody></table>\n")
		if t.Title == "Numbers that moved most" {
			b.WriteString("<p>" + html.EscapeString(MovedNote) + "</p>\n")
		}
	}
	if introAfter(ts) == len(ts) {
		b.WriteString("<p>" + html.EscapeString(intro) + "</p>\n")
	}
	b.WriteString("</body></html>\n")
	return []byte(b.String())
}

// LaTeX renders the report as a fragment (booktabs) for an appendix.
func (r *Report) LaTeX() []byte {
	intro, ts := r.tables()
	esc := strings.NewReplacer(`\`, `\textbackslash{}`, "{", `\{`, "}", `\}`, "$", `\$`, "&", `\&`, "#", `\#`, "^", `\textasciicircum{}`,
		"_", `\_`, "~", `\textasciitilde{}`, "%", `\%`, "<", `\textless{}`, ">", `\textgreater{}`, "−", `\ensuremath{-}`, "–", "--")
	var b strings.Builder
	b.WriteString("% galley revision report: needs \\usepackage{booktabs}\n\\subsection*{Revision report}\n")
	for k, t := range ts {
		if k == introAfter(ts) {
			b.WriteString("\n" + esc.Replace(intro) + "\n")
		}
		b.WriteString("\n\\paragraph{" + esc.Replace(t.Title) + "}\n\\begin{tabular}{" + strings.Repeat("l", len(t.Head)) + "}\n\\toprule\n")
		hs := make([]string, len(t.Head))
		for i, h := range t.Head {
			hs[i] = esc.Replace(h)
		}
		b.WriteString(strings.Join(hs, " & ") + " \\\\\n\\midrule\n")
		for _, row := range t.Rows {
			cs := make([]string, len(row))
			for i, c := range row {
				cs[i] = esc.Replace(c)
			}
			b.WriteString(strings.Join(cs, " & ") + " \\\\\n")
		}
		b.WriteString("\\bottomrule\n\\end{tabular}\n")
		if t.Title == "Numbers that moved most" {
			b.WriteString("\n" + esc.Replace(MovedNote) + "\n")
		}
	}
	if introAfter(ts) == len(ts) {
		b.WriteString("\n" + esc.Replace(intro) + "\n")
	}
	return []byte(b.String())
}

// introAfter is the index of the first section that follows the
// introduction: the specification changes and the conclusions that
// changed come first.
func introAfter(ts []Section) int {
	k := 0
	for k < len(ts) && (ts[k].Title == "Specification changes" || ts[k].Title == "Conclusions that changed") {
		k++
	}
	return k
}
