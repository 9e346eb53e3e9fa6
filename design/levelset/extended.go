package levelset

import (
	"fmt"
	"math/big"

	"quadwright/moments"
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
// (on [-1, 1], accurate to prec bits) on every piece. phi is evaluated by
// a compiled tape (moments.GradTape) into storage the replay reuses; the
// values it emits are new and never changed afterwards, so the points of
// a line share their fixed coordinates.
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
	phi *moments.GradTape
	s   scratch
}

// scratch is the reused storage of a replay's evaluations and root
// searches.
type scratch struct {
	fix, x, dir [3]*big.Float
	lo, hi, nt  *big.Float
	step, width *big.Float
	lim, one    *big.Float
	tan         [][]*big.Float
}

func newReplay(g *geom, prec uint, gx, gw []*big.Float, ev []event, size float64) *replay {
	r := &replay{g: g, prec: prec, gx: gx, gw: gw, ev: ev, phi: g.phi.CompileGrad(prec)}
	r.tol = r.f(size)
	r.tol.SetMantExp(r.tol, -int(prec)+8)
	s := &r.s
	for i := range s.fix {
		s.fix[i], s.x[i], s.dir[i] = r.f(0), r.f(0), r.f(0)
	}
	s.lo, s.hi, s.nt, s.step, s.width, s.lim, s.one = r.f(0), r.f(0), r.f(0), r.f(0), r.f(0), r.f(0), r.f(1)
	s.tan = [][]*big.Float{s.dir[:g.dim]}
	return r
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
	// The coordinates and weight factors of each free direction, made
	// once and shared by every point of the product.
	var cs, ws [3][]*big.Float
	for _, i := range free {
		h, c := r.half(r.f(b[i].Lo), r.f(b[i].Hi))
		for t := range r.gx {
			v := r.mul(h, r.gx[t])
			cs[i] = append(cs[i], v.Add(v, c))
			ws[i] = append(ws[i], r.mul(h, r.gw[t]))
		}
	}
	var rec func(j int, u xpoint, w *big.Float)
	rec = func(j int, u xpoint, w *big.Float) {
		if j == len(free) {
			emit(u, w)
			return
		}
		i := free[j]
		for t := range r.gx {
			v := u
			v[i] = cs[i][t]
			if w == nil {
				rec(j+1, v, new(big.Float).SetPrec(r.prec).Set(ws[i][t]))
			} else {
				rec(j+1, v, r.mul(w, ws[i][t]))
			}
		}
	}
	rec(0, xpoint{}, nil)
}

// half returns (t1-t0)/2 and (t1+t0)/2 rounded to prec.
func (r *replay) half(t0, t1 *big.Float) (h, m *big.Float) {
	h = new(big.Float).SetPrec(r.prec).Sub(t1, t0)
	m = new(big.Float).SetPrec(r.prec).Add(t1, t0)
	return h.SetMantExp(h, -1), m.SetMantExp(m, -1)
}

func (r *replay) mul(a, b *big.Float) *big.Float { return new(big.Float).SetPrec(r.prec).Mul(a, b) }

// line replays one line through u with weight w. The points it emits get
// new weights (an emitter may keep them); w itself is only read.
func (r *replay) line(u xpoint, w *big.Float, emit xemitter) {
	if r.err != nil {
		return
	}
	e := r.next(evLine)
	k := e.k
	ts := make([]*big.Float, len(e.cuts))
	for j := range e.cuts {
		c := &e.cuts[j]
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
			wt, err := r.areaElement(&e.cuts[j].f, e.free, q, k)
			if err != nil {
				r.fail(err)
				return
			}
			emit(q, wt.Mul(wt, w))
		}
		return
	}
	for _, j := range e.pieces {
		if ts[j+1].Cmp(ts[j]) <= 0 {
			r.fail(fmt.Errorf("two roots along a line came out in the wrong order at %d bits: the float64 plan does not hold at extended precision", r.prec))
			return
		}
		h, m := r.half(ts[j], ts[j+1])
		hw := r.mul(h, w)
		for t := range r.gx {
			q := u
			q[k] = r.mul(h, r.gx[t])
			q[k].Add(q[k], m)
			emit(q, r.mul(hw, r.gw[t]))
		}
	}
}

