package design

import "math/big"

// ConfirmPrinted decides whether v1, computed at a lower precision, confirms
// the printed form of v2, computed independently at prec bits (prec >= the
// precision of v2), and returns that printed form. It applies the criterion
// that Gauss uses for its two stages: with digits D > 0, v2 printed to D
// significant digits is confirmed when v1 prints the same and
// |v1 - v2| <= 10^-(D+1) |v2| (a tenth of a unit in the last printed place);
// with digits == 0 (float64 mode) the nearest double of v2 is confirmed when
// v1, v2 - 2|v1 - v2| and v2 + 2|v1 - v2| all round to it. A value that is
// exactly zero at both precisions is confirmed as "0".
func ConfirmPrinted(v1, v2 *big.Float, digits int, prec uint) (string, bool) {
	return confirm(v1, v2, digits, prec)
}
