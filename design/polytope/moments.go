package polytope

import (
	"math/big"
	"sync"

	"quadwright/design/element"
)

// expIndex maps exponent tuples to their place in element.Exponents.
type expIndex struct {
	exps [][]int
	pos  map[[3]int]int
}

// newExpIndex returns the (shared, read-only) index of dim variables
// through total degree deg.
func newExpIndex(dim, deg int) *expIndex {
	if v, ok := expIndexes.Load([2]int{dim, deg}); ok {
		return v.(*expIndex)
	}
	ix := &expIndex{exps: element.Exponents(dim, deg), pos: map[[3]int]int{}}
	for j, e := range ix.exps {
		ix.pos[key3(e)] = j
	}
	expIndexes.Store([2]int{dim, deg}, ix)
	return ix
}

var expIndexes sync.Map // [2]int{dim, deg} -> *expIndex

func key3(e []int) [3]int {
	var k [3]int
	copy(k[:], e)
	return k
}

// simplexAverages returns, for every exponent tuple a of ix, the integral
// of x^a over the simplex with the m+1 vertices vs divided by m! times its
// unsigned volume (the integral against the standard simplex measure of
// total mass 1/m!, times m!). It uses the closed form
//
//	int_S x^a = m! vol(S) a! / (|a| + m)! sum over b_0 + ... + b_m = a of
//	            prod_k (|b_k| choose b_k) v_k^(b_k)
//
// (the monomial form of the complete-homogeneous formula for powers of a
// linear form, V. Baldoni, N. Berline, J. De Loera, M. Koeppe and M.
// Vergne, "How to integrate a polynomial over a simplex", Math. Comp. 80,
// 2011), the sum formed as a convolution over the vertices (simplexSums).
// The vertices are first scaled to integers by the common denominator L of
// their coordinates, so that the convolution runs on integers and only the
// final factor L^-|a| a!/(|a|+m)! is rational: the reduction of rationals
// at every step cost more than the rest.
func simplexAverages(vs [][]*big.Rat, ix *expIndex) []*big.Rat {
	m := len(vs) - 1
	L := commonDenom(vs)
	g := simplexSums(scaleToInts(vs, L), ix)
	return finishMoments(g, ix, m, 0, L, big.NewInt(1))
}

// commonDenom is the least common denominator of the coordinates of pts.
func commonDenom(pts [][]*big.Rat) *big.Int {
	L := big.NewInt(1)
	g := new(big.Int)
	q := new(big.Int)
	for _, v := range pts {
		for _, c := range v {
			d := c.Denom()
			if d.IsInt64() && d.Int64() == 1 {
				continue
			}
			g.GCD(nil, nil, L, d)
			L.Mul(L, q.Quo(d, g))
		}
	}
	return L
}

// scaleToInts returns the points times L (integers when L is a common
// denominator of their coordinates).
func scaleToInts(pts [][]*big.Rat, L *big.Int) [][]*big.Int {
	out := make([][]*big.Int, len(pts))
	for k, v := range pts {
		out[k] = make([]*big.Int, len(v))
		for i, c := range v {
			t := new(big.Int).Mul(c.Num(), L)
			out[k][i] = t.Quo(t, c.Denom())
		}
	}
	return out
}

// convPlan is, for one expIndex, the multinomial coefficients |b|!/b!
// of every tuple and, for every tuple a, the pairs (b, a - b) of tuple
// positions with b <= a: the convolution of simplexSums without a map
// lookup per term.
type convPlan struct {
	multi []*big.Int
	pairs [][][2]int
}

var convPlans sync.Map // [2]int{dim, deg} -> *convPlan

func planFor(ix *expIndex) *convPlan {
	dim := len(ix.exps[0])
	deg := 0
	for _, e := range ix.exps {
		deg = max(deg, sum(e))
	}
	key := [2]int{dim, deg}
	if v, ok := convPlans.Load(key); ok && len(v.(*convPlan).multi) == len(ix.exps) {
		return v.(*convPlan)
	}
	pl := &convPlan{multi: multinomials(ix), pairs: make([][][2]int, len(ix.exps))}
	rest := make([]int, dim)
	for j, a := range ix.exps {
		forEachBelow(a, func(b []int) {
			for i := range a {
				rest[i] = a[i] - b[i]
			}
			pl.pairs[j] = append(pl.pairs[j], [2]int{ix.pos[key3(b)], ix.pos[key3(rest)]})
		})
	}
	convPlans.Store(key, pl)
	return pl
}

// simplexSums returns, for every tuple a of ix, the integer sum over b_0 +
// ... + b_m = a of prod_k (|b_k| choose b_k) v_k^(b_k), for the integer
// vertices iv: the numerator of simplexAverages before the factor
// a!/(|a|+m)!.
func simplexSums(iv [][]*big.Int, ix *expIndex) []*big.Int {
	return newSumWork(ix, len(iv[0])).sums(iv)
}

