package polytope

import (
	"math/big"

	"quadwright/design/element"
)

// expIndex maps exponent tuples to their place in element.Exponents.
type expIndex struct {
	exps [][]int
	pos  map[[3]int]int
}

func newExpIndex(dim, deg int) *expIndex {
	ix := &expIndex{exps: element.Exponents(dim, deg), pos: map[[3]int]int{}}
	for j, e := range ix.exps {
		ix.pos[key3(e)] = j
	}
	return ix
}

func key3(e []int) [3]int {
	var k [3]int
	copy(k[:], e)
	return k
}

func factorialRat(n int) *big.Rat {
	f := new(big.Int).MulRange(1, int64(max(n, 1)))
	return new(big.Rat).SetInt(f)
}

// simplexAverages returns, for every exponent tuple a of ix, the integral
// of x^a over the simplex with the m+1 vertices vs divided by m! times its
// unsigned volume (the integral against the standard simplex measure of
// total mass 1/m!, times m!). It uses the closed form
//
//	int_S x^a = m! vol(S) a! / (|a| + m)! sum over b_0 + ... + b_m = a of
//	            prod_k |b_k|! / b_k! v_k^(b_k)
//
// (the monomial form of the complete-homogeneous formula for powers of a
// linear form, V. Baldoni, N. Berline, J. De Loera, M. Koeppe and M.
// Vergne, "How to integrate a polynomial over a simplex", Math. Comp. 80,
// 2011), the sum formed as a convolution over the vertices.
func simplexAverages(vs [][]*big.Rat, ix *expIndex) []*big.Rat {
	m := len(vs) - 1
	N := len(ix.exps)
	// c[k][j] = |b|!/b! v_k^b for b = exps[j].
	coef := func(v []*big.Rat) []*big.Rat {
		out := make([]*big.Rat, N)
		for j, b := range ix.exps {
			t := new(big.Rat).Set(factorialRat(sum(b)))
			for i, bi := range b {
				t.Quo(t, factorialRat(bi))
				t.Mul(t, ratPow(v[i], bi))
			}
			out[j] = t
		}
		return out
	}
	g := coef(vs[0])
	tmp := new(big.Rat)
	for k := 1; k <= m; k++ {
		c := coef(vs[k])
		next := make([]*big.Rat, N)
		for j, a := range ix.exps {
			s := new(big.Rat)
			forEachBelow(a, func(b []int) {
				jb := ix.pos[key3(b)]
				if c[jb].Sign() == 0 {
					return
				}
				rest := make([]int, len(a))
				for i := range a {
					rest[i] = a[i] - b[i]
				}
				jr := ix.pos[key3(rest)]
				if g[jr].Sign() == 0 {
					return
				}
				s.Add(s, tmp.Mul(g[jr], c[jb]))
			})
			next[j] = s
		}
		g = next
	}
	for j, a := range ix.exps {
		f := new(big.Rat).Set(factorialRat(m))
		for _, ai := range a {
			f.Mul(f, factorialRat(ai))
		}
		f.Quo(f, factorialRat(sum(a)+m))
		// The m! of the formula belongs to m! vol(S), divided out.
		f.Quo(f, factorialRat(m))
		g[j].Mul(g[j], f)
	}
	return g
}

func sum(e []int) int {
	s := 0
	for _, v := range e {
		s += v
	}
	return s
}

func ratPow(x *big.Rat, n int) *big.Rat {
	out := big.NewRat(1, 1)
	for i := 0; i < n; i++ {
		out.Mul(out, x)
	}
	return out
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
	v := p.ccw()
	ix := newExpIndex(2, deg)
	out := make([]*big.Rat, len(ix.exps))
	for j := range out {
		out[j] = new(big.Rat)
	}
	zero := [2]*big.Rat{new(big.Rat), new(big.Rat)}
	for i := range v {
		a, b := v[i], v[(i+1)%len(v)]
		c := cross2(zero, a, b)
		if c.Sign() == 0 {
			continue
		}
		avg := simplexAverages([][]*big.Rat{a[:], b[:]}, ix)
		for j := range out {
			out[j].Add(out[j], new(big.Rat).Mul(c, avg[j]))
		}
	}
	for j, e := range ix.exps {
		out[j].Quo(out[j], big.NewRat(int64(2+sum(e)), 1))
	}
	return out
}

// PolyhedronMoments returns the exact integrals over p of the monomials
// of total degree <= deg, in the order of element.Exponents(3, deg), by
// the divergence theorem as for polygons: int_P f = 1/(3+q) sum over faces
// h_F int_F f, h_F the signed distance of the face plane from the origin;
// each face is split into triangles T = (a, b, c), on which h_F int_T f =
// det(a, b, c) times the average of f over T (simplexAverages, m = 2).
func PolyhedronMoments(p *Polyhedron, deg int) []*big.Rat {
	ix := newExpIndex(3, deg)
	out := make([]*big.Rat, len(ix.exps))
	for j := range out {
		out[j] = new(big.Rat)
	}
	o := vec3{new(big.Rat), new(big.Rat), new(big.Rat)}
	for _, t := range p.boundaryTriangles() {
		d := det3(o, t[0], t[1], t[2])
		if d.Sign() == 0 {
			continue
		}
		avg := simplexAverages([][]*big.Rat{t[0][:], t[1][:], t[2][:]}, ix)
		for j := range out {
			out[j].Add(out[j], new(big.Rat).Mul(d, avg[j]))
		}
	}
	for j, e := range ix.exps {
		out[j].Quo(out[j], big.NewRat(int64(3+sum(e)), 1))
	}
	return out
}
