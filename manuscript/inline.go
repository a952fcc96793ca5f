package manuscript

import (
	"bytes"

	"github.com/yuin/goldmark"
	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/extension"
	"github.com/yuin/goldmark/parser"
	"github.com/yuin/goldmark/text"
	"github.com/yuin/goldmark/util"
)

// RefNode is an inline value reference {{id.field [%verb]}} in prose.
type RefNode struct {
	ast.BaseInline
	Ref    string // text between the braces, trimmed
	Offset int    // byte offset of "{{" in the body
	End    int    // byte offset just past "}}"
}

// KindRef is the AST kind of RefNode.
var KindRef = ast.NewNodeKind("GalleyRef")

func (n *RefNode) Kind() ast.NodeKind { return KindRef }
func (n *RefNode) Dump(src []byte, level int) {
	ast.DumpHelper(n, src, level, map[string]string{"Ref": n.Ref}, nil)
}

// MathNode is TeX math in prose: $…$ (inline) or $$…$$ (display).
type MathNode struct {
	ast.BaseInline
	TeX     string
	Display bool
	Offset  int // byte offset of the opening $ in the body
}

// KindMath is the AST kind of MathNode.
var KindMath = ast.NewNodeKind("GalleyMath")

func (n *MathNode) Kind() ast.NodeKind { return KindMath }
func (n *MathNode) Dump(src []byte, level int) {
	ast.DumpHelper(n, src, level, map[string]string{"TeX": n.TeX}, nil)
}

type refParser struct{}

func (refParser) Trigger() []byte { return []byte{'{'} }

func (refParser) Parse(parent ast.Node, block text.Reader, pc parser.Context) ast.Node {
	line, seg := block.PeekLine()
	if !bytes.HasPrefix(line, []byte("{{")) {
		return nil
	}
	end := bytes.Index(line[2:], []byte("}}"))
	if end < 0 {
		return nil
	}
	inner := bytes.TrimSpace(line[2 : 2+end])
	if len(inner) == 0 {
		return nil
	}
	n := &RefNode{Ref: string(inner), Offset: seg.Start, End: seg.Start + end + 4}
	block.Advance(end + 4)
	return n
}

type mathParser struct{}

func (mathParser) Trigger() []byte { return []byte{'$'} }

// Parse follows the usual heuristic so that prices in prose stay text:
// the opening $ is followed by a non-space, the closing $ is preceded by
// a non-space and not followed by a digit.
func (mathParser) Parse(parent ast.Node, block text.Reader, pc parser.Context) ast.Node {
	line, seg := block.PeekLine()
	if len(line) < 2 {
		return nil
	}
	if line[1] == '$' { // display math $$…$$ on one line
		end := bytes.Index(line[2:], []byte("$$"))
		if end <= 0 {
			return nil
		}
		block.Advance(end + 4)
		return &MathNode{TeX: string(bytes.TrimSpace(line[2 : 2+end])), Display: true, Offset: seg.Start}
	}
	if line[1] == ' ' || line[1] == '\t' {
		return nil
	}
	for i := 1; i < len(line); i++ {
		switch line[i] {
		case '\\':
			i++
		case '$':
			if line[i-1] == ' ' || line[i-1] == '\t' {
				return nil
			}
			if i+1 < len(line) && line[i+1] >= '0' && line[i+1] <= '9' {
				return nil
			}
			block.Advance(i + 1)
			return &MathNode{TeX: string(line[1:i]), Offset: seg.Start}
		}
	}
	return nil
}

// NewMarkdown is the goldmark instance every writer parses with:
// CommonMark plus pipe tables, strikethrough, footnotes, heading
// attributes ({#id}), and galley's nodes: display equations, inline
// values, math and citations.
func NewMarkdown() goldmark.Markdown {
	return goldmark.New(
		goldmark.WithExtensions(extension.Table, extension.Strikethrough, extension.Footnote),
		goldmark.WithParserOptions(
			parser.WithAttribute(),
			parser.WithBlockParsers(mathBlockPriority),
			parser.WithInlineParsers(
				util.Prioritized(refParser{}, 150),
				util.Prioritized(mathParser{}, 150),
				util.Prioritized(citeParser{}, 150),
			),
		),
	)
}
