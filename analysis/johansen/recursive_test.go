package johansen

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"sort"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// recursiveFixture is testdata/fixtures/johansen_recursive.json, written by
// testdata/scripts/johansen_recursive.py.
type recursiveFixture struct {
	Library, Version string
	Numpy, Scipy     string
	Statsmodels      []struct {
		Data     string
		DetOrder int `json:"det_order"`
		KArDiff  int `json:"k_ar_diff"`
		First    int
		End      []int
		Eig      [][]float64
		Trace    [][]float64
	}
	NumpyRecursive []struct {
		Data       string
		Case       string
		Lags       int
		First      int
		Form       string
		ImpulseRow *int `json:"impulse_row"`
		StepRow    *int `json:"step_row"`
		End        []int
		Eig        [][]float64
		Trace      [][]float64
	} `json:"numpy_recursive"`
	Roots []struct {
		KArDiff int `json:"k_ar_diff"`
		Rank    int
		Re, Im  []float64
	}
}

func loadRecursive(t *testing.T) *recursiveFixture {
	var f recursiveFixture
	loadJSON(t, "../../testdata/fixtures/johansen_recursive.json", &f)
	return &f
}

func fixtureData(t *testing.T, name string) *mat.Dense {
	if name == "macrodata" {
		return macro(t)
	}
	return denmark(t)
}

func checkRecursion(t *testing.T, rec *Recursion, end []int, eig, trace [][]float64) {
	t.Helper()
	if len(rec.End) != len(end) {
		t.Fatalf("%d subsamples, want %d", len(rec.End), len(end))
	}
	for i := range end {
		if rec.End[i] != end[i] {
			t.Fatalf("subsample %d ends after %d observations, want %d", i, rec.End[i], end[i])
		}
		checkVec(t, fmt.Sprintf("eigenvalues(T=%d)", end[i]), rec.Eigenvalues[i], eig[i], 1e-6, 0)
		checkVec(t, fmt.Sprintf("trace(T=%d)", end[i]), rec.Trace[i], trace[i], 1e-6, 0)
	}
}

// TestRecursiveXFormStatsmodels: the X-form against statsmodels 0.13.5
// coint_johansen run on every subsample (det_order −1 is case N, 0 is
// case C; see TestStatisticsStatsmodels), 1e-6 relative.
func TestRecursiveXFormStatsmodels(t *testing.T) {
	f := loadRecursive(t)
	for _, c := range f.Statsmodels {
		cs := map[int]Case{-1: N, 0: C}[c.DetOrder]
		t.Run(fmt.Sprintf("%s/det_order=%d/k_ar_diff=%d", c.Data, c.DetOrder, c.KArDiff), func(t *testing.T) {
			rec, err := Recursive(fixtureData(t, c.Data), cs, c.KArDiff, Extra{}, c.First, XForm, 0)
			if err != nil {
				t.Fatal(err)
			}
			// statsmodels 0.13.5 coint_johansen eig and lr1 per subsample.
			checkRecursion(t, rec, c.End, c.Eig, c.Trace)
		})
	}
}

// TestRecursiveNumpy: the R-form (and the X-form in case RC, with an
// unrestricted impulse dummy and with a step dummy restricted to the
// relations, both zero on the early subsamples) against the numpy
// 1.24.2 / scipy 1.10.1 implementation of the published equations in
// testdata/scripts/johansen_recursive.py, 1e-6 relative.
func TestRecursiveNumpy(t *testing.T) {
	f := loadRecursive(t)
	for _, c := range f.NumpyRecursive {
		name := fmt.Sprintf("%s/%s/k=%d/%s-form/impulse=%v/step=%v", c.Data, c.Case, c.Lags, c.Form, c.ImpulseRow != nil, c.StepRow != nil)
		t.Run(name, func(t *testing.T) {
			y := fixtureData(t, c.Data)
			cs, err := ParseCase(c.Case)
			if err != nil {
				t.Fatal(err)
			}
			var x Extra
			if c.ImpulseRow != nil {
				rows, _ := y.Dims()
				x.Unrestricted = mat.NewDense(rows, 1, nil)
				x.Unrestricted.Set(*c.ImpulseRow, 0, 1)
			}
			if c.StepRow != nil {
				rows, _ := y.Dims()
				x.Restricted = mat.NewDense(rows, 1, nil)
				for i := *c.StepRow; i < rows; i++ {
					x.Restricted.Set(i, 0, 1)
				}
			}
			form := map[string]Form{"X": XForm, "R": RForm}[c.Form]
			rec, err := Recursive(y, cs, c.Lags, x, c.First, form, 0)
			if err != nil {
				t.Fatal(err)
			}
			// numpy/scipy from the published equations.
			checkRecursion(t, rec, c.End, c.Eig, c.Trace)
		})
	}
}

