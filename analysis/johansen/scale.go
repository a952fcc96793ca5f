package johansen

import (
	"math"

	"gonum.org/v1/gonum/mat"
)

// Internal scaling of the series.
//
// Every statistic of the reduced-rank regression is invariant to rescaling
// each series, y_j → y_j/d_j, while the factorisations are not: a series
// measured in units 10⁸ times another's makes S00 numerically singular.
// Test and LagOrder therefore work on ỹ = yD⁻¹, D = diag(d_1..d_K), and map
// every result back to the units of y:
//
//	S00 = D S̃00 D,  S11 = D₁ S̃11 D₁,  S01 = D S̃01 D₁,  v = D₁⁻¹ ṽ,  β = D₁⁻¹ β̃,
//	α = D α̃,  Ω = D Ω̃ D,  Γ_i = D Γ̃_i D⁻¹,  Φ = D Φ̃,
//
// with D₁ = diag(D, 1) when a deterministic term is restricted to the
// cointegrating space (its row of β is not rescaled). Eigenvalues, trace,
// maximum-eigenvalue and LR statistics are unchanged.
//
// d_j is the root mean square of the first differences of series j, rounded
// to the nearest power of two. The differences are what R0 and the short-run
// regressors are made of, and after the deterministic terms are regressed
// out the levels are of the order of their accumulated differences, so this
// brings both blocks of the design to comparable magnitudes whatever the
// units (the RMS of the levels would not: a log series has a level of about
// 5 and monthly differences of about 0.01). Rounding to a power of two makes
// the division by d_j and the maps back exact in floating point, so the
// scaling itself adds no rounding error.

// seriesScale returns d_j = 2^round(log₂ √(mean_t Δy_jt²)) for each column
// of y, which must have passed checkSeries (every value finite); 1 when a
// column's differences are all zero or overflow.
func seriesScale(y *mat.Dense) []float64 {
	rows, k := y.Dims()
	raw := y.RawMatrix()
	at := func(i, j int) float64 { return raw.Data[i*raw.Stride+j] }
	d := make([]float64, k)
	big := make([]float64, k)
	for i := 1; i < rows; i++ {
		for j := 0; j < k; j++ {
			// y is finite (checkSeries), so a plain comparison is math.Max
			if a := math.Abs(at(i, j) - at(i-1, j)); a > big[j] {
				big[j] = a
			}
		}
	}
	ss := make([]float64, k) // Σ (Δy/big)², safe from overflow and underflow
	for i := 1; i < rows; i++ {
		for j := 0; j < k; j++ {
			if b := big[j]; b > 0 && !math.IsInf(b, 0) {
				u := (at(i, j) - at(i-1, j)) / b
				ss[j] += u * u
			}
		}
	}
	for j := range d {
		d[j] = 1
		if b := big[j]; b > 0 && !math.IsInf(b, 0) && !math.IsNaN(b) {
			rms := b * math.Sqrt(ss[j]/float64(rows-1))
			d[j] = math.Ldexp(1, int(math.Round(math.Log2(rms))))
		}
	}
	return d
}

// scaleColumns returns y with column j divided by d[j].
func scaleColumns(y *mat.Dense, d []float64) *mat.Dense {
	rows, k := y.Dims()
	raw := y.RawMatrix()
	out := make([]float64, rows*k)
	for i := 0; i < rows; i++ {
		row := raw.Data[i*raw.Stride : i*raw.Stride+k]
		for j, v := range row {
			out[i*k+j] = v / d[j]
		}
	}
	return mat.NewDense(rows, k, out)
}

// rowScale returns the scale of each row of β: d_1..d_K, then 1 for a
// restricted deterministic term.
func (r *Result) rowScale() []float64 {
	s := make([]float64, r.P1())
	copy(s, r.scale)
	for i := r.K; i < len(s); i++ {
		s[i] = 1
	}
	return s
}

// mulRows returns diag(s)·m, or diag(s)⁻¹·m when inv is true.
func mulRows(m mat.Matrix, s []float64, inv bool) *mat.Dense {
	rows, cols := m.Dims()
	out := mat.NewDense(rows, cols, nil)
	for i := 0; i < rows; i++ {
		f := s[i]
		for j := 0; j < cols; j++ {
			if inv {
				out.Set(i, j, m.At(i, j)/f)
			} else {
				out.Set(i, j, m.At(i, j)*f)
			}
		}
	}
	return out
}

// outer returns diag(a)·m·diag(b).
func outer(a []float64, m mat.Matrix, b []float64) *mat.Dense {
	rows, cols := m.Dims()
	out := mat.NewDense(rows, cols, nil)
	for i := 0; i < rows; i++ {
		for j := 0; j < cols; j++ {
			out.Set(i, j, a[i]*m.At(i, j)*b[j])
		}
	}
	return out
}

// outerSym returns diag(a)·s·diag(a).
func outerSym(a []float64, s *mat.SymDense) *mat.SymDense {
	n := s.SymmetricDim()
	out := mat.NewSymDense(n, nil)
	for i := 0; i < n; i++ {
		for j := i; j < n; j++ {
			out.SetSym(i, j, a[i]*s.At(i, j)*a[j])
		}
	}
	return out
}
