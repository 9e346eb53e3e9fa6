package design

import (
	"math/big"

	"quadwright/moments"
)

// closedForm reports whether s's weight has modified moments in closed form
// in s.Basis (moments.Weight.ClosedForm, with s.Basis the interval's
// Legendre basis).
func (s *ExprSource) closedForm() (moments.ClosedForm, bool) {
	cf, ok := s.W.ClosedForm()
	if !ok || s.Basis.Name != "legendre" || s.Basis.A == nil || s.Basis.B == nil {
		return moments.ClosedForm{}, false
	}
	// The closed forms are those of moments.DefaultBasis(w.Interval).
	def := moments.DefaultBasis(s.W.Interval)
	for k := 0; k < 3; k++ {
		if s.Basis.A(k).Cmp(def.A(k)) != 0 || s.Basis.B(k).Cmp(def.B(k)) != 0 {
			return moments.ClosedForm{}, false
		}
	}
	return cf, true
}

// closedRoute computes pairs 0..n-1 at prec bits from the weight's exact
// modified moments (closed form, no quadrature): the modified Chebyshev
// algorithm on them at two working precisions, accepted where the two agree
// on every pair to prec - routeSlack + 8 bits, the accuracy the two-route
// check of compute confirms (chebyshevPair; if the map loses too many bits
// for that, chebyshevConverged's doubling decides). The inputs carry only
// their rounding, so the agreement of the two runs confirms the pairs the
// exact moments determine. The moments are kept, with their rounding
// bounds, for VerifyRule: the printed rule is then tested against the exact
// moments of the weight.
func (s *ExprSource) closedRoute(cf moments.ClosedForm, n int, prec uint) (*Recurrence, error) {
	bits := prec - min(prec, routeSlack)
	input := func(w uint) (nu, a, b []*big.Float) {
		nu, _ = cf.Moments(2*n, w)
		a, b = basisPairs(s.Basis, 2*n-1, w)
		return nu, a, b
	}
	rec, err := chebyshevPair(input, n, bits, prec)
	if err != nil {
		return nil, &conditioningError{err}
	}
	nu, est := cf.Moments(2*n, prec)
	s.keepMoments(nu, est)
	return rec, nil
}
