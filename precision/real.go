package precision

import (
	"fmt"
	"math"
	"math/big"
	"math/bits"
)

// Real is a binary floating-point number of fixed precision, made for the
// inner loops of recurrences where math/big.Float spends most of its time
// on bookkeeping. A nonzero Real is
//
//	(-1)^neg * m * 2^exp,   m = mant / 2^(64W),   1/2 <= m < 1,
//
// with a mantissa of W 64-bit words (little-endian, top bit of the top word
// set) and an int64 binary exponent restricted to
// [RealMinExp, RealMaxExp] (about ±2.3e18, i.e. values up to about
// 10^(6.9e17)); an operation whose result would leave that range panics.
// Zero is a distinct state with no sign (there is no -0), and there are no
// NaNs or infinities: an operation that would produce one panics.
//
// W is fixed when the value is made by NewReal or NewRealSlice and never
// changes; Prec() = 64W. The zero Go value of Real is not usable.
//
// Accuracy. Add, Sub, Mul, Quo, Sqrt, Set, SetBig and SetRat return the
// exact result rounded toward zero to the receiver's 64W bits: the result r
// satisfies |r| <= |exact| and |exact - r| < ulp(r) = 2^(e-64W) where e is
// r's Exponent, so the relative error is below 2^(1-64W). In particular a
// result that is representable (x - x, or a - b with b/2 <= a <= 2b as in
// Sterbenz' lemma) is exact. MulAdd and MulSub round twice (see there).
// These bounds hold when all operands have the receiver's precision and also,
// through a slower allocating path, when they do not.
//
// Aliasing is allowed: the receiver may be any of the operands. Operations on
// values of equal precision W <= 64 (4096 bits) allocate nothing.
type Real struct {
	mant []uint64 // W words, mant[W-1] >= 1<<63 unless zero
	exp  int64
	neg  bool
	zero bool
}

// RealMaxExp and RealMinExp bound the binary exponent (as returned by
// Exponent) of a nonzero Real. They are chosen so that the sum of two
// exponents cannot overflow an int64.
const (
	RealMaxExp = 1<<61 - 1
	RealMinExp = -(1 << 61)
)

// realMaxWords bounds the mantissa length, so that 64W, 2W+1 and the like
// never overflow an int, and bits fit in a uint.
const realMaxWords = 1 << 24

// realWords returns the number of 64-bit words for prec bits, panicking on
// a precision no caller should ask for.
func realWords(prec uint) int {
	if prec == 0 || prec > 64*realMaxWords {
		panic(fmt.Sprintf("precision: Real precision %d out of range [1, %d]", prec, 64*realMaxWords))
	}
	return int((prec + 63) / 64)
}

// NewReal returns a zero Real with precision prec rounded up to a multiple
// of 64 bits (a prec below 64 gives 64). It panics if prec is 0 or above
// 2^30.
func NewReal(prec uint) *Real {
	w := realWords(prec)
	return &Real{mant: make([]uint64, w), zero: true}
}

// NewRealSlice returns n zero Reals of precision prec (rounded up as in
// NewReal) whose structs and mantissas lie in two shared backing arrays,
// which keeps a table of values close together in memory and costs three
// allocations however large n is.
func NewRealSlice(n int, prec uint) []*Real {
	if n < 0 {
		panic("precision: NewRealSlice with negative length")
	}
	w := realWords(prec)
	vals := make([]Real, n)
	words := make([]uint64, n*w)
	ptrs := make([]*Real, n)
	for i := range vals {
		vals[i] = Real{mant: words[i*w : (i+1)*w : (i+1)*w], zero: true}
		ptrs[i] = &vals[i]
	}
	return ptrs
}

// Prec returns the precision of x in bits, 64W.
func (x *Real) Prec() uint { return uint(64 * len(x.mant)) }

// setZero sets z to 0 and returns z.
func (z *Real) setZero() *Real {
	z.zero, z.neg, z.exp = true, false, 0
	return z
}

// setExp sets z's exponent to e, panicking if it is out of range.
func (z *Real) setExp(e int64) {
	if e > RealMaxExp || e < RealMinExp {
		panic(fmt.Sprintf("precision: Real exponent %d out of range", e))
	}
	z.exp = e
}

// Set sets z to x rounded toward zero to z's precision (exact if z's
// precision is at least x's) and returns z.
func (z *Real) Set(x *Real) *Real {
	if z == x {
		return z
	}
	if x.zero {
		return z.setZero()
	}
	zw, xw := len(z.mant), len(x.mant)
	if zw <= xw {
		copy(z.mant, x.mant[xw-zw:])
	} else {
		copy(z.mant[zw-xw:], x.mant)
		clear(z.mant[:zw-xw])
	}
	z.exp, z.neg, z.zero = x.exp, x.neg, false
	return z
}

