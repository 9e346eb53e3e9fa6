package precision

import (
	"math"
	"math/big"
	"sync"

	"github.com/ALTree/bigfloat"
)

// guardBits is the number of bits added to the precision of a result for
// its internal computation. Rounding a value known within 2^40 ulp at
// prec+guardBits bits to prec bits errs by at most 1/2 + 2^-24 ulp, and
// that is the "within 1 ulp" promised by the functions of this file.
const guardBits = 64

// expLimit bounds |x| for Exp: e^x with x >= expLimit overflows the binary
// exponent range of big.Float (2^(2^31-1) = e^1.4885e9).
const expLimit = 1.48e9

// resultPrec returns the largest precision of xs, or 64 when all are 0
// (as for a zero big.Float), the precision of a result computed from xs.
func resultPrec(xs ...*big.Float) uint {
	p := uint(0)
	for _, x := range xs {
		if x.Prec() > p {
			p = x.Prec()
		}
	}
	if p == 0 {
		p = 64
	}
	return p
}

// bigfloatGuard serialises the first call of bigfloat.Exp and bigfloat.Log
// at each new working precision: bigfloat keeps an unguarded package-level
// cache of pi that it overwrites whenever a call needs more precision than
// it holds. Calls at a precision no higher than one already completed only
// read that cache and may run in parallel.
var bigfloatGuard struct {
	sync.RWMutex
	done [2]uint // highest working precision completed, per function
}

const (
	bfExp = iota
	bfLog
)

func bigfloatCall(fn int, w uint, f func() *big.Float) *big.Float {
	g := &bigfloatGuard
	g.RLock()
	if w <= g.done[fn] {
		defer g.RUnlock()
		return f()
	}
	g.RUnlock()
	g.Lock()
	defer g.Unlock()
	r := f()
	if w > g.done[fn] {
		g.done[fn] = w
	}
	return r
}

// Exp returns e^x rounded to x.Prec() bits, within 1 ulp (ExpTo at that
// precision). If x >= 1.48e9 the result is +Inf and if x <= -1.48e9 it is 0
// (beyond big.Float's exponent range); Exp(±Inf) is +Inf or 0.
func Exp(x *big.Float) *big.Float { return ExpTo(x, resultPrec(x)) }

// expBigfloat is ExpTo by bigfloat: the argument is reduced exactly as
// x = k ln 2 + r, |r| <= ln(2)/2, with ln 2 carrying enough extra bits for
// |k|, and e^r is computed by bigfloat.Exp at guardBits extra bits.
func expBigfloat(x *big.Float, p uint) *big.Float {
	z := new(big.Float).SetPrec(p)
	if x.Sign() == 0 {
		return z.SetInt64(1)
	}
	if xf, _ := x.Float64(); xf >= expLimit || xf <= -expLimit {
		if x.Sign() > 0 {
			return z.SetInf(false)
		}
		return z
	}
	w := p + guardBits
	xf, _ := x.Float64()
	k := int64(math.Round(xf / math.Ln2))
	r := new(big.Float).SetPrec(w).Set(x)
	if k != 0 {
		wl := w + 40
		kl := new(big.Float).SetPrec(wl).SetInt64(k)
		kl.Mul(kl, Ln2(wl))
		r.SetPrec(wl).Sub(new(big.Float).SetPrec(wl).Set(x), kl)
		r.SetPrec(w)
	}
	e := bigfloatCall(bfExp, w, func() *big.Float { return bigfloat.Exp(r) })
	e.SetMantExp(e, int(k))
	return z.Set(e)
}

// Log returns the natural logarithm of x rounded to x.Prec() bits, within
// 1 ulp (LogTo at that precision). Log(1) = 0 exactly and Log(+Inf) = +Inf.
// x <= 0 panics (a programmer error: callers check their data before
// taking logarithms).
func Log(x *big.Float) *big.Float {
	if x.Sign() <= 0 {
		panic("precision: Log of a non-positive number")
	}
	p := resultPrec(x)
	if x.IsInf() {
		return new(big.Float).SetPrec(p).SetInf(false)
	}
	return LogTo(x, p)
}

