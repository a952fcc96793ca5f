package engine

import (
	"fmt"
	"strings"

	"gopkg.in/yaml.v3"

	"github.com/galley-econ/galley/analysis/unitroot"
	"github.com/galley-econ/galley/manuscript"
)

// LagChoice is the grammar every `lags:` key shares: a fixed number
// (`lags: 4`), a selector with the default maximum (`lags: aic`), or a
// selector with a maximum (`lags: {select: aic, max: 12}`). Which
// selectors a key accepts is for its kind to say (valid).
type LagChoice struct {
	Set    bool
	Fixed  int
	Select string
	Max    *int
}

func (l *LagChoice) Decode(n *yaml.Node, valid func(string) error, help string) error {
	l.Set = true
	switch n.Kind {
	case yaml.ScalarNode:
		if n.ShortTag() == "!!float" {
			return fmt.Errorf("line %d: lags takes a whole number of lags or a selector, not %s", n.Line, n.Value)
		}
		var k int
		if err := n.Decode(&k); err == nil {
			if k < 0 {
				return fmt.Errorf("line %d: lags must be zero or more, got %d", n.Line, k)
			}
			l.Fixed = k
			return nil
		}
		if valid(n.Value) != nil {
			return fmt.Errorf("line %d: %s", n.Line, help)
		}
		l.Select = strings.ToLower(n.Value)
		return nil
	case yaml.MappingNode:
		var m struct {
			Select string `yaml:"select"`
			Max    *int   `yaml:"max"`
		}
		if err := manuscript.CheckKeys(n, &m); err != nil {
			return err
		}
		if err := n.Decode(&m); err != nil {
			return err
		}
		if err := valid(m.Select); err != nil {
			return fmt.Errorf("line %d: lags: %v", n.Line, err)
		}
		if m.Max != nil && *m.Max < 0 {
			return fmt.Errorf("line %d: lags: max must be zero or more", n.Line)
		}
		l.Select, l.Max = strings.ToLower(m.Select), m.Max
		return nil
	}
	return fmt.Errorf("line %d: %s", n.Line, help)
}

// LagSpec is the `lags:` key of a unit-root or residual-based test, with
// the selectors aic, bic and tstat.
type LagSpec struct{ LagChoice }

func (l *LagSpec) UnmarshalYAML(n *yaml.Node) error {
	return l.Decode(n, func(s string) error { _, err := unitroot.ParseSelector(s); return err },
		"lags: write a number, a selector (aic, bic, tstat, maic), or {select: aic, max: 12}")
}

// Rule converts the spec into a lag rule; def is used when lags is absent.
func (l LagSpec) Rule(def unitroot.LagRule) unitroot.LagRule {
	if !l.Set {
		return def
	}
	if l.Select == "" {
		return unitroot.LagRule{Select: unitroot.Fixed, Lags: l.Fixed}
	}
	sel, _ := unitroot.ParseSelector(l.Select)
	r := unitroot.LagRule{Select: sel, Max: -1}
	if l.Max != nil {
		r.Max = *l.Max
	}
	return r
}

// DescribeLags is a phrase for a table note: "chosen by AIC from 0–15".
func DescribeLags(r unitroot.LagRule, maxUsed int) string {
	if r.Select == unitroot.Fixed {
		return fmt.Sprintf("fixed at %d", r.Lags)
	}
	name := map[unitroot.Selector]string{unitroot.AIC: "AIC", unitroot.BIC: "BIC", unitroot.TStat: "general-to-specific t-test (10%)", unitroot.MAIC: "the modified AIC of Ng and Perron (2001)"}[r.Select]
	if maxUsed < 0 {
		if r.Max >= 0 {
			maxUsed = r.Max
		} else {
			return fmt.Sprintf("chosen by %s from 0 to the integer part of 12(T/100)^(1/4) on a common sample, then re-estimated on the full sample", name)
		}
	}
	return fmt.Sprintf("chosen by %s from 0–%d on a common sample, then re-estimated on the full sample", name, maxUsed)
}

// DefaultLags is AIC with the default maximum ⌊12(T/100)^{1/4}⌋.
var DefaultLags = unitroot.LagRule{Select: unitroot.AIC, Max: -1}
