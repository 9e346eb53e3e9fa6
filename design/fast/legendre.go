package fast

import "gonum.org/v1/gonum/integrate/quad"

// Legendre sets x and w to the nodes (ascending) and weights of the n-point
// Gauss-Legendre rule on [-1, 1]. x and w must have length n (it panics
// otherwise, or if n < 1).
//
// The values come from gonum's integrate/quad Legendre, an implementation of
// Bogaert, "Iteration-free computation of Gauss-Legendre quadrature nodes
// and weights", SIAM J. Sci. Comput. 36(3), A1008-A1026, 2014: tabulated
// angles for n <= 100, and for larger n the node angle theta and the weight
// from an asymptotic series in closed form, without iteration. gonum lists
// the nodes in descending order and returns x = cos(theta) mapped through
// (x+1)/2*2-1; the node therefore carries the rounding of theta and of
// that map (near x = 0 an absolute error up to about 2.4e-16 rather than a
// relative one) and the weights the few-ulp error the paper states. Only
// the more accurate half of gonum's values is used (see legendreRange). The
// figures measured against extended precision are in the package tests
// (TestLegendreAgainstRecurrence); fast.Jacobi(n, 0, 0, x, w) gives nodes
// within 0.5 ulp of theta and weights within about 2 ulp, at about twice
// the cost.
func Legendre(n int, x, w []float64) {
	checkLen(n, x, w)
	legendreRange(n, 0, n, x, w)
}

// legendreRange sets x[i-lo], w[i-lo] to the points lo..hi-1 of the n-point
// rule. gonum forms its right half as cos(theta) and its left half as
// cos(pi - theta), then maps x through (x+1)/2*2-1. The map is exact near
// -1 and rounds by up to 1.1e-16 near +1, and float64 pi is 1.2e-16 short,
// which matters only where sin(theta) is not small. So each node is taken
// from the half where gonum is more accurate and mirrored when needed:
// within about n/3 nodes of either end from the left half (x near -1), in
// the middle from the right half (x = cos(theta) directly); the middle node
// of an odd rule is exactly 0. Below mirrorMin points (gonum's tabulated
// rules and just above) gonum's own values are used unchanged: there the
// mirror measured worse.
const mirrorMin = 200

func legendreRange(n, lo, hi int, x, w []float64) {
	var g quad.Legendre
	parallelFor(hi-lo, func(a, b int) {
		for j := a; j < b; j++ {
			i := lo + j
			d := min(i, n-1-i) // distance to the nearer end
			src := d           // gonum-ascending index to evaluate: left half
			if n <= mirrorMin {
				src = i
			} else if 3*d >= n {
				src = n - 1 - d // right half
			}
			// gonum's index k = n-1-src counts from the right end.
			xi, wi := g.FixedLocationSingle(n, n-1-src, -1, 1)
			if src != i {
				xi = -xi
			}
			if 2*i == n-1 && n > mirrorMin {
				xi = 0
			}
			x[j], w[j] = xi, wi
		}
	})
}

func checkLen(n int, x, w []float64) {
	if n < 1 {
		panic("fast: n < 1")
	}
	if len(x) != n || len(w) != n {
		panic("fast: slice length mismatch")
	}
}