// logBigfloat is LogTo by bigfloat.Log (the arithmetic-geometric mean) at
// guardBits extra bits plus as many bits as cancel when x is near 1.
func logBigfloat(x *big.Float, p uint) *big.Float {
	z := new(big.Float).SetPrec(p)
	w := p + guardBits
	d := new(big.Float).SetPrec(x.Prec()+2).Sub(x, big.NewFloat(1))
	if d.Sign() == 0 {
		return z
	}
	if e := d.MantExp(nil); e < 0 {
		w += uint(-e)
	}
	xw := new(big.Float).SetPrec(w).Set(x)
	l := bigfloatCall(bfLog, w, func() *big.Float { return bigfloat.Log(xw) })
	return z.Set(l)
}

// Pow returns x^y = e^(y ln x) rounded to the larger of x.Prec() and
// y.Prec() bits, within 1 ulp. y ln x is formed with as many extra bits as
// its magnitude has above 1, so that the exponential keeps the relative
// accuracy. x <= 0 panics (a programmer error). Pow(x, 0) = Pow(1, y) = 1;
// the result is +Inf or 0 when y ln x is beyond the range of Exp.
func Pow(x, y *big.Float) *big.Float {
	if x.Sign() <= 0 {
		panic("precision: Pow of a non-positive base")
	}
	p := resultPrec(x, y)
	one := big.NewFloat(1)
	if y.Sign() == 0 || x.Cmp(one) == 0 {
		return new(big.Float).SetPrec(p).SetInt64(1)
	}
	// |ln x| < 2^(bitlen(|exponent of x|)+1) for x away from 1, and
	// |ln x| <= 2|x-1| < 1 near 1.
	mag := y.MantExp(nil) + bitLen(x.MantExp(nil)) + 1
	w := p + guardBits
	if mag > 0 {
		w += uint(mag)
	}
	l := Log(new(big.Float).SetPrec(w).Set(x))
	l.Mul(l, y)
	return new(big.Float).SetPrec(p).Set(Exp(l))
}

// bitLen returns the number of bits of |e|.
func bitLen(e int) int {
	if e < 0 {
		e = -e
	}
	n := 0
	for ; e > 0; e >>= 1 {
		n++
	}
	return n
}

// Sqrt returns the square root of x correctly rounded (to nearest, ties to
// even) at x.Prec() bits: the integer square root of the significand,
// scaled to carry two extra bits and a sticky bit, is rounded once.
// Sqrt(+Inf) = +Inf; x < 0 panics (a programmer error).
func Sqrt(x *big.Float) *big.Float {
	return sqrtPrec(new(big.Float), x, resultPrec(x))
}

// sqrtPrec sets z to sqrt(x) correctly rounded at prec bits and returns z.
func sqrtPrec(z, x *big.Float, prec uint) *big.Float {
	z.SetPrec(prec)
	switch {
	case x.Sign() < 0:
		panic("precision: Sqrt of a negative number")
	case x.Sign() == 0:
		return z.SetInt64(0)
	case x.IsInf():
		return z.SetInf(false)
	}
	m, e := intMantExp(x)
	// Shift m so that e is even and isqrt(m) has at least prec+2 bits.
	s := 2*int(prec) + 4 - m.BitLen()
	if s < 0 {
		s = 0
	}
	if (e-s)%2 != 0 {
		s++
	}
	m.Lsh(m, uint(s))
	e -= s
	r := new(big.Int).Sqrt(m)
	half := e / 2
	if new(big.Int).Mul(r, r).Cmp(m) != 0 {
		r.Lsh(r, 1).SetBit(r, 0, 1)
		half--
	}
	z.SetInt(r)
	return z.SetMantExp(z, half)
}

// intMantExp returns an integer m >= 1 and an exponent e with
// |x| = m * 2^e exactly, for finite nonzero x.
func intMantExp(x *big.Float) (*big.Int, int) {
	mant := new(big.Float)
	exp := x.MantExp(mant)
	prec := int(mant.Prec())
	mant.SetMantExp(mant, prec).Abs(mant)
	m, _ := mant.Int(nil)
	return m, exp - prec
}

