package polytope

import (
	"math/big"
	"strings"
	"testing"

	"quadwright/design/element"
)

func mustPolygon(t testing.TB, src string) *Polygon {
	t.Helper()
	p, err := ParsePolygon(strings.NewReader(src), "test")
	if err != nil {
		t.Fatal(err)
	}
	return p
}

func mustPolyhedron(t testing.TB, src string) *Polyhedron {
	t.Helper()
	p, err := ParsePolyhedron(strings.NewReader(src), "test")
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// The simplex formula against element.MonomialIntegral (the Dirichlet
// integrals on the reference triangle and tetrahedron).
func TestSimplexAveragesReference(t *testing.T) {
	r := func(s string) *big.Rat { v, _ := new(big.Rat).SetString(s); return v }
	tri := [][]*big.Rat{{r("0"), r("0")}, {r("1"), r("0")}, {r("0"), r("1")}}
	tet := [][]*big.Rat{{r("0"), r("0"), r("0")}, {r("1"), r("0"), r("0")}, {r("0"), r("1"), r("0")}, {r("0"), r("0"), r("1")}}
	for _, c := range []struct {
		vs   [][]*big.Rat
		s    element.Shape
		mvol *big.Rat
		deg  int
	}{{tri, element.Triangle, r("1"), 8}, {tet, element.Tetrahedron, r("1"), 6}} {
		ix := newExpIndex(len(c.vs[0]), c.deg)
		avg := simplexAverages(c.vs, ix)
		for j, e := range ix.exps {
			got := new(big.Rat).Mul(avg[j], c.mvol)
			if want := element.MonomialIntegral(c.s, e); got.Cmp(want) != 0 {
				t.Errorf("%s %v: %s, want %s", c.s, e, got.RatString(), want.RatString())
			}
		}
	}
}

// Hand values: the square [0,2]x[0,1]: int x^a y^b = 2^(a+1)/(a+1)/(b+1).
func TestPolygonMomentsSquare(t *testing.T) {
	p := mustPolygon(t, "0 0\n2 0\n2 1\n0 1\n")
	ix := newExpIndex(2, 6)
	m := PolygonMoments(p, 6)
	for j, e := range ix.exps {
		want := big.NewRat(1<<(e[0]+1), int64((e[0]+1)*(e[1]+1)))
		if m[j].Cmp(want) != 0 {
			t.Errorf("%v: %s, want %s", e, m[j].RatString(), want.RatString())
		}
	}
	// Clockwise gives the same.
	q := mustPolygon(t, "0 1\n2 1\n2 0\n0 0\n")
	for j, v := range PolygonMoments(q, 6) {
		if v.Cmp(m[j]) != 0 {
			t.Fatalf("clockwise %v differs", ix.exps[j])
		}
	}
}

// The box [0,1]x[0,2]x[0,3]: int x^a y^b z^c = 2^(b+1) 3^(c+1)/((a+1)(b+1)(c+1)).
func TestPolyhedronMomentsBox(t *testing.T) {
	p := mustPolyhedron(t, boxSrc)
	ix := newExpIndex(3, 5)
	m := PolyhedronMoments(p, 5)
	for j, e := range ix.exps {
		want := big.NewRat(1, int64((e[0]+1)*(e[1]+1)*(e[2]+1)))
		want.Mul(want, new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(2), big.NewInt(int64(e[1]+1)), nil)))
		want.Mul(want, new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(3), big.NewInt(int64(e[2]+1)), nil)))
		if m[j].Cmp(want) != 0 {
			t.Errorf("%v: %s, want %s", e, m[j].RatString(), want.RatString())
		}
	}
}

const boxSrc = `v 0 0 0
v 1 0 0
v 1 2 0
v 0 2 0
v 0 0 3
v 1 0 3
v 1 2 3
v 0 2 3
f 1 4 3 2
f 5 6 7 8
f 1 2 6 5
f 2 3 7 6
f 3 4 8 7
f 4 1 5 8
`
