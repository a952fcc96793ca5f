package manuscript

import (
	"regexp"
	"strings"

	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/parser"
	"github.com/yuin/goldmark/text"
)

// CiteNode is a citation in prose, written with natbib's commands:
// \citet{key} (Engle and Granger (1987)), \citep{key} ((Engle and
// Granger, 1987)), \citealt and \citealp (the same without
// parentheses), \citeauthor{key}, \citeyear{key} (the bare year, 1987)
// and \citeyearpar{key} ((1987)). Keys are separated by commas; one
// optional argument is a note after the citation ([p.~3]), two are a
// note before and one after ([see][ch.~2]).
type CiteNode struct {
	ast.BaseInline
	Cmd       string // citet, citep, citealt, citealp, citeauthor, citeyear, citeyearpar
	Keys      []string
	Pre, Post string // the notes, as written (TeX: ~ is a no-break space)
	Offset    int
	End       int
}

// KindCite is the AST kind of CiteNode.
var KindCite = ast.NewNodeKind("GalleyCite")

func (n *CiteNode) Kind() ast.NodeKind { return KindCite }
func (n *CiteNode) Dump(src []byte, level int) {
	ast.DumpHelper(n, src, level, map[string]string{"Cmd": n.Cmd, "Keys": strings.Join(n.Keys, ",")}, nil)
}

// CiteCommands are the natbib commands galley reads.
var CiteCommands = []string{"citet", "citep", "citealt", "citealp", "citeauthor", "citeyear", "citeyearpar"}

var citeRE = regexp.MustCompile(`^\\(citet|citep|citealt|citealp|citeauthor|citeyearpar|citeyear)\*?(\[[^\[\]]*\])?(\[[^\[\]]*\])?\{([^{}]*)\}`)

type citeParser struct{}

func (citeParser) Trigger() []byte { return []byte{'\\'} }

func (citeParser) Parse(parent ast.Node, block text.Reader, pc parser.Context) ast.Node {
	line, seg := block.PeekLine()
	m := citeRE.FindSubmatchIndex(line)
	if m == nil {
		return nil
	}
	n := &CiteNode{Cmd: string(line[m[2]:m[3]]), Offset: seg.Start, End: seg.Start + m[1]}
	var opts []string
	for _, g := range [][2]int{{m[4], m[5]}, {m[6], m[7]}} {
		if g[0] >= 0 {
			opts = append(opts, string(line[g[0]+1:g[1]-1]))
		}
	}
	switch len(opts) {
	case 1:
		n.Post = opts[0]
	case 2:
		n.Pre, n.Post = opts[0], opts[1]
	}
	for _, k := range strings.Split(string(line[m[8]:m[9]]), ",") {
		n.Keys = append(n.Keys, strings.TrimSpace(k))
	}
	block.Advance(m[1])
	return n
}

// CitePart is one work in a formatted citation: its key (for a link to
// the reference list) and its text.
type CitePart struct{ Key, Text string }

// FormatCite writes a citation the way natbib's author-year style does:
// \citet "Engle and Granger (1987)", \citep "(Engle and Granger, 1987)",
// \citealt "Engle and Granger 1987", \citealp "Engle and Granger, 1987",
// \citeauthor "Engle and Granger", \citeyear "1987", \citeyearpar
// "(1987)". Several works are separated by "; "; the notes go before the
// first and after the last work. Open and Close are the text around the
// parts (parentheses and notes).
func FormatCite(n *CiteNode, entries []*BibEntry) (open string, parts []CitePart, close string) {
	pre, post := noteText(n.Pre), noteText(n.Post)
	for i, e := range entries {
		a, y := e.AuthorText(), e.YearText()
		var t string
		switch n.Cmd {
		case "citet":
			t = a + " (" + y
			if i == len(entries)-1 && post != "" {
				t += ", " + post
			}
			t += ")"
		case "citealt":
			t = a + " " + y
		case "citep", "citealp":
			t = a + ", " + y
		case "citeauthor":
			t = a
		case "citeyear", "citeyearpar":
			t = y
		}
		parts = append(parts, CitePart{e.Key, t})
	}
	switch n.Cmd {
	case "citep", "citeyearpar":
		open, close = "(", ")"
	}
	if pre != "" && n.Cmd != "citet" {
		open += pre + " "
	}
	if post != "" && n.Cmd != "citet" {
		close = ", " + post + close
	}
	return open, parts, close
}

