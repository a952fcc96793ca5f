package simulate

import "math"

// Small dense kernels on caller-owned buffers, so that a replication
// allocates nothing. Matrices are row-major n×n arrays. The QR of the τ
// kernels is package householder's, on column-major slices of columns.

// cholesky factorises the symmetric positive-definite n×n row-major a
// (upper triangle read) as LLᵀ in place, L in the lower triangle. ok is
// false when a pivot is not positive.
func cholesky(a []float64, n int) (ok bool) {
	for j := 0; j < n; j++ {
		rj := a[j*n : j*n+j]
		d := a[j*n+j] - dot(rj, rj)
		if !(d > 0) {
			return false
		}
		d = math.Sqrt(d)
		a[j*n+j] = d
		for i := j + 1; i < n; i++ {
			ri := a[i*n : i*n+j]
			a[i*n+j] = (a[j*n+i] - dot(ri, rj)) / d
		}
	}
	return true
}

// jacobiEigen returns in w the eigenvalues of the symmetric n×n row-major
// a (destroyed), by cyclic Jacobi rotations until the off-diagonal mass
// is below 1e-30 of the total or 50 sweeps (Golub and Van Loan 2013,
// §8.5). Order is unspecified.
func jacobiEigen(a []float64, n int, w []float64) {
	var tot float64
	for _, v := range a[:n*n] {
		tot += v * v
	}
	for sweep := 0; sweep < 50; sweep++ {
		var off float64
		for p := 0; p < n; p++ {
			for q := p + 1; q < n; q++ {
				off += a[p*n+q] * a[p*n+q]
			}
		}
		if off <= 1e-30*tot {
			break
		}
		for p := 0; p < n; p++ {
			for q := p + 1; q < n; q++ {
				apq := a[p*n+q]
				if apq == 0 {
					continue
				}
				theta := (a[q*n+q] - a[p*n+p]) / (2 * apq)
				t := math.Copysign(1, theta) / (math.Abs(theta) + math.Sqrt(theta*theta+1))
				c := 1 / math.Sqrt(t*t+1)
				s := t * c
				for k := 0; k < n; k++ { // columns p, q
					akp, akq := a[k*n+p], a[k*n+q]
					a[k*n+p] = c*akp - s*akq
					a[k*n+q] = s*akp + c*akq
				}
				for k := 0; k < n; k++ { // rows p, q
					apk, aqk := a[p*n+k], a[q*n+k]
					a[p*n+k] = c*apk - s*aqk
					a[q*n+k] = s*apk + c*aqk
				}
			}
		}
	}
	for i := 0; i < n; i++ {
		w[i] = a[i*n+i]
	}
}

func dot(x, y []float64) float64 {
	y = y[:len(x)]
	var s0, s1 float64
	i := 0
	for ; i+1 < len(x); i += 2 {
		s0 += x[i] * y[i]
		s1 += x[i+1] * y[i+1]
	}
	if i < len(x) {
		s0 += x[i] * y[i]
	}
	return s0 + s1
}

func axpy(a float64, x, y []float64) {
	y = y[:len(x)]
	for i, v := range x {
		y[i] += a * v
	}
}
