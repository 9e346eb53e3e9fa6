package moments

import (
	"fmt"
	"math/big"
)

// Basis is a family of monic polynomials q_0, q_1, ... in x, given by its
// three-term recurrence with exact rational coefficients:
//
//	q_{-1} = 0, q_0 = 1, q_{k+1}(x) = (x - A(k)) q_k(x) - B(k) q_{k-1}(x),
//
// so that B(0) never matters (it is 0 for every basis here). Moments of a
// weight in such a basis, m_k = integral of q_k w, are the modified moments
// of the modified Chebyshev algorithm (Gautschi, "On generating orthogonal
// polynomials", SIAM J. Sci. Stat. Comput. 3, 1982), which are far better
// conditioned than the monomial ones when the basis is orthogonal for a
// weight close to w on the same interval.
//
// A and B return a new value on every call; the caller may keep or change it.
type Basis struct {
	Name string // "monomial", "legendre", "chebyshev", "laguerre", "hermite"
	A, B func(k int) *big.Rat
}

// MonomialBasis is q_k = x^k (A = B = 0): the raw moments of a moment file.
func MonomialBasis() Basis {
	zero := func(int) *big.Rat { return new(big.Rat) }
	return Basis{Name: "monomial", A: zero, B: zero}
}

// affineParams returns the centre c = (a+b)/2 and the square h^2 of the
// half-length of the finite interval iv; an infinite end panics.
func affineParams(iv Interval, name string) (c, h2 *big.Rat) {
	if !iv.Finite() {
		panic(fmt.Sprintf("moments: %s basis on the infinite interval %s", name, iv))
	}
	c = new(big.Rat).Add(iv.Lo.Value, iv.Hi.Value)
	c.Quo(c, big.NewRat(2, 1))
	h := new(big.Rat).Sub(iv.Hi.Value, iv.Lo.Value)
	h.Quo(h, big.NewRat(2, 1))
	return c, h.Mul(h, h)
}

// LegendreBasis is the monic Legendre polynomials mapped onto the finite
// interval iv = [a, b]: with t = (x - c)/h, c = (a+b)/2, h = (b-a)/2,
// q_k(x) = h^k P~_k(t), where P~_{k+1} = t P~_k - k^2/(4k^2-1) P~_{k-1}
// (Abramowitz and Stegun 22.7.10, made monic); so A(k) = c and
// B(k) = h^2 k^2/(4k^2-1). An infinite end panics.
func LegendreBasis(iv Interval) Basis {
	c, h2 := affineParams(iv, "legendre")
	return Basis{
		Name: "legendre",
		A:    func(int) *big.Rat { return new(big.Rat).Set(c) },
		B: func(k int) *big.Rat {
			kk := int64(k) * int64(k)
			r := big.NewRat(kk, 4*kk-1)
			return r.Mul(r, h2)
		},
	}
}

// ChebyshevBasis is the monic Chebyshev polynomials of the first kind mapped
// onto the finite interval iv as in LegendreBasis: T~_0 = 1, T~_k =
// 2^(1-k) T_k, with T~_2 = t T~_1 - 1/2 T~_0 and T~_{k+1} = t T~_k - 1/4
// T~_{k-1} for k >= 2 (from T_{k+1} = 2t T_k - T_{k-1}, Abramowitz and
// Stegun 22.7.4); so A(k) = c, B(1) = h^2/2, B(k) = h^2/4 for k >= 2. An
// infinite end panics.
func ChebyshevBasis(iv Interval) Basis {
	c, h2 := affineParams(iv, "chebyshev")
	return Basis{
		Name: "chebyshev",
		A:    func(int) *big.Rat { return new(big.Rat).Set(c) },
		B: func(k int) *big.Rat {
			switch {
			case k <= 0:
				return new(big.Rat)
			case k == 1:
				return new(big.Rat).Mul(h2, big.NewRat(1, 2))
			}
			return new(big.Rat).Mul(h2, big.NewRat(1, 4))
		},
	}
}

// LaguerreBasis is the monic Laguerre polynomials (parameter 0) shifted to
// [lo, inf): q_k(x) = (-1)^k k! L_k(x - lo), with A(k) = lo + 2k + 1 and
// B(k) = k^2 (Abramowitz and Stegun 22.7.12, made monic).
func LaguerreBasis(lo *big.Rat) Basis {
	lo = new(big.Rat).Set(lo)
	return Basis{
		Name: "laguerre",
		A:    func(k int) *big.Rat { return new(big.Rat).Add(lo, big.NewRat(2*int64(k)+1, 1)) },
		B:    func(k int) *big.Rat { return big.NewRat(int64(k)*int64(k), 1) },
	}
}

// mirroredLaguerreBasis is LaguerreBasis reflected onto (-inf, hi]:
// q_k(x) = (-1)^k L~_k(hi - x), monic in x, with A(k) = hi - 2k - 1 and
// B(k) = k^2.
func mirroredLaguerreBasis(hi *big.Rat) Basis {
	hi = new(big.Rat).Set(hi)
	return Basis{
		Name: "laguerre",
		A:    func(k int) *big.Rat { return new(big.Rat).Sub(hi, big.NewRat(2*int64(k)+1, 1)) },
		B:    func(k int) *big.Rat { return big.NewRat(int64(k)*int64(k), 1) },
	}
}

// HermiteBasis is the monic Hermite polynomials for the weight e^(-x^2) on
// (-inf, inf): A(k) = 0, B(k) = k/2 (Abramowitz and Stegun 22.7.13, made
// monic).
func HermiteBasis() Basis {
	return Basis{
		Name: "hermite",
		A:    func(int) *big.Rat { return new(big.Rat) },
		B:    func(k int) *big.Rat { return big.NewRat(int64(k), 2) },
	}
}

// DefaultBasis is the basis for the modified Chebyshev algorithm on iv:
// Legendre mapped onto a finite interval, Laguerre shifted to [a, inf)
// (reflected for (-inf, b]), Hermite on (-inf, inf).
func DefaultBasis(iv Interval) Basis {
	switch {
	case iv.Finite():
		return LegendreBasis(iv)
	case iv.Lo.Finite():
		return LaguerreBasis(iv.Lo.Value)
	case iv.Hi.Finite():
		return mirroredLaguerreBasis(iv.Hi.Value)
	}
	return HermiteBasis()
}
