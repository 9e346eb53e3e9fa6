package fast

// Accuracy is the worst error of a fast rule measured against an
// independent reference (Newton's method on the three-term recurrence at
// 192 bits, started from the float64 node, with the Christoffel number as
// the weight), over the sampled indices of the package tests and of the
// heavy sweep (N = 10^5, 200 indices over both ends and the middle).
type Accuracy struct {
	// NodeShare is the largest node error divided by max(2 ulp(theta)
	// sin(theta), 1 ulp(x)), theta = arccos x (the finite families), or
	// by 1 ulp(x) (Hermite, Laguerre): at most 1 meets the bound.
	NodeShare float64
	// NodeULP is the largest node error in units of ulp(x) (large where a
	// node lies close to 0, where ulp(x) is tiny).
	NodeULP float64
	// WeightULP is the largest relative weight error in units of ulp(w).
	WeightULP float64
}

// Measured returns the measured accuracy of a kind of rule (the figures
// of the tests of 1 December 2026; TestJacobiAgainstRecurrence,
// TestLegendreAgainstRecurrence, TestHermite*, TestLaguerre*, the heavy
// sweeps of this package and of design, TestHeavyBuildFast, and a scan of
// Legendre rules from 1000 to 50001 points). The rules build prints carry
// their own sampled figures (design.BuildFast). The Radau and Lobatto rules share the Jacobi figures for
// their free nodes; their end weights are closed forms rounded once, and
// the free weights carry one more rounding (the division by 1-x or 1+x).
func Measured(kind Kind) Accuracy {
	switch kind {
	case GaussLegendre: // Bogaert's expansions with the angle in double-double
		return Accuracy{NodeShare: 0.51, NodeULP: 1.8, WeightULP: 2.95}
	case GaussJacobi, RadauJacobiKind, LobattoJacobiKind:
		return Accuracy{NodeShare: 0.5, NodeULP: 5.8, WeightULP: 2.6}
	case GaussHermite:
		return Accuracy{NodeShare: 0.5, NodeULP: 0.5, WeightULP: 2.2}
	case GaussLaguerre:
		return Accuracy{NodeShare: 0.5, NodeULP: 0.5, WeightULP: 1.7}
	}
	panic("fast: unknown Kind")
}
