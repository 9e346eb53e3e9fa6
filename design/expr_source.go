package design

import (
	"context"
	"fmt"
	"math/big"
	"sync"

	"quadwright/moments"
)

// ExprSource is the measure of a weight expression on an interval. Its
// recurrence is computed by two independent routes and returned only where
// they agree:
//
//   - modified moments in moments.DefaultBasis of the interval (Legendre on
//     a finite interval, Laguerre on a half-line, Hermite on the line),
//     integrated by double-exponential quadrature (moments.Weight.Moments),
//     then the modified Chebyshev algorithm (ModifiedChebyshev);
//   - a discretisation of the weight (a positive discrete measure exact for
//     polynomials of the degree needed), then the discretised Stieltjes
//     procedure (Stieltjes, cheap and parallel), or, when that does not
//     agree with the first route, the Lanczos method (Lanczos, slower but
//     orthogonal and so never the one that lost accuracy).
//
// One route integrates moments and runs a moment map, the other builds a
// discrete measure and runs the polynomials on it (in the present
// integrator both rest on the same double-exponential sums, so the check
// guards the algorithms and their conditioning; the quadrature's own
// accuracy rests on its level-to-level error estimate). Disagreement
// doubles the digits asked of the integrators (up to maxRouteAttempts
// times). When the moment map stays too ill conditioned (modified moments
// in a basis that suits the weight poorly, e.g. Laguerre for exp(-x^2) on
// [0, inf) beyond about 25 points), the check is between two successive
// discretisations at different accuracies instead. Pairs computed at the
// highest precision and length asked so far are cached.
type ExprSource struct {
	W     *moments.Weight
	Basis moments.Basis
	// Ctx bounds the computations started by Recurrence (which takes no
	// context of its own); nil means context.Background().
	Ctx context.Context

	cache recurrenceCache

	mu      sync.Mutex
	nu, est []*big.Float // the modified moments of the last computation and their error bounds
}

// NewExprSource returns the source of w, with modified moments in
// moments.DefaultBasis(w.Interval).
func NewExprSource(ctx context.Context, w *moments.Weight) *ExprSource {
	return &ExprSource{W: w, Basis: moments.DefaultBasis(w.Interval), Ctx: ctx}
}

// MaxLen is -1: any number of pairs can be computed.
func (s *ExprSource) MaxLen() int { return -1 }

// Label is "expression": Weight and Domain say which.
func (s *ExprSource) Label() string { return "expression" }

// Weight is the expression as the user wrote it.
func (s *ExprSource) Weight() string { return s.W.Source }

// Domain is the weight's interval.
func (s *ExprSource) Domain() moments.Interval { return s.W.Interval }

// routeSlack is how many bits below the precision asked the two routes must
// agree. Gauss asks its sources for confirmPrec(p) = p + 64 bits, p its
// first working precision (which carries 32 + 2 log2(N) guard bits beyond
// the printed digits), so the pairs are confirmed to p bits: as accurate
// as the first stage's own rounding of them, whose harmlessness the two
// stages' agreement then shows.
const routeSlack = 64

// Recurrence returns pairs 0..n-1 at prec bits: the discretisation's pairs
// (Stieltjes, or Lanczos), after checking that the modified-moment route
// agrees with them to prec - routeSlack bits on every pair (relative to the
// pair's scale, |alpha_k| + sqrt(beta_k) for alpha_k). A disagreement is an
// error, never a result. On an interval symmetric about 0, when both routes put every
// alpha_k below 2^-(prec-routeSlack) sqrt(beta_k), the weight is even as
// far as the computation can tell and the alphas are returned as exact
// zeros, so that the Gauss engine treats the rule as symmetric (its middle
// node exactly 0, not rounding noise printed as digits).
func (s *ExprSource) Recurrence(n int, prec uint) (*Recurrence, error) {
	return s.cache.get(n, prec, s.compute)
}

