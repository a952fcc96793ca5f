package manuscript

import (
	"bytes"
	"fmt"
	"regexp"
	"strings"

	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/parser"
	"github.com/yuin/goldmark/text"
	"github.com/yuin/goldmark/util"
)

// MathBlock is a display equation written as a paragraph of its own
// between $$ lines (or on one line, $$ … $$). It is numbered unless its
// TeX says \nonumber or \notag; \label{id} gives it an id that prose
// refers to with {{id.label}}. TeX is the math with the label and the
// numbering switch taken out.
type MathBlock struct {
	ast.BaseBlock
	TeX      string
	ID       string
	Numbered bool
	Offset   int  // body offset of the opening $$
	End      int  // body offset just past the closing $$ line
	Closed   bool // false when the closing $$ never came
	LabelErr string
}

// KindMathBlock is the AST kind of MathBlock.
var KindMathBlock = ast.NewNodeKind("GalleyMathBlock")

func (n *MathBlock) Kind() ast.NodeKind { return KindMathBlock }
func (n *MathBlock) IsRaw() bool        { return true }
func (n *MathBlock) Dump(src []byte, level int) {
	ast.DumpHelper(n, src, level, map[string]string{"TeX": n.TeX, "ID": n.ID}, nil)
}

type mathBlockParser struct{}

func (mathBlockParser) Trigger() []byte { return []byte{'$'} }

func (mathBlockParser) Open(parent ast.Node, reader text.Reader, pc parser.Context) (ast.Node, parser.State) {
	line, seg := reader.PeekLine()
	pos := pc.BlockOffset()
	if pos < 0 || pos+2 > len(line) || line[pos] != '$' || line[pos+1] != '$' {
		return nil, parser.NoChildren
	}
	n := &MathBlock{Offset: seg.Start + pos}
	rest := bytes.TrimRight(line[pos+2:], " \t\r\n")
	if bytes.HasSuffix(rest, []byte("$$")) && len(rest) >= 2 {
		// one line: $$ … $$ (nothing may follow the closing $$)
		inner := rest[:len(rest)-2]
		n.Lines().Append(text.NewSegment(seg.Start+pos+2, seg.Start+pos+2+len(inner)))
		n.Closed = true
		n.End = seg.Start + len(line)
		reader.Advance(len(line) - 1)
		return n, parser.NoChildren
	}
	if len(bytes.TrimSpace(rest)) > 0 && bytes.Contains(rest, []byte("$$")) {
		return nil, parser.NoChildren // $$…$$ followed by prose: inline display math
	}
	if len(bytes.TrimSpace(rest)) > 0 {
		n.Lines().Append(text.NewSegment(seg.Start+pos+2, seg.Start+pos+2+len(rest)))
	}
	reader.Advance(len(line) - 1)
	return n, parser.NoChildren
}

func (mathBlockParser) Continue(node ast.Node, reader text.Reader, pc parser.Context) parser.State {
	n := node.(*MathBlock)
	if n.Closed { // a one-line equation closed on its opening line
		return parser.Close
	}
	line, seg := reader.PeekLine()
	trimmed := bytes.TrimRight(line, " \t\r\n")
	if bytes.HasSuffix(trimmed, []byte("$$")) {
		inner := trimmed[:len(trimmed)-2]
		if len(bytes.TrimSpace(inner)) > 0 {
			n.Lines().Append(text.NewSegment(seg.Start, seg.Start+len(inner)))
		}
		n.Closed = true
		n.End = seg.Start + len(line)
		reader.Advance(len(line) - 1)
		return parser.Close
	}
	n.Lines().Append(seg)
	reader.Advance(len(line) - 1)
	return parser.Continue | parser.NoChildren
}

func (mathBlockParser) Close(node ast.Node, reader text.Reader, pc parser.Context) {
	n := node.(*MathBlock)
	var b strings.Builder
	for i := 0; i < n.Lines().Len(); i++ {
		s := n.Lines().At(i)
		b.Write(s.Value(reader.Source()))
	}
	n.TeX, n.ID, n.Numbered, n.LabelErr = splitLabel(strings.TrimSpace(b.String()))
}

