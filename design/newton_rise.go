package design

import (
	"context"
	"math/bits"
	"sync"

	"quadwright/precision"
)

// Newton at rising precision. A step of Newton's method roughly doubles the
// number of correct bits of a node, so running every step at the target
// precision wastes most of the work: the early steps need only as many bits
// as they can make correct. riseNewton runs each step at the smallest
// multiple of 64 bits (at least 128) that can hold twice the bits the node
// already has, and only the last one or two at the target precision.
//
// The bits a node has are read off the step itself: for a simple zero z of
// f and a step delta = f(x)/f'(x) from x close to z, the new iterate is off
// by about K delta^2 with K = |f''/(2 f')| (the quadratic term of Taylor's
// formula), so the evaluation of pi_n, pi_n' and pi_n'' at the old point
// tells how good the new one is, without a further evaluation. That is
// also what ends the iteration at the target precision: once K delta^2 is
// below the rounding level, a further step could only move the node by
// rounding noise. The weight, norm / (pi_{n-1} pi_n'), is then taken at the
// new node from the values at the old one by first-order Taylor
// corrections (pi_{n-1}(x - delta) = pi_{n-1}(x) - delta pi_{n-1}'(x) and
// likewise for pi_n'), whose second-order remainder the same test keeps
// below the rounding level. Gauss's second, confirming stage still checks
// every printed digit against a computation at 64 more bits.

// evalD2 runs the three-term recurrence with the first and second
// derivatives of pi_n. pi_n and pi_n' run at the level's precision; pi_n”
// only scales the step's error estimate and the weight's first-order
// correction delta pi_n”, a term some (top - noise)/2 bits below pi_n', so
// it runs at about half the precision (c2), and as h = pi_n”/2, whose
// recurrence h_k+1 = (x - alpha_k) h_k - beta_k h_k-1 + pi_k' needs no
// doubling.
type evalD2 struct {
	n         int
	symmetric bool // all alpha_k are 0: x - alpha_k is x
	a, b      []*precision.Real
	b2        []*precision.Real // b at the precision of the h chain
	split     bool              // the h chain runs at a lower precision

	p0, p1, d0, d1, t, u, v, w *precision.Real
	h0, h1, hz, t2, u2, dd, x2 *precision.Real // the h chain
	// After eval(x): p = pi_n(x), q = pi_{n-1}(x), dp = pi_n'(x),
	// dq = pi_{n-1}'(x), h = pi_n''(x)/2 (at the h chain's precision).
	p, q, dp, dq, h *precision.Real
}

func newEvalD2(c, c2 *riseCoeffs) *evalD2 {
	r := precision.NewRealSlice(8, c.prec)
	e := &evalD2{n: len(c.a), symmetric: c.symmetric, a: c.a, b: c.b, b2: c2.b, split: c2.prec != c.prec,
		p0: r[0], p1: r[1], d0: r[2], d1: r[3], t: r[4], u: r[5], v: r[6], w: r[7]}
	h := precision.NewRealSlice(7, c2.prec)
	e.h0, e.h1, e.hz, e.t2, e.u2, e.dd, e.x2 = h[0], h[1], h[2], h[3], h[4], h[5], h[6]
	return e
}

func (e *evalD2) eval(x *precision.Real) {
	p0, p1, d0, d1 := e.p0, e.p1, e.d0, e.d1
	t, u, v, w := e.t, e.u, e.v, e.w
	h0, h1, hz, t2, u2, dd := e.h0, e.h1, e.hz, e.t2, e.u2, e.dd
	p0.SetInt64(1)
	p1.Sub(x, e.a[0])
	d0.SetInt64(0)
	d1.SetInt64(1)
	h0.SetInt64(0)
	h1.SetInt64(0)
	xk, xk2 := t, t2
	if e.symmetric {
		xk = x
		xk2 = e.x2.Set(x)
	}
	if !e.split {
		xk2, dd = xk, d1
	}
	for k := 1; k < e.n; k++ {
		if !e.symmetric {
			t.Sub(x, e.a[k])
			if e.split {
				t2.Set(t)
			}
		}
		bk := e.b[k]
		if e.split {
			dd.Set(d1)
		} else {
			dd = d1
		}
		u.Mul(bk, p0)
		v.MulSub(xk, p1, u) // pi_{k+1}
		u.Mul(bk, d0)
		w.MulSub(xk, d1, u)
		w.Add(w, p1) // pi_{k+1}'
		u2.Mul(e.b2[k], h0)
		hz.MulSub(xk2, h1, u2)
		hz.Add(hz, dd) // pi_{k+1}''/2
		p0, p1, v = p1, v, p0
		d0, d1, w = d1, w, d0
		h0, h1, hz = h1, hz, h0
	}
	e.p0, e.p1, e.d0, e.d1, e.v, e.w, e.h0, e.h1, e.hz = p0, p1, d0, d1, v, w, h0, h1, hz
	e.p, e.q, e.dp, e.dq, e.h = p1, p0, d1, d0, h1
}

