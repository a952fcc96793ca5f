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
