// Package systems builds quadrature rules exact for a user's system of
// functions f_1, ..., f_m times a weight w on an interval, not for
// polynomials: with m = 2N, the generalized Gauss rule of N nodes inside
// the interval and N positive weights; with m prescribed nodes, the
// interpolatory weights for the system.
//
// The road is that of design, widened: a function list (expressions in x
// with an integer template index k, ParseFunctions) -> the moments of
// f_j w, by the double-exponential quadrature of package moments at
// extended precision or read from a file -> an orthonormalised basis of
// the system on a fine discretisation of w (modified Gram-Schmidt at
// extended precision, so that the moment equations stay well conditioned
// however close to dependent the functions are) -> Newton's method on the
// moment equations along a continuation from a system whose rule is known
// (the Gauss rule of w for polynomials; for exponentials on [a, inf) with
// weight 1, the Gauss-Legendre rule mapped by t = e^-(x-a); for the log
// system x^k, x^k log x on [0, c] with weight 1, a power-exponent path
// x^a, (x^b - x^a)/(b - a) from the Gauss-Legendre rule, on which every
// intermediate system has its rule, logpath.go) -> a rule
// computed at two working precisions, printed only where both agree, and
// verified against every function's moment.
//
// The continuation follows J. Ma, V. Rokhlin and S. Wandzura,
// "Generalized Gaussian quadrature rules for systems of arbitrary
// functions", SIAM J. Numer. Anal. 33 (1996) 971-996. Where it fails, the
// rule is sought from an oversampled positive rule reduced by point
// elimination with Gauss-Newton steps, after J. Bremer, Z. Gimbutas and
// V. Rokhlin, "A nonlinear optimization procedure for generalized Gaussian
// quadratures", SIAM J. Sci. Comput. 32 (2010) 1761-1788.
package systems
