package fast

import "math"

// Legendre sets x and w to the nodes (ascending) and weights of the n-point
// Gauss-Legendre rule on [-1, 1]. x and w must have length n (it panics
// otherwise, or if n < 1).
//
// For n >= 101 each point comes from Bogaert's iteration-free expansions
// (bogaertPoint: the node angle in double-double, the node from its
// accurate cosine), independently of the others and in parallel; below,
// from Newton's method on the recurrence in double-double (as Jacobi).
// The figures measured against extended precision are in the package
// tests (TestLegendreAgainstRecurrence and Measured).
func Legendre(n int, x, w []float64) {
	checkLen(n, x, w)
	legendreRange(n, 0, n, x, w, nil)
}

// legendreRange sets x[j], w[j] (and d[j] = 1 - |x[j]| to a few ulp in
// relative terms, when d is not nil) to the points lo+j, lo <= lo+j < hi,
// of the n-point rule.
func legendreRange(n, lo, hi int, x, w, d []float64) {
	if n < bogaertMin {
		xs, ws, ds := make([]float64, n), make([]float64, n), make([]float64, n)
		if err := jacobiCore(n, ddF(0), ddF(0), xs, ws, ds, 0, 0); err != nil {
			panic(err) // the recurrence rule of Legendre converges for every n < 101
		}
		copy(x, xs[lo:hi])
		copy(w, ws[lo:hi])
		if d != nil {
			copy(d, ds[lo:hi])
		}
		return
	}
	half := (n + 1) / 2
	nh := float64(n) + 0.5
	v := dd{1 / nh, 0} // 1/(n+1/2) in double-double
	v.lo = math.FMA(-v.hi, nh, 1) / nh
	parallelFor(hi-lo, func(a, b int) {
		for j := a; j < b; j++ {
			i := lo + j
			k, sign := n-i, 1.0 // k-th node from x = 1
			if k > half {
				k, sign = i+1, -1 // the mirror of the k-th from x = 1
			}
			theta, wi := bogaertPoint(n, k, v)
			xi, di := cosFromAngle(theta)
			if 2*k == n+1 {
				xi, di = 0, 1
			}
			x[j], w[j] = sign*xi, wi
			if d != nil {
				d[j] = di
			}
		}
	})
}

func checkLen(n int, x, w []float64) {
	if n < 1 {
		panic("fast: n < 1")
	}
	if len(x) != n || len(w) != n {
		panic("fast: slice length mismatch")
	}
}
