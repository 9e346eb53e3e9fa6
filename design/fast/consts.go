package fast

import (
	"math/big"

	"quadwright/precision"
)

// constPrec is the precision at which the per-rule constants are formed
// from log-Gamma values before being rounded to float64: log Gamma(2n) is
// near 2n log(2n), so for n up to 2^40 its leading 45 bits cancel in the
// combinations below and 192 bits leave well over 53.
const constPrec = 192

func bf(v float64) *big.Float { return new(big.Float).SetPrec(constPrec).SetFloat64(v) }

// bfDD returns hi + lo exactly.
func bfDD(v dd) *big.Float { return bf(v.hi).Add(bf(v.hi), bf(v.lo)) }

// lgam returns log Gamma(v + k) at constPrec bits for v + k > 0 (k an
// integer, added exactly).
func lgam(v *big.Float, k int) *big.Float {
	x := new(big.Float).SetPrec(constPrec).Set(v)
	x.Add(x, new(big.Float).SetPrec(constPrec).SetInt64(int64(k)))
	l, _ := precision.LogGamma(x)
	return l
}

// expRound returns exp(l) rounded to the nearest float64.
func expRound(l *big.Float) float64 {
	return precision.NearestFloat64(precision.Exp(l))
}

// jacobiConsts returns, for the n-point rule of (1-x)^a (1+x)^b (a and b
// in double-double, so that exponents such as -0.3 enter exactly), the
// constants of the two weight formulas, each correct to within one rounding
// (Szego, Orthogonal Polynomials, 1939, eq. 15.3.1, for the Christoffel
// numbers lambda = cw / ((1-x^2) P_n'(x)^2)):
//
//	cw    = 2^(a+b+1) Gamma(n+a+1) Gamma(n+b+1) / (Gamma(n+a+b+1) n!),
//	interior = cw / K^2,  K = 2^(2 rho) B(n+a+1, n+b+1) / pi,  rho = n + (a+b+1)/2,
//	boundary = cw / binom(n+a, n)^2,
//
// K being the factor in front of the interior expansion and binom(n+a, n)
// the value P_n(1) in front of the hypergeometric series; lnInterior is
// log(interior) in double-double.
func jacobiConsts(n int, a, b dd) (interior, boundary float64, lnInterior dd) {
	ln2 := precision.Ln2(constPrec)
	lpi := precision.Log(precision.Pi(constPrec))
	ba, bb := bfDD(a), bfDD(b)
	ab := new(big.Float).SetPrec(constPrec).Add(ba, bb) // exact
	gna, gnb := lgam(ba, n+1), lgam(bb, n+1)
	gnab := lgam(ab, n+1)
	gn := lgam(bf(0), n+1)
	ab1 := new(big.Float).SetPrec(constPrec).Add(ab, bf(1))
	cw := new(big.Float).SetPrec(constPrec).Mul(ln2, ab1)
	cw.Add(cw, gna).Add(cw, gnb).Sub(cw, gnab).Sub(cw, gn)

	// log K = 2 rho log 2 + log Gamma(n+a+1) + log Gamma(n+b+1) - log Gamma(2n+a+b+2) - log pi
	rho2 := new(big.Float).SetPrec(constPrec).Set(ab1)
	rho2.Add(rho2, new(big.Float).SetPrec(constPrec).SetInt64(2*int64(n)))
	lk := new(big.Float).SetPrec(constPrec).Mul(ln2, rho2)
	lk.Add(lk, gna).Add(lk, gnb).Sub(lk, lgam(ab, 2*n+2)).Sub(lk, lpi)
	li := new(big.Float).SetPrec(constPrec).Sub(cw, new(big.Float).SetPrec(constPrec).Mul(bf(2), lk))

	// log binom = log Gamma(n+a+1) - log Gamma(a+1) - log n!
	lb := new(big.Float).SetPrec(constPrec).Sub(gna, lgam(ba, 1))
	lb.Sub(lb, gn)
	lbd := new(big.Float).SetPrec(constPrec).Sub(cw, new(big.Float).SetPrec(constPrec).Mul(bf(2), lb))
	return expRound(li), expRound(lbd), splitDDc(li)
}

// jacobiMass is 2^(a+b+1) Gamma(a+1) Gamma(b+1) / Gamma(a+b+2) rounded to
// float64.
func jacobiMass(a, b float64) float64 {
	ba, bb := bf(a), bf(b)
	ab := new(big.Float).SetPrec(constPrec).Add(ba, bb)
	ab1 := new(big.Float).SetPrec(constPrec).Add(ab, bf(1))
	l := new(big.Float).SetPrec(constPrec).Mul(precision.Ln2(constPrec), ab1)
	l.Add(l, lgam(ba, 1)).Add(l, lgam(bb, 1)).Sub(l, lgam(ab, 2))
	return expRound(l)
}

func precLn2() *big.Float { return precision.Ln2(constPrec) }
