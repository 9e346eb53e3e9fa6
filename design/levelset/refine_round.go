package levelset

import (
	"math/big"
	"strconv"
	"strings"
)

// roundCheck decides, without printing it, whether a value prints as a
// given string of d significant digits: it does when the value lies
// strictly inside the string's rounding interval, with a margin of 2^-32
// of that interval for the string's own reading at prec bits. It answers
// false (print and compare, then) where it cannot tell: near an end of
// the interval, or for a string it does not parse. Printing (precision.
// FormatSig) rounds correctly, so true is never wrong.
type roundCheck struct {
	prec uint
	half map[int]*big.Float // (1 - 2^-32) 10^k / 2, by k
	t    *big.Float
}

func newRoundCheck(prec uint) *roundCheck {
	return &roundCheck{prec: prec, half: map[int]*big.Float{}, t: new(big.Float).SetPrec(prec)}
}

// within reports whether v prints as s (d significant digits), sv being s
// read at c.prec bits.
func (c *roundCheck) within(v, sv *big.Float, s string, d int) bool {
	e, one, ok := decimalExponent(s)
	if !ok {
		return false
	}
	k := e - d + 1
	h, ok := c.half[k]
	if !ok {
		p := new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(max(k, -k))), nil)
		h = new(big.Float).SetPrec(c.prec).SetInt(p)
		if k < 0 {
			h.Quo(new(big.Float).SetPrec(c.prec).SetInt64(1), h)
		}
		h.SetMantExp(h, -1)
		m := new(big.Float).SetPrec(c.prec).SetMantExp(h, -32)
		h.Sub(h, m)
		c.half[k] = h
	}
	c.t.Sub(v, sv)
	c.t.Abs(c.t)
	if one {
		// 1.000...: below it the digits are ten times finer, so a tenth of
		// the interval on both sides.
		c.t.Mul(c.t, big.NewFloat(10))
	}
	return c.t.Cmp(h) < 0
}

// decimalExponent is the power of ten of the leading digit of the
// decimal s (as precision.FormatSig prints: an optional sign, digits with
// an optional point, an optional exponent), and whether its digits are a
// 1 followed by zeros only. ok is false for 0 or text it does not read.
func decimalExponent(s string) (e int, one, ok bool) {
	s = strings.TrimLeft(s, "+-")
	x := 0
	if i := strings.IndexAny(s, "eE"); i >= 0 {
		v, err := strconv.Atoi(s[i+1:])
		if err != nil {
			return 0, false, false
		}
		x, s = v, s[:i]
	}
	point := strings.IndexByte(s, '.')
	digits := strings.Replace(s, ".", "", 1)
	if point < 0 {
		point = len(s)
	}
	first := strings.IndexAny(digits, "123456789")
	if first < 0 {
		return 0, false, false
	}
	one = digits[first] == '1' && strings.Trim(digits[first+1:], "0") == ""
	return point - 1 - first + x, one, true
}
