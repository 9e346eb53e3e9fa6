package precision

import (
	"math"
	"math/big"
)

// Multi-float arithmetic: a number is an unevaluated sum of float64 terms
// of decreasing magnitude, each term below half an ulp of the one before,
// built from the error-free transformations two-sum (Knuth) and two-product
// (one fused multiply-add). DD (two terms) carries about 106 bits and QD
// (four terms) about 212; every operation's relative error is stated at
// the operation. These are for hot loops at up to about 60 decimal digits,
// where a Real spends most of its time on bookkeeping; there is no
// exponent beyond float64's, so callers keep their values within float64
// range (about 1e-290 to 1e300, leaving room for the error terms).
//
// References: T. J. Dekker, "A floating-point technique for extending the
// available precision", Numer. Math. 18 (1971) 224-242; Y. Hida, X. S. Li
// and D. H. Bailey, "Algorithms for quad-double precision floating point
// arithmetic", Proc. 15th IEEE Symposium on Computer Arithmetic (2001).

// twoSum returns s = fl(a+b) and the exact error e = a+b-s.
func twoSum(a, b float64) (s, e float64) {
	s = a + b
	bb := s - a
	return s, (a - (s - bb)) + (b - bb)
}

// quickTwoSum is twoSum for |a| >= |b| (or a == 0).
func quickTwoSum(a, b float64) (s, e float64) {
	s = a + b
	return s, b - (s - a)
}

// twoProd returns p = fl(a*b) and the exact error e = a*b-p.
func twoProd(a, b float64) (p, e float64) {
	p = a * b
	return p, math.FMA(a, b, -p)
}

// DD is the double-double Hi + Lo with |Lo| <= ulp(Hi)/2.
type DD struct{ Hi, Lo float64 }

// DDFrom returns v as a DD (exact).
func DDFrom(v float64) DD { return DD{v, 0} }

// Add returns x+y with a relative error below 2^-104 (the accurate
// double-double sum: both pairs of terms are added error-free).
func (x DD) Add(y DD) DD {
	s, e := twoSum(x.Hi, y.Hi)
	t, f := twoSum(x.Lo, y.Lo)
	e += t
	s, e = quickTwoSum(s, e)
	e += f
	s, e = quickTwoSum(s, e)
	return DD{s, e}
}

// AddFast returns x+y with an error below 2^-104 (|x| + |y|): the sloppy
// double-double sum, whose error is relative to the operands rather than
// to the result (what a forward error analysis of a recurrence uses); it
// is small enough to be inlined in hot loops.
func (x DD) AddFast(y DD) DD {
	s, e := twoSum(x.Hi, y.Hi)
	e += x.Lo + y.Lo
	s, e = quickTwoSum(s, e)
	return DD{s, e}
}

// SubFast returns x-y as x.AddFast(y.Neg()).
func (x DD) SubFast(y DD) DD { return x.AddFast(DD{-y.Hi, -y.Lo}) }

// Neg returns -x (exact).
func (x DD) Neg() DD { return DD{-x.Hi, -x.Lo} }

// Sub returns x-y as x.Add(y.Neg()).
func (x DD) Sub(y DD) DD { return x.Add(DD{-y.Hi, -y.Lo}) }

// Mul returns x*y with a relative error below 2^-102.
func (x DD) Mul(y DD) DD {
	p, e := twoProd(x.Hi, y.Hi)
	e += x.Hi*y.Lo + x.Lo*y.Hi
	p, e = quickTwoSum(p, e)
	return DD{p, e}
}

// MulFloat returns x*v with a relative error below 2^-103.
func (x DD) MulFloat(v float64) DD {
	p, e := twoProd(x.Hi, v)
	e = math.FMA(x.Lo, v, e)
	p, e = quickTwoSum(p, e)
	return DD{p, e}
}

// Quo returns x/y (y != 0) with a relative error below 2^-100: a float64
// quotient and two corrections.
func (x DD) Quo(y DD) DD {
	q1 := x.Hi / y.Hi
	r := x.Sub(y.MulFloat(q1))
	q2 := r.Hi / y.Hi
	r = r.Sub(y.MulFloat(q2))
	q3 := r.Hi / y.Hi
	q1, q2 = quickTwoSum(q1, q2)
	return DD{q1, q2}.Add(DD{q3, 0})
}