// CiteSeparator is the text between the works of one citation.
func CiteSeparator(cmd string) string {
	if cmd == "citeauthor" {
		return ", "
	}
	return "; "
}

func noteText(s string) string { return Detex(s) }

// RefSpan is a piece of a reference-list entry: text, set in italics or not.
type RefSpan struct {
	Text   string
	Italic bool
}

// Reference is a reference-list entry in galley's author-year style:
// Engle, R. F. and C. W. J. Granger (1987). Title. Journal 55(2), 251–276.
func (e *BibEntry) Reference() []RefSpan {
	var out []RefSpan
	add := func(t string, it bool) {
		if t != "" {
			out = append(out, RefSpan{t, it})
		}
	}
	var names []string
	for i, p := range e.Authors {
		first, last := Detex(p.First), p.Surname()
		jr := ""
		if p.Jr != "" {
			jr = ", " + Detex(p.Jr)
		}
		switch {
		case i == 0 && first != "":
			names = append(names, last+jr+", "+first)
		case first != "":
			names = append(names, first+" "+last+jr)
		default:
			names = append(names, last+jr)
		}
	}
	who := strings.Join(names, ", ")
	if len(names) == 2 {
		who = names[0] + " and " + names[1]
	} else if len(names) > 2 {
		who = strings.Join(names[:len(names)-1], ", ") + ", and " + names[len(names)-1]
	}
	if e.EtAl {
		who += " et al."
	}
	if e.Fields["author"] == "" {
		who += " (Ed.)"
		if len(names) > 1 {
			who = strings.TrimSuffix(who, " (Ed.)") + " (Eds.)"
		}
	}
	add(who+" ("+e.YearText()+"). ", false)
	title := e.Field("title")
	pages := e.Field("pages")
	switch e.Type {
	case "book":
		add(title, true)
		add(". ", false)
		add(join(", ", e.Field("address"), e.Field("publisher"))+".", false)
	case "incollection", "inproceedings", "conference", "inbook":
		add(title+". In ", false)
		if ed := e.Fields["editor"]; ed != "" && e.Fields["author"] != "" {
			eds, _ := ParseNames(ed)
			var en []string
			for _, p := range eds {
				en = append(en, strings.TrimSpace(Detex(p.First)+" "+p.Surname()))
			}
			s := " (Ed.), "
			if len(en) > 1 {
				s = " (Eds.), "
			}
			add(strings.Join(en, " and ")+s, false)
		}
		add(e.Field("booktitle"), true)
		if pages != "" {
			add(", pp. "+pages, false)
		}
		add(". "+join(", ", e.Field("address"), e.Field("publisher")), false)
		add(".", false)
	default: // article and the rest
		add(title+". ", false)
		if j := e.Field("journal"); j != "" {
			add(j, true)
			vol := e.Field("volume")
			if n := e.Field("number"); n != "" {
				vol += "(" + n + ")"
			}
			tail := join(", ", vol, pages)
			if tail != "" {
				add(" "+tail, false)
			}
			add(".", false)
		} else {
			add(join(", ", e.Field("type"), e.Field("number"), e.Field("institution"), e.Field("school"), e.Field("publisher"), e.Field("howpublished"), e.Field("note"))+".", false)
		}
	}
	if doi := e.Field("doi"); doi != "" {
		add(" doi:"+doi, false)
	}
	// tidy doubled full stops
	for i := range out {
		out[i].Text = strings.ReplaceAll(out[i].Text, "..", ".")
	}
	return out
}

func join(sep string, parts ...string) string {
	var keep []string
	for _, p := range parts {
		if p != "" {
			keep = append(keep, p)
		}
	}
	return strings.Join(keep, sep)
}

// ReferencesNode marks where the reference list goes: before the
// appendix, or at the end of the body. The engine places it; writers
// render the document's reference list there.
type ReferencesNode struct {
	ast.BaseBlock
}

// KindReferences is the AST kind of ReferencesNode.
var KindReferences = ast.NewNodeKind("GalleyReferences")

func (n *ReferencesNode) Kind() ast.NodeKind         { return KindReferences }
func (n *ReferencesNode) Dump(src []byte, level int) { ast.DumpHelper(n, src, level, nil, nil) }
