package html

import (
	"html"
	"regexp"
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

var (
	mathMLSpace = regexp.MustCompile(`>\s+<`)
	mathMLTag   = regexp.MustCompile(`<([a-z]+)((?:\s+[a-zA-Z:-]+="[^"]*")+)\s*(/?)>`)
	mathMLAttr  = regexp.MustCompile(`[a-zA-Z:-]+="[^"]*"`)
)

// mathML typesets TeX as a MathML element; display makes it a block.
// Anything the converter cannot read is shown as the TeX, marked.
func mathML(tex string, display bool) string {
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
	out = strings.TrimSpace(mathMLSpace.ReplaceAllString(out, "><"))
	// The converter writes attributes in map order; sort them so that a
	// page is the same bytes on every build.
	out = mathMLTag.ReplaceAllStringFunc(out, func(tag string) string {
		m := mathMLTag.FindStringSubmatch(tag)
		attrs := mathMLAttr.FindAllString(m[2], -1)
		sort.Strings(attrs)
		return "<" + m[1] + " " + strings.Join(attrs, " ") + m[3] + ">"
	})
	// The namespace is implied inside HTML; leaving it out keeps the page
	// free of addresses.
	return strings.Replace(out, ` xmlns="http://www.w3.org/1998/Math/MathML"`, "", 1)
}

type convertError struct{}

func (convertError) Error() string { return "TeX could not be converted" }

var errConvert error = convertError{}
