package johansen

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"runtime"
	"sort"
	"sync"

	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/mat"
)

// RankBootSpec sets the wild bootstrap of the rank tests: replications
// per rank, the seed, the workers (0: every core) and an optional progress
// report, called from one goroutine with the replications done so far.
type RankBootSpec struct {
	Reps     int
	Seed     uint64
	Workers  int
	Progress func(done, total int)
}

// RankBoot holds the wild bootstrap trace tests, one entry per rank
// r = 0..K−1.
type RankBoot struct {
	// PValue[r] is the bootstrap p-value of the trace statistic for H(r):
	// the share of the bootstrap statistics Q*_{r,b} that exceed Trace[r].
	PValue []float64
	// Reps[r] counts the replications that gave a statistic; Failed[r]
	// those whose artificial sample could not be analysed (singular).
	Reps, Failed []int
	// RootsOK[r] reports whether the VAR estimated under H(r) satisfies the
	// root condition the bootstrap algorithm checks first: K−r unit roots
	// and every other root of the companion matrix inside the unit circle
	// (Cavaliere, Rahbek and Taylor 2012). When it fails the bootstrap
	// sample may be explosive and the p-value is not to be trusted.
	RootsOK []bool
	// MaxRoot[r] is the largest modulus among those other roots.
	MaxRoot []float64
	// Mean[r] is the mean of the Reps[r] bootstrap statistics Q*_{r,b}
	// (BootMean): the bootstrap estimate of the finite-sample mean of the
	// trace statistic under H(r), used by the Bartlett correction
	// (BartlettTrace).
	Mean []float64
}

// Rank is the sequential bootstrap choice of rank at level: the first r
// whose bootstrap p-value exceeds level (K if none).
func (b *RankBoot) Rank(level float64) int {
	for r, p := range b.PValue {
		if p > level {
			return r
		}
	}
	return len(b.PValue)
}

// nullModel is the VECM estimated under H(r), on the scaled series, in the
// form the recursion needs: its VAR coefficients A_1..A_{k+1}, the
// deterministic part of each fitted row and the residuals.
type nullModel struct {
	rank   int
	y      *mat.Dense   // scaled levels (rows of the original sample)
	a      []*mat.Dense // A_1..A_{k+1}
	det    *mat.Dense   // T×K: y_s − ε̂_t − Σ A_l y_{s−l}, s = t + k + 1
	resid  *mat.Dense   // T×K: ε̂_{r,t}
	lags   int
	maxMod float64 // largest modulus of the roots beyond the K−r unit roots
}