// riseCoeffs is a recurrence rounded to one precision of the rise.
type riseCoeffs struct {
	prec      uint
	symmetric bool
	a, b      []*precision.Real
	norm      *precision.Real // beta_0 ... beta_{n-1}
}

// riseLevels hands out the recurrence at the precisions the workers ask
// for, each rounded once from the target precision and shared read-only.
type riseLevels struct {
	mu     sync.Mutex
	top    *riseCoeffs
	levels map[uint]*riseCoeffs
}

func (l *riseLevels) at(prec uint) *riseCoeffs {
	if prec >= l.top.prec {
		return l.top
	}
	l.mu.Lock()
	defer l.mu.Unlock()
	if c, ok := l.levels[prec]; ok {
		return c
	}
	n := len(l.top.a)
	c := &riseCoeffs{prec: prec, symmetric: l.top.symmetric, a: precision.NewRealSlice(n, prec), b: precision.NewRealSlice(n, prec)}
	for k := 0; k < n; k++ {
		c.a[k].Set(l.top.a[k])
		c.b[k].Set(l.top.b[k])
	}
	l.levels[prec] = c
	return c
}

// riseWorker is one goroutine's evaluators (one per precision level) and
// scratch values.
type riseWorker struct {
	levels *riseLevels
	evals  map[uint]*evalD2
	xs     map[uint]*precision.Real
	delta  *precision.Real
	f, g   *precision.Real // scratch at the target precision
}

func newRiseWorker(l *riseLevels) *riseWorker {
	s := precision.NewRealSlice(3, l.top.prec)
	return &riseWorker{levels: l, evals: map[uint]*evalD2{}, xs: map[uint]*precision.Real{}, delta: s[0], f: s[1], g: s[2]}
}

func (rw *riseWorker) eval(prec uint) (*evalD2, *precision.Real) {
	e, ok := rw.evals[prec]
	if !ok {
		e = newEvalD2(rw.levels.at(prec), rw.levels.at(rw.halfPrec(prec)))
		rw.evals[prec] = e
		rw.xs[prec] = precision.NewReal(prec)
	}
	return e, rw.xs[prec]
}

// halfPrec is the precision of the h chain at level q (see evalD2).
func (rw *riseWorker) halfPrec(q uint) uint {
	return riseRound((int(q)+rw.noise())/2+8, q)
}

// noise is the bits the recurrence's rounding costs, about.
func (rw *riseWorker) noise() int { return 2*bits.Len(uint(len(rw.levels.top.a))) + 8 }

// riseRound returns the level for b bits: b rounded up to a multiple of
// 64, at least 128 and at most top.
func riseRound(b int, top uint) uint {
	if b < 128 {
		b = 128
	}
	q := uint((b + 63) / 64 * 64)
	return min(q, top)
}

