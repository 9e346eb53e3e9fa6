package levelset

import (
	"fmt"
	"math/big"
)

// xpoint is a point of the computational box at extended precision; a
// nil coordinate is one the current level does not set.
type xpoint [3]*big.Float

// xemitter receives the points and weights of a level's rule at extended
// precision.
type xemitter func(u xpoint, w *big.Float)

// replay walks a float64 run's tape (tape.go) at prec bits: the same
// boxes, directions, cuts and pieces, with the roots found again at prec
// bits from their float64 brackets and the Gauss-Legendre rules gx, gw
// (on [-1, 1], accurate to prec bits) on every piece.
type replay struct {
	g      *geom
	prec   uint
	gx, gw []*big.Float
	ev     []event
	pos    int
	err    error
	// tol is the absolute accuracy of a root: 2^-(prec-8) of the
	// element's size.
	tol *big.Float
}

func (r *replay) f(v float64) *big.Float { return new(big.Float).SetPrec(r.prec).SetFloat64(v) }

func (r *replay) next(want ...evKind) event {
	if r.pos >= len(r.ev) {
		panic("levelset: the replay ran past its tape")
	}
	e := r.ev[r.pos]
	r.pos++
	if len(want) > 0 && e.kind != want[0] {
		panic(fmt.Sprintf("levelset: replay met event %d, want %d", e.kind, want[0]))
	}
	return e
}

func (r *replay) fail(err error) {
	if r.err == nil {
		r.err = err
	}
}

// integrate replays one call of builder.integrate.
func (r *replay) integrate(emit xemitter) {
	if r.err != nil {
		return // the tape is no longer followed; runRule reports r.err
	}
	e := r.next()
	switch e.kind {
	case evEmpty:
	case evTensor:
		r.tensor(e.free, e.b, emit)
	case evLine1:
		r.line(xpoint{}, r.f(1), emit)
	case evSplit:
		r.integrate(emit)
		r.integrate(emit)
	case evReduce:
		r.integrate(func(u xpoint, w *big.Float) { r.line(u, w, emit) })
	default:
		panic("levelset: replay met a line where a box was due")
	}
}

func (r *replay) tensor(free []int, b [3]span, emit xemitter) {
	var rec func(j int, u xpoint, w *big.Float)
	rec = func(j int, u xpoint, w *big.Float) {
		if j == len(free) {
			emit(u, w)
			return
		}
		i := free[j]
		h, c := r.half(r.f(b[i].Lo), r.f(b[i].Hi))
		for t := range r.gx {
			v := u
			v[i] = r.mul(h, r.gx[t])
			v[i].Add(v[i], c)
			rec(j+1, v, r.mul(r.mul(w, h), r.gw[t]))
		}
	}
	rec(0, xpoint{}, r.f(1))
}

// half returns (t1-t0)/2 and (t1+t0)/2 rounded to prec.
func (r *replay) half(t0, t1 *big.Float) (h, m *big.Float) {
	h = new(big.Float).SetPrec(r.prec).Sub(t1, t0)
	m = new(big.Float).SetPrec(r.prec).Add(t1, t0)
	return h.SetMantExp(h, -1), m.SetMantExp(m, -1)
}

func (r *replay) mul(a, b *big.Float) *big.Float { return new(big.Float).SetPrec(r.prec).Mul(a, b) }

