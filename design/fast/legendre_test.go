package fast_test

import (
	"testing"

	"quadwright/design/fast"
)

// TestLegendreAgainstRecurrence checks the bounds: each node within
// max(2 ulp(theta) sin(theta), 1 ulp(x)) (share <= 1), each weight within
// 4 ulp, against Newton's method on the recurrence at 192 bits. n = 101 is
// the smallest rule from Bogaert's expansions. (Measured 1 December 2026:
// node share <= 0.5 everywhere, weights <= 3 ulp, the worst at n = 1000.)
func TestLegendreAgainstRecurrence(t *testing.T) {
	for _, n := range []int{50, 101, 1000, 1001, 100000} {
		x, w := make([]float64, n), make([]float64, n)
		fast.Legendre(n, x, w)
		checkRule(t, n, x, w)
		cnt := 100
		if n > 10000 {
			cnt = 4
		}
		r := newReference(t, jacobiFamily(t, 0, 0), n)
		acc := measure(r, x, w, samples(n, cnt))
		t.Logf("legendre n=%d: node share %.3g (%.3g ulp of x), weight %.3g ulp", n, acc.NodeShare, acc.NodeULP, acc.WeightULP)
		if acc.NodeShare > 1 || acc.WeightULP > weightULPLimit {
			t.Errorf("legendre n=%d: %+v", n, acc)
		}
	}
}
