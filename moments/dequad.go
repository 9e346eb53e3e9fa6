package moments

import (
	"math/big"
	"sync"

	"quadwright/precision"
)

// The double-exponential transformations of Takahasi and Mori ("Double
// exponential formulas for numerical integration", Publ. RIMS Kyoto Univ. 9,
// 1974), with u = (pi/2) sinh t:
//
//	tanh-sinh  [a, b]:      x = a + (b-a) (1 + tanh u)/2
//	exp-sinh   [a, inf):    x = a + e^u          ((-inf, b]: x = b - e^u)
//	sinh-sinh  (-inf, inf): x = sinh u
//
// after which the trapezoidal rule with step h in t converges like
// exp(-c/h) for integrands analytic inside the interval, whatever their
// algebraic or logarithmic singularities at the ends. Halving h doubles the
// digits, so two successive levels that agree bound the error of the finer.
//
// Near a finite end the abscissa is never formed as "end minus something
// rounded": the cached nodes hold the distance to the nearer end, and the
// point is built from it at as many bits as the distance needs (see
// dePiece.point), so that 1-x, x-a and the singular factors built from them
// keep their full relative accuracy down to distances like 1e-4000.

type deKind uint8

const (
	tanhSinh deKind = iota // finite [lo, hi]
	expSinhR               // [lo, inf)
	expSinhL               // (-inf, hi]
	sinhSinh               // (-inf, inf)
)

// deH0 is the step of level 0; level l has step deH0 / 2^l and adds the
// odd multiples of that step to the nodes of the levels before it.
const deH0 = 0.5

// deNode is one node of a transformation, before it is placed on a piece.
//
// For tanh-sinh, d is the distance (1 - tanh|u|)/2 = E/(1+E), E = e^-2|u|, of
// the point to the nearer end in units of the length b-a, and wt its
// derivative (pi cosh t) E/(1+E)^2, again per unit length. For exp-sinh, d
// = e^u is the distance from the finite end and wt = (pi/2) cosh t e^u. For
// sinh-sinh, d = sinh u is the point itself (for t >= 0) and wt = (pi/2)
// cosh t cosh u. Both are rounded to the cache's precision, with an error
// below 2^-(prec-20) relative (the products that form e^t lose up to log2
// of the node count bits).
type deNode struct {
	d, wt *big.Float
}

// deList is the growing list of the nodes of one level on one side (t > 0
// or t < 0) of a transformation at one precision.
type deList struct {
	nodes []deNode
	et    *big.Float // e^t of the last node made
	step  *big.Float // e^(distance in t between successive nodes)
}

type deKey struct {
	kind  deKind
	prec  uint
	level int
	neg   bool
}

// deCache holds the nodes of every (transformation, precision, level, side)
// asked for so far: the nodes are the same for every weight, every piece and
// every moment, and forming them costs an exponential each.
var deCache = struct {
	sync.Mutex
	lists map[deKey]*deList
}{lists: map[deKey]*deList{}}

// symmetric kinds share one list for both sides: their nodes at -t mirror
// those at t.
func (k deKind) symmetric() bool { return k == tanhSinh || k == sinhSinh }

// deNodes returns the first n nodes of the list (kind, prec, level, side),
// computing the missing ones. Index i of level 0 is t = i h0 on the
// positive side and t = -(i+1) h0 on the negative one; index i of level
// l >= 1 is t = ±(2i+1) h0/2^l. The returned slice must not be modified.
func deNodes(kind deKind, prec uint, level int, neg bool, n int) []deNode {
	if kind.symmetric() && neg {
		if level == 0 {
			return deNodes(kind, prec, 0, false, n+1)[1:]
		}
		neg = false
	}
	key := deKey{kind, prec, level, neg}
	deCache.Lock()
	defer deCache.Unlock()
	l := deCache.lists[key]
	if l == nil {
		l = newDeList(prec, level, neg)
		deCache.lists[key] = l
	}
	for len(l.nodes) < n {
		l.nodes = append(l.nodes, makeDeNode(kind, prec, l.et, neg))
		l.et.Mul(l.et, l.step)
	}
	return l.nodes[:n]
}

