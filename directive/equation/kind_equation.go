// Package equation typesets an estimated model as a numbered display
// equation: the fitted coefficients with their standard errors (or
// t-ratios) beneath them. It reads the model only through
// contract.Model (Result.Model), so any kind that estimates one
// regression equation can be shown.
package equation

import (
	"github.com/galley-econ/galley/internal/termname"
	"math"
	"regexp"
	"slices"
	"sort"
	"strconv"
	"strings"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/table"
	"github.com/galley-econ/galley/manuscript"
)

// equationSpec: estimated-equation.
type equationSpec struct {
	engine.Common `yaml:",inline"`
	Of            string            `yaml:"of"`
	Symbols       map[string]string `yaml:"symbols"`
	Beneath       string            `yaml:"beneath"`
	Stats         []string          `yaml:"stats"`
	Decimals      *int              `yaml:"decimals"`
}

func init() {
	engine.Register(engine.Kind{
		Name:    "estimated-equation",
		Summary: "an estimated model as a numbered display equation, standard errors beneath the coefficients",
		New:     func() engine.Directive { return &equationSpec{} },
		Fields:  []string{"of"},
	})
}

// statTeX are the summary statistics the line under the equation can
// show, with their symbols.
var statTeX = []struct{ key, tex string }{
	{"nobs", "N"}, {"r2", "R^2"}, {"r2_adj", `\bar{R}^2`}, {"sigma", `\hat{\sigma}`},
	{"loglik", `\log L`}, {"dw", `\mathit{DW}`}, {"halflife", `\text{half-life}`},
}

var beneathValues = []string{"se", "t", "none"}

func (s *equationSpec) Check(c *engine.Context) error {
	if err := c.CheckRefWhere("of", s.Of, func(k *engine.Kind) bool { return k.Model }); err != nil {
		return err
	}
	if s.Beneath != "" && !slices.Contains(beneathValues, s.Beneath) {
		return c.Errorf("beneath", "%q is not a choice; write se (standard errors, the default), t (t-ratios) or none", s.Beneath)
	}
	var keys []string
	for _, st := range statTeX {
		keys = append(keys, st.key)
	}
	for i, st := range s.Stats {
		if !slices.Contains(keys, st) {
			return c.ItemErrorf("stats", i, "%q is not a statistic an estimated equation shows%s; choose from %s", st, manuscript.DidYouMean(st, keys), strings.Join(keys, ", "))
		}
	}
	if s.Decimals != nil && (*s.Decimals < 0 || *s.Decimals > 10) {
		return c.Errorf("decimals", "decimals must be between 0 and 10")
	}
	for term, tex := range s.Symbols {
		if err := manuscript.CheckTeX(tex); err != nil {
			return c.Errorf("symbols", "the symbol of %s: %v", term, err)
		}
	}
	return nil
}

func (s *equationSpec) Run(c *engine.Context) (*engine.Result, error) {
	res, err := c.Result("of", s.Of)
	if err != nil {
		return nil, err
	}
	m := res.Model
	if m == nil {
		return nil, c.Errorf("of", "%q is a %s result, which is not one estimated equation; an estimated equation shows a result that carries its model (ols, ecm, dols, fmols, …)", s.Of, res.Kind)
	}
	for term := range s.Symbols {
		if _, ok := m.Coef(term); !ok && term != m.Dependent {
			var names []string
			for _, c := range m.Coefs {
				names = append(names, c.Term)
			}
			return nil, c.Errorf("symbols", "%q is neither the dependent variable nor a term of %s%s; its terms: %s", term, s.Of, hint(term, names), strings.Join(names, ", "))
		}
	}
	dec := c.Decimals()
	if s.Decimals != nil {
		dec = *s.Decimals
	}
	eq := &table.Equation{LHS: s.symbol(m.Dependent)}
	// the constant first, as applied papers write it
	coefs := slices.Clone(m.Coefs)
	sort.SliceStable(coefs, func(i, j int) bool { return isConst(coefs[i].Term) && !isConst(coefs[j].Term) })
	for _, k := range coefs {
		t := table.EqTerm{Est: k.Est, Below: math.NaN(), Dec: dec}
		switch s.Beneath {
		case "", "se":
			t.Below = k.SE
		case "t":
			t.Below = k.T
		}
		if !isConst(k.Term) {
			t.Symbol = s.symbol(k.Term)
		}
		eq.Terms = append(eq.Terms, t)
	}
	stats := s.Stats
	if stats == nil {
		stats = []string{"nobs", "r2"}
	}
	var parts []string
	for _, st := range statTeX {
		if !slices.Contains(stats, st.key) {
			continue
		}
		v, ok := m.Stats[st.key]
		if !ok || math.IsNaN(v) {
			if s.Stats != nil {
				return nil, c.Errorf("stats", "%s has no %s", s.Of, st.key)
			}
			continue
		}
		txt := strconv.FormatFloat(v, 'f', dec, 64)
		if st.key == "nobs" {
			txt = strconv.Itoa(int(v))
		}
		parts = append(parts, st.tex+" = "+txt)
	}
	eq.Stats = strings.Join(parts, `,\quad `)
	switch s.Beneath {
	case "", "se":
		eq.Below = "standard errors"
	case "t":
		eq.Below = "t-ratios"
	}
	note := m.Method + " estimates"
	if eq.Below != "" {
		note += "; " + eq.Below + " in parentheses beneath the coefficients"
		if m.SE != "" && eq.Below == "standard errors" {
			note += " (" + m.SE + ")"
		}
	}
	note += "."
	if m.Sample != "" {
		note += " Sample " + m.Sample + "."
	}
	if m.Omitted != "" {
		note += " " + m.Omitted
	}
	eq.Notes = []string{note}
	if n := s.Note; n != "" {
		eq.Notes = append(eq.Notes, n)
	}
	// The numbers are the model's own (in its result's values); repeating
	// them here would count them twice in comparisons of builds.
	values := map[string]any{"of": s.Of}
	return &engine.Result{Equation: eq, Values: values}, nil
}

