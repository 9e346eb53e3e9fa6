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
// 2011), the sum formed as a convolution over the vertices. The vertices
// are first scaled to integers by the common denominator L of their
// coordinates, so that the convolution runs on integers (multinomial
// coefficients times integer powers) and only the final factor
// L^-|a| a!/(|a|+m)! is rational: the reduction of rationals at every
// step cost more than the rest.
func simplexAverages(vs [][]*big.Rat, ix *expIndex) []*big.Rat {
	m := len(vs) - 1
	N := len(ix.exps)
	dim := len(vs[0])
	L := big.NewInt(1)
	g0 := new(big.Int)
	for _, v := range vs {
		for _, c := range v {
			d := c.Denom()
			g0.GCD(nil, nil, L, d)
			L.Mul(L, new(big.Int).Quo(d, g0))
		}
	}
	iv := make([][]*big.Int, len(vs))
	for k, v := range vs {
		iv[k] = make([]*big.Int, dim)
		for i, c := range v {
			t := new(big.Int).Mul(c.Num(), L)
			iv[k][i] = t.Quo(t, c.Denom())
		}
	}
	deg := 0
	for _, e := range ix.exps {
		deg = max(deg, sum(e))
	}
	multi := multinomials(ix)
	// pw[i][p] = v_i^p, built per vertex.
	coef := func(v []*big.Int) []*big.Int {
		pw := make([][]*big.Int, dim)
		for i := range pw {
			pw[i] = make([]*big.Int, deg+1)
			pw[i][0] = big.NewInt(1)
			for p := 1; p <= deg; p++ {
				pw[i][p] = new(big.Int).Mul(pw[i][p-1], v[i])
			}
		}
		out := make([]*big.Int, N)
		for j, b := range ix.exps {
			t := new(big.Int).Set(multi[j])
			for i, bi := range b {
				t.Mul(t, pw[i][bi])
			}
			out[j] = t
		}
		return out
	}
	g := coef(iv[0])
	tmp := new(big.Int)
	rest := make([]int, dim)
	for k := 1; k <= m; k++ {
		c := coef(iv[k])
		next := make([]*big.Int, N)
		for j, a := range ix.exps {
			s := new(big.Int)
			forEachBelow(a, func(b []int) {
				jb := ix.pos[key3(b)]
				if c[jb].Sign() == 0 {
					return
				}
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
	out := make([]*big.Rat, N)
	Lp := make([]*big.Int, deg+1)
	Lp[0] = big.NewInt(1)
	for p := 1; p <= deg; p++ {
		Lp[p] = new(big.Int).Mul(Lp[p-1], L)
	}
	for j, a := range ix.exps {
		num := new(big.Int).Set(g[j])
		for _, ai := range a {
			num.Mul(num, factorialInt(ai))
		}
		den := new(big.Int).Mul(factorialInt(sum(a)+m), Lp[sum(a)])
		out[j] = new(big.Rat).SetFrac(num, den)
	}
	return out
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
