//go:build heavy

package element

import (
	"context"
	"testing"
)

// TestWeightedSweepHeavy builds polynomial-weight rules on every shape
// over a range of degrees and checks each against the exact rational
// moments (shifted: MonomialIntegral of the shifted exponents).
func TestWeightedSweepHeavy(t *testing.T) {
	for _, c := range []struct {
		s       Shape
		w       string
		k       int
		plusOne bool
		maxDeg  int
	}{
		{Prism, "1+z", 2, true, 10},
		{Pyramid, "z", 2, false, 10},
		{Line, "1+x", 0, true, 40},
		{Hexahedron, "1+z", 2, true, 10},
		{Triangle, "x", 0, false, 20},
		{Quadrilateral, "1+x", 0, true, 20},
		{Tetrahedron, "x", 0, false, 10},
	} {
		for d := 1; d <= c.maxDeg; d++ {
			for _, digits := range []int{0, 34} {
				r, err := Build(context.Background(), Request{Shape: c.s, Degree: d, Digits: digits, Weight: c.w})
				if err != nil {
					t.Errorf("%s weight %s degree %d digits %d: %v", c.s, c.w, d, digits, err)
					continue
				}
				checkWeightedRule(t, r, shifted(c.s, c.k, c.plusOne))
				t.Logf("%s weight %s degree %d digits %d: %d points", c.s, c.w, d, digits, r.Points())
			}
		}
	}
}
