package ardl

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat/distuv"

	"github.com/galley-econ/galley/analysis/ecm"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/rules"
)

// Input holds the series of an ARDL model, aligned on one time index
// 0..T−1 and all finite.
type Input struct {
	Y     []float64
	YName string // "y" when empty
	X     [][]float64
	// XNames name the regressors in term names; x1, x2, … when empty.
	XNames []string
	// Group ties regressors that share one lag order (the positive and
	// negative partial sums of a decomposed regressor): Group[j] is the
	// index of x_j's order in Orders.Q. Nil: one order per regressor.
	Group []int
	// Extra are stationary regressors entering at time t unlagged
	// (dummies), in both the ARDL and its error-correction forms.
	Extra      [][]float64
	ExtraNames []string
}

// Orders are the lag orders p (of y) and q (one per regressor, or per
// group of Input.Group).
type Orders struct {
	P int
	Q []int
}

// Spec chooses the deterministic case and the lag orders: fixed Orders,
// or the orders minimising Criterion over p = 1…MaxP and every q in
// 0…MaxQ.
type Spec struct {
	Case  Case
	Fixed *Orders
	Crit  rules.Criterion
	MaxP  int
	MaxQ  int
}

// MaxModels bounds the size of a lag-order grid.
const MaxModels = 50_000

// Selection records a lag-order search.
type Selection struct {
	Crit   rules.Criterion
	MaxP   int
	MaxQ   int
	NObs   int // observations of the common sample
	Models int
	Value  float64 // the criterion at the chosen orders, T·ln(SSR/T) + c_T·K (rules.Criterion.Total)
	// All lists every model compared, in grid order.
	All []Candidate
}

// Candidate is one model of a search.
type Candidate struct {
	Orders Orders
	K      int // regressors
	SSR    float64
	Value  float64
}

// Term is an estimated coefficient with its name.
type Term struct {
	Name string
	ols.Coef
}

// Model is a fitted ARDL model in its conditional error-correction form.
type Model struct {
	Case      Case
	Orders    Orders
	QStar     []int // max(q, 1) per order group: the lags of the error-correction form
	Selection *Selection

	// The conditional (unrestricted) error-correction regression.
	Fit   *ols.Fit
	Names []string
	Coef  []ols.Coef // classical standard errors, Student-t p-values
	Cov   *mat.SymDense
	// First and Last index the inputs at the first and last Δy_t of the
	// estimation sample.
	First, Last int

	// Bounds tests.
	F      float64 // Wald F of the level terms (and the restricted term)
	FRestr int     // restrictions of the F test
	T      float64 // t-ratio of π_y (NaN in cases II and IV)
	K      int     // regressors in levels, k

	// Long-run coefficients θ = −π/π_y with delta-method standard errors
	// (normal p-values), the restricted term first when there is one.
	LongRun []Term
	LRCov   *mat.SymDense

	// The restricted error-correction model.
	ECM       *ols.Fit
	ECMNames  []string
	ECMCoef   []ols.Coef
	ECT       []float64 // ect_t at every input index (NaN where undefined)
	Adjust    ecm.Adjustment
	levelPhi  []float64   // φ_1…φ_p of the levels form
	levelBeta [][]float64 // per regressor, β_0…β_{q*}
}

// Term names.
const (
	ConstName = "const"
	TrendName = "trend"
	ECTName   = ecm.ECTName
)

// LevelName is the name of v_{t−1}: "lag(v,1)".
func LevelName(v string) string { return "lag(" + v + ",1)" }

// DiffName is ecm.DiffName: "diff(v)" or "lag(diff(v),j)".
func DiffName(v string, lag int) string { return ecm.DiffName(v, lag) }

