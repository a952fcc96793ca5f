package dynamics

import (
	"fmt"
	"os"
	"strings"
	"sync"
	"time"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/plot/vg"

	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/analysis/vardyn"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/figures"
)

// responsesSpec is the responses kind: impulse responses drawn as one
// panel per (response, shock) pair, response-major, with bootstrap bands
// or asymptotic delta-method bands.
type responsesSpec struct {
	engine.Common `yaml:",inline"`
	SourceKeys    `yaml:",inline"`
	Horizon       *int     `yaml:"horizon"`
	Identify      string   `yaml:"identify"`
	Order         []string `yaml:"order"`
	Responses     []string `yaml:"responses"`
	Shocks        []string `yaml:"shocks"`
	Bands         string   `yaml:"bands"`
	Reps          int      `yaml:"replications" formerly:"reps"`
	Seed          *uint64  `yaml:"seed"`
	Coverage      *float64 `yaml:"coverage"`
	Interval      string   `yaml:"interval"`
	Width         float64  `yaml:"width"`
	Height        float64  `yaml:"height"`
}

func (s *responsesSpec) horizon() int {
	if s.Horizon == nil {
		return 20
	}
	return *s.Horizon
}

func (s *responsesSpec) identify() string {
	if s.Identify == "" {
		return "cholesky"
	}
	return strings.ToLower(s.Identify)
}

func (s *responsesSpec) interval() string {
	if s.Interval == "" {
		return "percentile"
	}
	return strings.ToLower(s.Interval)
}

// bands returns the band method: bootstrap (the default; bands only
// with replications:) or asymptotic.
func (s *responsesSpec) bands() string {
	if s.Bands == "" {
		return "bootstrap"
	}
	return strings.ToLower(strings.TrimSpace(s.Bands))
}

func (s *responsesSpec) asymptotic() bool { return s.bands() == "asymptotic" }

func (s *responsesSpec) coverage() float64 {
	if s.Coverage == nil {
		return 0.90
	}
	return *s.Coverage
}

func (s *responsesSpec) Check(c *engine.Context) error {
	if err := s.SourceKeys.check(c); err != nil {
		return err
	}
	if h := s.horizon(); h < 1 || h > 200 {
		return c.Errorf("horizon", "horizon must be 1–200 periods, not %d", h)
	}
	if id := s.identify(); id != "cholesky" && id != "generalised" {
		return c.Errorf("identify", "identify: write cholesky (orthogonalised shocks in the order given by order:) or generalised (Pesaran–Shin), not %q", s.Identify)
	}
	if s.identify() == "generalised" && len(s.Order) > 0 {
		return c.Errorf("order", "order: generalised responses do not depend on an ordering; drop order or use identify: cholesky")
	}
	if s.Reps != 0 && (s.Reps < 100 || s.Reps > 100000) {
		return c.Errorf("replications", "replications: bootstrap bands need 100–100,000 replications (0 for none), not %d", s.Reps)
	}
	if cv := s.coverage(); !(cv >= 0.5 && cv < 1) {
		return c.Errorf("coverage", "coverage must be at least 0.5 and below 1, not %g", cv)
	}
	if iv := s.interval(); iv != "percentile" && iv != "hall" {
		return c.Errorf("interval", "interval: write percentile or hall, not %q", s.Interval)
	}
	switch s.bands() {
	case "bootstrap":
		if c.Has("bands") && s.Reps == 0 {
			return c.Errorf("bands", "bands: bootstrap bands need replications: (100–100,000)")
		}
	case "asymptotic":
		for _, k := range []string{"replications", "seed", "interval"} {
			if c.Has(k) {
				return c.Errorf(k, "%s: belongs to bootstrap bands; drop it with bands: asymptotic", k)
			}
		}
		return nil
	default:
		return c.Errorf("bands", "bands: write bootstrap (residual bootstrap, with replications:) or asymptotic (delta method), not %q", s.Bands)
	}
	if s.Reps == 0 {
		for _, k := range []string{"seed", "coverage", "interval"} {
			if c.Has(k) {
				return c.Errorf(k, "%s: there are no bands without reps: (the bootstrap replications) or bands: asymptotic", k)
			}
		}
	}
	return nil
}

