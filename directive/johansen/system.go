package johansen

import (
	"errors"
	"fmt"
	"slices"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
)

// The johansen and vecm directives give their estimated system to the
// dynamics family through contract.SystemSource.

func (s *sysState) system(missing string) (*contract.System, error) {
	if s.vecm == nil {
		return nil, fmt.Errorf("the sequential trace tests at %s choose rank %d, so there is no VECM; set rank: (1..%d) there", contract.Pct(s.st.Level), s.chosen, s.res.K-1)
	}
	return &contract.System{
		Names: slices.Clone(s.st.Names), Levels: s.y, Case: s.res.Case, Lags: s.res.Lags, Rank: s.rank,
		Norm: slices.Clone(s.norm), Extra: s.ex.x, VECM: s.vecm,
		From: s.d.Dates[s.res.Lags+1].String(), To: s.d.Dates[s.d.N()-1].String(), NObs: s.res.T, Missing: missing,
	}, nil
}

func upstreamContext(ctx any) (*engine.Context, error) {
	c, ok := ctx.(*engine.Context)
	if !ok || c == nil {
		return nil, errors.New("internal: EstimatedSystem needs the directive's engine context")
	}
	return c, nil
}

// EstimatedSystem implements contract.SystemSource.
func (s *johansenSpec) EstimatedSystem(ctx any) (*contract.System, error) {
	if s.state == nil { // the result came from the cache: run the analysis
		c, err := upstreamContext(ctx)
		if err != nil {
			return nil, err
		}
		if s.state, err = s.run(c); err != nil {
			return nil, err
		}
	}
	return s.state.system(s.Missing)
}

// EstimatedSystem implements contract.SystemSource: the system of the
// johansen directive named in from:, or the vecm's own.
func (s *vecmSpec) EstimatedSystem(ctx any) (*contract.System, error) {
	c, err := upstreamContext(ctx)
	if err != nil {
		return nil, err
	}
	if s.From != "" {
		up, err := c.Upstream("from", s.From, "johansen")
		if err != nil {
			return nil, err
		}
		return up.(*johansenSpec).EstimatedSystem(c.UpstreamContext(s.From))
	}
	if s.state == nil {
		if s.state, err = s.run(c); err != nil {
			return nil, err
		}
	}
	return s.state.system(s.Missing)
}
