package precision

import (
	"fmt"
	"math/big"
	"strings"
	"unicode/utf8"
)

// Limits on the text ParseNumber accepts, so that no input can make it
// build an integer of unbounded size.
const (
	maxNumberLen   = 100000 // characters, after trimming spaces
	maxDecimalExp  = 100000 // largest |exponent| after 'e'
	maxQuotedInErr = 60     // characters of the input quoted in an error
)

// A Number is a value read from text: its exact value, and how many
// significant decimal digits the text gave.
type Number struct {
	// Value is the exact value written (a decimal or a fraction).
	Value *big.Rat
	// Digits is the number of significant decimal digits as written: all
	// digits of the significand from the first nonzero one on, trailing zeros
	// included ("0.00120" -> 3, "-1.50e3" -> 3, "100" -> 3). A zero has
	// Digits 1 however it is written ("0", "0.000", "0e7"). A fraction p/q
	// has Digits 0: it is exact, and no digit count applies.
	Digits int
	// Exact is true for a fraction p/q: the value is exact, not a decimal
	// rounded to Digits digits.
	Exact bool
}

// ParseNumber reads a number from s, with leading and trailing spaces
// trimmed. Accepted are
//
//   - decimals: an optional sign, digits with at most one decimal point and
//     at least one digit ("-0.7", ".5", "5.", "+3", "100"), then optionally
//     an exponent 'e' or 'E' with an optional sign and at least one digit,
//     |exponent| <= 100000 ("1e-3", "2.5E+10");
//   - fractions "p/q": p an integer with an optional sign, q an unsigned
//     nonzero integer ("-1/3", "6/4"); a sign on q ("1/-3") is refused.
//
// Anything else is refused, among it "", "nan", "inf", "0x10", "1e", "--1",
// "1.2.3", "1/0", "1_000", text longer than 100000 characters. The error is
// one sentence that quotes s (trimmed, and cut after 60 bytes), e.g.
// `number "1.2.3": more than one decimal point`, with character positions
// counted from 1 in the quoted text. ParseNumber never panics.
func ParseNumber(s string) (Number, error) {
	t := strings.TrimSpace(s)
	fail := func(format string, args ...any) (Number, error) {
		q := t // positions in messages count from the first non-space
		if q == "" {
			q = s
		}
		if len(q) > maxQuotedInErr {
			q = q[:maxQuotedInErr] + "..."
		}
		return Number{}, fmt.Errorf("number %q: "+format, append([]any{q}, args...)...)
	}
	switch {
	case t == "":
		return fail("empty")
	case len(t) > maxNumberLen:
		return fail("longer than %d characters", maxNumberLen)
	}
	switch strings.ToLower(strings.TrimLeft(t, "+-")) {
	case "nan", "inf", "infinity":
		return fail("not a finite number")
	}
	if p, q, ok := strings.Cut(t, "/"); ok {
		if strings.Contains(q, "/") {
			return fail("more than one '/'")
		}
		num, msg := parseInteger(p, true)
		if msg != "" {
			return fail("numerator %s", msg)
		}
		den, msg := parseInteger(q, false)
		if msg != "" {
			return fail("denominator %s", msg)
		}
		if den.Sign() == 0 {
			return fail("zero denominator")
		}
		return Number{Value: new(big.Rat).SetFrac(num, den), Exact: true}, nil
	}
	d, msg := scanDecimal(t)
	if msg != "" {
		return fail("%s", msg)
	}
	return Number{Value: d.value(), Digits: d.significant()}, nil
}

// ParseExact returns the exact value of the number s as ParseNumber reads it.
func ParseExact(s string) (*big.Rat, error) {
	n, err := ParseNumber(s)
	if err != nil {
		return nil, err
	}
	return n.Value, nil
}

// DecimalULP returns one unit in the last written place of the decimal s
// (as ParseNumber accepts it): 10^(exponent - digits after the point),
// e.g. "0.00120" -> 1e-5, "1.5e-3" -> 1e-4, "100" -> 1, "0.0" -> 1/10.
// A fraction p/q has no last place and is refused.
func DecimalULP(s string) (*big.Rat, error) {
	n, err := ParseNumber(s)
	if err != nil {
		return nil, err
	}
	if n.Exact {
		return nil, fmt.Errorf("number %q: a fraction has no last decimal place", s)
	}
	d, _ := scanDecimal(strings.TrimSpace(s))
	return pow10Rat(d.exp - len(d.frac)), nil
}