// Sin returns sin x rounded to x.Prec() bits, within 1 ulp, for any finite
// x (±Inf panics). See sinCos for the method.
func Sin(x *big.Float) *big.Float {
	s, _ := sinCos(x, true, false)
	return s
}

// Cos returns cos x rounded to x.Prec() bits, within 1 ulp, for any finite
// x (±Inf panics). See sinCos for the method.
func Cos(x *big.Float) *big.Float {
	_, c := sinCos(x, false, true)
	return c
}

// sinCos returns those of sin x and cos x that are asked for, at x.Prec()
// bits. The argument is reduced to r = x - k pi/2, |r| <= pi/4 (plus a
// rounding), with pi carrying the bits of k and then as many more as the
// subtraction cancels, found by retrying, so r is known to guardBits bits
// relative even when x lies near a multiple of pi/2. From r,
// u = 1 - cos r is summed by its Taylor series after s halvings of r and
// brought back by s steps of 1 - cos 2t = 2u(2-u), which never subtract
// nearly equal numbers (the halving is the classical doubling-formula
// acceleration, R. P. Brent, "Fast multiple-precision evaluation of
// elementary functions", J. ACM 23 (1976) 242-251); then cos r = 1 - u and
// |sin r| = sqrt(u(2-u)).
func sinCos(x *big.Float, wantSin, wantCos bool) (sin, cos *big.Float) {
	if x.IsInf() {
		panic("precision: Sin or Cos of an infinity")
	}
	p := resultPrec(x)
	if x.Sign() == 0 {
		return new(big.Float).SetPrec(p), new(big.Float).SetPrec(p).SetInt64(1)
	}
	w := p + guardBits
	r, quadrant := reduceHalfPi(x, w)
	u := oneMinusCos(r, w)
	var s, c *big.Float
	if wantSin || quadrant%2 == 1 {
		v := new(big.Float).SetPrec(w).Sub(big.NewFloat(2), u)
		v.Mul(v, u)
		s = sqrtPrec(v, v, w)
		if r.Sign() < 0 {
			s.Neg(s)
		}
	}
	if wantCos || quadrant%2 == 1 {
		c = new(big.Float).SetPrec(w).Sub(big.NewFloat(1), u)
	}
	// sin(r + k pi/2) and cos(r + k pi/2) by quadrant k mod 4.
	switch quadrant {
	case 1:
		s, c = c, s.Neg(s)
	case 2:
		s, c = neg(s), neg(c)
	case 3:
		s, c = c.Neg(c), s
	}
	if wantSin {
		sin = new(big.Float).SetPrec(p).Set(s)
	}
	if wantCos {
		cos = new(big.Float).SetPrec(p).Set(c)
	}
	return sin, cos
}

func neg(x *big.Float) *big.Float {
	if x == nil {
		return nil
	}
	return x.Neg(x)
}

// reduceHalfPi returns r = x - k pi/2 with |r| <= pi/4 (up to rounding)
// known to w bits relative, and k mod 4.
func reduceHalfPi(x *big.Float, w uint) (*big.Float, int) {
	ex := x.MantExp(nil)
	if ex <= -1 { // |x| < 1/2 < pi/4
		return new(big.Float).SetPrec(w).Set(x), 0
	}
	wr := w + uint(ex) + 8
	for {
		halfPi := Pi(wr)
		halfPi.SetMantExp(halfPi, -1)
		q := new(big.Float).SetPrec(uint(ex)+64).Quo(x, halfPi)
		q.Add(q, big.NewFloat(0.5))
		k, _ := q.Int(nil)
		if q.Sign() < 0 && !q.IsInt() {
			k.Sub(k, big.NewInt(1)) // floor of q+1/2
		}
		r := new(big.Float).SetPrec(wr).SetInt(k)
		r.Mul(r, halfPi)
		r.Sub(x, r)
		// |error of r| <= 2^(ex+2-wr): k pi/2 rounded twice near |x|.
		if r.Sign() != 0 {
			need := int(w) + ex + 2 - r.MantExp(nil)
			if need <= int(wr) {
				quadrant := new(big.Int).And(k, big.NewInt(3)).Int64()
				return r.SetPrec(w), int(quadrant)
			}
			wr = uint(need) + 8
		} else {
			wr *= 2
		}
	}
}

