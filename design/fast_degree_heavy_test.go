//go:build heavy

package design_test

import (
	"context"
	"math/big"
	"testing"

	"quadwright/design"
)

// TestHeavyFastFullDegree is the acceptance: Gauss-Legendre at
// 10^6 points verified to degree 1999999, Gauss-Jacobi(-0.7, 2.3) at 10^5
// to 199999. Run: go test -tags heavy -run HeavyFastFullDegree -v ./design/
func TestHeavyFastFullDegree(t *testing.T) {
	for _, c := range []struct {
		name string
		a, b *big.Rat
		n    int
	}{
		{"legendre", nil, nil, 1000000},
		{"jacobi", big.NewRat(-7, 10), big.NewRat(23, 10), 100000},
	} {
		f := fastFamily(t, c.name, c.a, c.b, "")
		rule, err := design.BuildFast(context.Background(), f, "gauss", c.n, design.FastOptions{})
		if err != nil {
			t.Fatalf("%s n=%d: %v", c.name, c.n, err)
		}
		t.Logf("%s n=%d: degree %d (%s)", c.name, c.n, rule.Degree, rule.DegreeCheck)
		if rule.Degree != 2*c.n-1 {
			t.Errorf("%s n=%d: degree %d", c.name, c.n, rule.Degree)
		}
	}
}
