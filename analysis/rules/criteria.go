package rules

import (
	"fmt"
	"math"
	"strings"
)

// Criterion is an information criterion for choosing a model order.
//
// Every criterion adds to a measure of fit a penalty of c_T per estimated
// parameter, c_T depending on the criterion and the sample size T:
//
//	AIC (Akaike 1974):         c_T = 2,
//	BIC (Schwarz 1978):        c_T = ln T,
//	HQ  (Hannan and Quinn 1979): c_T = 2 ln ln T.
//
// PerObs and Total are the two forms in use; both take c_T from Penalty,
// so that the smaller value is the preferred model.
type Criterion int

const (
	// AIC is Akaike's information criterion.
	AIC Criterion = iota
	// BIC is Schwarz's Bayesian information criterion.
	BIC
	// HQ is the criterion of Hannan and Quinn.
	HQ
)

// String returns "AIC", "BIC" or "HQ".
func (c Criterion) String() string {
	switch c {
	case AIC:
		return "AIC"
	case BIC:
		return "BIC"
	case HQ:
		return "HQ"
	}
	return fmt.Sprintf("Criterion(%d)", int(c))
}

// ParseCriterion reads "aic", "bic" (also "sic", "schwarz") or "hq"
// (also "hannan-quinn"), case-insensitive.
func ParseCriterion(s string) (Criterion, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "aic":
		return AIC, nil
	case "bic", "sic", "schwarz":
		return BIC, nil
	case "hq", "hannan-quinn":
		return HQ, nil
	}
	return 0, fmt.Errorf("unknown information criterion %q (want aic, bic or hq)", s)
}

// Penalty returns the penalty per parameter c_T of criterion c at sample
// size T: 2 for AIC, ln T for BIC and 2 ln ln T for HQ (see Criterion).
// It returns NaN for an unknown criterion; for HQ it is negative when
// T < e (T ≤ 2).
func (c Criterion) Penalty(t int) float64 {
	switch c {
	case AIC:
		return 2
	case BIC:
		return math.Log(float64(t))
	case HQ:
		return 2 * math.Log(math.Log(float64(t)))
	}
	return math.NaN()
}

// PerObs returns the criterion in its per-observation form
//
//	fit + c_T·k/T,
//
// the form of a system (Lütkepohl 2005, §4.3), where fit = ln|Σ̂| with
// Σ̂ = T⁻¹ Σ û_t û_t', or of a single equation, where fit = ln(SSR/T);
// k is the number of estimated parameters.
func (c Criterion) PerObs(fit float64, k, t int) float64 {
	return fit + c.Penalty(t)*float64(k)/float64(t)
}

// Total returns the criterion of a single least-squares equation in its
// summed form
//
//	T·ln(SSR/T) + c_T·k,
//
// T times PerObs(ln(SSR/T), k, T) up to rounding, and so the same choice;
// up to a constant it is −2 times the Gaussian log-likelihood plus the
// penalty (Akaike 1974; Schwarz 1978; Hannan and Quinn 1979).
func (c Criterion) Total(ssr float64, k, t int) float64 {
	tf := float64(t)
	return tf*math.Log(ssr/tf) + c.Penalty(t)*float64(k)
}
