package johansen

import (
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// Johansen with centred seasonal dummies, impulse and step dummies and an
// I(0) regressor against R urca 1.3-3 ca.jo(season = 4, dumvar = ...) and
// cajorls on the Danish money data, and a step dummy restricted to the
// relations against a direct reduced-rank regression in base R (checked
// there against ca.jo). Fixture and script:
// testdata/scripts/johansen_dummies_urca.R. Tolerance 1e-6 relative.

type dummiesFixture struct {
	Library, Version, Break string
	Runs                    []struct {
		Name, Source                string
		Lambda, Trace, Maxeig, Beta []float64
	}
}

// centredSeasonals returns s−1 centred seasonal dummies for n rows whose
// first row is season 0: column j is 1 − 1/s in season j and −1/s otherwise.
func centredSeasonals(n, s int) *mat.Dense {
	m := mat.NewDense(n, s-1, nil)
	for i := 0; i < n; i++ {
		for j := 0; j < s-1; j++ {
			v := -1 / float64(s)
			if i%s == j {
				v += 1
			}
			m.Set(i, j, v)
		}
	}
	return m
}

func hstack(ms ...*mat.Dense) *mat.Dense {
	rows, cols := ms[0].Dims()
	for _, m := range ms[1:] {
		_, c := m.Dims()
		cols += c
	}
	out := mat.NewDense(rows, cols, nil)
	at := 0
	for _, m := range ms {
		_, c := m.Dims()
		out.Slice(0, rows, at, at+c).(*mat.Dense).Copy(m)
		at += c
	}
	return out
}

func TestExtraAgainstURCA(t *testing.T) {
	var f dummiesFixture
	loadJSON(t, "../../testdata/fixtures/johansen_dummies_urca.json", &f)
	y := denmark(t)
	n, _ := y.Dims()
	brk := 36 // 1983Q1 is row 36 of 1974Q1..1987Q3
	col := func(fn func(i int) float64) *mat.Dense {
		m := mat.NewDense(n, 1, nil)
		for i := 0; i < n; i++ {
			m.Set(i, 0, fn(i))
		}
		return m
	}
	impulse := col(func(i int) float64 { return b2f(i == brk) })
	impulse2 := col(func(i int) float64 { return b2f(i == brk+1) })
	step := col(func(i int) float64 { return b2f(i >= brk) })
	lpy := loadCSV(t, "../../testdata/data/denmark.csv", []string{"LPY"}, nil)
	dlpy := col(func(i int) float64 {
		if i == 0 {
			return 0 // not used: the run starts one row later
		}
		return lpy.At(i, 0) - lpy.At(i-1, 0)
	})
	seas := centredSeasonals(n, 4)
	runs := map[string]struct {
		c Case
		x Extra
	}{
		"season4_const":   {RC, Extra{Unrestricted: seas}},
		"season4_none":    {C, Extra{Unrestricted: seas}},
		"dummies_none":    {C, Extra{Unrestricted: hstack(seas, impulse, step, dlpy)}}, // rows 1.. (1974Q2..)
		"restricted_step": {RC, Extra{Unrestricted: hstack(seas, impulse, impulse2), Restricted: step}},
	}
	if len(f.Runs) != len(runs) {
		t.Fatalf("fixture has %d runs, want %d", len(f.Runs), len(runs))
	}
	for _, run := range f.Runs {
		spec, ok := runs[run.Name]
		if !ok {
			t.Fatalf("unknown run %q", run.Name)
		}
		yy, x := y, spec.x
		if run.Name == "dummies_none" { // the differenced price level starts in 1974Q2
			yy = mat.DenseCopyOf(y.Slice(1, n, 0, 4))
			u := x.Unrestricted
			_, cu := u.Dims()
			x.Unrestricted = mat.DenseCopyOf(u.Slice(1, n, 0, cu))
		}
		r, err := TestExtra(yy, spec.c, 1, x)
		if err != nil {
			t.Fatalf("%s: %v", run.Name, err)
		}
		checkVec(t, run.Name+" eigenvalues ("+run.Source+")", r.Eigenvalues, run.Lambda, 1e-6, 0)
		checkVec(t, run.Name+" trace", r.Trace, run.Trace, 1e-6, 0)
		checkVec(t, run.Name+" maxeig", r.MaxEig, run.Maxeig, 1e-6, 0)
		v, err := r.Estimate(1, []int{0})
		if err != nil {
			t.Fatalf("%s: %v", run.Name, err)
		}
		beta := mat.Col(nil, 0, v.Beta)
		checkVec(t, run.Name+" beta", beta, run.Beta, 1e-6, 1e-3)
		if len(v.Terms) != len(r.Terms()) || v.Terms[len(v.Terms)-1].Kind != ExtraTerm {
			t.Errorf("%s: the short-run terms should end with the extra regressors", run.Name)
		}
	}
}

// With centred seasonals the relations of the restricted-step model carry
// the step's coefficient: z_t = β'(y_t, 1, step_t).
func TestExtraRelations(t *testing.T) {
	y := denmark(t)
	n, _ := y.Dims()
	step := mat.NewDense(n, 1, nil)
	for i := 30; i < n; i++ {
		step.Set(i, 0, 1)
	}
	r, err := TestExtra(y, RC, 1, Extra{Restricted: step})
	if err != nil {
		t.Fatal(err)
	}
	if r.P1() != 6 {
		t.Fatalf("P1 = %d, want 4 series + const + step", r.P1())
	}
	v, err := r.Estimate(1, []int{0})
	if err != nil {
		t.Fatal(err)
	}
	z := v.Relations(RC, y, step)[0]
	for _, i := range []int{0, 29, 30, n - 1} {
		var want float64
		for j := 0; j < 4; j++ {
			want += v.Beta.At(j, 0) * y.At(i, j)
		}
		want += v.Beta.At(4, 0) + v.Beta.At(5, 0)*step.At(i, 0)
		if math.Abs(z[i]-want) > 1e-12*math.Max(1, math.Abs(want)) {
			t.Errorf("relation at row %d = %g, want %g", i, z[i], want)
		}
	}
}

func TestExtraBadInput(t *testing.T) {
	y := denmark(t)
	n, _ := y.Dims()
	short := mat.NewDense(n-1, 1, nil)
	if _, err := TestExtra(y, C, 1, Extra{Unrestricted: short}); err == nil || !strings.Contains(err.Error(), "rows") {
		t.Errorf("short extra regressor: err = %v", err)
	}
	nan := mat.NewDense(n, 1, nil)
	nan.Set(3, 0, math.NaN())
	if _, err := TestExtra(y, C, 1, Extra{Unrestricted: nan}); err == nil || !strings.Contains(err.Error(), "row 3") {
		t.Errorf("NaN extra regressor: err = %v", err)
	}
	zero := mat.NewDense(n, 1, nil) // all zero: collinear with nothing, singular
	if _, err := TestExtra(y, C, 1, Extra{Unrestricted: zero}); err == nil || !strings.Contains(err.Error(), "extra regressor 0") {
		t.Errorf("zero extra regressor: err = %v", err)
	}
	many := mat.NewDense(n, 40, nil)
	for i := 0; i < n; i++ {
		many.Set(i, i%40, 1)
	}
	if _, err := TestExtra(y, C, 1, Extra{Unrestricted: many}); err == nil || !strings.Contains(err.Error(), "too few") {
		t.Errorf("40 extra regressors: err = %v", err)
	}
}
