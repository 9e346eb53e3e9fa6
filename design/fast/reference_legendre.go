package fast

import (
	"context"
	"math"

	"quadwright/precision"
)

// LegendreReference evaluates sampled points of the n-point Gauss-Legendre
// rule in O(1) work each, independently of Bogaert's expansions that build
// the rule: Newton's method in double-double on two classical series for
// P_n, with the weight 2 / (dP_n/dtheta)^2.
//
//   - Away from the ends ((n + 1/2) theta > legendreHyperZ, x = cos theta),
//     the Stieltjes series (G. Szego, Orthogonal Polynomials, 1939, eq.
//     8.21.14): P_n(cos theta) = C_n sum_m h_m cos(phi_m) / (2 sin theta)^(m+1/2),
//     phi_m = (n + m + 1/2) theta - (m + 1/2) pi/2, C_n = (4/pi) 4^n (n!)^2 / (2n+1)!,
//     h_0 = 1, h_(m+1) = h_m (2m+1)^2 / ((2m+2)(2n+2m+3)); its terms fall
//     like m! / (2 n sin theta)^m, so at (n + 1/2) theta > 30 the smallest is
//     below 1e-25 of the sum.
//   - Next to the ends, the terminating hypergeometric series P_n(1 - 2 delta)
//     = sum_j (-n)_j (n+1)_j / (j!)^2 delta^j (Szego 1939, eq. 4.21.2) in the
//     variable delta = (1 - x)/2 itself, so no digit of the distance to the
//     end is lost; at (n + 1/2) theta <= 30 its terms cancel by at most
//     about 1e12, which double-double carries with 20 digits to spare.
type LegendreReference struct {
	n  int
	cn dd
}

// legendreHyperZ is where LegendreReference turns from the hypergeometric
// series to the Stieltjes series.
const legendreHyperZ = 30

// NewLegendreReference prepares the n-point reference.
func NewLegendreReference(n int) *LegendreReference {
	piOnce.Do(buildPi)
	// log C_n = (n+1) log 4 - log pi + 2 log n! - log (2n+1)!
	l := precision.Log(bf(4))
	l.Mul(l, bf(float64(n)+1))
	l.Sub(l, precision.Log(precision.Pi(constPrec)))
	l.Add(l, bf(0).Mul(bf(2), lgam(bf(0), n+1)))
	l.Sub(l, lgam(bf(0), 2*n+2))
	return &LegendreReference{n: n, cn: splitDDc(precision.Exp(l))}
}

// Points returns the reference point for every start, in parallel; it
// returns ctx.Err() when ctx was cancelled.
func (r *LegendreReference) Points(ctx context.Context, starts []float64) ([]RefPoint, error) {
	out := make([]RefPoint, len(starts))
	parallelEach(len(starts), func() bool { return ctx.Err() != nil }, func(i int) {
		p := &out[i]
		p.X, p.WM, p.WE, p.OK = r.Point(starts[i])
	})
	return out, ctx.Err()
}

// Point refines the float64 node x0 to the zero of P_n next to it and
// returns it as hi + lo with its weight wm 2^we; ok is false when Newton's
// method did not settle or the series did not converge.
func (r *LegendreReference) Point(x0 float64) (x [2]float64, wm [2]float64, we int, ok bool) {
	neg := x0 < 0
	th := ddAcos(ddF(math.Abs(x0)))
	var z, w dd
	if float64(r.n)+0.5 < legendreHyperZ/math.Max(th.hi, 1e-300) {
		z, w, ok = r.pointHyper(ddMulF(ddSub(ddF(1), ddF(math.Abs(x0))), 0.5))
	} else {
		z, w, ok = r.pointStieltjes(th)
	}
	if !ok {
		return x, wm, 0, false
	}
	if neg {
		z = ddNeg(z)
	}
	m, e := rescale(w, 0)
	return [2]float64{z.hi, z.lo}, [2]float64{m.hi, m.lo}, e, true
}

const maxLegendreNewton = 8

