package moments

import (
	"math"
	"math/big"

	"quadwright/precision"
)

// pow2Sum is a sum of powers of two 2^e, kept as m * 2^e0 with a float64 m:
// adding a term costs an integer subtraction and a float64 addition, where
// an xfloat would renormalise. It serves the scale sums, which need a few
// digits over an exponent range no float64 has.
type pow2Sum struct {
	m float64
	e int64
}

// pow2 returns 2^d for -1022 <= d <= 1023.
func pow2(d int64) float64 { return math.Float64frombits(uint64(d+1023) << 52) }

func (s *pow2Sum) add(e int64) {
	if s.m == 0 {
		s.m, s.e = 1, e
		return
	}
	d := e - s.e
	switch {
	case d > 1000:
		s.m, s.e = 1, e // the old sum is below 2^-500 of the new term
		return
	case d < -1000:
		return
	}
	s.m += pow2(d)
	if s.m > 0x1p500 {
		s.m *= 0x1p-500
		s.e += 500
	}
}

func (s pow2Sum) xf() xfloat { return xfNorm(s.m, s.e) }

// accum holds one worker's running sums over nodes, and the scratch values
// of the basis recurrence.
type accum struct {
	sum               []*precision.Real
	abs               []pow2Sum
	r0, r1, r2, t, rh *precision.Real
	xa, xr, cr, ce    *precision.Real
	expo              []int64 // exponent of the last node's term k (walk only)
	zero              []bool
	err               error // a function of a system that could not be evaluated (functions.go)
}

func (p *deProblem) newAccum(walk bool) *accum {
	s := precision.NewRealSlice(9, p.prec)
	a := &accum{sum: precision.NewRealSlice(p.nk, p.prec), abs: make([]pow2Sum, p.nk),
		r0: s[0], r1: s[1], r2: s[2], t: s[3], rh: s[4], xa: s[5], xr: s[6], cr: s[7], ce: s[8]}
	if walk {
		a.expo = make([]int64, p.nk)
		a.zero = make([]bool, p.nk)
	}
	return a
}

// add accumulates the terms c q_k(x), k < nk, formed by the basis
// recurrence applied to r_k = c q_k(x) itself (it is linear), with the
// exponent of each term added to the scale sums: 2^e > |r_k| >= 2^(e-1), so
// the scale lies between one and two times the sum of |terms|.
func (p *deProblem) add(a *accum, pt dePoint, c *big.Float) {
	if p.funcs != nil {
		p.addFunctions(a, pt, c)
		return
	}
	a.xr.SetBig(pt.x)
	a.cr.SetBig(c)
	prev, cur, next := a.r0, a.r1, a.r2
	prev.SetInt64(0)
	cur.Set(a.cr)
	if p.aConst {
		a.xa.Sub(a.xr, p.a[0])
	}
	for k := 0; k < p.nk; k++ {
		a.sum[k].Add(a.sum[k], cur)
		if cur.IsZero() {
			if a.zero != nil {
				a.zero[k] = true
			}
		} else {
			e := cur.Exponent()
			a.abs[k].add(e)
			if a.zero != nil {
				a.zero[k], a.expo[k] = false, e
			}
		}
		if k+1 == p.nk {
			break
		}
		if !p.aConst {
			a.xa.Sub(a.xr, p.a[k])
		}
		next.Mul(a.xa, cur)
		if !p.bZero {
			a.t.Mul(p.b[k], prev)
			next.Sub(next, a.t)
		}
		prev, cur, next = cur, next, prev
	}
}

// addPair accumulates two nodes mirrored about the centre A of a basis
// with constant A (q_k(A+y) = (-1)^k q_k(A-y)): x is one of them, c and cm
// the masses at x and at its mirror. Then c q_k(x) + cm q_k(x') = q_k(x)
// (c + (-1)^k cm), so one recurrence, on r_k = (c+cm) q_k(x), serves both:
// the even terms are r_k, the odd ones r_k (c-cm)/(c+cm). The scale sums
// get |q_k(x)| (c+cm) = |r_k|, the sum of the two |terms|.
func (p *deProblem) addPair(a *accum, x, c, cm *big.Float) {
	a.xr.SetBig(x)
	a.cr.SetBig(c)
	a.ce.SetBig(cm)
	a.rh.Sub(a.cr, a.ce)
	a.cr.Add(a.cr, a.ce)
	if a.cr.IsZero() {
		return
	}
	a.rh.Quo(a.rh, a.cr)
	prev, cur, next := a.r0, a.r1, a.r2
	prev.SetInt64(0)
	cur.Set(a.cr)
	a.xa.Sub(a.xr, p.a[0])
	for k := 0; k < p.nk; k++ {
		if k&1 == 0 {
			a.sum[k].Add(a.sum[k], cur)
		} else {
			a.t.Mul(cur, a.rh)
			a.sum[k].Add(a.sum[k], a.t)
		}
		if !cur.IsZero() {
			a.abs[k].add(cur.Exponent())
		}
		if k+1 == p.nk {
			break
		}
		next.Mul(a.xa, cur)
		a.t.Mul(p.b[k], prev)
		next.Sub(next, a.t)
		prev, cur, next = cur, next, prev
	}
}

// merge adds b's sums into a.
func (a *accum) merge(b *accum) {
	for k := range a.sum {
		a.sum[k].Add(a.sum[k], b.sum[k])
		if b.abs[k].m != 0 {
			a.abs[k] = xfToPow2Sum(a.abs[k].xf().add(b.abs[k].xf()))
		}
	}
}

func xfToPow2Sum(x xfloat) pow2Sum { return pow2Sum{x.m, x.e} }

// tiny reports whether the last node's terms are all negligible: zero, or
// below eps times the scale summed so far.
func (a *accum) tiny(eps xfloat) bool { return a.firstLarge(eps) < 0 }

// firstLarge returns the lowest k whose last term is not negligible, or -1.
func (a *accum) firstLarge(eps xfloat) int {
	for k := range a.abs {
		if !a.zero[k] && xfPow2(a.expo[k]).cmp(eps.mul(a.abs[k].xf())) > 0 {
			return k
		}
	}
	return -1
}
