package johansen

import (
	"errors"
	"fmt"
	"slices"

	"github.com/galley-econ/galley/engine/contract"
)

// The johansen and vecm directives give their estimated system to the
// dynamics family through contract.SystemSource.

func (s *sysState) system(missing string) (*contract.System, error) {
	if s.vecm == nil {
		return nil, fmt.Errorf("the sequential trace tests at %s choose rank %d, so there is no VECM; set rank: (1..%d) there", contract.Pct(s.st.Level), s.chosen, s.res.K-1)
	}
	return &contract.System{
		Names: slices.Clone(s.st.Names), Levels: s.y, Dates: slices.Clone(s.d.Dates), Case: s.res.Case, Lags: s.res.Lags, Rank: s.rank,
		Norm: slices.Clone(s.norm), Extra: s.ex.x, VECM: s.vecm,
		From: s.d.Dates[s.res.Lags+1].String(), To: s.d.Dates[s.d.N()-1].String(), NObs: s.res.T, Missing: missing,
	}, nil
}

// EstimatedSystem implements contract.SystemSource. The engine runs the
// directive in this build before handing it on (engine.Context.Live), so
// its state is there.
func (s *johansenSpec) EstimatedSystem() (*contract.System, error) {
	if s.state == nil {
		return nil, errors.New("internal: the johansen directive has not run in this build")
	}
	return s.state.system(s.Missing)
}

// EstimatedSystem implements contract.SystemSource: the system of the
// johansen directive named in from:, or the vecm's own.
func (s *vecmSpec) EstimatedSystem() (*contract.System, error) {
	if s.from != nil {
		return s.from.EstimatedSystem()
	}
	if s.state == nil {
		return nil, errors.New("internal: the vecm directive has not run in this build")
	}
	return s.state.system(s.Missing)
}