// WildBootstrapRank returns wild bootstrap p-values of the trace tests
// (the recursive bootstrap algorithm of Cavaliere, Rahbek and Taylor 2012,
// with wild errors in place of i.i.d. resampling, which keeps the test
// valid under heteroskedasticity: Cavaliere, Rahbek and Taylor 2014; the
// references are given from memory). y and x must be the levels and extra
// regressors the Result was computed from. For each r = 0..K−1:
//
//  1. the VECM is estimated under H(r) by reduced-rank regression —
//     β̂^{(r)} the first r eigenvectors, α̂^{(r)}, Γ̂^{(r)} and the
//     unrestricted terms by least squares given β̂^{(r)} (α = 0 when r = 0)
//     — with residuals ε̂_{r,t};
//  2. replication b draws Rademacher weights w_t (±1 with probability ½
//     each) and sets ε*_t = w_t ε̂_{r,t};
//  3. the bootstrap sample is built recursively from the first k + 1
//     observations of y with the estimates of step 1:
//     y*_t = Σ_{i=1}^{k+1} Â_i y*_{t−i} + d̂_t + ε*_t, where Â_i is the VAR
//     form of the VECM under H(r) and d̂_t its estimated deterministic and
//     extra-regressor part at t (restricted and unrestricted alike);
//  4. the trace statistic Q*_{r,b} for H(r) against H(K) is computed on
//     y* with the same case, lags and extra regressors.
//
// The p-value is p*_r = #{b : Q*_{r,b} > Q_r} / B, Q_r = Trace[r], and
// the same statistics give m̂_T(r) = (1/B) Σ_b Q*_{r,b} (RankBoot.Mean, for
// the Bartlett correction BartlettTrace; failed replications are left out
// of both); the
// sequential procedure (RankBoot.Rank) takes the first r with p*_r above
// the level. Replication b of rank r draws from its own PCG generator
// seeded with (Seed, r·2³² + b), so the result does not depend on the
// number of workers. The computation runs on the internally scaled series
// (the trace statistic does not depend on the units).
func (r *Result) WildBootstrapRank(y *mat.Dense, x Extra, spec RankBootSpec) (*RankBoot, error) {
	if spec.Reps < 10 {
		return nil, fmt.Errorf("johansen: %d bootstrap replications are too few (at least 10)", spec.Reps)
	}
	if y == nil {
		return nil, errors.New("johansen: no data")
	}
	if rows, k := y.Dims(); k != r.K || rows != r.T+r.Lags+1 {
		return nil, fmt.Errorf("johansen: %d×%d levels for a system of %d series estimated on %d rows", rows, k, r.K, r.T+r.Lags+1)
	}
	ys := scaleColumns(y, r.scale)
	nulls := make([]*nullModel, r.K)
	out := &RankBoot{PValue: make([]float64, r.K), Reps: make([]int, r.K), Failed: make([]int, r.K),
		RootsOK: make([]bool, r.K), MaxRoot: make([]float64, r.K), Mean: make([]float64, r.K)}
	for rank := 0; rank < r.K; rank++ {
		m, err := r.nullModel(ys, rank)
		if err != nil {
			return nil, err
		}
		nulls[rank] = m
		out.MaxRoot[rank] = m.maxMod
		out.RootsOK[rank] = m.maxMod < 1-1e-8
	}
	workers := spec.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	total := r.K * spec.Reps
	stats := make([]float64, total)
	jobs := make(chan int)
	done := make(chan struct{}, total)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			buf := mat.NewDense(r.T+r.Lags+1, r.K, nil)
			wts := make([]float64, r.T)
			for j := range jobs {
				rank, b := j/spec.Reps, j%spec.Reps
				rng := rand.New(rand.NewPCG(spec.Seed, uint64(rank)<<32|uint64(b)))
				for t := range wts {
					wts[t] = 1
					if rng.Uint64()&1 == 1 {
						wts[t] = -1
					}
				}
				q, err := nulls[rank].replicate(wts, buf, r.Case, x)
				if err != nil {
					q = math.NaN()
				}
				stats[j] = q
				done <- struct{}{}
			}
		}()
	}
	go func() {
		for j := 0; j < total; j++ {
			jobs <- j
		}
		close(jobs)
	}()
	for d := 1; d <= total; d++ {
		<-done
		if spec.Progress != nil {
			spec.Progress(d, total)
		}
	}
	wg.Wait()
	for rank := 0; rank < r.K; rank++ {
		exceed := 0
		for _, q := range stats[rank*spec.Reps : (rank+1)*spec.Reps] {
			switch {
			case math.IsNaN(q):
				out.Failed[rank]++
			case q > r.Trace[rank]:
				exceed++
				out.Reps[rank]++
			default:
				out.Reps[rank]++
			}
		}
		if out.Failed[rank]*2 > spec.Reps {
			return nil, fmt.Errorf("johansen: %d of %d bootstrap samples for rank %d could not be analysed", out.Failed[rank], spec.Reps, rank)
		}
		out.PValue[rank] = float64(exceed) / float64(out.Reps[rank])
		out.Mean[rank], _ = BootMean(stats[rank*spec.Reps : (rank+1)*spec.Reps])
	}
	return out, nil
}

// nullModel estimates the VECM under H(rank) on the scaled problem and
// returns it in VAR form with its deterministic part and residuals.
func (r *Result) nullModel(ys *mat.Dense, rank int) (*nullModel, error) {
	t, k := r.T, r.K
	ns := r.shortCols()
	alpha := mat.NewDense(k, max(rank, 1), nil)
	short := mat.NewDense(k, max(ns, 1), nil)
	resid := mat.NewDense(t, k, nil)
	if rank+ns == 0 {
		row := make([]float64, r.dz.n)
		for h := 0; h < t; h++ {
			r.dz.row(h, row)
			resid.SetRow(h, row[r.dz.ns+r.dz.p1:])
		}
	} else {
		fits, res, err := r.shortFit(r.vs, rank)
		if err != nil {
			return nil, fmt.Errorf("johansen: the short-run equations under rank %d: %v", rank, err)
		}
		for i, f := range fits {
			for j := 0; j < rank; j++ {
				alpha.Set(i, j, f.Coef[j])
			}
			for j := 0; j < ns; j++ {
				short.Set(i, j, f.Coef[rank+j])
			}
			resid.SetCol(i, res[i])
		}
	}
	// VAR form: A_1 = I + αβ_y' + Γ_1, A_i = Γ_i − Γ_{i−1}, A_{k+1} = −Γ_k.
	lags := r.Lags
	gamma := make([]*mat.Dense, lags+1)
	for l := 1; l <= lags; l++ {
		gamma[l] = mat.NewDense(k, k, nil)
	}
	for c, tm := range r.Terms() {
		if tm.Kind == LagDiff {
			for i := 0; i < k; i++ {
				gamma[tm.Lag].Set(i, tm.Series, short.At(i, c))
			}
		}
	}
	a := make([]*mat.Dense, lags+1)
	for i := range a {
		a[i] = mat.NewDense(k, k, nil)
	}
	for i := 0; i < k; i++ {
		a[0].Set(i, i, 1)
	}
	if rank > 0 {
		var pi mat.Dense
		pi.Mul(alpha.Slice(0, k, 0, rank), r.vs.Slice(0, k, 0, rank).T())
		a[0].Add(a[0], &pi)
	}
	if lags >= 1 {
		a[0].Add(a[0], gamma[1])
		for i := 2; i <= lags; i++ {
			a[i-1].Sub(gamma[i], gamma[i-1])
		}
		a[lags].Scale(-1, gamma[lags])
	}
	det := mat.NewDense(t, k, nil)
	for tt := 0; tt < t; tt++ {
		s := tt + lags + 1
		for i := 0; i < k; i++ {
			v := ys.At(s, i) - resid.At(tt, i)
			for l := 1; l <= lags+1; l++ {
				for j := 0; j < k; j++ {
					v -= a[l-1].At(i, j) * ys.At(s-l, j)
				}
			}
			det.Set(tt, i, v)
		}
	}
	mods := rootModuli(a)
	m := &nullModel{rank: rank, y: ys, a: a, det: det, resid: resid, lags: lags}
	if u := k - rank; u < len(mods) {
		m.maxMod = mods[u]
	}
	return m, nil
}