// pointHyper is Newton's method in delta = (1 - x)/2 on the hypergeometric
// series; it returns the node 1 - 2 delta and the weight 2 / (delta (1 -
// delta) f'(delta)^2), f(delta) = P_n(1 - 2 delta).
func (r *LegendreReference) pointHyper(delta dd) (x, w dd, ok bool) {
	var df dd
	for it := 0; ; it++ {
		f, d := r.hyper(delta)
		if d.hi == 0 || it == maxLegendreNewton {
			return x, w, false
		}
		step := ddDiv(f, d)
		delta = ddSub(delta, step)
		if math.Abs(step.hi) <= 1e-17*math.Abs(delta.hi) {
			_, df = r.hyper(delta)
			break
		}
	}
	x = ddSub(ddF(1), ddMulF(delta, 2))
	den := ddMul(ddMul(delta, ddSub(ddF(1), delta)), ddMul(df, df))
	return x, ddDiv(ddF(2), den), true
}

// hyper returns f(delta) = P_n(1 - 2 delta) and f'(delta).
func (r *LegendreReference) hyper(delta dd) (f, df dd) {
	n := float64(r.n)
	t := ddF(1)
	f = t
	var dsum dd // sum j t_j; f' = dsum / delta
	peak := 1.0
	for j := 0.0; j < n; j++ {
		c := (j - n) * (j + n + 1) // exact below 2^53
		t = ddDiv(ddMul(ddMulF(t, c), delta), ddF((j+1)*(j+1)))
		f = ddAdd(f, t)
		dsum = ddAdd(dsum, ddMulF(t, j+1))
		a := math.Abs(t.hi)
		peak = math.Max(peak, a)
		if a < 1e-36*peak && j > 4 {
			break
		}
	}
	return f, ddDiv(dsum, delta)
}

// pointStieltjes is Newton's method in theta on the Stieltjes series; it
// returns the node cos theta and the weight 2 / (dP_n/dtheta)^2.
func (r *LegendreReference) pointStieltjes(th dd) (x, w dd, ok bool) {
	var dp dd
	for it := 0; ; it++ {
		p, d, conv := r.stieltjes(th)
		if !conv || d.hi == 0 || it == maxLegendreNewton {
			return x, w, false
		}
		step := ddDiv(p, d)
		th = ddSub(th, step)
		if math.Abs(step.hi) <= 1e-17*math.Abs(th.hi) {
			_, dp, conv = r.stieltjes(th)
			if !conv {
				return x, w, false
			}
			break
		}
	}
	// x = 1 - 2 sin^2(theta/2): cos theta itself would carry an absolute
	// error of about 1e-21, too much next to the end.
	sh, _ := ddSinCos(dd{th.hi / 2, th.lo / 2})
	return ddSub(ddF(1), ddMulF(ddMul(sh, sh), 2)), ddDiv(ddF(2), ddMul(dp, dp)), true
}

// stieltjes returns P_n(cos theta) and dP_n/dtheta; conv is false when
// the smallest term is not below 1e-22 of the first.
func (r *LegendreReference) stieltjes(th dd) (p, dp dd, conv bool) {
	n := float64(r.n)
	cth, sth := ddCosSin(th)
	cot := ddDiv(cth, sth)
	g := ddDiv(ddF(0.5), sth) // 1/(2 sin theta)
	q := ddF(1 / math.Sqrt(2*sth.hi))
	// One Newton correction of the float64 reciprocal square root.
	q = ddAdd(q, ddMul(q, ddMulF(ddSub(ddF(1), ddMul(ddMulF(sth, 2), ddMul(q, q))), 0.5)))
	c, s := ddCosSin(ddSub(ddMulF(th, n+0.5), dd{ddHalfPi.hi / 2, ddHalfPi.lo / 2}))
	h := ddF(1)
	first, prev := 0.0, math.Inf(1)
	for m := 0.0; m < 400; m++ {
		hq := ddMul(h, q)
		term := ddMul(hq, c)
		p = ddAdd(p, term)
		dterm := ddAdd(ddMulF(ddMul(hq, s), -(n+m+0.5)), ddMulF(ddMul(ddMul(hq, cot), c), -(m+0.5)))
		dp = ddAdd(dp, dterm)
		mag := math.Abs(hq.hi) * (n + m + 1)
		if m == 0 {
			first = mag
		}
		if mag < 1e-34*first {
			conv = true
			break
		}
		if mag > prev {
			conv = prev < 1e-22*first
			break
		}
		prev = mag
		c, s = ddAdd(ddMul(c, sth), ddMul(s, cth)), ddSub(ddMul(s, sth), ddMul(c, cth))
		h = ddDiv(ddMulF(h, (2*m+1)*(2*m+1)), ddF((2*m+2)*(2*n+2*m+3)))
		q = ddMul(q, g)
	}
	return ddMul(r.cn, p), ddMul(r.cn, dp), conv
}
