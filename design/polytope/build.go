package polytope

import (
	"context"
	"fmt"
	"math"
	"math/big"

	"quadwright/design/element"
)

// MaxDegree is the largest degree built: 30 for polygons, 12 for
// polyhedra (the moment equations are solved densely, as for weighted
// element rules).
func MaxDegree(dim int) int {
	if dim == 2 {
		return 30
	}
	return 12
}

// MaxDigits is the most digits printed (as for weighted element rules).
const MaxDigits = element.MaxWeightedDigits

// Options say what rule to build.
type Options struct {
	Degree int
	// Digits is the number of significant digits printed, 1..MaxDigits; 0
	// selects float64 mode (the nearest double of every value).
	Digits int
}

// Rule is a verified rule on a user's cell.
type Rule struct {
	// Kind is "polygon" or "polyhedron".
	Kind string
	Dim  int
	// Vertices are the cell's vertices as written; Faces (polyhedra) the
	// faces as 0-based vertex indices.
	Vertices [][]string
	Faces    [][]int
	Method   string
	// Nodes and Weights are printed as element.Rule's.
	Nodes     [][]string
	Weights   []string
	Digits    int
	Requested int
	Degree    int
	Exactness element.Exactness
	// WorkingPrec and CheckPrec are the bits of the two computations.
	WorkingPrec, CheckPrec uint
}

// Points is the number of nodes.
func (r *Rule) Points() int { return len(r.Nodes) }

// Method names the construction.
const Method = "collapsed rules on a simplex subdivision, Tchakaloff compression (Lawson-Hanson NNLS), point elimination (Xiao-Gimbutas), Gauss-Newton at two extended precisions"

// cell is what Build needs of a polygon or polyhedron.
type cell interface {
	dimension() int
	canonical() (canon func() cell, key string, sim similarity)
	moments(deg int) []*big.Rat
	// momentFracs is moments as unreduced fractions num[j] / den[j].
	momentFracs(deg int) (num, den []*big.Int)
	simplices() [][][]*big.Rat
	// framed returns the cell moved by w_k -> (w_k - c_k)/h_k into [-1,1]^dim.
	framed() (cell, []*big.Rat, []*big.Rat)
	insideOpen() func(x []float64) bool
	describe() (kind string, vertices [][]string, faces [][]int)
}

func checkOptions(dim int, opt Options) error {
	if opt.Degree < 0 || opt.Degree > MaxDegree(dim) {
		return fmt.Errorf("--degree %d: rules on a %s are built for degrees 0 to %d", opt.Degree, kindName(dim), MaxDegree(dim))
	}
	if opt.Digits < 0 || opt.Digits > MaxDigits {
		return fmt.Errorf("--digits %d: rules on a %s are built with 1 to %d digits", opt.Digits, kindName(dim), MaxDigits)
	}
	return nil
}

func kindName(dim int) string {
	if dim == 2 {
		return "polygon"
	}
	return "polyhedron"
}

// BuildPolygon builds a rule on the polygon (validated): positive weights,
// nodes in the closed polygon, every monomial of total degree <=
// opt.Degree integrated exactly to the digits printed (verified on the
// printed values against PolygonMoments).
func BuildPolygon(ctx context.Context, p *Polygon, opt Options) (*Rule, error) {
	return build(ctx, polygonCell{p}, opt, nil)
}

// BuildPolyhedron is BuildPolygon for a validated polyhedron.
func BuildPolyhedron(ctx context.Context, p *Polyhedron, opt Options) (*Rule, error) {
	return build(ctx, polyhedronCell{p}, opt, nil)
}

// classSolution is a canonical form's rule in its frame coordinates and
// the map from the frame to the canonical form.
type classSolution struct {
	sol    *element.Solution
	center []*big.Rat
	half   []*big.Rat
}

// solveClass builds the rule of a canonical form.
func solveClass(ctx context.Context, canon cell, opt Options) (*classSolution, error) {
	fr, c, h := canon.framed()
	reg := element.Region{
		Dim: fr.dimension(), Degree: opt.Degree,
		Inside: fr.insideOpen(), Simplices: fr.simplices(), Moments: fr.moments(opt.Degree),
	}
	sol, err := element.SolveRegion(ctx, reg, opt.Digits)
	if err != nil {
		return nil, err
	}
	return &classSolution{sol, c, h}, nil
}

