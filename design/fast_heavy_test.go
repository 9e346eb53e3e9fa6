//go:build heavy

package design_test

import (
	"context"
	"math/big"
	"testing"

	"quadwright/design"
)

// TestHeavyBuildFast is the acceptance sweep through the build
// path: N = 10^5, 200 sampled indices over both ends and the middle,
// every node within max(2 ulp(theta) sin(theta), 1 ulp(x)), every weight
// within 4 ulp (BuildFast fails otherwise), for every family and kind the
// fast path serves. Run: go test -tags heavy -run HeavyBuildFast -v ./design/
func TestHeavyBuildFast(t *testing.T) {
	r := big.NewRat
	for _, c := range []struct {
		name, kind string
		a, b       *big.Rat
	}{
		{"legendre", "gauss", nil, nil},
		{"jacobi", "gauss", r(-3, 10), r(4, 5)},
		{"jacobi", "gauss", r(2, 1), r(-1, 2)},
		{"jacobi", "gauss", r(-9, 10), r(9, 2)},
		{"jacobi", "radau", r(-3, 10), r(4, 5)},
		{"jacobi", "lobatto", r(1, 3), r(-1, 7)},
		{"chebyshev2", "gauss", nil, nil},
		{"laguerre", "gauss", r(-1, 2), nil},
		{"hermite", "gauss", nil, nil},
	} {
		n := 100000
		rule, err := design.BuildFast(context.Background(), fastFamily(t, c.name, c.a, c.b, ""), c.kind, n, design.FastOptions{})
		if err != nil {
			t.Errorf("%s %s: %v", c.name, c.kind, err)
			continue
		}
		a := rule.Accuracy
		t.Logf("%s(%v,%v) %s n=%d: degree %d of %d, %d samples: nodes %.3g ulp (share %.3g), weights %.3g ulp (share %.3g)",
			c.name, c.a, c.b, c.kind, n, rule.Degree, rule.ConstructionDegree, a.Samples, a.NodeULP, a.NodeShare, a.WeightULP, a.WeightShare)
		if a.Samples < 200 {
			t.Errorf("%s %s: only %d samples", c.name, c.kind, a.Samples)
		}
	}
}

// TestHeavyBuildFastLarge builds rules at N = 2 10^6, where the
// reference's end form and its Newton steps until they settle matter.
func TestHeavyBuildFastLarge(t *testing.T) {
	for _, name := range []string{"laguerre", "legendre", "hermite"} {
		rule, err := design.BuildFast(context.Background(), fastFamily(t, name, nil, nil, ""), "gauss", 2000000, design.FastOptions{})
		if err != nil {
			t.Errorf("%s: %v", name, err)
			continue
		}
		a := rule.Accuracy
		t.Logf("%s n=2e6: degree %d, %d samples: nodes %.3g ulp (share %.3g), weights %.3g ulp (share %.3g)", name, rule.Degree, a.Samples, a.NodeULP, a.NodeShare, a.WeightULP, a.WeightShare)
	}
}
