package element

import (
	"fmt"
	"math/big"
	"strings"
)

// Shape is a reference element.
type Shape int

// The reference elements (../../shared/CONTRACT.md): line [-1,1];
// triangle (0,0),(1,0),(0,1); quadrilateral [-1,1]^2; tetrahedron
// (0,0,0),(1,0,0),(0,1,0),(0,0,1); hexahedron [-1,1]^3; prism = triangle x
// [-1,1]; pyramid with base [-1,1]^2 at z = 0 and apex (0,0,1).
const (
	Line Shape = iota
	Triangle
	Quadrilateral
	Tetrahedron
	Hexahedron
	Prism
	Pyramid
)

// ShapeNames lists the element names in the order of the Shape constants.
var ShapeNames = []string{"line", "triangle", "quadrilateral", "tetrahedron", "hexahedron", "prism", "pyramid"}

// ParseShape reads an element name (case and surrounding blanks ignored).
func ParseShape(s string) (Shape, error) {
	t := strings.ToLower(strings.TrimSpace(s))
	for i, n := range ShapeNames {
		if t == n {
			return Shape(i), nil
		}
	}
	return 0, fmt.Errorf("--shape %q: choose one of %s", s, strings.Join(ShapeNames, ", "))
}

// String is the element's name; it panics on a value that is no Shape.
func (s Shape) String() string { return ShapeNames[s.check()] }

func (s Shape) check() int {
	if s < Line || s > Pyramid {
		panic(fmt.Sprintf("element: invalid Shape %d", int(s)))
	}
	return int(s)
}

// Dim is the number of coordinates of a point of the element.
func (s Shape) Dim() int {
	return [...]int{1, 2, 2, 3, 3, 3, 3}[s.check()]
}

// Vertices lists the vertices of the reference element as exact decimal
// strings, in the order of the contract (for the prism: the triangle at
// z = -1, then at z = 1; for the pyramid: the base counter-clockwise, then
// the apex).
func (s Shape) Vertices() [][]string {
	switch s {
	case Line:
		return [][]string{{"-1"}, {"1"}}
	case Triangle:
		return [][]string{{"0", "0"}, {"1", "0"}, {"0", "1"}}
	case Quadrilateral:
		return [][]string{{"-1", "-1"}, {"1", "-1"}, {"1", "1"}, {"-1", "1"}}
	case Tetrahedron:
		return [][]string{{"0", "0", "0"}, {"1", "0", "0"}, {"0", "1", "0"}, {"0", "0", "1"}}
	case Hexahedron:
		return [][]string{{"-1", "-1", "-1"}, {"1", "-1", "-1"}, {"1", "1", "-1"}, {"-1", "1", "-1"},
			{"-1", "-1", "1"}, {"1", "-1", "1"}, {"1", "1", "1"}, {"-1", "1", "1"}}
	case Prism:
		return [][]string{{"0", "0", "-1"}, {"1", "0", "-1"}, {"0", "1", "-1"}, {"0", "0", "1"}, {"1", "0", "1"}, {"0", "1", "1"}}
	case Pyramid:
		return [][]string{{"-1", "-1", "0"}, {"1", "-1", "0"}, {"1", "1", "0"}, {"-1", "1", "0"}, {"0", "0", "1"}}
	}
	s.check()
	return nil
}

// Measure is the exact length, area or volume of the reference element:
// line 2, triangle 1/2, quadrilateral 4, tetrahedron 1/6, hexahedron 8,
// prism 1, pyramid 4/3.
func (s Shape) Measure() *big.Rat {
	return MonomialIntegral(s, make([]int, s.Dim()))
}

// Contains reports whether the point p (len(p) == s.Dim(), exact values)
// lies in the closed reference element; strict asks for the open interior.
func (s Shape) Contains(p []*big.Rat, strict bool) bool {
	if len(p) != s.Dim() {
		panic("element: Contains with a point of the wrong dimension")
	}
	one := big.NewRat(1, 1)
	// ge reports a >= b (a > b when strict).
	ge := func(a, b *big.Rat) bool {
		c := a.Cmp(b)
		return c > 0 || (!strict && c == 0)
	}
	inBox := func(x *big.Rat) bool { return ge(x, big.NewRat(-1, 1)) && ge(one, x) }
	sum := func(xs ...*big.Rat) *big.Rat {
		t := new(big.Rat)
		for _, x := range xs {
			t.Add(t, x)
		}
		return t
	}
	zero := new(big.Rat)
	switch s {
	case Line:
		return inBox(p[0])
	case Quadrilateral:
		return inBox(p[0]) && inBox(p[1])
	case Hexahedron:
		return inBox(p[0]) && inBox(p[1]) && inBox(p[2])
	case Triangle:
		return ge(p[0], zero) && ge(p[1], zero) && ge(one, sum(p[0], p[1]))
	case Tetrahedron:
		return ge(p[0], zero) && ge(p[1], zero) && ge(p[2], zero) && ge(one, sum(p[0], p[1], p[2]))
	case Prism:
		return ge(p[0], zero) && ge(p[1], zero) && ge(one, sum(p[0], p[1])) && inBox(p[2])
	case Pyramid:
		// |x| <= 1 - z, |y| <= 1 - z, z >= 0.
		h := new(big.Rat).Sub(one, p[2])
		ax, ay := new(big.Rat).Abs(p[0]), new(big.Rat).Abs(p[1])
		return ge(p[2], zero) && ge(h, ax) && ge(h, ay)
	}
	s.check()
	return false
}