// sumWork is the storage simplexSums reuses from one simplex to the next
// (a polygon's edges, a polyhedron's boundary triangles): the values
// returned by sums are overwritten by the next call.
type sumWork struct {
	ix        *expIndex
	pl        *convPlan
	pw        [][]*big.Int
	c, g, nxt []*big.Int
	tmp       *big.Int
}

func newSumWork(ix *expIndex, dim int) *sumWork {
	N := len(ix.exps)
	deg := sum(ix.exps[N-1])
	w := &sumWork{ix: ix, pl: planFor(ix), pw: make([][]*big.Int, dim), tmp: new(big.Int)}
	for i := range w.pw {
		w.pw[i] = make([]*big.Int, deg+1)
		for p := range w.pw[i] {
			w.pw[i][p] = new(big.Int)
		}
	}
	mk := func() []*big.Int {
		out := make([]*big.Int, N)
		for j := range out {
			out[j] = new(big.Int)
		}
		return out
	}
	w.c, w.g, w.nxt = mk(), mk(), mk()
	return w
}

// coef sets out[b] = (|b| choose b) v^b.
func (w *sumWork) coef(v []*big.Int, out []*big.Int) {
	for i := range w.pw {
		w.pw[i][0].SetInt64(1)
		for p := 1; p < len(w.pw[i]); p++ {
			w.pw[i][p].Mul(w.pw[i][p-1], v[i])
		}
	}
	for j, b := range w.ix.exps {
		t := out[j].Set(w.pl.multi[j])
		for i, bi := range b {
			if bi > 0 {
				t.Mul(t, w.pw[i][bi])
			}
		}
	}
}

func (w *sumWork) sums(iv [][]*big.Int) []*big.Int {
	w.coef(iv[0], w.g)
	for k := 1; k < len(iv); k++ {
		w.coef(iv[k], w.c)
		for j := range w.ix.exps {
			s := w.nxt[j].SetInt64(0)
			for _, pr := range w.pl.pairs[j] {
				if w.c[pr[0]].Sign() == 0 || w.g[pr[1]].Sign() == 0 {
					continue
				}
				s.Add(s, w.tmp.Mul(w.g[pr[1]], w.c[pr[0]]))
			}
		}
		w.g, w.nxt = w.nxt, w.g
	}
	return w.g
}

// finishMoments returns g_a a! / ((|a| + m)! (|a| + extra) L^(|a| + extra) den)
// for every tuple a of ix (extra = 0: no factor |a| + extra, only L^|a|):
// the one rational division per monomial of the integer routes.
func finishMoments(g []*big.Int, ix *expIndex, m, extra int, L, den *big.Int) []*big.Rat {
	return reduce(fracMoments(g, ix, m, extra, L, den))
}

// fracMoments is finishMoments with each value left as an unreduced
// fraction num[j] / den[j] (den[j] > 0), for a caller that only
// cross-multiplies (exactSums): reducing costs a gcd per monomial.
func fracMoments(g []*big.Int, ix *expIndex, m, extra int, L, den *big.Int) (num, dn []*big.Int) {
	deg := sum(ix.exps[len(ix.exps)-1]) + extra
	Lp := make([]*big.Int, deg+1)
	Lp[0] = big.NewInt(1)
	for p := 1; p <= deg; p++ {
		Lp[p] = new(big.Int).Mul(Lp[p-1], L)
	}
	num, dn = make([]*big.Int, len(ix.exps)), make([]*big.Int, len(ix.exps))
	for j, a := range ix.exps {
		n := new(big.Int).Set(g[j])
		for _, ai := range a {
			if ai > 1 {
				n.Mul(n, factorialInt(ai))
			}
		}
		q := sum(a)
		d := new(big.Int).Mul(factorialInt(q+m), Lp[q+extra])
		if extra > 0 {
			d.Mul(d, big.NewInt(int64(q+extra)))
		}
		d.Mul(d, den)
		num[j], dn[j] = n, d
	}
	return num, dn
}

// multinomials returns |b|! / (b_1! ... b_dim!) for every tuple of ix.
func multinomials(ix *expIndex) []*big.Int {
	out := make([]*big.Int, len(ix.exps))
	for j, b := range ix.exps {
		t := factorialInt(sum(b))
		for _, bi := range b {
			t.Quo(t, factorialInt(bi))
		}
		out[j] = t
	}
	return out
}

func factorialInt(n int) *big.Int {
	return new(big.Int).MulRange(1, int64(max(n, 1)))
}

func sum(e []int) int {
	s := 0
	for _, v := range e {
		s += v
	}
	return s
}

// forEachBelow calls f with every tuple b, 0 <= b <= a componentwise.
func forEachBelow(a []int, f func(b []int)) {
	b := make([]int, len(a))
	var rec func(i int)
	rec = func(i int) {
		if i == len(a) {
			f(b)
			return
		}
		for v := 0; v <= a[i]; v++ {
			b[i] = v
			rec(i + 1)
		}
	}
	rec(0)
}

