package fast

import "math"

// Near an end e = -1 or +1 of [-1, 1] (or e = 0 for Laguerre) the plain forward recurrence loses
// the information in the small distance delta = |x - e| (its rounding is
// relative to the products (x - alpha_k) pi_k, not to delta), which matters
// once the nodes come within 1/n^2 of the end. The end form evaluates the
// ratios q_k = pi_k(x) / pi_k(e) instead, through their differences
//
//	D_{k+1} = q_{k+1} - q_k = E_k D_k + s delta g_k q_k,  s = +1 at -1, -1 at +1,
//
// with g_k = pi_k(e) / pi_{k+1}(e) in closed form and E_k = (e - alpha_k)
// g_k - 1 (which is beta_k g_{k-1} g_k by the recurrence at e), so that
// every term carrying delta is a product, never a difference: the zeros
// near the end keep double-double accuracy relative to delta.

// endRatio returns g_k = pi_k(e) / pi_{k+1}(e) for the monic Jacobi
// polynomials at e = -1 (left) or +1: from P_k(-1) = (-1)^k binom(k+b, k),
// P_k(1) = binom(k+a, k) and the leading coefficients (Szego 1939, eq.
// 4.21.6),
//
//	g_k = -+ (2k+a+b+1)(2k+a+b+2) / (2 (k+c+1) (k+a+b+1)),  c = b at -1, a at +1,
//
// and for k = 0 directly 1/(e - alpha_0).
//
// For Laguerre (the end x = 0), pi_k(0) = (-1)^k Gamma(k+a+1)/Gamma(a+1)
// (Szego 1939, eq. 5.1.7), so g_k = -1/(k+a+1).
func (r *Reference) endRatio(k int, left bool) dd {
	if r.laguerre {
		return ddNeg(ddDiv(ddF(1), ddAdd(ddF(float64(k)+1), r.ja)))
	}
	e := 1.0
	if left {
		e = -1
	}
	if k == 0 {
		return ddDiv(ddF(1), ddSub(ddF(e), r.al[0]))
	}
	fk := float64(k)
	s := ddAdd(r.ab, ddF(2*fk))
	c := r.ja
	if left {
		c = r.jb
	}
	num := ddMul(ddAdd(s, ddF(1)), ddAdd(s, ddF(2)))
	den := ddMulF(ddMul(ddAdd(c, ddF(fk+1)), ddAdd(r.ab, ddF(fk+1))), 2)
	g := ddDiv(num, den)
	if left {
		return ddNeg(g)
	}
	return g
}

// prepareEnds sets the constants of the end forms: C = beta_0 ... beta_{n-1}
// / (pi_{n-1}(e) pi_n(e)) at both ends, as mantissa and power of 2.
func (r *Reference) prepareEnds() {
	sides := []bool{true, false}
	if r.laguerre {
		sides = sides[:1]
	}
	for side, left := range sides {
		m, ex := r.normM, r.normE
		for j := 0; j < r.n; j++ {
			g := r.endRatio(j, left)
			if j < r.n-1 {
				g = ddMul(g, g)
			}
			m, ex = rescale(ddMul(m, g), ex)
		}
		r.endM[side], r.endE[side] = m, ex
	}
}

// evalEnd returns q_n, dq_n/d(delta) and q_{n-1} at x = e + s delta
// (s = +1 at the left end, -1 at the right).
func (r *Reference) evalEnd(delta dd, left bool) (q, dq, qm dd) {
	sd := delta
	e := ddF(1)
	switch {
	case r.laguerre:
		e = ddF(0)
	case left:
		e = ddF(-1)
	default:
		sd = ddNeg(delta)
	}
	q0, q1 := ddF(1), ddF(1) // q_{k-1}, q_k; q_{-1} is arbitrary (E_0 = 0)
	dq0, dq1 := ddF(0), ddF(0)
	D, dD := ddF(0), ddF(0)
	for k := 0; k < r.n; k++ {
		g := r.endRatio(k, left)
		E := ddF(0)
		if k > 0 {
			E = ddSub(ddMul(ddSub(e, r.al[k]), g), ddF(1))
		}
		sg := g
		if !left {
			sg = ddNeg(g)
		}
		// D_{k+1} = E_k D_k + s delta g_k q_k; its derivative in delta
		// E_k D'_k + s g_k (q_k + delta q'_k).
		dD = ddAddFast(ddMul(E, dD), ddMul(sg, ddAddFast(q1, ddMul(delta, dq1))))
		D = ddAddFast(ddMul(E, D), ddMul(ddMul(sd, g), q1))
		q0, q1 = q1, ddAdd(q1, D)
		dq0, dq1 = dq1, ddAdd(dq1, dD)
	}
	_ = dq0
	return q1, dq1, q0
}

// pointEnd is Point by the end form, for a start z0 near an end (within
// 1/2, so that 1 -/+ z0 loses nothing).
func (r *Reference) pointEnd(z0 dd, left bool) (x [2]float64, wm [2]float64, we int, ok bool) {
	r.endOnce.Do(r.prepareEnds)
	delta := ddAdd(ddF(1), z0)
	switch {
	case r.laguerre:
		delta = z0
	case !left:
		delta = ddSub(ddF(1), z0)
	}
	var step dd
	var prev float64
	for it := 0; ; it++ {
		q, dq, _ := r.evalEnd(delta, left)
		if dq.hi == 0 || math.IsNaN(dq.hi) || math.IsInf(dq.hi, 0) || it == maxRefNewton {
			return x, wm, 0, false
		}
		prev, step = math.Abs(step.hi), ddDiv(q, dq)
		delta = ddSub(delta, step)
		// Settled: below 1e-15 relative (the error is then of order the
		// step's square), or no longer halving.
		if a := math.Abs(step.hi); a <= 1e-15*math.Abs(delta.hi) || (it >= 2 && a > 0.5*prev) {
			break
		}
	}
	_, dq, qm := r.evalEnd(delta, left)
	side := 0
	z := ddAdd(ddF(-1), delta)
	if r.laguerre {
		z = delta
	}
	dqx := dq // d q_n / dx
	if !left {
		side = 1
		z = ddSub(ddF(1), delta)
		dqx = ddNeg(dq)
	}
	den, de := rescale(ddMul(qm, dqx), 0)
	if den.hi == 0 {
		return x, wm, 0, false
	}
	m, me := rescale(ddDiv(r.endM[side], den), r.endE[side]-de)
	return [2]float64{z.hi, z.lo}, [2]float64{m.hi, m.lo}, me, true
}