// areaElement is |grad phi| / |d phi / du_k| at the root q of the
// interface on a line in direction k (a new value).
func (r *replay) areaElement(f *fn, free []int, q xpoint, k int) (*big.Float, error) {
	full, x := r.point(f, free, q)
	_, gx, err := r.phi.Eval(x, r.phi.Unit())
	if err != nil {
		return nil, err
	}
	n := new(big.Float).SetPrec(r.prec)
	du := r.s.lim.SetInt64(0)
	r.tangent(full, k)
	for i := 0; i < r.g.dim; i++ {
		r.s.step.Mul(gx[i], gx[i])
		n.Add(n, r.s.step)
		r.s.step.Mul(gx[i], r.s.dir[i])
		du.Add(du, r.s.step)
	}
	n.Sqrt(n)
	if du.Sign() == 0 {
		return nil, fmt.Errorf("level set: its derivative along a height direction vanished at a root at %d bits", r.prec)
	}
	return n.Quo(n, du.Abs(du)), nil
}

// point sets the scratch point for the function f of a level: the fixed
// coordinates of f, then those of u among free (u's nil ones unset), and
// returns it (full) and its image x on the element. Both are scratch
// storage or u's own values, valid until the next call.
func (r *replay) point(f *fn, free []int, u xpoint) (full xpoint, x []*big.Float) {
	var q xpoint
	for i := 0; i < r.g.dim; i++ {
		q[i] = r.s.fix[i].SetFloat64(f.fix[i])
	}
	for _, i := range free {
		if u[i] != nil {
			q[i] = u[i]
		}
	}
	xs := r.s.x
	switch r.g.kind {
	case duffyTri:
		x := xs
		x[0].Set(q[0])
		x[1].Sub(r.s.one, q[0])
		x[1].Mul(x[1], q[1])
	case duffyTet:
		x := xs
		x[0].Set(q[0])
		x[1].Sub(r.s.one, q[0])
		x[2].Sub(r.s.one, q[1])
		x[2].Mul(x[2], x[1])
		x[2].Mul(x[2], q[2])
		x[1].Mul(x[1], q[1])
	default:
		return q, q[:r.g.dim]
	}
	return q, xs[:r.g.dim]
}

// tangent sets r.s.dir to dx/du_k at u, the image in x of the direction
// k of the computational box.
func (r *replay) tangent(u xpoint, k int) {
	d := r.s.dir
	for i := 0; i < r.g.dim; i++ {
		d[i].SetInt64(0)
	}
	om := func(i int) *big.Float { return r.s.width.Sub(r.s.one, u[i]) }
	switch r.g.kind {
	case duffyTri: // x = (u0, u1 (1-u0))
		if k == 0 {
			d[0].SetInt64(1)
			d[1].Neg(u[1])
		} else {
			d[1].Set(om(0))
		}
	case duffyTet: // x = (u0, u1 (1-u0), u2 (1-u0) (1-u1))
		switch k {
		case 0:
			d[0].SetInt64(1)
			d[1].Neg(u[1])
			d[2].Neg(u[2])
			d[2].Mul(d[2], om(1))
		case 1:
			d[1].Set(om(0))
			d[2].Neg(u[2])
			d[2].Mul(d[2], om(0))
		default:
			d[2].Set(om(0))
			d[2].Mul(d[2], om(1))
		}
	default:
		d[k].SetInt64(1)
	}
}

