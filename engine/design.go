package engine

import "gonum.org/v1/gonum/mat"

// Regressors returns the terms and the regressor matrix of a
// single-equation regression on d, whose column 0 is the dependent
// variable and columns 1 … len(x) the regressors x: the terms are "const"
// (when withConst) and then x, and row i of the matrix is (1, x_i') or
// x_i'. With k terms it returns an error when d has no more than
// k + spare observations (spare 0 for an estimate, more where a plot
// needs observations to spare), before any matrix is built. The ols
// directive and figure's regression plots build their design here, so
// that both read one regression the same way.
func Regressors(c *Context, d *Data, x []string, withConst bool, spare int) ([]string, *mat.Dense, error) {
	var terms []string
	if withConst {
		terms = append(terms, "const")
	}
	terms = append(terms, x...)
	n, k := d.N(), len(terms)
	if n <= k+spare {
		return nil, nil, c.Errorf("", "too few observations: %d in the sample %s for %d coefficients", n, d.Range(), k)
	}
	m := mat.NewDense(n, k, nil)
	for i := 0; i < n; i++ {
		j := 0
		if withConst {
			m.Set(i, 0, 1)
			j = 1
		}
		for l := range x {
			m.Set(i, j+l, d.Cols[1+l][i])
		}
	}
	return terms, m, nil
}