// build makes the rule of one cell from its class's solution, solved
// here unless cache supplies it; the mapped rule is printed, confirmed and
// verified for this cell.
func build(ctx context.Context, c cell, opt Options, cache func(key string, canon func() cell) (*classSolution, error)) (*Rule, error) {
	dim := c.dimension()
	if err := checkOptions(dim, opt); err != nil {
		return nil, err
	}
	canon, key, sim := c.canonical()
	var cs *classSolution
	var err error
	if cache != nil {
		cs, err = cache(key, canon)
	} else {
		cs, err = solveClass(ctx, canon(), opt)
	}
	if err != nil {
		return nil, fmt.Errorf("degree %d: %v", opt.Degree, err)
	}
	// x = t + A (c + H xi) = (t + A c) + (A H) xi, H = diag(h).
	A := make([][]*big.Rat, dim)
	t := make([]*big.Rat, dim)
	for i := 0; i < dim; i++ {
		A[i] = make([]*big.Rat, dim)
		t[i] = new(big.Rat).Set(sim.t[i])
		for j := 0; j < dim; j++ {
			A[i][j] = new(big.Rat).Mul(sim.A[i][j], cs.half[j])
			t[i].Add(t[i], new(big.Rat).Mul(sim.A[i][j], cs.center[j]))
		}
	}
	det := new(big.Rat).Set(sim.det)
	for i := 0; i < dim; i++ {
		det.Mul(det, cs.half[i])
	}
	nodes, weights, ok := cs.sol.Mapped(A, t, det).Print(opt.Digits)
	if !ok {
		return nil, fmt.Errorf("degree %d: the rule could not be confirmed by the second computation once mapped onto the cell", opt.Degree)
	}
	kind, verts, faces := c.describe()
	r := &Rule{
		Kind: kind, Dim: dim, Vertices: verts, Faces: faces, Method: Method,
		Nodes: nodes, Weights: weights, Digits: opt.Digits, Requested: opt.Degree,
		WorkingPrec: cs.sol.PrecLo, CheckPrec: cs.sol.PrecHi,
	}
	if err := verify(ctx, c, r); err != nil {
		return nil, err
	}
	return r, nil
}

// verify checks the printed rule: positive weights, nodes in the closed
// cell (exactly, on its simplices), exactness through the degree asked
// against the cell's exact moments. Each printed value is read once, as
// the exact decimal it is (readDecimal).
func verify(ctx context.Context, c cell, r *Rule) error {
	kind := r.Kind
	dim := c.dimension()
	rd, err := readRule(r.Nodes, r.Weights, dim)
	if err != nil {
		return err
	}
	st := newSimplexTest(c.simplices())
	pf := make([]float64, dim)
	for i, w := range rd.w {
		if w.m.Sign() <= 0 {
			return fmt.Errorf("the %s rule of degree %d has a weight that is not positive (weight %d = %s)", kind, r.Requested, i+1, r.Weights[i])
		}
		for k := range pf {
			pf[k] = rd.float(k, i)
		}
		if !st.contains(pf, func() []*big.Rat { return rd.point(i) }) {
			return fmt.Errorf("the %s rule of degree %d has node %d %v outside the %s", kind, r.Requested, i+1, r.Nodes[i], kind)
		}
	}
	if err := ctx.Err(); err != nil {
		return err
	}
	base := r.Digits
	if base == 0 {
		base = 17
	}
	num, den := c.momentFracs(r.Requested)
	ex := rd.exactSums(num, den, r.Requested, base)
	if ex.Degree < r.Requested {
		return fmt.Errorf("the printed %s rule for degree %d could not be verified: it integrates the exact moments only through degree %d", kind, r.Requested, ex.Degree)
	}
	r.Exactness, r.Degree = ex, ex.Degree
	return nil
}

// verifyExact tests a rule read from a file (any number
// precision.ParseNumber reads) on every monomial of total degree <=
// maxDeg against the exact moments of the cell, with the tolerance of
// element.VerifyAgainst for digits significant digits (0: float64, 17).
func verifyExact(ctx context.Context, c cell, nodes [][]string, weights []string, maxDeg, digits int) (element.Exactness, error) {
	dim := c.dimension()
	frame := element.Quadrilateral
	if dim == 3 {
		frame = element.Hexahedron
	}
	mono := c.moments(maxDeg)
	ix := newExpIndex(dim, maxDeg)
	integral := func(e []int) *big.Rat { return mono[ix.pos[key3(e)]] }
	base := digits
	if base == 0 {
		base = 17
	}
	return element.VerifyAgainst(ctx, frame, nodes, weights, element.CheckOptions{MaxDegree: maxDeg, MinDigits: base, Integral: integral})
}

// simplexTest is inSimplices with the simplices converted to float64
// once, for testing many points.
type simplexTest struct {
	exact [][][]*big.Rat
	f     [][][]float64
}