// decimal is the text of a decimal number split into its parts.
type decimal struct {
	neg       bool
	int, frac string // digits before and after the point
	exp       int
}

// scanDecimal splits t into a decimal, or returns a message saying what is
// wrong with it.
func scanDecimal(t string) (decimal, string) {
	var d decimal
	i := 0
	if t[0] == '+' || t[0] == '-' {
		d.neg = t[0] == '-'
		i++
	}
	start, point := i, -1
	for ; i < len(t) && t[i] != 'e' && t[i] != 'E'; i++ {
		switch c := t[i]; {
		case c >= '0' && c <= '9':
		case c == '.':
			if point >= 0 {
				return d, "more than one decimal point"
			}
			point = i
		case c == '+' || c == '-':
			return d, fmt.Sprintf("misplaced sign at position %d", i+1)
		default:
			r, _ := utf8.DecodeRuneInString(t[i:])
			return d, fmt.Sprintf("unexpected character %q at position %d", r, utf8.RuneCountInString(t[:i])+1)
		}
	}
	if point < 0 {
		d.int = t[start:i]
	} else {
		d.int, d.frac = t[start:point], t[point+1:i]
	}
	if d.int == "" && d.frac == "" {
		return d, "no digits"
	}
	if i < len(t) {
		e, msg := scanExponent(t[i+1:])
		if msg != "" {
			return d, msg
		}
		d.exp = e
	}
	return d, ""
}

// scanExponent reads the exponent after 'e': optional sign, then digits.
func scanExponent(s string) (int, string) {
	neg := false
	if s != "" && (s[0] == '+' || s[0] == '-') {
		neg = s[0] == '-'
		s = s[1:]
	}
	if s == "" {
		return 0, "exponent has no digits"
	}
	e := 0
	for i := 0; i < len(s); i++ {
		c := s[i]
		if c < '0' || c > '9' {
			r, _ := utf8.DecodeRuneInString(s[i:])
			return 0, fmt.Sprintf("unexpected character %q in the exponent", r)
		}
		if e = 10*e + int(c-'0'); e > maxDecimalExp {
			return 0, fmt.Sprintf("exponent beyond ±%d", maxDecimalExp)
		}
	}
	if neg {
		e = -e
	}
	return e, ""
}

// parseInteger reads an integer of decimal digits, with an optional sign if
// signed; on failure it returns a message.
func parseInteger(s string, signed bool) (*big.Int, string) {
	t := s
	if signed && t != "" && (t[0] == '+' || t[0] == '-') {
		t = t[1:]
	}
	if t == "" {
		return nil, "has no digits"
	}
	for i := 0; i < len(t); i++ {
		if c := t[i]; c < '0' || c > '9' {
			if !signed && (c == '+' || c == '-') && i == 0 {
				return nil, "must be an unsigned integer"
			}
			r, _ := utf8.DecodeRuneInString(t[i:])
			return nil, fmt.Sprintf("is not an integer: unexpected character %q", r)
		}
	}
	v, _ := new(big.Int).SetString(t, 10)
	if s[0] == '-' {
		v.Neg(v)
	}
	return v, ""
}

// value returns the exact value of d.
func (d decimal) value() *big.Rat {
	m, _ := new(big.Int).SetString("0"+d.int+d.frac, 10)
	if d.neg {
		m.Neg(m)
	}
	v := new(big.Rat).SetInt(m)
	return v.Mul(v, pow10Rat(d.exp-len(d.frac)))
}

// significant returns the number of significant digits of d (1 for zero).
func (d decimal) significant() int {
	n := len(strings.TrimLeft(d.int+d.frac, "0"))
	if n == 0 {
		return 1
	}
	return n
}

// pow10Rat returns 10^e exactly.
func pow10Rat(e int) *big.Rat {
	p := pow10Int(abs(e))
	if e < 0 {
		return new(big.Rat).SetFrac(big.NewInt(1), p)
	}
	return new(big.Rat).SetInt(p)
}

// pow10Int returns 10^e for e >= 0.
func pow10Int(e int) *big.Int {
	return new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(e)), nil)
}

func abs(v int) int {
	if v < 0 {
		return -v
	}
	return v
}
