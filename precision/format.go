package precision

import (
	"math"
	"math/big"
	"strconv"
	"strings"
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
	lo, hi := pow10Int(d-1), pow10Int(d)
	num, den, r := new(big.Int), new(big.Int), new(big.Int)
	for {
		// |x| / 10^k = m 2^(e2-k) / 5^k, k = e-d+1.
		k := e - d + 1
		num.Set(m)
		den.SetInt64(1)
		if k >= 0 {
			den.Exp(big.NewInt(5), big.NewInt(int64(k)), nil)
		} else {
			num.Mul(num, new(big.Int).Exp(big.NewInt(5), big.NewInt(int64(-k)), nil))
		}
		if s := e2 - k; s >= 0 {
			num.Lsh(num, uint(s))
		} else {
			den.Lsh(den, uint(-s))
		}
		q, _ := new(big.Int).QuoRem(num, den, r)
		switch {
		case q.Cmp(hi) >= 0:
			e++
			continue
		case q.Cmp(lo) < 0:
			e--
			continue
		}
		switch c := r.Lsh(r, 1).Cmp(den); {
		case c > 0, c == 0 && q.Bit(0) == 1:
			q.Add(q, big.NewInt(1))
		}
		if q.Cmp(hi) == 0 {
			q.Set(lo)
			e++
		}
		return q, e
	}
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
