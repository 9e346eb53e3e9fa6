package fast

import (
	"context"
	"math"
	"sync"
)

// Reference evaluates sampled points of a Gauss rule independently of the
// asymptotic methods that build the fast rules: Newton's method on the monic
// three-term recurrence in double-double, started from a float64 node, and
// the Christoffel number
//
//	lambda = beta_0 beta_1 ... beta_{n-1} / (pi_{n-1}(x) pi_n'(x))
//
// (Gautschi, Orthogonal Polynomials: Computation and Approximation, Oxford
// 2004, Theorem 1.46). Each point costs two passes over the recurrence,
// O(n) with about 30 floating-point operations per step; the values are
// rescaled by powers of 2 as they go, so no range is exceeded however
// large n is. The recurrence coefficients are formed once, in
// double-double, from the closed forms (Gautschi 2004, Table 1.1) of the
// exact parameters given to about 2^-106.
//
// Next to the ends of [-1, 1] the plain forward recurrence loses accuracy
// in relative terms of the distance to the end as n grows (measured at
// n = 3 10^6: the 40th Legendre weight 4.5e-10 off), so for |x| > 1/2 a
// Jacobi reference uses the end form of reference_ends.go (about three
// times the work per step), started from the plain form's zero.
type Reference struct {
	n      int
	al, be []dd
	// The product beta_0 ... beta_{n-1} = normM 2^normE.
	normM dd
	normE int
	// The end forms (reference_ends.go), for Jacobi only: the exponents,
	// their sum, and beta_0 ... beta_{n-1} / (pi_{n-1}(e) pi_n(e)) at
	// e = -1 and +1, prepared on first use.
	jacobi     bool
	laguerre   bool // the end form at x = 0 (left only)
	ja, jb, ab dd
	ends       bool
	endOnce    sync.Once
	endM       [2]dd
	endE       [2]int
}

// NewReference prepares the n-point reference of a family: kind
// GaussJacobi (alpha, beta the Jacobi exponents), GaussLaguerre (alpha)
// or GaussHermite, on the family's own interval, the parameters and the
// mass beta_0 each given as a pair hi + lo.
func NewReference(kind Kind, n int, alpha, beta, mass [2]float64) *Reference {
	r := &Reference{n: n, al: make([]dd, n), be: make([]dd, n)}
	a, b := dd{alpha[0], alpha[1]}, dd{beta[0], beta[1]}
	switch kind {
	case GaussJacobi:
		r.jacobi, r.ja, r.jb, r.ab = true, a, b, ddAdd(a, b)
	case GaussLaguerre:
		r.laguerre, r.ja = true, a
	}
	one := ddF(1)
	for k := 0; k < n; k++ {
		fk := float64(k)
		switch kind {
		case GaussJacobi:
			ab := ddAdd(a, b)
			s := ddAdd(ab, ddF(2*fk)) // 2k+a+b
			ba := ddMul(ddSub(b, a), ddAdd(b, a))
			if k == 0 {
				r.al[k] = ddDiv(ddSub(b, a), ddAdd(ab, ddF(2)))
			} else {
				r.al[k] = ddDiv(ba, ddMul(s, ddAdd(s, ddF(2))))
			}
			switch k {
			case 0:
			case 1:
				d := ddAdd(ab, ddF(2))
				num := ddMulF(ddMul(ddAdd(one, a), ddAdd(one, b)), 4)
				r.be[k] = ddDiv(num, ddMul(ddMul(d, d), ddAdd(ab, ddF(3))))
			default:
				num := ddMul(ddMul(ddMulF(ddAdd(ddF(fk), a), 4*fk), ddAdd(ddF(fk), b)), ddAdd(ddF(fk), ab))
				den := ddMul(ddMul(ddMul(s, s), ddAdd(s, one)), ddSub(s, one))
				r.be[k] = ddDiv(num, den)
			}
		case GaussLaguerre:
			r.al[k] = ddAdd(ddF(2*fk+1), a)
			r.be[k] = ddMulF(ddAdd(ddF(fk), a), fk)
		case GaussHermite:
			r.be[k] = ddF(fk / 2)
		default:
			panic("fast: NewReference of an unknown family")
		}
	}
	r.be[0] = dd{mass[0], mass[1]}
	r.normM = ddF(1)
	for k := 0; k < n; k++ {
		r.normM = ddMul(r.normM, r.be[k])
		r.normM, r.normE = rescale(r.normM, r.normE)
	}
	return r
}

// rescale returns m 2^e as m' 2^e' with |m'| in [2^-1, 2^1) (m' = m when
// m is 0).
func rescale(m dd, e int) (dd, int) {
	if m.hi == 0 {
		return m, e
	}
	_, k := math.Frexp(m.hi)
	return dd{math.Ldexp(m.hi, -k), math.Ldexp(m.lo, -k)}, e + k
}

