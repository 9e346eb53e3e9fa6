package fast

import (
	"context"
	"fmt"
	"math"
)

// ChebyshevCheck is what CheckChebyshev found.
type ChebyshevCheck struct {
	// Degree is the highest d such that every degree k <= d passed
	// (-1 when k = 0 failed).
	Degree int
	// Direct is the highest degree tested by direct double-double sums,
	// by the audit's criterion with u = DirectTol/10; DirectWorst the largest residual there as a
	// share of that tolerance.
	Direct      int
	DirectTol   float64
	DirectWorst float64
	// TransformWorst is the largest |F_k - mu_k| over the degrees that
	// passed, as a share of the transform's bound tau(k) sum |w_i|;
	// BoundLow and BoundHigh are tau(0) and tau(maxDeg).
	TransformWorst      float64
	BoundLow, BoundHigh float64
	// Agreement is the largest |F_k - S_k| / (tau(k) sum |w_i|) over the
	// degrees summed directly (S_k): at most 1, or the check fails.
	Agreement float64
	// Grid is the length of the transform's periodic grid.
	Grid int
	// Symmetric is set when the rule was exactly symmetric about 0 and
	// the weight even: the odd degrees then hold exactly, and the
	// transforms ran over half the nodes at half the band.
	Symmetric bool
}

