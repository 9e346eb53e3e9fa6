package precision

import (
	"fmt"
	"math/big"
	"math/rand/v2"
	"testing"
)

// TestGammaReference checks LogGamma, Gamma (on the exact binary argument
// mpmath used) and LogGammaRat, GammaRat (on the exact fraction) at 40 and
// 200 digits (and a few at 1000) against mpmath (see consts_test.go), to within 1 ulp.
func TestGammaReference(t *testing.T) {
	ref := mustReference(t)
	if len(ref.Gamma) == 0 {
		t.Fatal("no gamma reference values")
	}
	for _, g := range ref.Gamma {
		name := fmt.Sprintf("(%s)@%d", g.Arg, g.Digits)
		x := g.X.float(t, g.Bits)
		r, ok := new(big.Rat).SetString(g.Rat)
		if !ok {
			t.Fatalf("bad fraction %q", g.Rat)
		}
		lg, sign := LogGamma(x)
		check(t, "LogGamma"+name, lg, sign, g.BinLgamma, g.BinSign)
		lr, rsign := LogGammaRat(r, g.Bits)
		check(t, "LogGammaRat"+name, lr, rsign, g.RatLgamma, g.RatSign)
		check(t, "Gamma"+name, Gamma(x), 0, g.BinGamma, 0)
		check(t, "GammaRat"+name, GammaRat(r, g.Bits), 0, g.RatGamma, 0)
	}
}

func check(t *testing.T, name string, got *big.Float, sign int, want string, wantSign int) {
	t.Helper()
	if sign != wantSign {
		t.Errorf("%s: sign %d, want %d (mpmath)", name, sign, wantSign)
	}
	if u := ulps(t, got, want); u > 1 {
		t.Errorf("%s = %s, %.3g ulp from mpmath %s", name, got.Text('g', 30), u, want[:min(30, len(want))])
	}
}

// TestGammaFactorial checks Gamma(n) = (n-1)! exactly (DLMF 5.4.1) and
// ln Gamma(1) = ln Gamma(2) = 0.
func TestGammaFactorial(t *testing.T) {
	for _, n := range []int64{1, 2, 3, 4, 5, 10, 20, 21, 30, 100, 171, 2999, 3000, 3001} {
		want := new(big.Int).MulRange(1, n-1)
		if n <= 2 {
			want.SetInt64(1)
		}
		for _, prec := range []uint{53, 200, 40000} {
			if n >= 3000 && prec > 200 {
				continue // the general path at 40000 bits takes seconds
			}
			wf := new(big.Float).SetPrec(prec).SetInt(want)
			x := new(big.Float).SetPrec(prec).SetInt64(n)
			if n < 3000 {
				if g := Gamma(x); g.Cmp(wf) != 0 {
					t.Errorf("Gamma(%d) at %d bits = %s, want %d! correctly rounded", n, prec, g.Text('g', 20), n-1)
				}
			}
			if g := GammaRat(big.NewRat(n, 1), prec); n < 3000 && g.Cmp(wf) != 0 {
				t.Errorf("GammaRat(%d) at %d bits = %s, want %d!", n, prec, g.Text('g', 20), n-1)
			}
		}
	}
	for _, n := range []int64{1, 2} {
		if l, s := LogGamma(big.NewFloat(float64(n))); l.Sign() != 0 || s != 1 {
			t.Errorf("LogGamma(%d) = %s, %d; want 0, 1", n, l.Text('g', 10), s)
		}
	}
}

// TestGammaHalfIntegers checks Gamma(1/2) = sqrt(pi) (DLMF 5.4.6) and
// Gamma(-5/2) = -(8/15) sqrt(pi), Gamma(7/2) = (15/8) sqrt(pi) (DLMF 5.5.1
// applied to 5.4.6), within 1 ulp at 300 bits.
func TestGammaHalfIntegers(t *testing.T) {
	const prec = 300
	sp := Sqrt(Pi(prec + 64))
	for _, c := range []struct {
		x, factor *big.Rat
	}{
		{big.NewRat(1, 2), big.NewRat(1, 1)},
		{big.NewRat(-5, 2), big.NewRat(-8, 15)},
		{big.NewRat(7, 2), big.NewRat(15, 8)},
		{big.NewRat(-1, 2), big.NewRat(-2, 1)},
	} {
		want := new(big.Float).SetPrec(prec + 64).SetRat(c.factor)
		want.Mul(want, sp)
		for name, got := range map[string]*big.Float{
			"GammaRat": GammaRat(c.x, prec),
			"Gamma":    Gamma(new(big.Float).SetPrec(prec).SetRat(c.x)),
		} {
			if u := ulps(t, got, want.Text('e', 120)); u > 1 {
				t.Errorf("%s(%s) = %s, %.3g ulp from %s sqrt(pi)", name, c.x, got.Text('g', 30), u, c.factor)
			}
		}
	}
}

func TestGammaPoles(t *testing.T) {
	for _, v := range []float64{0, -1, -2, -1e6} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("LogGamma(%g) did not panic", v)
				}
			}()
			LogGamma(big.NewFloat(v))
		}()
	}
	func() {
		defer func() {
			if recover() == nil {
				t.Errorf("GammaRat(-3) did not panic")
			}
		}()
		GammaRat(big.NewRat(-3, 1), 64)
	}()
}

