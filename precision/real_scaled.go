package precision

// MantExp returns m and e with x = m 2^e up to x's bits beyond the 53 that
// m keeps (m truncated toward zero, 1/2 <= |m| < 1), or 0 and 0 for x = 0:
// a float64 view of x that never overflows or underflows, for scale
// computations (error bounds, tolerances) that need no more than float64's
// accuracy at any magnitude.
func (x *Real) MantExp() (float64, int64) {
	if x.zero {
		return 0, 0
	}
	m := float64(x.mant[len(x.mant)-1]>>11) * 0x1p-53
	if x.neg {
		m = -m
	}
	return m, x.exp
}