func (in *Input) names() (string, []string, []string, error) {
	yn := in.YName
	if yn == "" {
		yn = "y"
	}
	xn := in.XNames
	if xn == nil {
		for j := range in.X {
			xn = append(xn, fmt.Sprintf("x%d", j+1))
		}
	}
	if len(xn) != len(in.X) {
		return "", nil, nil, fmt.Errorf("ardl: %d regressor names for %d regressors", len(xn), len(in.X))
	}
	en := in.ExtraNames
	if en == nil {
		for j := range in.Extra {
			en = append(en, fmt.Sprintf("extra%d", j+1))
		}
	}
	if len(en) != len(in.Extra) {
		return "", nil, nil, fmt.Errorf("ardl: %d extra names for %d extra regressors", len(en), len(in.Extra))
	}
	return yn, xn, en, nil
}

// groups returns the order group of each regressor and the number of
// groups.
func (in *Input) groups() ([]int, int, error) {
	if in.Group == nil {
		g := make([]int, len(in.X))
		for j := range g {
			g[j] = j
		}
		return g, len(in.X), nil
	}
	if len(in.Group) != len(in.X) {
		return nil, 0, fmt.Errorf("ardl: %d group entries for %d regressors", len(in.Group), len(in.X))
	}
	n := 0
	for _, g := range in.Group {
		if g < 0 {
			return nil, 0, errors.New("ardl: negative group")
		}
		n = max(n, g+1)
	}
	return in.Group, n, nil
}

func (in *Input) validate() error {
	n := len(in.Y)
	if n == 0 {
		return errors.New("ardl: no observations")
	}
	if len(in.X) == 0 {
		return errors.New("ardl: no regressors: the bounds test needs at least one x")
	}
	chk := func(what string, v []float64) error {
		if len(v) != n {
			return fmt.Errorf("ardl: %s has %d observations, y has %d", what, len(v), n)
		}
		for i, x := range v {
			if math.IsNaN(x) || math.IsInf(x, 0) {
				return fmt.Errorf("ardl: %s is not finite at observation %d", what, i+1)
			}
		}
		return nil
	}
	if err := chk("y", in.Y); err != nil {
		return err
	}
	for j, x := range in.X {
		if err := chk(fmt.Sprintf("regressor %d", j+1), x); err != nil {
			return err
		}
	}
	for j, x := range in.Extra {
		if err := chk(fmt.Sprintf("extra regressor %d", j+1), x); err != nil {
			return err
		}
	}
	return nil
}

// column is one regressor as a function of the input index t.
type column struct {
	name string
	at   func(t int) float64
}

func lagOf(v []float64, l int) func(int) float64 { return func(t int) float64 { return v[t-l] } }
func diffOf(v []float64, l int) func(int) float64 {
	return func(t int) float64 { return v[t-l] - v[t-l-1] }
}

// detCols are the deterministic columns of case c: the intercept 1 and
// the trend t+1 (t the input index, so the trend counts the data's
// observations from 1).
func detCols(c Case) []column {
	var out []column
	if c.HasConst() {
		out = append(out, column{ConstName, func(int) float64 { return 1 }})
	}
	if c.HasTrend() {
		out = append(out, column{TrendName, func(t int) float64 { return float64(t + 1) }})
	}
	return out
}

// levelsCols are the regressors of the ARDL in levels.
func (in *Input) levelsCols(c Case, o Orders, group []int) []column {
	yn, xn, en, _ := in.names()
	cols := detCols(c)
	for i := 1; i <= o.P; i++ {
		cols = append(cols, column{fmt.Sprintf("%s(-%d)", yn, i), lagOf(in.Y, i)})
	}
	for j, x := range in.X {
		for l := 0; l <= o.Q[group[j]]; l++ {
			name := xn[j]
			if l > 0 {
				name = fmt.Sprintf("%s(-%d)", xn[j], l)
			}
			cols = append(cols, column{name, lagOf(x, l)})
		}
	}
	for j, w := range in.Extra {
		cols = append(cols, column{en[j], lagOf(w, 0)})
	}
	return cols
}