func isConst(term string) bool { return term == "const" || term == "constant" || term == "intercept" }

// symbol is the TeX for a term: the author's own from symbols:, or one
// made from the series expression.
func (s *equationSpec) symbol(term string) string {
	if tex, ok := s.Symbols[term]; ok {
		return tex
	}
	return ExprTeX(term)
}

// ExprTeX writes a series expression as math: log(x) as \ln x_t, diff(e)
// as \Delta e, lag(e, k) and e(-k) as e dated t−k, a name of several
// letters upright. What it cannot read is set as text.
func ExprTeX(expr string) string {
	src := strings.ReplaceAll(expr, " ", "")
	shift := 0
	if m := lagSuffix.FindStringSubmatch(src); m != nil && termname.Balanced(m[1]) {
		src = m[1]
		shift, _ = strconv.Atoi(m[2])
	}
	delta := ""
	if rest, ok := strings.CutPrefix(src, "d."); ok { // a term name for a difference: d.x, d.x(-1)
		src, delta = rest, `\Delta `
	}
	p := &exprParser{s: src}
	out, ok := p.expr(shift)
	out = delta + out
	if !ok || p.i != len(p.s) {
		return `\text{` + texText(expr) + `}`
	}
	return out
}

type exprParser struct {
	s string
	i int
}

func (p *exprParser) expr(shift int) (string, bool) {
	name := p.ident()
	if name == "" {
		return "", false
	}
	var out string
	if p.peek('(') {
		p.i++
		if strings.HasPrefix(p.s[p.i:], "-") { // e(-k): a lag
			k, ok := p.int()
			if !ok || !p.peek(')') {
				return "", false
			}
			p.i++
			return p.dated(name, shift-k), true
		}
		inner, ok := p.exprArg(name, shift)
		if !ok {
			return "", false
		}
		out = inner
	} else {
		out = p.dated(name, shift)
	}
	// a lag written after a call: diff(x)(-1)
	if p.peek('(') && strings.HasPrefix(p.s[p.i+1:], "-") {
		return "", false
	}
	return out, true
}

func (p *exprParser) exprArg(fn string, shift int) (string, bool) {
	switch fn {
	case "lag":
		start := p.i
		depth := 0
		for p.i < len(p.s) && (depth > 0 || p.s[p.i] != ',' && p.s[p.i] != ')') {
			switch p.s[p.i] {
			case '(':
				depth++
			case ')':
				depth--
			}
			p.i++
		}
		k := 1
		argEnd := p.i
		if p.peek(',') {
			p.i++
			kk, ok := p.int()
			if !ok {
				return "", false
			}
			k = kk
		}
		if !p.peek(')') {
			return "", false
		}
		p.i++
		sub := &exprParser{s: p.s[start:argEnd]}
		out, ok := sub.expr(shift - k)
		return out, ok && sub.i == len(sub.s)
	}
	inner, ok := p.expr(shift)
	if !ok {
		return "", false
	}
	arg := ""
	if p.peek(',') {
		p.i++
		k, ok := p.int()
		if !ok {
			return "", false
		}
		arg = strconv.Itoa(k)
	}
	if !p.peek(')') {
		return "", false
	}
	p.i++
	switch fn {
	case "log":
		return `\ln ` + inner, true
	case "exp":
		return `\exp ` + inner, true
	case "diff", "sdiff":
		if arg != "" {
			return `\Delta_{` + arg + `} ` + inner, true
		}
		return `\Delta ` + inner, true
	case "dlog":
		return `\Delta\ln ` + inner, true
	}
	return "", false
}

func (p *exprParser) dated(name string, shift int) string {
	sym := name
	if name == "trend" {
		return "t"
	}
	if len(name) > 1 {
		sym = `\mathit{` + texText(name) + `}`
	}
	switch {
	case shift == 0:
		return sym + "_{t}"
	case shift < 0:
		return sym + "_{t" + strconv.Itoa(shift) + "}"
	}
	return sym + "_{t+" + strconv.Itoa(shift) + "}"
}

func (p *exprParser) ident() string {
	start := p.i
	for p.i < len(p.s) {
		r := p.s[p.i]
		if r == '_' || r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || p.i > start && r >= '0' && r <= '9' {
			p.i++
			continue
		}
		break
	}
	return p.s[start:p.i]
}

func (p *exprParser) int() (int, bool) {
	start := p.i
	if p.peek('-') {
		p.i++
	}
	for p.i < len(p.s) && p.s[p.i] >= '0' && p.s[p.i] <= '9' {
		p.i++
	}
	k, err := strconv.Atoi(p.s[start:p.i])
	if err != nil {
		return 0, false
	}
	if k < 0 {
		k = -k
	}
	return k, true
}

func (p *exprParser) peek(b byte) bool { return p.i < len(p.s) && p.s[p.i] == b }

// texText escapes a name for \text{} or \mathit{}.
func texText(s string) string {
	return strings.NewReplacer(`\`, "", "{", "", "}", "", "_", `\_`, "%", `\%`, "#", `\#`, "&", `\&`, "$", `\$`, "^", "", "~", "").Replace(s)
}

var lagSuffix = regexp.MustCompile(`^(.+)\((-\d+)\)$`)

// hint suggests the term meant: its new spelling when written in the old
// suffix notation, else the closest name.
func hint(term string, names []string) string {
	if h := engine.TermHint(term); h != "" {
		return h
	}
	return manuscript.DidYouMean(term, names)
}
