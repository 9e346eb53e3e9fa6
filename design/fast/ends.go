package fast

import (
	"math/big"
)

// RadauJacobi sets x and w to the n-point Gauss-Radau rule (n >= 2) for
// (1-x)^alpha (1+x)^beta with the fixed node x[0] = -1; it is exact for
// polynomials of degree 2n-2. The free nodes are the (n-1)-point
// Gauss-Jacobi rule for (alpha, beta+1), whose weights divided by 1+x are
// the Radau weights (the distance 1+x taken from the computation, so the
// division keeps relative accuracy); the weight at -1 is the closed form
//
//	2^(a+b+1) Gamma(b+1) Gamma(b+2) Gamma(n) Gamma(n+a) / (Gamma(n+b+1) Gamma(n+a+b+1)),
//
// which gives 2/n^2 for Legendre (Abramowitz and Stegun 25.4.31) and
// pi/(2n-1) for Chebyshev of the first kind. It returns an error naming the
// parameter when alpha is outside (-1, MaxJacobiExponent] or beta outside
// (-1, MaxJacobiExponent-1].
func RadauJacobi(n int, alpha, beta float64, x, w []float64) error {
	return radauJacobi(n, ddF(alpha), ddF(beta), x, w, nil)
}

// radauJacobi is RadauJacobi for the exponents ea, eb in double-double,
// with the distances to the nearer end in d when d is not nil.
func radauJacobi(n int, ea, eb dd, x, w, d []float64) error {
	alpha, beta := ea.hi, eb.hi
	checkLen(n, x, w)
	if n < 2 {
		panic("fast: Radau rule with n < 2")
	}
	if err := checkExponent("alpha", alpha); err != nil {
		return err
	}
	if err := checkExponent("beta", beta+1); err != nil {
		return err
	}
	var dFree []float64
	if d != nil {
		d[0], dFree = 0, d[1:]
	}
	if err := jacobiCore(n-1, ea, ddAdd(eb, ddF(1)), x[1:], w[1:], dFree, 0, 1); err != nil {
		return err
	}
	x[0], w[0] = -1, radauEnd(n, ea, eb)
	return nil
}

// RadauLegendre is RadauJacobi for alpha = beta = 0.
func RadauLegendre(n int, x, w []float64) {
	if err := RadauJacobi(n, 0, 0, x, w); err != nil {
		panic(err)
	}
}

// LobattoJacobi sets x and w to the n-point Gauss-Lobatto rule (n >= 3)
// for (1-x)^alpha (1+x)^beta with the fixed nodes -1 and 1; it is exact for
// polynomials of degree 2n-3. The free nodes are the (n-2)-point
// Gauss-Jacobi rule for (alpha+1, beta+1), weights divided by 1-x^2; the
// weight at 1 is
//
//	2^(a+b+1) Gamma(a+1) Gamma(a+2) Gamma(n-1) Gamma(n+b) / (Gamma(n+a) Gamma(n+a+b+1))
//
// (half the Radau weight at 1 of the (n-1)-point rule for (alpha, beta+1),
// since both integrate (1+x) Q^2 with Q the same Jacobi polynomial) and the weight at -1 the same with alpha and beta exchanged; for
// Legendre they are 2/(n(n-1)) (Abramowitz and Stegun 25.4.32). It returns
// an error naming the parameter when alpha or beta is outside (-1,
// MaxJacobiExponent-1].
func LobattoJacobi(n int, alpha, beta float64, x, w []float64) error {
	return lobattoJacobi(n, ddF(alpha), ddF(beta), x, w, nil)
}

// lobattoJacobi is LobattoJacobi for the exponents ea, eb in
// double-double, with the distances to the nearer end in d when d is not
// nil.
func lobattoJacobi(n int, ea, eb dd, x, w, d []float64) error {
	alpha, beta := ea.hi, eb.hi
	checkLen(n, x, w)
	if n < 3 {
		panic("fast: Lobatto rule with n < 3")
	}
	if err := checkExponent("alpha", alpha+1); err != nil {
		return err
	}
	if err := checkExponent("beta", beta+1); err != nil {
		return err
	}
	var dFree []float64
	if d != nil {
		d[0], d[n-1], dFree = 0, 0, d[1:n-1]
	}
	if err := jacobiCore(n-2, ddAdd(ea, ddF(1)), ddAdd(eb, ddF(1)), x[1:n-1], w[1:n-1], dFree, 1, 1); err != nil {
		return err
	}
	x[0], w[0] = -1, lobattoEnd(n, eb, ea)
	x[n-1], w[n-1] = 1, lobattoEnd(n, ea, eb)
	return nil
}

// LobattoLegendre is LobattoJacobi for alpha = beta = 0.
func LobattoLegendre(n int, x, w []float64) {
	if err := LobattoJacobi(n, 0, 0, x, w); err != nil {
		panic(err)
	}
}

func sumLog(terms ...*big.Float) *big.Float {
	s := new(big.Float).SetPrec(constPrec)
	for _, t := range terms {
		s.Add(s, t)
	}
	return s
}

func neg(x *big.Float) *big.Float { return new(big.Float).SetPrec(constPrec).Neg(x) }

// radauEnd is the Radau weight at -1 (see RadauJacobi), rounded once.
func radauEnd(n int, a, b dd) float64 {
	ba, bb := bfDD(a), bfDD(b)
	ab := new(big.Float).SetPrec(constPrec).Add(ba, bb)
	l := sumLog(
		new(big.Float).SetPrec(constPrec).Mul(sumLog(ab, bf(1)), precLn2()),
		lgam(bb, 1), lgam(bb, 2), lgam(bf(0), n), lgam(ba, n),
		neg(lgam(bb, n+1)), neg(lgam(ab, n+1)))
	return expRound(l)
}

// lobattoEnd is the Lobatto weight (see LobattoJacobi) at the end where
// the weight function behaves as (1-x)^a, rounded once.
func lobattoEnd(n int, a, b dd) float64 {
	ba, bb := bfDD(a), bfDD(b)
	ab := new(big.Float).SetPrec(constPrec).Add(ba, bb)
	l := sumLog(
		new(big.Float).SetPrec(constPrec).Mul(sumLog(ab, bf(1)), precLn2()),
		lgam(ba, 1), lgam(ba, 2), lgam(bf(0), n-1), lgam(bb, n),
		neg(lgam(ba, n)), neg(lgam(ab, n+1)))
	return expRound(l)
}