// ecmCols are the regressors of the conditional error-correction form.
func (in *Input) ecmCols(c Case, p int, qstar []int, group []int) []column {
	yn, xn, en, _ := in.names()
	cols := detCols(c)
	cols = append(cols, column{LevelName(yn), lagOf(in.Y, 1)})
	for j, x := range in.X {
		cols = append(cols, column{LevelName(xn[j]), lagOf(x, 1)})
	}
	for i := 1; i < p; i++ {
		cols = append(cols, column{DiffName(yn, i), diffOf(in.Y, i)})
	}
	for j, x := range in.X {
		for l := 0; l < qstar[group[j]]; l++ {
			cols = append(cols, column{DiffName(xn[j], l), diffOf(x, l)})
		}
	}
	for j, w := range in.Extra {
		cols = append(cols, column{en[j], lagOf(w, 0)})
	}
	return cols
}

// design evaluates cols and the response at t = first..last.
func design(cols []column, resp func(int) float64, first, last int) ([]float64, *mat.Dense) {
	m := last - first + 1
	y := make([]float64, m)
	x := mat.NewDense(m, len(cols), nil)
	for i := 0; i < m; i++ {
		t := first + i
		y[i] = resp(t)
		for j, c := range cols {
			x.Set(i, j, c.at(t))
		}
	}
	return y, x
}

func regress(cols []column, resp func(int) float64, first, last int) (*ols.Fit, error) {
	y, x := design(cols, resp, first, last)
	fit, err := ols.Regress(y, x)
	if err != nil {
		var ce *ols.CollinearError
		if errors.As(err, &ce) {
			return nil, fmt.Errorf("ardl: term %q is collinear with the terms before it", cols[ce.Col].name)
		}
		if errors.Is(err, ols.ErrTooFewObs) {
			return nil, fmt.Errorf("ardl: %d observations for %d terms: too few observations for these lag orders", last-first+1, len(cols))
		}
		return nil, fmt.Errorf("ardl: %w", err)
	}
	return fit, nil
}

// Select searches the lag orders p = 1…maxP and q = 0…maxQ (one q per
// order group) of the ARDL in levels with deterministic case c on the
// common sample t = max(maxP, maxQ) … T−1, and returns the orders that
// minimise criterion cr in its summed form T·ln(SSR/T) + c_T·K
// (rules.Criterion.Total, K the number of regressors; Akaike 1974,
// Schwarz 1978). Ties keep the first model in the grid order (p slowest,
// then q of the first group, …).
func Select(in Input, c Case, cr rules.Criterion, maxP, maxQ int) (*Selection, Orders, error) {
	if err := in.validate(); err != nil {
		return nil, Orders{}, err
	}
	if _, _, _, err := in.names(); err != nil {
		return nil, Orders{}, err
	}
	group, ng, err := in.groups()
	if err != nil {
		return nil, Orders{}, err
	}
	if maxP < 1 {
		return nil, Orders{}, fmt.Errorf("ardl: the largest lag of y must be at least 1, not %d", maxP)
	}
	if maxQ < 0 {
		return nil, Orders{}, fmt.Errorf("ardl: the largest lag of the regressors must be zero or more, not %d", maxQ)
	}
	models := maxP
	for g := 0; g < ng; g++ {
		models *= maxQ + 1
		if models > MaxModels {
			return nil, Orders{}, fmt.Errorf("ardl: the lag grid has more than %d models; lower the maximum lag", MaxModels)
		}
	}
	n := len(in.Y)
	start := max(maxP, maxQ)
	kmax := len(detCols(c)) + maxP + len(in.Extra)
	kmax += len(in.X) * (maxQ + 1)
	if avail := n - start; avail <= kmax {
		return nil, Orders{}, fmt.Errorf("ardl: too few observations for the lag grid: the common sample has %d observations (T = %d less the %d largest lags) but the largest model has %d terms", max(avail, 0), n, start, kmax)
	}
	sel := &Selection{Crit: cr, MaxP: maxP, MaxQ: maxQ, NObs: n - start, Models: models, Value: math.Inf(1)}
	var best Orders
	q := make([]int, ng)
	for p := 1; p <= maxP; p++ {
		for i := range q {
			q[i] = 0
		}
		for {
			o := Orders{P: p, Q: append([]int(nil), q...)}
			cols := in.levelsCols(c, o, group)
			fit, err := regress(cols, func(t int) float64 { return in.Y[t] }, start, n-1)
			if err != nil {
				return nil, Orders{}, fmt.Errorf("%w (ARDL(%s))", err, o)
			}
			v := cr.Total(fit.SSR, fit.K, fit.N)
			sel.All = append(sel.All, Candidate{Orders: o, K: fit.K, SSR: fit.SSR, Value: v})
			if v < sel.Value {
				sel.Value, best = v, o
			}
			// next q (odometer, last group fastest)
			g := ng - 1
			for g >= 0 {
				q[g]++
				if q[g] <= maxQ {
					break
				}
				q[g] = 0
				g--
			}
			if g < 0 {
				break
			}
		}
	}
	return sel, best, nil
}

