package design_test

import (
	"context"
	"math/big"
	"strings"
	"testing"

	"quadwright/design"
)

// TestBuildFastFullDegree: finite-interval fast rules report the degree
// they are built for, verified in the Chebyshev basis, at sizes where the
// former work budget stopped the test early (N = 10^5 Legendre stopped at
// degree 1999), symmetric and not, on [-1, 1] and mapped.
func TestBuildFastFullDegree(t *testing.T) {
	r := big.NewRat
	for _, c := range []struct {
		name, kind string
		a, b       *big.Rat
		iv         string
		n          int
	}{
		{"legendre", "gauss", nil, nil, "", 100000},
		{"jacobi", "gauss", r(-7, 10), r(23, 10), "", 20000},
		{"legendre", "gauss", nil, nil, "0,3", 30001},
		{"jacobi", "radau", r(-3, 10), r(4, 5), "", 20000},
	} {
		f := fastFamily(t, c.name, c.a, c.b, c.iv)
		rule, err := design.BuildFast(context.Background(), f, c.kind, c.n, design.FastOptions{})
		if err != nil {
			t.Errorf("%s %s n=%d: %v", c.name, c.kind, c.n, err)
			continue
		}
		if rule.Degree != rule.ConstructionDegree || !strings.Contains(rule.DegreeCheck, "nonuniform FFT") {
			t.Errorf("%s %s n=%d: degree %d of %d; %s", c.name, c.kind, c.n, rule.Degree, rule.ConstructionDegree, rule.DegreeCheck)
		}
	}
}