// line replays one line through u with weight w.
func (r *replay) line(u xpoint, w *big.Float, emit xemitter) {
	if r.err != nil {
		return
	}
	e := r.next(evLine)
	k := e.k
	ts := make([]*big.Float, len(e.cuts))
	for j, c := range e.cuts {
		if c.end {
			ts[j] = r.f(c.t)
			continue
		}
		t, err := r.root(c, k, e.free, u)
		if err != nil {
			r.fail(err)
			return
		}
		ts[j] = t
	}
	if e.surface {
		for j, t := range ts {
			q := u
			q[k] = t
			_, gu, gx, err := r.g.evalX(e.cuts[j].f.atX(q, e.free, r.prec), r.prec)
			if err != nil {
				r.fail(err)
				return
			}
			n := new(big.Float).SetPrec(r.prec)
			for i := 0; i < r.g.dim; i++ {
				n.Add(n, r.mul(gx[i], gx[i]))
			}
			n.Sqrt(n)
			if gu[k].Sign() == 0 {
				r.fail(fmt.Errorf("level set: its derivative along a height direction vanished at a root at %d bits", r.prec))
				return
			}
			n.Quo(n, new(big.Float).Abs(gu[k]))
			emit(q, r.mul(w, n))
		}
		return
	}
	for _, j := range e.pieces {
		if ts[j+1].Cmp(ts[j]) <= 0 {
			r.fail(fmt.Errorf("two roots along a line came out in the wrong order at %d bits: the float64 plan does not hold at extended precision", r.prec))
			return
		}
		h, m := r.half(ts[j], ts[j+1])
		hw := r.mul(w, h)
		for t := range r.gx {
			q := u
			q[k] = r.mul(h, r.gx[t])
			q[k].Add(q[k], m)
			emit(q, r.mul(hw, r.gw[t]))
		}
	}
}

// atX fills the fixed coordinates of f into the point u of the free ones.
func (f *fn) atX(u xpoint, free []int, prec uint) xpoint {
	var q xpoint
	for i := range q {
		q[i] = new(big.Float).SetPrec(prec).SetFloat64(f.fix[i])
	}
	for _, i := range free {
		if u[i] != nil {
			q[i] = u[i]
		}
	}
	return q
}

// root finds the cut c again at prec bits along direction k through u: an
// end of the segment stays where it is (the function must vanish there to
// prec bits); a root is found in its float64 bracket by Newton's method
// safeguarded by bisection, to within r.tol. A bracket whose ends do not
// have opposite signs at prec bits is an error: the float64 plan does not
// hold there.
func (r *replay) root(c cut, k int, free []int, u xpoint) (*big.Float, error) {
	val := func(t *big.Float) (*big.Float, *big.Float, error) {
		q := u
		q[k] = t
		v, gu, _, err := r.g.evalX(c.f.atX(q, free, r.prec), r.prec)
		if err != nil {
			return nil, nil, err
		}
		return v, gu[k], nil
	}
	notHeld := fmt.Errorf("level set: a root along a line lies within float64 rounding of a segment's end, where the float64 plan cannot be confirmed at %d bits; try another --degree or element", r.prec)
	if c.lo == c.hi {
		t := r.f(c.lo)
		v, d, err := val(t)
		if err != nil {
			return nil, err
		}
		// |v| within a few ulps of prec of |d| times the element's size.
		lim := new(big.Float).SetPrec(r.prec).Abs(d)
		lim.Mul(lim, r.tol)
		lim.SetMantExp(lim, 4)
		if v.Sign() != 0 && new(big.Float).Abs(v).Cmp(lim) > 0 && d.Sign() != 0 {
			return nil, notHeld
		}
		return t, nil
	}
	lo, hi := r.f(c.lo), r.f(c.hi)
	vl, _, err := val(lo)
	if err != nil {
		return nil, err
	}
	vh, _, err := val(hi)
	if err != nil {
		return nil, err
	}
	switch {
	case vl.Sign() == 0:
		return lo, nil
	case vh.Sign() == 0:
		return hi, nil
	case vl.Sign() == vh.Sign():
		return nil, notHeld
	}
	if vl.Sign() > 0 {
		lo, hi = hi, lo // keep h(lo) < 0 < h(hi)
	}
	t := r.f(c.t)
	if !strictlyBetween(t, lo, hi) {
		_, t = r.half(lo, hi)
	}
	step := new(big.Float).SetPrec(r.prec)
	for it := 0; it < 400; it++ {
		v, d, err := val(t)
		if err != nil {
			return nil, err
		}
		if v.Sign() == 0 {
			return t, nil
		}
		if v.Sign() < 0 {
			lo = t
		} else {
			hi = t
		}
		var nt *big.Float
		if d.Sign() != 0 {
			step.Quo(v, d)
			nt = new(big.Float).SetPrec(r.prec).Sub(t, step)
		}
		if nt == nil || !strictlyBetween(nt, lo, hi) {
			_, nt = r.half(lo, hi)
		}
		step.Sub(nt, t)
		width := new(big.Float).SetPrec(r.prec).Sub(hi, lo)
		if step.Abs(step).Cmp(r.tol) <= 0 || width.Abs(width).Cmp(r.tol) <= 0 {
			return nt, nil
		}
		t = nt
	}
	return nil, fmt.Errorf("level set: a root along a line did not converge at %d bits", r.prec)
}

