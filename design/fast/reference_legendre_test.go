package fast_test

import (
	"context"
	"math"
	"testing"

	"quadwright/design/fast"
)

// TestLegendreReferenceAgrees compares the asymptotic reference with
// Newton's method on the recurrence (fast.Reference, double-double) at
// nodes across the rule, both ends and the middle, in both series'
// regions: nodes within 1e-18 of their distance to the nearer end (1e-2
// of the bound the sampled check holds a float64 node to), weights within
// 1e-19 relative (1e-3 ulp). Tolerances tuned: the largest differences
// seen were 1.2e-19 of the distance and 1.3e-20 of the weight.
func TestLegendreReferenceAgrees(t *testing.T) {
	for _, n := range []int{1000, 1001, 40000} {
		x, w := make([]float64, n), make([]float64, n)
		fast.Legendre(n, x, w)
		var starts []float64
		for _, i := range []int{0, 1, 2, 5, 9, 20, 47, n / 7, n/2 - 1, n / 2, n - 30, n - 3, n - 1} {
			starts = append(starts, x[i])
		}
		ref := fast.NewReference(fast.GaussJacobi, n, [2]float64{}, [2]float64{}, [2]float64{2, 0})
		want, err := ref.Points(context.Background(), starts)
		if err != nil {
			t.Fatal(err)
		}
		got, err := fast.NewLegendreReference(n).Points(context.Background(), starts)
		if err != nil {
			t.Fatal(err)
		}
		for j := range starts {
			g, e := got[j], want[j]
			if !g.OK || !e.OK {
				t.Errorf("n=%d start %v: ok %v, recurrence ok %v", n, starts[j], g.OK, e.OK)
				continue
			}
			dx := (g.X[0] - e.X[0]) + (g.X[1] - e.X[1])
			dist := 1 - math.Abs(e.X[0])
			we := math.Ldexp(e.WM[0], e.WE) * (1 + e.WM[1]/e.WM[0])
			wg2 := (g.WM[0] + g.WM[1]) * math.Ldexp(1, g.WE)
			dw := math.Abs((math.Ldexp(g.WM[0], g.WE-e.WE)-e.WM[0])+(math.Ldexp(g.WM[1], g.WE-e.WE)-e.WM[1])) / math.Abs(e.WM[0])
			if math.Abs(dx) > 1e-18*dist || dw > 1e-19 {
				t.Errorf("n=%d start %v: node off by %.3g (distance to the end %.3g), weight by %.3g relative (%v vs %v)", n, starts[j], dx, dist, dw, wg2, we)
			}
		}
	}
}
