package vardyn

import (
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"
)

func TestBadInput(t *testing.T) {
	y := macroGrowth(t)
	for _, c := range []struct {
		name string
		run  func() error
		want string
	}{
		{"nil", func() error { _, err := Fit(nil, 1, Const); return err }, "no data"},
		{"no lags", func() error { _, err := Fit(y, 0, Const); return err }, "at least one lag"},
		{"too few", func() error {
			_, err := Fit(mat.NewDense(5, 3, []float64{1, 2, 3, 4, 5, 6, 7, 8, 9, 1, 2, 3, 4, 5, 6}), 2, Const)
			return err
		}, "too few"},
		{"nan", func() error {
			z := mat.DenseCopyOf(y)
			z.Set(7, 1, math.NaN())
			_, err := Fit(z, 1, Const)
			return err
		}, "row 7"},
		{"collinear", func() error {
			z := mat.DenseCopyOf(y)
			n, _ := z.Dims()
			for i := 0; i < n; i++ {
				z.Set(i, 2, 2*z.At(i, 1))
			}
			_, err := Fit(z, 1, Const)
			return err
		}, "collinear"},
		{"bad order", func() error {
			_, err := CholeskyFactor(mat.NewSymDense(2, []float64{1, 0, 0, 1}), []int{0, 0})
			return err
		}, "permutation"},
		{"not pd", func() error {
			_, err := CholeskyFactor(mat.NewSymDense(2, []float64{1, 2, 2, 1}), nil)
			return err
		}, "positive definite"},
		{"fevd horizon", func() error {
			_, err := FEVD([]*mat.Dense{mat.NewDense(1, 1, []float64{1})}, 3)
			return err
		}, "horizon"},
		{"granger same", func() error {
			v, _ := Fit(y, 2, Const)
			_, err := v.Granger([]int{0}, []int{0}, 2)
			return err
		}, "both caused and causing"},
		{"granger lags", func() error {
			v, _ := Fit(y, 2, Const)
			_, err := v.Granger([]int{0}, []int{1}, 3)
			return err
		}, "cannot restrict"},
	} {
		err := c.run()
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: err = %v, want %q", c.name, err, c.want)
		}
	}
}

// Shares of each FEVD row sum to one, and the generalised response to
// the first series equals the orthogonalised one with that series first.
func TestIdentities(t *testing.T) {
	v, err := Fit(macroGrowth(t), 2, ConstTrend)
	if err != nil {
		t.Fatal(err)
	}
	phi, _ := MA(v.A, 8)
	th, _ := Orthogonalised(phi, v.Sigma, []int{1, 0, 2})
	gi, _ := Generalised(phi, v.Sigma)
	for s := range phi {
		for i := 0; i < 3; i++ {
			if math.Abs(th[s].At(i, 1)-gi[s].At(i, 1)) > 1e-12*math.Max(1, math.Abs(gi[s].At(i, 1))) {
				t.Errorf("h=%d: generalised %g ≠ orthogonalised-first %g", s, gi[s].At(i, 1), th[s].At(i, 1))
			}
		}
	}
	fe, _ := FEVD(th, 9)
	for s := range fe {
		for i := range fe[s] {
			var sum float64
			for _, x := range fe[s][i] {
				sum += x
			}
			if math.Abs(sum-1) > 1e-12 {
				t.Errorf("fevd h=%d series %d sums to %g", s+1, i, sum)
			}
		}
	}
}
