package element

import (
	"slices"
	"strings"
	"testing"
)

// The strata of the prism at degree 10, counted by hand. The invariant
// polynomials of D3h are those in u2, u3 (the triangle's invariants of
// degrees 2 and 3) and z^2: 38 of degree <= 10. Those vanishing on the
// mid-plane z = 0 (the centre, (a,a,0), (a,b,0)) are z^2 times the 24 of
// degree <= 8; those vanishing on the axis (the centre and (1/3,1/3,c))
// are all but the 6 powers of z^2 of degree <= 10, 32. (Hand derivation.)
func TestStrataPrism(t *testing.T) {
	sy := SymmetryOf(Prism)
	if got := sy.Equations(10); got != 38 {
		t.Fatalf("prism degree 10: %d invariant equations, want 38", got)
	}
	want := map[string]int{"(1/3,1/3,0) (a,a,0) (a,b,0)": 24, "(1/3,1/3,0) (1/3,1/3,c)": 32}
	for _, z := range sy.strataOf(10) {
		var names []string
		for i, on := range z.on {
			if on {
				names = append(names, sy.Types[i].Name)
			}
		}
		key := strings.Join(names, " ")
		if w, ok := want[key]; ok {
			if z.need != w {
				t.Errorf("stratum %s: %d polynomials vanish, want %d", key, z.need, w)
			}
			delete(want, key)
		}
	}
	for k := range want {
		t.Errorf("no stratum %s", k)
	}
	// Of the 1316 structures of 71 points with 38 unknowns or more, one
	// is admissible, and none of 70 points.
	if got := sy.Structures(10, 71); len(got) != 1 || !slices.Equal(got[0], Structure{1, 2, 4, 6, 1, 1}) {
		t.Errorf("prism degree 10, 71 points: structures %v, want [[1 2 4 6 1 1]]", got)
	}
	if got := sy.Structures(10, 70); len(got) != 0 {
		t.Errorf("prism degree 10, 70 points: structures %v, want none", got)
	}
}

// The strata bound holds for every rule we know: each catalogued
// structure is admissible.
func TestCatalogueAdmissible(t *testing.T) {
	for _, s := range []Shape{Triangle, Quadrilateral, Hexahedron, Tetrahedron, Prism, Pyramid} {
		sy := SymmetryOf(s)
		for _, e := range CatalogueOf(s).Rules {
			if !sy.admissible(e.Structure, e.Degree) {
				t.Errorf("%s degree %d: the catalogued structure %v is not admissible", s, e.Degree, e.Structure)
			}
		}
	}
}