// Sqrt returns the square root of x >= 0 with a relative error below
// 2^-100 (one Newton step on the float64 root).
func (x DD) Sqrt() DD {
	if x.Hi <= 0 {
		return DD{}
	}
	s := math.Sqrt(x.Hi)
	p, e := twoProd(s, s)
	r := x.Sub(DD{p, e})
	hi, lo := quickTwoSum(s, r.Hi/(2*s))
	return DD{hi, lo}
}

// Float64 returns the float64 nearest to x, about (Hi + Lo rounded once).
func (x DD) Float64() float64 { return x.Hi + x.Lo }

// QD is the quad-double X0 + X1 + X2 + X3, each term below half an
// ulp of the one before (after every operation here).
type QD struct{ X0, X1, X2, X3 float64 }

// QDFrom returns v as a QD (exact).
func QDFrom(v float64) QD { return QD{v, 0, 0, 0} }

// QDFromDD returns x as a QD (exact).
func QDFromDD(x DD) QD { return QD{x.Hi, x.Lo, 0, 0} }

// DD returns the leading two terms of x, renormalised (a relative error
// below 2^-105).
func (x QD) DD() DD {
	s, e := quickTwoSum(x.X0, x.X1+x.X2)
	return DD{s, e}
}

// Float64 returns X0, within half an ulp of x.
func (x QD) Float64() float64 { return x.X0 }

// Neg returns -x (exact).
func (x QD) Neg() QD { return QD{-x.X0, -x.X1, -x.X2, -x.X3} }

func threeSum(a, b, c float64) (float64, float64, float64) {
	t1, t2 := twoSum(a, b)
	a, t3 := twoSum(c, t1)
	b, c = twoSum(t2, t3)
	return a, b, c
}

func threeSum2(a, b, c float64) (float64, float64) {
	t1, t2 := twoSum(a, b)
	a, t3 := twoSum(c, t1)
	return a, t2 + t3
}

// renorm turns the five overlapping terms c0..c4 (of roughly decreasing
// magnitude) into four non-overlapping ones (Hida, Li and Bailey 2001).
func renorm(c0, c1, c2, c3, c4 float64) QD {
	var s0, s1, s2, s3 float64
	s0, c4 = quickTwoSum(c3, c4)
	s0, c3 = quickTwoSum(c2, s0)
	s0, c2 = quickTwoSum(c1, s0)
	c0, c1 = quickTwoSum(c0, s0)
	s0, s1 = c0, c1
	if s1 != 0 {
		s1, s2 = quickTwoSum(s1, c2)
		if s2 != 0 {
			s2, s3 = quickTwoSum(s2, c3)
			if s3 != 0 {
				s3 += c4
			} else {
				s2, s3 = quickTwoSum(s2, c4)
			}
		} else {
			s1, s2 = quickTwoSum(s1, c3)
			if s2 != 0 {
				s2, s3 = quickTwoSum(s2, c4)
			} else {
				s1, s2 = quickTwoSum(s1, c4)
			}
		}
	} else {
		s0, s1 = quickTwoSum(s0, c2)
		if s1 != 0 {
			s1, s2 = quickTwoSum(s1, c3)
			if s2 != 0 {
				s2, s3 = quickTwoSum(s2, c4)
			} else {
				s1, s2 = quickTwoSum(s1, c4)
			}
		} else {
			s0, s1 = quickTwoSum(s0, c3)
			if s1 != 0 {
				s1, s2 = quickTwoSum(s1, c4)
			} else {
				s0, s1 = quickTwoSum(s0, c4)
			}
		}
	}
	return QD{s0, s1, s2, s3}
}

// Add returns x+y with an error below 2^-208 (|x| + |y|) (the sloppy
// quad-double sum of Hida, Li and Bailey: an error bound relative to the
// operands, not to the result, which is what a forward error analysis of a
// recurrence uses).
func (x QD) Add(y QD) QD {
	s0, t0 := twoSum(x.X0, y.X0)
	s1, t1 := twoSum(x.X1, y.X1)
	s2, t2 := twoSum(x.X2, y.X2)
	s3, t3 := twoSum(x.X3, y.X3)
	s1, t0 = twoSum(s1, t0)
	s2, t0, t1 = threeSum(s2, t0, t1)
	s3, t0 = threeSum2(s3, t0, t2)
	t0 = t0 + t1 + t3
	return renorm(s0, s1, s2, s3, t0)
}

// Sub returns x-y as x.Add(y.Neg()).
func (x QD) Sub(y QD) QD { return x.Add(y.Neg()) }

