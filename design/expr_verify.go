package design

import (
	"context"
	"math/big"
)

// keepMoments remembers the modified moments of the last route computation
// for VerifyRule.
func (s *ExprSource) keepMoments(nu, est []*big.Float) {
	s.mu.Lock()
	defer s.mu.Unlock()
	if len(nu) >= len(s.nu) {
		s.nu, s.est = nu, est
	}
}

// VerifyRule tests printed nodes and weights for exactness through degree
// maxDeg against the weight itself rather than against its recurrence: in
// the basis q_j of s.Basis (the monic Legendre polynomials of a finite
// interval, Laguerre or Hermite on infinite ones), q_j counts as integrated
// when
//
//	|sum_i w_i q_j(x_i) - nu_j| <= tol sum_i |w_i| (|q_j(x_i)| + |x_i q_j'(x_i)|) + e_j,
//
// nu_j the modified moment of the weight by double-exponential quadrature
// and e_j its error bound (for a weight with moments in closed form,
// moments.ClosedForm, the exact moment and its rounding bound), tol = 10 u, u one unit in the D-th digit, D the
// largest number of significant digits among the printed values (the
// criterion of VerifyPrinted). The moments through degree 2N-1 are those
// the modified-moment route already integrated, so an N-point Gauss rule
// needs only the N pairs it is built from, and its check does not rest on
// the recurrence it was built from.
func (s *ExprSource) VerifyRule(ctx context.Context, nodes, weights []string, maxDeg int) (Exactness, error) {
	pv, err := readPrinted(nodes, weights)
	if err != nil {
		return Exactness{}, err
	}
	s.mu.Lock()
	nu, est := s.nu, s.est
	s.mu.Unlock()
	if cf, ok := s.closedForm(); ok && len(nu) < maxDeg+1 {
		// Exact moments, rounded 64 bits beyond the sums of the test.
		nu, est = cf.Moments(maxDeg+1, pv.prec+64)
	}
	if len(nu) < maxDeg+1 {
		// Ten digits beyond the printed ones keep the moments' own error
		// far below the tolerance.
		nu, est, err = s.W.Moments(ctx, maxDeg+1, s.Basis, pv.digits+10)
		if err != nil {
			return Exactness{}, err
		}
	}
	a, b := basisPairs(s.Basis, maxDeg, pv.prec)
	return checkInBasis(ctx, a, b, nu[:maxDeg+1], est[:maxDeg+1], pv.nodes, pv.weights, pv.tol, maxDeg, pv.prec)
}
