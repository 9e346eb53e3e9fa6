package design

import (
	"math"
	"math/big"

	"quadwright/moments"
)

// FastThreshold is the smallest number of points for which build takes
// the fast float64 path (package design/fast) in float64 mode, where it
// serves the measure and kind; below it the extended-precision engine is
// used. Measured on 1 December 2026 (2 shared cores): the engine needs
// 0.2 s at N = 300, 1.5 s at 1000 and 6.5 s at 2000 for a Jacobi rule,
// the fast path well under 0.1 s at 1000, and the two agree there within
// the fast path's stated accuracy (TestFastAgreesWithEngine).
const FastThreshold = 1000

// FastMaxPoints is the largest rule the fast path builds (memory: about
// 40 bytes per point while it is built and checked).
const FastMaxPoints = 10_000_000

// FastRule is a float64 rule from the fast path with its provenance and
// the checks it passed. Nodes X are ascending; X and W are the printed
// values (shortest round-trip form of each float64).
type FastRule struct {
	Kind    string // "gauss", "radau", "lobatto"
	Measure string // label of the measure
	Weight  string // the weight as an expression in x
	Domain  moments.Interval
	X, W    []float64

	// Degree is the degree of exactness verified on X, W (FastCheck); it
	// equals ConstructionDegree when the whole range was tested.
	Degree int
	// ConstructionDegree is the degree the rule is built for: 2N-1 for
	// gauss, 2N-2 radau, 2N-3 lobatto.
	ConstructionDegree int
	// DegreeCheck says how the degree was verified.
	DegreeCheck string
	// WorstShare is the largest residual of the exactness test as a
	// share of its tolerance, over the degrees that passed.
	WorstShare float64
	// Accuracy is the sampled comparison with an independent evaluation.
	Accuracy FastAccuracy
	Method   string
	Notes    []string
}

// FastAccuracy is the measured error of a fast rule at sampled indices
// against Newton's method on the three-term recurrence in double-double
// (fast.Reference), the reference mapped onto the rule's interval exactly.
type FastAccuracy struct {
	Samples int // indices compared
	// NodeULP and WeightULP are the largest errors in units of the last
	// place of the true value (the weight's relative error in ulps).
	NodeULP, WeightULP float64
	// NodeShare is the largest node error as a share of the bound
	// max(2 ulp(theta) sin(theta), 1 ulp(t)) on [-1, 1], theta = arccos t,
	// times the map's half-length, plus 1 ulp(x) for the map's own
	// rounding (1 ulp(x) for Laguerre and Hermite); WeightShare the
	// largest weight error as a share of 4 ulp (5 when the weights are
	// scaled by the map). A rule is accepted only when both are <= 1.
	NodeShare, WeightShare float64
	// WorstNode and WorstWeight are the 0-based indices of the maxima.
	WorstNode, WorstWeight int
}

// Points is the number of nodes.
func (r *FastRule) Points() int { return len(r.X) }

// FastStability is what the signs and positions of a fast rule say, as in
// Stability, with the smallest gap between adjacent nodes.
type FastStability struct {
	Stability
	NodesOnBoundary int
	MinGap          float64 // exact difference rounded to float64 (0 for one point)
	MinGapAfter     int     // 1-based index of the left node of that pair
}

// Stability computes the fast rule's FastStability from the float64 values
// (each an exact binary fraction, compared with the interval's exact ends).
func (r *FastRule) Stability() FastStability {
	var s FastStability
	var sumAbs, sum float64
	loEnd, hiEnd := newEndCmp(r.Domain.Lo), newEndCmp(r.Domain.Hi)
	for i, w := range r.W {
		if w < 0 {
			s.NegativeWeights++
		}
		sumAbs += math.Abs(w)
		sum += w
		x := r.X[i]
		lo, hi := loEnd.cmp(x), hiEnd.cmp(x)
		switch {
		case lo < 0 || hi > 0:
			s.NodesOutside++
		case lo == 0 || hi == 0:
			s.NodesOnBoundary++
		}
		if i > 0 {
			if g := x - r.X[i-1]; i == 1 || g < s.MinGap {
				s.MinGap, s.MinGapAfter = g, i
			}
		}
	}
	s.Factor = 1
	if s.NegativeWeights > 0 {
		s.Factor = sumAbs / math.Abs(sum)
	}
	return s
}

// endCmp compares float64 values with an end of an interval: exactly, but
// with one float64 comparison unless the value is the double nearest to
// the end (if x < f, the nearest double to e, then x < e, and likewise
// above).
type endCmp struct {
	e moments.Endpoint
	f float64
}

func newEndCmp(e moments.Endpoint) endCmp {
	c := endCmp{e: e}
	if e.Finite() {
		c.f, _ = e.Value.Float64()
	}
	return c
}

// cmp returns -1, 0, +1 as x is below, at or above the end.
func (c endCmp) cmp(x float64) int {
	switch {
	case !c.e.Finite():
		return -c.e.Inf
	case x < c.f:
		return -1
	case x > c.f:
		return 1
	}
	return new(big.Rat).SetFloat64(x).Cmp(c.e.Value)
}