// TestRecursiveMatchesTest: each X-form subsample is TestExtra on the
// first rows, and the last subsample of either form is the full sample;
// the results do not depend on the number of workers (bit for bit).
func TestRecursiveMatchesTest(t *testing.T) {
	y := macro(t)
	rows, _ := y.Dims()
	const lags = 2
	first := 20
	rec, err := Recursive(y, RT, lags, Extra{}, first, XForm, 1)
	if err != nil {
		t.Fatal(err)
	}
	for i, n := range rec.End {
		if i%37 != 0 && i != len(rec.End)-1 {
			continue
		}
		sub := mat.DenseCopyOf(y.Slice(0, n+lags+1, 0, 3))
		res, err := Test(sub, RT, lags)
		if err != nil {
			t.Fatal(err)
		}
		checkVec(t, fmt.Sprintf("eigenvalues(T=%d)", n), rec.Eigenvalues[i], res.Eigenvalues, 1e-9, 0)
		checkVec(t, fmt.Sprintf("trace(T=%d)", n), rec.Trace[i], res.Trace, 1e-9, 0)
	}
	if last := rec.End[len(rec.End)-1]; last != rows-lags-1 {
		t.Errorf("the last subsample has %d observations, want T = %d", last, rows-lags-1)
	}
	full, _ := Test(y, RT, lags)
	rr, err := Recursive(y, RT, lags, Extra{}, first, RForm, 3)
	if err != nil {
		t.Fatal(err)
	}
	checkVec(t, "R-form full-sample eigenvalues", rr.Eigenvalues[len(rr.End)-1], full.Eigenvalues, 1e-9, 0)
	again, err := Recursive(y, RT, lags, Extra{}, first, XForm, 3)
	if err != nil {
		t.Fatal(err)
	}
	for i := range rec.End {
		for j := range rec.Eigenvalues[i] {
			if rec.Eigenvalues[i][j] != again.Eigenvalues[i][j] || rec.Trace[i][j] != again.Trace[i][j] {
				t.Fatalf("subsample %d differs between 1 and 3 workers", i)
			}
		}
	}
}

// TestRecursiveScaledTrace: the ratios are the statistics over the
// tabulated 5% critical values.
func TestRecursiveScaledTrace(t *testing.T) {
	rec, err := Recursive(denmark(t), RC, 1, Extra{}, 20, XForm, 0)
	if err != nil {
		t.Fatal(err)
	}
	ratio, cv, err := rec.ScaledTrace(0.05)
	if err != nil {
		t.Fatal(err)
	}
	// Osterwald-Lenum (1992) Table 1*, 5%: K − r = 4, 3, 2, 1.
	checkVec(t, "critical values", cv, []float64{53.12, 34.91, 19.96, 9.24}, 0, 0)
	for i := range ratio {
		for r := range ratio[i] {
			if got, want := ratio[i][r], rec.Trace[i][r]/cv[r]; got != want {
				t.Fatalf("ratio[%d][%d] = %g, want %g", i, r, got, want)
			}
		}
	}
	if _, _, err := rec.ScaledTrace(0.2); err == nil {
		t.Error("level 0.2 gave no error")
	}
}