// Mul returns x*y with a relative error below 2^-206 (the sloppy
// quad-double product: the terms of order 2^-212 and below are summed in
// float64).
func (x QD) Mul(y QD) QD {
	p0, q0 := twoProd(x.X0, y.X0)
	p1, q1 := twoProd(x.X0, y.X1)
	p2, q2 := twoProd(x.X1, y.X0)
	p3, q3 := twoProd(x.X0, y.X2)
	p4, q4 := twoProd(x.X1, y.X1)
	p5, q5 := twoProd(x.X2, y.X0)
	p1, p2, q0 = threeSum(p1, p2, q0)
	p2, q1, q2 = threeSum(p2, q1, q2)
	p3, p4, p5 = threeSum(p3, p4, p5)
	s0, t0 := twoSum(p2, p3)
	s1, t1 := twoSum(q1, p4)
	s2 := q2 + p5
	s1, t0 = twoSum(s1, t0)
	s2 += t0 + t1
	s1 += x.X0*y.X3 + x.X1*y.X2 + x.X2*y.X1 + x.X3*y.X0 + q0 + q3 + q4 + q5
	return renorm(p0, p1, s0, s1, s2)
}

// MulFloat returns x*v with a relative error below 2^-207.
func (x QD) MulFloat(v float64) QD {
	p0, q0 := twoProd(x.X0, v)
	p1, q1 := twoProd(x.X1, v)
	p2, q2 := twoProd(x.X2, v)
	p3 := x.X3 * v
	s1, s2 := twoSum(q0, p1)
	s2, q1, p2 = threeSum(s2, q1, p2)
	q1, q2 = threeSum2(q1, q2, p3)
	return renorm(p0, s1, s2, q1, q2+p2)
}

// Quo returns x/y (y != 0) with a relative error below 2^-204: long
// division by float64 quotients (Hida, Li and Bailey 2001).
func (x QD) Quo(y QD) QD {
	q0 := x.X0 / y.X0
	r := x.Sub(y.MulFloat(q0))
	q1 := r.X0 / y.X0
	r = r.Sub(y.MulFloat(q1))
	q2 := r.X0 / y.X0
	r = r.Sub(y.MulFloat(q2))
	q3 := r.X0 / y.X0
	r = r.Sub(y.MulFloat(q3))
	q4 := r.X0 / y.X0
	return renorm(q0, q1, q2, q3, q4)
}

// Sqrt returns the square root of x >= 0 with a relative error below
// 2^-202: Newton's iteration for 1/sqrt(x) from the float64 value, at
// rising precision, then multiplied out.
func (x QD) Sqrt() QD {
	if x.X0 <= 0 {
		return QD{}
	}
	r := QDFrom(1 / math.Sqrt(x.X0))
	h := x.MulFloat(0.5)
	for i := 0; i < 3; i++ {
		// r += r (1/2 - h r^2)
		t := h.Mul(r.Mul(r))
		t = QDFrom(0.5).Sub(t)
		r = r.Add(r.Mul(t))
	}
	return x.Mul(r)
}

// SetQD sets z to the sum of x's terms rounded to z's precision (256 bits
// when z's precision is 0, which holds a renormalised QD exactly unless its
// terms straddle a gap of zero bits) and returns z.
func SetQD(z *big.Float, x QD) *big.Float {
	if z.Prec() == 0 {
		z.SetPrec(256)
	}
	t := new(big.Float).SetPrec(z.Prec())
	z.SetFloat64(x.X0)
	for _, v := range [3]float64{x.X1, x.X2, x.X3} {
		if v != 0 {
			z.Add(z, t.SetFloat64(v))
		}
	}
	return z
}

// QDFromBig returns the QD nearest to x, to within 2^-210 |x| (greedy:
// each term is the float64 nearest to what the terms before left over; x
// must lie within float64 range).
func QDFromBig(x *big.Float) QD {
	r := new(big.Float).SetPrec(max(x.Prec(), 64)).Set(x)
	t := new(big.Float)
	var v [4]float64
	for i := range v {
		v[i], _ = r.Float64()
		if v[i] == 0 {
			break
		}
		r.Sub(r, t.SetFloat64(v[i]))
	}
	return renorm(v[0], v[1], v[2], v[3], 0)
}

// DDFromBig returns the DD nearest to x, to within 2^-105 |x|.
func DDFromBig(x *big.Float) DD {
	q := QDFromBig(x)
	return q.DD()
}