// replicate builds one bootstrap sample with the weights w (one per
// fitted row) into buf and returns its trace statistic for H(rank).
func (m *nullModel) replicate(w []float64, buf *mat.Dense, c Case, x Extra) (float64, error) {
	t, k := m.resid.Dims()
	p := m.lags + 1
	// read in place (At and Set check bounds and dispatch at every
	// entry); the arithmetic and its order are the same
	yr, br, dr, rr := m.y.RawMatrix(), buf.RawMatrix(), m.det.RawMatrix(), m.resid.RawMatrix()
	ar := make([]blas64.General, p)
	for l := range ar {
		ar[l] = m.a[l].RawMatrix()
	}
	for s := 0; s < p; s++ {
		copy(br.Data[s*br.Stride:s*br.Stride+k], yr.Data[s*yr.Stride:s*yr.Stride+k])
	}
	for tt := 0; tt < t; tt++ {
		s := tt + p
		for i := 0; i < k; i++ {
			v := dr.Data[tt*dr.Stride+i] + w[tt]*rr.Data[tt*rr.Stride+i]
			for l := 1; l <= p; l++ {
				al, prev := ar[l-1].Data[i*ar[l-1].Stride:], br.Data[(s-l)*br.Stride:]
				for j := 0; j < k; j++ {
					v += al[j] * prev[j]
				}
			}
			br.Data[s*br.Stride+i] = v
		}
	}
	res, err := TestExtra(buf, c, m.lags, x)
	if err != nil {
		return 0, err
	}
	return res.Trace[m.rank], nil
}

// Companion is the companion matrix of a VAR with coefficients
// A_1 … A_p (each K×K),
//
//	F = [A_1 A_2 … A_p; I 0 … 0; …; 0 … I 0]  (Kp×Kp)
//
// (Lütkepohl 2005, §2.1.1), in which y_t = A_1 y_{t−1} + … + A_p y_{t−p}
// is the first block row of Y_t = F Y_{t−1}, Y_t = (y_t', …, y_{t−p+1}')'.
func Companion(a []*mat.Dense) (*mat.Dense, error) {
	if len(a) == 0 {
		return nil, errors.New("johansen: no VAR coefficients")
	}
	k, kc := a[0].Dims()
	if k != kc {
		return nil, fmt.Errorf("johansen: VAR coefficient of %d×%d is not square", k, kc)
	}
	n := k * len(a)
	f := mat.NewDense(n, n, nil)
	for l, al := range a {
		if r, c := al.Dims(); r != k || c != k {
			return nil, fmt.Errorf("johansen: VAR coefficient %d is %d×%d, not %d×%d", l+1, r, c, k, k)
		}
		f.Slice(0, k, l*k, (l+1)*k).(*mat.Dense).Copy(al)
	}
	for i := k; i < n; i++ {
		f.Set(i, i-k, 1)
	}
	return f, nil
}

// CompanionRoots returns the eigenvalues of the companion matrix of the
// VAR y_t = Σ_{i=1}^{p} A_i y_{t−i} + …,
//
//	F = [A_1 A_2 … A_p; I 0 … 0; …; 0 … I 0]  (Kp×Kp),
//
// sorted by modulus, largest first (Lütkepohl 2005, §2.1.1: the process is
// stable when every root has modulus below one; the VAR form of a VECM of
// rank r has exactly K − r roots equal to one, Johansen 1995, Thm 4.2).
func CompanionRoots(a []*mat.Dense) ([]complex128, error) {
	f, err := Companion(a)
	if err != nil {
		return nil, err
	}
	var eig mat.Eigen
	if !eig.Factorize(f, mat.EigenNone) {
		return nil, errors.New("johansen: the eigenvalues of the companion matrix did not converge")
	}
	v := eig.Values(nil)
	sort.SliceStable(v, func(i, j int) bool {
		mi, mj := cmplx.Abs(v[i]), cmplx.Abs(v[j])
		if mi != mj {
			return mi > mj
		}
		if real(v[i]) != real(v[j]) {
			return real(v[i]) > real(v[j])
		}
		return imag(v[i]) > imag(v[j])
	})
	return v, nil
}

// rootModuli returns the moduli of the companion roots, largest first
// (nil if they cannot be computed).
func rootModuli(a []*mat.Dense) []float64 {
	v, err := CompanionRoots(a)
	if err != nil {
		return nil
	}
	out := make([]float64, len(v))
	for i, z := range v {
		out[i] = cmplx.Abs(z)
	}
	return out
}
