package html

import (
	"math/rand"
	"regexp"
	"sort"
	"strings"
	"testing"

	"github.com/wyatt915/treeblood"
)

// tidyByRegexp is what tidyMathML replaces: three regular expressions.
func tidyByRegexp(out string) string {
	space := regexp.MustCompile(`>\s+<`)
	tag := regexp.MustCompile(`<([a-z]+)((?:\s+[a-zA-Z:-]+="[^"]*")+)\s*(/?)>`)
	attr := regexp.MustCompile(`[a-zA-Z:-]+="[^"]*"`)
	out = strings.TrimSpace(space.ReplaceAllString(out, "><"))
	return tag.ReplaceAllStringFunc(out, func(t string) string {
		m := tag.FindStringSubmatch(t)
		attrs := attr.FindAllString(m[2], -1)
		sort.Strings(attrs)
		return "<" + m[1] + " " + strings.Join(attrs, " ") + m[3] + ">"
	})
}

// TestTidyMathML: the scanner gives what the regular expressions gave,
// on the converter's output for a set of formulas (each several times,
// since the converter's attribute order varies) and on 8,000 random
// strings made of the characters that matter.
func TestTidyMathML(t *testing.T) {
	formulas := []string{
		`\Delta p^N_t = \alpha_N\, u^N_{t-1} + \sum_{j=1}^{k} \phi_j \Delta p^N_{t-j} + \varepsilon^N_t`,
		`\hat\beta = (X'X)^{-1} X'y`, `\operatorname{tr}(A) \le \tfrac{1}{2}`, `\left( \frac{a}{b} \right)`,
		`\begin{pmatrix} 1 & 0 \\ 0 & 1 \end{pmatrix}`, `x \mathrel{\widehat{=}} y`, `\mathbf{\Pi} = \alpha\beta'`,
		`\text{half-life} = \ln 0.5 / \ln(1+\hat\alpha)`, `\sqrt[3]{x^2}`, `\overline{x}_t \to \infty`,
	}
	n := 0
	for _, f := range formulas {
		for rep := 0; rep < 5; rep++ {
			for _, conv := range []func(string, map[string]string) (string, error){treeblood.DisplayStyle, treeblood.InlineStyle} {
				out, err := conv(f, texMacros)
				if err != nil {
					t.Fatalf("%s: %v", f, err)
				}
				if got, want := tidyMathML(out), tidyByRegexp(out); got != want {
					t.Fatalf("%s:\n got %s\nwant %s", f, got, want)
				}
				n++
			}
		}
	}
	alphabet := []string{"<", ">", "/", " ", "\n", "\t", "=", `"`, "mi", "a", "B", ":", "-", "x", "é", `a="1"`, `<mi `, `/>`}
	rng := rand.New(rand.NewSource(1))
	for i := 0; i < 8000; i++ {
		var b strings.Builder
		for k := rng.Intn(24); k > 0; k-- {
			b.WriteString(alphabet[rng.Intn(len(alphabet))])
		}
		s := b.String()
		if got, want := tidyMathML(s), tidyByRegexp(s); got != want {
			t.Fatalf("%q:\n got %q\nwant %q", s, got, want)
		}
	}
	if n == 0 {
		t.Fatal("no formula converted")
	}
}
