package design

import (
	"math"

	"quadwright/precision"
)

// The right-hand sides B_j of the exactness test in float64 with separate
// exponents. B_j is the scale the tolerance is measured in, so float64's 53
// bits (a relative 2^-40 or better after 10^4 recurrence steps) are far
// more than it needs, and keeping the exponents apart lets the monic
// polynomials' values, which shrink or grow geometrically with the degree,
// stay far from float64's range limits.

// scaled is f 2^e.
type scaled struct {
	f float64
	e int64
}

// pow2 returns 2^k for -1022 <= k <= 1023 exactly, and 0 below that range.
func pow2(k int64) float64 {
	if k < -1022 {
		return 0
	}
	return math.Float64frombits(uint64(k+1023) << 52)
}

// add adds t 2^e (t >= 0) to b. A term below 2^-1000 of the sum is dropped,
// which can only make B_j smaller, so the test stricter.
func (b *scaled) add(t float64, e int64) {
	switch {
	case t == 0:
	case b.f == 0:
		b.f, b.e = t, e
	case e > b.e:
		if e-b.e > 1000 {
			b.f, b.e = t, e
			return
		}
		b.f = b.f*pow2(b.e-e) + t
		b.e = e
	default:
		b.f += t * pow2(e-b.e)
	}
	if b.f > 0x1p500 {
		b.f *= 0x1p-500
		b.e += 500
	}
}

// real returns b as a Real at boundPrec bits.
func (b *scaled) real() *precision.Real {
	r := precision.NewReal(boundPrec).SetFloat64(b.f)
	return r.MulPow2(r, int(b.e))
}

// floatCoeffs returns the values as float64, or false when one is not a
// normal float64 of moderate size (the float chain then is not used).
func floatCoeffs(vs []*precision.Real) ([]float64, bool) {
	out := make([]float64, len(vs))
	for i, v := range vs {
		if v.IsZero() {
			continue
		}
		if e := v.Exponent(); e > 500 || e < -500 {
			return nil, false
		}
		m, e := v.MantExp()
		out[i] = m * pow2(e)
	}
	return out, true
}

// derivChain runs a derivative of the recurrence, d_k+1 = t_k d_k -
// b_k d_k-1 + p_k, in float64 scaled by a running exponent E (the true
// values are d 2^E), p_k coming from the full-precision chain.
type derivChain struct {
	d0, d1 float64
	E      int64
}

func (c *derivChain) reset() { c.d0, c.d1, c.E = 0, 0, 0 }

// scaledP returns p 2^-E as a float64, first moving E to the larger
// exponent of p and d_k when either has strayed 400 binades from it (a d
// far below p then loses its low digits or vanishes, which only matters
// to B_j at float64's rounding level).
func (c *derivChain) scaledP(p *precision.Real) float64 {
	m, e := p.MantExp()
	ad := math.Abs(c.d1)
	if (m != 0 && (e-c.E > 400 || e-c.E < -400)) || ad > 0x1p400 || (ad != 0 && ad < 0x1p-400) {
		top := c.E + int64(math.Logb(ad))
		if ad == 0 || (m != 0 && e > top) {
			top = e
		}
		if m != 0 || ad != 0 {
			c.rescale(top)
		}
	}
	if m == 0 || e-c.E < -1022 {
		return 0
	}
	return m * pow2(e-c.E)
}

func (c *derivChain) rescale(E int64) {
	s := E - c.E
	switch {
	case s > 2000:
		c.d0, c.d1 = 0, 0
	case s < -2000:
		// unreachable: E moves down only to d's own exponent
	default:
		c.d0 = math.Ldexp(c.d0, int(-s))
		c.d1 = math.Ldexp(c.d1, int(-s))
	}
	c.E = E
}

// step advances to d_k+1 with t = t_k, b = b_k and pk = p_k 2^-E.
func (c *derivChain) step(t, b, pk float64) {
	c.d0, c.d1 = c.d1, t*c.d1-b*c.d0+pk
}
