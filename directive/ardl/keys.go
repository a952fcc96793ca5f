package ardl

import (
	"fmt"
	"slices"
	"strings"

	"gopkg.in/yaml.v3"

	"github.com/galley-econ/galley/analysis/ardl"
	"github.com/galley-econ/galley/analysis/rules"
	"github.com/galley-econ/galley/engine"
)

// lagsKey is the lags: key: a criterion (aic, bic, hq), {select:
// CRITERION, max: N}, or the fixed orders [p, q1, …, qk].
type lagsKey struct {
	Set    bool
	Fixed  []int
	Select string
	Max    *int
	line   int
}

// UnmarshalYAML reads lags: in any of its three forms, or returns an
// error at its line that shows them.
func (l *lagsKey) UnmarshalYAML(n *yaml.Node) error {
	l.Set, l.line = true, n.Line
	const help = "lags: write a criterion (aic, bic or hq), {select: aic, max: 4}, or the orders [p, q1, …] (p for y, then one q per entry of x)"
	switch n.Kind {
	case yaml.ScalarNode:
		if _, err := rules.ParseCriterion(n.Value); err != nil {
			return fmt.Errorf("line %d: %s", n.Line, help)
		}
		l.Select = strings.ToLower(n.Value)
		return nil
	case yaml.SequenceNode:
		if err := n.Decode(&l.Fixed); err != nil {
			return fmt.Errorf("line %d: %s", n.Line, help)
		}
		return nil
	case yaml.MappingNode:
		var m struct {
			Select string `yaml:"select"`
			Max    *int   `yaml:"max"`
		}
		for i := 0; i+1 < len(n.Content); i += 2 {
			if k := n.Content[i].Value; k != "select" && k != "max" {
				return fmt.Errorf("line %d: lags: unknown key %q (select, max)", n.Content[i].Line, k)
			}
		}
		if err := n.Decode(&m); err != nil {
			return fmt.Errorf("line %d: %s", n.Line, help)
		}
		if m.Select == "" {
			m.Select = "aic"
		}
		if _, err := rules.ParseCriterion(m.Select); err != nil {
			return fmt.Errorf("line %d: lags: %v", n.Line, err)
		}
		l.Select, l.Max = strings.ToLower(m.Select), m.Max
		return nil
	}
	return fmt.Errorf("line %d: %s", n.Line, help)
}

// DefaultMaxLag is the largest lag searched when lags: gives no max.
const DefaultMaxLag = 4

// settings are the validated keys of one ardl directive.
type settings struct {
	det     ardl.Case
	spec    ardl.Spec
	tables  string
	horizon int
	show    string
	sim     *engine.SimSettings
	dec     int
}

// settings validates the keys and returns what the run needs: the
// deterministic case, the order search or fixed orders, the bound tables,
// the horizon, what the table shows, crit: simulate and the decimals.
func (s *ardlSpec) settings(c *engine.Context) (*settings, error) {
	st := &settings{}
	if s.Y == "" {
		return nil, c.Errorf("", "galley ardl: the key \"y\" is required: the dependent variable")
	}
	if len(s.X) == 0 {
		return nil, c.Errorf("", "galley ardl: the key \"x\" is required: a list of one or more regressors")
	}
	if err := s.checkSplit(c, st); err != nil {
		return nil, err
	}
	cs, err := engine.SystemCase(c, s.Det, int(ardl.Const))
	if err != nil {
		return nil, err
	}
	st.det = ardl.Case(cs)
	st.spec = ardl.Spec{Case: st.det, Crit: rules.AIC, MaxP: DefaultMaxLag, MaxQ: DefaultMaxLag}
	if err := s.readLags(c, &st.spec); err != nil {
		return nil, err
	}
	if err := s.readChoices(c, st); err != nil {
		return nil, err
	}
	if st.sim, err = s.SimKeys.Settings(c); err != nil {
		return nil, err
	}
	if st.sim != nil && c.Has("tables") {
		return nil, c.Errorf("tables", "tables chooses the published bounds; with crit: simulate they are simulated instead: drop tables")
	}
	st.dec = engine.DecimalsOr(c, s.Decimals)
	return st, nil
}