// newton refines x (at the target precision) to a zero of pi_n, starting
// from about startBits correct bits, and sets wt to its Christoffel number.
// It reports false when the iteration did not settle.
func (rw *riseWorker) newton(x, wt *precision.Real, startBits int) bool {
	top := rw.levels.top.prec
	noise := rw.noise()
	q, cubic := rw.plan(startBits, 0)
	var prevDelta int64
	const maxIter = 60
	for it := 0; it < maxIter; it++ {
		e, xq := rw.eval(q)
		xq.Set(x)
		e.eval(xq)
		if e.p.IsZero() {
			if q < top {
				q = top
				continue
			}
			return rw.weight(wt, e, nil)
		}
		if e.dp.IsZero() {
			return false
		}
		d := rw.delta
		d.Quo(rw.f.Set(e.p), rw.g.Set(e.dp)) // at the target precision: x carries all its bits
		// log2 of K = |pi_n'' / (2 pi_n')|, to within a couple of units.
		eK := int64(-1 << 40)
		if !e.h.IsZero() {
			eK = e.h.Exponent() - e.dp.Exponent()
		}
		ed := d.Exponent()
		quadratic := eK+ed <= -20 // the step is far below the scale on which pi_n' changes
		cubicStep := cubic && quadratic && q < top && !e.h.IsZero()
		if cubicStep {
			// Chebyshev's step x - d - (pi_n''/(2 pi_n')) d^2, third order.
			c := rw.f.Quo(rw.f.Set(e.h), rw.g.Set(e.dp))
			c.Mul(c, d)
			c.Mul(c, d)
			x.Sub(x, c)
		}
		x.Sub(x, d)
		if x.IsZero() {
			if q < top {
				q = top
				continue
			}
			return rw.weight(wt, e, d)
		}
		ex := x.Exponent()
		trunc := eK + 2*ed - ex // log2 of the new iterate's relative error, about
		if cubicStep {
			// After Chebyshev's step the error is about C delta^3, C of the
			// order of K^2 and of the third derivative over pi_n' (not at
			// hand: a factor 4 of margin).
			trunc = 2*eK + 2 + 3*ed - ex
		}
		if q == top {
			// Weight remainder: (delta * scale)^2 with scale the larger of
			// |pi_{n-1}'/pi_{n-1}| and |pi_n''/pi_n'|.
			eW := eK
			if !e.dq.IsZero() && !e.q.IsZero() {
				eW = max(eW, e.dq.Exponent()-e.q.Exponent())
			}
			// Below the evaluation's own rounding (about 2^noise ulp of
			// pi_n) a further step can only move the node by noise.
			lim := -int64(top) + int64(noise)
			// The correction delta pi_n'' carries the h chain's relative
			// rounding 2^-halfPrec; it must stay below lim relative to pi_n'.
			corr := eK + 1 + ed - int64(rw.halfPrec(q))
			if (quadratic && trunc+2 <= lim && 2*(eW+ed)+2 <= lim && corr+2 <= lim) || ed <= ex-int64(top)+4 {
				return rw.weight(wt, e, d)
			}
			if it >= 3 && ed >= prevDelta-1 {
				return rw.weight(wt, e, d) // rounding noise: the confirming stage judges
			}
			prevDelta = ed
			continue
		}
		if quadratic {
			acc := int(min(-trunc-2, int64(q)-int64(noise)))
			nq, nc := rw.plan(acc, eK)
			q, cubic = max(q, nq), nc && nq >= q
		}
		prevDelta = ed
	}
	return false
}

// plan returns the level of the next step for a node with about acc
// correct bits (K about 2^eK), and whether that step is Chebyshev's. The
// step at the target precision is Newton's, with the stopping tests above;
// it ends the iteration by itself when the node comes in with about half
// the target's bits and the weight remainder's scale on top. Below that, a
// step of third order at a level that holds what it makes (3 acc bits,
// capped at what the top step needs) takes the node there in fewer steps
// than Newton's doubling, which would often land just short and cost a
// second evaluation at the target precision. When even that level would be
// the target, the levels double as Newton's steps do.
func (rw *riseWorker) plan(acc int, eK int64) (uint, bool) {
	top := rw.levels.top.prec
	noise := rw.noise()
	need := (int(top)-noise)/2 + int(max(min(eK, 1<<20), 0)) + 8
	if acc >= need {
		return top, false
	}
	if q := riseRound(min(3*acc, need+16)+noise, top); q < top {
		return q, true
	}
	return riseRound(2*acc+noise, top), false
}

// weight sets wt to norm / (pi_{n-1}(x) pi_n'(x)) at the new node x - d from
// the values e holds at x (d nil: at x itself).
func (rw *riseWorker) weight(wt *precision.Real, e *evalD2, d *precision.Real) bool {
	f, g := rw.f, rw.g
	f.Set(e.q)
	g.Set(e.dp)
	if d != nil {
		wt.Set(e.dq)
		f.MulSub(wt, d, f)
		f.Neg(f)           // q - q' d
		wt.MulPow2(e.h, 1) // pi_n''
		g.MulSub(wt, d, g)
		g.Neg(g) // p' - p'' d
	}
	f.Mul(f, g)
	if f.IsZero() {
		return false
	}
	wt.Quo(rw.levels.top.norm, f)
	return true
}

// refineRising runs riseNewton on the nodes lo..hi-1 of xs in parallel;
// startBits is how many bits of each start are right.
func refineRising(ctx context.Context, a, b []*precision.Real, norm *precision.Real, xs, ws []*precision.Real, prec uint, symmetric bool, lo, hi, startBits int, after func(i int)) error {
	l := &riseLevels{top: &riseCoeffs{prec: prec, symmetric: symmetric, a: a, b: b, norm: norm}, levels: map[uint]*riseCoeffs{}}
	workers := make(chan *riseWorker, 64)
	return parallelNodes(ctx, a, b, prec, lo, hi, func(_ *evaluator, i int, _ []*precision.Real) error {
		var rw *riseWorker
		select {
		case rw = <-workers:
		default:
			rw = newRiseWorker(l)
		}
		defer func() {
			select {
			case workers <- rw:
			default:
			}
		}()
		if !rw.newton(xs[i], ws[i], startBits) {
			return errNoConvergence
		}
		after(i)
		return nil
	})
}