// String writes the orders as "p, q1, q2".
func (o Orders) String() string {
	s := fmt.Sprint(o.P)
	for _, q := range o.Q {
		s += fmt.Sprintf(", %d", q)
	}
	return s
}

// Estimate fits the model of s: the orders (fixed, or chosen by Select
// on the common sample and then re-estimated on their own sample
// t = max(p, q*) … T−1), the conditional error-correction regression by
// least squares with classical standard errors, the bounds F and t
// statistics, the long-run coefficients θ_j = −π_j/π_y with
// delta-method covariance G V Gᵀ (G the Jacobian of θ in (π_det, π_x,
// π_y)), and the restricted error-correction model
//
//	Δy_t = d_t'μ + α ect_{t−1} + Σ γ_i Δy_{t−i} + Σ δ_{jl} Δx_{j,t−l} + w_t'δ + ε_t,
//	ect_t = y_t − θ'x_t − θ_d d_t
//
// (d_t the restricted term of case II or IV, which then leaves the short
// run), whose α equals π_y; its half-life is ecm.NewAdjustment's. PSS
// (2001) eqs. (6), (21), (22); the F statistic is
// ((SSR_r − SSR_u)/m)/(SSR_u/(N − K)) for the m restrictions.
func Estimate(in Input, s Spec) (*Model, error) {
	if err := in.validate(); err != nil {
		return nil, err
	}
	_, xn, _, err := in.names()
	if err != nil {
		return nil, err
	}
	group, ng, err := in.groups()
	if err != nil {
		return nil, err
	}
	if s.Case < NoDet || s.Case > ConstTrend {
		return nil, fmt.Errorf("ardl: unknown case %d", int(s.Case))
	}
	m := &Model{Case: s.Case, K: len(in.X)}
	if s.Fixed != nil {
		m.Orders = Orders{P: s.Fixed.P, Q: append([]int(nil), s.Fixed.Q...)}
		if len(m.Orders.Q) != ng {
			return nil, fmt.Errorf("ardl: %d regressor lag orders for %d regressors", len(m.Orders.Q), ng)
		}
		if m.Orders.P < 1 {
			return nil, fmt.Errorf("ardl: the lag order of y must be at least 1, not %d", m.Orders.P)
		}
		for _, q := range m.Orders.Q {
			if q < 0 {
				return nil, fmt.Errorf("ardl: lag orders must be zero or more, not %d", q)
			}
		}
	} else {
		sel, o, err := Select(in, s.Case, s.Crit, s.MaxP, s.MaxQ)
		if err != nil {
			return nil, err
		}
		m.Selection, m.Orders = sel, o
	}
	m.QStar = make([]int, ng)
	maxLag := m.Orders.P
	for g, q := range m.Orders.Q {
		m.QStar[g] = max(q, 1)
		maxLag = max(maxLag, m.QStar[g])
	}
	n := len(in.Y)
	if maxLag >= n-1 {
		return nil, fmt.Errorf("ardl: lag order %d is beyond the sample of %d observations", maxLag, n)
	}
	m.First, m.Last = maxLag, n-1
	cols := in.ecmCols(s.Case, m.Orders.P, m.QStar, group)
	dy := diffOf(in.Y, 0)
	fit, err := regress(cols, dy, m.First, m.Last)
	if err != nil {
		return nil, err
	}
	m.Fit = fit
	for _, c := range cols {
		m.Names = append(m.Names, c.name)
	}
	m.Coef = fit.Table(ols.CovSpec{}, false)
	m.Cov = fit.Cov(ols.CovSpec{})

	// Positions: deterministic columns first, then y(-1), then x(-1)s.
	nd := len(detCols(s.Case))
	iy := nd
	ix := nd + 1
	// Bounds F: levels (and the restricted deterministic term).
	var restr []int
	switch s.Case {
	case RestConst:
		restr = append(restr, 0)
	case RestTrend:
		restr = append(restr, 1)
	}
	restr = append(restr, iy)
	for j := range in.X {
		restr = append(restr, ix+j)
	}
	R := mat.NewDense(len(restr), fit.K, nil)
	for i, c := range restr {
		R.Set(i, c, 1)
	}
	w, err := wald(fit.Coef, m.Cov, R, nil)
	if err != nil {
		return nil, fmt.Errorf("ardl: bounds F test: %v", err)
	}
	m.FRestr = len(restr)
	m.F = w / float64(len(restr))
	m.T = math.NaN()
	if s.Case.HasT() {
		m.T = m.Coef[iy].T
	}

	// Long-run coefficients.
	piY := fit.Coef[iy]
	if piY == 0 {
		return nil, errors.New("ardl: the coefficient of the lagged level of y is exactly zero: no long-run relation can be formed")
	}
	var lrIdx []int
	var lrNames []string
	switch s.Case {
	case RestConst:
		lrIdx, lrNames = append(lrIdx, 0), append(lrNames, ConstName)
	case RestTrend:
		lrIdx, lrNames = append(lrIdx, 1), append(lrNames, TrendName)
	}
	for j := range in.X {
		lrIdx, lrNames = append(lrIdx, ix+j), append(lrNames, xn[j])
	}
	G := mat.NewDense(len(lrIdx), fit.K, nil)
	theta := make([]float64, len(lrIdx))
	for i, c := range lrIdx {
		theta[i] = -fit.Coef[c] / piY
		G.Set(i, c, -1/piY)
		G.Set(i, iy, fit.Coef[c]/(piY*piY))
	}
	m.LRCov = ols.LinearCov(G, m.Cov)
	for i := range theta {
		se := math.Sqrt(m.LRCov.At(i, i))
		t := theta[i] / se
		m.LongRun = append(m.LongRun, Term{Name: lrNames[i], Coef: ols.Coef{Est: theta[i], SE: se, T: t, P: ols.TwoSidedP(t, 0, true)}})
	}

	// Error-correction term and the restricted ECM.
	m.ECT = make([]float64, n)
	for t := 0; t < n; t++ {
		v := in.Y[t]
		k := 0
		switch s.Case {
		case RestConst:
			v -= theta[0]
			k = 1
		case RestTrend:
			v -= theta[0] * float64(t+1)
			k = 1
		}
		for j, x := range in.X {
			v -= theta[k+j] * x[t]
		}
		m.ECT[t] = v
	}
	var ecols []column
	for _, c := range detCols(s.Case) {
		if (s.Case == RestConst && c.name == ConstName) || (s.Case == RestTrend && c.name == TrendName) {
			continue
		}
		ecols = append(ecols, c)
	}
	ecols = append(ecols, column{ECTName, lagOf(m.ECT, 1)})
	ecols = append(ecols, cols[nd+1+len(in.X):]...)
	efit, err := regress(ecols, dy, m.First, m.Last)
	if err != nil {
		return nil, fmt.Errorf("restricted error-correction model: %w", err)
	}
	m.ECM = efit
	for _, c := range ecols {
		m.ECMNames = append(m.ECMNames, c.name)
	}
	m.ECMCoef = efit.Table(ols.CovSpec{}, false)
	ia := 0
	for i, nm := range m.ECMNames {
		if nm == ECTName {
			ia = i
		}
	}
	m.Adjust = ecm.NewAdjustment(m.ECMCoef[ia].Est, m.ECMCoef[ia].SE)

	// Levels form of the dynamics, for multipliers.
	p := m.Orders.P
	gam := func(i int) float64 { // γ_i, i = 1…p−1
		if i < 1 || i > p-1 {
			return 0
		}
		return fit.Coef[nd+1+len(in.X)+i-1]
	}
	m.levelPhi = make([]float64, p)
	for i := 1; i <= p; i++ {
		m.levelPhi[i-1] = gam(i) - gam(i-1)
	}
	m.levelPhi[0] += 1 + piY
	off := nd + 1 + len(in.X) + p - 1
	for j := range in.X {
		qs := m.QStar[group[j]]
		del := fit.Coef[off : off+qs]
		off += qs
		b := make([]float64, qs+1)
		for l := 0; l <= qs; l++ {
			if l < qs {
				b[l] += del[l]
			}
			if l >= 1 {
				b[l] -= del[l-1]
			}
		}
		b[1] += fit.Coef[ix+j] // π_j x_{t−1}
		m.levelBeta = append(m.levelBeta, b)
	}
	return m, nil
}