func (s *ExprSource) compute(n int, prec uint) (*Recurrence, error) {
	ctx := s.Ctx
	if ctx == nil {
		ctx = context.Background()
	}
	// The second attempt asks the integrators for twice the digits: the
	// modified moments carry absolute errors relative to the integral of
	// |q_k w|, and when the basis suits the weight poorly (a Laguerre basis
	// for a Gaussian decay) the moment map amplifies them until the route
	// fails or disagrees.
	// A weight whose modified moments have a closed form needs no
	// quadrature: the exact moments and the modified Chebyshev algorithm,
	// confirmed at two precisions (closedRoute). Should the map be too
	// ill conditioned for that, the numerical routes below decide.
	if cf, ok := s.closedForm(); ok {
		if rec, err := s.closedRoute(cf, n, prec); err == nil {
			return rec, nil
		}
	}
	digits := digitsFor(prec)
	bits := prec - routeSlack
	var prevB *Recurrence
	var why string
	for attempt := 0; attempt < maxRouteAttempts; attempt++ {
		rA, rS, errA, err := s.bothRoutes(ctx, n, prec, digits)
		if err != nil {
			return nil, err
		}
		if errA == nil && pairsAgree(rA, rS, bits) {
			s.symmetrize(rS, rA, prec)
			return rS, nil
		}
		// Stieltjes can lose accuracy where Lanczos, an orthogonal
		// method, does not: the discretisation's own recurrence is then
		// taken from Lanczos.
		rB, err := s.lanczosRoute(ctx, n, prec, digits)
		if err != nil {
			return nil, err
		}
		switch {
		case errA != nil:
			why = errA.Error()
		case pairsAgree(rA, rB, bits):
			s.symmetrize(rB, rA, prec)
			return rB, nil
		default:
			why = fmt.Sprintf("the two routes disagree at pair %d", firstDisagreement(rA, rB, bits))
		}
		// The moment map may be too ill conditioned for the modified
		// moments to fix the pairs: then the check is between two
		// discretisations, at this accuracy and the previous one
		// (different levels and pieces of the quadrature), which must
		// agree.
		if prevB != nil && pairsAgree(prevB, rB, bits) {
			s.symmetrize(rB, prevB, prec)
			return rB, nil
		}
		prevB = rB
		digits *= 2
	}
	return nil, fmt.Errorf("%s: the recurrence could not be confirmed to %d bits even with %d-digit integrals (%s, and successive discretisations disagree); no rule is built on it", s.W.Label(), bits, digits/2, why)
}

// maxRouteAttempts bounds how often ExprSource doubles the digits asked of
// the integrators.
const maxRouteAttempts = 3

// symmetrize zeroes the alphas of r when the interval is symmetric and both
// r and its check put every alpha below the accuracy asked.
func (s *ExprSource) symmetrize(r, check *Recurrence, prec uint) {
	if symmetricInterval(s.W.Interval) && negligibleAlphas(r, prec-routeSlack) && negligibleAlphas(check, prec-routeSlack) {
		zeroAlphas(r)
	}
}

// bothRoutes integrates the first 2n modified moments once (the
// discretisation of the second route is the same quadrature's nodes, see
// moments.Weight.Discretize) and then runs the modified Chebyshev algorithm
// on the moments and the discretised Stieltjes procedure on the
// discretisation side by side. A failure of the modified Chebyshev
// algorithm that conditioning can explain (a beta_k <= 0 or no convergence
// of its moment map) comes back as errA, for the caller to judge; any other
// failure as err.
func (s *ExprSource) bothRoutes(ctx context.Context, n int, prec uint, digits int) (rA, rS *Recurrence, errA, err error) {
	nu, est, err := s.W.Moments(ctx, 2*n, s.Basis, digits)
	if err != nil {
		return nil, nil, nil, err
	}
	s.keepMoments(nu, est)
	x, c, err := s.discretize(ctx, n, digits)
	if err != nil {
		return nil, nil, nil, err
	}
	done := make(chan struct{})
	go func() {
		defer close(done)
		rA, errA = s.chebyshevRoute(nu, n, prec, prec-min(prec, routeSlack))
	}()
	rS, err = Stieltjes(ctx, x, c, n, prec)
	<-done
	if err != nil {
		return nil, nil, nil, err
	}
	return rA, rS, errA, nil
}

// conditioningError marks a failure of the moment map (as opposed to the
// weight or its integrals).
type conditioningError struct{ err error }

func (e *conditioningError) Error() string { return e.err.Error() }
func (e *conditioningError) Unwrap() error { return e.err }

// digitsFor is the decimal accuracy asked of the integrator for pairs
// confirmed to prec - routeSlack bits: those bits in digits, plus ten.
func digitsFor(prec uint) int {
	return int(float64(prec-min(prec, routeSlack))/3.321928094887362) + 10
}

