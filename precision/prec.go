package precision

import (
	"math"
	"math/bits"
)

// MaxDigits is the largest number of significant decimal digits that a
// quadwright command accepts for a computed rule (the --digits flag). Every
// function of this package works beyond it; the bound keeps the working
// precision, about 3400 bits at 1000 digits, within the range where the
// algorithms used here (Stirling series, Taylor series with argument halving)
// run in a fraction of a second per value.
const MaxDigits = 1000

// log2Of10 is log2(10) rounded to float64 (from memory: 3.321928094887362...).
// For d below 2^40 the product d*log2Of10 is off by far less than the distance
// of d*log2(10) from the nearest integer (log2(10) is irrational), so the
// ceiling is exact for every d this package meets.
const log2Of10 = 3.321928094887362347870319429489390175864831393

// DigitsToBits returns ceil(d*log2(10)), the number of bits of a binary
// significand that carries as much as d significant decimal digits (for d >= 0;
// d < 0 panics). DigitsToBits(0) is 0.
func DigitsToBits(d int) uint {
	if d < 0 {
		panic("precision: DigitsToBits of a negative digit count")
	}
	return uint(math.Ceil(float64(d) * log2Of10))
}

// WorkingPrec returns the binary precision used to compute an n-point rule
// to digits correct significant decimal digits (digits >= 1, n >= 0; other
// values panic):
//
//	DigitsToBits(digits) + 32 + 2*ceil(log2(n+1)), rounded up to a multiple of 64.
//
// The 32 bits cover the rounding errors of a fixed number of operations per
// value; the 2*ceil(log2(n+1)) bits the growth with n of rounding errors in
// recurrences and eigenvalue iterations over n terms (a bound proportional to
// n^2 ulp, common practice). The caller verifies the result and, if the check
// fails, retries at RaisePrec of this value.
func WorkingPrec(digits, n int) uint {
	if digits < 1 || n < 0 {
		panic("precision: WorkingPrec needs digits >= 1 and n >= 0")
	}
	return roundUp64(DigitsToBits(digits) + 32 + 2*ceilLog2(uint64(n)+1))
}

// RaisePrec returns the next working precision to try after a computation at
// prec bits failed its verification: ceil(3*prec/2) rounded up to a multiple of
// 64, and at least prec+64. Growing geometrically keeps the total cost of the
// retries within a constant factor of the last attempt.
func RaisePrec(prec uint) uint {
	next := roundUp64(prec + (prec+1)/2)
	if next < prec+64 {
		next = roundUp64(prec + 64)
	}
	return next
}

// ceilLog2 returns ceil(log2(v)) for v >= 1.
func ceilLog2(v uint64) uint {
	return uint(bits.Len64(v - 1))
}

// roundUp64 returns the least multiple of 64 that is >= b.
func roundUp64(b uint) uint {
	return (b + 63) &^ 63
}
