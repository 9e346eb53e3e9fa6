package precision

import (
	"math"
	"math/big"
	"sync"
)

// The quadratures evaluate an exponential per node and a weight's functions
// at every node, thousands of times at 100-300 bits. At those precisions
// bigfloat's routines (exp by Newton on an AGM logarithm) cost some 300
// microseconds a call; the classical argument reduction plus Taylor series
// below costs about 2 (and stays 5 to 30 times faster up to 8192 bits). Exp, Log and Pow take this route up to fastElemBits
// and bigfloat's beyond; each route is tested against the other at higher
// precision (elemfast_test.go).

// fastElemBits is the highest precision at which Exp, Log and Pow use the
// series below rather than bigfloat.
const fastElemBits = 8192

// elemGuard is the number of bits the functions below carry beyond the
// result's precision; with the s squarings of expBig (each doubling the
// relative error) covered separately, the result before the final rounding
// is within 2^-20 of an ulp, so the rounded result is within 1 ulp.
const elemGuard = 40

// expSquarings is the number of halvings of the reduced argument before the
// Taylor series (and squarings after it).
const expSquarings = 8

// ExpTo returns e^x rounded to prec bits, within 1 ulp, whatever the
// precision of x. x is reduced as
// x = k ln 2 + r with |r| <= ln(2)/2 (ln 2 carrying the bits of k), then
// r/2^s summed by its Taylor series and squared s times (Brent, "Fast
// multiple-precision evaluation of elementary functions", J. ACM 23, 1976,
// section 3: argument reduction and the power series). |x| >= 2^24 and
// precisions above fastElemBits go to bigfloat, which also gives +Inf or 0
// beyond big.Float's range.
func ExpTo(x *big.Float, prec uint) *big.Float {
	z := new(big.Float).SetPrec(prec)
	if x.Sign() == 0 {
		return z.SetInt64(1)
	}
	if x.IsInf() || x.MantExp(nil) > 24 || prec > fastElemBits {
		return expBigfloat(x, prec)
	}
	tab := expTable(prec + elemGuard + expSquarings)
	w := tab.prec
	xf, _ := x.Float64()
	k := int64(math.Round(xf / math.Ln2))
	r := new(big.Float).SetPrec(w + 40)
	r.Set(x)
	if k != 0 {
		kl := new(big.Float).SetPrec(w + 40).SetInt64(k)
		kl.Mul(kl, tab.ln2)
		r.Sub(r, kl)
	}
	r.SetMantExp(r, -expSquarings)
	// Horner's rule on the Taylor polynomial, in precision.Real: the
	// products then allocate nothing.
	s := make([]*Real, 2)
	s[0], s[1] = NewReal(w), NewReal(w)
	rr, sum := s[0].SetBig(r), s[1]
	n := len(tab.invFact) - 1
	sum.Set(tab.invFact[n])
	for i := n - 1; i >= 0; i-- {
		sum.Mul(sum, rr)
		sum.Add(sum, tab.invFact[i])
	}
	for i := 0; i < expSquarings; i++ {
		sum.Mul(sum, sum)
	}
	e := sum.Big(nil)
	e.SetMantExp(e, int(k))
	return z.Set(e)
}

// expTab holds, for one working precision, ln 2 and the inverse factorials
// 1/n! (n = 0..N, N the last term the Taylor series of e^r needs for
// |r| <= ln(2)/2^(s+1)), rounded to that precision.
type expTab struct {
	prec    uint
	ln2     *big.Float
	invFact []*Real
}

var expTabs sync.Map // words (uint) -> *expTab

// expTable returns the table for at least w bits (rounded up to a multiple
// of 64).
func expTable(w uint) *expTab {
	words := (w + 63) / 64
	if t, ok := expTabs.Load(words); ok {
		return t.(*expTab)
	}
	p := 64 * words
	t := &expTab{prec: p, ln2: new(big.Float).SetPrec(p + 40).Set(Ln2(p + 40))}
	f := new(big.Float).SetPrec(p + 16).SetInt64(1)
	// |r| < 2^-(s+1/2) after the reduction; stop when r^n/n! < 2^-(p+8).
	for n := int64(0); ; n++ {
		if n > 0 {
			f.Quo(f, new(big.Float).SetInt64(n))
		}
		t.invFact = append(t.invFact, NewReal(p).SetBig(f))
		if float64(f.MantExp(nil))-float64(n)*(expSquarings+0.5) < -float64(p)-8 {
			break
		}
	}
	v, _ := expTabs.LoadOrStore(words, t)
	return v.(*expTab)
}

