package levelset

import (
	"fmt"
	"math"
	"strings"

	"quadwright/design/fast"
	"quadwright/moments"
)

// Side says which part of the element the rule is for.
type Side int

const (
	Inside  Side = iota // phi < 0
	Outside             // phi > 0
	Surface             // phi = 0, with its area (2-D: length) measure
)

// SideNames lists the sides in the order of the constants.
var SideNames = []string{"inside", "outside", "surface"}

func (s Side) String() string { return SideNames[s] }

// ParseSide reads a side name.
func ParseSide(s string) (Side, error) {
	for i, n := range SideNames {
		if strings.TrimSpace(s) == n {
			return Side(i), nil
		}
	}
	return 0, fmt.Errorf("--side %q: choose inside, outside or surface", s)
}

// ShapeNames are the elements a level set may cut; "box" is a rectangle or
// box given by its bounds.
var ShapeNames = []string{"quadrilateral", "hexahedron", "triangle", "tetrahedron", "box"}

// Request says which rule to build.
type Request struct {
	Shape    string    // one of ShapeNames
	Box      []float64 // for "box": lo, hi of each coordinate (4 or 6 numbers)
	LevelSet string    // phi(x, y[, z])
	Side     Side
	Order    int    // points of every one-dimensional Gauss-Legendre rule, 1..MaxOrder
	Weight   string // optional weight w(x, y[, z]) > 0 multiplying the weights
	Digits   int    // 0: float64 mode; 1..MaxDigits: extended precision (see refine)
}

// MaxOrder bounds Request.Order.
const MaxOrder = 100

// Rule is a rule on the cut element.
type Rule struct {
	Request
	Dim     int
	Nodes   [][]float64 // float64 mode: each node's coordinates
	Weights []float64
	// Printed values: Digits digits, filled by Build; or at Digits 0
	// the shortest round-trip float64, filled by Print.
	PrintedNodes   [][]string
	PrintedWeights []string
	// EstimatedError is max |I_Q(f) - I_(Q+4)(f)| / I_(Q+4)(1) over the
	// test integrands f = 1, x, y, z, x^2, y^2, z^2, xy, xz, yz (in the
	// coordinates centred and scaled to [-1, 1] on the element's bounding
	// box), I_Q the rule of order Q on the same measure.
	EstimatedError float64
	Measure        float64 // I_Q(1)
	Whole          bool    // the element lies wholly on the side: a plain rule
	Note           string
	Method         string
	Vertices       [][]float64
}

// geometry makes the computational box of the request, its bounding box
// in x and its vertices.
func geometry(req Request, phi *moments.Expr) (*geom, error) {
	g := &geom{phi: phi}
	switch req.Shape {
	case "quadrilateral":
		g.dim, g.lo, g.hi = 2, [3]float64{-1, -1}, [3]float64{1, 1}
	case "hexahedron":
		g.dim, g.lo, g.hi = 3, [3]float64{-1, -1, -1}, [3]float64{1, 1, 1}
	case "triangle":
		g.dim, g.kind, g.hi = 2, duffyTri, [3]float64{1, 1}
	case "tetrahedron":
		g.dim, g.kind, g.hi = 3, duffyTet, [3]float64{1, 1, 1}
	case "box":
		if len(req.Box) != 4 && len(req.Box) != 6 {
			return nil, fmt.Errorf("--box: give 4 numbers A,B,C,D (a rectangle) or 6 (a box), not %d", len(req.Box))
		}
		g.dim = len(req.Box) / 2
		for i := 0; i < g.dim; i++ {
			lo, hi := req.Box[2*i], req.Box[2*i+1]
			if !(lo < hi) || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
				return nil, fmt.Errorf("--box: the bounds of %s must be finite with the lower first, not %v,%v", "xyz"[i:i+1], lo, hi)
			}
			g.lo[i], g.hi[i] = lo, hi
		}
	default:
		return nil, fmt.Errorf("--shape %q: a level set cuts one of quadrilateral, hexahedron, triangle, tetrahedron (or give --box)", req.Shape)
	}
	return g, nil
}

