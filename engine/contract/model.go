package contract

// Model is an estimated single-equation model as other directives show
// it: a column of a model table, or an estimated equation typeset from
// the result. Every kind that estimates one regression equation (ols,
// ecm, dols, fmols, …) sets Result.Model; a consumer needs no other
// knowledge of the kind.
type Model struct {
	// Method names the estimator in a column heading: "OLS", "ECM".
	Method string
	// Dependent is the dependent variable as written ("log(north)"; for
	// an error-correction model its first difference, "diff(log(north))").
	Dependent string
	// Coefs are the coefficients shown, in display order; nuisance terms
	// a table leaves out (the leads and lags of DOLS) are not among them.
	Coefs []Coef
	// Stats are the model's summary statistics by key: "nobs", "r2",
	// "r2_adj", "sigma", "loglik", "dw", "alpha", "halflife", "leads",
	// "lags", "hac_lags" (the truncation lag of a HAC covariance),
	// "bandwidth" (of a kernel estimator such as FMOLS; each only where
	// the model has it).
	Stats map[string]float64
	// Diagnostics are residual diagnostics by key ("bg", "lb", "jb",
	// "arch", "bp", "reset", "dw").
	Diagnostics map[string]Diagnostic
	// SE describes the standard errors ("HAC (Newey–West, 4 lags)").
	SE string
	// Normal: t-ratios are judged against the standard normal rather
	// than Student's t.
	Normal bool
	// Sample is the estimation sample: "2004-01–2019-12, N = 192".
	Sample string
	// Omitted says what Coefs leave out, for a table note ("" if none).
	Omitted string
}

// Coef is one estimated coefficient.
type Coef struct {
	Term          string
	Est, SE, T, P float64
}

// Diagnostic is one residual diagnostic: its label ("Breusch–Godfrey
// LM(12)"), statistic and p-value.
type Diagnostic struct {
	Label   string
	Stat, P float64
}

// Coef returns the coefficient of term, if the model has it.
func (m *Model) Coef(term string) (Coef, bool) {
	for _, c := range m.Coefs {
		if c.Term == term {
			return c, true
		}
	}
	return Coef{}, false
}
