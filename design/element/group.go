package element

import (
	"fmt"
	"math/big"
	"sort"
	"strings"
)

// affineMap is the map x -> M x + s on the coordinates of an element, with
// an integer matrix M and a rational shift s: every symmetry of a reference
// element is one (a permutation of barycentric coordinates on a simplex, a
// signed permutation on a cube, products of these on the prism and
// pyramid).
type affineMap struct {
	M [][]int64
	s []*big.Rat
}

// form is a point affine in the parameters t of an orbit: c + A t, with a
// rational c and an integer dim x len(t) matrix A. Because every orbit
// point is a form, the Jacobian of the points with respect to the
// parameters is the constant A.
type form struct {
	c []*big.Rat
	A [][]int64
}

// apply returns g(f) = M c + s + (M A) t.
func (g affineMap) apply(f form) form {
	dim, np := len(f.c), 0
	if dim > 0 {
		np = len(f.A[0])
	}
	out := form{c: make([]*big.Rat, dim), A: make([][]int64, dim)}
	for i := 0; i < dim; i++ {
		c := new(big.Rat).Set(g.s[i])
		row := make([]int64, np)
		for k := 0; k < dim; k++ {
			if g.M[i][k] == 0 {
				continue
			}
			c.Add(c, new(big.Rat).Mul(big.NewRat(g.M[i][k], 1), f.c[k]))
			for q := 0; q < np; q++ {
				row[q] += g.M[i][k] * f.A[k][q]
			}
		}
		out.c[i], out.A[i] = c, row
	}
	return out
}

// key is a string that two forms share exactly when they are equal.
func (f form) key() string {
	var b strings.Builder
	for i := range f.c {
		fmt.Fprintf(&b, "%s:%v;", f.c[i].RatString(), f.A[i])
	}
	return b.String()
}

// permutations lists the permutations of 0..n-1 in lexicographic order.
func permutations(n int) [][]int {
	if n == 0 {
		return [][]int{{}}
	}
	var out [][]int
	for _, p := range permutations(n - 1) {
		for pos := 0; pos <= len(p); pos++ {
			q := append(append(append([]int(nil), p[:pos]...), n-1), p[pos:]...)
			out = append(out, q)
		}
	}
	return out
}

func zeroMap(dim int) affineMap {
	g := affineMap{M: make([][]int64, dim), s: make([]*big.Rat, dim)}
	for i := range g.M {
		g.M[i] = make([]int64, dim)
		g.s[i] = new(big.Rat)
	}
	return g
}

// simplexGroup is the symmetry group S_(dim+1) of the reference simplex
// {x_i >= 0, sum x_i <= 1}: the permutations sigma of the barycentric
// coordinates (lambda_0 = 1 - sum x_i, lambda_i = x_i), acting as
// lambda'_i = lambda_sigma(i).
func simplexGroup(dim int) []affineMap {
	var out []affineMap
	for _, p := range permutations(dim + 1) {
		g := zeroMap(dim)
		for i := 1; i <= dim; i++ {
			if p[i] == 0 {
				for k := range g.M[i-1] {
					g.M[i-1][k] = -1
				}
				g.s[i-1].SetInt64(1)
			} else {
				g.M[i-1][p[i]-1] = 1
			}
		}
		out = append(out, g)
	}
	return out
}

// cubeGroup is the symmetry group of [-1,1]^dim, the dim! 2^dim signed
// permutation matrices.
func cubeGroup(dim int) []affineMap {
	var out []affineMap
	for _, p := range permutations(dim) {
		for signs := 0; signs < 1<<dim; signs++ {
			g := zeroMap(dim)
			for i := 0; i < dim; i++ {
				g.M[i][p[i]] = 1
				if signs>>i&1 == 1 {
					g.M[i][p[i]] = -1
				}
			}
			out = append(out, g)
		}
	}
	return out
}

// directSum returns the maps g1 x g2 acting on the first coordinates by g1
// and on the last by g2.
func directSum(g1, g2 []affineMap) []affineMap {
	var out []affineMap
	for _, a := range g1 {
		for _, b := range g2 {
			d1, d2 := len(a.s), len(b.s)
			g := zeroMap(d1 + d2)
			for i := 0; i < d1; i++ {
				copy(g.M[i], a.M[i])
				g.s[i].Set(a.s[i])
			}
			for i := 0; i < d2; i++ {
				copy(g.M[d1+i][d1:], b.M[i])
				g.s[d1+i].Set(b.s[i])
			}
			out = append(out, g)
		}
	}
	return out
}

// OrbitType is one kind of symmetry orbit of an element: the distinct
// images, under the element's symmetry group, of a generator point affine
// in Params parameters.
type OrbitType struct {
	// Name names the generator, for example "(a,a,b)".
	Name   string
	Params int
	pts    []form
	// float64 copies of the forms: point p is c64[p] + A64[p] t.
	c64 [][]float64
	A64 [][][]float64
}

// Points is the number of points of an orbit of the type.
func (o *OrbitType) Points() int { return len(o.pts) }

// newOrbitType builds the orbit of gen under group.
func newOrbitType(name string, group []affineMap, gen form) OrbitType {
	o := OrbitType{Name: name}
	if len(gen.A) > 0 {
		o.Params = len(gen.A[0])
	}
	seen := map[string]bool{}
	for _, g := range group {
		f := g.apply(gen)
		if k := f.key(); !seen[k] {
			seen[k] = true
			o.pts = append(o.pts, f)
		}
	}
	for _, f := range o.pts {
		c := make([]float64, len(f.c))
		A := make([][]float64, len(f.c))
		for i := range f.c {
			c[i], _ = f.c[i].Float64()
			A[i] = make([]float64, o.Params)
			for q := range A[i] {
				A[i][q] = float64(f.A[i][q])
			}
		}
		o.c64, o.A64 = append(o.c64, c), append(o.A64, A)
	}
	// The printed points (pts) take a fixed order: by coordinate, the
	// parameter coefficients, then the constant (on the square (-a,-a),
	// (-a,a), (a,-a), (a,a)). The float64 copies that the search sums over
	// keep the group's order, so that the searches recorded in the
	// catalogues run as they did.
	sort.SliceStable(o.pts, func(i, j int) bool { return formLess(o.pts[i], o.pts[j]) })
	return o
}

func formLess(f, g form) bool {
	for i := range f.c {
		for q := range f.A[i] {
			if f.A[i][q] != g.A[i][q] {
				return f.A[i][q] < g.A[i][q]
			}
		}
		if c := f.c[i].Cmp(g.c[i]); c != 0 {
			return c < 0
		}
	}
	return false
}

// gen builds a generator form from coordinate specifications: each
// coordinate is a constant (a rational string such as "1/3") followed by
// one integer coefficient per parameter.
func gen(np int, coords ...[]string) form {
	f := form{}
	for _, c := range coords {
		r, ok := new(big.Rat).SetString(c[0])
		if !ok || len(c) != np+1 {
			panic("element: bad orbit generator " + strings.Join(c, " "))
		}
		row := make([]int64, np)
		for q := range row {
			var v int64
			fmt.Sscan(c[q+1], &v)
			row[q] = v
		}
		f.c, f.A = append(f.c, r), append(f.A, row)
	}
	return f
}