// Run computes the responses (and their bootstrap bands) and returns the
// figure, one panel per pair, with the values.
func (s *responsesSpec) Run(c *engine.Context) (*engine.Result, error) {
	m, err := s.fit(c)
	if err != nil {
		return nil, err
	}
	order, err := s.order(c, m)
	if err != nil {
		return nil, err
	}
	resp := vardyn.Responses{Horizon: s.horizon(), Generalised: s.identify() == "generalised", Order: order}
	theta, err := resp.Compute(m.a, m.sigma)
	if err != nil {
		return nil, c.Errorf("", "%v", strings.TrimPrefix(err.Error(), "vardyn: "))
	}
	ri, err := c.SeriesIndices("responses", s.Responses, m.names)
	if err != nil {
		return nil, err
	}
	si, err := c.SeriesIndices("shocks", s.Shocks, m.names)
	if err != nil {
		return nil, err
	}
	seed := uint64(1)
	if s.Seed != nil {
		seed = *s.Seed
	}
	bands, err := s.bootstrap(c, m, resp, theta, seed)
	if err != nil {
		return nil, err
	}
	p := s.paths(theta, bands, resp.Horizon)
	if s.asymptotic() {
		if p, err = s.normalBands(c, m, resp, theta); err != nil {
			return nil, err
		}
	}
	vals := s.values(m, p, order, bands, seed)
	fig, err := s.figure(c, m, p, ri, si)
	if err != nil {
		return nil, err
	}
	notes := []string{s.note(m, p, bands)}
	res, err := renderFigure(c, fig, vals, notes)
	if err == nil {
		if s.identify() == "generalised" {
			res.Cites = append(res.Cites, "pesaran-shin-1998")
		}
		if s.asymptotic() {
			res.Cites = append(res.Cites, "lutkepohl-2005")
		}
	}
	return res, err
}

// normalBands returns the reader of the responses theta with asymptotic
// bands: θ̂ ± z·se, the standard errors by the delta method from the
// least-squares VAR (analysis/vardyn.ResponseStdErr) or from the VECM in
// its VAR form (vardyn.VECMResponseStdErr).
func (s *responsesSpec) normalBands(c *engine.Context, m *model, resp vardyn.Responses, theta []*mat.Dense) (irfPaths, error) {
	p := irfPaths{theta: theta, horizon: resp.Horizon}
	var se []*mat.Dense
	var err error
	switch {
	case m.varm != nil:
		se, err = m.varm.ResponseStdErr(resp)
	case m.vecm != nil:
		se, err = vardyn.VECMResponseStdErr(m.vecm, resp)
	default:
		return p, c.Errorf("bands", "bands: asymptotic bands need an estimated VAR or VECM")
	}
	if err != nil {
		return p, c.Errorf("bands", "%v", strings.TrimPrefix(err.Error(), "vardyn: "))
	}
	b, err := vardyn.AsymptoticBands(theta, se, s.coverage())
	if err != nil {
		return p, c.Errorf("coverage", "%v", strings.TrimPrefix(err.Error(), "vardyn: "))
	}
	p.lo, p.hi, p.se, p.z, p.bands = b.Lower, b.Upper, se, b.Z, true
	return p, nil
}

// order returns the Cholesky ordering as indices into the series (nil
// when order: is not given), or an error unless it names all of them.
func (s *responsesSpec) order(c *engine.Context, m *model) ([]int, error) {
	if len(s.Order) == 0 {
		return nil, nil
	}
	if k := len(m.names); len(s.Order) != k {
		return nil, c.Errorf("order", "order: name all %d series, first the one whose shock moves the others on impact", k)
	}
	return c.SeriesIndices("order", s.Order, m.names)
}

// bootstrap returns the bootstrap bands of the responses theta (nil
// without reps:), reporting the progress of a long run.
func (s *responsesSpec) bootstrap(c *engine.Context, m *model, resp vardyn.Responses, theta []*mat.Dense, seed uint64) (*vardyn.Bands, error) {
	if s.Reps <= 0 {
		return nil, nil
	}
	prog := newProgress(fmt.Sprintf("galley: %s %s: bootstrap", c.Kind(), c.ID()))
	bands, err := vardyn.Bootstrap(m.levels, m.a, m.resid, m.refit, resp, theta,
		vardyn.BootSpec{Reps: s.Reps, Seed: seed, Coverage: s.coverage(), Progress: prog.update})
	prog.finish(err)
	if err != nil {
		return nil, c.Errorf("replications", "%v", strings.TrimPrefix(err.Error(), "vardyn: "))
	}
	return bands, nil
}

// irfPaths reads the responses and their bands (the interval: asked for)
// along the horizons 0 … horizon.
type irfPaths struct {
	theta   []*mat.Dense
	lo, hi  [][][]float64 // nil without bands
	se      []*mat.Dense  // asymptotic standard errors (nil for bootstrap bands)
	z       float64       // their normal quantile
	bands   bool
	horizon int
}

