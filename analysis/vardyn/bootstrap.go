package vardyn

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"sort"
	"sync"

	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
)

// Responses says which impulse responses to compute: up to Horizon
// periods after the shock, orthogonalised with the Cholesky ordering Order
// (nil: the series' own order), or generalised.
type Responses struct {
	Horizon     int
	Generalised bool
	Order       []int
}

// Compute returns the responses Θ_0..Θ_H of the VAR with coefficients a
// and innovation covariance sigma (MA, then Orthogonalised or Generalised).
func (r Responses) Compute(a []*mat.Dense, sigma mat.Symmetric) ([]*mat.Dense, error) {
	phi, err := MA(a, r.Horizon)
	if err != nil {
		return nil, err
	}
	if r.Generalised {
		return Generalised(phi, sigma)
	}
	return Orthogonalised(phi, sigma, r.Order)
}

// Refit re-estimates a model on artificial levels y and returns its VAR
// form and innovation covariance.
type Refit func(y *mat.Dense) (a []*mat.Dense, sigma mat.Symmetric, err error)

// BootSpec sets a bootstrap: replications, seed, workers (0: every core),
// the coverage of the bands (e.g. 0.90), and an optional progress report,
// called from one goroutine with the replications done so far.
type BootSpec struct {
	Reps     int
	Seed     uint64
	Workers  int
	Coverage float64
	Progress func(done, total int)
}

// Bands are pointwise bootstrap confidence bands for impulse responses,
// indexed [s][i][j] (horizon, response, shock) like the responses.
type Bands struct {
	Percentile [2][][][]float64 // lower, upper
	Hall       [2][][][]float64 // lower, upper
	Reps       int              // replications that produced responses
	Failed     int              // replications whose re-estimation failed
}

// Bootstrap computes residual-bootstrap bands for the responses resp of a
// VAR of order p = len(a) fitted to the levels y (T₀×K rows in time), with
// residuals resid (row t belonging to row t + p of y) and re-estimation
// refit (Lütkepohl 2005, §3.7.3 and appendix D.3; Hall 1992, §1.3):
//
//  1. the deterministic part of each fitted row, d_t = y_t − ε̂_t − Σ_i A_i y_{t−i},
//     is kept; the residuals are centred;
//  2. replication b draws ε*_t with replacement from them and builds
//     y*_t = Σ_i A_i y*_{t−i} + d_t + ε*_t recursively from the first p
//     observations of y (the recursive design);
//  3. refit(y*) re-estimates the model — for a VECM the rank is kept and
//     β is estimated again — and its responses θ* are computed as for the
//     estimate θ̂.
//
// With q_a the a-quantile of the θ* (type-7 interpolation), c = Coverage,
// the percentile interval is [q_{(1−c)/2}, q_{(1+c)/2}] and Hall's interval
// [2θ̂ − q_{(1+c)/2}, 2θ̂ − q_{(1−c)/2}]. Replication b draws from its own
// generator, PCG seeded with (Seed, b), so the bands do not depend on the
// number of workers. Replications whose re-estimation fails (a singular
// artificial sample) are left out and counted; if more than half fail the
// bootstrap is an error.
func Bootstrap(y *mat.Dense, a []*mat.Dense, resid *mat.Dense, refit Refit, resp Responses, theta []*mat.Dense, spec BootSpec) (*Bands, error) {
	if y == nil || resid == nil || len(a) == 0 || refit == nil {
		return nil, errors.New("vardyn: the bootstrap needs data, a model and its residuals")
	}
	if spec.Reps < 10 {
		return nil, fmt.Errorf("vardyn: %d bootstrap replications are too few (at least 10)", spec.Reps)
	}
	if !(spec.Coverage > 0 && spec.Coverage < 1) {
		return nil, fmt.Errorf("vardyn: coverage %g is not between 0 and 1", spec.Coverage)
	}
	rows, k := y.Dims()
	p := len(a)
	tr, kr := resid.Dims()
	if kr != k || tr != rows-p {
		return nil, fmt.Errorf("vardyn: %d×%d residuals for %d rows of %d series and %d lags", tr, kr, rows, k, p)
	}
	if len(theta) != resp.Horizon+1 {
		return nil, fmt.Errorf("vardyn: %d response matrices for horizon %d", len(theta), resp.Horizon)
	}
	// Deterministic part and centred residuals.
	det := mat.NewDense(tr, k, nil)
	for t := 0; t < tr; t++ {
		s := t + p
		for i := 0; i < k; i++ {
			v := y.At(s, i) - resid.At(t, i)
			for l := 1; l <= p; l++ {
				for j := 0; j < k; j++ {
					v -= a[l-1].At(i, j) * y.At(s-l, j)
				}
			}
			det.Set(t, i, v)
		}
	}
	eps := mat.DenseCopyOf(resid)
	for i := 0; i < k; i++ {
		var m float64
		for t := 0; t < tr; t++ {
			m += eps.At(t, i)
		}
		m /= float64(tr)
		for t := 0; t < tr; t++ {
			eps.Set(t, i, eps.At(t, i)-m)
		}
	}
	workers := spec.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	n := resp.Horizon + 1
	draws := make([][]float64, spec.Reps) // replication → flattened responses (nil: failed)
	jobs := make(chan int)
	done := make(chan struct{}, spec.Reps)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			ys := mat.NewDense(rows, k, nil)
			for b := range jobs {
				draws[b] = replicate(b, spec.Seed, y, ys, a, det, eps, refit, resp, n, k)
				done <- struct{}{}
			}
		}()
	}
	go func() {
		for b := 0; b < spec.Reps; b++ {
			jobs <- b
		}
		close(jobs)
	}()
	for d := 1; d <= spec.Reps; d++ {
		<-done
		if spec.Progress != nil {
			spec.Progress(d, spec.Reps)
		}
	}
	wg.Wait()
	out := &Bands{}
	var ok [][]float64
	for _, d := range draws {
		if d == nil {
			out.Failed++
		} else {
			ok = append(ok, d)
		}
	}
	out.Reps = len(ok)
	if out.Failed*2 > spec.Reps {
		return nil, fmt.Errorf("vardyn: %d of %d bootstrap replications could not be re-estimated", out.Failed, spec.Reps)
	}
	lo, hi := (1-spec.Coverage)/2, (1+spec.Coverage)/2
	for b := 0; b < 2; b++ {
		out.Percentile[b] = cube(n, k)
		out.Hall[b] = cube(n, k)
	}
	col := make([]float64, len(ok))
	for s := 0; s < n; s++ {
		for i := 0; i < k; i++ {
			for j := 0; j < k; j++ {
				at := (s*k+i)*k + j
				for b, d := range ok {
					col[b] = d[at]
				}
				sort.Float64s(col)
				ql, qh := quantile(col, lo), quantile(col, hi)
				est := theta[s].At(i, j)
				out.Percentile[0][s][i][j], out.Percentile[1][s][i][j] = ql, qh
				out.Hall[0][s][i][j], out.Hall[1][s][i][j] = 2*est-qh, 2*est-ql
			}
		}
	}
	return out, nil
}

