// Package bench holds galley's speed measurements: the workloads timed by
// the Go benchmarks in this folder (go test -bench . ./bench/) and by
// bench/cmd/galleybench, which bench/compare.sh runs beside the same
// computations in statsmodels (bench/statsmodels_bench.py) on the same
// data. Figures and the machine they were taken on are in README.md.
//
// The data are generated here by a seeded, documented process (PCG with
// the seeds below, Gaussian innovations), so every run and both programs
// see the same numbers: WriteCSV writes them with 17 significant digits.
package bench

import (
	"fmt"
	"io/fs"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/coint"
	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/ecm"
	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/unitroot"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/internal/atomicfile"
	"github.com/galley-econ/galley/internal/version"
	_ "github.com/galley-econ/galley/kinds"
	"github.com/galley-econ/galley/write/html"
)

// Sizes of the workloads.
const (
	ADFT      = 100_000 // ADF series length
	ADFMaxLag = 12      // AIC chooses among 0..12 lagged differences
	EGT       = 1_000   // Engle–Granger: y on two regressors
	JohT      = 10_000  // Johansen: six series
	JohK      = 6
	JohLags   = 2 // lagged differences in the VECM
	ECMT      = 1_000
)

func gauss(seed uint64) *rand.Rand { return rand.New(rand.NewPCG(seed, 0x9e3779b97f4a7c15)) }

// walk is a Gaussian random walk of length n starting at 0.
func walk(r *rand.Rand, n int) []float64 {
	y := make([]float64, n)
	for i := 1; i < n; i++ {
		y[i] = y[i-1] + r.NormFloat64()
	}
	return y
}

// ar1 is a stationary AR(1) with coefficient phi, started at 0.
func ar1(r *rand.Rand, n int, phi float64) []float64 {
	u := make([]float64, n)
	for i := 1; i < n; i++ {
		u[i] = phi*u[i-1] + r.NormFloat64()
	}
	return u
}

// Data are the benchmark series.
type Data struct {
	ADF []float64 // a random walk, T = ADFT (seed 1)
	// EG: y = 1 + 0.5 x1 − 0.3 x2 + u, x1, x2 random walks, u AR(1)
	// with 0.5, T = EGT (seed 2).
	EGY, EGX1, EGX2 []float64
	// Joh: six series, T = JohT (seed 3): three random walks w1..w3 and
	// w1 + w2 + u4, w2 − w3 + u5, w1 + w3 + u6 with AR(1) 0.5 errors, so
	// the cointegrating rank is 3.
	Joh [][]float64
	// ECM: x a random walk, y = x + u with u AR(1) 0.7 (T = ECMT, seed
	// 4); ECT is the residual of the static regression of y on 1 and x.
	ECMY, ECMX, ECT []float64
}

// Generate makes the benchmark data.
func Generate() *Data {
	d := &Data{}
	d.ADF = walk(gauss(1), ADFT)

	r := gauss(2)
	d.EGX1, d.EGX2 = walk(r, EGT), walk(r, EGT)
	u := ar1(r, EGT, 0.5)
	d.EGY = make([]float64, EGT)
	for i := range d.EGY {
		d.EGY[i] = 1 + 0.5*d.EGX1[i] - 0.3*d.EGX2[i] + u[i]
	}

	r = gauss(3)
	w1, w2, w3 := walk(r, JohT), walk(r, JohT), walk(r, JohT)
	u4, u5, u6 := ar1(r, JohT, 0.5), ar1(r, JohT, 0.5), ar1(r, JohT, 0.5)
	y4, y5, y6 := make([]float64, JohT), make([]float64, JohT), make([]float64, JohT)
	for i := range y4 {
		y4[i], y5[i], y6[i] = w1[i]+w2[i]+u4[i], w2[i]-w3[i]+u5[i], w1[i]+w3[i]+u6[i]
	}
	d.Joh = [][]float64{w1, w2, w3, y4, y5, y6}

	r = gauss(4)
	d.ECMX = walk(r, ECMT)
	u = ar1(r, ECMT, 0.7)
	d.ECMY = make([]float64, ECMT)
	for i := range d.ECMY {
		d.ECMY[i] = d.ECMX[i] + u[i]
	}
	x := mat.NewDense(ECMT, 2, nil)
	for i, v := range d.ECMX {
		x.Set(i, 0, 1)
		x.Set(i, 1, v)
	}
	fit, err := ols.Regress(d.ECMY, x)
	if err != nil {
		panic(err) // cannot happen with this design
	}
	d.ECT = fit.Resid
	return d
}