// TestLogGammaNearZeros checks the cancellation near the zeros of ln Gamma,
// from DLMF 5.7.3, ln Gamma(1+h) = -gamma h + sum_{k>=2} (-1)^k zeta(k) h^k/k,
// and ln Gamma(2+h) = ln(1+h) + ln Gamma(1+h): with h = 2^-100 the terms
// through h^2 leave a relative error below 2^-190, far below an ulp at 128
// bits. Euler's constant to 50 decimals is from memory (and agrees with
// mpmath); zeta(2) = pi^2/6 (DLMF 25.6.1).
func TestLogGammaNearZeros(t *testing.T) {
	const prec = 128
	euler := parseRef(t, "0.57721566490153286060651209008240243104215933593992", 300)
	h := new(big.Float).SetPrec(300).SetMantExp(big.NewFloat(1), -100)
	h2 := new(big.Float).SetPrec(300).Mul(h, h)
	zeta2 := new(big.Float).SetPrec(300).Mul(Pi(300), Pi(300))
	zeta2.Quo(zeta2, big.NewFloat(6))
	series := func(c1, c2 *big.Float) *big.Float {
		v := new(big.Float).SetPrec(300).Mul(c1, h)
		return v.Add(v, new(big.Float).SetPrec(300).Mul(c2, h2))
	}
	half := func(v *big.Float) *big.Float { return new(big.Float).SetPrec(300).Quo(v, big.NewFloat(2)) }
	for _, c := range []struct {
		base float64
		want *big.Float
	}{
		{1, series(new(big.Float).SetPrec(300).Neg(euler), half(zeta2))},
		{2, series(new(big.Float).SetPrec(300).Sub(big.NewFloat(1), euler),
			half(new(big.Float).SetPrec(300).Sub(zeta2, big.NewFloat(1))))},
	} {
		x := new(big.Float).SetPrec(prec).Add(big.NewFloat(c.base), h)
		got, sign := LogGamma(x)
		if u := ulps(t, got, c.want.Text('e', 80)); u > 1 || sign != 1 {
			t.Errorf("LogGamma(%g+2^-100) = %s (sign %d), %.3g ulp from %s",
				c.base, got.Text('g', 25), sign, u, c.want.Text('g', 25))
		}
	}
}

// checkRecurrence checks ln|Gamma(x+1)| = ln|Gamma(x)| + ln|x| (DLMF 5.5.1)
// on count exact rationals x in (-50, 2000) at prec bits, to within the sum
// of the three results' ulps (each is within 1 ulp).
func checkRecurrence(t *testing.T, prec uint, count int) {
	rng := rand.New(rand.NewPCG(5, uint64(prec)))
	for i := 0; i < count; i++ {
		x := big.NewRat(rng.Int64N(2050000)-50000, 1+rng.Int64N(1000))
		if x.IsInt() && x.Sign() <= 0 {
			continue
		}
		x1 := new(big.Rat).Add(x, big.NewRat(1, 1))
		if x1.IsInt() && x1.Sign() <= 0 {
			continue
		}
		a, sa := LogGammaRat(x1, prec)
		b, sb := LogGammaRat(x, prec)
		ax := new(big.Float).SetPrec(prec).SetRat(x)
		l := Log(ax.Abs(ax))
		if sa != sb*x.Sign() {
			t.Errorf("x = %s: sign of Gamma(x+1) %d, of Gamma(x) %d", x.RatString(), sa, sb)
		}
		d := new(big.Float).SetPrec(4*prec).Sub(a, b)
		d.Sub(d, l)
		tol := new(big.Float).SetPrec(64)
		for _, v := range []*big.Float{a, b, l} {
			if v.Sign() != 0 {
				tol.Add(tol, new(big.Float).SetMantExp(big.NewFloat(1), v.MantExp(nil)-int(prec)))
			}
		}
		if d.Abs(d).Cmp(tol) > 0 {
			t.Errorf("x = %s at %d bits: ln Gamma(x+1) - ln Gamma(x) - ln|x| = %s, beyond %s",
				x.RatString(), prec, d.Text('g', 5), tol.Text('g', 5))
		}
	}
}

func TestLogGammaRecurrence(t *testing.T) { checkRecurrence(t, 200, 40) }

func BenchmarkLogGamma34Digits(b *testing.B) {
	x := new(big.Float).SetPrec(DigitsToBits(34)).SetFloat64(0.3)
	for b.Loop() {
		LogGamma(x)
	}
}

func BenchmarkLogGamma1000Digits(b *testing.B) {
	x := new(big.Float).SetPrec(DigitsToBits(1000)).SetFloat64(0.3)
	for b.Loop() {
		LogGamma(x)
	}
}

func BenchmarkLogGamma1000DigitsLarge(b *testing.B) {
	x := new(big.Float).SetPrec(DigitsToBits(1000)).SetFloat64(12345.678)
	for b.Loop() {
		LogGamma(x)
	}
}