// LogTo returns ln x rounded to prec bits, within 1 ulp, for finite x > 0
// (other x panic), whatever the precision of x. Near 1, with z = x-1 formed exactly, |z| < 2^-(prec/3+2)
// takes the series z - z^2/2 + z^3/3 - ..., which converges in a few terms
// and keeps the relative accuracy however close x is to 1 (this is what a
// point given by its distance to the end 1 needs); otherwise Halley's
// iteration y <- y + 2(x - e^y)/(x + e^y) from the float64 logarithm
// triples the correct bits per step, carried at prec + guard bits plus the
// bits that cancel near 1.
func LogTo(x *big.Float, prec uint) *big.Float {
	if x.Sign() <= 0 || x.IsInf() {
		panic("precision: LogTo of a number that is not finite and positive")
	}
	if prec > fastElemBits {
		return logBigfloat(x, prec)
	}
	w := prec + elemGuard
	one := big.NewFloat(1)
	zp := x.Prec() + 2
	if e := x.MantExp(nil); e < 0 {
		zp += uint(-e)
	}
	z := new(big.Float).SetPrec(zp).Sub(x, one) // exact
	if z.Sign() == 0 {
		return new(big.Float).SetPrec(prec)
	}
	ez := z.MantExp(nil)
	if ez < -int(prec/3)-2 {
		z.SetPrec(w)
		sum := new(big.Float).SetPrec(w).Set(z)
		pw := new(big.Float).SetPrec(w).Set(z)
		t := new(big.Float).SetPrec(w)
		nb := new(big.Float).SetPrec(w)
		for n := int64(2); ; n++ {
			pw.Mul(pw, z)
			t.Quo(pw, nb.SetInt64(n))
			if t.Sign() == 0 || t.MantExp(nil) < ez-int(w)-2 {
				break
			}
			if n%2 == 0 {
				sum.Sub(sum, t)
			} else {
				sum.Add(sum, t)
			}
		}
		return new(big.Float).SetPrec(prec).Set(sum)
	}
	if ez < 0 {
		w += uint(-ez)
	}
	mant := new(big.Float)
	e := x.MantExp(mant)
	mf, _ := mant.Float64()
	y := new(big.Float).SetPrec(w).SetFloat64(math.Log(mf))
	if e != 0 {
		y.Add(y, new(big.Float).SetPrec(w).Mul(new(big.Float).SetPrec(w).SetInt64(int64(e)), Ln2(w)))
	}
	// Each step runs at the precision its result can have, 3 bits + 16
	// (the last one at w): the early steps are cheap.
	for bits := uint(45); ; bits *= 3 {
		sp := min(w, 3*bits+16)
		xw := new(big.Float).SetPrec(sp).Set(x)
		ey := ExpTo(y, sp)
		num := new(big.Float).SetPrec(sp).Sub(xw, ey)
		num.Quo(num, new(big.Float).SetPrec(sp).Add(xw, ey))
		num.SetMantExp(num, 1)
		y.Add(y, num)
		if 3*bits >= w+8 {
			break
		}
	}
	return new(big.Float).SetPrec(prec).Set(y)
}

// PowTo returns a^b = e^(b ln a) rounded to prec bits, within 1 ulp, for
// finite a > 0 (other a panic): ln a is formed with as many extra bits as
// |b ln a| has above 1, so that the exponential keeps the relative accuracy.
func PowTo(a, b *big.Float, prec uint) *big.Float {
	if b.Sign() == 0 || a.Cmp(big.NewFloat(1)) == 0 {
		return new(big.Float).SetPrec(prec).SetInt64(1)
	}
	w := prec + elemGuard
	if mag := b.MantExp(nil) + bitLen(a.MantExp(nil)) + 1; mag > 0 {
		if mag > 40 {
			// |b ln a| > 2^32 unless ln a is tiny: decide in float64,
			// where e^(b ln a) beyond big.Float's range is +Inf or 0.
			mant := new(big.Float)
			e := a.MantExp(mant)
			mf, _ := mant.Float64()
			la := math.Log(mf) + float64(e)*math.Ln2
			bf, _ := b.Float64()
			if t := bf * la; math.Abs(t) > 1.5e9 {
				if t > 0 {
					return new(big.Float).SetPrec(prec).SetInf(false)
				}
				return new(big.Float).SetPrec(prec)
			}
		}
		w += uint(mag)
	}
	l := LogTo(a, w)
	return ExpTo(l.Mul(l, b), prec)
}