// halvings returns how many times an argument of binary exponent e must be
// halved before a Taylor series at w bits: down to about 2^-sqrt(w)/2,
// where the cost of halvings and of series terms balance.
func halvings(e int, w uint) int {
	h := 1
	for uint(h*h) < w {
		h++
	}
	s := e + h/2
	if s < 0 {
		s = 0
	}
	return s
}

// oneMinusCos returns 1 - cos r at w bits (relative error a few ulp) for
// |r| <= 1.
func oneMinusCos(r *big.Float, w uint) *big.Float {
	s := halvings(r.MantExp(nil), w)
	t := new(big.Float).SetPrec(w).SetMantExp(r, -s)
	t2 := new(big.Float).SetPrec(w).Mul(t, t)
	// u = t^2/2! - t^4/4! + t^6/6! - ...
	term := new(big.Float).SetPrec(w).SetMantExp(t2, -1)
	u := new(big.Float).SetPrec(w).Set(term)
	limit := term.MantExp(nil) - int(w) - 4
	den := new(big.Float).SetPrec(w)
	for k := int64(2); term.Sign() != 0 && term.MantExp(nil) > limit; k++ {
		term.Mul(term, t2)
		term.Quo(term, den.SetInt64((2*k-1)*(2*k)))
		term.Neg(term)
		u.Add(u, term)
	}
	two := big.NewFloat(2)
	v := new(big.Float).SetPrec(w)
	for i := 0; i < s; i++ {
		v.Sub(two, u)
		u.Mul(u, v)
		u.SetMantExp(u, 1)
	}
	return u
}

// Atan returns arctan x rounded to x.Prec() bits, within 1 ulp, in
// (-pi/2, pi/2); Atan(±Inf) = ±pi/2. For |x| > 1, arctan x =
// pi/2 - arctan(1/x); then s halvings t <- t/(1 + sqrt(1 + t^2)) (each
// halves arctan t) bring t near 2^-sqrt(w)/2, where the Taylor series
// t - t^3/3 + t^5/5 - ... converges in few terms (Brent 1976, see sinCos).
func Atan(x *big.Float) *big.Float {
	p := resultPrec(x)
	z := new(big.Float).SetPrec(p)
	if x.Sign() == 0 {
		return z
	}
	w := p + guardBits
	if x.IsInf() {
		z.SetMantExp(Pi(p), -1)
		if x.Sign() < 0 {
			z.Neg(z)
		}
		return z
	}
	t := new(big.Float).SetPrec(w).Abs(x)
	one := big.NewFloat(1)
	invert := t.Cmp(one) > 0
	if invert {
		t.Quo(one, t)
	}
	s := halvings(t.MantExp(nil), w)
	v := new(big.Float).SetPrec(w)
	for i := 0; i < s; i++ {
		v.Mul(t, t)
		v.Add(v, one)
		v.Sqrt(v)
		v.Add(v, one)
		t.Quo(t, v)
	}
	t2 := new(big.Float).SetPrec(w).Mul(t, t)
	pow := new(big.Float).SetPrec(w).Set(t)
	sum := new(big.Float).SetPrec(w).Set(t)
	term := new(big.Float).SetPrec(w)
	den := new(big.Float).SetPrec(w)
	limit := t.MantExp(nil) - int(w) - 4
	for k := int64(1); ; k++ {
		pow.Mul(pow, t2)
		pow.Neg(pow)
		if pow.Sign() == 0 || pow.MantExp(nil) <= limit {
			break
		}
		sum.Add(sum, term.Quo(pow, den.SetInt64(2*k+1)))
	}
	sum.SetMantExp(sum, s)
	if invert {
		hp := Pi(w)
		sum.Sub(hp.SetMantExp(hp, -1), sum)
	}
	if x.Sign() < 0 {
		sum.Neg(sum)
	}
	return z.Set(sum)
}
