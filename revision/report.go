package revision

import (
	"fmt"
	"html"
	"strings"
)

// Summary is the terminal summary of a comparison.
func (r *Report) Summary() string {
	var b strings.Builder
	fmt.Fprintf(&b, "comparing %s (galley %s) with %s (galley %s)\n", r.Old.Path, r.Old.Galley, r.New.Path, r.New.Galley)
	if !r.SameManuscript {
		fmt.Fprintf(&b, "note: the files come from different manuscripts (%s and %s); comparing the ids they share\n", r.Old.Manuscript, r.New.Manuscript)
	}
	for _, in := range r.InputsChanged {
		switch {
		case in.Old == "":
			fmt.Fprintf(&b, "input %s: new\n", in.Path)
		case in.New == "":
			fmt.Fprintf(&b, "input %s: no longer read\n", in.Path)
		default:
			fmt.Fprintf(&b, "input %s: changed\n", in.Path)
		}
	}
	moved := 0
	for _, it := range r.Items {
		moved += len(it.Moved)
	}
	fmt.Fprintf(&b, "%d results unchanged, %d changed; %d numbers moved; %d conclusions flipped\n", r.Unchanged, len(r.Items), moved, r.Flips())
	for _, it := range r.Items {
		for _, f := range it.Flips {
			fmt.Fprintf(&b, "FLIP  %s: %s: %s -> %s\n", it.ID, f.What, f.Old, f.New)
		}
	}
	for _, it := range r.Items {
		for _, s := range it.Samples {
			fmt.Fprintf(&b, "sample %s: %s: %s -> %s\n", it.ID, s.What, s.Old, s.New)
		}
	}
	for _, it := range r.Items {
		if len(it.Moved) > 0 {
			fmt.Fprintf(&b, "moved %s: %d values (largest: %s)\n", it.ID, len(it.Moved), largest(it.Moved))
		}
	}
	if len(r.OnlyOld) > 0 {
		fmt.Fprintf(&b, "only in the old build: %s\n", strings.Join(r.OnlyOld, ", "))
	}
	if len(r.OnlyNew) > 0 {
		fmt.Fprintf(&b, "only in the new build: %s\n", strings.Join(r.OnlyNew, ", "))
	}
	return b.String()
}

func largest(ch []Change) string {
	best := ch[0]
	for _, c := range ch[1:] {
		if abs(c.Rel) > abs(best.Rel) {
			best = c
		}
	}
	return fmt.Sprintf("%s %s -> %s", best.What, best.Old, best.New)
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

// Section is one part of a report: a title, a header and rows of cells.
type Section struct {
	Title string
	Head  []string
	Rows  [][]string
}

// Sections returns the report's introduction and its non-empty sections:
// data files that changed, conclusions that changed, samples that
// changed, and numbers that moved.
func (r *Report) Sections() (intro string, ss []Section) { return r.tables() }

func (r *Report) tables() (intro string, ts []Section) {
	intro = fmt.Sprintf("This report compares the results of two builds: %s (old) and %s (new). %d results are unchanged and %d changed; %d conclusions changed.",
		r.Old.Path, r.New.Path, r.Unchanged, len(r.Items), r.Flips())
	if !r.SameManuscript {
		intro += fmt.Sprintf(" The builds come from different manuscripts (%s, %s); only the ids they share are compared.", r.Old.Manuscript, r.New.Manuscript)
	}
	flips := Section{Title: "Conclusions that changed", Head: []string{"Result", "What", "Old", "New"}}
	samples := Section{Title: "Samples that changed", Head: []string{"Result", "What", "Old", "New"}}
	moved := Section{Title: "Numbers that moved", Head: []string{"Result", "Value", "Old", "New", "Change"}}
	for _, it := range r.Items {
		for _, f := range it.Flips {
			flips.Rows = append(flips.Rows, []string{it.ID, f.What, f.Old, f.New})
		}
		for _, s := range it.Samples {
			samples.Rows = append(samples.Rows, []string{it.ID, s.What, s.Old, s.New})
		}
		for _, m := range it.Moved {
			moved.Rows = append(moved.Rows, []string{it.ID, m.What, m.Old, m.New, fmt.Sprintf("%+.2f%%", 100*m.Rel)})
		}
	}
	inputs := Section{Title: "Data files that changed", Head: []string{"File", "Change"}}
	for _, in := range r.InputsChanged {
		what := "content changed"
		if in.Old == "" {
			what = "new"
		} else if in.New == "" {
			what = "no longer read"
		}
		inputs.Rows = append(inputs.Rows, []string{in.Path, what})
	}
	for _, t := range []Section{inputs, flips, samples, moved} {
		if len(t.Rows) > 0 {
			ts = append(ts, t)
		}
	}
	return intro, ts
}

// Markdown renders the report as CommonMark.
func (r *Report) Markdown() []byte {
	intro, ts := r.tables()
	esc := strings.NewReplacer("|", `\|`, "*", `\*`, "_", `\_`, "<", `\<`)
	var b strings.Builder
	b.WriteString("## Revision report\n\n" + esc.Replace(intro) + "\n")
	for _, t := range ts {
		b.WriteString("\n### " + t.Title + "\n\n| " + strings.Join(t.Head, " | ") + " |\n|" + strings.Repeat("---|", len(t.Head)) + "\n")
		for _, row := range t.Rows {
			cells := make([]string, len(row))
			for i, c := range row {
				cells[i] = esc.Replace(c)
			}
			b.WriteString("| " + strings.Join(cells, " | ") + " |\n")
		}
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
</style></head><body><h2>Revision report</h2><p>` + html.EscapeString(intro) + "</p>\n")
	for _, t := range ts {
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
	b.WriteString("% galley revision report: needs \\usepackage{booktabs}\n\\subsection*{Revision report}\n" + esc.Replace(intro) + "\n")
	for _, t := range ts {
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
	}
	return []byte(b.String())
}
