package ardl

import (
	"errors"
	"fmt"

	"gonum.org/v1/gonum/mat"
)

// PartialSums decomposes x into the partial sums of its changes above
// and at or below the threshold τ (Shin, Yu and Greenwood-Nimmo 2014,
// eq. 2, with the threshold of their §2):
//
//	x⁺_t = Σ_{s=1..t} Δx_s·1{Δx_s > τ},   x⁻_t = Σ_{s=1..t} Δx_s·1{Δx_s ≤ τ},
//
// x⁺_0 = x⁻_0 = 0, so that x_t = x_0 + x⁺_t + x⁻_t. With τ = 0 these are
// the sums of the increases and of the decreases. It returns an error
// when every change falls on one side of τ (one partial sum is then
// identically zero and the decomposition is degenerate); nPos and nNeg
// count the changes on each side.
func PartialSums(x []float64, tau float64) (pos, neg []float64, nPos, nNeg int, err error) {
	if len(x) < 2 {
		return nil, nil, 0, 0, errors.New("ardl: a decomposed regressor needs at least two observations")
	}
	pos = make([]float64, len(x))
	neg = make([]float64, len(x))
	for t := 1; t < len(x); t++ {
		d := x[t] - x[t-1]
		pos[t], neg[t] = pos[t-1], neg[t-1]
		if d > tau {
			pos[t] += d
			nPos++
		} else {
			neg[t] += d
			if d != 0 || tau != 0 {
				nNeg++
			}
		}
	}
	switch {
	case nPos == 0 && tau == 0:
		return nil, nil, 0, nNeg, errors.New("ardl: the series never rises: the positive partial sum would be zero throughout")
	case nPos == 0:
		return nil, nil, 0, nNeg, fmt.Errorf("ardl: no change is above the threshold %g: the positive partial sum would be zero throughout", tau)
	case nNeg == 0 && tau == 0:
		return nil, nil, nPos, 0, errors.New("ardl: the series never falls: the negative partial sum would be zero throughout")
	case nNeg == 0:
		return nil, nil, nPos, 0, fmt.Errorf("ardl: no change is at or below the threshold %g: the negative partial sum would be zero throughout", tau)
	}
	return pos, neg, nPos, nNeg, nil
}

// Pair names the positions in Input.X of the positive and negative
// partial sums of one decomposed regressor.
type Pair struct {
	Name     string
	Pos, Neg int
}

// SymmetryTests returns, for the decomposed regressor p, the Wald F tests
// of Shin, Yu and Greenwood-Nimmo (2014), §3:
//
//   - long-run symmetry, θ⁺ = θ⁻; since θ^± = −π^±/π_y this is the linear
//     restriction π⁺ = π⁻ on the levels x⁺_{t−1} and x⁻_{t−1};
//   - additive short-run symmetry, Σ_{l=0..q*−1} δ⁺_l = Σ_l δ⁻_l on the
//     differences of the two partial sums.
//
// Both are one restriction, with F(1, N − K) p-values (Model.WaldF).
func (m *Model) SymmetryTests(xn []string, p Pair) (long, short FTest, err error) {
	k := m.Fit.K
	ip, in := m.Index(LevelName(xn[p.Pos])), m.Index(LevelName(xn[p.Neg]))
	if ip < 0 || in < 0 {
		return long, short, fmt.Errorf("ardl: %s: partial sums not in the model", p.Name)
	}
	R := mat.NewDense(1, k, nil)
	R.Set(0, ip, 1)
	R.Set(0, in, -1)
	if long, err = m.WaldF("long-run symmetry of "+p.Name, R, nil); err != nil {
		return
	}
	R = mat.NewDense(1, k, nil)
	for l := 0; ; l++ {
		a, b := m.Index(DiffName(xn[p.Pos], l)), m.Index(DiffName(xn[p.Neg], l))
		if a < 0 && b < 0 {
			break
		}
		if a >= 0 {
			R.Set(0, a, 1)
		}
		if b >= 0 {
			R.Set(0, b, -1)
		}
	}
	short, err = m.WaldF("short-run symmetry of "+p.Name, R, nil)
	return
}

// Multipliers are cumulative dynamic multipliers at horizons 0…H.
type Multipliers struct {
	// Pos[h] = Σ_{j=0..h} ∂y_{t+j}/∂x⁺_t, the response to a unit rise.
	Pos []float64
	// Neg[h] = −Σ_{j=0..h} ∂y_{t+j}/∂x⁻_t, the response to a unit fall
	// (a fall of one lowers x⁻ by one).
	Neg []float64
	// Asym[h] = Pos[h] + Neg[h] = m⁺_h − m⁻_h, zero at every horizon
	// under symmetry.
	Asym []float64
	// LongPos and LongNeg are the limits θ⁺ and −θ⁻.
	LongPos, LongNeg float64
}

// Multipliers returns the cumulative dynamic multipliers of the
// decomposed regressor p up to horizon h (Shin, Yu and Greenwood-Nimmo
// 2014, eq. 12): with φ_i and β_l the coefficients of the ARDL in levels
// implied by the error-correction form, the impulse responses
// λ_j = Σ_{i=1..p} φ_i λ_{j−i} + β_j (λ_j = 0 for j < 0, β_j = 0 for
// j > q*) are summed, m_h = Σ_{j≤h} λ_j, which tends to θ as h grows
// when the model is stable.
func (m *Model) Multipliers(p Pair, h int) (Multipliers, error) {
	if h < 0 {
		return Multipliers{}, fmt.Errorf("ardl: horizon %d is negative", h)
	}
	if p.Pos < 0 || p.Pos >= len(m.levelBeta) || p.Neg < 0 || p.Neg >= len(m.levelBeta) {
		return Multipliers{}, errors.New("ardl: regressor out of range")
	}
	cum := func(beta []float64) []float64 {
		lam := make([]float64, h+1)
		out := make([]float64, h+1)
		var s float64
		for j := 0; j <= h; j++ {
			v := 0.0
			if j < len(beta) {
				v = beta[j]
			}
			for i, phi := range m.levelPhi {
				if j-i-1 >= 0 {
					v += phi * lam[j-i-1]
				}
			}
			lam[j] = v
			s += v
			out[j] = s
		}
		return out
	}
	mu := Multipliers{Pos: cum(m.levelBeta[p.Pos]), Neg: cum(m.levelBeta[p.Neg])}
	for i := range mu.Neg {
		mu.Neg[i] = -mu.Neg[i]
	}
	mu.Asym = make([]float64, h+1)
	for i := range mu.Asym {
		mu.Asym[i] = mu.Pos[i] + mu.Neg[i]
	}
	off := len(m.LongRun) - m.K
	mu.LongPos = m.LongRun[off+p.Pos].Est
	mu.LongNeg = -m.LongRun[off+p.Neg].Est
	return mu, nil
}

// LevelPhi and LevelBeta expose the levels form implied by the
// error-correction coefficients: φ_1…φ_p, and per regressor β_0…β_{q*}.
func (m *Model) LevelPhi() []float64 { return append([]float64(nil), m.levelPhi...) }
func (m *Model) LevelBeta(j int) []float64 {
	return append([]float64(nil), m.levelBeta[j]...)
}