// checkSplit returns an error for a split: entry that is not in x or is
// listed twice, or a threshold or horizon without split (or out of
// range); it sets st.horizon.
func (s *ardlSpec) checkSplit(c *engine.Context, st *settings) error {
	for i, sp := range s.Split {
		if !slices.Contains(s.X, sp) {
			return c.ItemErrorf("split", i, "split: %q is not one of the regressors in x (%s); write it exactly as in x", sp, strings.Join(s.X, ", "))
		}
		if slices.Index(s.Split, sp) != i {
			return c.ItemErrorf("split", i, "split: %q is listed twice", sp)
		}
	}
	if s.Threshold != nil && len(s.Split) == 0 {
		return c.Errorf("threshold", "threshold applies to the regressors of split; there are none")
	}
	if s.Horizon != nil {
		if len(s.Split) == 0 {
			return c.Errorf("horizon", "horizon is the length of the dynamic multipliers of the regressors of split; there are none")
		}
		if *s.Horizon < 1 || *s.Horizon > 1000 {
			return c.Errorf("horizon", "horizon must be 1…1000 periods, not %d", *s.Horizon)
		}
		st.horizon = *s.Horizon
	}
	return nil
}

// readLags sets in sp the fixed orders or the criterion and maximum that
// lags: gives, or returns an error at lags:.
func (s *ardlSpec) readLags(c *engine.Context, sp *ardl.Spec) error {
	switch {
	case len(s.Lags.Fixed) > 0:
		if len(s.Lags.Fixed) != 1+len(s.X) {
			return c.Errorf("lags", "lags: %d orders given; write %d: p for %s, then one q per entry of x", len(s.Lags.Fixed), 1+len(s.X), s.Y)
		}
		if s.Lags.Fixed[0] < 1 {
			return c.Errorf("lags", "lags: the order of %s must be at least 1, not %d", s.Y, s.Lags.Fixed[0])
		}
		for _, q := range s.Lags.Fixed[1:] {
			if q < 0 {
				return c.Errorf("lags", "lags: orders must be zero or more, not %d", q)
			}
		}
		sp.Fixed = &ardl.Orders{P: s.Lags.Fixed[0], Q: slices.Clone(s.Lags.Fixed[1:])}
	case s.Lags.Set && s.Lags.Select == "" && len(s.Lags.Fixed) == 0:
		return c.Errorf("lags", "lags: give at least the order of %s", s.Y)
	case s.Lags.Select != "":
		cr, _ := rules.ParseCriterion(s.Lags.Select)
		sp.Crit = cr
		if s.Lags.Max != nil {
			if *s.Lags.Max < 1 {
				return c.Errorf("lags", "lags: max must be at least 1, not %d", *s.Lags.Max)
			}
			sp.MaxP, sp.MaxQ = *s.Lags.Max, *s.Lags.Max
		}
	}
	return nil
}

// readChoices sets st.tables (default auto) and st.show (default bounds),
// or returns an error for a value they do not take.
func (s *ardlSpec) readChoices(c *engine.Context, st *settings) error {
	switch s.Tables {
	case "", "auto", "pss", "narayan":
		st.tables = s.Tables
		if st.tables == "" {
			st.tables = "auto"
		}
	default:
		return c.Errorf("tables", "tables: write auto, pss or narayan, not %q", s.Tables)
	}
	switch s.Show {
	case "", "bounds", "ecm":
		st.show = s.Show
		if st.show == "" {
			st.show = "bounds"
		}
	default:
		return c.Errorf("show", "show: write bounds (the default) or ecm, not %q", s.Show)
	}
	return nil
}