// eval is phi at the point u of the line (its coordinate k set to t) and,
// with deriv, its derivative along k there; both scratch storage of the
// tape.
func (r *replay) eval(f *fn, free []int, u xpoint, k int, t *big.Float, deriv bool) (v, d *big.Float, err error) {
	u[k] = t
	full, x := r.point(f, free, u)
	if !deriv {
		v, _, err = r.phi.Eval(x, nil)
		return v, nil, err
	}
	r.tangent(full, k)
	v, ds, err := r.phi.Eval(x, r.s.tan)
	if err != nil {
		return nil, nil, err
	}
	return v, ds[0], nil
}

// root finds the cut c again at prec bits along direction k through u: an
// end of the segment stays where it is (the function must vanish there to
// prec bits); a root is found in its float64 bracket by Newton's method
// from the float64 root, safeguarded by bisection, to within r.tol (from
// a float64 start two or three steps). A bracket whose ends do not have
// opposite signs at prec bits is an error: the float64 plan does not hold
// there.
func (r *replay) root(c *cut, k int, free []int, u xpoint) (*big.Float, error) {
	notHeld := fmt.Errorf("level set: a root along a line lies within float64 rounding of a segment's end, where the float64 plan cannot be confirmed at %d bits; try another --degree or element", r.prec)
	s := &r.s
	if c.lo == c.hi {
		t := r.f(c.lo)
		v, d, err := r.eval(&c.f, free, u, k, t, true)
		if err != nil {
			return nil, err
		}
		// |v| within a few ulps of prec of |d| times the element's size.
		s.lim.Abs(d)
		s.lim.Mul(s.lim, r.tol)
		s.lim.SetMantExp(s.lim, 4)
		if v.Sign() != 0 && d.Sign() != 0 && s.step.Abs(v).Cmp(s.lim) > 0 {
			return nil, notHeld
		}
		return t, nil
	}
	lo, hi := s.lo.SetFloat64(c.lo), s.hi.SetFloat64(c.hi)
	v, _, err := r.eval(&c.f, free, u, k, lo, false)
	if err != nil {
		return nil, err
	}
	sl := v.Sign()
	v, _, err = r.eval(&c.f, free, u, k, hi, false)
	if err != nil {
		return nil, err
	}
	sh := v.Sign()
	switch {
	case sl == 0:
		return r.f(c.lo), nil
	case sh == 0:
		return r.f(c.hi), nil
	case sl == sh:
		return nil, notHeld
	}
	if sl > 0 {
		lo, hi = hi, lo // keep h(lo) < 0 < h(hi)
	}
	t := r.f(c.t)
	if !strictlyBetween(t, lo, hi) {
		r.mid(t, lo, hi)
	}
	nt := s.nt
	for it := 0; it < 400; it++ {
		v, d, err := r.eval(&c.f, free, u, k, t, true)
		if err != nil {
			return nil, err
		}
		if v.Sign() == 0 {
			return t, nil
		}
		if v.Sign() < 0 {
			lo.Set(t)
		} else {
			hi.Set(t)
		}
		if d.Sign() != 0 {
			s.step.Quo(v, d)
			nt.Sub(t, s.step)
		}
		if d.Sign() == 0 || !strictlyBetween(nt, lo, hi) {
			r.mid(nt, lo, hi)
		}
		s.step.Sub(nt, t)
		s.width.Sub(hi, lo)
		done := s.step.Abs(s.step).Cmp(r.tol) <= 0 || s.width.Abs(s.width).Cmp(r.tol) <= 0
		t.Set(nt)
		if done {
			return t, nil
		}
	}
	return nil, fmt.Errorf("level set: a root along a line did not converge at %d bits", r.prec)
}

// mid sets z to (a+b)/2 rounded to prec.
func (r *replay) mid(z, a, b *big.Float) {
	z.Add(a, b)
	z.SetMantExp(z, -1)
}

// strictlyBetween reports whether t lies strictly between a and b (in
// either order).
func strictlyBetween(t, a, b *big.Float) bool {
	if a.Cmp(b) > 0 {
		a, b = b, a
	}
	return t.Cmp(a) > 0 && t.Cmp(b) < 0
}

// toXBig maps u onto the element at prec bits: new values where the map
// changes a coordinate, u's own where it does not.
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
