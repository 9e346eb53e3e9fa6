package element

import (
	"context"
	"encoding/json"
	"fmt"
	"math/big"
	"os"
	"testing"
)

// The collapsed rules against testdata/element/collapsed.json, made by
// gen_collapsed.py with mpmath on an independent route (Jacobi zeros by
// bisection on the explicit sum, weights from the moment system): every
// coordinate and weight within 2 units of the 40th digit.
func TestCollapsedReference(t *testing.T) {
	b, err := os.ReadFile("../../testdata/element/collapsed.json")
	if err != nil {
		t.Fatal(err)
	}
	var ref struct {
		Rules []struct {
			Shape   string
			Degree  int
			Nodes   [][]string
			Weights []string
		}
	}
	if err := json.Unmarshal(b, &ref); err != nil {
		t.Fatal(err)
	}
	for _, c := range ref.Rules {
		s, err := ParseShape(c.Shape)
		if err != nil {
			t.Fatal(err)
		}
		r, err := Product(context.Background(), Request{Shape: s, Degree: c.Degree, Digits: 40})
		if err != nil {
			t.Fatal(err)
		}
		if r.Points() != len(c.Weights) {
			t.Fatalf("%s: %d points, reference %d", c.Shape, r.Points(), len(c.Weights))
		}
		for i := range c.Weights {
			ok := near(r.Weights[i], c.Weights[i])
			for k := range c.Nodes[i] {
				ok = ok && near(r.Nodes[i][k], c.Nodes[i][k])
			}
			if !ok {
				t.Errorf("%s node %d: %v %s, reference %v %s", c.Shape, i, r.Nodes[i], r.Weights[i], c.Nodes[i], c.Weights[i])
			}
		}
	}
}

// The 12-point degree-6 rule against the values published by D. A.
// Dunavant, "High degree efficient symmetrical Gaussian quadrature rules
// for the triangle", Int. J. Numer. Meth. Eng. 21, 1985 (from memory, 15
// decimals; his weights are for area 1 and are halved here): each of his
// coordinates is a coordinate of some node whose weight matches. The
// catalogue may hold another 12-point rule of degree 6 (the equations have
// several solutions), so the rule is rebuilt from his values as the start
// of the polish, which then confirms and verifies it at 30 digits.
func TestSymmetricDegree6Dunavant(t *testing.T) {
	var params []*big.Float
	for _, v := range []float64{0.116786275726379 / 2, 0.249286745170910, 0.050844906370207 / 2, 0.063089014491502, 0.082851075618374 / 2, 0.053145049844817, 0.310352451033784} {
		params = append(params, big.NewFloat(v))
	}
	r, _, err := symmetricRule(context.Background(), SymmetryOf(Triangle), Structure{0, 2, 1}, params, 6, 30)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct{ coord, area1Weight float64 }{
		{0.249286745170910, 0.116786275726379},
		{0.063089014491502, 0.050844906370207},
		{0.053145049844817, 0.082851075618374},
		{0.310352451033784, 0.082851075618374},
	} {
		found := false
		for i := range r.Nodes {
			for _, x := range r.Nodes[i] {
				if closeDecimal(x, fmt.Sprint(c.coord), 1e-15) && closeDecimal(r.Weights[i], fmt.Sprint(c.area1Weight/2), 1e-15) {
					found = true
				}
			}
		}
		if !found {
			t.Errorf("no node with coordinate %v and weight %v/2", c.coord, c.area1Weight)
		}
	}
}
