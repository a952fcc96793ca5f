package householder

import (
	"fmt"
	"math"
	"runtime"
	"sync"
	"sync/atomic"

	"gonum.org/v1/gonum/mat"
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
// cache; a long matrix is cut into pieces of TallChunk rows, reduced so
// on every core, whose triangles, stacked in order, are reduced the same
// way (tallPieces; the same result on any number of cores). The final R
// equals the R of one QR of [X | y] up to the signs of its rows (R is
// unique up to them for a full-rank matrix) and to rounding. Nested
// reads only R: with R = [R_X r; 0 ρ], SSR_j and t_j are as in Nested
// (the products sign(R_{j−1,j−1}) r_{j−1} do not depend on the row
// signs), and the rank rule reads ‖x_k‖² = Σ_{i≤k} R_ik² (triangleIndep).
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
	r, err := tallPieces(n, w, func(lo, hi int, dst [][]float64) {
		for j := 0; j < w; j++ {
			if scale == nil || j == m {
				copy(dst[j], cols[j][lo:hi])
			} else {
				s, d := scale[j], dst[j]
				for i, v := range cols[j][lo:hi] {
					d[i] = v * s
				}
			}
		}
	}, block)
	if err != nil {
		return 0, err
	}
	// Nested on the final triangle, as a QR of the m design columns with
	// the response's column [r; ρ] carried.
	g := QR{n: n, m: m, diag: make([]float64, m), tau: make([]float64, m), cols: make([][]float64, w), indep: m}
	for j := 0; j < w; j++ {
		g.cols[j] = r[j*w : j*w+w]
	}
	for k := 0; k < m; k++ {
		g.diag[k] = r[k*w+k]
	}
	g.indep = triangleIndep(r, w, m)
	if err := g.Nested(m, ssr, t); err != nil {
		return 0, err
	}
	return g.indep, nil
}

// tallTriangle is the sequential tall-skinny QR of NestedTall on an n×w
// matrix (n ≥ w) whose rows fill writes, a block at a time: fill(lo, hi,
// dst) writes rows lo..hi−1 of column j into dst[j][:hi−lo]. It returns
// R as r[j*w+i] = R_ij, i ≤ j (zero below the diagonal).
func tallTriangle(n, w int, fill func(lo, hi int, dst [][]float64), block int) ([]float64, error) {
	block = max(min(block, n), w) // no larger than the matrix: a bootstrap factorises thousands of short ones
	rows := w + block
	buf := make([]float64, rows*w)
	work := make([][]float64, w)
	for j := range work {
		work[j] = buf[j*rows : (j+1)*rows : (j+1)*rows]
	}
	r := make([]float64, w*w) // r[j*w+i] = R_ij, i ≤ j
	var f QR
	bc := make([][]float64, w)
	dst := make([][]float64, w)
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
			dst[j] = c[have:]
		}
		fill(lo, hi, dst)
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
			return nil, err
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
	return r, nil
}

// TallChunk is the number of rows TallR factorises as one piece: a
// design's rows are cut into pieces of this many (the last shorter),
// whatever the number of cores, so that R does not depend on it.
const TallChunk = 1 << 15

// TallR returns the upper-triangular factor R of the QR of the n×w
// matrix X (n ≥ w) whose rows row writes (row(i, dst) writes row i,
// length w), and indep, the count of leading columns that pass the rank
// rule CollinearTol (as QR.Indep, with ‖x_k‖² = Σ_{i≤k} R_ik²), without
// holding X: as in NestedTall, X is cut into pieces of TallChunk rows,
// each reduced to its triangle by the sequential tall-skinny QR (blocks
// of rows held in cache), the pieces on every core; the triangles,
// stacked in order, are reduced the same way (the reduction tree of
// Demmel, Grigori, Hoemmen and Langou 2012, §3, flat over the pieces).
// R equals the R of one Householder QR of X (Factor) up to the signs of
// its rows and to rounding; it is the same bit for bit on any number of
// cores.
// TallR returns an error for a malformed shape or a non-finite entry.
func TallR(n, w int, row func(i int, dst []float64)) (*mat.TriDense, int, error) {
	if w < 1 || n < w {
		return nil, 0, fmt.Errorf("%w: %d rows for %d columns", ErrShape, n, w)
	}
	r, err := tallPieces(n, w, func(lo, hi int, dst [][]float64) {
		x := make([]float64, w)
		for i := lo; i < hi; i++ {
			row(i, x)
			for j, v := range x {
				dst[j][i-lo] = v
			}
		}
	}, tallBlock(w))
	if err != nil {
		return nil, 0, err
	}
	out := mat.NewTriDense(w, mat.Upper, nil)
	for k := 0; k < w; k++ {
		for i := 0; i <= k; i++ {
			out.SetTri(i, k, r[k*w+i])
		}
	}
	return out, triangleIndep(r, w, w), nil
}

// triangleIndep is the rank rule CollinearTol read from a triangle
// (r[j*w+i] = R_ij): the number of leading columns among the first m
// before the first with |R_kk| ≤ CollinearTol·‖x_k‖, where
// ‖x_k‖² = Σ_{i≤k} R_ik² (orthogonal invariance), as QR.Indep counts them.
func triangleIndep(r []float64, w, m int) int {
	for k := 0; k < m; k++ {
		norm := 0.0
		for i := 0; i <= k; i++ {
			norm += r[k*w+i] * r[k*w+i]
		}
		if math.Abs(r[k*w+k]) <= CollinearTol*math.Sqrt(norm) {
			return k
		}
	}
	return m
}

// tallPieces is tallTriangle on pieces of TallChunk rows (a last piece
// shorter than w joins the one before), the pieces on every core and
// their triangles, stacked in order, reduced the same way: the same
// result on any number of cores. fill must be safe to call for
// different rows at once.
func tallPieces(n, w int, fill func(lo, hi int, dst [][]float64), block int) ([]float64, error) {
	pieces := max((n+TallChunk-1)/TallChunk, 1)
	if pieces > 1 && n-(pieces-1)*TallChunk < w {
		pieces--
	}
	if pieces == 1 {
		return tallTriangle(n, w, fill, block)
	}
	tri := make([][]float64, pieces)
	errs := make([]error, pieces)
	workers := min(runtime.GOMAXPROCS(0), pieces)
	var next atomic.Int64
	var wg sync.WaitGroup
	for k := 0; k < workers; k++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for p := int(next.Add(1) - 1); p < pieces; p = int(next.Add(1) - 1) {
				lo, hi := p*TallChunk, min(n, (p+1)*TallChunk)
				if p == pieces-1 {
					hi = n
				}
				tri[p], errs[p] = tallTriangle(hi-lo, w, func(a, b int, dst [][]float64) { fill(lo+a, lo+b, dst) }, block)
			}
		}()
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return nil, err
		}
	}
	// the stacked triangles, w rows each, reduced as one tall matrix
	return tallTriangle(pieces*w, w, func(lo, hi int, dst [][]float64) {
		for i := lo; i < hi; i++ {
			t, ri := tri[i/w], i%w
			for j := 0; j < w; j++ {
				dst[j][i-lo] = t[j*w+ri]
			}
		}
	}, block)
}
