package fast

import "fmt"

// Points sets x and w to the n-point rule of the given kind, the values
// Legendre, Jacobi, RadauJacobi, LobattoJacobi, Hermite and Laguerre
// return, but with the exponents alpha and beta given as pairs hi + lo
// (used where the kind has them; Laguerre takes alpha[0] only; scaled only
// for GaussHermite and GaussLaguerre). For the kinds on [-1, 1], when d is not
// nil, d[i] receives min(1-x_i, 1+x_i), the distance to the nearer end,
// taken from the computation to a few ulp in relative terms (0 at a fixed
// end), which the rounded node cannot give near the ends; an affine map
// onto another interval needs it to keep the nodes near its ends accurate.
// x, w (and d) must have length n.
func Points(kind Kind, n int, alpha, beta [2]float64, scaled bool, x, w, d []float64) error {
	ea, eb := dd{alpha[0], alpha[1]}, dd{beta[0], beta[1]}
	if n < 1 {
		return fmt.Errorf("the number of points %d is not positive", n)
	}
	if d != nil && len(d) != n {
		panic("fast: slice length mismatch")
	}
	switch kind {
	case GaussLegendre:
		checkLen(n, x, w)
		legendreRange(n, 0, n, x, w, d)
		return nil
	case GaussJacobi:
		checkLen(n, x, w)
		if err := checkExponent("alpha", ea.hi); err != nil {
			return err
		}
		if err := checkExponent("beta", eb.hi); err != nil {
			return err
		}
		return jacobiCore(n, ea, eb, x, w, d, 0, 0)
	case RadauJacobiKind:
		if n < 2 {
			return fmt.Errorf("a Radau rule needs at least 2 points, not %d", n)
		}
		return radauJacobi(n, ea, eb, x, w, d)
	case LobattoJacobiKind:
		if n < 3 {
			return fmt.Errorf("a Lobatto rule needs at least 3 points, not %d", n)
		}
		return lobattoJacobi(n, ea, eb, x, w, d)
	case GaussHermite:
		Hermite(n, x, w, scaled)
		return nil
	case GaussLaguerre:
		return Laguerre(n, alpha[0], x, w, scaled)
	}
	panic("fast: unknown Kind")
}
