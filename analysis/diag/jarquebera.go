package diag

import (
	"fmt"
	"math"
)

// JarqueBera is the Jarque and Bera (1980) normality statistic
//
//	JB = N/6 · (S² + (K − 3)²/4),
//
// with the moment estimators S = m₃/m₂^{3/2} and K = m₄/m₂², where
// m_j = N⁻¹ Σ (e_t − ē)^j. It is asymptotically χ²(2) under normality.
func JarqueBera(e []float64) (Test, error) {
	n := len(e)
	if n < 3 {
		return Test{}, fmt.Errorf("diag: Jarque–Bera needs at least 3 observations, have %d", n)
	}
	mean, err := finiteMean("residual", e)
	if err != nil {
		return Test{}, err
	}
	var m2, m3, m4 float64
	for _, v := range e {
		d := v - mean
		d2 := d * d
		m2 += d2
		m3 += d2 * d
		m4 += d2 * d2
	}
	fn := float64(n)
	m2 /= fn
	m3 /= fn
	m4 /= fn
	if m2 == 0 {
		return Test{}, fmt.Errorf("diag: Jarque–Bera: the residuals are constant")
	}
	s := m3 / (m2 * math.Sqrt(m2))
	k := m4 / (m2 * m2)
	jb := fn / 6 * (s*s + (k-3)*(k-3)/4)
	return chi2Test("Jarque–Bera", jb, 2), nil
}
