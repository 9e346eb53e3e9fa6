package fast

import (
	"math"
	"sync"

	"quadwright/precision"
)

var (
	piOnce         sync.Once
	ddPi, ddHalfPi dd
)

func buildPi() {
	ddPi = splitDDc(precision.Pi(constPrec))
	ddHalfPi = dd{ddPi.hi / 2, ddPi.lo / 2}
}

// ddAsin returns asin s for 0 <= s <= 0.71 (so that the angle is at most
// pi/4 and ddSinCos applies): the float64 arcsine and one Newton
// correction, the error about that of ddSinCos (1e-21 relative).
func ddAsin(s dd) dd {
	y0 := math.Asin(s.hi)
	if y0 == 0 {
		return s
	}
	sn, cs := ddSinCos(ddF(y0))
	return ddAddFast(ddF(y0), ddF(-ddSub(sn, s).hi/cs.hi))
}

// ddAcos returns arccos t in [0, pi] for -1 <= t <= 1 as 2 asin(sqrt((1-t)/2))
// (t >= 0) or pi - 2 asin(sqrt((1+t)/2)), so that no digit of the angle
// is lost next to the ends, where 1 -/+ t is small.
func ddAcos(t dd) dd {
	piOnce.Do(buildPi)
	if t.hi >= 0 {
		s := ddSqrt(ddMulF(ddSub(ddF(1), t), 0.5))
		a := ddAsin(s)
		return dd{2 * a.hi, 2 * a.lo}
	}
	s := ddSqrt(ddMulF(ddAdd(ddF(1), t), 0.5))
	a := ddAsin(s)
	return ddSub(ddPi, dd{2 * a.hi, 2 * a.lo})
}

// ddCosSin returns cos y and sin y for any y of moderate size (|y| below
// about 2^50): y = q pi/2 + r with |r| <= pi/4, r formed in double-double
// (so that y up to 10^8 keeps about 1e-24 of absolute accuracy), then
// ddSinCos of |r| and the quadrant.
func ddCosSin(y dd) (c, s dd) {
	piOnce.Do(buildPi)
	q := math.Floor(y.hi/ddHalfPi.hi + 0.5)
	r := ddSub(y, ddMulF(ddHalfPi, q))
	neg := r.hi < 0
	if neg {
		r = ddNeg(r)
	}
	s, c = ddSinCos(r)
	if neg {
		s = ddNeg(s)
	}
	switch int64(q) & 3 {
	case 1:
		c, s = ddNeg(s), c
	case 2:
		c, s = ddNeg(c), ddNeg(s)
	case 3:
		c, s = s, ddNeg(c)
	}
	return c, s
}
