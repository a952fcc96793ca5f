package contract

// VarianceShares is the forecast-error variance decomposition of an
// estimated system at every horizon h = 1 … H, in the form a figure draws
// it. Shares[h−1][i][j] is the share (a fraction) of the h-step
// forecast-error variance of series i due to the orthogonalised shock in
// series j; each Shares[h−1][i] sums to one.
type VarianceShares struct {
	Names  []string // the series as written, in the system's order (rows and shocks)
	Order  []int    // the Cholesky ordering, indices into Names, first the shock that moves every series on impact
	Shares [][][]float64
	Model  string // a description of the system, for notes
}

// VarianceShareSource is implemented by the directives that decompose
// forecast-error variances (variance-shares). VarianceShares returns the
// decomposition at horizons 1 … horizon of the system the directive
// estimated, computed as its own table is; a consumer asks the engine for
// the directive with engine.Context.Live, which makes sure it ran in this
// build. LastHorizon is the last horizon of the directive's own table.
type VarianceShareSource interface {
	VarianceShares(horizon int) (*VarianceShares, error)
	LastHorizon() int
}