// SetInt64 sets z to v, exactly, and returns z.
func (z *Real) SetInt64(v int64) *Real {
	if v == 0 {
		return z.setZero()
	}
	u := uint64(v)
	if v < 0 {
		u = -u
	}
	n := bits.LeadingZeros64(u)
	w := len(z.mant)
	clear(z.mant[:w-1])
	z.mant[w-1] = u << uint(n)
	z.exp, z.neg, z.zero = int64(64-n), v < 0, false
	return z
}

// SetFloat64 sets z to v, exactly, and returns z. It panics if v is NaN or
// an infinity.
func (z *Real) SetFloat64(v float64) *Real {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		panic(fmt.Sprintf("precision: SetFloat64(%v)", v))
	}
	if v == 0 {
		return z.setZero()
	}
	frac, e := math.Frexp(math.Abs(v)) // frac in [1/2, 1), exact
	w := len(z.mant)
	clear(z.mant[:w-1])
	z.mant[w-1] = uint64(math.Ldexp(frac, 64)) // < 2^64 and an integer
	z.exp, z.neg, z.zero = int64(e), v < 0, false
	return z
}

// SetBig sets z to x rounded toward zero to z's precision and returns z.
// It panics if x is an infinity.
func (z *Real) SetBig(x *big.Float) *Real {
	if x.IsInf() {
		panic("precision: SetBig of an infinity")
	}
	if x.Sign() == 0 {
		return z.setZero()
	}
	m := new(big.Float)
	e := x.MantExp(m)
	m.Abs(m).SetMantExp(m, 64*len(z.mant))
	n, _ := m.Int(nil) // truncates toward zero
	return z.setInt(x.Sign() < 0, n, int64(e)-int64(64*len(z.mant)))
}

// SetRat sets z to x rounded toward zero to z's precision and returns z.
func (z *Real) SetRat(x *big.Rat) *Real {
	if x.Sign() == 0 {
		return z.setZero()
	}
	num := new(big.Int).Abs(x.Num())
	den := new(big.Int).Set(x.Denom())
	// Scale so that the integer quotient has more than 64W bits.
	k := 64*len(z.mant) + den.BitLen() - num.BitLen() + 1
	if k >= 0 {
		num.Lsh(num, uint(k))
	} else {
		den.Lsh(den, uint(-k))
	}
	num.Quo(num, den)
	return z.setInt(x.Sign() < 0, num, int64(-k))
}

// setInt sets z to (-1)^neg * n * 2^e rounded toward zero to z's precision
// and returns z. n must be non-negative.
func (z *Real) setInt(neg bool, n *big.Int, e int64) *Real {
	if n.Sign() == 0 {
		return z.setZero()
	}
	w := len(z.mant)
	l := n.BitLen()
	m := new(big.Int)
	if d := l - 64*w; d > 0 {
		m.Rsh(n, uint(d))
	} else {
		m.Lsh(n, uint(-d))
	}
	intToWords(z.mant, m)
	z.setExp(e + int64(l))
	z.neg, z.zero = neg, false
	return z
}

// intToWords sets dst to the low 64*len(dst) bits of n >= 0 as
// little-endian 64-bit words.
func intToWords(dst []uint64, n *big.Int) {
	clear(dst)
	for i, b := range n.Bits() {
		if bits.UintSize == 64 {
			if i < len(dst) {
				dst[i] = uint64(b)
			}
		} else if i/2 < len(dst) {
			dst[i/2] |= uint64(b) << (32 * uint(i%2))
		}
	}
}

// wordsToInt sets n to the integer whose little-endian 64-bit words are w
// and returns n.
func wordsToInt(n *big.Int, w []uint64) *big.Int {
	if bits.UintSize == 64 {
		b := make([]big.Word, len(w))
		for i, v := range w {
			b[i] = big.Word(v)
		}
		return n.SetBits(b)
	}
	b := make([]big.Word, 2*len(w))
	for i, v := range w {
		b[2*i] = big.Word(uint32(v))
		b[2*i+1] = big.Word(v >> 32)
	}
	return n.SetBits(b)
}

// Big sets z to the exact value of x and returns z; if z is nil a new
// big.Float is allocated. z's precision is raised to x.Prec() if it is
// lower, so the conversion never rounds. It panics if x's exponent lies
// outside big.Float's range (MinExp, MaxExp).
func (x *Real) Big(z *big.Float) *big.Float {
	if z == nil {
		z = new(big.Float)
	}
	if z.Prec() < x.Prec() {
		z.SetPrec(x.Prec())
	}
	if x.zero {
		return z.SetInt64(0)
	}
	if x.exp > big.MaxExp || x.exp <= big.MinExp {
		panic(fmt.Sprintf("precision: Real exponent %d outside big.Float range", x.exp))
	}
	z.SetInt(wordsToInt(new(big.Int), x.mant))
	z.SetMantExp(z, int(x.exp)-64*len(x.mant))
	if x.neg {
		z.Neg(z)
	}
	return z
}

