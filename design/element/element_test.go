package element

import (
	"context"
	"math/big"
	"strings"
	"testing"
)

func TestMonomialIntegral(t *testing.T) {
	for _, c := range []struct {
		s    Shape
		e    []int
		want string
	}{
		// Hand calculation from the Dirichlet integral a! b! / (a+b+2)! (issue text).
		{Triangle, []int{0, 0}, "1/2"},
		{Triangle, []int{1, 0}, "1/6"},
		{Triangle, []int{1, 1}, "1/24"},
		{Triangle, []int{2, 3}, "1/420"}, // 2! 3! / 7! = 12/5040
		// a! b! c! / (a+b+c+3)!.
		{Tetrahedron, []int{0, 0, 0}, "1/6"},
		{Tetrahedron, []int{1, 0, 0}, "1/24"},
		{Tetrahedron, []int{1, 1, 1}, "1/720"},
		// [-1,1]^d: products of 2/(a+1) (common practice).
		{Line, []int{4}, "2/5"},
		{Line, []int{3}, "0"},
		{Quadrilateral, []int{2, 2}, "4/9"},
		{Hexahedron, []int{0, 0, 0}, "8"},
		{Hexahedron, []int{2, 0, 1}, "0"},
		// Prism: triangle times [-1,1].
		{Prism, []int{0, 0, 0}, "1"},
		{Prism, []int{0, 0, 2}, "1/3"},
		// Pyramid, by hand in slices z: volume 4/3; z-moment 1/3 (centroid
		// at z = 1/4); x^2: integral of (2(1-z)^3/3)(2(1-z)) = 4/15.
		{Pyramid, []int{0, 0, 0}, "4/3"},
		{Pyramid, []int{0, 0, 1}, "1/3"},
		{Pyramid, []int{2, 0, 0}, "4/15"},
		{Pyramid, []int{1, 0, 0}, "0"},
	} {
		want, _ := new(big.Rat).SetString(c.want)
		if got := MonomialIntegral(c.s, c.e); got.Cmp(want) != 0 {
			t.Errorf("%s %v: got %s, want %s", c.s, c.e, got.RatString(), c.want)
		}
	}
}

func TestMeasure(t *testing.T) {
	// The element measures of the contract's reference elements (common practice).
	want := map[Shape]string{Line: "2", Triangle: "1/2", Quadrilateral: "4", Tetrahedron: "1/6", Hexahedron: "8", Prism: "1", Pyramid: "4/3"}
	for s, w := range want {
		if got := s.Measure().RatString(); got != w {
			t.Errorf("%s: measure %s, want %s", s, got, w)
		}
	}
}

func TestProductSmall(t *testing.T) {
	ctx := context.Background()
	for _, c := range []struct {
		req     Request
		nodes   [][]string
		weights []string
		degree  int
	}{
		// 2-point Gauss-Legendre: +-1/sqrt(3), weights 1 (Abramowitz and Stegun 25.4.29).
		{Request{Shape: Line, Degree: 3}, [][]string{{"-0.5773502691896257"}, {"0.5773502691896257"}}, []string{"1", "1"}, 3},
		// 3-point Gauss-Lobatto: -1, 0, 1 with 1/3, 4/3, 1/3 (A&S 25.4.32, Simpson's rule).
		{Request{Shape: Line, Degree: 3, Lobatto: true, Digits: 10}, [][]string{{"-1.000000000"}, {"0"}, {"1.000000000"}}, []string{"0.3333333333", "1.333333333", "0.3333333333"}, 3},
		// One point: the centroid with the element's measure (common practice).
		{Request{Shape: Triangle, Degree: 1}, [][]string{{"0.3333333333333333", "0.3333333333333333"}}, []string{"0.5"}, 1},
		{Request{Shape: Tetrahedron, Degree: 1}, [][]string{{"0.25", "0.25", "0.25"}}, []string{"0.16666666666666666"}, 1},
		{Request{Shape: Pyramid, Degree: 0}, [][]string{{"0", "0", "0.25"}}, []string{"1.3333333333333333"}, 1},
		{Request{Shape: Prism, Degree: 1}, [][]string{{"0.3333333333333333", "0.3333333333333333", "0"}}, []string{"1"}, 1},
	} {
		r, err := Product(ctx, c.req)
		if err != nil {
			t.Errorf("%+v: %v", c.req, err)
			continue
		}
		if r.Degree != c.degree {
			t.Errorf("%+v: degree %d, want %d", c.req, r.Degree, c.degree)
		}
		if strings.Join(flat(r.Nodes), " ") != strings.Join(flat(c.nodes), " ") || strings.Join(r.Weights, " ") != strings.Join(c.weights, " ") {
			t.Errorf("%+v: got %v %v, want %v %v", c.req, r.Nodes, r.Weights, c.nodes, c.weights)
		}
	}
}

