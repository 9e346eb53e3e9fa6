package levelset

import (
	"math"

	"quadwright/moments"
)

type span = moments.Span

// mapKind is how the computational box maps onto the element.
type mapKind uint8

const (
	identity mapKind = iota // a rectangle or box: u is x
	duffyTri                // triangle (0,0),(1,0),(0,1) from [0,1]^2
	duffyTet                // tetrahedron from [0,1]^3
)

// geom is the element as the algorithm sees it: a computational box
// [lo, hi] in dim coordinates u, the map x(u) onto the element, and the
// level set phi(x(u)) with its gradient in u by the chain rule.
//
// The triangle and the tetrahedron are reached through the collapsed
// (Duffy) map: M. G. Duffy, "Quadrature over a pyramid or cube of
// integrands with a singularity at a vertex", SIAM J. Numer. Anal. 19
// (1982), 1260-1262. For the triangle x = u, y = v(1-u), Jacobian 1-u; for
// the tetrahedron x = u, y = v(1-u), z = w(1-u)(1-v), Jacobian
// (1-u)^2 (1-v). The map is smooth on the closed cube, so phi(x(u)) is as
// smooth as phi and Saye's algorithm applies to it unchanged; only the
// surface weights need the area element of x-space (see surfaceWeight).
type geom struct {
	dim    int
	kind   mapKind
	lo, hi [3]float64
	phi    *moments.Expr
	// prog is phi compiled for the float64 inner loops (the same numbers
	// as phi.Eval64 and phi.Grad64, faster), made for the phi it names.
	prog   *moments.Prog64
	progOf *moments.Expr
}

// compiled is the float64 program of phi (compiled at the first use, and
// again if phi was replaced). A geom is used by one goroutine.
func (g *geom) compiled() *moments.Prog64 {
	if g.prog == nil || g.progOf != g.phi {
		g.prog, g.progOf = g.phi.Compile64(), g.phi
	}
	return g.prog
}

// toX maps u onto the element.
func (g *geom) toX(u [3]float64) [3]float64 {
	switch g.kind {
	case duffyTri:
		return [3]float64{u[0], u[1] * (1 - u[0])}
	case duffyTet:
		return [3]float64{u[0], u[1] * (1 - u[0]), u[2] * (1 - u[0]) * (1 - u[1])}
	}
	return u
}

// jac is the Jacobian determinant of the map at u.
func (g *geom) jac(u [3]float64) float64 {
	switch g.kind {
	case duffyTri:
		return 1 - u[0]
	case duffyTet:
		return (1 - u[0]) * (1 - u[0]) * (1 - u[1])
	}
	return 1
}

// eval returns phi(x(u)), its gradient in u (gu) and in x (gx).
func (g *geom) eval(u [3]float64) (v float64, gu, gx [3]float64) {
	x := g.toX(u)
	v = g.compiled().Grad(x[:g.dim], gx[:g.dim])
	switch g.kind {
	case duffyTri:
		gu[0] = gx[0] - u[1]*gx[1]
		gu[1] = (1 - u[0]) * gx[1]
	case duffyTet:
		gu[0] = gx[0] - u[1]*gx[1] - u[2]*(1-u[1])*gx[2]
		gu[1] = (1-u[0])*gx[1] - u[2]*(1-u[0])*gx[2]
		gu[2] = (1 - u[0]) * (1 - u[1]) * gx[2]
	default:
		gu = gx
	}
	return v, gu, gx
}

// value is phi(x(u)) alone.
func (g *geom) value(u [3]float64) float64 {
	x := g.toX(u)
	return g.compiled().Value(x[:g.dim])
}

// evalSpan encloses phi(x(u)) and its u-gradient over the box b.
func (g *geom) evalSpan(b [3]span) (v span, gu [3]span) {
	var x, gx [3]span
	one := span{Lo: 1, Hi: 1}
	switch g.kind {
	case duffyTri:
		om := sub(one, b[0])
		x = [3]span{b[0], mul(b[1], om)}
	case duffyTet:
		om, omv := sub(one, b[0]), sub(one, b[1])
		x = [3]span{b[0], mul(b[1], om), mul(mul(b[2], om), omv)}
	default:
		x = b
	}
	v = g.phi.GradSpan(x[:g.dim], gx[:g.dim])
	switch g.kind {
	case duffyTri:
		om := sub(one, b[0])
		gu[0] = sub(gx[0], mul(b[1], gx[1]))
		gu[1] = mul(om, gx[1])
	case duffyTet:
		om, omv := sub(one, b[0]), sub(one, b[1])
		gu[0] = sub(sub(gx[0], mul(b[1], gx[1])), mul(mul(b[2], omv), gx[2]))
		gu[1] = sub(mul(om, gx[1]), mul(mul(b[2], om), gx[2]))
		gu[2] = mul(mul(om, omv), gx[2])
	default:
		gu = gx
	}
	return v, gu
}

// Interval helpers for the map; the ends are pushed out by an ulp as in
// package moments, so the enclosures stay enclosures.
func sub(a, b span) span { return widen(a.Lo-b.Hi, a.Hi-b.Lo) }

func mul(a, b span) span {
	p := [4]float64{a.Lo * b.Lo, a.Lo * b.Hi, a.Hi * b.Lo, a.Hi * b.Hi}
	lo, hi := p[0], p[0]
	for _, v := range p[1:] {
		if math.IsNaN(v) {
			return span{Lo: math.Inf(-1), Hi: math.Inf(1)}
		}
		lo, hi = math.Min(lo, v), math.Max(hi, v)
	}
	return widen(lo, hi)
}

func widen(lo, hi float64) span {
	if math.IsNaN(lo) || math.IsNaN(hi) {
		return span{Lo: math.Inf(-1), Hi: math.Inf(1)}
	}
	if lo != 0 {
		lo = math.Nextafter(lo, math.Inf(-1))
	}
	if hi != 0 {
		hi = math.Nextafter(hi, math.Inf(1))
	}
	return span{Lo: lo, Hi: hi}
}
