package design

import (
	"math"
	"sort"

	"gonum.org/v1/gonum/lapack/gonum"
)

// float64Start returns the eigenvalues of the Jacobi matrix of rec.Prefix(n)
// in float64, ascending, computed by gonum's root-free QL/QR tridiagonal
// eigensolver (LAPACK Dsterf). It reports false when a coefficient does not
// fit a float64 or the solver fails; the caller then falls back to Sturm
// bisection.
func float64Start(rec *Recurrence, n int) ([]float64, bool) {
	if f, ok := squaresStart(rec, n); ok {
		return f, true
	}
	d := make([]float64, n)
	e := make([]float64, n)
	for k := 0; k < n; k++ {
		a, _ := rec.Alpha[k].Float64()
		if math.IsInf(a, 0) {
			return nil, false
		}
		d[k] = a
		if k+1 < n {
			b, _ := rec.Beta[k+1].Float64()
			if b <= 0 || math.IsInf(b, 0) {
				return nil, false
			}
			e[k] = math.Sqrt(b)
		}
	}
	if !(gonum.Implementation{}).Dsterf(n, d, e) {
		return nil, false
	}
	sort.Float64s(d)
	return d, true
}

// squaresStart is float64Start for a symmetric recurrence (every alpha_k
// zero, n >= 4): the eigenvalues of the Jacobi matrix of the squared
// variable (see refineSquares), half the size and a quarter of the work,
// mapped back by x = +-sqrt(y), with 0 in the middle for odd n. It reports
// false for other recurrences or when a coefficient does not fit a float64.
func squaresStart(rec *Recurrence, n int) ([]float64, bool) {
	if n < 4 {
		return nil, false
	}
	b := make([]float64, n)
	for k := 0; k < n; k++ {
		if rec.Alpha[k].Sign() != 0 {
			return nil, false
		}
		b[k], _ = rec.Beta[k].Float64()
		if k > 0 && (b[k] <= 0 || math.IsInf(b[k], 0)) {
			return nil, false
		}
	}
	m, odd := n/2, n%2 == 1
	d := make([]float64, m)
	e := make([]float64, m)
	for k := 0; k < m; k++ {
		var dk, ek float64 // alpha and beta_(k+1) of the squared variable
		switch {
		case odd:
			dk = b[2*k+1] + b[2*k+2]
			if k+1 < m {
				ek = b[2*k+2] * b[2*k+3]
			}
		default:
			dk = b[2*k+1]
			if k > 0 {
				dk += b[2*k]
			}
			if k+1 < m {
				ek = b[2*k+1] * b[2*k+2]
			}
		}
		d[k] = dk
		if k+1 < m {
			if ek <= 0 || math.IsInf(ek, 0) {
				return nil, false
			}
			e[k] = math.Sqrt(ek)
		}
	}
	if !(gonum.Implementation{}).Dsterf(m, d, e) {
		return nil, false
	}
	sort.Float64s(d)
	x := make([]float64, n)
	for i, y := range d {
		if y <= 0 {
			return nil, false
		}
		r := math.Sqrt(y)
		x[n-m+i], x[m-1-i] = r, -r
	}
	return x, true
}