// PolygonMoments returns the exact integrals over p of the monomials
// x^a y^b of total degree <= deg, in the order of element.Exponents(2,
// deg), by the divergence theorem: for a homogeneous f of degree q,
// div(x f) = (2 + q) f, so
//
//	int_P f = 1/(2+q) sum over edges (v_i x v_(i+1)) int_0^1 f((1-t) v_i + t v_(i+1)) dt
//
// (the boundary normal times position is constant along an edge; E. B.
// Chin, J. B. Lasserre and N. Sukumar, "Numerical integration of
// homogeneous functions on convex and nonconvex polygons and polyhedra",
// Comput. Mech. 56, 2015), each edge integral in closed form
// (simplexAverages with m = 1).
func PolygonMoments(p *Polygon, deg int) []*big.Rat {
	num, den := polygonMomentFracs(p, deg)
	return reduce(num, den)
}

// reduce returns the fractions num[j] / den[j] as rationals.
func reduce(num, den []*big.Int) []*big.Rat {
	out := make([]*big.Rat, len(num))
	for j := range num {
		out[j] = new(big.Rat).SetFrac(num[j], den[j])
	}
	return out
}

// polygonMomentFracs is PolygonMoments as unreduced fractions.
func polygonMomentFracs(p *Polygon, deg int) (num, den []*big.Int) {
	v := p.ccw()
	ix := newExpIndex(2, deg)
	pts := make([][]*big.Rat, len(v))
	for i := range v {
		pts[i] = v[i][:]
	}
	// Every edge average has the denominator (|a|+1)! L^|a| / a! and every
	// edge factor v_i x v_(i+1) the denominator L^2: the sum over the
	// edges runs on integers, with one division per monomial at the end.
	L := commonDenom(pts)
	iv := scaleToInts(pts, L)
	acc := make([]*big.Int, len(ix.exps))
	for j := range acc {
		acc[j] = new(big.Int)
	}
	c, t := new(big.Int), new(big.Int)
	sw := newSumWork(ix, 2)
	for i := range iv {
		a, b := iv[i], iv[(i+1)%len(iv)]
		c.Mul(a[0], b[1])
		c.Sub(c, t.Mul(a[1], b[0]))
		if c.Sign() == 0 {
			continue
		}
		g := sw.sums([][]*big.Int{a, b})
		for j := range acc {
			acc[j].Add(acc[j], t.Mul(c, g[j]))
		}
	}
	return fracMoments(acc, ix, 1, 2, L, bigOne)
}

// PolyhedronMoments returns the exact integrals over p of the monomials
// of total degree <= deg, in the order of element.Exponents(3, deg), by
// the divergence theorem as for polygons: int_P f = 1/(3+q) sum over faces
// h_F int_F f, h_F the signed distance of the face plane from the origin;
// each face is split into triangles T = (a, b, c), on which h_F int_T f =
// det(a, b, c) times the average of f over T (simplexSums, m = 2), the
// sum over the triangles in integers as for polygons.
func PolyhedronMoments(p *Polyhedron, deg int) []*big.Rat {
	num, den := polyhedronMomentFracs(p, deg)
	return reduce(num, den)
}

// polyhedronMomentFracs is PolyhedronMoments as unreduced fractions.
func polyhedronMomentFracs(p *Polyhedron, deg int) (num, den []*big.Int) {
	ix := newExpIndex(3, deg)
	tris := p.boundaryTriangles()
	var pts [][]*big.Rat
	for _, t := range tris {
		pts = append(pts, t[0][:], t[1][:], t[2][:])
	}
	L := commonDenom(pts)
	acc := make([]*big.Int, len(ix.exps))
	for j := range acc {
		acc[j] = new(big.Int)
	}
	t := new(big.Int)
	sw := newSumWork(ix, 3)
	for _, tri := range tris {
		iv := scaleToInts([][]*big.Rat{tri[0][:], tri[1][:], tri[2][:]}, L)
		d := detInt3(iv[0], iv[1], iv[2])
		if d.Sign() == 0 {
			continue
		}
		g := sw.sums(iv)
		for j := range acc {
			acc[j].Add(acc[j], t.Mul(d, g[j]))
		}
	}
	return fracMoments(acc, ix, 2, 3, L, bigOne)
}

// detInt3 is det[a, b, c] of three integer vectors.
func detInt3(a, b, c []*big.Int) *big.Int {
	m := func(x, y *big.Int) *big.Int { return new(big.Int).Mul(x, y) }
	d := new(big.Int)
	for k := 0; k < 3; k++ {
		minor := new(big.Int).Sub(m(b[(k+1)%3], c[(k+2)%3]), m(b[(k+2)%3], c[(k+1)%3]))
		d.Add(d, minor.Mul(minor, a[k]))
	}
	return d
}
