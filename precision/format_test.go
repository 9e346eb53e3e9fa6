package precision

import (
	"math"
	"math/big"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"
)

func TestFormatSigTable(t *testing.T) {
	bin := func(f float64) *big.Float { return new(big.Float).SetFloat64(f) }
	dec := func(s string, prec uint) *big.Float {
		x, _, err := new(big.Float).SetPrec(prec).Parse(s, 10)
		if err != nil {
			t.Fatal(err)
		}
		return x
	}
	third := new(big.Float).SetPrec(3400).Quo(big.NewFloat(1), big.NewFloat(3))
	for _, c := range []struct {
		name string
		x    *big.Float
		d    int
		want string
	}{
		// Exact binary ties round to even (by hand: 0.125 = 1/8 exactly, ...).
		{"tie down", bin(0.125), 2, "0.12"},
		{"tie up", bin(0.375), 2, "0.38"},
		{"tie 2.5", bin(2.5), 1, "2"},
		{"tie 3.5", bin(3.5), 1, "4"},
		{"tie -2.5", bin(-2.5), 1, "-2"},
		{"tie 1e3", bin(1250), 2, "1.2e+3"},
		// Not a tie: float64 0.15 is 0.1499999999999999944...
		{"below tie", bin(0.15), 1, "0.1"},
		// Carries into a new digit: float64 9.99996 = 9.99995999999999...
		{"carry 5", bin(9.99996), 5, "10.000"},
		{"carry 4", bin(9.9996), 4, "10.00"},
		{"carry to sci", bin(99999.6), 5, "1.0000e+5"},
		{"carry small", bin(0.0000099999), 3, "0.0000100"},
		{"9.9996 at 5", bin(9.9996), 5, "9.9996"},
		// Notation: positional for -5 <= e < d.
		{"int", bin(123), 3, "123"},
		{"int sci", bin(123.456), 2, "1.2e+2"},
		{"e=-4", bin(0.000123), 3, "0.000123"},
		{"e=-5", bin(0.0000123), 3, "0.0000123"},
		{"e=-6", bin(0.00000123), 3, "1.23e-6"},
		{"one digit", bin(7), 1, "7"},
		{"one digit sci", bin(7e7), 1, "7e+7"},
		{"trailing zeros", bin(1.5), 6, "1.50000"},
		{"negative", bin(-1.5), 2, "-1.5"},
		{"zero", bin(0), 5, "0"},
		{"avogadro", dec("6.02214076e23", 100), 3, "6.02e+23"},
		{"tiny", dec("1.25e-300", 100), 3, "1.25e-300"},
		{"very tiny", dec("1e-300000", 200), 3, "1.00e-300000"},
		{"very huge", dec("-4.5e300000", 200), 4, "-4.500e+300000"},
		// 2^1000 = 1.0715086071862673...e301 (from memory)
		{"2^1000", new(big.Float).SetMantExp(big.NewFloat(1), 1000), 5, "1.0715e+301"},
		{"1000 digits of 1/3", third, 1000, "0." + strings.Repeat("3", 1000)},
		{"1000 digits of 1/2", bin(0.5), 1000, "0.5" + strings.Repeat("0", 999)},
		{"+Inf", new(big.Float).SetInf(false), 3, "+Inf"},
	} {
		if got := FormatSig(c.x, c.d); got != c.want {
			t.Errorf("%s: FormatSig(%s, %d) = %q, want %q", c.name, c.x.Text('g', 20), c.d, got, c.want)
		}
	}
}

// layout puts the digits and exponent that math/big's own exact decimal
// conversion (Float.Text 'e', which rounds half to even on the exact binary
// value) gives into FormatSig's notation.
func layout(x *big.Float, d int) string {
	s := x.Text('e', d-1)
	neg := strings.HasPrefix(s, "-")
	s = strings.TrimPrefix(s, "-")
	mant, es, _ := strings.Cut(s, "e")
	e, _ := strconv.Atoi(es)
	digits := strings.Replace(mant, ".", "", 1)
	var out string
	switch {
	case e >= 0 && e < d:
		out = digits[:e+1]
		if e+1 < d {
			out += "." + digits[e+1:]
		}
	case e < 0 && e >= -5:
		out = "0." + strings.Repeat("0", -e-1) + digits
	default:
		out = mant + "e"
		if e >= 0 {
			out += "+"
		}
		out += strconv.Itoa(e)
	}
	if neg {
		out = "-" + out
	}
	return out
}