func (mathBlockParser) CanInterruptParagraph() bool { return true }
func (mathBlockParser) CanAcceptIndentedLine() bool { return false }

var (
	labelRE    = regexp.MustCompile(`\\label\s*\{([^{}]*)\}`)
	noNumberRE = regexp.MustCompile(`\\(nonumber|notag)\b`)
)

// splitLabel takes \label{id} and \nonumber out of display TeX.
func splitLabel(tex string) (rest, id string, numbered bool, problem string) {
	labels := labelRE.FindAllStringSubmatch(tex, -1)
	switch {
	case len(labels) > 1:
		problem = "an equation takes one \\label{id}"
	case len(labels) == 1:
		id = strings.TrimSpace(labels[0][1])
	}
	rest = strings.TrimSpace(labelRE.ReplaceAllString(tex, ""))
	numbered = !noNumberRE.MatchString(rest)
	rest = strings.TrimSpace(noNumberRE.ReplaceAllString(rest, ""))
	if !numbered && id != "" && problem == "" {
		problem = "an equation with \\nonumber has no number to refer to; drop the \\label or the \\nonumber"
	}
	return rest, id, numbered, problem
}

// TeX that math may not contain, because it reaches pdflatex verbatim:
// file and shell access, category and control-sequence tricks, and
// definitions that could change what later text means.
var forbiddenTeX = []string{
	"input", "include", "includeonly", "InputIfFileExists", "IfFileExists", "openin", "openout",
	"read", "readline", "write", "immediate", "closein", "closeout", "newread", "newwrite",
	"catcode", "lccode", "uccode", "csname", "endcsname", "expandafter", "string", "scantokens",
	"def", "edef", "gdef", "xdef", "let", "futurelet", "newcommand", "renewcommand", "providecommand",
	"DeclareRobustCommand", "newenvironment", "renewenvironment", "usepackage", "RequirePackage",
	"documentclass", "special", "pdfobj", "pdfliteral", "pdfximage", "directlua", "ShellEscape",
	"makeatletter", "makeatother", "endinput", "jobname", "output", "everypar", "everymath",
	"everydisplay", "tag", "label", "ref", "eqref",
}

var texCommandRE = regexp.MustCompile(`\\([A-Za-z@]+)`)

// CheckTeX refuses math that would reach outside the formula when
// pdflatex reads it: a forbidden command (file or shell access, a
// definition, a category code), TeX's ^^ character escape, a control
// character, or unbalanced braces.
func CheckTeX(tex string) error {
	if strings.Contains(tex, "^^") {
		return fmt.Errorf("math may not contain ^^ (TeX's character-code escape)")
	}
	for _, r := range tex {
		if r < 0x20 && r != '\n' && r != '\t' || r == 0x7f {
			return fmt.Errorf("math contains the control character U+%04X", r)
		}
	}
	for _, m := range texCommandRE.FindAllStringSubmatch(tex, -1) {
		for _, f := range forbiddenTeX {
			if m[1] == f {
				if f == "tag" || f == "label" || f == "ref" || f == "eqref" {
					return fmt.Errorf("\\%s is not used in galley's math: equations are numbered by galley; give a display equation its id with \\label{id} and refer to it in prose with {{id.label}}", f)
				}
				return fmt.Errorf("\\%s is not allowed in math (it could read or write files, run commands or redefine TeX); write the formula only", f)
			}
		}
		if strings.Contains(m[1], "@") {
			return fmt.Errorf("\\%s: internal commands (with @) are not allowed in math", m[1])
		}
	}
	depth := 0
	for i := 0; i < len(tex); i++ {
		switch tex[i] {
		case '\\':
			i++
		case '{':
			depth++
		case '}':
			depth--
			if depth < 0 {
				return fmt.Errorf("math has a } without its {")
			}
		}
	}
	if depth != 0 {
		return fmt.Errorf("math has a { without its }")
	}
	return nil
}

// CheckDisplayTeX is CheckTeX for display math, where \label{id} is how
// an equation gets its id (it is taken out before this check).
func CheckDisplayTeX(tex string) error { return CheckTeX(tex) }

var mathBlockPriority = util.Prioritized(mathBlockParser{}, 90)
