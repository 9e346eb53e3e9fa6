package precision

import (
	"math/big"
	"testing"
)

// ulpsOff returns |got - want| in units of the last place of got.
func ulpsOff(got, want *big.Float) float64 {
	d := new(big.Float).SetPrec(2*got.Prec()).Sub(got, want)
	if d.Sign() == 0 {
		return 0
	}
	ulp := new(big.Float).SetMantExp(big.NewFloat(1), want.MantExp(nil)-int(got.Prec()))
	f, _ := new(big.Float).Quo(d.Abs(d), ulp).Float64()
	return f
}

// The series route of ExpTo, LogTo and PowTo against bigfloat's route at
// 128 more bits (bigfloat's Exp and Log are tested against mpmath in
// testdata/precision), within 1 ulp as documented; and each of Exp, Log
// above fastElemBits (bigfloat) against the series route below it.
func TestElementaryRoutesAgree(t *testing.T) {
	args := []string{"0.3711", "-0.3711", "1e-30", "-7.5", "123.456", "1e6", "-1e6", "0.999999999999", "1.0000000000001", "3e-200", "5e200"}
	for _, prec := range []uint{53, 64, 192, 320, 640, 1200, 3456} {
		for _, s := range args {
			x := new(big.Float).SetPrec(prec)
			r, _ := new(big.Rat).SetString(s)
			x.SetRat(r)
			ref := expBigfloat(x, prec+128)
			if got := ExpTo(x, prec); ref.IsInf() {
				if !got.IsInf() {
					t.Errorf("ExpTo(%s) = %v, want +Inf", s, got)
				}
			} else if u := ulpsOff(got, ref); u > 1 {
				t.Errorf("ExpTo(%s) at %d bits: %.3g ulp off", s, prec, u)
			}
			if x.Sign() <= 0 {
				continue
			}
			ref = logBigfloat(x, prec+128)
			if u := ulpsOff(LogTo(x, prec), ref); u > 1 {
				t.Errorf("LogTo(%s) at %d bits: %.3g ulp off", s, prec, u)
			}
			y := new(big.Float).SetPrec(prec).SetFloat64(-0.9)
			lx := logBigfloat(x, prec+256)
			ref = expBigfloat(lx.Mul(lx, y), prec+128)
			if u := ulpsOff(PowTo(x, y, prec), ref); u > 1 {
				t.Errorf("PowTo(%s, -0.9) at %d bits: %.3g ulp off", s, prec, u)
			}
		}
	}
	// log(1 - 2^-500), given with the bits of the distance, is -2^-500 - ...
	x := new(big.Float).SetPrec(600).Sub(big.NewFloat(1), new(big.Float).SetMantExp(big.NewFloat(1), -500))
	ref := logBigfloat(x, 800)
	if u := ulpsOff(LogTo(x, 128), ref); u > 1 {
		t.Errorf("LogTo(1-2^-500): %.3g ulp off", u)
	}
	// Above fastElemBits the bigfloat route answers; the series route at
	// the same precision is the check.
	p := uint(fastElemBits + 64)
	x = new(big.Float).SetPrec(p).SetFloat64(2.75)
	if u := ulpsOff(Exp(x), expBigfloat(x, p+128)); u > 1 {
		t.Errorf("Exp(2.75) at %d bits: %.3g ulp off", p, u)
	}
}

func BenchmarkExp(b *testing.B) {
	for _, prec := range []uint{192, 1024, 3456, 8192} {
		x := new(big.Float).SetPrec(prec).SetFloat64(0.7371)
		b.Run("series/"+itoa(prec), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				ExpTo(x, prec)
			}
		})
		if prec > fastElemBits {
			continue
		}
		b.Run("bigfloat/"+itoa(prec), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				expBigfloat(x, prec)
			}
		})
	}
}

func itoa(p uint) string { return big.NewInt(int64(p)).String() }
