package manuscript

import (
	"bytes"
	"regexp"
	"strconv"
	"strings"

	"github.com/yuin/goldmark/ast"
)

// Section is one heading of the manuscript with galley's number for it.
type Section struct {
	Node     *ast.Heading
	Level    int    // 1 for the document's top heading level, 2 below it, …
	Number   string // "3", "3.1", "A", "A.2"; "" for a heading too deep to number
	ID       string // from {#id}, or ""
	Appendix bool
	Title    string // the heading's text without the author's own number
	Offset   int    // body offset of the heading's text
	// TextStart and TextEnd bound the heading's text in the body (after
	// the # marks, before any {#id}); Skip is the length of the author's
	// own number at its start, which galley drops ("1. ", "Appendix A: ").
	TextStart, TextEnd, Skip int
}

// Outline is the structure galley numbers: sections, the start of the
// appendix, and display equations.
type Outline struct {
	Sections []*Section
	// AppendixAt is the body offset where the appendix starts (-1: none);
	// AppendixMarker is the \appendix paragraph that started it, if any
	// (writers leave it out).
	AppendixAt     int
	AppendixMarker ast.Node
	// MarkerEnd is the body offset just past the marker's line.
	MarkerEnd int
	Equations []*MathBlock
}

// MaxNumberedLevel is the deepest heading level galley numbers
// (section, subsection, subsubsection), as LaTeX's article does.
const MaxNumberedLevel = 3

// leadingNumber matches a number the author put at the start of a
// heading: "1 ", "2.3. ", "A. ", "A.1 ", "Appendix A: ", "Appendix B. ".
var leadingNumber = regexp.MustCompile(`^(?:(?:Appendix|Annex)\s+[A-Z](?:\.\d+)*\s*[.:)–—-]?\s+|\d+(?:\.\d+)*[.:)]?\s+|[A-Z](?:\.\d+)+[.:)]?\s+|[A-Z][.:)]\s+)`)

var appendixTitle = regexp.MustCompile(`^(?:Appendix|Appendices|Annex)\b`)

// BuildOutline numbers the headings of a parsed body: sections at the
// top level 1, 2, …, subsections 1.1, …; after the appendix marker (a
// paragraph that is only \appendix, or else the first top-level heading
// whose title starts with "Appendix") A, B, … and A.1, ….
func BuildOutline(root ast.Node, body []byte) *Outline {
	o := &Outline{AppendixAt: -1}
	top := 6
	for n := root.FirstChild(); n != nil; n = n.NextSibling() {
		if h, ok := n.(*ast.Heading); ok && h.Level < top {
			top = h.Level
		}
	}
	counters := make([]int, MaxNumberedLevel+1)
	appendix := false
	for n := root.FirstChild(); n != nil; n = n.NextSibling() {
		if p, ok := n.(*ast.Paragraph); ok && !appendix && isAppendixMarker(p, body) {
			appendix = true
			o.AppendixAt = p.Lines().At(0).Start
			o.AppendixMarker = p
			o.MarkerEnd = p.Lines().At(0).Stop
			counters = make([]int, MaxNumberedLevel+1)
			continue
		}
		h, ok := n.(*ast.Heading)
		if !ok {
			continue
		}
		s := &Section{Node: h, Level: h.Level - top + 1}
		if h.Lines().Len() > 0 {
			seg := h.Lines().At(0)
			s.Offset, s.TextStart, s.TextEnd = seg.Start, seg.Start, seg.Stop
			raw := body[seg.Start:seg.Stop]
			if i := bytes.Index(raw, []byte("{#")); i >= 0 && bytes.HasSuffix(bytes.TrimSpace(raw), []byte("}")) {
				s.TextEnd = seg.Start + i
			}
			s.Title = strings.TrimSpace(string(body[s.TextStart:s.TextEnd]))
		}
		if id, ok := h.AttributeString("id"); ok {
			if b, ok := id.([]byte); ok {
				s.ID = string(b)
			}
		}
		if !appendix && s.Level == 1 && appendixTitle.MatchString(s.Title) {
			appendix = true
			o.AppendixAt = s.Offset
			counters = make([]int, MaxNumberedLevel+1)
		}
		s.Appendix = appendix
		if m := leadingNumber.FindString(s.Title); m != "" && (appendix || !strings.HasPrefix(m, "Appendix") && !strings.HasPrefix(m, "Annex")) && len(m) < len(s.Title) {
			s.Skip = len(m)
			s.Title = s.Title[len(m):]
			dropPrefix(h, s.TextStart+leadingSpace(body[s.TextStart:s.TextEnd]), len(m))
		}
		if s.Level >= 1 && s.Level <= MaxNumberedLevel {
			counters[s.Level]++
			for l := s.Level + 1; l <= MaxNumberedLevel; l++ {
				counters[l] = 0
			}
			parts := make([]string, 0, s.Level)
			for l := 1; l <= s.Level; l++ {
				if l == 1 && appendix {
					parts = append(parts, letters(counters[1]))
				} else {
					parts = append(parts, strconv.Itoa(counters[l]))
				}
			}
			s.Number = strings.Join(parts, ".")
		}
		o.Sections = append(o.Sections, s)
	}
	if o.AppendixMarker != nil {
		// the marker is not text: writers see only where the appendix starts
		root.RemoveChild(root, o.AppendixMarker)
	}
	_ = ast.Walk(root, func(n ast.Node, entering bool) (ast.WalkStatus, error) {
		if m, ok := n.(*MathBlock); ok && entering {
			o.Equations = append(o.Equations, m)
		}
		return ast.WalkContinue, nil
	})
	return o
}

// AppendixSection is the number of the top-level appendix section that
// holds body offset off ("A", "B"), or "" outside the appendix.
func (o *Outline) AppendixSection(off int) string {
	if o.AppendixAt < 0 || off < o.AppendixAt {
		return ""
	}
	cur := ""
	for _, s := range o.Sections {
		if s.Offset > off {
			break
		}
		if s.Appendix && s.Level == 1 {
			cur = s.Number
		}
	}
	if cur == "" {
		cur = "A" // appendix material before its first heading
	}
	return cur
}

// SectionOf is the section a heading node stands for.
func (o *Outline) SectionOf(h ast.Node) *Section {
	for _, s := range o.Sections {
		if s.Node == h {
			return s
		}
	}
	return nil
}

func isAppendixMarker(p *ast.Paragraph, body []byte) bool {
	if p.Lines().Len() != 1 {
		return false
	}
	seg := p.Lines().At(0)
	return strings.TrimSpace(string(body[seg.Start:seg.Stop])) == `\appendix`
}

// letters numbers appendices A … Z, then AA, AB, ….
func letters(n int) string {
	if n <= 0 {
		return "A"
	}
	s := ""
	for n > 0 {
		n--
		s = string(rune('A'+n%26)) + s
		n /= 26
	}
	return s
}

// dropPrefix removes n bytes at body offset at from the heading's first
// text node, so that every writer renders the title without the
// author's own number.
func dropPrefix(h *ast.Heading, at, n int) {
	t, ok := h.FirstChild().(*ast.Text)
	if !ok || t.Segment.Start != at || t.Segment.Stop-t.Segment.Start < n {
		return
	}
	if t.Segment.Stop-t.Segment.Start == n {
		h.RemoveChild(h, t)
		return
	}
	t.Segment = t.Segment.WithStart(at + n)
}

func leadingSpace(b []byte) int { return len(b) - len(bytes.TrimLeft(b, " \t")) }
