package design

import (
	"context"

	"quadwright/precision"
)

// zerosAbove returns the number of zeros of pi_n in (x, inf): the number of
// sign changes in pi_0(x), ..., pi_n(x), zeros skipped. The monic
// orthogonal polynomials form a Sturm sequence (Szego 1939, Theorem 3.3.2
// on interlacing; the count is the classical Sturm count of the Jacobi
// matrix J - xI).
func (e *evaluator) zerosAbove(x *precision.Real) int {
	p0, p1, t, u, v := e.p0, e.p1, e.t, e.u, e.v
	p0.SetInt64(1)
	p1.Sub(x, e.a[0])
	last := 1
	changes := 0
	if s := p1.Sign(); s != 0 {
		if s != last {
			changes++
		}
		last = s
	}
	for k := 1; k < e.n; k++ {
		t.Sub(x, e.a[k])
		u.Mul(e.b[k], p0)
		v.MulSub(t, p1, u)
		p0, p1, v = p1, v, p0
		if s := p1.Sign(); s != 0 {
			if s != last {
				changes++
			}
			last = s
		}
	}
	e.p0, e.p1, e.v = p0, p1, v
	return changes
}

// gershgorin returns an interval [lo, hi] that holds every eigenvalue of the
// Jacobi matrix of (a, b), widened by a sixteenth of its length.
func gershgorin(a, b []*precision.Real, prec uint) (lo, hi *precision.Real) {
	n := len(a)
	s := make([]*precision.Real, n+1)
	for k := range s {
		s[k] = precision.NewReal(prec)
		if k >= 1 && k < n {
			s[k].Sqrt(b[k])
		}
	}
	lo, hi = precision.NewReal(prec), precision.NewReal(prec)
	r, t := precision.NewReal(prec), precision.NewReal(prec)
	for k := 0; k < n; k++ {
		r.Add(s[k], s[k+1])
		t.Sub(a[k], r)
		if k == 0 || t.Cmp(lo) < 0 {
			lo.Set(t)
		}
		t.Add(a[k], r)
		if k == 0 || t.Cmp(hi) > 0 {
			hi.Set(t)
		}
	}
	r.Sub(hi, lo)
	if r.IsZero() {
		r.Abs(lo)
		if r.IsZero() {
			r.SetInt64(1)
		}
	}
	r.MulPow2(r, -4)
	lo.Sub(lo, r)
	hi.Add(hi, r)
	return lo, hi
}

// sturmAll isolates every zero of pi_n by bisection on Sturm counts until
// its bracket is narrow enough for Newton to converge inside it, then
// refines it with Newton and recomputes its weight. It is the robust path
// taken when the float64 start fails; its cost is O(n^2 log(1/eps)).
func sturmAll(ctx context.Context, a, b []*precision.Real, norm *precision.Real, xs, ws []*precision.Real, prec uint, symmetric bool) error {
	n := len(xs)
	lo0, hi0 := gershgorin(a, b, prec)
	width := precision.NewReal(prec).Sub(hi0, lo0)
	// Brackets are narrowed to 2^-48 of the Gershgorin width before Newton;
	// then the bracket is kept, so a Newton step that leaves it is caught.
	stop := width.Exponent() - 48
	first := 0
	if symmetric {
		first = n / 2
		if n%2 == 1 {
			xs[first].SetInt64(0)
		}
	}
	return parallelNodes(ctx, a, b, prec, first, n, func(e *evaluator, i int, scratch []*precision.Real) error {
		lo := precision.NewReal(prec).Set(lo0)
		hi := precision.NewReal(prec).Set(hi0)
		mid := xs[i]
		middle := symmetric && n%2 == 1 && i == first
		if middle {
			mid.SetInt64(0)
			if !e.newton(mid, ws[i], norm, scratch[0], scratch[1]) {
				return errNoConvergence
			}
			return nil
		}
		w := scratch[2]
		// bisect narrows [lo, hi] until it holds the i-th zero alone and
		// its width has exponent at most lim.
		cLo, cHi := 0, n // the Gershgorin ends hold no zero below / all zeros below
		bisect := func(lim int64) {
			for {
				w.Sub(hi, lo)
				if cLo == i && cHi == i+1 && (w.IsZero() || w.Exponent() <= lim) {
					return
				}
				mid.Add(lo, hi)
				mid.MulPow2(mid, -1)
				if mid.Cmp(lo) <= 0 || mid.Cmp(hi) >= 0 {
					return // the bracket cannot shrink further at prec bits
				}
				if c := n - e.zerosAbove(mid); c >= i+1 {
					hi.Set(mid)
					cHi = c
				} else {
					lo.Set(mid)
					cLo = c
				}
			}
		}
		bisect(stop)
		mid.Add(lo, hi)
		mid.MulPow2(mid, -1)
		ok := e.newton(mid, ws[i], norm, scratch[0], scratch[1])
		if !ok || mid.Cmp(lo) < 0 || mid.Cmp(hi) > 0 {
			// Newton left the bracket: finish by bisection alone.
			bisect(width.Exponent() - int64(prec) + 4)
			mid.Add(lo, hi)
			mid.MulPow2(mid, -1)
			e.eval(mid)
			ws[i].Mul(e.q, e.dp)
			if ws[i].IsZero() {
				return errNoConvergence
			}
			ws[i].Quo(norm, ws[i])
		}
		if symmetric && i != n-1-i {
			xs[n-1-i].Neg(xs[i])
			ws[n-1-i].Set(ws[i])
		}
		return nil
	})
}
