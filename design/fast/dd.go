package fast

import "math"

// dd is a double-double number hi + lo with |lo| <= ulp(hi)/2, carrying
// about 106 bits (Dekker, "A floating-point technique for extending the
// available precision", Numer. Math. 18, 1971). The operations below are the
// standard error-free transformations (two-sum, FMA two-product); each
// result carries a relative error of a few units of 2^-104.
type dd struct{ hi, lo float64 }

func twoSum(a, b float64) dd {
	s := a + b
	bb := s - a
	return dd{s, (a - (s - bb)) + (b - bb)}
}

func quickTwoSum(a, b float64) dd {
	s := a + b
	return dd{s, b - (s - a)}
}

func twoProd(a, b float64) dd {
	p := a * b
	return dd{p, math.FMA(a, b, -p)}
}

func ddAdd(a, b dd) dd {
	s := twoSum(a.hi, b.hi)
	t := twoSum(a.lo, b.lo)
	s.lo += t.hi
	s = quickTwoSum(s.hi, s.lo)
	s.lo += t.lo
	return quickTwoSum(s.hi, s.lo)
}

func ddNeg(a dd) dd { return dd{-a.hi, -a.lo} }

func ddSub(a, b dd) dd { return ddAdd(a, ddNeg(b)) }

func ddMul(a, b dd) dd {
	p := twoProd(a.hi, b.hi)
	p.lo += a.hi*b.lo + a.lo*b.hi
	return quickTwoSum(p.hi, p.lo)
}

func ddMulF(a dd, b float64) dd {
	p := twoProd(a.hi, b)
	p.lo += a.lo * b
	return quickTwoSum(p.hi, p.lo)
}

func ddDiv(a, b dd) dd {
	q1 := a.hi / b.hi
	r := ddSub(a, ddMulF(b, q1))
	q2 := r.hi / b.hi
	r = ddSub(r, ddMulF(b, q2))
	q3 := r.hi / b.hi
	q := quickTwoSum(q1, q2)
	return ddAdd(q, dd{q3, 0})
}

func ddF(a float64) dd { return dd{a, 0} }

func (a dd) float() float64 { return a.hi + a.lo }
