package levelset

import (
	"math/big"
	"testing"

	"quadwright/precision"
)

// TestRoundCheck: roundCheck.within never says a value prints as a string
// that precision.FormatSig does not give it, including next to powers of
// ten, where the digits below are ten times finer.
func TestRoundCheck(t *testing.T) {
	const prec = 256
	c := newRoundCheck(prec)
	rd := func(s string) *big.Float {
		v, _, err := big.ParseFloat(s, 10, prec, big.ToNearestEven)
		if err != nil {
			t.Fatal(err)
		}
		return v
	}
	for _, s := range []string{"0.12345", "-4.4e-3", "1", "1.0000", "9.9999", "0.0010000", "123.45", "-1.0000e+12", "6.0000e-30"} {
		for _, d := range []int{5} {
			sv := rd(s)
			str := precision.FormatSig(sv, d)
			for _, off := range []string{"0", "1e-40", "-1e-40", "4e-6", "-4e-6", "4.9e-5", "-4.9e-5", "5.1e-5", "-5.1e-5", "2e-4", "-2e-4"} {
				v := new(big.Float).SetPrec(prec).Mul(sv, rd("1"))
				v.Add(v, new(big.Float).Mul(rd(off), new(big.Float).Abs(sv)))
				if c.within(v, rd(str), str, d) && precision.FormatSig(v, d) != str {
					t.Errorf("%s%+s: within %s, but prints %s", s, off, str, precision.FormatSig(v, d))
				}
			}
			if !c.within(sv, rd(str), str, d) {
				t.Errorf("%s: not within its own string %s", s, str)
			}
		}
	}
	if e, one, ok := decimalExponent("-0.00123"); e != -3 || one || !ok {
		t.Errorf("decimalExponent(-0.00123) = %d %v %v", e, one, ok)
	}
	if e, one, ok := decimalExponent("1.000e+7"); e != 7 || !one || !ok {
		t.Errorf("decimalExponent(1.000e+7) = %d %v %v", e, one, ok)
	}
}
