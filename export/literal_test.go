package export

import (
	"math"
	"strconv"
	"testing"

	"quadwright/precision"
)

func TestLiteralSpelling(t *testing.T) {
	// Expected spellings follow precision.FormatSig's notation (positional
	// for -5 <= e < digits); the nearest doubles were checked with Python's
	// float() on the same strings (correctly rounded, shortest repr).
	cases := []struct {
		in, plain, float, double string
		digits                   int
	}{
		{"0", "0", "0.0", "0.0", 1},
		{"-0.000", "0", "0.0", "0.0", 1},
		{"1", "1", "1.0", "1.0", 1},
		{"+3", "3", "3.0", "3.0", 1},
		{".5", "0.5", "0.5", "0.5", 1},
		{"5.", "5", "5.0", "5.0", 1},
		{"100", "100", "100.0", "100.0", 3},
		{"1.0000", "1.0000", "1.0000", "1.0", 5},
		{"0.00120", "0.00120", "0.00120", "0.0012", 3},
		{"-1.50e3", "-1.50e+3", "-1.50e+3", "-1500.0", 3},
		{"1e-3", "0.001", "0.001", "0.001", 1},
		{"1.25e-300", "1.25e-300", "1.25e-300", "1.25e-300", 3},
		{"6.02E+23", "6.02e+23", "6.02e+23", "6.02e+23", 3},
		{"1e7", "1e+7", "1e+7", "1e+7", 1},
		{"0.0000012345", "1.2345e-6", "1.2345e-6", "1.2345e-6", 5},
		{"0.000012345", "0.000012345", "0.000012345", "0.000012345", 5},
		// 1/sqrt(3) to 30 digits (Abramowitz and Stegun, Table 25.4, n = 2).
		{"-0.577350269189625764509148780502", "-0.577350269189625764509148780502", "-0.577350269189625764509148780502", "-0.5773502691896257", 30},
	}
	for _, c := range cases {
		l, err := parseLiteral(c.in, fractionDigits)
		if err != nil {
			t.Fatalf("%q: %v", c.in, err)
		}
		if got := l.plain(); got != c.plain {
			t.Errorf("%q: plain %q, want %q", c.in, got, c.plain)
		}
		if got := l.float(); got != c.float {
			t.Errorf("%q: float %q, want %q", c.in, got, c.float)
		}
		if got := l.double(); got != c.double {
			t.Errorf("%q: double %q, want %q", c.in, got, c.double)
		}
		if l.sigDigits() != c.digits {
			t.Errorf("%q: %d digits, want %d", c.in, l.sigDigits(), c.digits)
		}
	}
}

func TestLiteralFraction(t *testing.T) {
	// 1/3 and -2/7 to 40 digits: exact decimal expansions (common practice).
	cases := []struct{ in, plain string }{
		{"1/3", "0.3333333333333333333333333333333333333333"},
		{"-2/7", "-0.2857142857142857142857142857142857142857"},
		{"4/2", "2.000000000000000000000000000000000000000"},
	}
	for _, c := range cases {
		l, err := parseLiteral(c.in, fractionDigits)
		if err != nil {
			t.Fatal(err)
		}
		if l.plain() != c.plain || !l.exact || l.sigDigits() != 0 {
			t.Errorf("%q: %q (exact %v), want %q", c.in, l.plain(), l.exact, c.plain)
		}
	}
}

func TestLiteralRefused(t *testing.T) {
	for _, s := range []string{"1e400", "-2e308", "x", "", "1/0"} {
		if _, err := parseLiteral(s, fractionDigits); err == nil {
			t.Errorf("%q accepted", s)
		}
	}
}

// FuzzLiteral checks that every accepted number is spelled with its exact
// value (decimals) and that the double spelling reads back as the nearest
// double.
func FuzzLiteral(f *testing.F) {
	for _, s := range []string{"0", "-1.50e3", ".5", "1/3", "6.02E+23", "0.000012345", "1e-320", "1e400"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		l, err := parseLiteral(s, fractionDigits)
		if err != nil {
			return
		}
		in, _ := precision.ParseNumber(s)
		out, err := precision.ParseNumber(l.float())
		if err != nil {
			t.Fatalf("%q spelled %q, which does not parse: %v", s, l.float(), err)
		}
		if !in.Exact && in.Value.Cmp(out.Value) != 0 {
			t.Fatalf("%q spelled %q: value changed", s, l.float())
		}
		if !in.Exact && in.Digits != out.Digits && !l.isZero() && len(l.plain()) == len(l.float()) {
			t.Fatalf("%q spelled %q: digits %d -> %d", s, l.plain(), in.Digits, out.Digits)
		}
		d, err := strconv.ParseFloat(l.double(), 64)
		if err != nil || (d != l.f64 && !(math.IsNaN(d) && math.IsNaN(l.f64))) {
			t.Fatalf("%q: double spelling %q reads %v, want %v", s, l.double(), d, l.f64)
		}
	})
}
