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