// CheckChebyshev tests a rule on a finite interval for exactness in the
// Chebyshev basis T_k(t), t = (x - lo)/half - 1 the variable of [-1, 1],
// for every degree k = 0..maxDeg, against mu_k = half m_k, m_k the
// Chebyshev moments of (1-t)^a (1+t)^b of mass m_0 = mass
// (JacobiChebyshevMoments). Degrees 0..direct are summed directly in
// double-double and pass when |sum_i w_i T_k(t_i) - mu_k| <= tol sum |w_i|
// (tol = 10 u, the audit's criterion; |T_k| <= 1 on [-1, 1] makes this
// stricter than the audit's own scale). All degrees are summed by one
// nonuniform FFT (cosSums, T_k(cos theta) = cos(k theta)) with error at
// most tau(k) sum |w_i|, and pass when |F_k - mu_k| <= tau(k) sum |w_i|,
// so that the rule's own residual is below 2 tau(k) sum |w_i|. The
// transform's bound is itself tested: where both sums exist, and at the
// band's edge k = maxDeg by a direct double-double sum of cos(k theta_i),
// |F_k - S_k| must lie within tau(k) sum |w_i|, or CheckChebyshev fails
// with an error. x must lie in [lo, lo + 2 half].
func CheckChebyshev(ctx context.Context, x, w []float64, lo, half, mass, a, b [2]float64, maxDeg, direct int, tol float64) (ChebyshevCheck, error) {
	if len(x) != len(w) || maxDeg < 0 {
		panic("fast: CheckChebyshev arguments of mismatched lengths")
	}
	direct = min(direct, maxDeg)
	n := len(x)
	L, H := dd{lo[0], lo[1]}, dd{half[0], half[1]}
	unit := L.hi == -1 && L.lo == 0 && H.hi == 1 && H.lo == 0
	sym := unit && a == b && symmetric(x, w)
	// With sym only the angles of the nodes x_i >= 0 are used.
	from := 0
	if sym {
		from = n / 2
	}
	// On [-1, 1] the variable is the node itself (t stays nil).
	var t []dd
	if !unit {
		t = make([]dd, n)
	}
	th := make([]dd, n)
	parallelFor(n, func(i0, i1 int) {
		for i := i0; i < i1; i++ {
			ti := ddF(x[i])
			if !unit {
				ti = ddSub(ddDiv(ddSub(ti, L), H), ddF(1))
			}
			ti.hi = math.Max(-1, math.Min(1, ti.hi))
			if !unit {
				t[i] = ti
			}
			if i >= from {
				th[i] = ddAcos(ti)
			}
		}
	})
	if err := ctx.Err(); err != nil {
		return ChebyshevCheck{}, err
	}
	var sumAbs float64
	for _, v := range w {
		sumAbs += math.Abs(v)
	}
	muDone := make(chan []dd, 1)
	go func() {
		mu := JacobiChebyshevMoments(dd{a[0], a[1]}, dd{b[0], b[1]}, dd{mass[0], mass[1]}, maxDeg)
		for k := range mu {
			mu[k] = ddMul(mu[k], H)
		}
		muDone <- mu
	}()
	tf := chebTransforms(x, w, th, H.hi, maxDeg, sym)
	S, sc := directChebyshev(x, t, w, H.hi, direct)
	edgeDeg, step := maxDeg, 1
	if sym {
		step, edgeDeg = 2, maxDeg-maxDeg%2
	}
	edge := directCos(tf.ang, tf.c, edgeDeg/step)
	tr, trA, mu := <-tf.fine, <-tf.coarse, <-muDone
	if err := ctx.Err(); err != nil {
		return ChebyshevCheck{}, err
	}
	// F(k) and its bound: at index k/step; with sym the odd degrees are
	// exactly 0 (mirror pairs cancel exactly) and need no transform.
	F := func(k int) float64 { return tr.F[k/step] }
	bound := func(k int) float64 { return tr.errBound(k/step) * sumAbs }
	lower := func(k int) float64 {
		j := k / step
		return math.Max(0, float64(k)*(tf.sumA-trA.F[j]-trA.errBound(j)*tf.sumA)/2)
	}
	c := ChebyshevCheck{Degree: -1, Direct: direct, DirectTol: tol, Grid: tr.grid, Symmetric: sym,
		BoundLow: tr.errBound(0), BoundHigh: tr.errBound(edgeDeg / step)}
	agree := func(k int, s dd) error {
		share := math.Abs(ddSub(s, ddF(F(k))).float()) / bound(k)
		c.Agreement = math.Max(c.Agreement, share)
		if !(share <= 1) {
			return fmt.Errorf("the nonuniform FFT of the exactness check missed its error bound at degree %d (%.3g times the bound)", k, share)
		}
		return nil
	}
	for k := 0; k <= direct; k++ {
		if sym && k%2 == 1 {
			continue
		}
		if err := agree(k, S[k]); err != nil {
			return c, err
		}
		if l := lower(k); l > sc[k]*(1+1e-9) {
			return c, fmt.Errorf("the lower bound of the audit's scale at degree %d, %.6g, exceeds the scale %.6g", k, l, sc[k])
		}
	}
	if err := agree(edgeDeg, edge); err != nil {
		return c, err
	}
	for k := 0; k <= maxDeg; k++ {
		if k <= direct {
			share := 0.0
			if r := ddSub(S[k], mu[k]).float(); r != 0 {
				share = math.Abs(r) / (tol * sc[k])
			}
			if !(share <= 1) {
				break
			}
			c.DirectWorst = math.Max(c.DirectWorst, share)
		}
		if sym && k%2 == 1 {
			if mu[k].hi != 0 {
				break
			}
			c.Degree = k
			continue
		}
		share := math.Abs(ddSub(ddF(F(k)), mu[k]).float()) / (bound(k) + tol*lower(k))
		if !(share <= 1) {
			break
		}
		c.TransformWorst = math.Max(c.TransformWorst, share)
		c.Degree = k
	}
	return c, nil
}

// symmetric reports whether the rule is exactly symmetric about 0: x_i =
// -x_(n-1-i) and w_i = w_(n-1-i) as float64 values.
func symmetric(x, w []float64) bool {
	n := len(x)
	for i := 0; i < n/2; i++ {
		if x[i] != -x[n-1-i] || w[i] != w[n-1-i] {
			return false
		}
	}
	return n%2 == 0 || x[n/2] == 0
}

// chebPending is the pair of transforms chebTransforms started.
type chebPending struct {
	fine, coarse chan *cosTransform
	sumA         float64
	ang          []dd      // the angles of the fine transform
	c            []float64 // and its weights
}

