package johansen

import (
	"errors"
	"fmt"
	"math"
)

// The Bartlett correction of the trace statistic with a bootstrap
// estimate of its finite-sample mean.
//
// A Bartlett correction rescales a likelihood-ratio statistic LR so that
// its mean matches the mean of its limit distribution:
// LR_B = LR · E_∞[LR] / E_T[LR] (Bartlett 1937). Where E_T[LR] has no
// usable closed form it can be estimated by the mean of bootstrap
// statistics computed under the null hypothesis (Rocke 1989, for
// likelihood-ratio tests in seemingly unrelated regressions). For the
// trace test of cointegrating rank, Johansen (2002) derives an analytic
// approximation to E_T[LR]; galley does not implement that formula and
// uses the bootstrap mean instead.
//
// References:
//
//	Bartlett, M. S. (1937). Properties of sufficiency and statistical
//	  tests. Proceedings of the Royal Society of London A 160, 268–282.
//	Doornik, J. A. (1998). Approximations to the asymptotic distributions
//	  of cointegration tests. Journal of Economic Surveys 12(5), 573–593.
//	Johansen, S. (2002). A small sample correction for the test of
//	  cointegrating rank in the vector autoregressive model. Econometrica
//	  70(5), 1929–1961.
//	Rocke, D. M. (1989). Bootstrap Bartlett adjustment in seemingly
//	  unrelated regression. Journal of the American Statistical
//	  Association 84, 598–601 (title and journal confirmed; year, volume
//	  and pages from memory).

// doornikMean holds, by case, the coefficients (a, b, c, e₁, e₂) of
// Doornik's (1998, Table 7) response surface for the mean of the
// asymptotic trace distribution with d = K − r non-stationary directions:
//
//	E_∞[trace] ≈ 2d² + a·d + b + c·√d + e₁·1{d = 1} + e₂·1{d = 2}.
//
// The coefficients were not read from the journal: they are those of two
// public transcriptions that agree digit for digit, the R packages pvars
// (data coint_rscoef, "Doornik 1998:591, Tab.7") and tsDyn
// (doornik_tab7_mean). Doornik's H_z, H_c, H_lc, H_l and H_ql are galley's
// cases n, rc, c, rt and ct.
var doornikMean = [5][5]float64{
	N:  {-1, 0.07, 0, 0.07, 0},
	RC: {2.01, 0, 0, 0.06, 0.05},
	C:  {1.05, -1.55, 0, -0.5, -0.23},
	RT: {4.05, 0.5, 0, -0.23, -0.07},
	CT: {2.85, -5.1, 1.35, -0.1, -0.06},
}

// AsymptoticTraceMean returns the mean of the asymptotic null
// distribution of the trace statistic for H(r) in case c with
// dim = K − r, from the response surface of Doornik (1998, Table 7):
//
//	m_∞(d) = 2d² + a·d + b + c·√d + e₁·1{d = 1} + e₂·1{d = 2},
//
// with the case's coefficients (see doornikMean; cases n, rc, c, rt, ct
// are Doornik's H_z, H_c, H_lc, H_l, H_ql). In cases c and ct with d = 1
// the limit is χ²(1) and the surface gives exactly 1. The surface is
// Doornik's fit to simulated moments; galley's own simulation of the
// asymptotic distribution agrees with it (analysis/simulate,
// TestAsymptoticTraceMeanSimulated).
func AsymptoticTraceMean(c Case, dim int) (float64, error) {
	if !c.valid() {
		return 0, fmt.Errorf("johansen: invalid deterministic case %d", int(c))
	}
	if dim < 1 {
		return 0, fmt.Errorf("johansen: the asymptotic mean needs K−r ≥ 1, not %d", dim)
	}
	k := doornikMean[c]
	d := float64(dim)
	m := 2*d*d + k[0]*d + k[1] + k[2]*math.Sqrt(d)
	switch dim {
	case 1:
		m += k[3]
	case 2:
		m += k[4]
	}
	return m, nil
}

// BootMean returns the mean of the bootstrap statistics q that are not
// NaN (a NaN marks a replication that could not be analysed) and their
// number, summing in the order given:
//
//	m̂_T = (1/n) Σ_{b: q_b not NaN} q_b.
//
// It is the estimate of E_T[LR] in the bootstrap Bartlett correction
// (Rocke 1989); RankBoot.Mean holds it for each rank.
func BootMean(q []float64) (mean float64, n int) {
	var s float64
	for _, v := range q {
		if math.IsNaN(v) {
			continue
		}
		s += v
		n++
	}
	if n == 0 {
		return math.NaN(), 0
	}
	return s / float64(n), n
}

// Bartlett holds the bootstrap Bartlett-corrected trace statistics, one
// entry per rank r = 0..K−1.
type Bartlett struct {
	// Trace[r] = Q_r · Asymptotic[r] / BootMean[r].
	Trace []float64
	// Factor[r] = Asymptotic[r] / BootMean[r].
	Factor []float64
	// BootMean[r] is m̂_T(r), the mean of the bootstrap trace statistics
	// under H(r); Asymptotic[r] is m_∞(K − r) (AsymptoticTraceMean).
	BootMean, Asymptotic []float64
}

// BartlettTrace returns the bootstrap Bartlett-corrected trace statistics
//
//	Q^B_r = Q_r · m_∞(K − r) / m̂_T(r),  r = 0..K−1,
//
// where Q_r = trace[r], m̂_T(r) = bootMean[r] is the mean of the bootstrap
// trace statistics computed under H(r) (BootMean; RankBoot.Mean) and
// m_∞(K − r) the mean of the asymptotic distribution in case c
// (AsymptoticTraceMean, Doornik 1998). The corrected statistic has, to
// the accuracy of the bootstrap mean, the finite-sample mean of the limit
// distribution and is compared with the asymptotic critical values
// (Bartlett 1937; Rocke 1989 for the bootstrap estimate of the mean).
// Multiplying Q_r and the bootstrap statistics by a common factor (such as
// the Reinsel–Ahn factor) leaves Q^B_r unchanged.
func BartlettTrace(trace, bootMean []float64, c Case) (*Bartlett, error) {
	k := len(trace)
	if k == 0 {
		return nil, errors.New("johansen: no trace statistics")
	}
	if len(bootMean) != k {
		return nil, fmt.Errorf("johansen: %d bootstrap means for %d trace statistics", len(bootMean), k)
	}
	out := &Bartlett{Trace: make([]float64, k), Factor: make([]float64, k),
		BootMean: append([]float64(nil), bootMean...), Asymptotic: make([]float64, k)}
	for r := 0; r < k; r++ {
		m, err := AsymptoticTraceMean(c, k-r)
		if err != nil {
			return nil, err
		}
		if !(bootMean[r] > 0) || math.IsInf(bootMean[r], 0) {
			return nil, fmt.Errorf("johansen: the mean of the bootstrap trace statistics for rank %d is %g, not a positive number", r, bootMean[r])
		}
		out.Asymptotic[r] = m
		out.Factor[r] = m / bootMean[r]
		out.Trace[r] = trace[r] * out.Factor[r]
	}
	return out, nil
}

// Rank is the sequential choice of rank with the corrected statistics:
// the first r whose Trace[r] does not exceed its asymptotic critical value
// cv[r] at the level's column li (see Levels), K if none.
func (b *Bartlett) Rank(cv [][3]float64, li int) int {
	for r, q := range b.Trace {
		if r >= len(cv) || q <= cv[r][li] {
			return r
		}
	}
	return len(b.Trace)
}