// Float64 returns the float64 nearest to x (ties to even), with gradual
// underflow to subnormals and 0, and ±Inf on overflow.
func (x *Real) Float64() float64 {
	if x.zero {
		return 0
	}
	if x.exp < -1021 || x.exp > 1024 {
		return x.float64Edge()
	}
	top := x.mant[len(x.mant)-1]
	sticky := false
	for _, w := range x.mant[:len(x.mant)-1] {
		if w != 0 {
			sticky = true
			break
		}
	}
	m, r := top>>11, top&0x7ff // 53 kept bits, 11 rounding bits
	if r > 0x400 || r == 0x400 && (sticky || m&1 == 1) {
		m++ // may become 2^53, which float64 holds exactly
	}
	f := math.Ldexp(float64(m), int(x.exp)-53)
	if x.neg {
		f = -f
	}
	return f
}

// float64Edge is Float64 for exponents near or beyond float64's range.
func (x *Real) float64Edge() float64 {
	if x.exp > 1100 {
		return math.Copysign(math.Inf(1), float64(x.Sign()))
	}
	if x.exp < -1200 {
		return math.Copysign(0, float64(x.Sign()))
	}
	f, _ := x.Big(nil).Float64()
	return f
}

// String formats x like big.Float's %g verb at x's precision, for
// debugging. An exponent outside big.Float's range is printed as a
// mantissa times a power of two.
func (x *Real) String() string {
	if !x.zero && (x.exp > big.MaxExp || x.exp <= big.MinExp) {
		m := NewReal(x.Prec()).Set(x)
		m.exp = 0
		return fmt.Sprintf("%g*2**%d", m.Big(nil), x.exp)
	}
	return fmt.Sprintf("%g", x.Big(nil))
}

// Sign returns -1, 0 or +1 as x is negative, zero or positive.
func (x *Real) Sign() int {
	switch {
	case x.zero:
		return 0
	case x.neg:
		return -1
	}
	return 1
}

// IsZero reports whether x is zero.
func (x *Real) IsZero() bool { return x.zero }

// Exponent returns the e with x = m * 2^e and 1/2 <= |m| < 1, as
// big.Float.MantExp does; it returns 0 for zero.
func (x *Real) Exponent() int64 { return x.exp }

// Cmp compares x and y exactly, whatever their precisions, and returns -1,
// 0 or +1 as x < y, x == y or x > y.
func (x *Real) Cmp(y *Real) int {
	sx, sy := x.Sign(), y.Sign()
	if sx != sy {
		if sx < sy {
			return -1
		}
		return 1
	}
	return sx * x.CmpAbs(y)
}

// CmpAbs compares |x| and |y| exactly and returns -1, 0 or +1 as
// |x| < |y|, |x| == |y| or |x| > |y|.
func (x *Real) CmpAbs(y *Real) int {
	switch {
	case x.zero && y.zero:
		return 0
	case x.zero:
		return -1
	case y.zero:
		return 1
	case x.exp != y.exp:
		if x.exp < y.exp {
			return -1
		}
		return 1
	}
	return cmpWords(x.mant, y.mant)
}

// cmpWords compares the mantissas a and b, aligned at their top words, and
// returns -1, 0 or +1.
func cmpWords(a, b []uint64) int {
	i, j := len(a)-1, len(b)-1
	for ; i >= 0 && j >= 0; i, j = i-1, j-1 {
		if a[i] != b[j] {
			if a[i] < b[j] {
				return -1
			}
			return 1
		}
	}
	for ; i >= 0; i-- {
		if a[i] != 0 {
			return 1
		}
	}
	for ; j >= 0; j-- {
		if b[j] != 0 {
			return -1
		}
	}
	return 0
}

// Neg sets z to -x, rounded toward zero to z's precision, and returns z.
func (z *Real) Neg(x *Real) *Real {
	z.Set(x)
	z.neg = !z.zero && !z.neg
	return z
}

// Abs sets z to |x|, rounded toward zero to z's precision, and returns z.
func (z *Real) Abs(x *Real) *Real {
	z.Set(x)
	z.neg = false
	return z
}

// MulPow2 sets z to x * 2^k, rounded toward zero to z's precision (exact
// if z's precision is at least x's), and returns z. It panics if the result
// exponent leaves [RealMinExp, RealMaxExp].
func (z *Real) MulPow2(x *Real, k int) *Real {
	z.Set(x)
	if z.zero {
		return z
	}
	if int64(k) > RealMaxExp-RealMinExp || int64(k) < RealMinExp-RealMaxExp {
		panic(fmt.Sprintf("precision: MulPow2 by 2^%d", k))
	}
	z.setExp(z.exp + int64(k))
	return z
}
