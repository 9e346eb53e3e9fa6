package precision

import (
	"math/big"
	"math/bits"
	"sync"
)

// constant caches the highest-precision approximation of one irrational
// constant computed so far, and hands out correctly rounded values from it.
type constant struct {
	mu sync.Mutex
	// val approximates the constant at val.Prec() bits within
	// 4 ulp; nil until first use.
	val *big.Float
	// compute returns the constant at w bits within 4 ulp.
	compute func(w uint) *big.Float
}

// get returns the constant correctly rounded to nearest (ties to even) at
// prec bits. An irrational constant never lies on a tie, and the loop
// raises the cached precision until the 4-ulp interval around the cached
// value rounds to a single prec-bit number, so the answer is exact
// rounding, not just within an ulp.
func (c *constant) get(prec uint) *big.Float {
	if prec == 0 {
		panic("precision: constant requested at precision 0")
	}
	c.mu.Lock()
	defer c.mu.Unlock()
	for {
		if c.val != nil && c.val.Prec() >= prec+8 {
			if z, ok := roundInterval(c.val, 4, prec); ok {
				return z
			}
		}
		w := roundUp64(prec + 64)
		if c.val != nil && w < 2*c.val.Prec() {
			w = 2 * c.val.Prec()
		}
		c.val = c.compute(w)
	}
}

// roundInterval rounds v-k ulp and v+k ulp (ulp at v.Prec() bits) to
// nearest even at prec bits and reports whether the two agree; if so the
// common value is returned, and it is the correct rounding of every real
// number in the interval.
func roundInterval(v *big.Float, k int64, prec uint) (*big.Float, bool) {
	w := v.Prec()
	off := new(big.Float).SetMantExp(big.NewFloat(float64(k)), v.MantExp(nil)-int(w))
	lo := new(big.Float).SetPrec(w+8).Sub(v, off)
	hi := new(big.Float).SetPrec(w+8).Add(v, off)
	lo.SetPrec(prec)
	hi.SetPrec(prec)
	return lo, lo.Cmp(hi) == 0
}

var piConst = constant{compute: chudnovskyPi}

var ln2Const = constant{compute: machinLn2}

// Pi returns pi correctly rounded to nearest (ties to even) at prec bits
// (prec >= 1; 0 panics). The highest-precision value computed so far is
// cached, behind a mutex, and later requests at lower precision are rounded
// from it.
func Pi(prec uint) *big.Float {
	return piConst.get(prec)
}

// Ln2 returns ln 2 correctly rounded to nearest (ties to even) at prec bits
// (prec >= 1; 0 panics), cached like Pi.
func Ln2(prec uint) *big.Float {
	return ln2Const.get(prec)
}

// chudnovskyPi returns pi at w bits within 4 ulp, from the series of
//
//	D. V. Chudnovsky and G. V. Chudnovsky, "Approximations and complex
//	multiplication according to Ramanujan", in Ramanujan Revisited,
//	Academic Press, 1988, pp. 375-472,
//
// 1/pi = 12 sum_k (-1)^k (6k)! (13591409 + 545140134k) /
// ((3k)! (k!)^3 640320^(3k+3/2)), summed exactly on big.Int by binary
// splitting (B. Haible and T. Papanikolaou, "Fast multiprecision evaluation
// of series of rational numbers", Algorithmic Number Theory (ANTS-III),
// LNCS 1423, Springer, 1998, pp. 338-350). Each term adds about 47.11 bits,
// so w/47+2 terms leave a tail below 2^-w; the four final roundings
// (sqrt, two conversions, product and quotient) cost under 3 ulp.
func chudnovskyPi(w uint) *big.Float {
	n := int64(w/47 + 2)
	_, q, t := chudnovskySplit(0, n)
	s := Sqrt(new(big.Float).SetPrec(w).SetInt64(10005))
	qf := new(big.Float).SetPrec(w).SetInt(q)
	tf := new(big.Float).SetPrec(w).SetInt(t)
	s.Mul(s, qf)
	s.Mul(s, new(big.Float).SetInt64(426880))
	return s.Quo(s, tf)
}

// chudnovskySplit returns P(a,b), Q(a,b), T(a,b) of the binary splitting of
// the Chudnovsky series over terms a <= k < b (b > a), with
// pi = 426880 sqrt(10005) Q(0,n) / T(0,n) up to the truncation error.
func chudnovskySplit(a, b int64) (p, q, t *big.Int) {
	if b-a == 1 {
		if a == 0 {
			p, q = big.NewInt(1), big.NewInt(1)
		} else {
			p = big.NewInt(-(6*a - 5))
			p.Mul(p, big.NewInt(2*a-1))
			p.Mul(p, big.NewInt(6*a-1))
			q = big.NewInt(a)
			q.Mul(q, q).Mul(q, big.NewInt(a))
			q.Mul(q, big.NewInt(10939058860032000)) // 640320^3/24
		}
		t = new(big.Int).Mul(p, big.NewInt(13591409+545140134*a))
		return p, q, t
	}
	m := (a + b) / 2
	p1, q1, t1 := chudnovskySplit(a, m)
	p2, q2, t2 := chudnovskySplit(m, b)
	t = new(big.Int).Mul(t1, q2)
	t.Add(t, t2.Mul(p1, t2))
	return p1.Mul(p1, p2), q1.Mul(q1, q2), t
}

// machinLn2 returns ln 2 at w bits within 1 ulp, from the Machin-type
// identity ln 2 = 18 atanh(1/26) - 2 atanh(1/4801) + 8 atanh(1/8749)
// (common practice; the test checks the result against mpmath), with each
// arctanh summed by its Taylor series in fixed point on big.Int.
func machinLn2(w uint) *big.Float {
	f := w + 24 + uint(bits.Len(w))
	s := new(big.Int).Mul(big.NewInt(18), atanhInvFixed(26, f))
	s.Sub(s, new(big.Int).Mul(big.NewInt(2), atanhInvFixed(4801, f)))
	s.Add(s, new(big.Int).Mul(big.NewInt(8), atanhInvFixed(8749, f)))
	z := new(big.Float).SetPrec(w).SetInt(s)
	return z.SetMantExp(z, -int(f))
}

// atanhInvFixed returns an integer within 3n of 2^f atanh(1/q) (q >= 2),
// n the number of series terms used (about f/(2 log2 q)): every term
// 2^f/((2k+1) q^(2k+1)) is truncated, the truncation of the running power
// staying below 2 units.
func atanhInvFixed(q int64, f uint) *big.Int {
	pow := new(big.Int).Lsh(big.NewInt(1), f)
	bq := big.NewInt(q)
	pow.Quo(pow, bq)
	q2 := new(big.Int).Mul(bq, bq)
	sum := new(big.Int).Set(pow)
	term := new(big.Int)
	for k := int64(1); pow.Sign() > 0; k++ {
		pow.Quo(pow, q2)
		term.Quo(pow, big.NewInt(2*k+1))
		sum.Add(sum, term)
	}
	return sum
}