// chebTransforms starts, each on a goroutine of its own, the transform
// of sum_i w_i cos(k theta_i) (fine) and the one behind the lower bound
// of the audit's scale (coarse): at degree k that scale is at least
// sum_i |w_i x_i| k |sin(k theta_i)| / (half sin theta_i) >= k sum_i a_i
// (1 - cos(2k theta_i)) / 2 (as |s| >= s^2), a_i = |w_i x_i| / (half sin
// theta_i), and the coarse transform gives sum_i a_i cos(2k theta_i) for
// every k. For a symmetric rule (sym) both run over the nodes x_i >= 0
// with the doubled angles, mirror pairs weighted twice: sum_i w_i cos(2j
// theta_i) over all nodes is sum over that half of c_i cos(j 2 theta_i),
// so the even degrees 2j cost a transform of half the band.
func chebTransforms(x, w []float64, th []dd, half float64, maxDeg int, sym bool) chebPending {
	n := len(x)
	ang, c := th, w
	K := maxDeg + 1
	if sym {
		m := (n + 1) / 2
		ang, c = make([]dd, m), make([]float64, m)
		for j := 0; j < m; j++ {
			i := n - m + j // the nodes x_i >= 0
			ang[j], c[j] = doubled(th[i]), 2*w[i]
			if x[i] == 0 {
				c[j] = w[i]
			}
		}
		K = maxDeg/2 + 1
	}
	phi := make([]dd, len(ang))
	av := make([]float64, len(ang))
	var p chebPending
	for j := range ang {
		phi[j] = doubled(ang[j])
		i := j
		if sym {
			i = n - len(ang) + j
		}
		if sn := math.Sin(th[i].hi); sn > 0 {
			av[j] = math.Abs(c[j]*x[i]) / (half * sn) * (1 - 1e-12)
		}
		p.sumA += av[j]
	}
	p.fine, p.coarse = make(chan *cosTransform, 1), make(chan *cosTransform, 1)
	go func() { p.fine <- cosSums(ang, c, K, nufftFine) }()
	go func() { p.coarse <- cosSums(phi, av, K, nufftCoarse) }()
	p.ang, p.c = ang, c
	return p
}

// doubled returns 2a folded into [0, pi] (cos(k 2a) = cos(k (2 pi -
// 2a))), for a in [0, pi].
func doubled(a dd) dd {
	if a.hi > math.Pi/2 {
		return ddMulF(ddSub(ddPi, a), 2)
	}
	return dd{2 * a.hi, 2 * a.lo}
}

// directChebyshev returns S_k = sum_i w_i T_k(t_i) for k = 0..K in
// double-double (t nil: t_i = x_i), by the recurrence T_{k+1} = 2 t T_k - T_{k-1} (stable on
// [-1, 1]: its rounding grows like k, not faster), and the audit's scale
// sc_k = sum_i |w_i| (|T_k(t_i)| + |x_i T_k'(t_i)| / half) in float64
// (T_k' = k U_{k-1}), chunk by chunk in parallel and the chunks added in
// order, so that the result does not depend on the number of cores.
func directChebyshev(x []float64, t []dd, w []float64, halfF float64, K int) ([]dd, []float64) {
	n := len(x)
	chunks := (n + degreeChunk - 1) / degreeChunk
	part := make([][]dd, chunks)
	partSc := make([][]float64, chunks)
	parallelEach(chunks, nil, func(c int) {
		s := make([]dd, K+1)
		sc := make([]float64, K+1)
		for i := c * degreeChunk; i < min((c+1)*degreeChunk, n); i++ {
			ti := ddF(x[i])
			if t != nil {
				ti = t[i]
			}
			t0, t1 := ddF(1), ti
			tt := dd{2 * ti.hi, 2 * ti.lo}
			aw, ax := math.Abs(w[i]), math.Abs(x[i])/halfF
			tf := ti.hi
			u0, u1 := 0.0, 1.0 // U_{k-2}, U_{k-1}
			s[0] = ddAdd(s[0], ddF(w[i]))
			sc[0] += aw
			// The sums by the cheaper double-double addition (its error
			// relative to the terms, about 2^-104 of sum |w_i|).
			exact := ti.lo == 0
			for k := 1; k <= K; k++ {
				s[k] = ddAddFast(s[k], ddMulF(t1, w[i]))
				sc[k] += aw * (math.Abs(t1.hi) + ax*float64(k)*math.Abs(u1))
				if exact {
					t0, t1 = t1, ddAddFast(ddMulF(t1, tt.hi), ddNeg(t0))
				} else {
					t0, t1 = t1, ddAddFast(ddMul(tt, t1), ddNeg(t0))
				}
				u0, u1 = u1, 2*tf*u1-u0
			}
		}
		part[c], partSc[c] = s, sc
	})
	S := make([]dd, K+1)
	Sc := make([]float64, K+1)
	for c, s := range part {
		for k := range S {
			S[k] = ddAdd(S[k], s[k])
			Sc[k] += partSc[c][k]
		}
	}
	return S, Sc
}

