package householder

import (
	"fmt"
	"math"
)

// TallBlockBytes bounds the working storage of NestedTall: a block of
// rows of every column, with the triangle carried from the blocks
// before, is sized to stay in a core's cache.
const TallBlockBytes = 256 << 10

// NestedTall returns, for the design X = cols[:m] and the response
// y = cols[m] (m = len(cols) − 1, every column of length n ≥ m + 1), what
// Factor(cols, m) followed by Nested(m, ssr, t) gives, and Indep; it
// leaves cols unchanged. Instead of sweeping every reflection over whole
// columns (a pass over all of X per column, memory-bound once X
// outgrows the cache), it factorises [X | y] in blocks of rows
// (sequential tall-skinny QR, Demmel, Grigori, Hoemmen and Langou 2012,
// §3): with A = [A_1; A_2; …] and the triangle R_k of the rows seen so
// far,
//
//	[R_k; A_{k+1}] = Q_{k+1} R_{k+1},
//
// each step an ordinary Householder QR (Factor) of a block held in
// cache, so that the final R equals the R of one QR of [X | y] up to the
// signs of its rows (R is unique up to them for a full-rank matrix) and
// to rounding. Nested reads only R: with R = [R_X r; 0 ρ], SSR_j and t_j
// are as in Nested (the products sign(R_{j−1,j−1}) r_{j−1} do not depend
// on the row signs), and the rank rule reads ‖x_k‖² = Σ_{i≤k} R_ik².
//
// The result agrees with Factor and Nested to rounding, not bit for bit.
// NestedTall returns an error for a malformed shape or a non-finite
// entry.
func NestedTall(cols [][]float64, ssr, t []float64) (indep int, err error) {
	return nestedTall(cols, nil, ssr, t, tallBlock(len(cols)))
}

// NestedTallScaled is NestedTall for the columns x_j = s_j·c_j (j < m)
// and y = c_m, with c_j = cols[j] and s_j = scale[j] (len(scale) = m;
// the response is not scaled). Each block of rows is formed as
// s_j·c_j[lo:hi] when it is factorised, so the scaled design is never
// held whole and the columns may share storage (the lags of one series
// as windows of it). Every entry s_j·c_ij is the same product that
// scaling a copy of c_j in place would store, so the result is that of
// NestedTall on the scaled copies, bit for bit.
func NestedTallScaled(cols [][]float64, scale []float64, ssr, t []float64) (indep int, err error) {
	if len(scale) != len(cols)-1 {
		return 0, fmt.Errorf("%w: %d scales for %d design columns", ErrShape, len(scale), len(cols)-1)
	}
	return nestedTall(cols, scale, ssr, t, tallBlock(len(cols)))
}

// tallBlock is the number of rows of a block of w columns.
func tallBlock(w int) int { return max(TallBlockBytes/(8*w)-w, 2*w) }

// nestedTall is NestedTall with blocks of the given number of rows;
// scale (nil: none) multiplies the design columns as they are copied.
func nestedTall(cols [][]float64, scale []float64, ssr, t []float64, block int) (indep int, err error) {
	w := len(cols)
	m := w - 1
	if m < 1 {
		return 0, fmt.Errorf("%w: %d columns given, at least 2 needed", ErrShape, w)
	}
	n := len(cols[0])
	for j, c := range cols {
		if len(c) != n {
			return 0, fmt.Errorf("%w: column %d has %d rows, column 0 has %d", ErrShape, j, len(c), n)
		}
	}
	if n < w {
		return 0, fmt.Errorf("%w: %d rows for %d columns", ErrShape, n, w)
	}
	if len(ssr) != m || len(t) != m {
		return 0, fmt.Errorf("%w: %d and %d outputs for %d sub-designs", ErrShape, len(ssr), len(t), m)
	}
	block = max(block, w)
	rows := w + block
	buf := make([]float64, rows*w)
	work := make([][]float64, w)
	for j := range work {
		work[j] = buf[j*rows : (j+1)*rows : (j+1)*rows]
	}
	r := make([]float64, w*w) // r[j*w+i] = R_ij, i ≤ j
	var f QR
	bc := make([][]float64, w)
	have := 0 // rows of R carried (0 before the first block)
	for lo := 0; lo < n; {
		hi := min(n, lo+block)
		if have == 0 && hi-lo < w { // the first block must be at least square
			hi = min(n, lo+w)
		}
		h := have + hi - lo
		for j := 0; j < w; j++ {
			c := work[j][:h]
			copy(c[:have], r[j*w:j*w+have])
			if scale == nil || j == m {
				copy(c[have:], cols[j][lo:hi])
			} else {
				s, dst := scale[j], c[have:]
				for i, v := range cols[j][lo:hi] {
					dst[i] = v * s
				}
			}
		}
		if have > 0 {
			for j := 0; j < w; j++ { // zero below R's diagonal
				for i := j + 1; i < have; i++ {
					work[j][i] = 0
				}
			}
		}
		for j := range bc {
			bc[j] = work[j][:h]
		}
		if err := f.Factor(bc, w); err != nil {
			return 0, err
		}
		for j := 0; j < w; j++ {
			for i := 0; i < j; i++ {
				r[j*w+i] = bc[j][i]
			}
			r[j*w+j] = f.diag[j]
		}
		have = w
		lo = hi
	}
	// Nested on the final triangle, as a QR of the m design columns with
	// the response's column [r; ρ] carried.
	g := QR{n: n, m: m, diag: make([]float64, m), tau: make([]float64, m), cols: make([][]float64, w), indep: m}
	for j := 0; j < w; j++ {
		g.cols[j] = r[j*w : j*w+w]
	}
	for k := 0; k < m; k++ {
		g.diag[k] = r[k*w+k]
		if g.indep == m {
			norm := 0.0
			for i := 0; i <= k; i++ {
				norm += r[k*w+i] * r[k*w+i]
			}
			if math.Abs(g.diag[k]) <= CollinearTol*math.Sqrt(norm) {
				g.indep = k
			}
		}
	}
	if err := g.Nested(m, ssr, t); err != nil {
		return 0, err
	}
	return g.indep, nil
}