// JohMatrix is the Johansen data as a T×K matrix.
func (d *Data) JohMatrix() *mat.Dense {
	y := mat.NewDense(JohT, JohK, nil)
	for j, c := range d.Joh {
		for i, v := range c {
			y.Set(i, j, v)
		}
	}
	return y
}

// WriteCSV writes the data for statsmodels_bench.py into dir: adf.csv,
// eg.csv, johansen.csv and ecm.csv, with a header row.
func (d *Data) WriteCSV(dir string) error {
	files := map[string][][]float64{
		"adf.csv":      {d.ADF},
		"eg.csv":       {d.EGY, d.EGX1, d.EGX2},
		"johansen.csv": d.Joh,
		"ecm.csv":      {d.ECMY, d.ECMX, d.ECT},
	}
	heads := map[string]string{"adf.csv": "y", "eg.csv": "y,x1,x2", "johansen.csv": "y1,y2,y3,y4,y5,y6", "ecm.csv": "y,x,ect"}
	for name, cols := range files {
		var b strings.Builder
		b.WriteString(heads[name] + "\n")
		for i := range cols[0] {
			for j, c := range cols {
				if j > 0 {
					b.WriteByte(',')
				}
				b.WriteString(strconv.FormatFloat(c[i], 'g', 17, 64))
			}
			b.WriteByte('\n')
		}
		if err := os.WriteFile(filepath.Join(dir, name), []byte(b.String()), 0o644); err != nil {
			return err
		}
	}
	return nil
}

// ADF runs the augmented Dickey–Fuller test with a constant, AIC over
// 0..12 lagged differences (the same test as statsmodels' adfuller(y,
// maxlag=12, regression="c", autolag="AIC")).
func ADF(d *Data) (*unitroot.ADFResult, error) {
	return unitroot.ADF(d.ADF, critical.Const, unitroot.LagRule{Select: unitroot.AIC, Max: ADFMaxLag})
}

// EngleGranger runs the Engle–Granger test of y on x1, x2 with a
// constant, AIC over 0..12 lags in the residual regression (statsmodels:
// coint(y, [x1, x2], trend="c", maxlag=12, autolag="aic")).
func EngleGranger(d *Data) (*coint.EGResult, error) {
	return coint.EngleGranger(d.EGY, [][]float64{d.EGX1, d.EGX2}, critical.Const, unitroot.LagRule{Select: unitroot.AIC, Max: ADFMaxLag})
}

// Johansen runs the rank tests on the six series with an unrestricted
// constant (case c) and two lagged differences, with the statistics and
// their critical values (statsmodels: coint_johansen(y, det_order=0,
// k_ar_diff=2)).
func Johansen(y *mat.Dense) (*johansen.Result, error) {
	r, err := johansen.Test(y, johansen.C, JohLags)
	if err != nil {
		return nil, err
	}
	r.Statistics(false)
	if _, err := r.Critical(johansen.TraceStat); err != nil {
		return nil, err
	}
	if _, err := r.Critical(johansen.MaxEigStat); err != nil {
		return nil, err
	}
	return r, nil
}

