package contract

// LongRun says where a long-run (cointegrating) relation was estimated:
// the data alias ("" for the document's default), the dependent variable
// and regressors as expressions, the sample, and the missing-value rule
// ("error" or "drop"). A directive that builds on the relation (an
// error-correction model) reads its data with exactly these settings, so
// that it sees the observations the relation was estimated on.
type LongRun struct {
	Data, Y, Sample, Missing string
	X                        []string
}

// RelationSource is implemented by the directives whose result carries a
// long-run relation and its residuals (engle-granger, dols, fmols).
type RelationSource interface {
	Relation() LongRun
}

// Design says where a single-equation regression was estimated: data
// alias, dependent variable, regressors, whether a constant was added,
// sample and missing-value rule. A figure of the fit or of recursive
// estimates rebuilds exactly this design.
type Design struct {
	Data, Y, Sample, Missing string
	X                        []string
	Const                    bool
}

// DesignSource is implemented by the directives whose result is a
// single-equation regression a figure can re-examine (ols).
type DesignSource interface {
	RegressionDesign() Design
}
