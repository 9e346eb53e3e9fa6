package moments

import (
	"math"
	"math/big"

	"quadwright/precision"
)

// xfloat is a nonnegative m * 2^e with a float64 m in [1/2, 1) (or m = 0):
// the 53-bit accuracy of a float64 with an exponent range wide enough for
// the scales of high-degree moments (2^-4000 and below), used for error
// estimates and tolerances, where a few correct digits are all that
// matters.
type xfloat struct {
	m float64
	e int64
}

func xfNorm(m float64, e int64) xfloat {
	if m == 0 {
		return xfloat{}
	}
	f, k := math.Frexp(m)
	return xfloat{f, e + int64(k)}
}

// xfPow2 is 2^e.
func xfPow2(e int64) xfloat { return xfloat{0.5, e + 1} }

func xfBig(x *big.Float) xfloat {
	if x.Sign() == 0 {
		return xfloat{}
	}
	mant := new(big.Float)
	e := x.MantExp(mant)
	f, _ := mant.Float64()
	return xfNorm(math.Abs(f), int64(e))
}

func xfReal(x *precision.Real) xfloat {
	if x.IsZero() {
		return xfloat{}
	}
	return xfBig(x.Big(nil))
}

func (a xfloat) add(b xfloat) xfloat {
	if a.m == 0 {
		return b
	}
	if b.m == 0 {
		return a
	}
	if a.e < b.e {
		a, b = b, a
	}
	d := a.e - b.e
	if d > 1100 {
		return a
	}
	return xfNorm(a.m+math.Ldexp(b.m, -int(d)), a.e)
}

func (a xfloat) mul(b xfloat) xfloat { return xfNorm(a.m*b.m, a.e+b.e) }

func (a xfloat) scale(f float64) xfloat { return xfNorm(a.m*f, a.e) }

// cmp compares a and b, both nonnegative.
func (a xfloat) cmp(b xfloat) int {
	switch {
	case a.m == 0 && b.m == 0:
		return 0
	case a.m == 0:
		return -1
	case b.m == 0:
		return 1
	case a.e != b.e:
		if a.e < b.e {
			return -1
		}
		return 1
	case a.m < b.m:
		return -1
	case a.m > b.m:
		return 1
	}
	return 0
}

// big returns a at prec bits.
func (a xfloat) big(prec uint) *big.Float {
	r := new(big.Float).SetPrec(prec).SetFloat64(a.m)
	if a.m == 0 {
		return r
	}
	return r.SetMantExp(r, int(a.e))
}

// xfPow10 is 10^-d to 53 bits.
func xfPow10(d int) xfloat {
	t := new(big.Float).SetPrec(64).SetInt64(10)
	p := new(big.Float).SetPrec(64).SetInt64(1)
	for i := 0; i < d; i++ {
		p.Quo(p, t)
	}
	return xfBig(p)
}