// TestFormatSigAgainstBig compares FormatSig with math/big's exact decimal
// conversion on random values of 1 to 300 bits and exponents from 2^-4000
// to 2^4000, and on values close to decimal ties.
func TestFormatSigAgainstBig(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for i := 0; i < 3000; i++ {
		prec := uint(1 + rng.IntN(300))
		m := new(big.Int)
		for m.BitLen() < int(prec) {
			m.Lsh(m, 64).Or(m, new(big.Int).SetUint64(rng.Uint64()))
		}
		m.Rsh(m, uint(m.BitLen())-prec)
		x := new(big.Float).SetPrec(prec).SetInt(m)
		x.SetMantExp(x, rng.IntN(8000)-4000-int(prec))
		if rng.IntN(2) == 0 {
			x.Neg(x)
		}
		d := 1 + rng.IntN(40)
		if got, want := FormatSig(x, d), layout(x, d); got != want {
			t.Fatalf("FormatSig(%s, %d) = %q, want %q (math/big)", x.Text('p', 0), d, got, want)
		}
	}
	// Decimal ties d.ddd5 made exact in binary: k/2^j with few digits.
	for k := int64(1); k < 4000; k += 7 {
		for j := 1; j < 12; j++ {
			x := new(big.Float).SetMantExp(big.NewFloat(float64(k)), -j)
			for d := 1; d < 6; d++ {
				if got, want := FormatSig(x, d), layout(x, d); got != want {
					t.Fatalf("FormatSig(%d/2^%d, %d) = %q, want %q (math/big)", k, j, d, got, want)
				}
			}
		}
	}
}

func TestFormatFloat64(t *testing.T) {
	// Shortest round-trip strings (strconv 'g', -1).
	for _, c := range []struct {
		f    float64
		want string
	}{{0.1, "0.1"}, {1e21, "1e+21"}, {5e-324, "5e-324"}, {-2.5, "-2.5"}, {0, "0"}, {123456789, "1.23456789e+08"}} {
		if got := FormatFloat64(c.f); got != c.want {
			t.Errorf("FormatFloat64(%v) = %q, want %q", c.f, got, c.want)
		}
	}
	defer func() {
		if recover() == nil {
			t.Error("FormatFloat64(NaN) did not panic")
		}
	}()
	FormatFloat64(math.NaN())
}

// TestNearestFloat64 compares NearestFloat64 with strconv.ParseFloat, which
// rounds a decimal string to the nearest float64 (IEEE 754, ties to even),
// including subnormals, the overflow threshold and random decimals; each
// string is first read into 4000 bits, far more than any float64 decision
// needs for these inputs.
func TestNearestFloat64(t *testing.T) {
	inputs := []string{"0.1", "-0.1", "1", "1e308", "1.7976931348623157e308",
		"1.7976931348623158e308", "1.797693134862315807e308", "1.7976931348623159e308", "1e309",
		"2.2250738585072014e-308", "2.2250738585072011e-308", "4.9406564584124654e-324",
		"2.4703282292062328e-324", "2.4703282292062327e-324", "1e-400", "-1e-400",
		"9007199254740993", "9007199254740995", "123456789012345678901234567890"}
	rng := rand.New(rand.NewPCG(3, 4))
	for i := 0; i < 2000; i++ {
		n := 1 + rng.IntN(25)
		var b strings.Builder
		for j := 0; j < n; j++ {
			b.WriteByte(byte('0' + rng.IntN(10)))
		}
		inputs = append(inputs, b.String()+"e"+strconv.Itoa(rng.IntN(660)-340))
	}
	for _, s := range inputs {
		want, _ := strconv.ParseFloat(s, 64) // ±Inf with a range error above the maximum
		x, _, err := new(big.Float).SetPrec(4000).Parse(s, 10)
		if err != nil {
			t.Fatal(err)
		}
		if got := NearestFloat64(x); got != want || math.Signbit(got) != math.Signbit(want) {
			t.Errorf("NearestFloat64(%s) = %v, want %v (strconv.ParseFloat)", s, got, want)
		}
	}
	// Exactly half the smallest subnormal ties to even, 0; just above it
	// rounds up (IEEE 754).
	half := new(big.Float).SetMantExp(big.NewFloat(1), -1075)
	if got := NearestFloat64(half); got != 0 {
		t.Errorf("NearestFloat64(2^-1075) = %v, want 0", got)
	}
	half.SetPrec(200).Add(half, new(big.Float).SetMantExp(big.NewFloat(1), -1200))
	if got := NearestFloat64(half); got != math.SmallestNonzeroFloat64 {
		t.Errorf("NearestFloat64(2^-1075+2^-1200) = %v, want 5e-324", got)
	}
}

func BenchmarkFormatSig34(b *testing.B) {
	x := new(big.Float).SetPrec(DigitsToBits(34)+64).Quo(big.NewFloat(1), big.NewFloat(3))
	for b.Loop() {
		FormatSig(x, 34)
	}
}

func BenchmarkFormatSig1000(b *testing.B) {
	x := new(big.Float).SetPrec(DigitsToBits(1000)+64).Quo(big.NewFloat(-2), big.NewFloat(3))
	x.SetMantExp(x, -200)
	for b.Loop() {
		FormatSig(x, 1000)
	}
}
