package html

import (
	"html"
	"sort"
	"strings"

	"github.com/wyatt915/treeblood"
)

// Math is converted to MathML when the page is built (treeblood, a Go
// TeX-to-MathML converter), so the page needs no script and fetches
// nothing: current browsers lay MathML out natively. See
// docs/writing.md for the choice and its measurements.

// texMacros are commands treeblood lacks, defined in terms it has.
var texMacros = map[string]string{
	"operatorname": `\mathrm{#1}`,
	"tfrac":        `\frac{#1}{#2}`,
	"dfrac":        `\frac{#1}{#2}`,
}

// mathML is typeset, kept in the document's memo (engine.Document.Memo)
// between builds, so that a rebuild converts only the formulas that
// changed (converting the demo's formulas cost 1 ms of every build).
func (h *htmlNodes) mathML(tex string, display bool) string {
	key := "i" + tex
	if display {
		key = "d" + tex
	}
	return h.doc.Memo("mathml", key, func() string { return typeset(tex, display) })
}

// typeset typesets TeX as a MathML element; display makes it a block.
// Anything the converter cannot read is shown as the TeX, marked.
func typeset(tex string, display bool) string {
	var out string
	var err error
	func() {
		defer func() {
			if recover() != nil {
				err = errConvert
			}
		}()
		if display {
			out, err = treeblood.DisplayStyle(tex, texMacros)
		} else {
			out, err = treeblood.InlineStyle(tex, texMacros)
		}
	}()
	if err != nil || strings.Contains(out, "<merror") {
		return `<code class="tex">` + html.EscapeString(tex) + `</code>`
	}
	// The converter writes attributes in map order; tidyMathML sorts them
	// so that a page is the same bytes on every build. The namespace is
	// implied inside HTML; leaving it out keeps the page free of
	// addresses.
	return strings.Replace(tidyMathML(out), ` xmlns="http://www.w3.org/1998/Math/MathML"`, "", 1)
}

// tidyMathML drops the white space between tags and writes each start
// tag's attributes in sorted order, one space apart (a tag of the form
// <name attr="…" …> or <name attr="…" …/>; anything else is copied as
// it is). It is a hand-written form of three regular expressions (kept
// in the test as its reference), which cost a page half a millisecond.
func tidyMathML(s string) string {
	// first ">", white space, "<" become "><"
	var b strings.Builder
	b.Grow(len(s))
	for i := 0; i < len(s); i++ {
		b.WriteByte(s[i])
		if s[i] == '>' {
			j := i + 1
			for j < len(s) && isSpace(s[j]) {
				j++
			}
			if j > i+1 && j < len(s) && s[j] == '<' {
				i = j - 1
			}
		}
	}
	s = strings.TrimSpace(b.String())
	// then each start tag with attributes is written again
	b.Reset()
	b.Grow(len(s))
	var attrs []string
	for i := 0; i < len(s); {
		if s[i] != '<' {
			b.WriteByte(s[i])
			i++
			continue
		}
		end, name, slash, ok := startTag(s, i, &attrs)
		if !ok {
			b.WriteByte('<')
			i++
			continue
		}
		sort.Strings(attrs)
		b.WriteString("<" + name + " " + strings.Join(attrs, " ") + slash + ">")
		i = end
	}
	return b.String()
}

// startTag reads a start tag with at least one attribute at s[i] ('<'):
// its end (just past '>'), name, "/" if it closes itself, and its
// attributes (into *attrs); ok false if s[i:] does not start one.
func startTag(s string, i int, attrs *[]string) (end int, name, slash string, ok bool) {
	*attrs = (*attrs)[:0]
	j := i + 1
	for j < len(s) && 'a' <= s[j] && s[j] <= 'z' {
		j++
	}
	if j == i+1 {
		return 0, "", "", false
	}
	name = s[i+1 : j]
	for {
		k := j
		for k < len(s) && isSpace(s[k]) {
			k++
		}
		a := k
		for k < len(s) && isAttrNameByte(s[k]) {
			k++
		}
		if k == a || a == j { // no attribute name, or no space before it
			j = a
			break
		}
		if k+1 >= len(s) || s[k] != '=' || s[k+1] != '"' {
			return 0, "", "", false
		}
		q := strings.IndexByte(s[k+2:], '"')
		if q < 0 {
			return 0, "", "", false
		}
		k += 2 + q + 1
		*attrs = append(*attrs, s[a:k])
		j = k
	}
	if len(*attrs) == 0 {
		return 0, "", "", false
	}
	if j < len(s) && s[j] == '/' {
		slash = "/"
		j++
	}
	if j >= len(s) || s[j] != '>' {
		return 0, "", "", false
	}
	return j + 1, name, slash, true
}

// isSpace is the white space of regular expressions' \s.
func isSpace(c byte) bool { return c == ' ' || c == '\t' || c == '\n' || c == '\f' || c == '\r' }

func isAttrNameByte(c byte) bool {
	return 'a' <= c && c <= 'z' || 'A' <= c && c <= 'Z' || c == ':' || c == '-'
}

type convertError struct{}

func (convertError) Error() string { return "TeX could not be converted" }

var errConvert error = convertError{}
