package html

import (
	"html"
	"strings"
)

// texToHTML typesets the common subset of TeX math that papers use in
// prose (Greek letters, sub- and superscripts, accents, operators,
// fractions) as HTML, so that the page reads well offline without a math
// engine. Anything it does not know is shown as written.
func texToHTML(tex string) string {
	var b strings.Builder
	p := &texParser{s: tex}
	p.render(&b, false)
	return b.String()
}

var texSymbols = map[string]string{
	"alpha": "α", "beta": "β", "gamma": "γ", "delta": "δ", "epsilon": "ϵ", "varepsilon": "ε",
	"zeta": "ζ", "eta": "η", "theta": "θ", "vartheta": "ϑ", "iota": "ι", "kappa": "κ",
	"lambda": "λ", "mu": "μ", "nu": "ν", "xi": "ξ", "pi": "π", "rho": "ρ", "sigma": "σ",
	"tau": "τ", "upsilon": "υ", "phi": "ϕ", "varphi": "φ", "chi": "χ", "psi": "ψ", "omega": "ω",
	"Gamma": "Γ", "Delta": "Δ", "Theta": "Θ", "Lambda": "Λ", "Xi": "Ξ", "Pi": "Π",
	"Sigma": "Σ", "Phi": "Φ", "Psi": "Ψ", "Omega": "Ω",
	"cdot": "·", "times": "×", "pm": "±", "mp": "∓", "leq": "≤", "le": "≤", "geq": "≥", "ge": "≥",
	"neq": "≠", "ne": "≠", "approx": "≈", "sim": "∼", "equiv": "≡", "infty": "∞", "sum": "∑",
	"prod": "∏", "partial": "∂", "nabla": "∇", "to": "→", "rightarrow": "→", "leftarrow": "←",
	"Rightarrow": "⇒", "in": "∈", "notin": "∉", "subset": "⊂", "cup": "∪", "cap": "∩",
	"ldots": "…", "cdots": "⋯", "dots": "…", "prime": "′", "perp": "⊥", "mid": "∣",
	"lvert": "|", "rvert": "|", "vert": "|", "lbrace": "{", "rbrace": "}", "{": "{", "}": "}",
	",": "\u2009", ";": "\u2005", ":": "\u2005", "quad": "\u2003", "qquad": "\u2003\u2003", " ": " ",
	"%": "%", "$": "$", "_": "_", "&": "&", "#": "#",
}

var texOperators = map[string]bool{
	"ln": true, "log": true, "exp": true, "min": true, "max": true, "lim": true, "sup": true,
	"inf": true, "det": true, "tr": true, "var": true, "cov": true, "sin": true, "cos": true,
	"Pr": true, "arg": true, "rank": true, "diag": true,
}

var texAccents = map[string]string{
	"hat": "\u0302", "widehat": "\u0302", "tilde": "\u0303", "widetilde": "\u0303",
	"bar": "\u0304", "overline": "\u0305", "dot": "\u0307", "ddot": "\u0308", "vec": "\u20d7",
}

type texParser struct {
	s string
	i int
}

func (p *texParser) render(b *strings.Builder, untilBrace bool) {
	for p.i < len(p.s) {
		c := p.s[p.i]
		switch {
		case c == '}' && untilBrace:
			p.i++
			return
		case c == '{':
			p.i++
			p.render(b, true)
		case c == '^' || c == '_':
			p.i++
			tag := "sup"
			if c == '_' {
				tag = "sub"
			}
			b.WriteString("<" + tag + ">")
			p.atom(b)
			b.WriteString("</" + tag + ">")
		case c == '\\':
			p.command(b)
		case c == '-':
			p.i++
			b.WriteString("\u2009−\u2009")
		case c == '+' || c == '=' || c == '<' || c == '>':
			p.i++
			b.WriteString("\u2009" + html.EscapeString(string(c)) + "\u2009")
		case c >= '0' && c <= '9' || c == '(' || c == ')' || c == '[' || c == ']' || c == ',' || c == '.' || c == '|' || c == '/':
			p.i++
			b.WriteString(`<span class="up">` + html.EscapeString(string(c)) + `</span>`)
		case c == ' ':
			p.i++
		default:
			r, size := decodeRune(p.s[p.i:])
			p.i += size
			b.WriteString(html.EscapeString(r))
		}
	}
}

// atom renders one argument: a {group}, a command, or one character.
func (p *texParser) atom(b *strings.Builder) {
	if p.i >= len(p.s) {
		return
	}
	switch p.s[p.i] {
	case '{':
		p.i++
		p.render(b, true)
	case '\\':
		p.command(b)
	default:
		r, size := decodeRune(p.s[p.i:])
		p.i += size
		if r >= "0" && r <= "9" && size == 1 {
			b.WriteString(`<span class="up">` + r + `</span>`)
		} else {
			b.WriteString(html.EscapeString(r))
		}
	}
}

func (p *texParser) command(b *strings.Builder) {
	p.i++ // the backslash
	start := p.i
	for p.i < len(p.s) && (p.s[p.i] >= 'a' && p.s[p.i] <= 'z' || p.s[p.i] >= 'A' && p.s[p.i] <= 'Z') {
		p.i++
	}
	if p.i == start && p.i < len(p.s) { // a one-character command like \, or \{
		p.i++
	}
	name := p.s[start:p.i]
	switch {
	case name == "left" || name == "right" || name == "big" || name == "Big" || name == "displaystyle":
		return
	case name == "frac":
		b.WriteString(`<span class="up">(</span>`)
		p.atom(b)
		b.WriteString(`<span class="up">)/(</span>`)
		p.atom(b)
		b.WriteString(`<span class="up">)</span>`)
	case name == "sqrt":
		b.WriteString(`√<span style="text-decoration:overline">`)
		p.atom(b)
		b.WriteString("</span>")
	case name == "mathrm" || name == "text" || name == "textrm" || name == "operatorname" || name == "mathit":
		var inner strings.Builder
		p.atom(&inner)
		b.WriteString(`<span class="up">` + inner.String() + `</span>`)
	case name == "mathbf" || name == "boldsymbol" || name == "bm":
		var inner strings.Builder
		p.atom(&inner)
		b.WriteString("<b>" + inner.String() + "</b>")
	case texAccents[name] != "":
		var inner strings.Builder
		p.atom(&inner)
		b.WriteString(inner.String() + texAccents[name])
	case texOperators[name]:
		b.WriteString(`<span class="up">` + name + `</span>`)
	case texSymbols[name] != "":
		b.WriteString(html.EscapeString(texSymbols[name]))
	default:
		b.WriteString(html.EscapeString(`\` + name))
	}
}

func decodeRune(s string) (string, int) {
	for i := 1; i <= len(s) && i <= 4; i++ {
		if i == len(s) || s[i]&0xC0 != 0x80 {
			return s[:i], i
		}
	}
	return s[:1], 1
}
