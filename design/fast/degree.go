package fast

import (
	"context"
	"math"
)

// degreeChunk is the number of nodes whose sums one task of CheckDegree
// forms; the chunks, and the order in which their sums are added, do not
// depend on the number of cores, so neither does the verdict.
const degreeChunk = 1024

// CheckDegree tests a rule for exactness, degree by degree from 0 to
// maxDeg, in the basis p_0 = 1, sb_{k+1} p_{k+1} = (x - al[k]) p_k -
// sb_k p_{k-1}, sb_k = sqrt(be[k]), of the measure whose monic recurrence
// is (al, be) with be[0] its mass (al and be need maxDeg+1 entries at least;
// the p_j are orthogonal with integrals of p_j^2 equal to be[0]). Degree j
// passes when
//
//	|sum_i w_i p_j(x_i) - delta_j0 be[0]| <= tol sum_i |w_i| (|p_j(x_i)| + |x_i p_j'(x_i)|),
//
// the criterion of the audit (CheckExactness in package design) with its
// ratio independent of how p_j is normalised. The sums run in float64:
// w_i p_j(x_i) and w_i p_j'(x_i) by the recurrence started from w_i (so
// neither a huge p_j nor a tiny weight leaves float64's range) and the
// first sum compensated (two-sum), chunk by chunk in parallel. With double,
// the recurrence and the first sum run in double-double (about ten times
// the work): needed where float64 evaluation of the p_j loses more than
// the tolerance, as for Laguerre nodes far beyond the oscillatory region
// of the low-degree p_j (measured: a correctly rounded 300-point Laguerre
// rule passes only degree 113 in float64, all 599 in double-double).
//
// It returns the highest d such that every j <= d passes (-1 when j = 0
// fails) and the largest ratio residual / (tol scale) over j <= d; err is
// ctx.Err() when ctx was cancelled.
func CheckDegree(ctx context.Context, al, be, x, w []float64, maxDeg int, tol float64, double bool) (degree int, worst float64, err error) {
	if len(x) != len(w) || len(al) <= maxDeg || len(be) <= maxDeg || maxDeg < 0 {
		panic("fast: CheckDegree arguments of mismatched lengths")
	}
	K := maxDeg + 1
	sb := make([]float64, K+1)
	isb := make([]float64, K+1)
	for k := 1; k <= K && k < len(be); k++ {
		sb[k] = math.Sqrt(be[k])
		isb[k] = 1 / sb[k]
	}
	n := len(x)
	chunks := (n + degreeChunk - 1) / degreeChunk
	res := make([][]dd, chunks)
	scl := make([][]float64, chunks)
	parallelEach(chunks, func() bool { return ctx.Err() != nil }, func(c int) {
		lo, hi := c*degreeChunk, min((c+1)*degreeChunk, n)
		if double {
			res[c], scl[c] = degreeSumsDD(al, be, x[lo:hi], w[lo:hi], K)
		} else {
			res[c], scl[c] = degreeSums(al, sb, isb, x[lo:hi], w[lo:hi], K)
		}
	})
	if err := ctx.Err(); err != nil {
		return 0, 0, err
	}
	degree = -1
	for j := 0; j < K; j++ {
		s, sc := ddF(0), 0.0
		for c := range res {
			s = ddAdd(s, res[c][j])
			sc += scl[c][j]
		}
		if j == 0 {
			s = ddSub(s, ddF(be[0]))
		}
		share := 0.0 // an exact zero passes even where the scale is 0
		if r := s.float(); r != 0 {
			share = math.Abs(r) / (tol * sc)
		}
		if !(share <= 1) {
			break
		}
		degree, worst = j, math.Max(worst, share)
	}
	return degree, worst, nil
}

// degreeSums returns, for j < K, sum_i w_i p_j(x_i) (as a double-double
// from two-sums) and sum_i |w_i| (|p_j(x_i)| + |x_i p_j'(x_i)|).
func degreeSums(al, sb, isb, x, w []float64, K int) ([]dd, []float64) {
	m := len(x)
	q0, q1 := make([]float64, m), append([]float64(nil), w...) // w p_{j-1}, w p_j
	r0, r1 := make([]float64, m), make([]float64, m)           // w p'_{j-1}, w p'_j
	res := make([]dd, K)
	scl := make([]float64, K)
	for j := 0; j < K; j++ {
		var s, c, sc float64
		a, b, ib := al[j], sb[j], isb[j+1]
		for i, xi := range x {
			v, dv := q1[i], r1[i]
			t := s + v
			bb := t - s
			c += (s - (t - bb)) + (v - bb)
			s = t
			sc += math.Abs(v) + math.Abs(xi*dv)
			if j+1 < K {
				u := xi - a
				q0[i] = (u*v - b*q0[i]) * ib
				r0[i] = (u*dv + v - b*r0[i]) * ib
			}
		}
		q0, q1 = q1, q0
		r0, r1 = r1, r0
		res[j] = quickTwoSum(s, c)
		scl[j] = sc
	}
	return res, scl
}

// degreeSumsDD is degreeSums in double-double, sb_k and 1/sb_k formed in
// double-double from be[k].
func degreeSumsDD(al, be, x, w []float64, K int) ([]dd, []float64) {
	m := len(x)
	q0, q1 := make([]dd, m), make([]dd, m)
	r0, r1 := make([]dd, m), make([]dd, m)
	for i := range w {
		q1[i] = ddF(w[i])
	}
	res := make([]dd, K)
	scl := make([]float64, K)
	sbPrev := ddF(0)
	for j := 0; j < K; j++ {
		s := ddF(0)
		var sc float64
		a := ddF(al[j])
		var ib dd
		var sbNext dd
		if j+1 < K {
			sbNext = ddSqrt(ddF(be[j+1]))
			ib = ddDiv(ddF(1), sbNext)
		}
		for i, xi := range x {
			v, dv := q1[i], r1[i]
			s = ddAdd(s, v)
			sc += math.Abs(v.hi) + math.Abs(xi*dv.hi)
			if j+1 < K {
				u := ddSub(ddF(xi), a)
				q0[i] = ddMul(ddSub(ddMul(u, v), ddMul(sbPrev, q0[i])), ib)
				r0[i] = ddMul(ddAdd(ddSub(ddMul(u, dv), ddMul(sbPrev, r0[i])), v), ib)
			}
		}
		q0, q1 = q1, q0
		r0, r1 = r1, r0
		res[j] = s
		scl[j] = sc
		sbPrev = sbNext
	}
	return res, scl
}

// ddSqrt returns the square root of a >= 0 in double-double (one Newton
// correction of the float64 root).
func ddSqrt(a dd) dd {
	if a.hi <= 0 {
		return ddF(0)
	}
	s := math.Sqrt(a.hi)
	r := ddSub(a, twoProd(s, s))
	return quickTwoSum(s, r.hi/(2*s))
}