// paths returns the reader of the responses theta and of bands (nil
// without reps:).
func (s *responsesSpec) paths(theta []*mat.Dense, bands *vardyn.Bands, horizon int) irfPaths {
	p := irfPaths{theta: theta, bands: bands != nil, horizon: horizon}
	if bands == nil {
		return p
	}
	b := bands.Percentile
	if s.interval() == "hall" {
		b = bands.Hall
	}
	p.lo, p.hi = b[0], b[1]
	return p
}

// at returns src(h, i, j) over the horizons 0 … horizon.
func (p irfPaths) at(src func(h, i, j int) float64, i, j int) []float64 {
	out := make([]float64, p.horizon+1)
	for h := range out {
		out[h] = src(h, i, j)
	}
	return out
}

// est, lower and upper return the response of series i to shock j and
// its band's ends over the horizons.
func (p irfPaths) est(i, j int) []float64 {
	return p.at(func(h, i, j int) float64 { return p.theta[h].At(i, j) }, i, j)
}

func (p irfPaths) lower(i, j int) []float64 {
	return p.at(func(h, i, j int) float64 { return p.lo[h][i][j] }, i, j)
}

func (p irfPaths) upper(i, j int) []float64 {
	return p.at(func(h, i, j int) float64 { return p.hi[h][i][j] }, i, j)
}

func (p irfPaths) stderr(i, j int) []float64 {
	return p.at(func(h, i, j int) float64 { return p.se[h].At(i, j) }, i, j)
}

// values returns the results-file values: irf.RESPONSE.SHOCK (a list over
// horizons 0 … H), with lower and upper and the bootstrap's settings when
// there are bootstrap bands, or lower, upper, stderr and coverage when
// there are asymptotic bands.
func (s *responsesSpec) values(m *model, p irfPaths, order []int, bands *vardyn.Bands, seed uint64) map[string]any {
	irf, lower, upper, stderr := map[string]any{}, map[string]any{}, map[string]any{}, map[string]any{}
	for i, rn := range m.names {
		ir, lr, ur, sr := map[string]any{}, map[string]any{}, map[string]any{}, map[string]any{}
		for j, sn := range m.names {
			ir[sn] = p.est(i, j)
			if p.bands {
				lr[sn] = p.lower(i, j)
				ur[sn] = p.upper(i, j)
			}
			if p.se != nil {
				sr[sn] = p.stderr(i, j)
			}
		}
		irf[rn], lower[rn], upper[rn], stderr[rn] = ir, lr, ur, sr
	}
	vals := map[string]any{"irf": irf, "horizon": p.horizon, "identify": s.identify(), "series": m.names, "model": m.desc}
	if order != nil {
		vals["order"] = s.Order
	}
	if bands != nil {
		vals["lower"], vals["upper"] = lower, upper
		vals["reps"], vals["failed"], vals["seed"], vals["coverage"], vals["interval"] = bands.Reps, bands.Failed, seed, s.coverage(), s.interval()
	}
	if p.se != nil {
		vals["lower"], vals["upper"], vals["stderr"], vals["coverage"] = lower, upper, stderr, s.coverage()
	}
	return vals
}

// figure returns the chart: one panel per (response ri, shock si) pair,
// response-major, the periods after the shock on the horizontal axis.
func (s *responsesSpec) figure(c *engine.Context, m *model, p irfPaths, ri, si []int) (*figures.Figure, error) {
	dates := make([]series.Date, p.horizon+1)
	for h := range dates {
		dates[h] = series.Date{Freq: series.Undated, Sub: h}
	}
	var panels []figures.Panel
	var labels []string
	for _, i := range ri {
		for _, j := range si {
			ss := []series.Series{{Name: "response", Dates: dates, Values: p.est(i, j)}}
			if p.bands {
				ss = append(ss,
					series.Series{Name: fmt.Sprintf("%s band", pctText(s.coverage())), Dates: dates, Values: p.lower(i, j)},
					series.Series{Name: "", Dates: dates, Values: p.upper(i, j)})
			}
			// "RESPONSE to SHOCK": plain text, which every output font
			// (the PDF's included) can set.
			panels = append(panels, figures.Panel{Series: ss, YLabel: m.names[i] + " to " + m.names[j]})
			labels = append(labels, m.names[i]+" to "+m.names[j])
		}
	}
	o := figures.Options{Width: s.Width, Height: s.Height, XLabel: "Periods after the shock", PanelLabels: labels, Legend: figures.LegendNone}
	rows := len(panels)
	if len(ri) > 1 && len(si) > 1 {
		// a grid: a row per response, a column per shock
		o.Columns, rows = len(si), len(ri)
		if s.Width == 0 {
			o.Width = min(max(2.2*float64(len(si)), 3.4), 6.5)
		}
	}
	if s.Height == 0 {
		o.Height = min(1.3*float64(rows)+0.2*float64(o.Columns), 39)
	}
	fig, err := figures.Panels(panels, o)
	if err != nil {
		return nil, c.Errorf("", "%v", err)
	}
	return fig, nil
}

