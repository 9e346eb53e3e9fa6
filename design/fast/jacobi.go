package fast

import (
	"fmt"
	"math"
	"sync/atomic"
)

// MaxJacobiExponent bounds |alpha| and |beta| for the fast Jacobi rules:
// beyond it the coefficients of the interior expansion grow so fast that
// the boundary block of boundaryNodes nodes no longer covers the region
// where the expansion fails.
const MaxJacobiExponent = 5

// smallN is the size below which the rules come from Newton's method on the
// three-term recurrence in double-double (O(n^2), a few milliseconds).
const smallN = 100

// Jacobi sets x and w to the nodes (ascending) and weights of the n-point
// Gauss-Jacobi rule for the weight (1-x)^alpha (1+x)^beta on [-1, 1]. x and
// w must have length n (it panics otherwise). It returns an error, naming
// the parameter, when alpha or beta is not in (-1, MaxJacobiExponent].
//
// Method (Hale and Townsend, "Fast and accurate computation of
// Gauss-Legendre and Gauss-Jacobi quadrature nodes and weights", SIAM J.
// Sci. Comput. 35(2), A652-A674, 2013): the half of the nodes nearer x = 1
// is computed in theta = arccos x and the other half as the mirror image of
// the rule with alpha and beta exchanged, so theta stays in (0, ~pi/2].
// Away from the ends each node is Newton's method on Hahn's interior
// expansion, started from its leading-order zero; the boundaryNodes nodes
// nearest each end come from the hypergeometric series in double-double.
// For n < 100 the rule comes from Newton's method on the recurrence in
// double-double instead. All weights are formed as products and quotients
// of positive factors, never as differences, so they keep their relative
// accuracy at any size.
func Jacobi(n int, alpha, beta float64, x, w []float64) error {
	checkLen(n, x, w)
	if err := checkExponent("alpha", alpha); err != nil {
		return err
	}
	if err := checkExponent("beta", beta); err != nil {
		return err
	}
	return jacobiCore(n, ddF(alpha), ddF(beta), x, w, nil, 0, 0)
}

// jacobiCore sets x and w to the n-point Gauss-Jacobi rule with each weight
// divided by (1-x)^pa (1+x)^pb (pa, pb in {0, 1}), the distances to the ends
// taken from the computation rather than from the rounded node. When d is
// not nil it receives those distances, d[i] = min(1-x_i, 1+x_i), each to a
// few ulp in relative terms. The exponents ea and eb are double-double: the
// per-rule constants and the weights' powers take them exactly, the
// asymptotic expansions their float64 parts (the rest moves the nodes by
// far less than an ulp).
func jacobiCore(n int, ea, eb dd, x, w, d []float64, pa, pb int) error {
	alpha, beta := ea.hi, eb.hi
	var adjust func(p point) float64
	switch {
	case pa == 0 && pb == 0:
		adjust = func(p point) float64 { return p.w }
	case pa == 1 && pb == 0:
		adjust = func(p point) float64 { return p.w / p.omx }
	case pa == 0 && pb == 1:
		adjust = func(p point) float64 { return p.w / p.opx }
	default:
		adjust = func(p point) float64 { return ddDiv(ddF(p.w), twoProd(p.omx, p.opx)).float() }
	}
	if n < smallN {
		pts := make([]point, n)
		if err := recurrenceRule(jacobiRecurrence(n, alpha, beta), pts); err != nil {
			return err
		}
		for i, p := range pts {
			x[i], w[i] = p.x, adjust(p)
			if d != nil {
				d[i] = min(p.omx, p.opx)
			}
		}
		return nil
	}
	right, left, err := jacobiHalves(n, ea, eb)
	if err != nil {
		return err
	}
	kA := rightCount(n, alpha, beta)
	var bad atomic.Bool
	parallelFor(n, func(lo, hi int) {
		localBad := false
		for i := lo; i < hi; i++ {
			var p point
			var ok bool
			if i < n-kA {
				p, ok = left.point(i + 1)
				p.x, p.omx, p.opx = -p.x, p.opx, p.omx
			} else {
				p, ok = right.point(n - i)
			}
			x[i], w[i] = p.x, adjust(p)
			if d != nil {
				d[i] = min(p.omx, p.opx)
			}
			if !ok {
				localBad = true
			}
		}
		if localBad {
			bad.Store(true)
		}
	})
	if bad.Load() {
		return fmt.Errorf("the %d-point Gauss-Jacobi rule for alpha = %g, beta = %g did not converge in float64", n, alpha, beta)
	}
	return nil
}

func checkExponent(name string, v float64) error {
	if !(v > -1 && v <= MaxJacobiExponent) {
		return fmt.Errorf("%s = %g is outside (-1, %d] for the fast rules", name, v, MaxJacobiExponent)
	}
	return nil
}

// rightCount is the number of nodes taken from the half at x = 1: those
// whose leading-order angle (k + a/2 - 1/4) pi / rho is at most pi/2.
func rightCount(n int, a, b float64) int {
	k := int(math.Floor(float64(n)/2 + (b-a)/4 + 0.5))
	return max(0, min(n, k))
}

// jacobiHalves prepares both halves of the n-point rule, boundary blocks
// included.
func jacobiHalves(n int, ea, eb dd) (right, left *jacobiHalf, err error) {
	a, b := ea.hi, eb.hi
	ci, cbR, lci := jacobiConsts(n, ea, eb)
	_, cbL, _ := jacobiConsts(n, eb, ea)
	right = newJacobiHalf(n, ea, eb, ci, cbR)
	left = newJacobiHalf(n, eb, ea, ci, cbL)
	right.lnci, left.lnci = lci, lci
	kb := boundaryNodes
	if !right.boundary(kb) || !left.boundary(kb) {
		return nil, nil, fmt.Errorf("the end nodes of the %d-point Gauss-Jacobi rule for alpha = %g, beta = %g could not be isolated", n, a, b)
	}
	return right, left, nil
}

// point returns the k-th node from this half's end (as x = cos theta) and
// its weight.
func (h *jacobiHalf) point(k int) (point, bool) {
	if k <= len(h.bnd) {
		return h.bnd[k-1], true
	}
	return h.node(k)
}
