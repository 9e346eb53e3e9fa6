package element

import (
	"context"
	"math/rand/v2"
	"testing"
)

// reachable on the triangle's types (centre, (a,a), (a,b)): an (a,b)
// orbit can become an (a,a) one, never the reverse (hand cases).
func TestReachable(t *testing.T) {
	sy := SymmetryOf(Triangle)
	for _, c := range []struct {
		st, target Structure
		want       bool
	}{
		{Structure{0, 0, 20}, Structure{1, 8, 9}, true},
		{Structure{0, 2, 10}, Structure{1, 8, 9}, false}, // 2 + (10-9) < 8
		{Structure{0, 7, 10}, Structure{1, 8, 9}, true},
		{Structure{1, 8, 8}, Structure{1, 8, 9}, false},
		{Structure{0, 8, 9}, Structure{1, 8, 9}, true}, // a demotion adds the centre
	} {
		if got := reachable(sy, c.st, c.target); got != c.want {
			t.Errorf("reachable(%v, %v) = %v, want %v", c.st, c.target, got, c.want)
		}
	}
}

// The NNLS start is a rule of positive weights and interior points whose
// residual the descent's first solve can finish; flatten and unflatten
// are inverses.
func TestTchakaloffStart(t *testing.T) {
	for _, s := range []Shape{Triangle, Quadrilateral, Tetrahedron, Pyramid} {
		sy := SymmetryOf(s)
		sys := newProjectedSystem(sy, Structure(make([]int, len(sy.Types))), 6)
		os := tchakaloffStart(sys, rand.New(rand.NewPCG(1, 2)))
		if len(os) == 0 || len(os) > sys.m {
			t.Fatalf("%s: %d orbits for %d equations", s, len(os), sys.m)
		}
		st, v := flatten(sy, os)
		if !acceptable(sy, st, v) {
			t.Errorf("%s: the NNLS start is not positive and inside", s)
		}
		st2, v2 := flatten(sy, unflatten(sy, st, v))
		if st2.Points(sy) != st.Points(sy) || len(v2) != len(v) {
			t.Fatalf("%s: flatten(unflatten) changed the rule", s)
		}
		for i := range v {
			if v[i] != v2[i] {
				t.Fatalf("%s: flatten(unflatten) changed parameter %d", s, i)
			}
		}
		r := make([]float64, sys.m)
		sys.like(st).eval(v, r, nil)
		if n := norm2(r); n > 1e-2 {
			t.Errorf("%s: NNLS residual %.2g", s, n)
		}
	}
}

// A descent from one NNLS start reaches the published counts (from
// memory) of these degrees; the rule found is polished and verified on
// every monomial by NewCatalogueEntry.
func TestDescentFindsPublished(t *testing.T) {
	ctx := context.Background()
	for _, c := range []struct {
		s Shape
		d int
	}{{Triangle, 8}, {Triangle, 12}, {Quadrilateral, 9}, {Tetrahedron, 5}, {Prism, 5}} {
		sy := SymmetryOf(c.s)
		p := Published(c.s, c.d)
		sts := sy.Structures(c.d, p)
		sys := newProjectedSystem(sy, sts[0], c.d)
		rng := rand.New(rand.NewPCG(1, 2))
		found := false
		for try := 0; try < 10 && !found; try++ {
			os, ok := descend(sys, tchakaloffStart(sys, rng), sts)
			if !ok {
				continue
			}
			found = true
			st, v := flatten(sy, os)
			if st.Points(sy) > p {
				t.Errorf("%s degree %d: %d points, published %d", c.s, c.d, st.Points(sy), p)
			}
			e, err := NewCatalogueEntry(ctx, c.d, result(newSystem(sy, st, c.d), v, try+1), 1)
			if err != nil {
				t.Errorf("%s degree %d: %v", c.s, c.d, err)
			} else if e.Points > p {
				t.Errorf("%s degree %d: polished rule has %d points", c.s, c.d, e.Points)
			}
		}
		if !found {
			t.Errorf("%s degree %d: no %d-point rule in 10 descents", c.s, c.d, p)
		}
	}
}
