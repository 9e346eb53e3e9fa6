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
	tabLog         []dd      // log(1 + j/64), j = 0..64
	tabInv         []float64 // 1/(1 + j/64), rounded
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
	tabLog = make([]dd, 65)
	tabInv = make([]float64, 65)
	for j := range tabLog {
		tabInv[j] = 1 / (1 + float64(j)/64)
		tabLog[j] = splitDDc(precision.Log(new(big.Float).SetPrec(constPrec).SetFloat64(1 + float64(j)/64)))
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
	d := ddSub(y, ddF(float64(j)/32))
	x := d.hi
	x2 := x * x
	sinTail := -x * x2 / 6 * (1 - x2/20*(1-x2/42*(1-x2/72)))
	cosTail := -x2 / 2 * (1 - x2/12*(1-x2/30*(1-x2/56)))
	sd := quickTwoSum(d.hi, d.lo+sinTail)
	cd := quickTwoSum(1, cosTail)
	s = ddAddFast(ddMul(tabSin[j], cd), ddMul(tabCos[j], sd))
	c = ddAddFast(ddMul(tabCos[j], cd), ddNeg(ddMul(tabSin[j], sd)))
	return s, c
}

// ddLog returns log x for x > 0 with an absolute error of about 1e-20
// (plus 1e-32 |log x|): x = m 2^k with m in [1, 2), m = (1 + j/64)(1 + u),
// the tabulated log(1 + j/64) plus the series of log(1 + u), |u| < 1/64,
// whose terms beyond the first are formed in float64.
func ddLog(x dd) dd {
	tabOnce.Do(buildTables)
	fr, e := math.Frexp(x.hi) // x.hi = fr 2^e, fr in [1/2, 1)
	m := dd{fr * 2, math.Ldexp(x.lo, 1-e)}
	k := e - 1
	j := int(math.Floor((m.hi - 1) * 64))
	base := 1 + float64(j)/64
	// u = (m - base)/base: m.hi - base is exact (Sterbenz), the quotient
	// gets one correction from its FMA residual.
	num := m.hi - base + m.lo
	uh := num * tabInv[j]
	ul := (math.FMA(-uh, base, m.hi-base) + m.lo) / base
	v := uh
	tail := -v * v * (0.5 - v*(1.0/3-v*(0.25-v*(0.2-v*(1.0/6-v*(1.0/7-v/8))))))
	l := ddAddFast(tabLog[j], ddMulF(ddLn2, float64(k)))
	return ddAddFast(l, quickTwoSum(uh, ul+tail))
}

// ddExpF returns exp(x) in float64 for a double-double x: exp(x.hi) (1 +
// x.lo), within the error of math.Exp for an exact argument.
func ddExpF(x dd) float64 {
	return math.Exp(x.hi) * (1 + x.lo)
}
