package design

import (
	"math/big"

	"quadwright/precision"
)

// agree decides whether the lower-precision stage s1 confirms the printed
// form of the higher-precision stage s2, and returns that printed form
// (nodes, weights).
//
// With digits D > 0 each value v2 of s2 is printed to D significant digits;
// it is confirmed when v1 prints the same and |v1 - v2| <= 10^-(D+1) |v2|,
// that is, at most a tenth of a unit in the last printed place. s2 carries
// more than twice the bits of that difference's worth of accuracy, so the
// printed value is then within 0.6 units in its last place of the truth.
// In float64 mode the nearest double of v2 is printed; it is confirmed when
// v1, v2 - 2|v1 - v2| and v2 + 2|v1 - v2| all round to the same double, so
// that the double is the nearest one to the true value as long as s2's error
// is below twice its distance from s1 (it is far below).
func agree(s1, s2 *stage, digits int) ([2][]string, bool) {
	var out [2][]string
	for k, pair := range [2][2][]*big.Float{{s1.nodes, s2.nodes}, {s1.weights, s2.weights}} {
		out[k] = make([]string, len(pair[0]))
		for i := range pair[0] {
			s, ok := confirm(pair[0][i], pair[1][i], digits, s2.prec)
			if !ok {
				return out, false
			}
			out[k][i] = s
		}
	}
	return out, true
}

func confirm(v1, v2 *big.Float, digits int, prec uint) (string, bool) {
	d := new(big.Float).SetPrec(prec).Sub(v1, v2)
	if digits > 0 {
		s := precision.FormatSig(v2, digits)
		if precision.FormatSig(v1, digits) != s {
			return "", false
		}
		if d.Sign() != 0 {
			if v2.Sign() == 0 {
				return "", false
			}
			lim := int(precision.DigitsToBits(digits+1)) + 1
			if d.MantExp(nil) > v2.MantExp(nil)-lim {
				return "", false
			}
		}
		return s, true
	}
	f := precision.NearestFloat64(v2)
	if precision.NearestFloat64(v1) != f {
		return "", false
	}
	d.Abs(d)
	d.Mul(d, big.NewFloat(2))
	lo := new(big.Float).SetPrec(prec).Sub(v2, d)
	hi := new(big.Float).SetPrec(prec).Add(v2, d)
	if precision.NearestFloat64(lo) != f || precision.NearestFloat64(hi) != f {
		return "", false
	}
	return precision.FormatFloat64(f), true
}
