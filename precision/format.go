package precision

import (
	"math"
	"math/big"
	"strconv"
	"strings"
	"sync"
)

// FormatSig returns x correctly rounded (to nearest, ties to even, on the
// exact binary value of x) to d >= 1 significant decimal digits, with
// exactly d digits printed, trailing zeros kept. With x = m*10^e,
// 1 <= |m| < 10 after rounding, the notation is positional when
// -5 <= e < d ("0.000123", "10.000", "123") and otherwise scientific with a
// signed exponent of as many digits as it needs ("1.25e-300", "6.02e+23",
// "1e+7"). Zero prints "0", infinities "+Inf" and "-Inf", and a negative
// value gets a leading "-". The conversion is exact integer arithmetic for
// any exponent of x. d < 1 panics.
func FormatSig(x *big.Float, d int) string {
	if d < 1 {
		panic("precision: FormatSig needs at least one digit")
	}
	switch {
	case x.IsInf():
		if x.Sign() > 0 {
			return "+Inf"
		}
		return "-Inf"
	case x.Sign() == 0:
		return "0"
	}
	q, e := decimalDigits(x, d)
	digits := q.String()
	var b strings.Builder
	if x.Sign() < 0 {
		b.WriteByte('-')
	}
	switch {
	case e >= 0 && e < d:
		b.WriteString(digits[:e+1])
		if e+1 < d {
			b.WriteByte('.')
			b.WriteString(digits[e+1:])
		}
	case e < 0 && e >= -5:
		b.WriteString("0.")
		b.WriteString(strings.Repeat("0", -e-1))
		b.WriteString(digits)
	default:
		b.WriteString(digits[:1])
		if d > 1 {
			b.WriteByte('.')
			b.WriteString(digits[1:])
		}
		b.WriteByte('e')
		if e >= 0 {
			b.WriteByte('+')
		}
		b.WriteString(strconv.Itoa(e))
	}
	return b.String()
}

// decimalDigits returns the integer q, 10^(d-1) <= q < 10^d, and the
// exponent e with q*10^(e-d+1) the correct rounding (ties to even) of |x|
// to d significant digits; x is finite and nonzero.
func decimalDigits(x *big.Float, d int) (*big.Int, int) {
	m, e2 := intMantExp(x)
	mant := new(big.Float)
	be := x.MantExp(mant)
	mf, _ := mant.Float64()
	// First guess of floor(log10|x|), off by at most one.
	e := int(math.Floor(float64(be)*math.Log10(2) + math.Log10(math.Abs(mf))))
	lo, hi := cachedPow(10, d-1), cachedPow(10, d)
	num, q, r := new(big.Int), new(big.Int), new(big.Int)
	for {
		// |x| / 10^k = m 2^(e2-k) / 5^k, k = e-d+1.
		k := e - d + 1
		s := e2 - k
		var c int // the sign of 2r - den, r the remainder of the division
		if k >= 0 {
			num.Set(m)
			den := cachedPow(5, k)
			if s >= 0 {
				num.Lsh(num, uint(s))
			} else {
				den = new(big.Int).Lsh(den, uint(-s))
			}
			q.QuoRem(num, den, r)
			c = r.Lsh(r, 1).Cmp(den)
		} else {
			// The divisor is a power of two: shift, and read the
			// remainder's comparison with half of it off the bits.
			num.Mul(m, cachedPow(5, -k))
			if s >= 0 {
				q.Lsh(num, uint(s))
				c = -1
			} else {
				t := uint(-s)
				q.Rsh(num, t)
				switch {
				case num.Bit(int(t-1)) == 0:
					c = -1
				case num.TrailingZeroBits() == t-1:
					c = 0
				default:
					c = 1
				}
			}
		}
		switch {
		case q.Cmp(hi) >= 0:
			e++
			continue
		case q.Cmp(lo) < 0:
			e--
			continue
		}
		if c > 0 || c == 0 && q.Bit(0) == 1 {
			q.Add(q, big.NewInt(1))
		}
		if q.Cmp(hi) == 0 {
			q.Set(lo)
			e++
		}
		return q, e
	}
}

// Powers of 10 and 5 for decimalDigits, computed once: a rule prints
// thousands of values at one digit count and within a few exponents. The
// cache keeps at most powCacheMax entries (beyond that a power is computed
// each time); the values in it are never modified.
const powCacheMax = 512

var (
	powMu    sync.RWMutex
	powCache = map[[2]int]*big.Int{}
)

// cachedPow returns base^e for e >= 0; the result must not be modified.
func cachedPow(base, e int) *big.Int {
	key := [2]int{base, e}
	powMu.RLock()
	p, ok := powCache[key]
	powMu.RUnlock()
	if ok {
		return p
	}
	p = new(big.Int).Exp(big.NewInt(int64(base)), big.NewInt(int64(e)), nil)
	powMu.Lock()
	if len(powCache) < powCacheMax {
		powCache[key] = p
	}
	powMu.Unlock()
	return p
}

// FormatFloat64 returns the shortest decimal that reads back as f
// (strconv.FormatFloat(f, 'g', -1, 64): "0.1", "1e+21", "5e-324"). f must be
// finite; NaN and ±Inf panic (a programmer error: a non-finite value has no
// place in a rule).
func FormatFloat64(f float64) string {
	if math.IsNaN(f) || math.IsInf(f, 0) {
		panic("precision: FormatFloat64 of a non-finite value")
	}
	return strconv.FormatFloat(f, 'g', -1, 64)
}

// NearestFloat64 returns the float64 nearest to the exact value of x, ties
// to even, as IEEE 754 rounding gives it: a value beyond the largest finite
// float64 by half an ulp or more becomes ±Inf, a value below the smallest
// normal becomes a subnormal or ±0 by the same rule (x.Float64 of math/big).
func NearestFloat64(x *big.Float) float64 {
	f, _ := x.Float64()
	return f
}
