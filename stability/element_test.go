package stability

import (
	"context"
	"math"
	"math/big"
	"strings"
	"testing"

	"quadwright/design/element"
	"quadwright/precision"
)

func TestElementGroups(t *testing.T) {
	// Orders of the symmetry groups of the reference elements (common
	// practice): |S3| = 6, |S4| = 24, |D4| = 8, |Oh| = 48, D3h = S3 x Z2 =
	// 12, C4v = 8. Every map must send the vertex set onto itself, and no
	// two maps may agree on the vertices.
	want := map[element.Shape]int{element.Line: 2, element.Triangle: 6, element.Quadrilateral: 8,
		element.Tetrahedron: 24, element.Hexahedron: 48, element.Prism: 12, element.Pyramid: 8}
	for s, n := range want {
		group, _ := elementGroup(s)
		if len(group) != n {
			t.Errorf("%s: %d maps, want %d", s, len(group), n)
		}
		var verts [][]*big.Rat
		key := func(p []*big.Rat) string {
			var b strings.Builder
			for _, c := range p {
				b.WriteString(c.RatString() + " ")
			}
			return b.String()
		}
		set := map[string]bool{}
		for _, v := range s.Vertices() {
			p := make([]*big.Rat, len(v))
			for k, c := range v {
				p[k], _ = precision.ParseExact(c)
			}
			verts = append(verts, p)
			set[key(p)] = true
		}
		images := map[string]bool{}
		for gi, g := range group {
			var img strings.Builder
			for _, v := range verts {
				q := g.apply(v)
				if !set[key(q)] {
					t.Errorf("%s: %s sends vertex %v off the vertices", s, g.name, v)
				}
				img.WriteString(key(q) + "|")
			}
			if images[img.String()] {
				t.Errorf("%s: map %d (%s) repeats another", s, gi, g.name)
			}
			images[img.String()] = true
		}
		if !strings.HasSuffix(group[0].name, "-> ("+strings.Join([]string{"x", "y", "z"}[:s.Dim()], ",")+")") {
			t.Errorf("%s: the identity is not first: %s", s, group[0].name)
		}
	}
}

func TestAuditElementNegativeWeights(t *testing.T) {
	// The 4-point degree-3 rule on the triangle with a negative centroid
	// weight: -27/96 at (1/3,1/3), 25/96 at (1/5,1/5), (3/5,1/5),
	// (1/5,3/5) (G. Strang and G. Fix, An Analysis of the Finite Element
	// Method, 1973, from memory). Exact fractions: D = ExactDigits.
	nodes := [][]string{{"1/3", "1/3"}, {"1/5", "1/5"}, {"3/5", "1/5"}, {"1/5", "3/5"}}
	weights := []string{"-27/96", "25/96", "25/96", "25/96"}
	rep, err := AuditElement(context.Background(), element.Triangle, nodes, weights, ElementOptions{})
	if err != nil {
		t.Fatal(err)
	}
	// sum |w| / |sum w| = (27 + 75) / 48.
	if rep.Degree != 3 || rep.NegativeWeights != 1 || math.Abs(float64(rep.StabilityFactor)-102.0/48) > 1e-15 ||
		math.Abs(float64(rep.LostDigits)-math.Log10(102.0/48)) > 1e-12 || rep.NodesOutside != 0 || !rep.Symmetry.Full || rep.Digits != ExactDigits {
		t.Errorf("report %+v", rep)
	}
}

func TestAuditElementProductAndWeight(t *testing.T) {
	ctx := context.Background()
	// The 3x3x3 Gauss-Legendre product on the cube: degree 5, all 48
	// symmetries.
	r, err := element.Product(ctx, element.Request{Shape: element.Hexahedron, Degree: 5, Digits: 25})
	if err != nil {
		t.Fatal(err)
	}
	rep, err := AuditElement(ctx, element.Hexahedron, r.Nodes, r.Weights, ElementOptions{})
	if err != nil || rep.Degree != 5 || rep.Symmetry.Order != 48 || rep.NodesOnBoundary != 0 {
		t.Errorf("hexahedron product: %+v (%v)", rep, err)
	}
	// A weighted rule audited against its weight and against another.
	w, err := element.Weighted(ctx, element.Request{Shape: element.Pyramid, Degree: 3, Digits: 20, Weight: "1+z"})
	if err != nil {
		t.Fatal(err)
	}
	rep, err = AuditElement(ctx, element.Pyramid, w.Nodes, w.Weights, ElementOptions{Weight: "1+z"})
	if err != nil || rep.Degree < 3 || rep.Weight != "1+z" {
		t.Errorf("weighted pyramid rule: %+v (%v)", rep, err)
	}
	rep, err = AuditElement(ctx, element.Pyramid, w.Nodes, w.Weights, ElementOptions{Weight: "1+2*z"})
	if err != nil || rep.Degree != -1 {
		t.Errorf("against another weight: degree %d (%v), want -1", rep.Degree, err)
	}
	// --tolerance: a coarse u lets a rule of 1 digit fewer pass.
	rep, err = AuditElement(ctx, element.Triangle, [][]string{{"0.3333", "0.3333"}}, []string{"0.5"}, ElementOptions{Unit: big.NewRat(1, 1000)})
	if err != nil || rep.Degree != 1 || !rep.UnitGiven {
		t.Errorf("coarse tolerance: %+v (%v)", rep, err)
	}
	if _, err := AuditElement(ctx, element.Triangle, [][]string{{"0.3", "x"}}, []string{"0.5"}, ElementOptions{}); err == nil || !strings.Contains(err.Error(), "node 1 coordinate 2") {
		t.Errorf("bad coordinate: %v", err)
	}
}