// replicate runs replication b; nil when the re-estimation fails.
func replicate(b int, seed uint64, y, ys *mat.Dense, a []*mat.Dense, det, eps *mat.Dense, refit Refit, resp Responses, n, k int) []float64 {
	rng := rand.New(rand.NewPCG(seed, uint64(b)))
	p := len(a)
	tr, _ := eps.Dims()
	// read in place (At and Set check bounds and dispatch at every
	// entry); the arithmetic and its order are the same
	yr, sr, dr, er := y.RawMatrix(), ys.RawMatrix(), det.RawMatrix(), eps.RawMatrix()
	ar := make([]blas64.General, p)
	for l := range a {
		ar[l] = a[l].RawMatrix()
	}
	for t := 0; t < p; t++ {
		copy(sr.Data[t*sr.Stride:t*sr.Stride+k], yr.Data[t*yr.Stride:t*yr.Stride+k])
	}
	for t := 0; t < tr; t++ {
		s := t + p
		e := rng.IntN(tr)
		for i := 0; i < k; i++ {
			v := dr.Data[t*dr.Stride+i] + er.Data[e*er.Stride+i]
			for l := 1; l <= p; l++ {
				al, prev := ar[l-1].Data[i*ar[l-1].Stride:], sr.Data[(s-l)*sr.Stride:]
				for j := 0; j < k; j++ {
					v += al[j] * prev[j]
				}
			}
			sr.Data[s*sr.Stride+i] = v
		}
	}
	as, sig, err := refit(ys)
	if err != nil {
		return nil
	}
	th, err := resp.Compute(as, sig)
	if err != nil {
		return nil
	}
	out := make([]float64, n*k*k)
	for s := 0; s < n; s++ {
		for i := 0; i < k; i++ {
			for j := 0; j < k; j++ {
				v := th[s].At(i, j)
				if math.IsNaN(v) || math.IsInf(v, 0) {
					return nil
				}
				out[(s*k+i)*k+j] = v
			}
		}
	}
	return out
}

func cube(n, k int) [][][]float64 {
	out := make([][][]float64, n)
	for s := range out {
		out[s] = make([][]float64, k)
		for i := range out[s] {
			out[s][i] = make([]float64, k)
		}
	}
	return out
}

// quantile is the type-7 (linear interpolation) quantile of sorted x.
func quantile(x []float64, q float64) float64 {
	h := q * float64(len(x)-1)
	lo := math.Floor(h)
	i := int(lo)
	if i+1 >= len(x) {
		return x[len(x)-1]
	}
	return x[i] + (h-lo)*(x[i+1]-x[i])
}

// VECMRefit re-estimates a VECM of the given case, lagged differences,
// rank and normalisation (with the extra regressors x, rows aligned with
// y) and returns its VAR form and ML innovation covariance Ω̂: the rank is
// kept and β estimated afresh on each artificial sample.
func VECMRefit(c johansen.Case, lags, rank int, norm []int, x johansen.Extra) Refit {
	return func(y *mat.Dense) ([]*mat.Dense, mat.Symmetric, error) {
		r, err := johansen.TestExtra(y, c, lags, x)
		if err != nil {
			return nil, nil, err
		}
		m, err := r.Estimate(rank, norm)
		if err != nil {
			return nil, nil, err
		}
		return m.VARForm(), m.Omega, nil
	}
}

// VARRefit re-estimates a VAR(p) with deterministic terms det.
func VARRefit(p int, det Det) Refit {
	return func(y *mat.Dense) ([]*mat.Dense, mat.Symmetric, error) {
		v, err := Fit(y, p, det)
		if err != nil {
			return nil, nil, err
		}
		return v.A, v.Sigma, nil
	}
}