func newDeList(prec uint, level int, neg bool) *deList {
	w := prec + 32
	h := new(big.Float).SetPrec(w).SetFloat64(deH0)
	h.SetMantExp(h, -level)
	first := new(big.Float).SetPrec(w).Set(h) // level >= 1: t = h
	stride := new(big.Float).SetPrec(w).Mul(h, big.NewFloat(2))
	if level == 0 {
		stride.Set(h)
		if !neg {
			first.SetInt64(0)
		}
	}
	return &deList{et: precision.ExpTo(first, w), step: precision.ExpTo(stride, w)}
}

// makeDeNode forms the node at |t| with e^|t| = et; neg selects t < 0
// (only exp-sinh is not symmetric).
func makeDeNode(kind deKind, prec uint, et *big.Float, neg bool) deNode {
	w := et.Prec()
	one := big.NewFloat(1)
	inv := new(big.Float).SetPrec(w).Quo(one, et)
	sinh := new(big.Float).SetPrec(w).Sub(et, inv)
	sinh.SetMantExp(sinh, -1)
	cosh := new(big.Float).SetPrec(w).Add(et, inv)
	cosh.SetMantExp(cosh, -1)
	if neg {
		sinh.Neg(sinh)
	}
	hp := new(big.Float).SetPrec(w).Set(precision.Pi(w))
	hp.SetMantExp(hp, -1) // pi/2
	u := new(big.Float).SetPrec(w).Mul(hp, sinh)
	var d, wt *big.Float
	switch kind {
	case tanhSinh:
		m2u := new(big.Float).SetPrec(w).Abs(u)
		m2u.SetMantExp(m2u, 1)
		e := precision.ExpTo(m2u.Neg(m2u), w)
		onePlus := new(big.Float).SetPrec(w).Add(one, e)
		d = new(big.Float).SetPrec(w).Quo(e, onePlus)
		wt = new(big.Float).SetPrec(w).Quo(d, onePlus)
		wt.Mul(wt, cosh)
		wt.Mul(wt, hp)
		wt.SetMantExp(wt, 1)
	case expSinhR, expSinhL:
		d = precision.ExpTo(u, w)
		wt = new(big.Float).SetPrec(w).Mul(hp, cosh)
		wt.Mul(wt, d)
	case sinhSinh:
		eu := precision.ExpTo(u, w)
		iu := new(big.Float).SetPrec(w).Quo(one, eu)
		d = new(big.Float).SetPrec(w).Sub(eu, iu)
		d.SetMantExp(d, -1)
		wt = new(big.Float).SetPrec(w).Add(eu, iu)
		wt.SetMantExp(wt, -1)
		wt.Mul(wt, cosh)
		wt.Mul(wt, hp)
	}
	return deNode{d: d.SetPrec(prec), wt: wt.SetPrec(prec)}
}

// dePiece is a part of the interval integrated by one transformation.
type dePiece struct {
	kind   deKind
	lo, hi *big.Rat // nil for an infinite end
	depth  int      // number of bisections that made it
}

// near names the piece by a point for messages: its midpoint to 10
// digits, or its finite end (the one end of a half-line, 0 for the line).
func (p dePiece) near() string {
	switch {
	case p.lo != nil && p.hi != nil:
		m := new(big.Rat).Add(p.lo, p.hi)
		m.Quo(m, big.NewRat(2, 1))
		return precision.FormatSig(new(big.Float).SetPrec(128).SetRat(m), 10)
	case p.lo != nil:
		return RatString(p.lo)
	case p.hi != nil:
		return RatString(p.hi)
	}
	return "0"
}

// piecesOf cuts iv at the sorted interior points breaks and chooses each
// part's transformation.
func piecesOf(iv Interval, breaks []*big.Rat) []dePiece {
	var ends []*big.Rat
	if iv.Lo.Finite() {
		ends = append(ends, iv.Lo.Value)
	} else {
		ends = append(ends, nil)
	}
	ends = append(ends, breaks...)
	if iv.Hi.Finite() {
		ends = append(ends, iv.Hi.Value)
	} else {
		ends = append(ends, nil)
	}
	var ps []dePiece
	for i := 0; i+1 < len(ends); i++ {
		ps = append(ps, newPiece(ends[i], ends[i+1], 0))
	}
	return ps
}