// eval returns pi_n(x), pi_n'(x) and pi_{n-1}(x), each divided by the
// same power 2^e.
func (r *Reference) eval(x dd) (p, dp, q dd, e int) {
	p0, p1 := ddF(0), ddF(1)
	d0, d1 := ddF(0), ddF(0)
	const big, bigE = 0x1p400, 400
	// The sums are the cheaper double-double addition (error relative
	// to the operands, not to the sum), which suits a recurrence: its
	// float64 form errs the same way, 2^53 times more.
	for k := 0; k < r.n; k++ {
		t := ddAddFast(x, ddNeg(r.al[k]))
		var pn, dn dd
		if k == 0 {
			pn, dn = t, ddF(1)
		} else {
			pn = ddAddFast(ddMul(t, p1), ddNeg(ddMul(r.be[k], p0)))
			dn = ddAddFast(ddAddFast(ddMul(t, d1), ddNeg(ddMul(r.be[k], d0))), p1)
		}
		p0, p1, d0, d1 = p1, pn, d1, dn
		if m := math.Abs(p1.hi) + math.Abs(d1.hi); m > big || (m < 1/big && m != 0) {
			s := -bigE
			if m < 1/big {
				s = bigE
			}
			p0, p1 = ddScale(p0, s), ddScale(p1, s)
			d0, d1 = ddScale(d0, s), ddScale(d1, s)
			e -= s
		}
	}
	return p1, d1, p0, e
}

func ddScale(a dd, s int) dd { return dd{math.Ldexp(a.hi, s), math.Ldexp(a.lo, s)} }

// maxRefNewton bounds the Newton steps of Point.
const maxRefNewton = 12

// Point refines x0 to a zero of pi_n by Newton's method until the step is
// below 1e-15 of the point, its error then of order the step's square (two
// steps from a float64 node are not always enough: near an end at n = 10^7
// they left the first weight 6e-6 off), and
// returns it as hi + lo, with the weight lambda = wm 2^we (wm a pair hi +
// lo, |wm| in [1/2, 2)). ok is false when the recurrence gave no usable
// derivative or the steps did not settle.
func (r *Reference) Point(x0 float64) (x [2]float64, wm [2]float64, we int, ok bool) {
	z, ok := r.newton(x0)
	if r.jacobi && math.Abs(x0) > 0.5 {
		// The plain form's zero is within about 1e-13 of its distance to
		// the end; one or two steps of the end form finish it.
		if !ok {
			z = ddF(x0)
		}
		return r.pointEnd(z, x0 < 0)
	}
	if r.laguerre && x0 < 1 {
		if !ok {
			z = ddF(x0)
		}
		return r.pointEnd(z, true)
	}
	if !ok {
		return x, wm, 0, false
	}
	_, dp, q, e := r.eval(z)
	den, de := rescale(ddMul(q, dp), 2*e)
	if den.hi == 0 {
		return x, wm, 0, false
	}
	m, me := rescale(ddDiv(r.normM, den), r.normE-de)
	return [2]float64{z.hi, z.lo}, [2]float64{m.hi, m.lo}, me, true
}

// RefPoint is the result of Reference.Point for one start.
type RefPoint struct {
	X, WM [2]float64
	WE    int
	OK    bool
}

// Points calls Point for every start, in parallel; it returns ctx.Err()
// when ctx was cancelled.
func (r *Reference) Points(ctx context.Context, starts []float64) ([]RefPoint, error) {
	out := make([]RefPoint, len(starts))
	parallelEach(len(starts), func() bool { return ctx.Err() != nil }, func(i int) {
		p := &out[i]
		p.X, p.WM, p.WE, p.OK = r.Point(starts[i])
	})
	return out, ctx.Err()
}

// newton refines x0 to a zero of pi_n by Newton's method on the plain
// recurrence until the step settles (below 1e-15 relative, or no longer
// halving); ok is false when it did not.
func (r *Reference) newton(x0 float64) (z dd, ok bool) {
	z = ddF(x0)
	var step dd
	var prev float64
	for it := 0; ; it++ {
		p, dp, _, _ := r.eval(z)
		if dp.hi == 0 || math.IsNaN(dp.hi) || math.IsInf(dp.hi, 0) || it == maxRefNewton {
			return z, false
		}
		prev, step = math.Abs(step.hi), ddDiv(p, dp)
		z = ddSub(z, step)
		// Settled: a step below 1e-15 relative leaves an error of order
		// its square (quadratic convergence); or no longer halving (the
		// rounding level of the evaluation).
		if a := math.Abs(step.hi); a <= 1e-15*math.Abs(z.hi) || (it >= 2 && a > 0.5*prev) || z.hi == 0 {
			break
		}
	}
	return z, true
}