func newSimplexTest(simp [][][]*big.Rat) *simplexTest {
	st := &simplexTest{exact: simp, f: make([][][]float64, len(simp))}
	for j, s := range simp {
		st.f[j] = make([][]float64, len(s))
		for i := range s {
			st.f[j][i] = make([]float64, len(s[i]))
			for k := range s[i] {
				st.f[j][i][k], _ = s[i][k].Float64()
			}
		}
	}
	return st
}

// contains reports whether the point lies in the closed union of the
// simplices: pf is its nearest float64 value, exact returns it exactly
// (called only when the float64 filter cannot decide).
func (st *simplexTest) contains(pf []float64, exact func() []*big.Rat) bool {
	for _, s := range st.f {
		if clearlyInside(s, pf) {
			return true
		}
	}
	p := exact()
	for _, s := range st.exact {
		if inSimplex(s, p) {
			return true
		}
	}
	return false
}

// inSimplices reports whether p lies in the closed union of the simplices.
// A point clearly inside one simplex in float64 (every barycentric
// coordinate above 1e-9, the simplex not flatter than 1e-6) is accepted
// without the exact test: the float64 coordinates are wrong by about
// 1e-15 relative, far inside that margin; every other case is decided
// exactly.
func inSimplices(simp [][][]*big.Rat, p []*big.Rat) bool {
	pf := make([]float64, len(p))
	for k := range p {
		pf[k], _ = p[k].Float64()
	}
	return newSimplexTest(simp).contains(pf, func() []*big.Rat { return p })
}

// clearlyInside is the float64 filter of inSimplices.
func clearlyInside(v [][]float64, p []float64) bool {
	dim := len(p)
	det := func(rows [][]float64) float64 {
		if dim == 2 {
			return rows[0][0]*rows[1][1] - rows[0][1]*rows[1][0]
		}
		return rows[0][0]*(rows[1][1]*rows[2][2]-rows[1][2]*rows[2][1]) - rows[0][1]*(rows[1][0]*rows[2][2]-rows[1][2]*rows[2][0]) + rows[0][2]*(rows[1][0]*rows[2][1]-rows[1][1]*rows[2][0])
	}
	// barycentric coordinates by Cramer's rule on the edge vectors from v0
	E := make([][]float64, dim)
	lens := 1.0
	for k := 0; k < dim; k++ {
		E[k] = make([]float64, dim)
		n := 0.0
		for i := 0; i < dim; i++ {
			E[k][i] = v[k+1][i] - v[0][i]
			n += E[k][i] * E[k][i]
		}
		lens *= math.Sqrt(n)
	}
	D := det(E)
	if math.Abs(D) < 1e-6*lens {
		return false
	}
	sum := 0.0
	for k := 0; k < dim; k++ {
		F := make([][]float64, dim)
		for j := range F {
			F[j] = E[j]
		}
		q := make([]float64, dim)
		for i := range q {
			q[i] = p[i] - v[0][i]
		}
		F[k] = q
		l := det(F) / D
		if l <= 1e-9 {
			return false
		}
		sum += l
	}
	return 1-sum > 1e-9
}

// inSimplex tests p against every facet of s: p and the opposite vertex
// on the same (closed) side.
func inSimplex(s [][]*big.Rat, p []*big.Rat) bool {
	dim := len(p)
	for k := range s {
		// the facet without vertex k
		var f [][]*big.Rat
		for j := range s {
			if j != k {
				f = append(f, s[j])
			}
		}
		side := func(q []*big.Rat) int {
			E := make([][]*big.Rat, dim)
			for i := 0; i < dim; i++ {
				E[i] = make([]*big.Rat, dim)
			}
			for i := 1; i < dim; i++ {
				for j := 0; j < dim; j++ {
					E[i-1][j] = new(big.Rat).Sub(f[i][j], f[0][j])
				}
			}
			for j := 0; j < dim; j++ {
				E[dim-1][j] = new(big.Rat).Sub(q[j], f[0][j])
			}
			return detRat(E).Sign()
		}
		sv, sp := side(s[k]), side(p)
		if sp != 0 && sp != sv {
			return false
		}
	}
	return true
}

func detRat(E [][]*big.Rat) *big.Rat {
	m := func(a, b *big.Rat) *big.Rat { return new(big.Rat).Mul(a, b) }
	if len(E) == 2 {
		return new(big.Rat).Sub(m(E[0][0], E[1][1]), m(E[0][1], E[1][0]))
	}
	d := new(big.Rat)
	for c := 0; c < 3; c++ {
		d.Add(d, m(E[0][c], new(big.Rat).Sub(m(E[1][(c+1)%3], E[2][(c+2)%3]), m(E[1][(c+2)%3], E[2][(c+1)%3]))))
	}
	return d
}
