package design

import (
	"math/big"
)

// jacobiRecurrence is the default branch of FamilySource.Recurrence
// (Jacobi on [lo, hi]) without rational arithmetic in the loop: with
// a = A/L and b = B/L over a common denominator L and s = L (2k+a+b), the
// closed forms of jacobiPairs become quotients of integers,
//
//	alpha_k = (B^2 - A^2) / (s (s + 2L)),
//	beta_k  = 4k L (kL + A)(kL + B)(kL + A + B) / (s^2 (s + L)(s - L)),   k >= 2,
//
// and the map to [lo, hi] (alpha -> c + h alpha, beta -> h^2 beta) keeps
// them so. Each value is one correctly rounded quotient of two exact
// integers, the same number SetRat gives for the reduced fraction, without
// the greatest common divisors that every big.Rat operation computes. The
// pairs k < 2 (special forms) come from jacobiPairs. mass is beta_0.
func jacobiRecurrence(a, b, lo, hi *big.Rat, mass *big.Float, n int, prec uint) *Recurrence {
	r := &Recurrence{Alpha: make([]*big.Float, n), Beta: make([]*big.Float, n)}
	c := new(big.Rat).Quo(new(big.Rat).Add(lo, hi), big.NewRat(2, 1))
	h := new(big.Rat).Quo(new(big.Rat).Sub(hi, lo), big.NewRat(2, 1))
	h2 := new(big.Rat).Mul(h, h)
	k0 := min(n, 2)
	al := make([]*big.Rat, k0)
	be := make([]*big.Rat, k0)
	jacobiPairs(a, b, al, be)
	for k := 0; k < k0; k++ {
		al[k].Add(c, al[k].Mul(h, al[k]))
		r.Alpha[k] = new(big.Float).SetPrec(prec).SetRat(al[k])
		if k == 0 {
			r.Beta[0] = new(big.Float).SetPrec(prec).Set(mass)
		} else {
			r.Beta[k] = new(big.Float).SetPrec(prec).SetRat(be[k].Mul(h2, be[k]))
		}
	}
	if n <= 2 {
		return r
	}
	L := new(big.Int).Mul(a.Denom(), b.Denom())
	A := new(big.Int).Mul(a.Num(), b.Denom())
	B := new(big.Int).Mul(b.Num(), a.Denom())
	AB := new(big.Int).Add(A, B)
	diff := new(big.Int).Sub(new(big.Int).Mul(B, B), new(big.Int).Mul(A, A)) // B^2 - A^2
	cn, cd, hn, hd := c.Num(), c.Denom(), h.Num(), h.Denom()
	hn2 := new(big.Int).Mul(hn, hn)
	hd2 := new(big.Int).Mul(hd, hd)
	L2 := new(big.Int).Lsh(L, 1)
	var kk, kL, s, t, u, num, den big.Int
	fn, fd := new(big.Float), new(big.Float)
	quo := func(num, den *big.Int) *big.Float {
		fn.SetPrec(0).SetInt(num) // exact: precision = bit length
		fd.SetPrec(0).SetInt(den)
		return new(big.Float).SetPrec(prec).Quo(fn, fd)
	}
	for k := 2; k < n; k++ {
		kk.SetInt64(int64(k))
		kL.Mul(&kk, L)
		s.Lsh(&kL, 1)
		s.Add(&s, AB) // L (2k + a + b)
		// alpha: c + h diff/(s (s+2L)) = (cn hd Q + hn cd diff) / (cd hd Q)
		t.Add(&s, L2)
		t.Mul(&t, &s) // Q
		num.Mul(cn, hd)
		num.Mul(&num, &t)
		u.Mul(hn, cd)
		u.Mul(&u, diff)
		num.Add(&num, &u)
		den.Mul(cd, hd)
		den.Mul(&den, &t)
		r.Alpha[k] = quo(&num, &den)
		// beta: h^2 4k L (kL+A)(kL+B)(kL+A+B) / (s^2 (s+L)(s-L))
		num.Lsh(&kk, 2)
		num.Mul(&num, L)
		u.Add(&kL, A)
		num.Mul(&num, &u)
		u.Add(&kL, B)
		num.Mul(&num, &u)
		u.Add(&kL, AB)
		num.Mul(&num, &u)
		num.Mul(&num, hn2)
		den.Mul(&s, &s)
		u.Add(&s, L)
		den.Mul(&den, &u)
		u.Sub(&s, L)
		den.Mul(&den, &u)
		den.Mul(&den, hd2)
		r.Beta[k] = quo(&num, &den)
	}
	return r
}
