package contract

import (
	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/series"
)

// System is an estimated cointegrated VAR (a VECM at a rank in 1..K−1), in
// the form a directive that studies its dynamics (impulse responses,
// variance decompositions, causality) needs: the series as written, the
// levels it was estimated on, the specification to re-estimate it
// (bootstrap), and the estimates.
type System struct {
	Names  []string   // the series as written, in the model's order
	Levels *mat.Dense // T₀×K levels over the sample, rows in time
	Case   johansen.Case
	Lags   int // lagged differences k
	Rank   int
	Norm   []int          // normalisation series of β, one per relation
	Extra  johansen.Extra // dummies and conditioning regressors, rows as Levels
	VECM   *johansen.VECM
	From   string // first date of the estimation sample
	To     string // last date
	NObs   int    // T, the observations the VECM was estimated on
	// Missing is the upstream's missing-value rule ("error" or "drop").
	Missing string
	// Dates are the dates of the rows of Levels (the first Lags + 1 only
	// supply lags; row Lags + 1 is the first of the estimation sample).
	Dates []series.Date
}

// SystemSource is implemented by the directives that estimate a VECM
// (johansen, vecm). EstimatedSystem returns the system at the rank the
// directive reports; a consumer asks the engine for the directive with
// engine.Context.Live, which makes sure it ran in this build (a result
// reused from the cache carries no estimated system). It is an error
// when the directive's rank is 0 or K (no VECM).
type SystemSource interface {
	EstimatedSystem() (*System, error)
}