// ECM fits Δy_t = μ + α ect_{t−1} + φ Δy_{t−1} + θ0 Δx_t + θ1 Δx_{t−1} + ε_t
// by least squares with the usual standard errors (statsmodels: OLS on
// the same columns, built with numpy).
func ECM(d *Data) (*ecm.Model, error) {
	return ecm.Estimate(ecm.Input{Y: d.ECMY, X: [][]float64{d.ECMX}, ECT: d.ECT}, ecm.Spec{YLags: 1, XLags: 1})
}

// CopyDemo copies the demo project at src (examples/gridlink) into dst,
// without its outputs (out/) and cache (.galley-cache/), and returns the
// manuscript's path in dst.
func CopyDemo(src, dst string) (string, error) {
	err := filepath.WalkDir(src, func(p string, e fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		rel, _ := filepath.Rel(src, p)
		if e.IsDir() {
			if rel == "out" || rel == ".galley-cache" || rel == "gen" {
				return filepath.SkipDir
			}
			return os.MkdirAll(filepath.Join(dst, rel), 0o755)
		}
		b, err := os.ReadFile(p)
		if err != nil {
			return err
		}
		return os.WriteFile(filepath.Join(dst, rel), b, 0o644)
	})
	return filepath.Join(dst, "paper.md"), err
}

// Phases are the wall-clock times of the steps of a Build.
type Phases struct {
	Parse, Run, Render, Write time.Duration
}

// Total is the whole build.
func (p Phases) Total() time.Duration { return p.Parse + p.Run + p.Render + p.Write }

// Build builds the manuscript as `galley build` does by default: parse,
// run every directive (through the result cache in <manuscript
// folder>/.galley-cache when cache is true, keyed by version.BuildID),
// render HTML and the results file in memory, and write them with the
// figures (SVG and PDF) into out/ beside the manuscript through one
// atomicfile.Set. It returns the document and the time of each step.
func Build(manuscript string, cache bool) (*engine.Document, Phases, error) {
	return BuildFresh(manuscript, cache, false)
}

// BuildFresh is Build, ignoring stored results when fresh is set (as
// `galley build --fresh`: every directive runs and its result is stored).
func BuildFresh(manuscript string, cache, fresh bool) (*engine.Document, Phases, error) {
	var ph Phases
	t0 := time.Now()
	dir := filepath.Dir(manuscript)
	var opts engine.Options
	if cache {
		cd := filepath.Join(dir, ".galley-cache")
		opts.Cache = &engine.Cache{Dir: cd, Version: version.BuildID(cd), Fresh: fresh}
	}
	doc, err := engine.Parse(manuscript, opts)
	if err != nil {
		return nil, ph, err
	}
	t1 := time.Now()
	ph.Parse = t1.Sub(t0)
	if err := doc.Run(); err != nil {
		return nil, ph, err
	}
	t2 := time.Now()
	ph.Run = t2.Sub(t1)
	base := strings.TrimSuffix(filepath.Base(manuscript), filepath.Ext(manuscript))
	files := map[string][]byte{}
	if files[base+".results.json"], err = doc.ResultsJSON(version.Version); err != nil {
		return nil, ph, err
	}
	if files[base+".html"], err = html.Write(doc, html.Options{Version: version.Version}); err != nil {
		return nil, ph, err
	}
	for _, r := range doc.Results() {
		if r.Figure != nil {
			files[filepath.Join(engine.FigureFolder, r.ID+".svg")] = r.Figure.SVG
			files[filepath.Join(engine.FigureFolder, r.ID+".pdf")] = r.Figure.PDF
		}
	}
	t3 := time.Now()
	ph.Render = t3.Sub(t2)
	var set atomicfile.Set
	out := filepath.Join(dir, "out")
	for name, b := range files {
		if err := set.Stage(filepath.Join(out, name), b); err != nil {
			set.Abort()
			return nil, ph, err
		}
	}
	if err := set.Commit(); err != nil {
		return nil, ph, fmt.Errorf("writing outputs: %w", err)
	}
	ph.Write = time.Since(t3)
	return doc, ph, nil
}