// vertices lists the element's corners in x.
func (g *geom) vertices() [][]float64 {
	switch g.kind {
	case duffyTri:
		return [][]float64{{0, 0}, {1, 0}, {0, 1}}
	case duffyTet:
		return [][]float64{{0, 0, 0}, {1, 0, 0}, {0, 1, 0}, {0, 0, 1}}
	}
	var out [][]float64
	for m := 0; m < 1<<g.dim; m++ {
		v := make([]float64, g.dim)
		for i := range v {
			v[i] = g.lo[i]
			if m>>i&1 == 1 {
				v[i] = g.hi[i]
			}
		}
		out = append(out, v)
	}
	return out
}

// ParseLevelSet parses phi in the variables of a dim-dimensional element;
// errors name the level set and the character position.
func ParseLevelSet(src string, dim int) (*moments.Expr, error) {
	return parseIn("level set", src, dim)
}

func parseIn(what, src string, dim int) (*moments.Expr, error) {
	e, err := moments.ParseExpr(src, []string{"x", "y", "z"}[:dim]...)
	if err != nil {
		return nil, fmt.Errorf("%s%s", what, strings.TrimPrefix(err.Error(), "weight"))
	}
	return e, nil
}

// glCache holds Gauss-Legendre rules by order (float64, from package fast).
func gaussLegendre(n int) (x, w []float64) {
	x, w = make([]float64, n), make([]float64, n)
	fast.Legendre(n, x, w)
	return x, w
}

// points runs the algorithm at order q and returns the nodes (x-space)
// and weights (Jacobian included, weight function not), and the builder's
// counters.
func points(g *geom, side Side, q int) (nodes [][3]float64, wts []float64, bd *builder) {
	return pointsTaped(g, side, q, nil)
}

// pointsTaped is points recording its plan on tp (when not nil).
func pointsTaped(g *geom, side Side, q int, tp *tape) (nodes [][3]float64, wts []float64, bd *builder) {
	// Collected in chunks and copied once: a slice grown by doubling
	// would copy (and clear fresh pages for) the rule several times.
	const chunk = 4096
	var ns [][][3]float64
	var ws [][]float64
	total := 0
	bd = run(g, side, q, tp, func(x [3]float64, w float64) {
		if total%chunk == 0 {
			ns, ws = append(ns, make([][3]float64, 0, chunk)), append(ws, make([]float64, 0, chunk))
		}
		last := len(ns) - 1
		ns[last], ws[last] = append(ns[last], x), append(ws[last], w)
		total++
	})
	if total == 0 {
		return nil, nil, bd
	}
	nodes, wts = make([][3]float64, 0, total), make([]float64, 0, total)
	for i := range ns {
		nodes, wts = append(nodes, ns[i]...), append(wts, ws[i]...)
	}
	return nodes, wts, bd
}

// run runs the algorithm at order q, handing every node (in x-space) and
// its weight (Jacobian included, weight function not) to out.
func run(g *geom, side Side, q int, tp *tape, out func(x [3]float64, w float64)) *builder {
	bd := &builder{g: g, q: q, maxDepth: 12 * g.dim, maxSlope: slopeBound, tape: tp}
	bd.gx, bd.gw = gaussLegendre(q)
	var b [3]span
	free := make([]int, g.dim)
	for i := range free {
		free[i] = i
		b[i] = span{Lo: g.lo[i], Hi: g.hi[i]}
	}
	s := -1
	if side == Outside {
		s = 1
	}
	if side == Surface {
		s = 0
	}
	bd.integrate(free, b, []fn{{s: s}}, side == Surface, 0, func(u [3]float64, w float64) {
		out(g.toX(u), w*g.jac(u))
	})
	return bd
}

// slopeBound is the largest variation of d phi/du_k over a box, in units
// of its smallest size there, that a box keeps before it is split; tuned
// on the shifted discs and balls of the tests (smaller costs points,
// larger slows the convergence near vertical tangents).
var slopeBound = 1.5