// TestRecursiveErrors: bad windows and forms are errors, not panics.
func TestRecursiveErrors(t *testing.T) {
	y := denmark(t)
	for _, tc := range []struct {
		first int
		form  Form
	}{{5, XForm}, {13, XForm}, {54, XForm}, {20, Form(7)}} {
		if _, err := Recursive(y, C, 1, Extra{}, tc.first, tc.form, 0); err == nil {
			t.Errorf("first %d, form %d: no error", tc.first, tc.form)
		}
	}
	if _, err := Recursive(nil, C, 1, Extra{}, 20, XForm, 0); err == nil {
		t.Error("nil data: no error")
	}
	// A series that is constant over the first window makes it singular.
	z := mat.DenseCopyOf(y)
	for i := 0; i < 30; i++ {
		z.Set(i, 3, 0.1)
	}
	_, err := Recursive(z, C, 1, Extra{}, 20, XForm, 0)
	var se *SubsampleError
	if !errors.As(err, &se) || se.End != 20 {
		t.Errorf("a constant stretch in the first window: %v, want the subsample of 20 observations named", err)
	}
}

// TestCompanionRootsStatsmodels: the companion roots of the VAR form of
// the estimated VECM (case C) against numpy.linalg.eigvals of the
// companion matrix built from statsmodels 0.13.5 VECMResults.var_rep
// (deterministic "co"), matched root by root, 1e-6 relative (absolute
// 1e-6 on the real and imaginary parts of roots of modulus below one).
func TestCompanionRootsStatsmodels(t *testing.T) {
	f := loadRecursive(t)
	y := denmark(t)
	for _, c := range f.Roots {
		t.Run(fmt.Sprintf("k=%d/rank=%d", c.KArDiff, c.Rank), func(t *testing.T) {
			res, err := Test(y, C, c.KArDiff)
			if err != nil {
				t.Fatal(err)
			}
			norm := make([]int, c.Rank)
			for i := range norm {
				norm[i] = i
			}
			m, err := res.Estimate(c.Rank, norm)
			if err != nil {
				t.Fatal(err)
			}
			got, err := CompanionRoots(m.VARForm())
			if err != nil {
				t.Fatal(err)
			}
			want := make([]complex128, len(c.Re))
			for i := range want {
				want[i] = complex(c.Re[i], c.Im[i])
			}
			sort.Slice(want, func(i, j int) bool { return cmplx.Abs(want[i]) > cmplx.Abs(want[j]) })
			if len(got) != len(want) {
				t.Fatalf("%d roots, want %d", len(got), len(want))
			}
			used := make([]bool, len(want))
			for _, g := range got {
				best, bd := -1, math.Inf(1)
				for j, w := range want {
					if d := cmplx.Abs(g - w); !used[j] && d < bd {
						best, bd = j, d
					}
				}
				used[best] = true
				if bd > 1e-6*math.Max(cmplx.Abs(want[best]), 1) {
					t.Errorf("root %v: nearest statsmodels root %v is %g away", g, want[best], bd)
				}
			}
			for i := 0; i < res.K-c.Rank; i++ {
				if math.Abs(cmplx.Abs(got[i])-1) > 1e-8 {
					t.Errorf("root %d has modulus %.12f, want a unit root", i, cmplx.Abs(got[i]))
				}
			}
		})
	}
}

// BenchmarkRecursive6x10k times both forms on six series of 10,000
// observations (two lagged differences, case C): go test -bench Recursive
// -run '^$' ./analysis/johansen.
func BenchmarkRecursive6x10k(b *testing.B) {
	const n, k = 10000, 6
	y := mat.NewDense(n, k, nil)
	rng := rand.New(rand.NewPCG(1, 2))
	for i := 1; i < n; i++ {
		for j := 0; j < k; j++ {
			v := y.At(i-1, j) + rng.NormFloat64()
			if j >= 3 { // three series tied to the first three
				v = 0.5*y.At(i-1, j) + 0.5*y.At(i-1, j-3) + rng.NormFloat64()
			}
			y.Set(i, j, v)
		}
	}
	for _, form := range []Form{XForm, RForm} {
		b.Run(form.String(), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				if _, err := Recursive(y, C, 2, Extra{}, 100, form, 0); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