func flat(n [][]string) []string {
	var out []string
	for _, p := range n {
		out = append(out, strings.Join(p, ","))
	}
	return out
}

func TestProductAllShapes(t *testing.T) {
	ctx := context.Background()
	for _, c := range []struct {
		s      Shape
		deg    int
		digits int
		points int // N^dim with N = ceil((deg+1)/2)
		degree int // 2N-1
	}{
		{Line, 10, 40, 6, 11},
		{Quadrilateral, 7, 0, 16, 7},
		{Hexahedron, 5, 30, 27, 5},
		{Triangle, 10, 30, 36, 11},
		{Triangle, 20, 0, 121, 21},
		{Tetrahedron, 6, 25, 64, 7},
		{Prism, 4, 0, 27, 5},
		{Pyramid, 8, 20, 125, 9},
	} {
		r, err := Product(ctx, Request{Shape: c.s, Degree: c.deg, Digits: c.digits})
		if err != nil {
			t.Errorf("%s %d: %v", c.s, c.deg, err)
			continue
		}
		if r.Points() != c.points || r.Degree != c.degree {
			t.Errorf("%s %d: %d points of degree %d, want %d of degree %d", c.s, c.deg, r.Points(), r.Degree, c.points, c.degree)
		}
		if r.Exactness.WorstShare > 0.5 {
			// Tuned: a correctly rounded rule stays far below the tolerance.
			t.Errorf("%s %d: residual %.2g of the tolerance", c.s, c.deg, r.Exactness.WorstShare)
		}
	}
}

func TestVerifyCatchesAWrongDigit(t *testing.T) {
	ctx := context.Background()
	r, err := Product(ctx, Request{Shape: Triangle, Degree: 6, Digits: 25})
	if err != nil {
		t.Fatal(err)
	}
	w := []rune(r.Weights[3])
	w[len(w)-6] = '0' + (w[len(w)-6]-'0'+5)%10
	bad := append([]string(nil), r.Weights...)
	bad[3] = string(w)
	ex, err := VerifyPrinted(ctx, Triangle, r.Nodes, bad, 25, 7)
	if err != nil {
		t.Fatal(err)
	}
	if ex.Degree != -1 {
		t.Errorf("a weight wrong in its 20th digit passed through degree %d", ex.Degree)
	}
}

func TestRequestErrors(t *testing.T) {
	for _, c := range []struct {
		req  Request
		want string
	}{
		{Request{Shape: Triangle, Degree: -1}, "--degree -1"},
		{Request{Shape: Hexahedron, Degree: 31}, "--degree 31"},
		{Request{Shape: Triangle, Degree: 3, Lobatto: true}, "--lobatto"},
		{Request{Shape: Line, Degree: 3, Digits: 1001}, "--digits 1001"},
	} {
		_, err := Build(context.Background(), c.req)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%+v: error %v, want one naming %s", c.req, err, c.want)
		}
	}
}

func FuzzParseShape(f *testing.F) {
	for _, s := range append(ShapeNames, "", "Triangle ", "cube", "\x00") {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		sh, err := ParseShape(s)
		if err != nil {
			if !strings.Contains(err.Error(), "--shape") {
				t.Errorf("error %q does not name the flag", err)
			}
			return
		}
		if back, err := ParseShape(sh.String()); err != nil || back != sh {
			t.Errorf("%q: no round trip", s)
		}
	})
}
