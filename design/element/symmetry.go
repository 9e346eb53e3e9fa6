package element

import (
	"fmt"
	"sync"
)

// Symmetry is the symmetry group of a reference element with the orbit
// types a fully symmetric rule on it is made of. A rule's Structure counts
// the orbits of each type, in the order of Types.
type Symmetry struct {
	Shape Shape
	// Group names the group, for example "S3" or "D4".
	Group string
	// Types lists the orbit types, those with fewer parameters first.
	Types []OrbitType
	// lo, hi bound each coordinate on the element (random starts).
	lo, hi []float64
	order  int
}

var (
	symOnce sync.Once
	symTab  map[Shape]*Symmetry
)

// SymmetryOf returns the symmetry of s, or nil for the line (whose
// symmetric rules are the Gauss rules).
func SymmetryOf(s Shape) *Symmetry {
	symOnce.Do(buildSymmetries)
	return symTab[s]
}

func buildSymmetries() {
	symTab = map[Shape]*Symmetry{}
	mk := func(s Shape, name string, group []affineMap, lo, hi []float64, types ...any) {
		sy := &Symmetry{Shape: s, Group: name, lo: lo, hi: hi, order: len(group)}
		for i := 0; i < len(types); i += 2 {
			sy.Types = append(sy.Types, newOrbitType(types[i].(string), group, types[i+1].(form)))
		}
		symTab[s] = sy
	}
	z := []string{"0", "0"}
	a1 := []string{"0", "1"}
	tri := simplexGroup(2)
	mk(Triangle, "S3", tri, []float64{0, 0}, []float64{1, 1},
		"(1/3,1/3)", gen(0, []string{"1/3"}, []string{"1/3"}),
		"(a,a)", gen(1, a1, a1),
		"(a,b)", gen(2, []string{"0", "1", "0"}, []string{"0", "0", "1"}))
	mk(Quadrilateral, "D4", cubeGroup(2), []float64{-1, -1}, []float64{1, 1},
		"(0,0)", gen(0, []string{"0"}, []string{"0"}),
		"(a,0)", gen(1, a1, z),
		"(a,a)", gen(1, a1, a1),
		"(a,b)", gen(2, []string{"0", "1", "0"}, []string{"0", "0", "1"}))
	z2 := []string{"0", "0", "0"}
	b2 := []string{"0", "0", "1"}
	c2 := []string{"0", "1", "0"}
	mk(Hexahedron, "Oh", cubeGroup(3), []float64{-1, -1, -1}, []float64{1, 1, 1},
		"(0,0,0)", gen(0, []string{"0"}, []string{"0"}, []string{"0"}),
		"(a,0,0)", gen(1, a1, z, z),
		"(a,a,a)", gen(1, a1, a1, a1),
		"(a,a,0)", gen(1, a1, a1, z),
		"(a,b,0)", gen(2, c2, b2, z2),
		"(a,a,b)", gen(2, c2, c2, b2),
		"(a,b,c)", gen(3, []string{"0", "1", "0", "0"}, []string{"0", "0", "1", "0"}, []string{"0", "0", "0", "1"}))
	mk(Tetrahedron, "S4", simplexGroup(3), []float64{0, 0, 0}, []float64{1, 1, 1},
		"(1/4,1/4,1/4)", gen(0, []string{"1/4"}, []string{"1/4"}, []string{"1/4"}),
		"(a,a,a)", gen(1, a1, a1, a1),
		"(a,1/2-a,1/2-a)", gen(1, a1, []string{"1/2", "-1"}, []string{"1/2", "-1"}),
		"(a,a,b)", gen(2, c2, c2, b2),
		"(a,b,c)", gen(3, []string{"0", "1", "0", "0"}, []string{"0", "0", "1", "0"}, []string{"0", "0", "0", "1"}))
	mk(Prism, "D3h", directSum(tri, cubeGroup(1)), []float64{0, 0, -1}, []float64{1, 1, 1},
		"(1/3,1/3,0)", gen(0, []string{"1/3"}, []string{"1/3"}, []string{"0"}),
		"(1/3,1/3,c)", gen(1, []string{"1/3", "0"}, []string{"1/3", "0"}, a1),
		"(a,a,0)", gen(1, a1, a1, z),
		"(a,a,c)", gen(2, c2, c2, b2),
		"(a,b,0)", gen(2, c2, b2, z2),
		"(a,b,c)", gen(3, []string{"0", "1", "0", "0"}, []string{"0", "0", "1", "0"}, []string{"0", "0", "0", "1"}))
	// The pyramid's group keeps z: the signed permutations of (x, y).
	mk(Pyramid, "C4v", directSum(cubeGroup(2), []affineMap{identityMap(1)}), []float64{-1, -1, 0}, []float64{1, 1, 1},
		"(0,0,c)", gen(1, z, z, a1),
		"(a,0,c)", gen(2, c2, z2, b2),
		"(a,a,c)", gen(2, c2, c2, b2),
		"(a,b,c)", gen(3, []string{"0", "1", "0", "0"}, []string{"0", "0", "1", "0"}, []string{"0", "0", "0", "1"}))
}

func identityMap(dim int) affineMap {
	g := zeroMap(dim)
	for i := range g.M {
		g.M[i][i] = 1
	}
	return g
}