// wald returns (Rb − r)'(R V R')⁻¹(Rb − r).
func wald(b []float64, v *mat.SymDense, R *mat.Dense, r []float64) (float64, error) {
	q, _ := R.Dims()
	d := mat.NewVecDense(q, nil)
	d.MulVec(R, mat.NewVecDense(len(b), append([]float64(nil), b...)))
	if r != nil {
		d.SubVec(d, mat.NewVecDense(q, append([]float64(nil), r...)))
	}
	rv := ols.LinearCov(R, v)
	var ch mat.Cholesky
	if !ch.Factorize(rv) {
		return 0, errors.New("the restrictions' covariance is not positive definite")
	}
	var sol mat.VecDense
	if err := ch.SolveVecTo(&sol, d); err != nil {
		return 0, err
	}
	return mat.Dot(d, &sol), nil
}

// FTest is an F-form Wald test of linear restrictions on the conditional
// error-correction regression.
type FTest struct {
	Name     string
	Stat     float64 // W/q
	DF1, DF2 int
	PValue   float64 // P(F(q, N−K) > Stat)
}

// WaldF tests R b = r on the conditional error-correction coefficients
// with the classical covariance: F = (Rb − r)'(R V R')⁻¹(Rb − r)/q, with
// p-value from F(q, N − K) (exact under normal errors with fixed
// regressors; common practice otherwise).
func (m *Model) WaldF(name string, R *mat.Dense, r []float64) (FTest, error) {
	q, k := R.Dims()
	if k != m.Fit.K {
		return FTest{}, fmt.Errorf("ardl: restriction has %d columns for %d coefficients", k, m.Fit.K)
	}
	w, err := wald(m.Fit.Coef, m.Cov, R, r)
	if err != nil {
		return FTest{}, fmt.Errorf("ardl: %s: %v", name, err)
	}
	f := w / float64(q)
	return FTest{Name: name, Stat: f, DF1: q, DF2: m.Fit.DF(), PValue: distuv.F{D1: float64(q), D2: float64(m.Fit.DF())}.Survival(f)}, nil
}

// Index returns the column of the named term of the conditional
// error-correction regression, or −1.
func (m *Model) Index(name string) int {
	for i, n := range m.Names {
		if n == name {
			return i
		}
	}
	return -1
}