// ModifiedMomentRoute computes pairs 0..n-1 from the first 2n modified
// moments of the weight in s.Basis (computed to digitsFor(prec) digits)
// by the modified Chebyshev algorithm, run to convergence in its own
// arithmetic (chebyshevConverged); the result is rounded to prec bits and
// is as accurate as the moments and the conditioning of the moment map
// allow, which the caller judges.
func (s *ExprSource) ModifiedMomentRoute(ctx context.Context, n int, prec uint) (*Recurrence, error) {
	nu, _, err := s.W.Moments(ctx, 2*n, s.Basis, digitsFor(prec))
	if err != nil {
		return nil, err
	}
	return s.chebyshevRoute(nu, n, prec, 0)
}

// chebyshevRoute runs the modified Chebyshev algorithm on nu to
// convergence in its own arithmetic: to prec + 8 bits (chebyshevConverged)
// when bits is 0, else to bits + 8 bits (chebyshevPair), which is all the
// comparison of the two routes at bits bits can use.
func (s *ExprSource) chebyshevRoute(nu []*big.Float, n int, prec, bits uint) (*Recurrence, error) {
	input := func(w uint) (x, a, b []*big.Float) {
		a, b = basisPairs(s.Basis, 2*n-1, w)
		return nu, a, b
	}
	var rec *Recurrence
	var err error
	if bits == 0 {
		rec, err = chebyshevConverged(input, n, prec)
	} else {
		rec, err = chebyshevPair(input, n, bits, prec)
	}
	if err != nil {
		return nil, &conditioningError{fmt.Errorf("the modified moments in the %s basis: %w", s.Basis.Name, err)}
	}
	return rec, nil
}

// LanczosRoute computes pairs 0..n-1 by Lanczos from a discretisation of
// the weight exact to degree 2n-1 (to digitsFor(prec) digits), at prec
// bits: the method is orthogonal, so its rounding errors stay a few ulp
// times a modest multiple of n, far inside the routeSlack bits the check
// allows.
func (s *ExprSource) LanczosRoute(ctx context.Context, n int, prec uint) (*Recurrence, error) {
	return s.lanczosRoute(ctx, n, prec, digitsFor(prec))
}

func (s *ExprSource) lanczosRoute(ctx context.Context, n int, prec uint, digits int) (*Recurrence, error) {
	x, c, err := s.discretize(ctx, n, digits)
	if err != nil {
		return nil, err
	}
	return Lanczos(ctx, x, c, n, prec)
}

// discretize returns the discrete measure of the weight exact to degree
// 2n-1 (to digits digits), with at least n points.
func (s *ExprSource) discretize(ctx context.Context, n int, digits int) (x, c []*big.Float, err error) {
	x, c, err = s.W.Discretize(ctx, 2*n-1, digits)
	if err != nil {
		return nil, nil, err
	}
	if len(x) < n {
		return nil, nil, fmt.Errorf("%s: the discretisation has %d points, fewer than the %d pairs asked", s.W.Label(), len(x), n)
	}
	return x, c, nil
}

// firstDisagreement returns the first pair index where r1 and r2 differ
// beyond bits bits (as pairsAgree measures it).
func firstDisagreement(r1, r2 *Recurrence, bits uint) int {
	for k := 0; k < min(r1.Len(), r2.Len()); k++ {
		if !pairsAgree(r1.Prefix(k+1), r2.Prefix(k+1), bits) {
			return k
		}
	}
	return min(r1.Len(), r2.Len())
}

// symmetricInterval reports whether iv is (-inf, inf) or [-a, a].
func symmetricInterval(iv moments.Interval) bool {
	if !iv.Lo.Finite() && !iv.Hi.Finite() {
		return true
	}
	return iv.Finite() && new(big.Rat).Add(iv.Lo.Value, iv.Hi.Value).Sign() == 0
}

// negligibleAlphas reports |alpha_k| <= 2^-bits sqrt(beta_k) for every k.
func negligibleAlphas(r *Recurrence, bits uint) bool {
	for k := range r.Alpha {
		s := new(big.Float).SetPrec(64).Sqrt(absF(r.Beta[k]))
		if !smallRelative(r.Alpha[k], s, bits) {
			return false
		}
	}
	return true
}

// zeroAlphas sets every alpha_k of r to an exact zero.
func zeroAlphas(r *Recurrence) {
	for k := range r.Alpha {
		r.Alpha[k].SetInt64(0)
	}
}