// renderFigure returns the result of a drawn figure: its size in vals, and
// unless nested (a revision's build of another vintage, which compares
// values only) its SVG and PDF and their files.
func renderFigure(c *engine.Context, fig *figures.Figure, vals map[string]any, notes []string) (*engine.Result, error) {
	return engine.DrawnFigure(c, fig, float64(fig.Width/vg.Inch), float64(fig.Height/vg.Inch), vals, notes)
}

// note returns the figure's note: the responses, the identification and
// the bands.
func (s *responsesSpec) note(m *model, p irfPaths, b *vardyn.Bands) string {
	var sb strings.Builder
	fmt.Fprintf(&sb, "Responses of %s over %d periods, from %s. ", strings.Join(m.names, ", "), s.horizon(), m.desc)
	if s.identify() == "generalised" {
		sb.WriteString("Generalised responses (Pesaran and Shin 1998) to a one-standard-deviation shock in each series' innovation; they do not depend on an ordering. ")
	} else {
		ord := m.names
		if len(s.Order) > 0 {
			ord = s.Order
		}
		fmt.Fprintf(&sb, "Orthogonalised responses to one-standard-deviation shocks, Cholesky ordering %s. ", strings.Join(ord, ", "))
	}
	if b != nil {
		iv := "percentile"
		if s.interval() == "hall" {
			iv = "Hall's"
		}
		fmt.Fprintf(&sb, "Bands: pointwise %s %s intervals from %d residual-bootstrap replications (recursive design", pctText(s.coverage()), iv, b.Reps)
		if m.vecm != nil {
			sb.WriteString(", the VECM re-estimated at its rank with a fresh β each time")
		}
		sb.WriteString(")")
		if b.Failed > 0 {
			fmt.Fprintf(&sb, "; %d replications could not be re-estimated and are left out", b.Failed)
		}
		sb.WriteString(".")
	}
	if p.se != nil {
		fmt.Fprintf(&sb, "Bands: pointwise %s asymptotic intervals, the response ± %.3f standard errors from the delta method (Lütkepohl 2005, Proposition 3.6", pctText(s.coverage()), p.z)
		if s.identify() == "generalised" {
			sb.WriteString(", applied to the generalised responses")
		}
		if m.vecm != nil {
			sb.WriteString("), from the covariance of the VAR-form coefficients with β fixed at its estimate (Lütkepohl 2005, ch. 7 and 9) and, for normal errors, that of the ML residual covariance matrix.")
		} else {
			sb.WriteString("), from the least-squares covariance of the lag coefficients and, for normal errors, that of the residual covariance matrix (estimated with T − Kp − d degrees of freedom).")
		}
	}
	return sb.String()
}

func pctText(p float64) string {
	return strings.TrimSuffix(strings.TrimRight(fmt.Sprintf("%.2f", p*100), "0"), ".") + "%"
}

// progress reports a long bootstrap on stderr: nothing for the first
// second, then a line at each quarter of the replications and at the end.
type progress struct {
	mu    sync.Mutex
	label string
	start time.Time
	next  int
	shown bool
}

func newProgress(label string) *progress { return &progress{label: label, start: time.Now(), next: 1} }

func (p *progress) update(done, total int) {
	p.mu.Lock()
	defer p.mu.Unlock()
	el := time.Since(p.start)
	if el < time.Second || done >= total {
		return
	}
	if q := 4 * done / total; q >= p.next {
		p.next = q + 1
		p.shown = true
		fmt.Fprintf(os.Stderr, "%s %d%% of %d replications after %s\n", p.label, 100*done/total, total, el.Round(100*time.Millisecond))
	}
}

func (p *progress) finish(err error) {
	if p.shown && err == nil {
		fmt.Fprintf(os.Stderr, "%s done in %s\n", p.label, time.Since(p.start).Round(100*time.Millisecond))
	}
}
