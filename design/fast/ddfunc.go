package fast

import (
	"math"
	"math/big"
	"sync"

	"quadwright/precision"
)

// Tables for ddSinCos and ddLog, built once at 192 bits.
var (
	tabOnce        sync.Once
	tabSin, tabCos []dd      // sin(j/32), cos(j/32), j = 0..40
	tabLog         []dd      // log(1 + j/128), j = 0..128
	tabInv         []float64 // 1/(1 + j/128), rounded
	ddLn2          dd
)

func buildTables() {
	tabSin = make([]dd, 41)
	tabCos = make([]dd, 41)
	for j := range tabSin {
		t := new(big.Float).SetPrec(constPrec).SetFloat64(float64(j) / 32)
		tabSin[j] = splitDDc(precision.Sin(t))
		tabCos[j] = splitDDc(precision.Cos(t))
	}
	tabLog = make([]dd, 129)
	tabInv = make([]float64, 129)
	for j := range tabLog {
		tabInv[j] = 1 / (1 + float64(j)/128)
		tabLog[j] = splitDDc(precision.Log(new(big.Float).SetPrec(constPrec).SetFloat64(1 + float64(j)/128)))
	}
	ddLn2 = splitDDc(precision.Ln2(constPrec))
}

// ddSinCos returns sin y and cos y for 0 <= y <= 1.25 with a relative
// error of about 1e-21: y = j/32 + d with |d| <= 1/64, the tabulated values
// at j/32 combined with the Taylor series of sin d and cos d, whose terms
// beyond the first are formed in float64 (they are below 1e-4 of the
// result, so float64 holds them to 1e-20).
func ddSinCos(y dd) (s, c dd) {
	tabOnce.Do(buildTables)
	j := int(math.Floor(y.hi*32 + 0.5))
	d := ddSub(y, ddF(float64(j)*(1.0/32)))
	x := d.hi
	x2 := x * x
	sinTail := -x * x2 * (1.0 / 6) * (1 - x2*(1.0/20)*(1-x2*(1.0/42)*(1-x2*(1.0/72))))
	cosTail := -x2 * 0.5 * (1 - x2*(1.0/12)*(1-x2*(1.0/30)*(1-x2*(1.0/56))))
	sd := quickTwoSum(d.hi, d.lo+sinTail)
	cd := quickTwoSum(1, cosTail)
	s = ddAddFast(ddMul(tabSin[j], cd), ddMul(tabCos[j], sd))
	c = ddAddFast(ddMul(tabCos[j], cd), ddNeg(ddMul(tabSin[j], sd)))
	return s, c
}

// ddLog returns log x for x > 0 with an absolute error below about 2e-18
// (the truncated series; plus 1e-32 |log x|): x = m 2^k with m in [1, 2),
// m = (1 + j/128)(1 + u), the tabulated log(1 + j/128) plus the series of
// log(1 + u), 0 <= u < 1/128, whose terms beyond the first are formed in
// float64.
func ddLog(x dd) dd {
	tabOnce.Do(buildTables)
	bits := math.Float64bits(x.hi)
	be := int(bits >> 52 & 0x7ff)
	if be == 0 || be == 0x7ff {
		return ddLogSlow(x)
	}
	// x.hi = m 2^k with m in [1, 2), read off the bits; x.lo scaled by the
	// exact power 2^-k.
	k := be - 1023
	m := dd{math.Float64frombits(bits&(1<<52-1) | 1023<<52), x.lo * math.Float64frombits(uint64(1023-k)<<52)}
	return ddLogMantissa(m, k)
}

// ddLogSlow is ddLog for a subnormal x.hi.
func ddLogSlow(x dd) dd {
	fr, e := math.Frexp(x.hi) // x.hi = fr 2^e, fr in [1/2, 1)
	return ddLogMantissa(dd{fr * 2, math.Ldexp(x.lo, 1-e)}, e-1)
}

// ddLogMantissa returns log(m 2^k) for m in [1, 2).
func ddLogMantissa(m dd, k int) dd {
	j := int((m.hi - 1) * 128)
	base := 1 + float64(j)*(1.0/128)
	// u = (m - base)/base: m.hi - base is exact (Sterbenz), the quotient
	// gets one correction from its FMA residual (the correction, below
	// 2^-53 u, needs no more than float64 division by multiplication).
	inv := tabInv[j]
	num := m.hi - base + m.lo
	uh := num * inv
	ul := (math.FMA(-uh, base, m.hi-base) + m.lo) * inv
	v := uh
	tail := -v * v * (0.5 - v*(1.0/3-v*(0.25-v*(0.2-v*(1.0/6-v*(1.0/7))))))
	l := ddAddFast(tabLog[j], ddMulF(ddLn2, float64(k)))
	return ddAddFast(l, quickTwoSum(uh, ul+tail))
}

// ddExpF returns exp(x) in float64 for a double-double x: exp(x.hi) (1 +
// x.lo), within the error of math.Exp for an exact argument.
func ddExpF(x dd) float64 {
	return math.Exp(x.hi) * (1 + x.lo)
}
