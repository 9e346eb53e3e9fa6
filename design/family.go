package design

import (
	"math/big"

	"quadwright/moments"
	"quadwright/precision"
)

// FamilySource is the RecurrenceSource of a classical family, from closed
// forms. Every coefficient except the mass Beta[0] is an exact rational in
// the family's parameters and interval ends, rounded once to the precision
// asked; the mass comes from Gamma functions at extra precision.
type FamilySource struct {
	Family moments.Family
}

// MaxLen is -1: closed forms give any number of coefficients.
func (FamilySource) MaxLen() int { return -1 }

// Recurrence returns the first n pairs at prec bits.
//
// Jacobi weight (1-t)^a (1+t)^b on [-1, 1], from the closed forms of the
// monic Jacobi recurrence (Gautschi, Orthogonal Polynomials: Computation and
// Approximation, Oxford 2004, Table 1.1; Szego, Orthogonal Polynomials, 1939,
// eq. 4.5.1, rewritten for monic polynomials):
//
//	alpha_0 = (b-a)/(a+b+2),  alpha_k = (b^2-a^2)/((2k+a+b)(2k+a+b+2)),
//	beta_0  = 2^(a+b+1) Gamma(a+1) Gamma(b+1) / Gamma(a+b+2),
//	beta_1  = 4(1+a)(1+b)/((2+a+b)^2 (3+a+b)),
//	beta_k  = 4k(k+a)(k+b)(k+a+b)/((2k+a+b)^2 (2k+a+b+1)(2k+a+b-1)),  k >= 2.
//
// The special forms at k = 0 and k = 1 avoid the 0/0 that the general ones
// give when a+b = 0 or a+b = -1 (Chebyshev of the first kind, Gegenbauer
// with alpha = 0). Laguerre x^a e^(-x): alpha_k = 2k+a+1, beta_k = k(k+a),
// beta_0 = Gamma(a+1). Hermite e^(-x^2): alpha_k = 0, beta_k = k/2,
// beta_0 = sqrt(pi). On [lo, hi] a finite family's pairs map as
// alpha -> c + h alpha, beta_k -> h^2 beta_k, beta_0 -> h beta_0, with
// c = (lo+hi)/2 and h = (hi-lo)/2; Laguerre on [lo, inf) shifts alpha by lo.
func (s FamilySource) Recurrence(n int, prec uint) (*Recurrence, error) {
	f := s.Family
	al := make([]*big.Rat, n)
	be := make([]*big.Rat, n) // be[0] unused: the mass is not rational
	var mass *big.Float
	guard := prec + 64
	switch f.Name {
	case "laguerre":
		a := f.Alpha
		for k := 0; k < n; k++ {
			kk := big.NewRat(int64(k), 1)
			al[k] = new(big.Rat).Add(new(big.Rat).Add(new(big.Rat).Mul(big.NewRat(2, 1), kk), a), big.NewRat(1, 1))
			al[k].Add(al[k], f.Interval.Lo.Value)
			be[k] = new(big.Rat).Mul(kk, new(big.Rat).Add(kk, a))
		}
		mass = precision.GammaRat(new(big.Rat).Add(a, big.NewRat(1, 1)), guard)
	case "hermite":
		for k := 0; k < n; k++ {
			al[k] = new(big.Rat)
			be[k] = big.NewRat(int64(k), 2)
		}
		mass = precision.Sqrt(precision.Pi(guard))
	default:
		a, b := f.JacobiExponents()
		mass = jacobiMass(a, b, guard)
		lo, hi := f.Interval.Lo.Value, f.Interval.Hi.Value
		h := new(big.Rat).Quo(new(big.Rat).Sub(hi, lo), big.NewRat(2, 1))
		mass.Mul(mass, new(big.Float).SetPrec(guard).SetRat(h))
		return jacobiRecurrence(a, b, lo, hi, mass, n, prec), nil
	}
	r := &Recurrence{Alpha: make([]*big.Float, n), Beta: make([]*big.Float, n)}
	for k := 0; k < n; k++ {
		r.Alpha[k] = new(big.Float).SetPrec(prec).SetRat(al[k])
		if k == 0 {
			r.Beta[k] = new(big.Float).SetPrec(prec).Set(mass)
		} else {
			r.Beta[k] = new(big.Float).SetPrec(prec).SetRat(be[k])
		}
	}
	return r, nil
}

// jacobiPairs fills al[k] and be[k] (k >= 1) with the exact monic Jacobi
// coefficients on [-1, 1]; be[0] is set to zero.
func jacobiPairs(a, b *big.Rat, al, be []*big.Rat) {
	one, two, four := big.NewRat(1, 1), big.NewRat(2, 1), big.NewRat(4, 1)
	ab := new(big.Rat).Add(a, b)
	b2a2 := new(big.Rat).Sub(new(big.Rat).Mul(b, b), new(big.Rat).Mul(a, a))
	for k := range al {
		kk := big.NewRat(int64(k), 1)
		s := new(big.Rat).Add(new(big.Rat).Mul(two, kk), ab) // 2k+a+b
		switch k {
		case 0:
			al[0] = new(big.Rat).Quo(new(big.Rat).Sub(b, a), new(big.Rat).Add(ab, two))
			be[0] = new(big.Rat)
			continue
		default:
			al[k] = new(big.Rat).Quo(b2a2, new(big.Rat).Mul(s, new(big.Rat).Add(s, two)))
		}
		if k == 1 {
			num := new(big.Rat).Mul(four, new(big.Rat).Mul(new(big.Rat).Add(one, a), new(big.Rat).Add(one, b)))
			d := new(big.Rat).Add(ab, two)
			den := new(big.Rat).Mul(new(big.Rat).Mul(d, d), new(big.Rat).Add(ab, big.NewRat(3, 1)))
			be[1] = num.Quo(num, den)
			continue
		}
		num := new(big.Rat).Mul(four, kk)
		num.Mul(num, new(big.Rat).Add(kk, a))
		num.Mul(num, new(big.Rat).Add(kk, b))
		num.Mul(num, new(big.Rat).Add(kk, ab))
		den := new(big.Rat).Mul(s, s)
		den.Mul(den, new(big.Rat).Add(s, one))
		den.Mul(den, new(big.Rat).Sub(s, one))
		be[k] = num.Quo(num, den)
	}
}

// jacobiMass is 2^(a+b+1) Gamma(a+1) Gamma(b+1) / Gamma(a+b+2) at prec bits.
func jacobiMass(a, b *big.Rat, prec uint) *big.Float {
	one := big.NewRat(1, 1)
	ga := precision.GammaRat(new(big.Rat).Add(a, one), prec)
	gb := precision.GammaRat(new(big.Rat).Add(b, one), prec)
	ab1 := new(big.Rat).Add(new(big.Rat).Add(a, b), one)
	gab := precision.GammaRat(new(big.Rat).Add(ab1, one), prec)
	p := precision.Pow(new(big.Float).SetPrec(prec).SetInt64(2), new(big.Float).SetPrec(prec).SetRat(ab1))
	m := new(big.Float).SetPrec(prec).Mul(ga, gb)
	m.Mul(m, p)
	return m.Quo(m, gab)
}