// directCos returns sum_i w_i cos(k theta_i) in double-double (for a
// symmetric rule over the half at the doubled angles: the even degree
// 2k).
func directCos(th []dd, w []float64, k int) dd {
	n := len(th)
	chunks := (n + degreeChunk - 1) / degreeChunk
	part := make([]dd, chunks)
	parallelEach(chunks, nil, func(c int) {
		var s dd
		for i := c * degreeChunk; i < min((c+1)*degreeChunk, n); i++ {
			cs, _ := ddCosSin(ddMulF(th[i], float64(k)))
			s = ddAdd(s, ddMulF(cs, w[i]))
		}
		part[c] = s
	})
	var S dd
	for _, s := range part {
		S = ddAdd(S, s)
	}
	return S
}

// JacobiChebyshevMoments returns m_k = integral over [-1, 1] of (1-t)^a
// (1+t)^b T_k(t) dt for k = 0..K, m_0 = mass, in double-double, by the
// recurrence
//
//	(k + 2 + a + b) m_{k+1} = 2 (b - a) m_k + (k - 2 - a - b) m_{k-1},
//
// from integrating (1-t^2) w'(t) T_k(t) by parts (R. Piessens and M.
// Branders, "The evaluation and application of some modified moments",
// BIT 13, 1973). Its two solutions behave like k^(-2a-2) and (-1)^k
// k^(-2b-2), both parts of m_k, so the forward direction is stable.
func JacobiChebyshevMoments(a, b, mass dd, K int) []dd {
	m := make([]dd, K+1)
	m[0] = mass
	s := ddAdd(a, b)
	ba2 := ddMulF(ddSub(b, a), 2)
	sym := ba2.hi == 0 // the odd moments vanish
	// With s a multiple of 2^-20 below 2^20 (every half-integer sum of
	// exponents), k - 2 - s and k + 2 + s are exact in float64 for k
	// below 2^32.
	short := s.lo == 0 && math.Abs(s.hi) < 0x1p20 && s.hi*0x1p20 == math.Trunc(s.hi*0x1p20)
	if K >= 1 {
		m[1] = ddDiv(ddMul(mass, ddSub(b, a)), ddAdd(s, ddF(2)))
	}
	for k := 1; k < K; k++ {
		fk := float64(k)
		var num dd
		if short {
			num = ddMulF(m[k-1], fk-2-s.hi)
		} else {
			num = ddMul(ddSub(ddF(fk-2), s), m[k-1])
		}
		if !sym {
			num = ddAdd(ddMul(ba2, m[k]), num)
		}
		if short {
			m[k+1] = ddDivF(num, fk+2+s.hi)
		} else {
			m[k+1] = ddDiv(num, ddAdd(ddF(fk+2), s))
		}
	}
	return m
}

// ddDivF returns a / b for a float64 b in double-double (two correction
// steps of the float64 quotient).
func ddDivF(a dd, b float64) dd {
	q1 := a.hi / b
	p := twoProd(q1, b)
	r := (a.hi - p.hi - p.lo + a.lo) / b
	return quickTwoSum(q1, r)
}

// JacobiChebyshevMomentsF is JacobiChebyshevMoments of float64 arguments,
// rounded to float64 (for tests).
func JacobiChebyshevMomentsF(a, b, mass float64, K int) []float64 {
	m := JacobiChebyshevMoments(ddF(a), ddF(b), ddF(mass), K)
	out := make([]float64, len(m))
	for k, v := range m {
		out[k] = v.float()
	}
	return out
}
