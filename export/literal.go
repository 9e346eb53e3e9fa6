package export

import (
	"fmt"
	"math"
	"math/big"
	"strconv"
	"strings"

	"quadwright/precision"
)

// fractionDigits is the number of significant digits an exact fraction p/q
// of a rule table is written with when the rule's own decimals carry fewer:
// 40 digits round correctly to every binary format up to binary128 (which
// needs 36 for a round trip) with margin.
const fractionDigits = 40

// literal is one number of a rule in decimal form: value =
// (-1)^neg * 0.digits * 10^exp, digits holding every significant digit of
// the rule's string (trailing zeros kept), "0" with exp 1 for zero.
type literal struct {
	neg    bool
	digits string
	exp    int
	exact  bool    // the rule wrote p/q; digits is its rounding to fracDigits digits
	f64    float64 // the float64 nearest to the exact value
}

// parseLiteral reads one number of a rule (anything precision.ParseNumber
// accepts). A fraction p/q is rounded to fracDigits significant digits. A
// value whose nearest float64 is infinite is refused: no float64 array could
// hold it. The error is one sentence naming the value.
func parseLiteral(s string, fracDigits int) (literal, error) {
	num, err := precision.ParseNumber(s)
	if err != nil {
		return literal{}, err
	}
	return newLiteral(s, num, fracDigits)
}

// newLiteral is parseLiteral for a string s already parsed into num.
func newLiteral(s string, num precision.Number, fracDigits int) (literal, error) {
	f, _ := num.Value.Float64()
	if math.IsInf(f, 0) {
		return literal{}, fmt.Errorf("value %q is beyond the range of a double", clip(strings.TrimSpace(s)))
	}
	var l literal
	if num.Exact {
		// SetRat at this precision keeps far more bits than fracDigits
		// decimal digits need; FormatSig then rounds the binary value once.
		prec := uint(float64(fracDigits)*math.Log2(10)) + 64
		x := new(big.Float).SetPrec(prec).SetRat(num.Value)
		l = lexLiteral(precision.FormatSig(x, fracDigits))
		l.exact = true
	} else {
		l = lexLiteral(strings.TrimSpace(s))
	}
	l.f64 = f
	return l, nil
}

// lexLiteral splits a decimal that ParseNumber accepted into sign,
// significant digits and exponent, by text alone so that no digit is lost.
func lexLiteral(s string) literal {
	var l literal
	switch {
	case strings.HasPrefix(s, "-"):
		l.neg, s = true, s[1:]
	case strings.HasPrefix(s, "+"):
		s = s[1:]
	}
	e10 := 0
	if i := strings.IndexAny(s, "eE"); i >= 0 {
		// ParseNumber bounds the exponent; Atoi reads "+08" as 8, where
		// fmt.Sscan would take it for octal.
		e10, _ = strconv.Atoi(s[i+1:])
		s = s[:i]
	}
	intPart, frac, _ := strings.Cut(s, ".")
	all := intPart + frac
	lead := 0
	for lead < len(all) && all[lead] == '0' {
		lead++
	}
	if lead == len(all) {
		return literal{digits: "0", exp: 1}
	}
	l.digits = all[lead:]
	l.exp = len(intPart) - lead + e10
	return l
}

// isZero reports whether the literal is 0.
func (l literal) isZero() bool { return l.digits == "0" }

// plain spells the literal with all its digits: positional when the
// exponent e of the leading digit satisfies -5 <= e < len(digits), else
// scientific with a signed exponent ("1.25e-30", "6.02e+23"), the notation of
// precision.FormatSig.
func (l literal) plain() string {
	if l.isZero() {
		return "0"
	}
	var b strings.Builder
	if l.neg {
		b.WriteByte('-')
	}
	d, e := l.digits, l.exp-1
	switch {
	case e >= -5 && e < len(d):
		if e < 0 {
			b.WriteString("0." + strings.Repeat("0", -e-1) + d)
		} else {
			b.WriteString(d[:e+1])
			if e+1 < len(d) {
				b.WriteString("." + d[e+1:])
			}
		}
	default:
		b.WriteString(d[:1])
		if len(d) > 1 {
			b.WriteString("." + d[1:])
		}
		fmt.Fprintf(&b, "e%+d", e)
	}
	return b.String()
}

// float spells the literal as plain does, with ".0" added to an integer so
// that every language reads it as a floating-point literal (Fortran reads
// 1_real64 as an integer, C reads 1L as a long).
func (l literal) float() string {
	s := l.plain()
	if !strings.ContainsAny(s, ".e") {
		s += ".0"
	}
	return s
}

// double is the float64 nearest to the value, in shortest round-trip form,
// spelled as float does.
func (l literal) double() string {
	return lexLiteral(precision.FormatFloat64(l.f64)).float()
}

// sigDigits is the number of significant digits written (0 for an exact
// fraction, whose digits are a rounding).
func (l literal) sigDigits() int {
	if l.exact {
		return 0
	}
	return len(l.digits)
}

func clip(s string) string {
	if len(s) > 60 {
		return s[:57] + "..."
	}
	return s
}