// strictlyBetween reports whether t lies strictly between a and b (in
// either order).
func strictlyBetween(t, a, b *big.Float) bool {
	if a.Cmp(b) > 0 {
		a, b = b, a
	}
	return t.Cmp(a) > 0 && t.Cmp(b) < 0
}

// toXBig maps u onto the element at prec bits.
func (g *geom) toXBig(u xpoint, prec uint) xpoint {
	one := big.NewFloat(1)
	m := func(a, b *big.Float) *big.Float { return new(big.Float).SetPrec(prec).Mul(a, b) }
	switch g.kind {
	case duffyTri:
		om := new(big.Float).SetPrec(prec).Sub(one, u[0])
		return xpoint{u[0], m(u[1], om)}
	case duffyTet:
		om := new(big.Float).SetPrec(prec).Sub(one, u[0])
		omv := new(big.Float).SetPrec(prec).Sub(one, u[1])
		return xpoint{u[0], m(u[1], om), m(m(u[2], om), omv)}
	}
	return u
}

// jacBig is the Jacobian determinant of the map at u, at prec bits.
func (g *geom) jacBig(u xpoint, prec uint) *big.Float {
	one := big.NewFloat(1)
	switch g.kind {
	case duffyTri:
		return new(big.Float).SetPrec(prec).Sub(one, u[0])
	case duffyTet:
		om := new(big.Float).SetPrec(prec).Sub(one, u[0])
		omv := new(big.Float).SetPrec(prec).Sub(one, u[1])
		return om.Mul(om, om).Mul(om, omv)
	}
	return new(big.Float).SetPrec(prec).SetInt64(1)
}

// evalX returns phi(x(u)), its gradient in u and in x at prec bits
// (moments.Expr.GradBig and the chain rule of the map, as eval).
func (g *geom) evalX(u xpoint, prec uint) (v *big.Float, gu, gx [3]*big.Float, err error) {
	x := g.toXBig(u, prec)
	v, err = g.phi.GradBig(prec, x[:g.dim], gx[:g.dim])
	if err != nil {
		return nil, gu, gx, err
	}
	m := func(a, b *big.Float) *big.Float { return new(big.Float).SetPrec(prec).Mul(a, b) }
	s := func(a, b *big.Float) *big.Float { return new(big.Float).SetPrec(prec).Sub(a, b) }
	one := big.NewFloat(1)
	switch g.kind {
	case duffyTri:
		gu[0] = s(gx[0], m(u[1], gx[1]))
		gu[1] = m(s(one, u[0]), gx[1])
	case duffyTet:
		om, omv := s(one, u[0]), s(one, u[1])
		gu[0] = s(s(gx[0], m(u[1], gx[1])), m(m(u[2], omv), gx[2]))
		gu[1] = s(m(om, gx[1]), m(m(u[2], om), gx[2]))
		gu[2] = m(m(om, omv), gx[2])
	default:
		gu = gx
	}
	return v, gu, gx, nil
}