func newPiece(lo, hi *big.Rat, depth int) dePiece {
	p := dePiece{lo: lo, hi: hi, depth: depth}
	switch {
	case lo != nil && hi != nil:
		p.kind = tanhSinh
	case lo != nil:
		p.kind = expSinhR
	case hi != nil:
		p.kind = expSinhL
	default:
		p.kind = sinhSinh
	}
	return p
}

// bisect splits a piece in two: a finite one at its midpoint, [a, inf) at
// a + max(1, |a|), (-inf, b] at b - max(1, |b|), (-inf, inf) at 0.
func (p dePiece) bisect() (dePiece, dePiece) {
	var m *big.Rat
	switch p.kind {
	case tanhSinh:
		m = new(big.Rat).Add(p.lo, p.hi)
		m.Quo(m, big.NewRat(2, 1))
	case expSinhR:
		m = new(big.Rat).Add(p.lo, ratMaxAbs1(p.lo))
	case expSinhL:
		m = new(big.Rat).Sub(p.hi, ratMaxAbs1(p.hi))
	default:
		m = new(big.Rat)
	}
	return newPiece(p.lo, m, p.depth+1), newPiece(m, p.hi, p.depth+1)
}

func ratMaxAbs1(r *big.Rat) *big.Rat {
	a := new(big.Rat).Abs(r)
	if a.Cmp(big.NewRat(1, 1)) < 0 {
		return big.NewRat(1, 1)
	}
	return a
}

// dePoint is a node placed on a piece: the abscissa x, exact enough that
// the distance to the nearer finite end is recovered by subtraction (xExt,
// at precision prec + the number of bits by which that distance lies below
// the end's magnitude), the same rounded to prec bits (x), the distance
// itself (dist, nil on sinh-sinh), and dx/dt (dxdt) at prec bits.
type dePoint struct {
	xExt, x, dist, dxdt *big.Float
	end                 *big.Rat // the finite end that dist is measured from
	below               bool     // x = end - dist
}

// point places node nd, on the positive (neg false) or negative side of t,
// on the piece. maxGap bounds the extra bits of xExt; point reports false if
// the node lies closer to a nonzero end than that allows.
func (p dePiece) point(nd deNode, neg bool, prec, maxGap uint) (dePoint, bool) {
	var end *big.Rat
	sign := 1 // x = end + sign*dist
	dist := new(big.Float).SetPrec(prec)
	switch p.kind {
	case tanhSinh:
		l := new(big.Rat).Sub(p.hi, p.lo)
		lf := new(big.Float).SetPrec(prec).SetRat(l)
		dist.Mul(lf, nd.d)
		end = p.lo
		if !neg {
			end, sign = p.hi, -1
		}
		dxdt := new(big.Float).SetPrec(prec).Mul(lf, nd.wt)
		return p.place(end, sign, dist, dxdt, prec, maxGap)
	case expSinhR:
		end = p.lo
	case expSinhL:
		end, sign = p.hi, -1
	case sinhSinh:
		x := new(big.Float).SetPrec(prec).Set(nd.d)
		if neg {
			x.Neg(x)
		}
		return dePoint{xExt: x, x: x, dxdt: nd.wt}, true
	}
	dist.Set(nd.d)
	return p.place(end, sign, dist, nd.wt, prec, maxGap)
}

func (p dePiece) place(end *big.Rat, sign int, dist, dxdt *big.Float, prec, maxGap uint) (dePoint, bool) {
	if end.Sign() == 0 {
		x := dist
		if sign < 0 {
			x = new(big.Float).SetPrec(prec).Neg(dist)
		}
		return dePoint{xExt: x, x: x, dist: dist, dxdt: dxdt, end: end, below: sign < 0}, true
	}
	ef := new(big.Float).SetPrec(prec).SetRat(end)
	gap := ef.MantExp(nil) - dist.MantExp(nil)
	if gap > int(maxGap) {
		return dePoint{}, false
	}
	xp := prec + uint(max(gap, 0)) + 2
	ext := new(big.Float).SetPrec(xp).SetRat(end)
	if sign < 0 {
		ext.Sub(ext, dist)
	} else {
		ext.Add(ext, dist)
	}
	return dePoint{xExt: ext, x: new(big.Float).SetPrec(prec).Set(ext), dist: dist, dxdt: dxdt, end: end, below: sign < 0}, true
}
