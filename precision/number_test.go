package precision

import (
	"math/big"
	"strings"
	"testing"
)

func TestParseNumberGood(t *testing.T) {
	// Values are the exact rationals the text denotes (by the definition
	// of decimal notation); Digits follow the documented convention.
	for _, c := range []struct {
		in     string
		value  string // big.Rat notation
		digits int
		exact  bool
	}{
		{"-0.7", "-7/10", 1, false},
		{"1e-3", "1/1000", 1, false},
		{"2.5E+10", "25000000000", 2, false},
		{".5", "1/2", 1, false},
		{"5.", "5", 1, false},
		{"+3", "3", 1, false},
		{"100", "100", 3, false},
		{"0.00120", "3/2500", 3, false},
		{"-1.50e3", "-1500", 3, false},
		{"0", "0", 1, false},
		{"-0.000", "0", 1, false},
		{"0e7", "0", 1, false},
		{"  42  ", "42", 2, false},
		{"\t1.25\n", "5/4", 3, false},
		{"007", "7", 1, false},
		{"1e100000", "1" + strings.Repeat("0", 100000), 1, false},
		{"12345678901234567890.5", "24691357802469135781/2", 21, false},
		{"1e-00005", "1/100000", 1, false},
		{"-1/3", "-1/3", 0, true},
		{"+6/4", "3/2", 0, true},
		{"0/5", "0", 0, true},
		{"22/7", "22/7", 0, true},
	} {
		n, err := ParseNumber(c.in)
		if err != nil {
			t.Errorf("ParseNumber(%q): %v", c.in, err)
			continue
		}
		want, _ := new(big.Rat).SetString(c.value)
		if n.Value.Cmp(want) != 0 || n.Digits != c.digits || n.Exact != c.exact {
			t.Errorf("ParseNumber(%q) = {%s %d %v}, want {%s %d %v}",
				c.in, n.Value.RatString(), n.Digits, n.Exact, want.RatString(), c.digits, c.exact)
		}
		if v, err := ParseExact(c.in); err != nil || v.Cmp(want) != 0 {
			t.Errorf("ParseExact(%q) = %v, %v", c.in, v, err)
		}
	}
}

func TestParseNumberBad(t *testing.T) {
	for _, c := range []struct{ in, msg string }{
		{"", `number "": empty`},
		{"   ", `number "   ": empty`},
		{"1/0", `number "1/0": zero denominator`},
		{"1/-3", `number "1/-3": denominator must be an unsigned integer`},
		{"nan", `number "nan": not a finite number`},
		{"-Inf", `number "-Inf": not a finite number`},
		{"infinity", `number "infinity": not a finite number`},
		{"0x10", `number "0x10": unexpected character 'x' at position 2`},
		{"1e", `number "1e": exponent has no digits`},
		{"1e+", `number "1e+": exponent has no digits`},
		{"e5", `number "e5": no digits`},
		{".", `number ".": no digits`},
		{"-", `number "-": no digits`},
		{"--1", `number "--1": misplaced sign at position 2`},
		{"1-", `number "1-": misplaced sign at position 2`},
		{"1.2.3", `number "1.2.3": more than one decimal point`},
		{"1e100001", `number "1e100001": exponent beyond ±100000`},
		{"1e-999999999999999999999", `number "1e-999999999999999999999": exponent beyond ±100000`},
		{"1e5.5", `number "1e5.5": unexpected character '.' in the exponent`},
		{"1_000", `number "1_000": unexpected character '_' at position 2`},
		{"1 2", `number "1 2": unexpected character ' ' at position 2`},
		{"1/2/3", `number "1/2/3": more than one '/'`},
		{"1.5/2", `number "1.5/2": numerator is not an integer: unexpected character '.'`},
		{"1/2e3", `number "1/2e3": denominator is not an integer: unexpected character 'e'`},
		{"/3", `number "/3": numerator has no digits`},
		{"3/", `number "3/": denominator has no digits`},
		{"١٢", `number "١٢": unexpected character '١' at position 1`},
		{"  12x", `number "12x": unexpected character 'x' at position 3`},
		{"1.5\u00e9", `number "1.5é": unexpected character 'é' at position 4`},
		{strings.Repeat("1", 100001), `longer than 100000 characters`},
	} {
		_, err := ParseNumber(c.in)
		if err == nil {
			t.Errorf("ParseNumber(%q) accepted", c.in)
			continue
		}
		if !strings.Contains(err.Error(), c.msg) {
			t.Errorf("ParseNumber(%q): error %q, want %q", c.in, err, c.msg)
		}
		if _, err := ParseExact(c.in); err == nil {
			t.Errorf("ParseExact(%q) accepted", c.in)
		}
	}
}

func TestDecimalULP(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{"0.00120", "1/100000"},
		{"1.5e-3", "1/10000"},
		{"100", "1"},
		{"0", "1"},
		{"0.0", "1/10"},
		{"-2.50E2", "1"},
		{"5.", "1"},
		{"1e5", "100000"},
	} {
		got, err := DecimalULP(c.in)
		want, _ := new(big.Rat).SetString(c.want)
		if err != nil || got.Cmp(want) != 0 {
			t.Errorf("DecimalULP(%q) = %v, %v; want %s", c.in, got, err, c.want)
		}
	}
	for _, in := range []string{"1/3", "x", ""} {
		if _, err := DecimalULP(in); err == nil {
			t.Errorf("DecimalULP(%q) accepted", in)
		}
	}
}

// FuzzParseNumber checks that ParseNumber never panics and that an
// accepted decimal, rounded to binary with 8 bits to spare and printed back
// by FormatSig at its own Digits, reads back as the same exact value.
func FuzzParseNumber(f *testing.F) {
	for _, s := range []string{"-0.7", "1e-3", "2.5E+10", ".5", "5.", "+3", "0.00120",
		"-1.50e3", "100", "0", "1/3", "-1/3", "1/0", "nan", "0x10", "1e", "--1", "1.2.3",
		"9.9996", "99999.5", "1e-99999", "7e99999", "0.000009999"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		n, err := ParseNumber(s)
		if err != nil {
			if !strings.HasPrefix(err.Error(), "number ") {
				t.Fatalf("error %q does not name the input", err)
			}
			return
		}
		if n.Exact {
			if n.Value.Denom().Sign() <= 0 {
				t.Fatalf("%q: bad fraction %v", s, n.Value)
			}
			return
		}
		if len(s) > 2000 {
			return // keep each case fast
		}
		x := new(big.Float).SetPrec(DigitsToBits(n.Digits) + 8).SetRat(n.Value)
		out := FormatSig(x, n.Digits)
		back, err := ParseExact(out)
		if err != nil || back.Cmp(n.Value) != 0 {
			t.Fatalf("%q (%d digits) printed as %q, read back as %v, %v", s, n.Digits, out, back, err)
		}
	})
}