// shapeStages lists the factors of the orthonormal basis of s (see
// jacobiBasis).
func shapeStages(s Shape) []stage {
	leg := func(dim, c int) stage {
		g := make([]int64, dim)
		g[c] = 1
		return stage{tg: g, sc: 1, sg: make([]int64, dim), affine: true}
	}
	switch s {
	case Line:
		return []stage{leg(1, 0)}
	case Quadrilateral:
		return []stage{leg(2, 0), leg(2, 1)}
	case Hexahedron:
		return []stage{leg(3, 0), leg(3, 1), leg(3, 2)}
	case Triangle:
		// a = 2x/(1-y) - 1, b = 2y - 1.
		return []stage{
			{tc: -1, tg: []int64{2, 1}, sc: 1, sg: []int64{0, -1}},
			{tc: -1, tg: []int64{0, 2}, sc: 1, sg: []int64{0, 0}, aMul: 2, aAdd: 1, affine: true},
		}
	case Prism:
		return []stage{
			{tc: -1, tg: []int64{2, 1, 0}, sc: 1, sg: []int64{0, -1, 0}},
			{tc: -1, tg: []int64{0, 2, 0}, sc: 1, sg: []int64{0, 0, 0}, aMul: 2, aAdd: 1, affine: true},
			leg(3, 2),
		}
	case Tetrahedron:
		// a = 2x/(1-y-z) - 1, b = 2y/(1-z) - 1, c = 2z - 1.
		return []stage{
			{tc: -1, tg: []int64{2, 1, 1}, sc: 1, sg: []int64{0, -1, -1}},
			{tc: -1, tg: []int64{0, 2, 1}, sc: 1, sg: []int64{0, 0, -1}, aMul: 2, aAdd: 1},
			{tc: -1, tg: []int64{0, 0, 2}, sc: 1, sg: []int64{0, 0, 0}, aMul: 2, aAdd: 2, affine: true},
		}
	case Pyramid:
		// u = x/(1-z), v = y/(1-z), c = 2z - 1.
		return []stage{
			{tc: 0, tg: []int64{1, 0, 0}, sc: 1, sg: []int64{0, 0, -1}},
			{tc: 0, tg: []int64{0, 1, 0}, sc: 1, sg: []int64{0, 0, -1}},
			{tc: -1, tg: []int64{0, 0, 2}, sc: 1, sg: []int64{0, 0, 0}, aMul: 2, aAdd: 2, affine: true},
		}
	}
	panic(fmt.Sprintf("element: no basis for shape %d", int(s)))
}

// collapse maps u in [0,1]^dim onto the element and returns the point and
// the Jacobian determinant of the map (the Duffy maps of the simplices and
// the pyramid; affine on the cubes).
func collapse(s Shape, u []float64) ([]float64, float64) {
	switch s {
	case Line:
		return []float64{2*u[0] - 1}, 2
	case Quadrilateral:
		return []float64{2*u[0] - 1, 2*u[1] - 1}, 4
	case Hexahedron:
		return []float64{2*u[0] - 1, 2*u[1] - 1, 2*u[2] - 1}, 8
	case Triangle:
		return []float64{u[0] * (1 - u[1]), u[1]}, 1 - u[1]
	case Prism:
		return []float64{u[0] * (1 - u[1]), u[1], 2*u[2] - 1}, 2 * (1 - u[1])
	case Tetrahedron:
		return []float64{u[0] * (1 - u[1]) * (1 - u[2]), u[1] * (1 - u[2]), u[2]}, (1 - u[1]) * (1 - u[2]) * (1 - u[2])
	case Pyramid:
		h := 1 - u[2]
		return []float64{(2*u[0] - 1) * h, (2*u[1] - 1) * h, u[2]}, 4 * h * h
	}
	panic(fmt.Sprintf("element: no collapse for shape %d", int(s)))
}

// inside reports whether x lies in the element with margin eps (every
// bounding inequality holds with eps to spare; negative eps widens it).
func inside(s Shape, x []float64, eps float64) bool {
	switch s {
	case Line:
		return x[0] > -1+eps && x[0] < 1-eps
	case Quadrilateral:
		return x[0] > -1+eps && x[0] < 1-eps && x[1] > -1+eps && x[1] < 1-eps
	case Hexahedron:
		return x[0] > -1+eps && x[0] < 1-eps && x[1] > -1+eps && x[1] < 1-eps && x[2] > -1+eps && x[2] < 1-eps
	case Triangle:
		return x[0] > eps && x[1] > eps && x[0]+x[1] < 1-eps
	case Prism:
		return x[0] > eps && x[1] > eps && x[0]+x[1] < 1-eps && x[2] > -1+eps && x[2] < 1-eps
	case Tetrahedron:
		return x[0] > eps && x[1] > eps && x[2] > eps && x[0]+x[1]+x[2] < 1-eps
	case Pyramid:
		h := 1 - x[2]
		return x[2] > eps && x[0] > -h+eps && x[0] < h-eps && x[1] > -h+eps && x[1] < h-eps
	}
	panic(fmt.Sprintf("element: no containment test for shape %d", int(s)))
}

// ProductPoints is the number of points of the Gauss product or collapsed
// rule of degree d on s (Product): ceil((d+1)/2) per direction.
func ProductPoints(s Shape, d int) int {
	n := (d + 2) / 2
	p := 1
	for k := 0; k < s.Dim(); k++ {
		p *= n
	}
	return p
}
